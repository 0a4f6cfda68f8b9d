package cubic_test

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/cubic"
)

// component holds critical constants copied from
// testdata/reference/critical-constants.csv (columns Tc_K, Pc_kPa,
// acentric_factor, molar_mass_g_per_mol); each row names the reference EOS
// the file took them from.
type component struct {
	name  string
	tc    float64 // K
	pc    float64 // Pa
	omega float64
	mm    float64 // kg/mol
}

var (
	// Span et al. 2000 JPCRD 29:1361 (via critical-constants.csv)
	nitrogen = component{"nitrogen", 126.192, 3395.8e3, 0.0372, 28.01348e-3}
	// Setzmann & Wagner 1991 JPCRD 20:1061 (via critical-constants.csv)
	methane = component{"methane", 190.564, 4599.2e3, 0.01142, 16.0428e-3}
	// Span & Wagner 1996 JPCRD 25:1509 (via critical-constants.csv)
	carbonDioxide = component{"carbon dioxide", 304.1282, 7377.3e3, 0.22394, 44.0098e-3}
	// Buecker & Wagner 2006 (via critical-constants.csv)
	ethane = component{"ethane", 305.322, 4872.2e3, 0.099, 30.06904e-3}
	// Lemmon, McLinden & Wagner 2009 (via critical-constants.csv)
	propane = component{"propane", 369.89, 4251.2e3, 0.1521, 44.09562e-3}
	// Tegeler, Span & Wagner 1999 (via critical-constants.csv)
	argon = component{"argon", 150.687, 4863.0e3, -0.00219, 39.948e-3}
	// critical-constants.csv (n-butane, isobutane rows)
	nButane   = component{"n-butane", 425.125, 3796.0e3, 0.200810094644, 58.1222e-3}
	isoButane = component{"isobutane", 407.817, 3629.0e3, 0.183531783208, 58.1222e-3}
)

func newMixture(t testing.TB, kind cubic.Kind, kij [][]float64, comps ...component) *cubic.Mixture {
	t.Helper()
	tc := make([]physics.Kelvin, len(comps))
	pc := make([]physics.Pascal, len(comps))
	om := make([]float64, len(comps))
	for i, c := range comps {
		tc[i], pc[i], om[i] = physics.Kelvin(c.tc), physics.Pascal(c.pc), c.omega
	}
	m, err := cubic.NewMixture(kind, tc, pc, om, kij)
	require.NoError(t, err)
	return m
}

