package physics

import (
	"errors"
	"fmt"
)

// ErrDomain is the sentinel that every *DomainError unwraps to: an input
// lies outside the range where the physics holds, or the result would not be
// a finite number.
var ErrDomain = errors.New("physics: input outside the model's domain")

// DomainError names the input that is out of range, its value and what the
// function wants. Reason, when set, is a sentence for an engineer that
// replaces the generated message.
type DomainError struct {
	Name   string  // input name, e.g. "t01" or "suction.temperature"
	Value  float64 // the offending value (may be NaN)
	Want   string  // the accepted range, e.g. "finite, > 0 K"
	Reason string  // optional sentence for an engineer
}

// Error returns the message, prefixed "physics:".
func (e *DomainError) Error() string {
	if e.Reason != "" {
		return "physics: " + e.Reason
	}
	return fmt.Sprintf("physics: %s = %g is out of range (want %s)", e.Name, e.Value, e.Want)
}

// Unwrap returns ErrDomain.
func (e *DomainError) Unwrap() error { return ErrDomain }
