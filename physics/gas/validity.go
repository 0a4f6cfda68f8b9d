package gas

import (
	"errors"

	"stagewright/physics"
)

// Validity is a set of notes on how far a state can be trusted; the zero
// value means the state lies inside every correlation's stated range.
type Validity uint8

// Validity notes.
const (
	// CpExtrapolated: the temperature lies outside a component's ideal-gas
	// cp correlation range but within ExtrapolationBelow/ExtrapolationAbove.
	CpExtrapolated Validity = 1 << iota
	// TwoPhaseRisk: the cubic equation of state has a liquid-like root or the
	// stability test found that the gas would split (see Phase).
	TwoPhaseRisk
)

// Notes returns one sentence per note set in v.
func (v Validity) Notes() []string {
	var out []string
	if v&CpExtrapolated != 0 {
		out = append(out, "ideal-gas heat capacity extrapolated beyond the correlation's temperature range")
	}
	if v&TwoPhaseRisk != 0 {
		out = append(out, "the equation of state reports a liquid or two-phase state: the gas may condense")
	}
	return out
}

// ErrUnknownComponent is matched (errors.Is) by the error of a lookup of a
// component name that is not in the catalogue. The same error is also a
// *physics.DomainError.
var ErrUnknownComponent = errors.New("physics: unknown gas component")

// unknownError is a *physics.DomainError that also matches
// ErrUnknownComponent.
type unknownError struct{ de *physics.DomainError }

func (e unknownError) Error() string   { return e.de.Error() }
func (e unknownError) Unwrap() []error { return []error{ErrUnknownComponent, e.de} }

func unknownComponent(name string) error {
	return unknownError{&physics.DomainError{Name: "component", Value: 0, Want: "a catalogue component name",
		Reason: "unknown gas component \"" + name + "\"; see the component catalogue for accepted names"}}
}
