package units_test

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"os"
	"os/exec"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api/units"
)

// pintRow is one accepted unit string, the same unit written for pint, and
// the SI unit both are converted to.
type pintRow struct {
	dim, unit, pint, si string
}

// pintTable lists every unit string the parsers accept (the completeness
// check below reads them from factors.go) with its pint expression.
// pint (Debian python3-pint) defines its units independently of ours, from
// the same definitions: foot 0.3048 m, inch 0.0254 m, pound 0.453 592 37 kg,
// standard gravity 9.806 65 m/s2, atmosphere 101 325 Pa, bar 1e5 Pa (all
// exact, NIST SP 811 (2008) Appendix B.8), lbf = pound · g_n, horsepower
// 550 ft·lbf/s, Btu(IT)/lb 2326 J/kg (exact, SP 811 B.8), conventional
// mmHg and inHg from mercury of 13.5951 g/cm3.
var pintTable = []pintRow{
	// pressure, Pa absolute (gauge units less the ambient they are read
	// against; TestParsePressure checks the ambient)
	{"pressure", "Pa", "pascal", "pascal"}, {"pressure", "Pa(a)", "pascal", "pascal"}, {"pressure", "PaA", "pascal", "pascal"},
	{"pressure", "hPa", "hectopascal", "pascal"},
	{"pressure", "kPa", "kilopascal", "pascal"}, {"pressure", "kPa(a)", "kilopascal", "pascal"}, {"pressure", "kPaa", "kilopascal", "pascal"},
	{"pressure", "kPag", "kilopascal", "pascal"}, {"pressure", "kPa(g)", "kilopascal", "pascal"},
	{"pressure", "MPa", "megapascal", "pascal"}, {"pressure", "MPa(a)", "megapascal", "pascal"}, {"pressure", "MPaa", "megapascal", "pascal"},
	{"pressure", "MPag", "megapascal", "pascal"}, {"pressure", "MPa(g)", "megapascal", "pascal"},
	{"pressure", "mbar", "millibar", "pascal"}, {"pressure", "mbar(a)", "millibar", "pascal"}, {"pressure", "mbara", "millibar", "pascal"},
	{"pressure", "mbarg", "millibar", "pascal"}, {"pressure", "mbar(g)", "millibar", "pascal"},
	{"pressure", "bar", "bar", "pascal"}, {"pressure", "bara", "bar", "pascal"}, {"pressure", "bar(a)", "bar", "pascal"}, {"pressure", "bar.a", "bar", "pascal"},
	{"pressure", "barg", "bar", "pascal"}, {"pressure", "bar(g)", "bar", "pascal"}, {"pressure", "bar.g", "bar", "pascal"},
	{"pressure", "psia", "psi", "pascal"}, {"pressure", "psi(a)", "psi", "pascal"},
	{"pressure", "psig", "psi", "pascal"}, {"pressure", "psi(g)", "psi", "pascal"},
	{"pressure", "atm", "standard_atmosphere", "pascal"},
	{"pressure", "mmHg", "millimeter_Hg", "pascal"}, {"pressure", "inHg", "inch_Hg", "pascal"}, {"pressure", "torr", "torr", "pascal"},
	// temperature, K (offsets checked at two points)
	{"temperature", "K", "kelvin", "kelvin"}, {"temperature", "kelvin", "kelvin", "kelvin"}, {"temperature", "degK", "kelvin", "kelvin"},
	{"temperature", "degC", "degC", "kelvin"}, {"temperature", "C", "degC", "kelvin"}, {"temperature", "celsius", "degC", "kelvin"},
	{"temperature", "degF", "degF", "kelvin"}, {"temperature", "F", "degF", "kelvin"}, {"temperature", "fahrenheit", "degF", "kelvin"},
	{"temperature", "R", "degR", "kelvin"}, {"temperature", "degR", "degR", "kelvin"}, {"temperature", "rankine", "degR", "kelvin"},
	// mass flow, kg/s
	{"mass-flow", "kg/s", "kilogram/second", "kilogram/second"}, {"mass-flow", "g/s", "gram/second", "kilogram/second"},
	{"mass-flow", "kg/min", "kilogram/minute", "kilogram/second"},
	{"mass-flow", "kg/h", "kilogram/hour", "kilogram/second"}, {"mass-flow", "kg/hr", "kilogram/hour", "kilogram/second"},
	{"mass-flow", "t/h", "metric_ton/hour", "kilogram/second"}, {"mass-flow", "t/hr", "metric_ton/hour", "kilogram/second"},
	{"mass-flow", "tonne/h", "metric_ton/hour", "kilogram/second"},
	{"mass-flow", "t/d", "metric_ton/day", "kilogram/second"}, {"mass-flow", "tonne/d", "metric_ton/day", "kilogram/second"},
	{"mass-flow", "lb/s", "pound/second", "kilogram/second"}, {"mass-flow", "lbm/s", "pound/second", "kilogram/second"},
	{"mass-flow", "lb/min", "pound/minute", "kilogram/second"}, {"mass-flow", "lbm/min", "pound/minute", "kilogram/second"},
	{"mass-flow", "lb/h", "pound/hour", "kilogram/second"}, {"mass-flow", "lb/hr", "pound/hour", "kilogram/second"},
	{"mass-flow", "lbm/h", "pound/hour", "kilogram/second"}, {"mass-flow", "lbm/hr", "pound/hour", "kilogram/second"},
	// actual volume flow, m3/s
	{"volume-flow", "m3/s", "meter**3/second", "meter**3/second"}, {"volume-flow", "am3/s", "meter**3/second", "meter**3/second"},
	{"volume-flow", "m3/min", "meter**3/minute", "meter**3/second"}, {"volume-flow", "am3/min", "meter**3/minute", "meter**3/second"},
	{"volume-flow", "m3/h", "meter**3/hour", "meter**3/second"}, {"volume-flow", "m3/hr", "meter**3/hour", "meter**3/second"},
	{"volume-flow", "am3/h", "meter**3/hour", "meter**3/second"}, {"volume-flow", "am3/hr", "meter**3/hour", "meter**3/second"},
	{"volume-flow", "L/s", "liter/second", "meter**3/second"}, {"volume-flow", "L/min", "liter/minute", "meter**3/second"},
	{"volume-flow", "ft3/s", "foot**3/second", "meter**3/second"}, {"volume-flow", "acfs", "foot**3/second", "meter**3/second"},
	{"volume-flow", "ft3/min", "foot**3/minute", "meter**3/second"}, {"volume-flow", "acfm", "foot**3/minute", "meter**3/second"},
	{"volume-flow", "ft3/h", "foot**3/hour", "meter**3/second"}, {"volume-flow", "ft3/hr", "foot**3/hour", "meter**3/second"},
	{"volume-flow", "acfh", "foot**3/hour", "meter**3/second"},
	// rotational speed, rev/min; Hz and rev/s are cycles (revolutions) per
	// second for a shaft (pint reads a bare Hz as 1/s, i.e. rad/s)
	{"speed", "rpm", "revolution/minute", "revolution/minute"}, {"speed", "rev/min", "revolution/minute", "revolution/minute"},
	{"speed", "r/min", "revolution/minute", "revolution/minute"}, {"speed", "1/min", "revolution/minute", "revolution/minute"},
	{"speed", "rev/s", "revolution/second", "revolution/minute"}, {"speed", "rps", "revolution/second", "revolution/minute"},
	{"speed", "Hz", "revolution/second", "revolution/minute"},
	{"speed", "rad/s", "radian/second", "revolution/minute"},
	// velocity, m/s
	{"velocity", "m/s", "meter/second", "meter/second"}, {"velocity", "km/h", "kilometer/hour", "meter/second"},
	{"velocity", "ft/s", "foot/second", "meter/second"}, {"velocity", "ft/min", "foot/minute", "meter/second"},
	// length, m
	{"length", "m", "meter", "meter"}, {"length", "cm", "centimeter", "meter"}, {"length", "mm", "millimeter", "meter"},
	{"length", "in", "inch", "meter"}, {"length", "inch", "inch", "meter"}, {"length", "ft", "foot", "meter"},
	// power, W
	{"power", "W", "watt", "watt"}, {"power", "kW", "kilowatt", "watt"}, {"power", "MW", "megawatt", "watt"},
	{"power", "hp", "horsepower", "watt"}, {"power", "bhp", "horsepower", "watt"}, {"power", "hp(metric)", "metric_horsepower", "watt"},
	// specific energy and head, J/kg (a head in m or ft is a column under
	// standard gravity)
	{"specific-energy", "J/kg", "joule/kilogram", "joule/kilogram"}, {"specific-energy", "m2/s2", "meter**2/second**2", "joule/kilogram"},
	{"specific-energy", "kJ/kg", "kilojoule/kilogram", "joule/kilogram"},
	{"specific-energy", "Btu/lb", "Btu_it/pound", "joule/kilogram"}, {"specific-energy", "Btu/lbm", "Btu_it/pound", "joule/kilogram"},
	{"specific-energy", "ft.lbf/lbm", "foot*force_pound/pound", "joule/kilogram"}, {"specific-energy", "ft.lbf/lb", "foot*force_pound/pound", "joule/kilogram"},
	{"specific-energy", "ftlbf/lbm", "foot*force_pound/pound", "joule/kilogram"}, {"specific-energy", "ftlbf/lb", "foot*force_pound/pound", "joule/kilogram"},
	{"specific-energy", "ft.lb/lb", "foot*force_pound/pound", "joule/kilogram"},
	{"specific-energy", "m", "meter*standard_gravity", "joule/kilogram"}, {"specific-energy", "ft", "foot*standard_gravity", "joule/kilogram"},
	// standard volume flow, m3/s at the unit's reference conditions
	{"standard-volume-flow", "Nm3/s", "meter**3/second", "meter**3/second"}, {"standard-volume-flow", "Nm3/h", "meter**3/hour", "meter**3/second"},
	{"standard-volume-flow", "Nm3/hr", "meter**3/hour", "meter**3/second"}, {"standard-volume-flow", "Nm3/d", "meter**3/day", "meter**3/second"},
	{"standard-volume-flow", "Sm3/s", "meter**3/second", "meter**3/second"}, {"standard-volume-flow", "Sm3/h", "meter**3/hour", "meter**3/second"},
	{"standard-volume-flow", "Sm3/hr", "meter**3/hour", "meter**3/second"}, {"standard-volume-flow", "Sm3/d", "meter**3/day", "meter**3/second"},
	{"standard-volume-flow", "MMSCFD", "1e6*foot**3/day", "meter**3/second"}, {"standard-volume-flow", "MMSCF/d", "1e6*foot**3/day", "meter**3/second"},
	{"standard-volume-flow", "MSCFD", "1e3*foot**3/day", "meter**3/second"}, {"standard-volume-flow", "MSCF/d", "1e3*foot**3/day", "meter**3/second"},
	{"standard-volume-flow", "SCFD", "foot**3/day", "meter**3/second"}, {"standard-volume-flow", "SCF/d", "foot**3/day", "meter**3/second"},
	{"standard-volume-flow", "SCFH", "foot**3/hour", "meter**3/second"}, {"standard-volume-flow", "SCF/h", "foot**3/hour", "meter**3/second"},
	{"standard-volume-flow", "SCFM", "foot**3/minute", "meter**3/second"}, {"standard-volume-flow", "SCF/min", "foot**3/minute", "meter**3/second"},
}

