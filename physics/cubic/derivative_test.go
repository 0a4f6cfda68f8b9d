package cubic_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/cubic"
)

// heavyEnd is a hypothetical heavy-end pseudo-component with ω > 0.49 so
// that the Robinson & Peng (1978) κ branch is exercised; its constants are
// illustrative (typical of a C10+ cut, common practice), used only for
// self-consistency checks.
var heavyEnd = component{"C10+ pseudo", 620, 2.1e6, 0.53, 0.15}

// Illustrative binary interaction parameters (typical magnitudes for
// N2/CO2 with hydrocarbons, common practice; not fitted data).
func naturalGas(t testing.TB, kind cubic.Kind) (*cubic.Mixture, []float64) {
	t.Helper()
	kij := [][]float64{
		// CH4   C2H6   C3H8   N2     CO2
		{0, 0, 0, 0.03, 0.10},
		{0, 0, 0, 0.04, 0.13},
		{0, 0, 0, 0.08, 0.13},
		{0.03, 0.04, 0.08, 0, -0.02},
		{0.10, 0.13, 0.13, -0.02, 0},
	}
	m := newMixture(t, kind, kij, methane, ethane, propane, nitrogen, carbonDioxide)
	return m, []float64{0.87, 0.06, 0.02, 0.03, 0.02}
}

type fdCase struct {
	name string
	m    *cubic.Mixture
	x    []float64
	t, p float64
}

func fdCases(t *testing.T) []fdCase {
	ngPR, x := naturalGas(t, cubic.PengRobinson)
	ngSRK, _ := naturalGas(t, cubic.SoaveRedlichKwong)
	co2 := newMixture(t, cubic.PengRobinson, nil, carbonDioxide)
	c3 := newMixture(t, cubic.PengRobinson, nil, propane)
	heavy := newMixture(t, cubic.PengRobinson, [][]float64{{0, 0.04}, {0.04, 0}}, methane, heavyEnd)
	heavySRK := newMixture(t, cubic.SoaveRedlichKwong, nil, methane, heavyEnd)
	return []fdCase{
		{"PR natural gas 300 K 5 MPa", ngPR, x, 300, 5e6},
		{"PR natural gas 420 K 15 MPa", ngPR, x, 420, 15e6},
		{"SRK natural gas 300 K 5 MPa", ngSRK, x, 300, 5e6},
		{"PR CO2 280 K 0.5 MPa", co2, []float64{1}, 280, 0.5e6},
		{"PR CO2 280 K 4.1607 MPa vapour of three", co2, []float64{1}, 280, 4.1607e6},
		{"PR propane 400 K 7 MPa dense", c3, []float64{1}, 400, 7e6},
		{"PR methane + heavy end (omega 0.53) 500 K 3 MPa", heavy, []float64{0.95, 0.05}, 500, 3e6},
		{"SRK methane + heavy end 500 K 3 MPa", heavySRK, []float64{0.95, 0.05}, 500, 3e6},
	}
}

// TestDerivativesAgainstFiniteDifferences compares the analytic results of
// Residual with central finite differences of the same equation
// (thermodynamic identities, e.g. Çengel & Boles, Thermodynamics, 6th ed.
// (2008), ch. 12, "general relations for du, dh, ds, cv and cp"):
//
//	(∂v/∂P)_T = 1/DPdV,  (∂v/∂T)_P = −DPdT/DPdV
//	(∂h_res/∂T)_P = R·CvDep + T·DPdT²/(−DPdV) − R,  (∂s_res/∂T)_P = that/T
//	(∂ ln φ/∂P)_T = (Z − 1)/P,  h_res/(RT) = −T (∂ ln φ/∂T)_P
//
// with ln φ = HDep − SDep. Relative step 1e-4 (central difference error
// ~1e-8), tolerance 1e-6 relative.
func TestDerivativesAgainstFiniteDifferences(t *testing.T) {
	const r = physics.UniversalGasConstant
	for _, tc := range fdCases(t) {
		t.Run(tc.name, func(t *testing.T) {
			at := func(tt, pp float64) cubic.Residual {
				res, err := tc.m.Residual(tc.x, physics.Kelvin(tt), physics.Pascal(pp))
				require.NoError(t, err)
				return res
			}
			s := at(tc.t, tc.p)
			ht, hp := 1e-4*tc.t, 1e-4*tc.p
			tp, tm := at(tc.t+ht, tc.p), at(tc.t-ht, tc.p)
			pp, pm := at(tc.t, tc.p+hp), at(tc.t, tc.p-hp)
			require.Equal(t, s.Root, tp.Root)
			require.Equal(t, s.Root, pm.Root)

			dvdp := (pp.MolarVolume - pm.MolarVolume) / (2 * hp)
			assert.InEpsilon(t, 1/s.DPdV, dvdp, 1e-6, "dv/dP = 1/DPdV")
			dvdt := (tp.MolarVolume - tm.MolarVolume) / (2 * ht)
			assert.InEpsilon(t, -s.DPdT/s.DPdV, dvdt, 1e-6, "dv/dT|P = -DPdT/DPdV")

			hres := func(x cubic.Residual, tt float64) float64 { return x.HDep * r * tt }
			cpRes := r*s.CvDep + tc.t*s.DPdT*s.DPdT/(-s.DPdV) - r
			dhdt := (hres(tp, tc.t+ht) - hres(tm, tc.t-ht)) / (2 * ht)
			assert.InDelta(t, cpRes, dhdt, 1e-6*math.Max(math.Abs(cpRes), r), "dh_res/dT|P = cp_res")
			dsdt := (tp.SDep - tm.SDep) * r / (2 * ht)
			assert.InDelta(t, cpRes/tc.t, dsdt, 1e-6*math.Max(math.Abs(cpRes), r)/tc.t, "ds_res/dT|P = cp_res/T")

			lnphi := func(x cubic.Residual) float64 { return x.HDep - x.SDep }
			dgdp := (lnphi(pp) - lnphi(pm)) / (2 * hp)
			assert.InEpsilon(t, (s.Z-1)/tc.p, dgdp, 1e-6, "d ln phi/dP = (Z-1)/P")
			dgdt := (lnphi(tp) - lnphi(tm)) / (2 * ht)
			assert.InEpsilon(t, s.HDep, -tc.t*dgdt, 1e-6, "Gibbs-Helmholtz")

			// Euler: Σ xi ln φi = ln φ; ln φi = ∂(n ln φ)/∂ni.
			out := make([]float64, len(tc.x))
			z, err := tc.m.LnPhi(tc.x, physics.Kelvin(tc.t), physics.Pascal(tc.p), out)
			require.NoError(t, err)
			assert.InEpsilon(t, s.Z, z, 1e-14)
			sum := 0.0
			for i, xi := range tc.x {
				sum += xi * out[i]
			}
			assert.InDelta(t, lnphi(s), sum, 1e-12*math.Max(1, math.Abs(sum)), "sum x ln phi_i")
			if len(tc.x) < 2 {
				return
			}
			for i := range tc.x {
				const dn = 1e-5
				nG := func(sign float64) float64 {
					n := make([]float64, len(tc.x))
					tot := 0.0
					for j := range n {
						n[j] = tc.x[j]
						if j == i {
							n[j] += sign * dn
						}
						tot += n[j]
					}
					for j := range n {
						n[j] /= tot
					}
					return tot * lnphi(must(t, tc.m, n, tc.t, tc.p))
				}
				fd := (nG(1) - nG(-1)) / (2 * dn)
				assert.InDelta(t, out[i], fd, 1e-6*math.Max(1, math.Abs(out[i])), "ln phi_%d = d(n ln phi)/dn_%d", i, i)
			}
		})
	}
}

