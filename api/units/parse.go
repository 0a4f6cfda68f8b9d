package units

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode"
)

// ErrInvalid is the sentinel that every *Error unwraps to.
var ErrInvalid = errors.New("units: invalid physical quantity")

// Error says why a physical input could not be read: Quantity is its kind
// ("pressure"), Input the text (or number) as given and Reason a sentence
// for an engineer.
type Error struct {
	Quantity string
	Input    string
	Reason   string
}

// Error returns the reason, prefixed "units:".
func (e *Error) Error() string { return "units: " + e.Reason }

// Unwrap returns ErrInvalid.
func (e *Error) Unwrap() error { return ErrInvalid }

// dimension describes one kind of quantity for the parser.
type dimension struct {
	name    string // "pressure"
	si      string // SI unit of a plain number, "Pa absolute"
	units   string // accepted units, for messages
	example string // "12 bara"
	lookup  func(string) (unit, bool)
}

// The dimensions, built on each call: the package holds no variables.
func pressureDim() dimension {
	return dimension{"pressure", "Pa absolute", pressureUnits, "12 bara", pressureUnit}
}
func temperatureDim() dimension {
	return dimension{"temperature", "K", temperatureUnits, "35 degC", temperatureUnit}
}
func massFlowDim() dimension {
	return dimension{"mass flow", "kg/s", massFlowUnits, "3600 kg/h", massFlowUnit}
}
func volumeFlowDim() dimension {
	return dimension{"actual volume flow", "m3/s", volumeFlowUnits, "9000 m3/h", volumeFlowUnit}
}
func speedDim() dimension {
	return dimension{"rotational speed", "rev/min", speedUnits, "21000 rpm", speedUnit}
}
func velocityDim() dimension {
	return dimension{"velocity", "m/s", velocityUnits, "120 m/s", velocityUnit}
}
func lengthDim() dimension { return dimension{"length", "m", lengthUnits, "350 mm", lengthUnit} }
func powerDim() dimension  { return dimension{"power", "W", powerUnits, "1.2 MW", powerUnit} }
func specificEnergyDim() dimension {
	return dimension{"specific energy", "J/kg", specificEnergyUnits, "85 kJ/kg", specificEnergyUnit}
}
func standardFlowDim() dimension {
	return dimension{"standard volume flow", "m3/s at stated reference conditions", standardFlowUnits, "2400 Nm3/h", standardFlowUnit}
}

// dimensions lists every dimension, to tell a unit given to the wrong field.
func dimensions() [10]dimension {
	return [10]dimension{pressureDim(), temperatureDim(), massFlowDim(), volumeFlowDim(), standardFlowDim(),
		speedDim(), velocityDim(), lengthDim(), powerDim(), specificEnergyDim()}
}

// ParsePressure returns the absolute pressure in Pa written in s, e.g.
// "14.7 psia", "12 bara", "3.5 MPa", "750 mmHg". A gauge unit ("12 barg",
// "50 psig", "300 kPag") adds ambient, the absolute ambient pressure in Pa,
// which must then be finite and > 0 (pass StandardAtmosphere when the
// request gives none). "bar" and "kPa" without a suffix are absolute; "psi"
// alone is refused as ambiguous. Factors: NIST SP 811 (2008), B.8 (psi =
// 6894.757 293 168 Pa, bar = 1e5 Pa, atm = 101 325 Pa exactly; mmHg and
// inHg are the conventional units, 133.322 387 415 Pa and 3386.388 64 Pa).
func ParsePressure(s string, ambient float64) (float64, error) {
	v, u, err := parse(pressureDim(), s)
	if err != nil {
		return 0, err
	}
	p := v * u.factor
	if u.gauge {
		if !(ambient > 0) || math.IsInf(ambient, 0) {
			return 0, &Error{Quantity: pressureDim().name, Input: clipText(s),
				Reason: fmt.Sprintf("gauge pressure %q needs the ambient pressure as a finite absolute pressure above 0 Pa (got %g)", clipText(s), ambient)}
		}
		p += ambient
	}
	if err := finiteSI(pressureDim(), s, p); err != nil {
		return 0, err
	}
	if p < 0 {
		return 0, &Error{Quantity: pressureDim().name, Input: clipText(s),
			Reason: fmt.Sprintf("pressure %q is %.6g Pa absolute, below vacuum; an absolute pressure cannot be negative", clipText(s), p)}
	}
	return p, nil
}

// ParseTemperature returns the temperature in K written in s, e.g.
// "35 degC", "35 °C", "95 degF", "300 K", "540 R". Conversions (NIST SP
// 811 (2008), B.9): T/K = t/°C + 273.15; T/K = (t/°F + 459.67)/1.8;
// T/K = T/°R / 1.8. A temperature below absolute zero is refused.
func ParseTemperature(s string) (float64, error) {
	v, u, err := parse(temperatureDim(), s)
	if err != nil {
		return 0, err
	}
	t := v*u.factor + u.offset
	if err := finiteSI(temperatureDim(), s, t); err != nil {
		return 0, err
	}
	if t < 0 {
		return 0, &Error{Quantity: temperatureDim().name, Input: clipText(s),
			Reason: fmt.Sprintf("temperature %q is %.6g K, below absolute zero", clipText(s), t)}
	}
	return t, nil
}