// gauge matches the gauge pressure units.
var gauge = regexp.MustCompile(`^(kpa|mpa|mbar|bar|psi)(g|\(g\)|\.g)$`)

// ours converts "x UNIT" with the service's parsers (a gauge pressure less
// the standard atmosphere it is read against).
func ours(t *testing.T, dim, unit string, x float64) float64 {
	t.Helper()
	s := strings.TrimSpace(jsonNumber(x) + " " + unit)
	var v float64
	var err error
	switch dim {
	case "pressure":
		v, err = units.ParsePressure(s, units.StandardAtmosphere)
		if gauge.MatchString(strings.ToLower(unit)) {
			v -= units.StandardAtmosphere // gauge: the ambient is added
		}
	case "temperature":
		v, err = units.ParseTemperature(s)
	case "mass-flow":
		v, err = units.ParseMassFlow(s)
	case "volume-flow":
		v, err = units.ParseVolumeFlow(s)
	case "speed":
		v, err = units.ParseSpeed(s)
	case "velocity":
		v, err = units.ParseVelocity(s)
	case "length":
		v, err = units.ParseLength(s)
	case "power":
		v, err = units.ParsePower(s)
	case "specific-energy":
		v, err = units.ParseSpecificEnergy(s)
	case "standard-volume-flow":
		var f units.StandardFlow
		f, err = units.ParseStandardVolumeFlow(s)
		v = f.Flow
	default:
		t.Fatalf("no parser for %s", dim)
	}
	require.NoError(t, err, s)
	return v
}

