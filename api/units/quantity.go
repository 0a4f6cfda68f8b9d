package units

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Quantity is a physical input as the JSON carried it: a number in the
// field's SI unit (Text empty) or a string with a unit (Text set). Its
// methods read it as a given dimension.
type Quantity struct {
	Value float64 // the JSON number, in the field's SI unit, when Text is ""
	Text  string  // the JSON string with its unit, as given
}

// UnmarshalJSON accepts a JSON number or a non-empty string. A JSON null
// leaves q unchanged (use a *Quantity for an optional field).
func (q *Quantity) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	switch {
	case len(b) == 0:
		return &Error{Reason: "a physical value must be a JSON number in SI units or a string with a unit"}
	case string(b) == "null":
		return nil
	case b[0] == '"':
		var s string
		if err := json.Unmarshal(b, &s); err != nil {
			return &Error{Input: clipText(string(b)), Reason: "the string of a physical value is not valid JSON"}
		}
		if strings.TrimSpace(s) == "" {
			return &Error{Input: clipText(s), Reason: "a physical value must not be an empty string; give a number in SI units or a string with a unit, e.g. \"35 degC\""}
		}
		*q = Quantity{Text: s}
		return nil
	case b[0] == '-' || (b[0] >= '0' && b[0] <= '9'):
		v, err := strconv.ParseFloat(string(b), 64)
		if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
			return &Error{Input: clipText(string(b)), Reason: fmt.Sprintf("the number %s is not a finite number", clipText(string(b)))}
		}
		*q = Quantity{Value: v}
		return nil
	}
	return &Error{Input: clipText(string(b)), Reason: fmt.Sprintf("a physical value must be a JSON number in SI units or a string with a unit, not %s", kindOf(b))}
}

func kindOf(b []byte) string {
	switch b[0] {
	case '{':
		return "an object"
	case '[':
		return "an array"
	case 't', 'f':
		return "a boolean"
	}
	return "this value"
}

// MarshalJSON writes the string as given, or the number. A NaN or infinite
// number is an error (JSON has no such numbers).
func (q Quantity) MarshalJSON() ([]byte, error) {
	if q.Text != "" {
		return json.Marshal(q.Text)
	}
	if math.IsNaN(q.Value) || math.IsInf(q.Value, 0) {
		return nil, &Error{Input: fmt.Sprint(q.Value), Reason: "a NaN or infinite value has no JSON form"}
	}
	return json.Marshal(q.Value)
}

// String returns the quantity as given.
func (q Quantity) String() string {
	if q.Text != "" {
		return q.Text
	}
	return strconv.FormatFloat(q.Value, 'g', -1, 64)
}

// IsText reports whether the quantity was given as a string with a unit.
func (q Quantity) IsText() bool { return q.Text != "" }

// number checks a plain number of dimension d.
func (q Quantity) number(d dimension) (float64, error) {
	if math.IsNaN(q.Value) || math.IsInf(q.Value, 0) {
		return 0, &Error{Quantity: d.name, Input: q.String(),
			Reason: fmt.Sprintf("%s must be a finite number in %s", d.name, d.si)}
	}
	return q.Value, nil
}

// Pressure returns the absolute pressure in Pa: the number as is, or the
// string parsed by ParsePressure with the ambient for gauge units.
func (q Quantity) Pressure(ambient float64) (float64, error) {
	if q.IsText() {
		return ParsePressure(q.Text, ambient)
	}
	return q.number(pressureDim())
}

// Temperature returns the temperature in K (see ParseTemperature).
func (q Quantity) Temperature() (float64, error) {
	if q.IsText() {
		return ParseTemperature(q.Text)
	}
	return q.number(temperatureDim())
}

// MassFlow returns the mass flow in kg/s (see ParseMassFlow).
func (q Quantity) MassFlow() (float64, error) {
	if q.IsText() {
		return ParseMassFlow(q.Text)
	}
	return q.number(massFlowDim())
}

// VolumeFlow returns the actual volume flow in m3/s (see ParseVolumeFlow).
func (q Quantity) VolumeFlow() (float64, error) {
	if q.IsText() {
		return ParseVolumeFlow(q.Text)
	}
	return q.number(volumeFlowDim())
}

// Speed returns the rotational speed in rev/min; a plain number is already
// in rev/min (see ParseSpeed).
func (q Quantity) Speed() (float64, error) {
	if q.IsText() {
		return ParseSpeed(q.Text)
	}
	return q.number(speedDim())
}

// Velocity returns the velocity in m/s (see ParseVelocity).
func (q Quantity) Velocity() (float64, error) {
	if q.IsText() {
		return ParseVelocity(q.Text)
	}
	return q.number(velocityDim())
}

// Length returns the length in m (see ParseLength).
func (q Quantity) Length() (float64, error) {
	if q.IsText() {
		return ParseLength(q.Text)
	}
	return q.number(lengthDim())
}

// Power returns the power in W (see ParsePower).
func (q Quantity) Power() (float64, error) {
	if q.IsText() {
		return ParsePower(q.Text)
	}
	return q.number(powerDim())
}

// SpecificEnergy returns the specific energy in J/kg (see
// ParseSpecificEnergy).
func (q Quantity) SpecificEnergy() (float64, error) {
	if q.IsText() {
		return ParseSpecificEnergy(q.Text)
	}
	return q.number(specificEnergyDim())
}

// StandardVolumeFlow returns the standard volume flow (see
// ParseStandardVolumeFlow). A plain number is m3/s at numberReference
// ("normal", "standard", "us-standard"); with numberReference "" a number is
// refused, because it does not say at which conditions it was measured.
func (q Quantity) StandardVolumeFlow(numberReference string) (StandardFlow, error) {
	if q.IsText() {
		return ParseStandardVolumeFlow(q.Text)
	}
	d := standardFlowDim()
	v, err := q.number(d)
	if err != nil {
		return StandardFlow{}, err
	}
	switch numberReference {
	case ReferenceNormal, ReferenceStandard, ReferenceUSStandard:
		return StandardFlow{Flow: v, Reference: numberReference}, nil
	case "":
		return StandardFlow{}, &Error{Quantity: d.name, Input: q.String(),
			Reason: fmt.Sprintf("a standard volume flow given as a plain number does not say its reference conditions; write it with a unit, e.g. %q or \"48 MMSCFD\"", d.example)}
	}
	return StandardFlow{}, &Error{Quantity: d.name, Input: q.String(),
		Reason: fmt.Sprintf("unknown reference conditions %q; use \"normal\", \"standard\" or \"us-standard\"", numberReference)}
}
