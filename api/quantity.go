package api

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
)

// Quantity is a physical input: a JSON number in the field's SI unit, or a
// string with a unit ("35 degC", "14.7 psia", "12 barg"). Strings are kept
// as text here and parsed with the field's dimension when the request is
// converted, so that a bad unit is reported with its field's pointer.
type Quantity struct {
	number float64
	text   string
	isText bool
}

// quantityTypeError is a Quantity given as something other than a number
// or a string.
type quantityTypeError struct{ got string }

func (e *quantityTypeError) Error() string {
	return "a physical value must be a JSON number in SI units or a string with a unit, not " + e.got
}

// UnmarshalJSON accepts a number or a string.
func (q *Quantity) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	if len(b) > 0 && b[0] == '"' {
		var s string
		if err := json.Unmarshal(b, &s); err != nil {
			return err
		}
		*q = Quantity{text: s, isText: true}
		return nil
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil {
		return &quantityTypeError{got: string(b)}
	}
	*q = Quantity{number: v}
	return nil
}

// MarshalJSON writes the number, or the text as given.
func (q Quantity) MarshalJSON() ([]byte, error) {
	if q.isText {
		return json.Marshal(q.text)
	}
	if math.IsNaN(q.number) || math.IsInf(q.number, 0) {
		return []byte("null"), nil
	}
	return json.Marshal(q.number)
}

// Num returns a Quantity holding the SI number v (for tests and examples).
func Num(v float64) *Quantity { return &Quantity{number: v} }

// Text returns a Quantity holding a string with a unit.
func Text(s string) *Quantity { return &Quantity{text: s, isText: true} }

// String is the quantity as given.
func (q Quantity) String() string {
	if q.isText {
		return q.text
	}
	return fmt.Sprint(q.number)
}

// quantityKind reports whether a raw JSON value can be a Quantity.
func quantityKind(raw any) bool {
	switch raw.(type) {
	case json.Number, string:
		return true
	}
	return false
}
