package gas_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/cubic"
	"stagewright/physics/gas"
)

func mustModel(t testing.TB, name string, kij []gas.BinaryParameter, fr ...gas.Fraction) gas.Model {
	t.Helper()
	c, err := gas.NewComposition(fr, gas.BasisMole)
	require.NoError(t, err)
	m, err := gas.NewModel(name, c, kij)
	require.NoError(t, err)
	return m
}

func naturalGas() []gas.Fraction {
	// an invented lean natural gas (demo composition)
	return []gas.Fraction{{"CH4", 0.90}, {"C2H6", 0.05}, {"C3H8", 0.02}, {"N2", 0.02}, {"CO2", 0.01}}
}

// refState is a row of shared/reference/real-gas-checks.csv.
type refState struct {
	id       string
	fluid    string
	T, P     float64 // K, kPa
	rho      float64 // kg/m3 from the reference EOS (0: not usable)
	prZ      float64 // PR_Z_calc ("computed here" in the pack)
	srkDev   float64 // SRK_rho_dev_pct ("computed here")
	rhoTol   float64 // suggested_PR_tol (suggested, common practice)
	cp       float64 // J/(mol K) (0: none)
	cpTol    float64 // relative (common practice, see the comment of the test)
	w        float64 // m/s (0: none)
	wTol     float64 // relative (common practice)
	phaseSet []gas.Phase
}

func refStates() []refState {
	gasLike := []gas.Phase{gas.PhaseGas}
	super := []gas.Phase{gas.PhaseSupercritical}
	// PR puts its own vapour pressure of CO2 below the Span-Wagner one, so
	// the vapour root at the reference saturation pressure is metastable
	// for PR: gas or liquid are both acceptable phase labels there.
	dew := []gas.Phase{gas.PhaseGas, gas.PhaseLiquid}
	const m = 1.0
	return []refState{
		// Younglove 1982 / Younglove & Ely 1987 (J. Phys. Chem. Ref. Data 11 Suppl. 1; 16:577)
		{"N2-YL-300", "N2", 300, 101.325, 1.138, 0.99956, -0.02, 0.005, 29.15, 0.005, 353.2, 0.005, gasLike},
		{"CH4-YE-300", "CH4", 300, 101.325, 0.6528, 0.99780, 0.00, 0.005, 35.87, 0.005, 449.7, 0.005, gasLike},
		// Span & Wagner 1996 (J. Phys. Chem. Ref. Data 25:1509) Table 35 and saturation table; cp in kJ/(kg K) × M
		{"CO2-SW-280", "CO2", 280, 500, 9.7568, 0.96640, -0.05, 0.005, 0.87063 * 44.0098 * m, 0.03, 257.27, 0.005, gasLike},
		{"CO2-SW-260sat", "CO2", 260, 2418.8, 64.417, 0.76398, -1.73, 0.005, 1.4295 * 44.0098, 0.25, 218.19, 0.02, dew},
		{"CO2-SW-280sat", "CO2", 280, 4160.7, 121.74, 0.64109, -2.52, 0.015, 2.2769 * 44.0098, 0.30, 207.72, 0.04, dew},
		// Vesovic et al. 1990 (J. Phys. Chem. Ref. Data 19:763), density only
		{"CO2-V-300", "CO2", 300, 100, 1.773, 0.99462, -0.00, 0.005, 0, 0, 0, 0, gasLike},
		// Buecker & Wagner 2006 ethane (saturated vapour)
		{"C2-BW-270sat", "C2H6", 270, 2209.98, 42.08922, 0.69628, -1.56, 0.04, 2.815 * 30.06904, 0.20, 237.02, 0.02, gasLike},
		// Younglove & Ely 1987, ethane Appendix F
		{"C2-YE-420", "C2H6", 420, 400, 3.478, 0.98828, -0.05, 0.005, 68.61, 0.01, 361.2, 0.005, gasLike},
		{"C2-YE-360", "C2H6", 360, 800, 8.316, 0.96129, -0.02, 0.015, 62.08, 0.01, 331.8, 0.01, gasLike},
		{"C2-YE-300", "C2H6", 300, 4000, 84.99, 0.55097, -1.87, 0.04, 144.3, 0.15, 222.9, 0.02, gasLike},
		// Younglove & Ely 1987, propane (near critical and dense)
		{"C3-YE-370", "C3H8", 370, 4000, 116.0, 0.48392, -3.56, 0.04, 266.2, 0.15, 165.4, 0.02, gasLike},
		{"C3-YE-400", "C3H8", 400, 7000, 244.8, 0.40292, -12.35, 0.08, 246.6, 0.10, 208.6, 0.08, super},
		// Younglove 1982, argon
		{"Ar-YL-300", "Ar", 300, 101.325, 1.624, 0.99909, -0.01, 0.005, 20.83, 0.005, 322.7, 0.005, gasLike},
		{"Ar-YL-400", "Ar", 400, 400, 4.805, 0.99930, -0.05, 0.005, 20.89, 0.005, 373.1, 0.005, gasLike},
		{"Ar-YL-280", "Ar", 280, 1500, 26.06, 0.98300, -0.10, 0.015, 21.66, 0.01, 312.7, 0.005, gasLike},
		// stress states outside 250-500 K / 1-150 bar
		{"X-N2-S-350-200", "N2", 350, 20000, 6.3552 * 28.01348, 1.05486, -1.36, 0.04, 34.19, 0.02, 449.7, 0.04, super},
		{"X-CH4-SW-200-50", "CH4", 200, 5000, 87.764, 0.52346, -0.69, 0.08, 7.2726 * 16.0428, 0.10, 291.29, 0.05, super},
		{"X-C2-BW-500-200", "C2H6", 500, 20000, 164.96, 0.87000, -4.64, 0.015, 3.2172 * 30.06904, 0.02, 416.34, 0.02, super},
	}
}