// ParseMassFlow returns the mass flow in kg/s written in s, e.g. "3600
// kg/h", "12 t/h", "25000 lb/h" (lb = 0.453 592 37 kg exactly, NIST SP 811
// (2008), B.8; t = 1000 kg).
func ParseMassFlow(s string) (float64, error) { return parseLinear(massFlowDim(), s) }

// ParseVolumeFlow returns the actual volume flow in m3/s written in s, e.g.
// "9000 m3/h", "5300 ACFM", "150 L/s" (ft = 0.3048 m exactly, NIST SP 811
// (2008), B.8, so ft3/min = 4.719 474 432e-4 m3/s). Standard volume units
// ("Nm3/h", "SCFM") are refused here: see ParseStandardVolumeFlow.
func ParseVolumeFlow(s string) (float64, error) { return parseLinear(volumeFlowDim(), s) }

// ParseSpeed returns the rotational speed in rev/min (the unit of the
// trade, not SI) written in s, e.g. "21000 rpm", "350 Hz", "2200 rad/s"
// (rev/s = Hz = 60 rev/min; rad/s = 60/(2π) rev/min).
func ParseSpeed(s string) (float64, error) { return parseLinear(speedDim(), s) }

// ParseVelocity returns the velocity in m/s written in s, e.g. "120 m/s",
// "400 ft/s" (ft = 0.3048 m exactly, NIST SP 811 (2008), B.8).
func ParseVelocity(s string) (float64, error) { return parseLinear(velocityDim(), s) }

// ParseLength returns the length in m written in s, e.g. "350 mm",
// "14 in", "1.2 ft" (in = 0.0254 m, ft = 0.3048 m exactly, NIST SP 811
// (2008), B.8).
func ParseLength(s string) (float64, error) { return parseLinear(lengthDim(), s) }

// ParsePower returns the power in W written in s, e.g. "1.2 MW", "850 kW",
// "1500 hp". hp is the mechanical horsepower, 550 ft·lbf/s =
// 745.699 871 582 270 2 W (NIST SP 811 (2008), B.8: 7.456 999 E+02 W);
// "hp(metric)" is 75 kgf·m/s = 735.498 75 W.
func ParsePower(s string) (float64, error) { return parseLinear(powerDim(), s) }

// ParseSpecificEnergy returns the specific energy (head, work, enthalpy
// difference) in J/kg written in s, e.g. "85 kJ/kg", "28000 ft·lbf/lbm",
// "36 Btu/lb", or a head as a height of fluid column, "9000 m" or
// "29000 ft", converted with standard gravity g_n = 9.806 65 m/s2
// (ft·lbf/lbm = g_n · 0.3048 m = 2.989 066 92 J/kg; Btu(IT)/lb = 2326 J/kg
// exactly; NIST SP 811 (2008), B.8).
func ParseSpecificEnergy(s string) (float64, error) { return parseLinear(specificEnergyDim(), s) }

// StandardFlow is a standard volume flow: Flow in m3/s at the reference
// conditions named Reference ("normal", "standard" or "us-standard").
type StandardFlow struct {
	Flow      float64
	Reference string
}

// ParseStandardVolumeFlow returns the standard volume flow written in s as
// m3/s at its reference conditions, with their name: "2400 Nm3/h" is
// normal (0 °C, 101.325 kPa, DIN 1343), "Sm3/h" standard (15 °C,
// 101.325 kPa, ISO 13443), "MMSCFD", "SCFM" and the other scf units
// us-standard (60 °F, 14.696 psia). ft3 = 0.028 316 846 592 m3 exactly
// (NIST SP 811 (2008), B.8), so 1 MMSCFD = 0.327 741 28 m3/s. Converting to
// a mass flow needs the gas density at the reference conditions, which is
// the service's job.
func ParseStandardVolumeFlow(s string) (StandardFlow, error) {
	v, u, err := parse(standardFlowDim(), s)
	if err != nil {
		return StandardFlow{}, err
	}
	q := v * u.factor
	if err := finiteSI(standardFlowDim(), s, q); err != nil {
		return StandardFlow{}, err
	}
	return StandardFlow{Flow: q, Reference: u.ref}, nil
}

func parseLinear(d dimension, s string) (float64, error) {
	v, u, err := parse(d, s)
	if err != nil {
		return 0, err
	}
	si := v*u.factor + u.offset
	if err := finiteSI(d, s, si); err != nil {
		return 0, err
	}
	return si, nil
}

