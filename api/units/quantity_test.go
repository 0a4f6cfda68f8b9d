package units_test

import (
	"encoding/json"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api/units"
)

type suction struct {
	Pressure    *units.Quantity `json:"pressure"`
	Temperature *units.Quantity `json:"temperature"`
	Flow        *units.Quantity `json:"flow,omitempty"`
}

func TestQuantityUnmarshal(t *testing.T) {
	var s suction
	require.NoError(t, json.Unmarshal([]byte(`{"pressure": "14.7 psia", "temperature": 308.15, "flow": null}`), &s))
	require.NotNil(t, s.Pressure)
	assert.True(t, s.Pressure.IsText())
	assert.Equal(t, "14.7 psia", s.Pressure.Text)
	assert.False(t, s.Temperature.IsText())
	assert.Nil(t, s.Flow, "null leaves an optional field unset")

	p, err := s.Pressure.Pressure(units.StandardAtmosphere)
	require.NoError(t, err)
	assert.InEpsilon(t, 14.7*6894.757, p, 5e-7) // NIST SP 811 (2008), B.8 psi
	tk, err := s.Temperature.Temperature()
	require.NoError(t, err)
	assert.InDelta(t, 308.15, tk, 1e-12) // a number is already SI (K)
}

func TestQuantityUnmarshalErrors(t *testing.T) {
	tests := []struct{ in, reason string }{
		{`{"pressure": ""}`, "must not be an empty string"},
		{`{"pressure": "   "}`, "must not be an empty string"},
		{`{"pressure": true}`, "not a boolean"},
		{`{"pressure": {"value": 1}}`, "not an object"},
		{`{"pressure": [1]}`, "not an array"},
		{`{"pressure": 1e400}`, "not a finite number"},
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			var s suction
			err := json.Unmarshal([]byte(tc.in), &s)
			require.ErrorIs(t, err, units.ErrInvalid)
			assert.Contains(t, err.Error(), tc.reason)
		})
	}
	var q units.Quantity
	require.ErrorIs(t, q.UnmarshalJSON(nil), units.ErrInvalid)
	require.ErrorIs(t, q.UnmarshalJSON([]byte("-Inf")), units.ErrInvalid)
	require.ErrorIs(t, q.UnmarshalJSON([]byte(`"unterminated`)), units.ErrInvalid)
}

func TestQuantityMarshal(t *testing.T) {
	b, err := json.Marshal(suction{Pressure: &units.Quantity{Text: "12 barg"}, Temperature: &units.Quantity{Value: 300}})
	require.NoError(t, err)
	assert.JSONEq(t, `{"pressure": "12 barg", "temperature": 300}`, string(b))
	_, err = json.Marshal(units.Quantity{Value: math.NaN()})
	require.Error(t, err)
	assert.Equal(t, "12 barg", units.Quantity{Text: "12 barg"}.String())
	assert.Equal(t, "101325", units.Quantity{Value: 101325}.String())
}

func TestQuantityDimensions(t *testing.T) {
	num := func(v float64) units.Quantity { return units.Quantity{Value: v} }
	txt := func(s string) units.Quantity { return units.Quantity{Text: s} }
	tests := []struct {
		name string
		get  func() (float64, error)
		want float64
	}{
		// Numbers pass through in the field's unit; strings convert (NIST
		// SP 811 (2008), B.8/B.9 factors as in parse_test.go).
		{"pressure number", func() (float64, error) { return num(2e5).Pressure(0) }, 2e5},
		{"pressure gauge", func() (float64, error) { return txt("1 barg").Pressure(units.StandardAtmosphere) }, 201325},
		{"temperature text", func() (float64, error) { return txt("95 degF").Temperature() }, 308.15},
		{"mass flow number", func() (float64, error) { return num(3.2).MassFlow() }, 3.2},
		{"mass flow text", func() (float64, error) { return txt("3.6 t/h").MassFlow() }, 1},
		{"volume flow text", func() (float64, error) { return txt("9000 m3/h").VolumeFlow() }, 2.5},
		{"speed number is rpm", func() (float64, error) { return num(21000).Speed() }, 21000},
		{"speed text", func() (float64, error) { return txt("350 Hz").Speed() }, 21000},
		{"velocity text", func() (float64, error) { return txt("1000 ft/s").Velocity() }, 304.8},
		{"length text", func() (float64, error) { return txt("350 mm").Length() }, 0.35},
		{"power text", func() (float64, error) { return txt("1.2 MW").Power() }, 1.2e6},
		{"energy text", func() (float64, error) { return txt("85 kJ/kg").SpecificEnergy() }, 85e3},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := tc.get()
			require.NoError(t, err)
			assert.InEpsilon(t, tc.want, got, 1e-12)
		})
	}
}