// TestPureStatesAgainstReferencePack reproduces the PR_Z_calc column of
// testdata/reference/real-gas-checks.csv ("computed here" there with the
// same constants and R = 8.314462618: agreement to 0.01 % expected), checks
// the PR density against the reference-EOS density within the file's
// suggested_PR_tol (common practice, no source) and the PR and SRK density
// deviations against PR_rho_dev_pct and SRK_rho_dev_pct (given to 0.01
// percentage point, so 0.015 point allows for rounding plus the 0.01 %
// reproduction).
func TestPureStatesAgainstReferencePack(t *testing.T) {
	tests := []struct {
		id   string // row id in real-gas-checks.csv
		comp component
		t, p float64 // K, Pa
		// rhoRef is the reference-EOS density in kg/m3 (rho_mol_L × M where
		// the CSV gives mol/L: the file's *_rho_dev_pct use that column);
		// 0 = too coarse for a density check.
		rhoRef   float64
		prZ      float64 // PR_Z_calc
		prDev    float64 // PR_rho_dev_pct
		srkDev   float64 // SRK_rho_dev_pct
		tolPct   float64 // suggested_PR_tol (density, %)
		vapRoot3 bool    // the notes say: on the dew line, vapour root
	}{
		// CRC Handbook isobar 0.1 MPa: density too coarse (0.04 mol/L), Z only
		{"N2-CRC-300", nitrogen, 300, 100e3, 0, 0.99957, 0, 0, 0, false},
		{"N2-CRC-400", nitrogen, 400, 100e3, 0, 1.00013, 0, 0, 0, false},
		// Younglove 1982 JPCRD 11 Suppl. 1, nitrogen appendix
		{"N2-YL-300", nitrogen, 300, 101.325e3, 0.04063 * 28.01348, 0.99956, +0.02, -0.02, 0.5, false},
		// Younglove & Ely 1987 JPCRD 16:577, methane Appendix E p.588
		{"CH4-YE-300", methane, 300, 101.325e3, 0.04069 * 16.0428, 0.99780, +0.05, +0.00, 0.5, false},
		// Span & Wagner 1996 JPCRD 25:1509, Table 35 p.1562
		{"CO2-SW-280", carbonDioxide, 280, 500e3, 9.7568, 0.96640, +0.24, -0.05, 0.5, false},
		// Span & Wagner 1996, saturation table (saturated vapour)
		{"CO2-SW-260sat", carbonDioxide, 260, 2418.8e3, 64.417, 0.76398, +0.06, -1.73, 0.5, true},
		{"CO2-SW-280sat", carbonDioxide, 280, 4160.7e3, 121.74, 0.64109, +0.78, -2.52, 1.5, true},
		// Vesovic et al. 1990 JPCRD 19:763, Appendix IV p.808
		{"CO2-V-300", carbonDioxide, 300, 100e3, 1.773, 0.99462, +0.05, -0.00, 0.5, false},
		// Buecker & Wagner 2006 ethane EOS, saturation table (saturated vapour)
		{"C2-BW-270sat", ethane, 270, 2209.98e3, 42.08922, 0.69628, +1.01, -1.56, 4, true},
		// Younglove & Ely 1987 JPCRD 16:577, ethane Appendix F p.642
		{"C2-YE-420", ethane, 420, 400e3, 0.1157 * 30.06904, 0.98828, +0.18, -0.05, 0.5, false},
		{"C2-YE-360", ethane, 360, 800e3, 0.2766 * 30.06904, 0.96129, +0.52, -0.02, 1.5, false},
		{"C2-YE-300", ethane, 300, 4000e3, 2.827 * 30.06904, 0.55097, +2.96, -1.87, 4, false},
		// Younglove & Ely 1987, propane appendix
		{"C3-YE-370", propane, 370, 4000e3, 2.631 * 44.09562, 0.48392, +2.12, -3.56, 4, false},
		{"C3-YE-400", propane, 400, 7000e3, 5.552 * 44.09562, 0.40292, -5.91, -12.35, 8, false},
		// Younglove 1982, argon appendix
		{"Ar-YL-300", argon, 300, 101.325e3, 0.04065 * 39.948, 0.99909, +0.02, -0.01, 0.5, false},
		{"Ar-YL-400", argon, 400, 400e3, 0.1203 * 39.948, 0.99930, +0.05, -0.05, 0.5, false},
		{"Ar-YL-280", argon, 280, 1500e3, 0.6523 * 39.948, 0.98300, +0.48, -0.10, 1.5, false},
		// Span et al. 2000 JPCRD 29:1361 p.1410 (6.3552 mol/L): stress case
		{"X-N2-S-350-200", nitrogen, 350, 20000e3, 6.3552 * 28.01348, 1.05486, +2.52, -1.36, 4, false},
		// Setzmann & Wagner 1991 JPCRD 20:1061, Table 40 p.1119: stress case
		{"X-CH4-SW-200-50", methane, 200, 5000e3, 87.764, 0.52346, +5.00, -0.69, 8, false},
		// Buecker & Wagner 2006 ethane, Table 30 p.243: stress case
		{"X-C2-BW-500-200", ethane, 500, 20000e3, 164.96, 0.87000, +0.80, -4.64, 1.5, false},
	}
	for _, tc := range tests {
		t.Run(tc.id, func(t *testing.T) {
			pr := newMixture(t, cubic.PengRobinson, nil, tc.comp)
			srk := newMixture(t, cubic.SoaveRedlichKwong, nil, tc.comp)
			x := []float64{1}
			got, err := pr.Residual(x, physics.Kelvin(tc.t), physics.Pascal(tc.p))
			require.NoError(t, err)
			assert.InEpsilon(t, tc.prZ, got.Z, 1e-4, "PR Z vs PR_Z_calc (0.01 %)")
			if tc.vapRoot3 {
				assert.Equal(t, cubic.RootVapourOfThree, got.Root, "saturated vapour: three roots, vapour taken")
			}
			if tc.rhoRef == 0 {
				return
			}
			rhoPR := tc.comp.mm / got.MolarVolume
			assert.InDelta(t, tc.prDev, 100*(rhoPR/tc.rhoRef-1), 0.015, "PR_rho_dev_pct")
			assert.InEpsilon(t, tc.rhoRef, rhoPR, tc.tolPct/100, "PR density vs reference EOS within suggested_PR_tol %g %%", tc.tolPct)
			s, err := srk.Residual(x, physics.Kelvin(tc.t), physics.Pascal(tc.p))
			require.NoError(t, err)
			assert.InDelta(t, tc.srkDev, 100*(tc.comp.mm/s.MolarVolume/tc.rhoRef-1), 0.015, "SRK_rho_dev_pct")
		})
	}
}

