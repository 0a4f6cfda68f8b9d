package flowbasis_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/flowbasis"
	"stagewright/physics/gas"
)

// air is dry air as a constant-property ideal gas with R = 287.05 J/(kg K)
// (M = 28.9647 g/mol; Çengel & Boles, 6th ed. (2008), Table A-1 gives
// 0.2870 kJ/(kg K), from memory): cp = 3.5 R, gamma = 1.4.
func air(t *testing.T) gas.Constant {
	t.Helper()
	m, err := gas.NewConstant(3.5*287.05, 1.4)
	require.NoError(t, err)
	return m
}

// fixedZ is an ideal-constant gas whose State reports compressibility z
// (density p/(z R T)) and the given phase: a stand-in for a real-gas model
// at the reference conditions.
type fixedZ struct {
	gas.Constant
	z     float64
	phase gas.Phase
}

func (f fixedZ) State(t physics.Kelvin, p physics.Pascal) (gas.State, error) {
	st, err := f.Constant.State(t, p)
	st.Compressibility = f.z
	st.Density /= physics.KgPerCubicMeter(f.z)
	st.Phase = f.phase
	return st, err
}

func TestReferences(t *testing.T) {
	n := flowbasis.Normal()
	assert.InDelta(t, 273.15, float64(n.Temperature), 1e-12) // DIN 1343
	assert.InDelta(t, 101325, float64(n.Pressure), 1e-9)     // DIN 1343
	s := flowbasis.Standard()
	assert.InDelta(t, 288.15, float64(s.Temperature), 1e-12) // ISO 13443
	assert.InDelta(t, 101325, float64(s.Pressure), 1e-9)     // ISO 13443
	us := flowbasis.USStandard()
	// NIST SP 811 (2008), B.9: T/K = (t/°F + 459.67)/1.8 -> 288.705 556 K.
	assert.InDelta(t, 288.705556, float64(us.Temperature), 1e-6)
	// NIST SP 811 (2008), B.8: psi = 6.894 757 E+03 Pa -> 14.696 psi =
	// 101 325.35 Pa, 0.35 Pa above 1 atm.
	assert.InDelta(t, 101325.35, float64(us.Pressure), 0.01)
	for _, ref := range []flowbasis.Reference{n, s, us} {
		assert.NotEmpty(t, ref.Source)
		got, err := flowbasis.ReferenceNamed(ref.Name)
		require.NoError(t, err)
		assert.Equal(t, ref, got)
	}
}

func TestReferenceNamedErrors(t *testing.T) {
	for _, name := range []string{"", "Normal", "STP", "ntp"} {
		_, err := flowbasis.ReferenceNamed(name)
		require.ErrorIs(t, err, physics.ErrDomain, name)
		assert.Contains(t, err.Error(), "unknown reference conditions")
	}
}

func TestIdealMolarVolume(t *testing.T) {
	tests := []struct {
		name string
		ref  flowbasis.Reference
		want float64 // m3/mol
		rel  float64
	}{
		// CODATA 2018: molar volume of ideal gas at 273.15 K, 101.325 kPa,
		// 22.413 969 54e-3 m3/mol.
		{"normal, CODATA 2018", flowbasis.Normal(), 22.41396954e-3, 1e-9},
		// Derived from the CODATA value by Charles's law: × 288.15/273.15
		// = 23.644 830e-3 m3/mol.
		{"standard, derived", flowbasis.Standard(), 22.41396954e-3 * 288.15 / 273.15, 1e-9},
		// GPSA Engineering Data Book: 379.49 ft3/lbmol at 60 °F and 14.696
		// psia (from memory); ft3 = 0.028 316 846 592 m3 and lbmol =
		// 453.592 37 mol (NIST SP 811 (2008), B.8).
		{"us-standard, GPSA", flowbasis.USStandard(), 379.49 * 0.028316846592 / 453.59237, 1e-4},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := flowbasis.IdealMolarVolume(tc.ref)
			require.NoError(t, err)
			assert.InEpsilon(t, tc.want, got, tc.rel)
		})
	}
}