func jsonNumber(x float64) string {
	b, _ := json.Marshal(x)
	return string(b)
}

// pintScript converts each request with pint's default registry.
const pintScript = `
import json, sys
import pint
u = pint.UnitRegistry()
out = {"version": pint.__version__, "values": []}
for r in json.load(sys.stdin):
    q = u.Quantity(r["x"], u.parse_units(r["unit"])) if r["offset"] else r["x"] * u.parse_expression(r["unit"])
    out["values"].append(q.to(r["si"]).magnitude)
json.dump(out, sys.stdout)
`

// runPint runs pintScript with Debian's python3 (python3-pint), or skips
// when pint is missing, unless STAGEWRIGHT_REQUIRE_PINT is set (CI).
func runPint(t *testing.T, reqs []map[string]any) []float64 {
	t.Helper()
	python := "/usr/bin/python3"
	if _, err := os.Stat(python); err != nil {
		python = "python3"
	}
	in, err := json.Marshal(reqs)
	require.NoError(t, err)
	cmd := exec.Command(python, "-c", pintScript)
	cmd.Stdin = bytes.NewReader(in)
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	out, err := cmd.Output()
	if err != nil {
		missing := errors.Is(err, exec.ErrNotFound) || strings.Contains(stderr.String(), "No module named 'pint'")
		if missing && os.Getenv("STAGEWRIGHT_REQUIRE_PINT") == "" {
			t.Skipf("pint is not installed (apt-get install python3-pint; .ci/run requires it): %v", err)
		}
		t.Fatalf("pint: %v\n%s", err, stderr.String())
	}
	var res struct {
		Version string    `json:"version"`
		Values  []float64 `json:"values"`
	}
	require.NoError(t, json.Unmarshal(out, &res))
	require.Len(t, res.Values, len(reqs))
	t.Logf("pint %s, %d conversions", res.Version, len(reqs))
	return res.Values
}

