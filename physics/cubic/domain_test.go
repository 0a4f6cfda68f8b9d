package cubic_test

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/cubic"
)

func nan() float64 { return math.NaN() }
func inf() float64 { return math.Inf(1) }

func TestNewMixtureDomain(t *testing.T) {
	tc2 := []physics.Kelvin{190.564, 305.322}
	pc2 := []physics.Pascal{4599.2e3, 4872.2e3}
	om2 := []float64{0.01142, 0.099}
	k := func(a, b, c, d float64) [][]float64 { return [][]float64{{a, b}, {c, d}} }
	tests := []struct {
		name  string
		kind  cubic.Kind
		tc    []physics.Kelvin
		pc    []physics.Pascal
		omega []float64
		kij   [][]float64
	}{
		{"unknown kind", cubic.Kind(0), tc2, pc2, om2, nil},
		{"unknown kind 3", cubic.Kind(3), tc2, pc2, om2, nil},
		{"no components", cubic.PengRobinson, nil, nil, nil, nil},
		{"pc length", cubic.PengRobinson, tc2, pc2[:1], om2, nil},
		{"omega length", cubic.PengRobinson, tc2, pc2, om2[:1], nil},
		{"tc NaN", cubic.PengRobinson, []physics.Kelvin{physics.Kelvin(nan()), 305}, pc2, om2, nil},
		{"tc zero", cubic.PengRobinson, []physics.Kelvin{0, 305}, pc2, om2, nil},
		{"tc negative", cubic.PengRobinson, []physics.Kelvin{-190, 305}, pc2, om2, nil},
		{"tc Inf", cubic.PengRobinson, []physics.Kelvin{physics.Kelvin(inf()), 305}, pc2, om2, nil},
		{"pc NaN", cubic.PengRobinson, tc2, []physics.Pascal{physics.Pascal(nan()), 4.8e6}, om2, nil},
		{"pc zero", cubic.PengRobinson, tc2, []physics.Pascal{0, 4.8e6}, om2, nil},
		{"pc Inf", cubic.PengRobinson, tc2, []physics.Pascal{physics.Pascal(inf()), 4.8e6}, om2, nil},
		{"pc underflowing b", cubic.PengRobinson, tc2, []physics.Pascal{1e-320, 4.8e6}, om2, nil},
		{"omega NaN", cubic.PengRobinson, tc2, pc2, []float64{nan(), 0.1}, nil},
		{"omega too low", cubic.PengRobinson, tc2, pc2, []float64{-0.6, 0.1}, nil},
		{"omega too high", cubic.SoaveRedlichKwong, tc2, pc2, []float64{2.1, 0.1}, nil},
		{"kij rows", cubic.PengRobinson, tc2, pc2, om2, [][]float64{{0, 0}}},
		{"kij columns", cubic.PengRobinson, tc2, pc2, om2, [][]float64{{0}, {0, 0}}},
		{"kij not symmetric", cubic.PengRobinson, tc2, pc2, om2, k(0, 0.01, 0.02, 0)},
		{"kij diagonal", cubic.PengRobinson, tc2, pc2, om2, k(0.1, 0, 0, 0)},
		{"kij NaN", cubic.PengRobinson, tc2, pc2, om2, k(0, nan(), nan(), 0)},
		{"kij 1", cubic.PengRobinson, tc2, pc2, om2, k(0, 1, 1, 0)},
		{"kij -1", cubic.PengRobinson, tc2, pc2, om2, k(0, -1, -1, 0)},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m, err := cubic.NewMixture(tc.kind, tc.tc, tc.pc, tc.omega, tc.kij)
			require.ErrorIs(t, err, physics.ErrDomain)
			assert.Nil(t, m)
			var de *physics.DomainError
			require.True(t, errors.As(err, &de))
			assert.NotEmpty(t, de.Reason, "an engineer's sentence")
		})
	}
	m, err := cubic.NewMixture(cubic.PengRobinson, tc2, pc2, om2, k(0, 0.01, 0.01, 0))
	require.NoError(t, err)
	assert.Equal(t, 2, m.Len())
	assert.Equal(t, cubic.PengRobinson, m.Kind())
	// √α of methane reaches 0 at Tc (1 + 1/κ)², κ = 0.39222 (PR 1976 κ
	// formula with ω = 0.01142): 190.564 × 3.5495² ≈ 2401 K.
	assert.InEpsilon(t, 2401, float64(m.MaxTemperature()), 0.002)
}