func TestRealAgainstReferenceStates(t *testing.T) {
	// real-gas-checks.csv. Tolerances: density = the pack's
	// suggested_PR_tol (suggested, common practice); PR_Z_calc and
	// SRK_rho_dev_pct were computed in the pack with the same constants, so
	// they must be reproduced to 1e-4 (Z) and 0.05 points (SRK %, the
	// tabulated densities have 4 significant digits); cp and
	// sound speed tolerances are common practice for a cubic: 0.5-1 % for
	// dilute gas, several % to 30 % near the critical point and dew line,
	// where cubic equations are known to be poor.
	for _, r := range refStates() {
		pr := mustModel(t, "peng-robinson", nil, gas.Fraction{Name: r.fluid, Value: 1})
		st, err := pr.State(physics.Kelvin(r.T), physics.Pascal(r.P*1e3))
		require.NoError(t, err, r.id)
		assert.InEpsilon(t, r.prZ, st.Compressibility, 1e-4, "%s PR Z (pack PR_Z_calc)", r.id)
		assert.InEpsilon(t, r.rho, float64(st.Density), r.rhoTol, "%s PR density", r.id)
		if r.cp > 0 {
			assert.InEpsilon(t, r.cp, float64(st.Cp)*st.MolarMass, r.cpTol, "%s PR cp", r.id)
		}
		if r.w > 0 {
			assert.InEpsilon(t, r.w, float64(st.SoundSpeed), r.wTol, "%s PR sound speed", r.id)
		}
		assert.Contains(t, r.phaseSet, st.Phase, r.id)

		srk := mustModel(t, "srk", nil, gas.Fraction{Name: r.fluid, Value: 1})
		ss, err := srk.State(physics.Kelvin(r.T), physics.Pascal(r.P*1e3))
		require.NoError(t, err, r.id)
		assert.InDelta(t, r.srkDev, 100*(float64(ss.Density)/r.rho-1), 0.05, "%s SRK density deviation (pack SRK_rho_dev_pct)", r.id)
	}
}

