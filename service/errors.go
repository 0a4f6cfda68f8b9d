package service

import (
	"errors"
	"strings"

	"stagewright/physics"
)

// ErrInput is the sentinel every *InputError unwraps to (besides its cause).
var ErrInput = errors.New("service: invalid input")

// InputError ties a problem to the input field that caused it. Field is the
// dotted path of the field in the duty ("impeller.slip_factor"), named as
// the trade names it (the API uses the same names).
type InputError struct {
	Field string
	// Shape is true for a malformed input (wrong unit, missing part), false
	// for a well-formed input that is physically impossible or outside the
	// model.
	Shape bool
	Err   error
}

// Error returns "service: FIELD: cause".
func (e *InputError) Error() string { return "service: " + e.Field + ": " + e.Sentence() }

// Unwrap returns the cause and ErrInput.
func (e *InputError) Unwrap() []error { return []error{e.Err, ErrInput} }

// Sentence is the cause as a sentence for an engineer, without package
// prefixes.
func (e *InputError) Sentence() string {
	msg := e.Err.Error()
	for _, p := range []string{"service: ", "physics: ", "units: "} {
		msg = strings.ReplaceAll(msg, p, "")
	}
	return msg
}

func fieldErr(field string, err error) error {
	return &InputError{Field: field, Err: err}
}

func shapeErr(field string, err error) error {
	return &InputError{Field: field, Shape: true, Err: err}
}

func reason(name, sentence string, value float64) error {
	return &physics.DomainError{Name: name, Value: value, Reason: sentence}
}