// TestCO2IsothermEnthalpyDifference checks the residual-enthalpy change
// along the 280 K CO2 isotherm from 0.5 MPa to the saturated vapour at
// 4.1607 MPa: Span & Wagner 1996 JPCRD 25:1509, Table 35 and the saturation
// table give Δh = −60.246 kJ/kg (row DH-CO2-SW-280-iso of
// real-gas-checks.csv); the ideal gas would give 0. A cubic fits vapour
// pressure and volume, not the temperature derivative of a(T) that the
// residual enthalpy depends on, and the saturated vapour at Tr = 0.92,
// Z = 0.64 is where that shows most: departures of 5-10 % are usual there
// (common practice). Measured here: PR −54.86 kJ/kg (−8.9 %), SRK
// −53.86 kJ/kg (−10.6 %); the analytic HDep itself is verified against
// finite differences in TestDerivativesAgainstFiniteDifferences.
// Tolerance: 10 % PR, 12 % SRK.
func TestCO2IsothermEnthalpyDifference(t *testing.T) {
	const want = -60.246e3 // J/kg
	for _, tc := range []struct {
		kind cubic.Kind
		tol  float64
	}{{cubic.PengRobinson, 0.10}, {cubic.SoaveRedlichKwong, 0.12}} {
		m := newMixture(t, tc.kind, nil, carbonDioxide)
		x := []float64{1}
		lo, err := m.Residual(x, 280, 500e3)
		require.NoError(t, err)
		hi, err := m.Residual(x, 280, 4160.7e3)
		require.NoError(t, err)
		dh := (hi.HDep - lo.HDep) * physics.UniversalGasConstant * 280 / carbonDioxide.mm
		t.Logf("%v: dh = %.3f kJ/kg (Span & Wagner -60.246)", tc.kind, dh/1e3)
		assert.InEpsilon(t, want, dh, tc.tol, "%v", tc.kind)
	}
}

func TestIdealGasLimit(t *testing.T) {
	// At 1 Pa every departure tends to 0 and Z to 1 (ideal-gas limit,
	// exact as P → 0); 1e-6 is a bound on B ≈ 1e-9 times O(10) terms.
	x := []float64{0.85, 0.1, 0.05}
	for _, kind := range []cubic.Kind{cubic.PengRobinson, cubic.SoaveRedlichKwong} {
		m := newMixture(t, kind, nil, methane, ethane, nitrogen)
		got, err := m.Residual(x, 300, 1)
		require.NoError(t, err)
		assert.InDelta(t, 1, got.Z, 1e-6)
		assert.InDelta(t, 0, got.HDep, 1e-6)
		assert.InDelta(t, 0, got.SDep, 1e-6)
		assert.InDelta(t, 0, got.CvDep, 1e-6)
		assert.Equal(t, cubic.RootOnlyGasLike, got.Root)
		r := physics.UniversalGasConstant
		assert.InEpsilon(t, r/got.MolarVolume, got.DPdT, 1e-6, "ideal gas: dP/dT = R/v")
		assert.InEpsilon(t, -r*300/(got.MolarVolume*got.MolarVolume), got.DPdV, 1e-6, "ideal gas: dP/dv = -RT/v²")
		lnphi := make([]float64, 3)
		_, err = m.LnPhi(x, 300, 1, lnphi)
		require.NoError(t, err)
		for i := range lnphi {
			assert.InDelta(t, 0, lnphi[i], 1e-6)
		}
	}
}