func TestRealEnthalpyDifferences(t *testing.T) {
	pr := func(fl string) gas.Model { return mustModel(t, "peng-robinson", nil, gas.Fraction{Name: fl, Value: 1}) }
	h := func(m gas.Model, T, PkPa float64) float64 {
		st, err := m.State(physics.Kelvin(T), physics.Pascal(PkPa*1e3))
		require.NoError(t, err)
		return float64(st.Enthalpy) * st.MolarMass
	}
	// DH-N2-CRC-300-400: 2918 J/mol on the 0.1 MPa isobar (CRC Handbook,
	// entries rounded to 1 J/mol); the ideal-gas part alone gives 2917 and
	// the PR residual adds ~4 J/mol: 5 J/mol (0.17 %, common practice).
	n2 := pr("N2")
	assert.InDelta(t, 2918, h(n2, 400, 100)-h(n2, 300, 100), 5)
	// Younglove & Ely 1987 ethane table (h rounded to 10 J/mol):
	// h(420 K, 0.4 MPa) − h(360 K, 0.8 MPa) = 19090 − 15030 = 4060 J/mol;
	// h(360 K, 0.8 MPa) − h(300 K, 4 MPa) = 15030 − 8283 = 6747 J/mol (near
	// critical: 3 %, common practice).
	c2 := pr("C2H6")
	assert.InDelta(t, 4060, h(c2, 420, 400)-h(c2, 360, 800), 20)
	assert.InEpsilon(t, 6747, h(c2, 360, 800)-h(c2, 300, 4000), 0.03)
	// Younglove 1982 argon: h(400 K, 0.4 MPa) − h(300 K, 1 atm) = 11790 − 9716 = 2074 J/mol;
	// h(300 K, 1 atm) − h(280 K, 1.5 MPa) = 9716 − 9177 = 539 J/mol (rounding of 10 J/mol and
	// the PR residual error of ~20 J/mol at 1.5 MPa).
	ar := pr("Ar")
	assert.InDelta(t, 2074, h(ar, 400, 400)-h(ar, 300, 101.325), 10)
	assert.InDelta(t, 539, h(ar, 300, 101.325)-h(ar, 280, 1500), 25)
}

func TestRealIsothermEnthalpyCO2(t *testing.T) {
	// DH-CO2-SW-280-iso: h(sat. vapour, 280 K, 4.1607 MPa) − h(280 K,
	// 0.5 MPa) = −60.246 kJ/kg (Span & Wagner 1996); a pure residual effect
	// (0 for an ideal gas). PR underestimates the residual enthalpy close to
	// the dew line: 10 % (common practice for a cubic at Tr = 0.92).
	for _, name := range []string{"peng-robinson", "srk"} {
		m := mustModel(t, name, nil, gas.Fraction{Name: "CO2", Value: 1})
		a, err := m.State(280, 500e3)
		require.NoError(t, err)
		b, err := m.State(280, 4160.7e3)
		require.NoError(t, err)
		assert.InEpsilon(t, -60.246e3, float64(b.Enthalpy-a.Enthalpy), 0.12, name)
	}
	id := mustModel(t, "ideal", nil, gas.Fraction{Name: "CO2", Value: 1})
	a, _ := id.State(280, 500e3)
	b, _ := id.State(280, 4160.7e3)
	assert.InDelta(t, 0, float64(b.Enthalpy-a.Enthalpy), 1e-9)
}

