package gas_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
)

func mustIdeal(t testing.TB, fr ...gas.Fraction) gas.Ideal {
	t.Helper()
	c, err := gas.NewComposition(fr, gas.BasisMole)
	require.NoError(t, err)
	m, err := gas.NewIdeal(c)
	require.NoError(t, err)
	return m
}

func TestIdealStateLowPressureReference(t *testing.T) {
	// Younglove 1982 (J. Phys. Chem. Ref. Data 11 Suppl. 1) at 300 K,
	// 101.325 kPa: N2 w = 353.2 m/s, cp = 29.15 J/(mol K); Ar w = 322.7 m/s,
	// cp = 20.83 J/(mol K) (real gas; residual at 1 atm is ~0.1 %).
	n2 := mustIdeal(t, gas.Fraction{Name: "N2", Value: 1})
	st, err := n2.State(300, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, 353.2, float64(st.SoundSpeed), 2e-3)
	assert.InEpsilon(t, 29.15, float64(st.Cp)*st.MolarMass, 2e-3)
	assert.InEpsilon(t, 1.138, float64(st.Density), 1e-3, "N2-YL-300 density")
	assert.Equal(t, gas.PhaseGas, st.Phase)
	assert.InDelta(t, 1, st.Compressibility, 1e-15)
	assert.InDelta(t, 1, st.SchultzY, 1e-15)
	assert.InDelta(t, 0, st.SchultzX, 1e-15)
	assert.InEpsilon(t, float64(st.Cp)/float64(st.Cv), st.IsentropicExponent, 1e-12)

	ar := mustIdeal(t, gas.Fraction{Name: "argon", Value: 1})
	st, err = ar.State(300, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, 322.7, float64(st.SoundSpeed), 2e-3)
	assert.InEpsilon(t, 5.0/3.0, st.IsentropicExponent, 1e-4)
}

func TestIdealDryAir(t *testing.T) {
	// Çengel & Boles, Thermodynamics 6th ed. (2008), Table A-2: air at 300 K
	// cp = 1.005 kJ/(kg K), k = 1.400; Table A-17 (ideal-gas air, from
	// memory): h(1000 K) − h(300 K) = 1046.04 − 300.19 = 745.85 kJ/kg.
	c, err := gas.NamedMixture("dry-air")
	require.NoError(t, err)
	m, err := gas.NewIdeal(c)
	require.NoError(t, err)
	a, err := m.State(300, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, 1005, float64(a.Cp), 2e-3)
	assert.InEpsilon(t, 1.400, a.IsentropicExponent, 1e-3)
	b, err := m.State(1000, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, 745.85e3, float64(b.Enthalpy-a.Enthalpy), 3e-3)
	// the pseudo-component air gives the same cp per mole (blend of the same
	// four correlations)
	p := mustIdeal(t, gas.Fraction{Name: "air", Value: 1})
	ap, err := p.State(300, 101325)
	require.NoError(t, err)
	assert.InEpsilon(t, float64(a.Cp)*a.MolarMass, float64(ap.Cp)*ap.MolarMass, 1e-9)
}

func TestIdealMixingEntropyInState(t *testing.T) {
	// s_mix = Σ x_i s_i(T, p) − R Σ x ln x (ideal-gas mixture, Smith, Van
	// Ness & Abbott 7th ed., eq. 11.26).
	mix := mustIdeal(t, gas.Fraction{Name: "CH4", Value: 0.7}, gas.Fraction{Name: "C2H6", Value: 0.3})
	st, err := mix.State(320, 2e6)
	require.NoError(t, err)
	sum := 0.0
	for _, f := range []gas.Fraction{{"CH4", 0.7}, {"C2H6", 0.3}} {
		pure := mustIdeal(t, gas.Fraction{Name: f.Name, Value: 1})
		sp, err := pure.State(320, 2e6)
		require.NoError(t, err)
		sum += f.Value * float64(sp.Entropy) * sp.MolarMass
	}
	mixing := -physics.UniversalGasConstant * (0.7*math.Log(0.7) + 0.3*math.Log(0.3))
	assert.InEpsilon(t, sum+mixing, float64(st.Entropy)*st.MolarMass, 1e-12)
}

func TestIdealFlashRoundTrip(t *testing.T) {
	models := []gas.Ideal{
		mustIdeal(t, gas.Fraction{Name: "N2", Value: 1}),
		mustIdeal(t, gas.Fraction{Name: "CH4", Value: 0.9}, gas.Fraction{Name: "C2H6", Value: 0.06},
			gas.Fraction{Name: "C3H8", Value: 0.03}, gas.Fraction{Name: "CO2", Value: 0.01}),
		mustIdeal(t, gas.Fraction{Name: "H2", Value: 0.8}, gas.Fraction{Name: "CH4", Value: 0.2}),
		mustIdeal(t, gas.Fraction{Name: "water", Value: 1}),
	}
	for _, m := range models {
		for _, T := range []float64{255, 300, 420, 499.9, 500.1, 650} {
			for _, p := range []float64{1e5, 3e6} {
				st, err := m.State(physics.Kelvin(T), physics.Pascal(p))
				require.NoError(t, err)
				back, err := m.StateFromPH(physics.Pascal(p), st.Enthalpy)
				require.NoError(t, err)
				assert.InDelta(t, T, float64(back.Temperature), 1e-6, "PH T=%g p=%g", T, p)
				back, err = m.StateFromPS(physics.Pascal(p), st.Entropy)
				require.NoError(t, err)
				assert.InDelta(t, T, float64(back.Temperature), 1e-6, "PS T=%g p=%g", T, p)
			}
		}
	}
}

func TestIdealDomainErrors(t *testing.T) {
	m := mustIdeal(t, gas.Fraction{Name: "n-butane", Value: 1})
	lo, hi := m.TemperatureRange()
	assert.InDelta(t, 150, float64(lo), 1e-9)
	assert.InDelta(t, 1200, float64(hi), 1e-9)
	nan := math.NaN()
	for _, tp := range [][2]float64{{nan, 1e5}, {300, nan}, {0, 1e5}, {300, 0}, {300, -1}, {140, 1e5}, {1300, 1e5},
		{math.Inf(1), 1e5}, {300, math.Inf(1)}} {
		_, err := m.State(physics.Kelvin(tp[0]), physics.Pascal(tp[1]))
		require.ErrorIs(t, err, physics.ErrDomain, "%v", tp)
	}
	for _, h := range []float64{nan, -1e7, 1e8, math.Inf(1)} {
		_, err := m.StateFromPH(1e5, physics.JoulePerKg(h))
		require.ErrorIs(t, err, physics.ErrDomain, "h=%g", h)
		_, err = m.StateFromPS(1e5, physics.JoulePerKgK(h))
		require.ErrorIs(t, err, physics.ErrDomain, "s=%g", h)
	}
	_, err := m.StateFromPH(physics.Pascal(nan), 0)
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = gas.NewIdeal(gas.Composition{})
	require.ErrorIs(t, err, physics.ErrDomain)
}
