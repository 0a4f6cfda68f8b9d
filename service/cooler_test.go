package service

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
)

func fp(v float64) *float64 { return &v }

// hotState builds gas g's model and its state at (t, p).
func hotState(t *testing.T, s *Service, g GasInput, tt, p float64) (gas.Model, gas.State) {
	t.Helper()
	m, _, err := s.gasModel(g, tt, p)
	require.NoError(t, err)
	st, err := m.State(physics.Kelvin(tt), physics.Pascal(p))
	require.NoError(t, err)
	return m, st
}

// TestCoolerHumidAirCondensate: moist air (4 % water by mole) leaves a
// cooler at 300 K and 290 kPa saturated. The condensate is the mass balance
// with the IAPWS-IF97 saturation pressure at 300 K, psat = 3536.58941 Pa
// (IAPWS-IF97, IAPWS R7-97 Table 35 verification value, from memory):
// the water left per mole of dry gas is y/(1−y), y = psat/p2 (ideal
// mixing, Dalton's law); the next stage takes the inlet mass flow less the
// condensate.
func TestCoolerHumidAirCondensate(t *testing.T) {
	s := New()
	for _, model := range []string{"ideal", "peng-robinson"} {
		g := GasInput{Model: model, Composition: map[string]float64{"dry-air": 0.96, "H2O": 0.04}}
		m, in := hotState(t, s, g, 420, 300e3)
		const mdot = 5.0
		c := MachineCooler{AfterStage: 1, OutletTemperature: fp(300), PressureDrop: 10e3}
		out, err := s.cool(c, g, m, in, mdot)
		require.NoError(t, err, model)

		const psat, p2 = 3536.58941, 290e3
		y := psat / p2
		const xw = 0.04
		removed := xw - y/(1-y)*(1-xw) // mol per mol of feed
		comp, _ := compositionOfModel(m)
		feedM := comp.MolarMass()
		want := mdot * removed * 0.018015268 / feedM // water 18.015268 g/mol (IAPWS-95, from memory)
		assert.InEpsilon(t, want, out.Condensate, 2e-4, "%s: condensate, kg/s", model)
		assert.InEpsilon(t, mdot-want, out.MassFlow, 1e-6, "%s: mass flow on", model)
		assert.InDelta(t, 300, float64(out.State.Temperature), 1e-9)
		assert.InDelta(t, p2, float64(out.State.Pressure), 1e-9)
		assert.InEpsilon(t, y, out.Gas.Composition["water"], 1e-8, "%s: the gas leaves saturated", model)
		assert.Nil(t, out.Gas.RelativeHumidity)
		// Duty: sensible cooling of the whole stream (≈ cp ΔT, cp of moist
		// air ≈ 1.03 kJ/(kg K) from the composition) plus the latent heat of
		// the condensate (≈ 2.44 MJ/kg at 27 °C, steam tables, from memory).
		approx := mdot*1030*120 + want*2.437e6
		assert.InEpsilon(t, approx, out.Duty, 0.02, "%s: duty", model)
		var codes []string
		for _, w := range out.Warnings {
			codes = append(codes, w.Code)
		}
		assert.Contains(t, codes, "cooler-condensate")
		assert.Contains(t, codes, "cooler-outlet-near-dew-point", "%s: saturated gas is at its dew point", model)
	}
}

// TestCoolerDryConstantGas: a constant-property gas loses m cp ΔT and
// nothing condenses (Çengel & Boles 2008, ch. 5, steady-flow energy
// balance of a heat exchanger); approach on the coolant gives the outlet.
func TestCoolerDryConstantGas(t *testing.T) {
	s := New()
	g := GasInput{Model: "ideal-constant", Cp: fp(1005), Gamma: fp(1.4)}
	m, in := hotState(t, s, g, 400, 200e3)
	out, err := s.cool(MachineCooler{AfterStage: 1, CoolantTemperature: fp(290), Approach: fp(10), PressureDrop: 5e3}, g, m, in, 2)
	require.NoError(t, err)
	assert.InEpsilon(t, 2*1005*100.0, out.Duty, 1e-9)
	assert.Zero(t, out.Condensate)
	assert.Equal(t, 2.0, out.MassFlow)
	assert.InDelta(t, 300, float64(out.State.Temperature), 1e-9)
	assert.InDelta(t, 195e3, float64(out.State.Pressure), 1e-9)
}