func TestRealIdealGasLimit(t *testing.T) {
	// As p → 0 every residual vanishes (definition of the ideal-gas state):
	// at 1 Pa the real models equal the ideal model to 1e-6 (h_res there is
	// ~0.01 J/kg, s_res ~1e-4 J/(kg K)).
	for _, name := range []string{"peng-robinson", "srk"} {
		real := mustModel(t, name, nil, naturalGas()...)
		ideal := mustModel(t, "ideal", nil, naturalGas()...)
		for _, T := range []float64{250, 350, 600} {
			a, err := real.State(physics.Kelvin(T), 1)
			require.NoError(t, err)
			b, err := ideal.State(physics.Kelvin(T), 1)
			require.NoError(t, err)
			assert.InDelta(t, 1, a.Compressibility, 1e-6)
			assert.InDelta(t, float64(b.Enthalpy), float64(a.Enthalpy), 0.05)
			assert.InDelta(t, float64(b.Entropy), float64(a.Entropy), 2e-4)
			assert.InEpsilon(t, float64(b.Cp), float64(a.Cp), 1e-6)
			assert.InEpsilon(t, float64(b.Cv), float64(a.Cv), 1e-6)
			assert.InEpsilon(t, b.IsentropicExponent, a.IsentropicExponent, 1e-6)
			assert.InEpsilon(t, float64(b.SoundSpeed), float64(a.SoundSpeed), 1e-6)
			assert.InDelta(t, 0, a.SchultzX, 1e-5)
			assert.InDelta(t, 1, a.SchultzY, 1e-6)
			assert.Equal(t, gas.PhaseGas, a.Phase)
		}
	}
}

// prZIndependent evaluates the Peng-Robinson Z of a mixture directly from
// the 1976 paper's equations (4)-(12), (17) with van der Waals mixing and
// Newton iteration on the cubic in Z from Z = 1 (vapour root), without the
// cubic package.
func prZIndependent(tc, pc, om, x []float64, k [][]float64, T, P float64) float64 {
	const r = physics.UniversalGasConstant
	n := len(x)
	a := make([]float64, n)
	b := make([]float64, n)
	for i := range n {
		kap := 0.37464 + 1.54226*om[i] - 0.26992*om[i]*om[i]
		al := 1 + kap*(1-math.Sqrt(T/tc[i]))
		a[i] = 0.45724 * r * r * tc[i] * tc[i] / pc[i] * al * al
		b[i] = 0.07780 * r * tc[i] / pc[i]
	}
	var am, bm float64
	for i := range n {
		bm += x[i] * b[i]
		for j := range n {
			am += x[i] * x[j] * math.Sqrt(a[i]*a[j]) * (1 - k[i][j])
		}
	}
	A := am * P / (r * r * T * T)
	B := bm * P / (r * T)
	z := 1.0
	for range 100 {
		f := z*z*z - (1-B)*z*z + (A-3*B*B-2*B)*z - (A*B - B*B - B*B*B)
		d := 3*z*z - 2*(1-B)*z + (A - 3*B*B - 2*B)
		z -= f / d
	}
	return z
}

func TestRealMixtureZIndependent(t *testing.T) {
	// Natural gas at 300 K, 5 MPa with the default kij (CH4-CO2 0.0919,
	// N2-CH4 0.0311, N2-C2H6 0.0515, N2-C3H8 0.0852, N2-CO2 -0.017,
	// C2H6-CO2 0.1322, C3H8-CO2 0.1241) against a separate evaluation of the 1976 equations.
	// The paper's rounded Ωa = 0.45724, Ωb = 0.07780 differ from the exact
	// roots by 1e-5, hence 2e-5.
	m := mustModel(t, "peng-robinson", nil, naturalGas()...)
	ids := []string{"methane", "ethane", "propane", "nitrogen", "carbon-dioxide"}
	x := []float64{0.90, 0.05, 0.02, 0.02, 0.01}
	tc, pc, om := make([]float64, 5), make([]float64, 5), make([]float64, 5)
	for i, id := range ids {
		c, err := gas.LookupComponent(id)
		require.NoError(t, err)
		tc[i], pc[i], om[i] = float64(c.Tc), float64(c.Pc), c.Omega
	}
	k := [][]float64{
		{0, 0, 0, 0.0311, 0.0919},
		{0, 0, 0, 0.0515, 0.1322},
		{0, 0, 0, 0.0852, 0.1241},
		{0.0311, 0.0515, 0.0852, 0, -0.0170},
		{0.0919, 0.1322, 0.1241, -0.0170, 0},
	}
	for _, tp := range [][2]float64{{300, 5e6}, {350, 10e6}, {280, 2e6}} {
		st, err := m.State(physics.Kelvin(tp[0]), physics.Pascal(tp[1]))
		require.NoError(t, err)
		assert.InEpsilon(t, prZIndependent(tc, pc, om, x, k, tp[0], tp[1]), st.Compressibility, 2e-5, "%v", tp)
	}
	// A caller's kij override changes the result, and kij = 0 reproduces
	// the independent value with k = 0.
	zero := []gas.BinaryParameter{{"CH4", "CO2", 0, ""}, {"N2", "CH4", 0, ""}, {"N2", "C2H6", 0, ""},
		{"N2", "C3H8", 0, ""}, {"N2", "CO2", 0, ""}, {"C2H6", "CO2", 0, ""}, {"C3H8", "CO2", 0, ""}}
	m0 := mustModel(t, "peng-robinson", zero, naturalGas()...)
	st, err := m0.State(300, 5e6)
	require.NoError(t, err)
	k0 := make([][]float64, 5)
	for i := range k0 {
		k0[i] = make([]float64, 5)
	}
	assert.InEpsilon(t, prZIndependent(tc, pc, om, x, k0, 300, 5e6), st.Compressibility, 2e-5)
}