func TestTradeUnits(t *testing.T) {
	// ft = 0.3048 m exactly (NIST SP 811 (2008), B.8): 1 MMSCFD =
	// 28 316.846 592 m3/d = 0.327 741 28 m3/s; 1 SCFM = 4.719 474 432e-4
	// m3/s; 1 Nm3/h = 1/3600 m3/s.
	assert.InEpsilon(t, 0.32774128, float64(flowbasis.MMSCFD), 1e-12)
	assert.InEpsilon(t, 4.719474432e-4, float64(flowbasis.SCFM), 1e-12)
	assert.InEpsilon(t, 1.0/3600, float64(flowbasis.NormalCubicMeterPerHour), 1e-15)
	assert.InEpsilon(t, 1.0/3600, float64(flowbasis.StandardCubicMeterPerHour), 1e-15)

	// 1 MMSCFD of ideal gas: 1e6 scf/d / 379.49 scf/lbmol (GPSA, from
	// memory) / 24 h/d · 0.453 592 37 kmol/lbmol = 49.80 kmol/h.
	n, err := flowbasis.IdealMolarFlow(flowbasis.MMSCFD, flowbasis.USStandard())
	require.NoError(t, err)
	assert.InEpsilon(t, 1e6/379.49/24*0.45359237, n*3600/1000, 1e-4)

	// The same 1 MMSCFD at normal conditions (ideal gas, any composition):
	// about 26 800 Nm3/d (common conversion-table value, from memory).
	m := air(t)
	qn, err := flowbasis.StandardVolumeFlow(mustMass(t, flowbasis.MMSCFD, m, flowbasis.USStandard()), m, flowbasis.Normal())
	require.NoError(t, err)
	assert.InEpsilon(t, 26800, float64(qn)*86400, 1e-3)
}

func mustMass(t *testing.T, q physics.CubicMeterPerS, m gas.Model, ref flowbasis.Reference) physics.KgPerS {
	t.Helper()
	mdot, err := flowbasis.MassFlowFromStandard(q, m, ref)
	require.NoError(t, err)
	return mdot
}

func TestReferenceDensity(t *testing.T) {
	m := air(t)
	// Dry air at 0 °C and 1 atm: 1.293 kg/m3 (the handbook normal density,
	// e.g. Çengel & Boles; from memory); ideal gas p/(R T) = 1.29225.
	rho, err := flowbasis.ReferenceDensity(m, flowbasis.Normal())
	require.NoError(t, err)
	assert.InEpsilon(t, 1.293, float64(rho), 1e-3)
	assert.InEpsilon(t, 101325/(287.05*273.15), float64(rho), 1e-12) // ideal gas law

	ideal, err := flowbasis.IdealReferenceDensity(m.MolarMass(), flowbasis.Normal())
	require.NoError(t, err)
	assert.InEpsilon(t, float64(rho), float64(ideal), 1e-12) // same ideal gas

	// A real-gas model applies its Z at the reference: ρ = p/(Z R T).
	// Natural gas near 0.998 at 15 °C and 1 atm is typical (ISO 6976
	// tables, from memory); the stand-in reports Z = 0.998.
	real := fixedZ{Constant: m, z: 0.998, phase: gas.PhaseGas}
	rhoReal, err := flowbasis.ReferenceDensity(real, flowbasis.Standard())
	require.NoError(t, err)
	assert.InEpsilon(t, 101325/(0.998*287.05*288.15), float64(rhoReal), 1e-12)
	q, err := flowbasis.StandardVolumeFlow(1, real, flowbasis.Standard())
	require.NoError(t, err)
	assert.InEpsilon(t, 0.998*287.05*288.15/101325, float64(q), 1e-12)
}