func must(t *testing.T, m *cubic.Mixture, x []float64, tt, pp float64) cubic.Residual {
	t.Helper()
	res, err := m.Residual(x, physics.Kelvin(tt), physics.Pascal(pp))
	require.NoError(t, err)
	return res
}

// TestMixtureZAgainstDirectFormula evaluates a CH4/C2H6/N2 (+ heavy end,
// ω > 0.49) mixture independently inside the test: a_i from
// Peng & Robinson (1976) eqs. (9), (12), (17) (κ of Robinson & Peng 1978
// for ω > 0.49), the van der Waals one-fluid mixing rules with math.Pow and
// math.Sqrt, and the root of P(v) = P found by bisection on v rather than
// a cubic in Z. Agreement to 1e-9 relative.
func TestMixtureZAgainstDirectFormula(t *testing.T) {
	comps := []component{methane, ethane, nitrogen, heavyEnd}
	kij := [][]float64{{0, 0.01, 0.03, 0.04}, {0.01, 0, 0.04, 0.02}, {0.03, 0.04, 0, 0.1}, {0.04, 0.02, 0.1, 0}}
	x := []float64{0.85, 0.08, 0.06, 0.01}
	m := newMixture(t, cubic.PengRobinson, kij, comps...)
	const r = 8.314462618
	for _, st := range []struct{ t, p float64 }{{300, 5e6}, {350, 10e6}, {450, 20e6}, {280, 1e5}} {
		var am, bm float64
		ai := make([]float64, len(comps))
		for i, c := range comps {
			k := 0.37464 + 1.54226*c.omega - 0.26992*c.omega*c.omega
			if c.omega > 0.49 {
				k = 0.379642 + 1.48503*c.omega - 0.164423*math.Pow(c.omega, 2) + 0.016666*math.Pow(c.omega, 3)
			}
			ai[i] = 0.45724 * r * r * c.tc * c.tc / c.pc * math.Pow(1+k*(1-math.Sqrt(st.t/c.tc)), 2)
			bm += x[i] * 0.07780 * r * c.tc / c.pc
		}
		for i := range comps {
			for j := range comps {
				am += x[i] * x[j] * math.Sqrt(ai[i]*ai[j]) * (1 - kij[i][j])
			}
		}
		pOf := func(v float64) float64 { return r*st.t/(v-bm) - am/(v*v+2*bm*v-bm*bm) }
		lo, hi := bm*(1+1e-12), 10*r*st.t/st.p
		for range 200 {
			mid := 0.5 * (lo + hi)
			if pOf(mid) > st.p {
				lo = mid
			} else {
				hi = mid
			}
		}
		zWant := st.p * 0.5 * (lo + hi) / (r * st.t)
		got, err := m.Residual(x, physics.Kelvin(st.t), physics.Pascal(st.p))
		require.NoError(t, err)
		require.Equal(t, cubic.RootOnlyGasLike, got.Root, "single gas root, so bisection finds the same root")
		assert.InEpsilon(t, zWant, got.Z, 1e-9, "T=%g P=%g", st.t, st.p)
	}
}
