package api

import (
	"encoding/json"
	"strings"

	"stagewright/api/units"
)

// Quantity is a physical input: a JSON number in the field's SI unit, or a
// string with a unit ("35 degC", "14.7 psia", "12 barg"). It is
// units.Quantity, the one parser of units; strings are kept as text when
// decoding and read with the field's dimension when the request is
// converted, so that a bad unit is reported with its field's pointer.
type Quantity = units.Quantity

// quantityProblem says what is wrong with a raw JSON value meant for a
// Quantity, or "" when it can be one: decoding errors of a Quantity carry
// no field path, so the strict decoder checks the raw value first.
func quantityProblem(raw any) string {
	switch v := raw.(type) {
	case nil:
		return ""
	case json.Number:
		var q Quantity
		if err := q.UnmarshalJSON([]byte(v)); err != nil {
			return "is not a finite number"
		}
		return ""
	case string:
		if strings.TrimSpace(v) == "" {
			return "must not be an empty string: give a number in SI units or a string with a unit, e.g. \"35 degC\""
		}
		return ""
	}
	return "must be a number in SI units or a string with a unit, e.g. \"35 degC\""
}