func TestReferenceDensityErrors(t *testing.T) {
	m := air(t)
	for _, ph := range []gas.Phase{gas.PhaseLiquid, gas.PhaseTwoPhase} {
		_, err := flowbasis.ReferenceDensity(fixedZ{Constant: m, z: 1, phase: ph}, flowbasis.Standard())
		require.ErrorIs(t, err, physics.ErrDomain)
		assert.Contains(t, err.Error(), "no real-gas standard volume")
	}
	_, err := flowbasis.ReferenceDensity(fixedZ{Constant: m, z: math.NaN(), phase: gas.PhaseGas}, flowbasis.Standard())
	require.ErrorIs(t, err, physics.ErrDomain)
	for _, ref := range []flowbasis.Reference{
		{Name: "zero T", Temperature: 0, Pressure: 101325},
		{Name: "NaN T", Temperature: physics.Kelvin(math.NaN()), Pressure: 101325},
		{Name: "zero p", Temperature: 288.15, Pressure: 0},
		{Name: "Inf p", Temperature: 288.15, Pressure: physics.Pascal(math.Inf(1))},
	} {
		_, err := flowbasis.ReferenceDensity(m, ref)
		require.ErrorIs(t, err, physics.ErrDomain, ref.Name)
		_, err = flowbasis.IdealMolarVolume(ref)
		require.ErrorIs(t, err, physics.ErrDomain, ref.Name)
	}
	for _, mm := range []float64{0, -0.01, 1, math.NaN(), math.Inf(1)} {
		_, err := flowbasis.IdealReferenceDensity(mm, flowbasis.Normal())
		require.ErrorIs(t, err, physics.ErrDomain, "M = %g", mm)
	}
}

func TestActualFlows(t *testing.T) {
	m := air(t)
	// 10 kg/s of air at 35 °C and 3.5 bar(a): ρ = p/(R T) = 350000 /
	// (287.05 · 308.15) = 3.9568 kg/m3, q = 2.5273 m3/s (ideal gas law).
	q, err := flowbasis.ActualVolumeFlow(10, m, 308.15, 3.5e5)
	require.NoError(t, err)
	assert.InEpsilon(t, 10*287.05*308.15/3.5e5, float64(q), 1e-12)
	assert.InEpsilon(t, 2.5273, float64(q), 1e-4)
	mdot, err := flowbasis.MassFlowFromActual(q, m, 308.15, 3.5e5)
	require.NoError(t, err)
	assert.InEpsilon(t, 10, float64(mdot), 1e-12)

	// 2400 Nm3/h to actual at 35 °C, 3.5 bar(a): for an ideal gas
	// q = q_n (p_n/p)(T/T_n) (Boyle and Charles), 0.217 73 m3/s.
	qn := 2400 * flowbasis.NormalCubicMeterPerHour
	qa, err := flowbasis.ActualFromStandard(qn, m, flowbasis.Normal(), 308.15, 3.5e5)
	require.NoError(t, err)
	want := float64(qn) * 101325 / 3.5e5 * 308.15 / 273.15
	assert.InEpsilon(t, want, float64(qa), 1e-12)
	assert.InEpsilon(t, 0.21773, float64(qa), 1e-4)
	back, err := flowbasis.StandardFromActual(qa, m, 308.15, 3.5e5, flowbasis.Normal())
	require.NoError(t, err)
	assert.InEpsilon(t, float64(qn), float64(back), 1e-12)

	// Avogadro: a standard volume of any ideal gas holds the same moles, so
	// its actual volume at a state does not depend on the gas (hydrogen
	// R = 4124.2, CO2 R = 188.92 J/(kg K); Çengel & Boles Table A-1).
	for _, r := range []float64{4124.2, 188.92} {
		g, err := gas.NewConstant(physics.JoulePerKgK(3.5*r), 1.4)
		require.NoError(t, err)
		qg, err := flowbasis.ActualFromStandard(qn, g, flowbasis.Normal(), 308.15, 3.5e5)
		require.NoError(t, err)
		assert.InEpsilon(t, want, float64(qg), 1e-12, "R = %g", r)
	}
}