// parse splits s into a number and a unit of dimension d.
func parse(d dimension, s string) (float64, unit, error) {
	text := strings.TrimSpace(s)
	if text == "" {
		return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
			Reason: fmt.Sprintf("empty %s; give a JSON number in %s or a string with a unit such as %q", d.name, d.si, d.example)}
	}
	num, rest := splitNumber(text)
	if num == "" {
		return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
			Reason: fmt.Sprintf("%s %q does not start with a number; write the value, then the unit, e.g. %q", d.name, clipText(s), d.example)}
	}
	v, err := strconv.ParseFloat(num, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
			Reason: fmt.Sprintf("the number in %s %q is out of range", d.name, clipText(s))}
	}
	unitText := strings.TrimSpace(rest)
	if unitText == "" {
		return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
			Reason: fmt.Sprintf("%s %q has no unit; send a JSON number for %s or add a unit: %s", d.name, clipText(s), d.si, d.units)}
	}
	if unitText[0] == ',' {
		return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
			Reason: fmt.Sprintf("%s %q: write the number with a decimal point and no thousands separator, e.g. %q", d.name, clipText(s), d.example)}
	}
	key := normalize(unitText)
	if u, ok := d.lookup(key); ok {
		return v, u, nil
	}
	if d.name == "pressure" && key == "psi" {
		return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
			Reason: fmt.Sprintf("pressure %q does not say whether it is absolute or gauge; write psia or psig", clipText(s))}
	}
	for _, other := range dimensions() {
		if other.name == d.name {
			continue
		}
		if _, ok := other.lookup(key); ok {
			return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
				Reason: fmt.Sprintf("%q is %s %s unit, but this is %s %s; use %s", clipText(unitText), article(other.name), other.name, article(d.name), d.name, d.units)}
		}
	}
	return 0, unit{}, &Error{Quantity: d.name, Input: clipText(s),
		Reason: fmt.Sprintf("unknown %s unit %q; use %s", d.name, clipText(unitText), d.units)}
}

// article returns "an" before a vowel, else "a".
func article(word string) string {
	if word != "" && strings.ContainsRune("aeiou", rune(word[0])) {
		return "an"
	}
	return "a"
}

// finiteSI refuses a conversion that overflowed.
func finiteSI(d dimension, s string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return &Error{Quantity: d.name, Input: clipText(s),
			Reason: fmt.Sprintf("%s %q is too large to convert to %s", d.name, clipText(s), d.si)}
	}
	return nil
}

// splitNumber returns the leading decimal number of s (optional sign,
// digits with an optional decimal point, optional exponent) and the rest.
// It accepts no "NaN", "Inf", hexadecimal or digit separators.
func splitNumber(s string) (num, rest string) {
	i := 0
	if i < len(s) && (s[i] == '+' || s[i] == '-') {
		i++
	}
	digits := 0
	for i < len(s) && isDigit(s[i]) {
		i++
		digits++
	}
	if i < len(s) && s[i] == '.' {
		i++
		for i < len(s) && isDigit(s[i]) {
			i++
			digits++
		}
	}
	if digits == 0 {
		return "", s
	}
	if i < len(s) && (s[i] == 'e' || s[i] == 'E') {
		j := i + 1
		if j < len(s) && (s[j] == '+' || s[j] == '-') {
			j++
		}
		if j < len(s) && isDigit(s[j]) {
			for j < len(s) && isDigit(s[j]) {
				j++
			}
			i = j
		}
	}
	return s[:i], s[i:]
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }

// normalize folds a unit symbol to the lookup key: lower case, no spaces,
// degree signs as "deg", superscripts as digits, "·", "⋅", "*" and "-" as
// ".".
func normalize(u string) string {
	var b strings.Builder
	b.Grow(len(u) + 4)
	for _, r := range u {
		switch {
		case unicode.IsSpace(r):
		case r == '°' || r == 'º':
			b.WriteString("deg")
		case r == '℃':
			b.WriteString("degc")
		case r == '℉':
			b.WriteString("degf")
		case r == '³':
			b.WriteByte('3')
		case r == '²':
			b.WriteByte('2')
		case r == '·' || r == '⋅' || r == '*' || r == '-' || r == '•':
			b.WriteByte('.')
		case r == '^':
			// "m^3/s" reads as "m3/s"
		default:
			b.WriteRune(unicode.ToLower(r))
		}
	}
	return b.String()
}

// maxEcho bounds how much of a client's text an error quotes.
const maxEcho = 64

// clipText shortens a client's text quoted in an error to maxEcho bytes
// (on a UTF-8 boundary) and says how long it was: a long string is not
// echoed back whole (twice, in a problem's detail and its field error).
func clipText(s string) string {
	if len(s) <= maxEcho {
		return s
	}
	n := maxEcho
	for n > 0 && s[n]&0xC0 == 0x80 {
		n--
	}
	return s[:n] + "… (" + strconv.Itoa(len(s)) + " bytes)"
}