func TestRealFlashRoundTrip(t *testing.T) {
	models := []gas.Model{
		mustModel(t, "peng-robinson", nil, naturalGas()...),
		mustModel(t, "srk", nil, naturalGas()...),
		mustModel(t, "peng-robinson", nil, gas.Fraction{Name: "CO2", Value: 1}),
		mustModel(t, "srk", nil, gas.Fraction{Name: "N2", Value: 0.78}, gas.Fraction{Name: "O2", Value: 0.21}, gas.Fraction{Name: "Ar", Value: 0.01}),
		mustModel(t, "peng-robinson", nil, gas.Fraction{Name: "H2", Value: 0.7}, gas.Fraction{Name: "CH4", Value: 0.3}),
	}
	for _, m := range models {
		for _, T := range []float64{310, 400, 550} {
			for _, p := range []float64{2e5, 3e6, 12e6} {
				st, err := m.State(physics.Kelvin(T), physics.Pascal(p))
				require.NoError(t, err)
				back, err := m.StateFromPH(physics.Pascal(p), st.Enthalpy)
				require.NoError(t, err, "%s PH T=%g p=%g", m.Name(), T, p)
				assert.InDelta(t, T, float64(back.Temperature), 1e-6, "%s PH T=%g p=%g", m.Name(), T, p)
				back, err = m.StateFromPS(physics.Pascal(p), st.Entropy)
				require.NoError(t, err, "%s PS T=%g p=%g", m.Name(), T, p)
				assert.InDelta(t, T, float64(back.Temperature), 1e-6, "%s PS T=%g p=%g", m.Name(), T, p)
				assert.InDelta(t, float64(st.Enthalpy), float64(back.Enthalpy), 1e-3)
			}
		}
	}
}