// TestUnitsAgainstPint (issue 13, units): every unit the parsers accept
// converts to SI as pint does, to 1e-12 relative (both compute the same
// exact definitions in float64), at 1 and 1000 of the unit, and for
// degC and degF also at 0 and -40 (the offsets).
func TestUnitsAgainstPint(t *testing.T) {
	var reqs []map[string]any
	type point struct {
		row pintRow
		x   float64
	}
	var points []point
	for _, r := range pintTable {
		xs := []float64{1, 1000}
		offset := r.dim == "temperature"
		if r.pint == "degC" || r.pint == "degF" {
			xs = append(xs, 0, -40)
		}
		for _, x := range xs {
			reqs = append(reqs, map[string]any{"x": x, "unit": r.pint, "si": r.si, "offset": offset})
			points = append(points, point{r, x})
		}
	}
	want := runPint(t, reqs)
	for i, p := range points {
		got := ours(t, p.row.dim, p.row.unit, p.x)
		assert.InDelta(t, want[i], got, 1e-12*math.Max(1, math.Abs(want[i])), "%g %s (%s) = %.17g, pint %s: %.17g",
			p.x, p.row.unit, p.row.dim, got, p.row.pint, want[i])
	}
}

// TestExactFactors: the exact definitions the conversion table is built
// from, as NIST SP 811 (2008), Appendix B.8 and B.9, prints them, through
// the parsers.
func TestExactFactors(t *testing.T) {
	tests := []struct {
		dim, in string
		want    float64
		source  string
	}{
		{"length", "1 ft", 0.3048, "NIST SP 811 B.8: foot = 0.3048 m, exact"},
		{"length", "1 in", 0.0254, "NIST SP 811 B.8: inch = 0.0254 m, exact"},
		{"mass-flow", "1 lb/s", 0.45359237, "NIST SP 811 B.8: pound (avoirdupois) = 0.453 592 37 kg, exact"},
		{"pressure", "1 atm", 101325, "NIST SP 811 B.8: standard atmosphere = 101 325 Pa, exact"},
		{"pressure", "1 bar", 1e5, "NIST SP 811 B.8: bar = 1e5 Pa, exact"},
		{"pressure", "1 psia", 4.4482216152605 / (0.0254 * 0.0254), "NIST SP 811 B.8: lbf = 4.448 221 615 260 5 N (exact), psi = lbf/in2 = 6.894 757 E+03 Pa"},
		{"specific-energy", "1 m", 9.80665, "NIST SP 811 B.8: standard acceleration of gravity 9.806 65 m/s2, exact"},
		{"specific-energy", "1 Btu/lb", 2326, "NIST SP 811 B.8: Btu(IT)/lb = 2326 J/kg, exact"},
		{"temperature", "0 degC", 273.15, "NIST SP 811 B.9: T/K = t/°C + 273.15, exact"},
		{"temperature", "0 degF", 459.67 / 1.8, "NIST SP 811 B.9: T/K = (t/°F + 459.67)/1.8, exact"},
		{"power", "1 hp", 550 * 0.3048 * 4.4482216152605, "NIST SP 811 B.8: horsepower (550 ft·lbf/s) = 745.699 9 W"},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			var v float64
			switch tt.dim {
			case "length":
				v, _ = units.ParseLength(tt.in)
			case "mass-flow":
				v, _ = units.ParseMassFlow(tt.in)
			case "pressure":
				v, _ = units.ParsePressure(tt.in, units.StandardAtmosphere)
			case "specific-energy":
				v, _ = units.ParseSpecificEnergy(tt.in)
			case "temperature":
				v, _ = units.ParseTemperature(tt.in)
			case "power":
				v, _ = units.ParsePower(tt.in)
			}
			assert.InDelta(t, tt.want, v, 1e-12*tt.want, tt.source)
		})
	}
}