// TestCoolerHydrocarbonCondensate: a rich natural gas cooled to 290 K at
// 6 MPa drops a hydrocarbon liquid with Peng-Robinson; the flash's liquid
// leaves, the gas that goes on is lighter and at its dew point (the dew
// point of the remaining gas by DewTemperature, Michelsen 1982, lies at
// the outlet temperature within 0.5 K: a saturated vapour).
func TestCoolerHydrocarbonCondensate(t *testing.T) {
	s := New()
	g := GasInput{Model: "peng-robinson", Composition: map[string]float64{"CH4": 0.80, "C3H8": 0.10, "n-C4H10": 0.06, "n-C5H12": 0.04}}
	m, in := hotState(t, s, g, 380, 6e6)
	out, err := s.cool(MachineCooler{AfterStage: 1, OutletTemperature: fp(290)}, g, m, in, 10)
	require.NoError(t, err)
	require.Greater(t, out.Condensate, 0.0)
	assert.InDelta(t, 10, out.MassFlow+out.Condensate, 1e-9)
	assert.Less(t, out.Gas.Composition["n-pentane"], 0.04)
	r, ok := realOf(out.Model)
	require.True(t, ok)
	td, err := r.DewTemperature(6e6)
	require.NoError(t, err)
	assert.InDelta(t, 290, float64(td), 0.5)
	assert.Less(t, out.Model.MolarMass(), m.MolarMass())
}

// TestCoolerBadInput: each impossible cooler names its field.
func TestCoolerBadInput(t *testing.T) {
	s := New()
	g := GasInput{Model: "ideal-constant", Cp: fp(1005), Gamma: fp(1.4)}
	m, in := hotState(t, s, g, 400, 200e3)
	for _, c := range []struct {
		name  string
		c     MachineCooler
		field string
		shape bool
	}{
		{"hotter than inlet", MachineCooler{OutletTemperature: fp(450)}, "outlet_temperature", false},
		{"colder than coolant", MachineCooler{OutletTemperature: fp(280), CoolantTemperature: fp(290)}, "outlet_temperature", false},
		{"approach hotter than inlet", MachineCooler{CoolantTemperature: fp(390), Approach: fp(20)}, "approach", false},
		{"negative approach", MachineCooler{CoolantTemperature: fp(290), Approach: fp(-1)}, "approach", false},
		{"NaN approach", MachineCooler{CoolantTemperature: fp(290), Approach: fp(math.NaN())}, "approach", false},
		{"approach without coolant", MachineCooler{Approach: fp(10)}, "coolant_temperature", true},
		{"both", MachineCooler{OutletTemperature: fp(300), Approach: fp(10), CoolantTemperature: fp(290)}, "approach", true},
		{"neither", MachineCooler{}, "outlet_temperature", true},
		{"pressure drop above inlet", MachineCooler{OutletTemperature: fp(300), PressureDrop: 300e3}, "pressure_drop", false},
		{"negative pressure drop", MachineCooler{OutletTemperature: fp(300), PressureDrop: -1}, "pressure_drop", false},
		{"NaN outlet", MachineCooler{OutletTemperature: fp(math.NaN())}, "outlet_temperature", false},
	} {
		_, err := s.cool(c.c, g, m, in, 1)
		var ie *InputError
		require.True(t, errors.As(err, &ie), c.name)
		assert.Equal(t, c.field, ie.Field, c.name)
		assert.Equal(t, c.shape, ie.Shape, c.name)
		pe := prefixField(err, "intercooling.")
		require.True(t, errors.As(pe, &ie))
		assert.Equal(t, "intercooling."+c.field, ie.Field)
	}
}