func TestRealFiniteDifferenceConsistency(t *testing.T) {
	// Exact thermodynamic identities checked by central differences:
	//   cp = (∂h/∂T)_p,  (∂h/∂p)_T = v − T (∂v/∂T)_p,  a² = (∂p/∂ρ)_s,
	//   μJT = (∂T/∂p)_h,  X = (T/v)(∂v/∂T)_p − 1,  Y = −(p/v)(∂v/∂p)_T
	// (e.g. Smith, Van Ness & Abbott, 7th ed., ch. 6; Schultz 1962).
	for _, name := range []string{"peng-robinson", "srk"} {
		m := mustModel(t, name, nil, naturalGas()...)
		for _, tp := range [][2]float64{{300, 5e6}, {360, 12e6}, {450, 1e6}} {
			T, p := tp[0], tp[1]
			st, err := m.State(physics.Kelvin(T), physics.Pascal(p))
			require.NoError(t, err)
			at := func(T, p float64) gas.State {
				s, err := m.State(physics.Kelvin(T), physics.Pascal(p))
				require.NoError(t, err)
				return s
			}
			dT, dp := 0.01, p*1e-5
			hT := (float64(at(T+dT, p).Enthalpy) - float64(at(T-dT, p).Enthalpy)) / (2 * dT)
			assert.InEpsilon(t, float64(st.Cp), hT, 1e-6, "%s cp = dh/dT %v", name, tp)

			v := 1 / float64(st.Density)
			dvdT := (1/float64(at(T+dT, p).Density) - 1/float64(at(T-dT, p).Density)) / (2 * dT)
			dvdp := (1/float64(at(T, p+dp).Density) - 1/float64(at(T, p-dp).Density)) / (2 * dp)
			hp := (float64(at(T, p+dp).Enthalpy) - float64(at(T, p-dp).Enthalpy)) / (2 * dp)
			assert.InEpsilon(t, v-T*dvdT, hp, 1e-5, "%s dh/dp %v", name, tp)
			assert.InEpsilon(t, T/v*dvdT-1, st.SchultzX, 1e-5, "%s X %v", name, tp)
			assert.InEpsilon(t, -p/v*dvdp, st.SchultzY, 1e-5, "%s Y %v", name, tp)

			s1, err := m.StateFromPS(physics.Pascal(p+dp), st.Entropy)
			require.NoError(t, err)
			s2, err := m.StateFromPS(physics.Pascal(p-dp), st.Entropy)
			require.NoError(t, err)
			a2 := 2 * dp / float64(s1.Density-s2.Density)
			assert.InEpsilon(t, float64(st.SoundSpeed)*float64(st.SoundSpeed), a2, 1e-5, "%s a² = dp/drho|s %v", name, tp)
			assert.InEpsilon(t, a2*float64(st.Density)/p, st.IsentropicExponent, 1e-5, "%s kappa %v", name, tp)

			h1, err := m.StateFromPH(physics.Pascal(p+dp), st.Enthalpy)
			require.NoError(t, err)
			h2, err := m.StateFromPH(physics.Pascal(p-dp), st.Enthalpy)
			require.NoError(t, err)
			assert.InEpsilon(t, float64(h1.Temperature-h2.Temperature)/(2*dp), st.JouleThomson, 1e-4, "%s JT %v", name, tp)
		}
	}
}

func TestRealPhase(t *testing.T) {
	// CO2 at 280 K: PR vapour pressure ≈ 4.1 MPa (Span & Wagner 4.1607 MPa),
	// so 5 MPa is compressed liquid. Methane/propane 50/50 at 250 K, 3 MPa
	// lies inside its two-phase envelope (propane vapour pressure at 250 K
	// is 0.22 MPa, methane is supercritical: a bubble point far above 3 MPa
	// is impossible, the dew point far below; GPSA Engineering Data Book,
	// common practice). Propane at 400 K, 7 MPa: T > Tc, P > Pc.
	co2 := mustModel(t, "peng-robinson", nil, gas.Fraction{Name: "CO2", Value: 1})
	st, err := co2.State(280, 5e6)
	require.NoError(t, err)
	assert.Equal(t, gas.PhaseLiquid, st.Phase)
	assert.NotZero(t, st.Validity&gas.TwoPhaseRisk)
	st, err = co2.State(280, 2e6)
	require.NoError(t, err)
	assert.Equal(t, gas.PhaseGas, st.Phase)
	assert.Zero(t, st.Validity&gas.TwoPhaseRisk)

	mix := mustModel(t, "peng-robinson", nil, gas.Fraction{Name: "CH4", Value: 0.5}, gas.Fraction{Name: "C3H8", Value: 0.5})
	st, err = mix.State(250, 3e6)
	require.NoError(t, err)
	assert.Contains(t, []gas.Phase{gas.PhaseTwoPhase, gas.PhaseLiquid}, st.Phase)
	assert.NotZero(t, st.Validity&gas.TwoPhaseRisk)
	st, err = mix.State(400, 3e6)
	require.NoError(t, err)
	assert.Equal(t, gas.PhaseGas, st.Phase)

	c3 := mustModel(t, "srk", nil, gas.Fraction{Name: "C3H8", Value: 1})
	st, err = c3.State(400, 7e6)
	require.NoError(t, err)
	assert.Equal(t, gas.PhaseSupercritical, st.Phase)

	// GasState skips the stability test: same properties.
	r, ok := co2.(gas.Real)
	require.True(t, ok)
	g, err := r.GasState(280, 5e6)
	require.NoError(t, err)
	full, _ := co2.State(280, 5e6)
	assert.InDelta(t, float64(full.Enthalpy), float64(g.Enthalpy), 1e-9)
}

