package path_test

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/path"
)

// heunPath integrates the same polytropic path as path.StepwisePath by a
// different method: in p (not ln p), on enthalpy through the model's (P,h)
// flash (not on T through cp and Schultz X), with Heun's trapezoidal
// predictor-corrector,
//
//	dh/dp = v/ηp,  dHp/dp = v
//
// (the definition of the polytropic path, Dixon & Hall, Fluid Mechanics and
// Thermodynamics of Turbomachinery, 7th ed., 2014, ch. 2), with n steps.
func heunPath(t *testing.T, m gas.GERG, s1 gas.State, p2, eta float64, n int) (t2, head float64) {
	t.Helper()
	p, h := float64(s1.Pressure), float64(s1.Enthalpy)
	dp := (p2 - p) / float64(n)
	v := 1 / float64(s1.Density)
	for range n {
		hp := h + dp*v/eta
		pred, err := m.GasStateFromPH(physics.Pascal(p+dp), physics.JoulePerKg(hp))
		require.NoError(t, err)
		v2 := 1 / float64(pred.Density)
		h += dp * (v + v2) / (2 * eta)
		head += dp * (v + v2) / 2
		p += dp
		st, err := m.GasStateFromPH(physics.Pascal(p), physics.JoulePerKg(h))
		require.NoError(t, err)
		v = 1 / float64(st.Density)
		t2 = float64(st.Temperature)
	}
	return t2, head
}

// TestStepwisePathWithGERG: a natural-gas compression from 30 to 60 bar at
// 300 K with ηp = 0.8 on GERG-2008: the stepwise path's discharge
// temperature and polytropic head agree with the independent integration
// above (Richardson-extrapolated from 100 and 200 steps; Heun's method is
// second order) to 2 mK and 1e-6 of the head, and the path closes on the
// model's own enthalpy (Hp/ηp = h2 − h1).
func TestStepwisePathWithGERG(t *testing.T) {
	c, err := gas.NewComposition([]gas.Fraction{{Name: "CH4", Value: 0.9}, {Name: "C2H6", Value: 0.05}, {Name: "C3H8", Value: 0.02}, {Name: "N2", Value: 0.02}, {Name: "CO2", Value: 0.01}}, gas.BasisMole)
	require.NoError(t, err)
	m, err := gas.NewGERG(c)
	require.NoError(t, err)
	s1, err := m.State(300, 3e6)
	require.NoError(t, err)
	const eta, p2 = 0.8, 6e6
	res, err := path.StepwisePath(m, s1, p2, eta)
	require.NoError(t, err)

	tA, hA := heunPath(t, m, s1, p2, eta, 100)
	tB, hB := heunPath(t, m, s1, p2, eta, 200)
	t2 := tB + (tB-tA)/3
	head := hB + (hB-hA)/3
	assert.InDelta(t, t2, float64(res.Discharge.Temperature), 2e-3)
	assert.InEpsilon(t, head, float64(res.Head), 1e-6)
	dh := float64(res.Discharge.Enthalpy - s1.Enthalpy)
	assert.InEpsilon(t, dh, float64(res.Head)/eta, 1e-5)
	// plausibility against the ideal-gas path (κ ≈ 1.30 here, from the
	// checks.csv row ng5-300-30): T2 ≈ T1 (p2/p1)^((κ−1)/(κ ηp)) ≈ 366 K.
	assert.InDelta(t, 366, t2, 10)
}