func TestQuantityNumberErrors(t *testing.T) {
	for _, v := range []float64{math.NaN(), math.Inf(1), math.Inf(-1)} {
		q := units.Quantity{Value: v}
		for name, get := range map[string]func() (float64, error){
			"pressure":    func() (float64, error) { return q.Pressure(units.StandardAtmosphere) },
			"temperature": q.Temperature, "mass": q.MassFlow, "volume": q.VolumeFlow, "speed": q.Speed,
			"velocity": q.Velocity, "length": q.Length, "power": q.Power, "energy": q.SpecificEnergy,
		} {
			_, err := get()
			require.ErrorIs(t, err, units.ErrInvalid, "%s %g", name, v)
			assert.Contains(t, err.Error(), "must be a finite number")
		}
		_, err := q.StandardVolumeFlow(units.ReferenceNormal)
		require.ErrorIs(t, err, units.ErrInvalid)
	}
}

func TestQuantityStandardVolumeFlow(t *testing.T) {
	f, err := units.Quantity{Text: "48 MMSCFD"}.StandardVolumeFlow("")
	require.NoError(t, err)
	assert.Equal(t, units.ReferenceUSStandard, f.Reference)
	assert.InEpsilon(t, 48*0.32774128, f.Flow, 1e-12) // ft = 0.3048 m, NIST SP 811 B.8

	f, err = units.Quantity{Value: 0.6}.StandardVolumeFlow(units.ReferenceStandard)
	require.NoError(t, err)
	assert.Equal(t, units.ReferenceStandard, f.Reference)
	assert.InEpsilon(t, 0.6, f.Flow, 1e-15)

	_, err = units.Quantity{Value: 0.6}.StandardVolumeFlow("")
	require.ErrorIs(t, err, units.ErrInvalid)
	assert.Contains(t, err.Error(), "does not say its reference conditions")
	_, err = units.Quantity{Value: 0.6}.StandardVolumeFlow("stp")
	require.ErrorIs(t, err, units.ErrInvalid)
	assert.Contains(t, err.Error(), "unknown reference conditions")
}

func FuzzQuantityUnmarshalJSON(f *testing.F) {
	for _, s := range []string{`"14.7 psia"`, `101325`, `null`, `""`, `true`, `-1e400`, `"2400 Nm3/h"`, `"35 °C"`} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, b []byte) {
		var q units.Quantity
		if err := q.UnmarshalJSON(b); err != nil {
			return
		}
		for _, get := range []func() (float64, error){
			func() (float64, error) { return q.Pressure(units.StandardAtmosphere) },
			q.Temperature, q.MassFlow, q.VolumeFlow, q.Speed, q.Velocity, q.Length, q.Power, q.SpecificEnergy,
		} {
			if v, err := get(); err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
				t.Fatalf("%q gave %g without error", b, v)
			}
		}
		if sf, err := q.StandardVolumeFlow(units.ReferenceNormal); err == nil && (math.IsNaN(sf.Flow) || math.IsInf(sf.Flow, 0)) {
			t.Fatalf("%q gave %+v without error", b, sf)
		}
		if _, err := q.MarshalJSON(); err != nil {
			t.Fatalf("%q decoded but does not encode: %v", b, err)
		}
	})
}