func TestMassAndVolumeFlow(t *testing.T) {
	// ṁ = ρ q (definition): 2 m3/s at 1.2 kg/m3 is 2.4 kg/s.
	mdot, err := flowbasis.MassFlow(2, 1.2)
	require.NoError(t, err)
	assert.InEpsilon(t, 2.4, float64(mdot), 1e-15)
	q, err := flowbasis.VolumeFlow(2.4, 1.2)
	require.NoError(t, err)
	assert.InEpsilon(t, 2, float64(q), 1e-15)
	zero, err := flowbasis.VolumeFlow(0, 1.2)
	require.NoError(t, err)
	assert.InDelta(t, 0, float64(zero), 1e-15)
}

func TestFlowErrors(t *testing.T) {
	m := air(t)
	nan, inf := math.NaN(), math.Inf(1)
	for _, v := range []float64{-1, nan, inf, math.Inf(-1)} {
		_, err := flowbasis.MassFlow(physics.CubicMeterPerS(v), 1.2)
		require.ErrorIs(t, err, physics.ErrDomain, "q = %g", v)
		_, err = flowbasis.VolumeFlow(physics.KgPerS(v), 1.2)
		require.ErrorIs(t, err, physics.ErrDomain, "mdot = %g", v)
		_, err = flowbasis.IdealMolarFlow(physics.CubicMeterPerS(v), flowbasis.Normal())
		require.ErrorIs(t, err, physics.ErrDomain, "q = %g", v)
		_, err = flowbasis.StandardVolumeFlow(physics.KgPerS(v), m, flowbasis.Normal())
		require.ErrorIs(t, err, physics.ErrDomain, "mdot = %g", v)
		_, err = flowbasis.ActualFromStandard(physics.CubicMeterPerS(v), m, flowbasis.Normal(), 300, 1e5)
		require.ErrorIs(t, err, physics.ErrDomain, "q = %g", v)
	}
	for _, rho := range []float64{0, -1, nan, inf} {
		_, err := flowbasis.MassFlow(1, physics.KgPerCubicMeter(rho))
		require.ErrorIs(t, err, physics.ErrDomain, "rho = %g", rho)
		_, err = flowbasis.VolumeFlow(1, physics.KgPerCubicMeter(rho))
		require.ErrorIs(t, err, physics.ErrDomain, "rho = %g", rho)
	}
	// Overflow: 1e300 m3/s at 1e10 kg/m3.
	_, err := flowbasis.MassFlow(1e300, 1e10)
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = flowbasis.VolumeFlow(1e300, 1e-10)
	require.ErrorIs(t, err, physics.ErrDomain)
	// The model's own range errors come through.
	_, err = flowbasis.ActualVolumeFlow(1, m, 0, 1e5)
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = flowbasis.MassFlowFromActual(1, m, 300, physics.Pascal(nan))
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = flowbasis.StandardFromActual(1, m, 300, -1, flowbasis.Normal())
	require.ErrorIs(t, err, physics.ErrDomain)
}

func FuzzActualFromStandard(f *testing.F) {
	f.Add(1.0, 300.0, 1e5)
	f.Add(0.0, 1e-300, 1e300)
	f.Add(1e300, 1e300, 1e-300)
	m, err := gas.NewConstant(1004.675, 1.4)
	if err != nil {
		f.Fatal(err)
	}
	f.Fuzz(func(t *testing.T, q, tk, p float64) {
		got, err := flowbasis.ActualFromStandard(physics.CubicMeterPerS(q), m, flowbasis.Standard(), physics.Kelvin(tk), physics.Pascal(p))
		if err == nil && (!physics.Finite(float64(got)) || got < 0) {
			t.Fatalf("ActualFromStandard(%g, %g, %g) = %g without error", q, tk, p, got)
		}
	})
}

func BenchmarkActualFromStandard(b *testing.B) {
	m, err := gas.NewConstant(1004.675, 1.4)
	if err != nil {
		b.Fatal(err)
	}
	var model gas.Model = m // box once; the call itself must not allocate
	ref := flowbasis.Normal()
	b.ReportAllocs()
	for b.Loop() {
		_, _ = flowbasis.ActualFromStandard(0.6, model, ref, 308.15, 3.5e5)
	}
}