func TestNewModelErrors(t *testing.T) {
	c, err := gas.NewComposition(naturalGas(), gas.BasisMole)
	require.NoError(t, err)
	bad := []struct {
		name  string
		model string
		kij   []gas.BinaryParameter
		has   string
	}{
		{"unknown model", "virial", nil, "virial"},
		{"ideal-constant needs cp", "ideal-constant", nil, "NewConstant"},
		{"kij on ideal", "ideal", []gas.BinaryParameter{{"CH4", "CO2", 0.1, ""}}, "interaction"},
		{"unknown component", "peng-robinson", []gas.BinaryParameter{{"CH4", "xenon-ish", 0.1, ""}}, "xenon-ish"},
		{"not in gas", "peng-robinson", []gas.BinaryParameter{{"CH4", "H2S", 0.1, ""}}, "not in the gas"},
		{"same component", "srk", []gas.BinaryParameter{{"CH4", "methane", 0.1, ""}}, "different"},
		{"too large", "srk", []gas.BinaryParameter{{"CH4", "CO2", 1, ""}}, "between -1 and 1"},
		{"NaN", "srk", []gas.BinaryParameter{{"CH4", "CO2", math.NaN(), ""}}, "between -1 and 1"},
		{"twice", "peng-robinson", []gas.BinaryParameter{{"CH4", "CO2", 0.1, ""}, {"CO2", "methane", 0.1, ""}}, "more than once"},
	}
	for _, tc := range bad {
		_, err := gas.NewModel(tc.model, c, tc.kij)
		require.ErrorIs(t, err, physics.ErrDomain, tc.name)
		assert.Contains(t, err.Error(), tc.has, tc.name)
	}
	_, err = gas.NewModel("peng-robinson", gas.Composition{}, nil)
	require.ErrorIs(t, err, physics.ErrDomain)
	for _, name := range []string{"ideal", "peng-robinson", "srk"} {
		m, err := gas.NewModel(name, c, nil)
		require.NoError(t, err)
		assert.Equal(t, name, m.Name())
		assert.InEpsilon(t, c.MolarMass(), m.MolarMass(), 1e-15)
	}
	r, err := gas.NewReal(cubic.PengRobinson, c, nil)
	require.NoError(t, err)
	nan := math.NaN()
	for _, tp := range [][2]float64{{nan, 1e5}, {300, nan}, {0, 1e5}, {300, -1}, {20, 1e5}, {5000, 1e5}, {math.Inf(1), 1e5}} {
		_, err := r.State(physics.Kelvin(tp[0]), physics.Pascal(tp[1]))
		require.ErrorIs(t, err, physics.ErrDomain, "%v", tp)
	}
	for _, v := range []float64{nan, math.Inf(-1), -1e8, 1e9} {
		_, err := r.StateFromPH(5e6, physics.JoulePerKg(v))
		require.ErrorIs(t, err, physics.ErrDomain, "h=%g", v)
		_, err = r.StateFromPS(5e6, physics.JoulePerKgK(v))
		require.ErrorIs(t, err, physics.ErrDomain, "s=%g", v)
	}
	assert.NotEmpty(t, gas.DefaultBinaryParameters("peng-robinson"))
	assert.Empty(t, gas.DefaultBinaryParameters("ideal"))
}