func TestStateDomain(t *testing.T) {
	m, x := naturalGas(t, cubic.PengRobinson)
	good := func() []float64 { return append([]float64(nil), x...) }
	bad := func(i int, v float64) []float64 { y := good(); y[i] = v; return y }
	tests := []struct {
		name string
		x    []float64
		t, p float64
	}{
		{"T NaN", good(), nan(), 1e6},
		{"T zero", good(), 0, 1e6},
		{"T negative", good(), -300, 1e6},
		{"T Inf", good(), inf(), 1e6},
		{"T above the alpha-function limit", good(), 5000, 1e6},
		{"P NaN", good(), 300, nan()},
		{"P zero", good(), 300, 0},
		{"P negative", good(), 300, -1e5},
		{"P Inf", good(), 300, inf()},
		{"P overflowing the cubic", good(), 300, 1e300},
		{"T underflowing", good(), 1e-300, 1e6},
		{"x short", good()[:4], 300, 1e6},
		{"x long", append(good(), 0), 300, 1e6},
		{"x nil", nil, 300, 1e6},
		{"x NaN", bad(0, nan()), 300, 1e6},
		{"x negative", bad(1, -0.06), 300, 1e6},
		{"x above 1", []float64{1.5, 0, 0, 0, -0.5}, 300, 1e6},
		{"x sum 1.01", bad(0, 0.88), 300, 1e6},
		{"x Inf", bad(0, inf()), 300, 1e6},
	}
	out := make([]float64, 5)
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := m.Residual(tc.x, physics.Kelvin(tc.t), physics.Pascal(tc.p))
			require.ErrorIs(t, err, physics.ErrDomain, "Residual")
			_, err = m.LnPhi(tc.x, physics.Kelvin(tc.t), physics.Pascal(tc.p), out)
			require.ErrorIs(t, err, physics.ErrDomain, "LnPhi")
			_, err = m.Stable(tc.x, physics.Kelvin(tc.t), physics.Pascal(tc.p))
			require.ErrorIs(t, err, physics.ErrDomain, "Stable")
		})
	}
	_, err := m.LnPhi(x, 300, 1e6, out[:4])
	require.ErrorIs(t, err, physics.ErrDomain, "LnPhi out too short")
	for _, p := range []float64{nan(), 0, -1, inf()} {
		_, err := m.DewTemperature(x, physics.Pascal(p))
		require.ErrorIs(t, err, physics.ErrDomain, "DewTemperature p = %g", p)
	}
	_, err = m.DewTemperature(x[:3], 1e6)
	require.ErrorIs(t, err, physics.ErrDomain, "DewTemperature x short")
	// sums within 1e-9 are accepted
	_, err = m.Residual(bad(0, x[0]+5e-10), 300, 1e6)
	require.NoError(t, err)
}

// FuzzResidual: any input gives an error or finite results (design rule).
func FuzzResidual(f *testing.F) {
	f.Add(300.0, 5e6, 0.9)
	f.Add(280.0, 4.1607e6, 0.0)
	f.Add(1e-3, 1e9, 0.5)
	f.Add(2000.0, 1e3, 1.0)
	m := newMixture(f, cubic.PengRobinson, nil, methane, carbonDioxide)
	f.Fuzz(func(t *testing.T, tt, pp, x0 float64) {
		x := []float64{x0, 1 - x0}
		r, err := m.Residual(x, physics.Kelvin(tt), physics.Pascal(pp))
		if err != nil {
			require.ErrorIs(t, err, physics.ErrDomain)
			return
		}
		require.True(t, physics.Finite(r.Z, r.MolarVolume, r.HDep, r.SDep, r.CvDep, r.DPdT, r.DPdV), "%+v", r)
		require.Greater(t, r.Z, 0.0)
		out := make([]float64, 2)
		if _, err := m.LnPhi(x, physics.Kelvin(tt), physics.Pascal(pp), out); err == nil {
			require.True(t, physics.Finite(out...))
		}
		if _, err := m.Stable(x, physics.Kelvin(tt), physics.Pascal(pp)); err != nil {
			require.ErrorIs(t, err, physics.ErrDomain)
		}
	})
}