// TestPintTableComplete: the table above names every unit string that
// factors.go accepts (its case labels), so that a unit added later is
// cross-checked too.
func TestPintTableComplete(t *testing.T) {
	src, err := os.ReadFile("factors.go")
	require.NoError(t, err)
	funcDim := map[string]string{"pressureUnit": "pressure", "temperatureUnit": "temperature", "massFlowUnit": "mass-flow",
		"volumeFlowUnit": "volume-flow", "speedUnit": "speed", "velocityUnit": "velocity", "lengthUnit": "length",
		"powerUnit": "power", "specificEnergyUnit": "specific-energy", "standardFlowUnit": "standard-volume-flow"}
	have := map[string]bool{}
	for _, r := range pintTable {
		have[r.dim+" "+strings.ToLower(r.unit)] = true
	}
	fn := regexp.MustCompile(`^func (\w+)\(`)
	label := regexp.MustCompile(`"([^"]+)"`)
	dim, n := "", 0
	for _, line := range strings.Split(string(src), "\n") {
		if m := fn.FindStringSubmatch(line); m != nil {
			dim = funcDim[m[1]]
			continue
		}
		if dim == "" || !strings.HasPrefix(strings.TrimSpace(line), "case ") {
			continue
		}
		for _, m := range label.FindAllStringSubmatch(line, -1) {
			n++
			assert.True(t, have[dim+" "+m[1]], "%s unit %q of factors.go is not in pintTable", dim, m[1])
		}
	}
	assert.Greater(t, n, 100, "case labels read from factors.go")
}
