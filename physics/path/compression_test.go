package path_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/path"
)

// airModel is the ideal-gas air of the check case in the reference pack,
// stage-examples.md §8: R = 287.055 J/(kg K) (M = 28.9647 g/mol), k = 1.4,
// cp = k R/(k − 1).
func airModel(t testing.TB) gas.Constant {
	t.Helper()
	m, err := gas.NewConstant(physics.JoulePerKgK(1.4*287.055/0.4), 1.4)
	require.NoError(t, err)
	return m
}

func suctionState(t testing.TB, m gas.Model, t1 physics.Kelvin, p1 physics.Pascal) gas.State {
	t.Helper()
	s, err := m.State(t1, p1)
	require.NoError(t, err)
	return s
}

var methods = []path.Method{path.Stepwise, path.Schultz}

// TestIdealGasCheckCase reproduces the ideal-gas check case of the
// reference pack, stage-examples.md §8 (values "computed here" in the pack;
// equation forms of Schultz 1962 / ASME PTC 10 from memory): air, T1 = 300 K,
// p2/p1 = 3, ηp = 0.80, by both methods.
func TestIdealGasCheckCase(t *testing.T) {
	m := airModel(t)
	s1 := suctionState(t, m, 300, 100e3)
	for _, method := range methods {
		t.Run(method.String(), func(t *testing.T) {
			r, err := path.Compression(m, s1, 300e3, path.Efficiency{Basis: path.Polytropic, Value: 0.80}, method)
			require.NoError(t, err)
			assert.Equal(t, method, r.Method)
			// stage-examples.md §8 table, computed here (6 significant digits given).
			assert.InEpsilon(t, 0.357143, r.Schultz.M, 2e-6, "m")
			assert.InEpsilon(t, 1.555556, r.Schultz.N, 2e-6, "n")
			assert.InEpsilon(t, 1.555556, r.Schultz.NFromXY, 2e-6, "n = 1/(Y − m(1+X))")
			assert.InDelta(t, 2.8000, r.Schultz.N/(r.Schultz.N-1), 5e-5, "n/(n−1)")
			assert.InDelta(t, 444.14, float64(r.Discharge.Temperature), 0.005, "T2 (K)")
			assert.InDelta(t, 115.855, float64(r.PolytropicHead)/1e3, 0.0005, "Hp (kJ/kg)")
			assert.InDelta(t, 115.855, float64(r.Schultz.Head)/1e3, 0.0005, "Hp Schultz (kJ/kg)")
			assert.InDelta(t, 115.855, float64(r.Stepwise.Head)/1e3, 0.0005, "Hp stepwise (kJ/kg)")
			assert.InDelta(t, 144.818, float64(r.Work)/1e3, 0.0005, "work (kJ/kg)")
			assert.InDelta(t, 111.141, float64(r.IsentropicHead)/1e3, 0.0005, "isentropic head (kJ/kg)")
			assert.InDelta(t, 0.7674, r.IsentropicEfficiency, 0.00005, "ηs")
			assert.InDelta(t, 0.8000, r.PolytropicEfficiency, 1e-6, "Hp/work = ηp")
			// Ideal-gas limit, same section: X = 0, Y = 1, f = 1, n_s = k.
			assert.InDelta(t, 0, r.Schultz.X, 1e-12)
			assert.InDelta(t, 1, r.Schultz.Y, 1e-12)
			assert.InDelta(t, 1, r.Schultz.HeadFactor, 1e-12, "f")
			assert.InDelta(t, 1.4, r.Schultz.IsentropicN, 1e-9, "n_s")
			// Both methods agree for a perfect gas to the step tolerance.
			assert.Less(t, math.Abs(r.HeadDifference), path.StepTolerance)
		})
	}
}

// TestPerfectGasClosedForms checks both numerical paths against the closed
// forms of a perfect gas (Dixon & Hall, Fluid Mechanics and Thermodynamics
// of Turbomachinery, 7th ed. (2014), ch. 2, small-stage efficiency):
//
//	T2/T1 = pr^((γ−1)/(γ ηp)),   ηs = (pr^((γ−1)/γ) − 1)/(pr^((γ−1)/(γ ηp)) − 1),
//	Hp = ηp cp (T2 − T1),        n/(n−1) = ηp γ/(γ−1), f = 1 (pack §8).
func TestPerfectGasClosedForms(t *testing.T) {
	cases := []struct {
		name      string
		gamma, pr float64
		etaP      float64
	}{
		{"air pr 1.5 eta 0.88", 1.4, 1.5, 0.88},
		{"air pr 3 eta 0.80", 1.4, 3, 0.80},
		{"air pr 10 eta 0.70", 1.4, 10, 0.70},
		{"air pr 4 eta 1 (isentropic)", 1.4, 4, 1},
		{"gamma 1.3 pr 2.5 eta 0.82", 1.3, 2.5, 0.82},
		{"monatomic pr 6 eta 0.75", 5.0 / 3.0, 6, 0.75},
		{"gamma 1.1 pr 30 eta 0.6", 1.1, 30, 0.6},
	}
	const r = 287.055
	for _, tc := range cases {
		cp := tc.gamma * r / (tc.gamma - 1)
		m, err := gas.NewConstant(physics.JoulePerKgK(cp), tc.gamma)
		require.NoError(t, err)
		s1 := suctionState(t, m, 300, 1e5)
		e := (tc.gamma - 1) / tc.gamma
		t2 := 300 * math.Pow(tc.pr, e/tc.etaP)
		etaS := (math.Pow(tc.pr, e) - 1) / (math.Pow(tc.pr, e/tc.etaP) - 1)
		for _, method := range methods {
			t.Run(tc.name+"/"+method.String(), func(t *testing.T) {
				res, err := path.Compression(m, s1, physics.Pascal(1e5*tc.pr), path.Efficiency{Basis: path.Polytropic, Value: tc.etaP}, method)
				require.NoError(t, err)
				assert.InEpsilon(t, t2, float64(res.Discharge.Temperature), 1e-7, "T2")
				assert.InEpsilon(t, etaS, res.IsentropicEfficiency, 1e-7, "ηs")
				assert.InEpsilon(t, tc.etaP*cp*(t2-300), float64(res.PolytropicHead), 1e-7, "Hp")
				assert.InEpsilon(t, cp*300*(math.Pow(tc.pr, e)-1), float64(res.IsentropicHead), 1e-9, "Hs")
				assert.InDelta(t, 1, res.Schultz.HeadFactor, 1e-9, "f")
				assert.InEpsilon(t, tc.etaP/e, res.Schultz.N/(res.Schultz.N-1), 1e-6, "n/(n−1)")
				assert.InEpsilon(t, tc.gamma, res.Schultz.IsentropicN, 1e-9, "n_s")

				// The inverse: the isentropic efficiency gives back ηp.
				back, err := path.Compression(m, s1, physics.Pascal(1e5*tc.pr), path.Efficiency{Basis: path.Isentropic, Value: etaS}, method)
				require.NoError(t, err)
				assert.InEpsilon(t, tc.etaP, back.PolytropicEfficiency, 1e-7, "ηp from ηs")
				assert.InEpsilon(t, tc.etaP, back.Stepwise.Efficiency, 1e-7, "stepwise ηp from ηs")
			})
		}
		gotS, err := path.PerfectGasIsentropicEfficiency(tc.etaP, tc.pr, tc.gamma)
		require.NoError(t, err)
		assert.InEpsilon(t, etaS, gotS, 1e-12, tc.name)
		gotP, err := path.PerfectGasPolytropicEfficiency(etaS, tc.pr, tc.gamma)
		require.NoError(t, err)
		assert.InEpsilon(t, tc.etaP, gotP, 1e-12, tc.name)
	}
}

// TestPolytropicExceedsIsentropic: for a compression with pr > 1 and η < 1
// the polytropic efficiency exceeds the isentropic one, and the gap widens
// with the pressure ratio (Dixon & Hall (2014), ch. 2, the figure of ηs
// against pr at constant ηp).
func TestPolytropicExceedsIsentropic(t *testing.T) {
	prev := 1.0
	for _, pr := range []float64{1.2, 2, 5, 20} {
		etaS, err := path.PerfectGasIsentropicEfficiency(0.85, pr, 1.4)
		require.NoError(t, err)
		assert.Less(t, etaS, 0.85)
		assert.Less(t, etaS, prev)
		prev = etaS
	}
	// The limit pr → 1 is ηs = ηp (same source).
	etaS, err := path.PerfectGasIsentropicEfficiency(0.85, 1+1e-9, 1.4)
	require.NoError(t, err)
	assert.InDelta(t, 0.85, etaS, 1e-9)
}

// TestCompressionForWork inverts Compression: the work of a compression
// to p2 makes p2 again, for both bases and both methods (round trip of the
// definitions in Dixon & Hall (2014), ch. 2).
func TestCompressionForWork(t *testing.T) {
	models := []struct {
		name string
		m    gas.Model
		t1   physics.Kelvin
		p1   physics.Pascal
		p2   physics.Pascal
	}{
		{"ideal air", airModel(t), 300, 100e3, 300e3},
		{"virial CO2", co2Virial(), 310, 2e6, 6e6},
	}
	for _, mc := range models {
		s1 := suctionState(t, mc.m, mc.t1, mc.p1)
		for _, method := range methods {
			for _, eff := range []path.Efficiency{{Basis: path.Polytropic, Value: 0.8}, {Basis: path.Isentropic, Value: 0.78}} {
				t.Run(mc.name+"/"+method.String()+"/"+eff.Basis.String(), func(t *testing.T) {
					fwd, err := path.Compression(mc.m, s1, mc.p2, eff, method)
					require.NoError(t, err)
					inv, err := path.CompressionForWork(mc.m, s1, fwd.Work, eff, method)
					require.NoError(t, err)
					assert.InEpsilon(t, float64(mc.p2), float64(inv.Discharge.Pressure), 1e-8)
					assert.InEpsilon(t, float64(fwd.Work), float64(inv.Work), 1e-8)
					// a first guess of the pressure, above or below the root, or
					// useless (at or below suction): the same compression
					for _, near := range []float64{0.9, 1.1, 0} {
						g, err := path.CompressionForWorkNear(mc.m, s1, fwd.Work, eff, method, physics.Pascal(near*float64(mc.p2)))
						require.NoError(t, err)
						assert.InEpsilon(t, float64(mc.p2), float64(g.Discharge.Pressure), 1e-8, "near %g", near)
					}
				})
			}
		}
	}
}

// TestCompressionForWorkFromIsBitIdentical: an iteration that carries the
// previous call's End (the off-design passes of a rated point) gets the
// very same result as one that does not, bit for bit, for both methods, a
// real-gas model and works on both sides of the previous one; an End of
// another efficiency is not taken. This pins the reuse as a saving of
// work only (the path at a pressure does not depend on the work).
func TestCompressionForWorkFromIsBitIdentical(t *testing.T) {
	m := co2Virial()
	s1 := suctionState(t, m, 310, 2e6)
	for _, method := range methods {
		eff := path.Efficiency{Basis: path.Polytropic, Value: 0.8}
		fwd, err := path.Compression(m, s1, 6e6, eff, method)
		require.NoError(t, err)
		r0, end, err := path.CompressionForWorkFrom(m, s1, fwd.Work, eff, method, 0, nil)
		require.NoError(t, err)
		near := r0.Discharge.Pressure
		p1 := float64(s1.Pressure)
		require.Equal(t, path.EndPressure(end), physics.Pascal(p1*math.Exp(math.Log(float64(near)/p1))),
			"the first Newton step must land on the End's pressure, or the reuse is not exercised")
		for _, f := range []float64{1, 1 + 1e-7, 1 - 1e-4, 1.01} {
			w := fwd.Work * physics.JoulePerKg(f)
			want, err := path.CompressionForWorkNear(m, s1, w, eff, method, near)
			require.NoError(t, err)
			got, _, err := path.CompressionForWorkFrom(m, s1, w, eff, method, near, &end)
			require.NoError(t, err)
			assert.Equal(t, want, got, "%s, work x %g", method, f)
			other := path.Efficiency{Basis: path.Polytropic, Value: 0.75}
			want, err = path.CompressionForWorkNear(m, s1, w, other, method, near)
			require.NoError(t, err)
			got, _, err = path.CompressionForWorkFrom(m, s1, w, other, method, near, &end)
			require.NoError(t, err)
			assert.Equal(t, want, got, "%s, other efficiency, work x %g", method, f)
		}
	}
}

// TestErrors has a row for every range check, NaN included; each must
// unwrap to physics.ErrDomain (design rule, helper-rules.md).
func TestErrors(t *testing.T) {
	m := airModel(t)
	s1 := suctionState(t, m, 300, 100e3)
	nan, inf := math.NaN(), math.Inf(1)
	poly := func(v float64) path.Efficiency { return path.Efficiency{Basis: path.Polytropic, Value: v} }
	badT := s1
	badT.Temperature = physics.Kelvin(nan)
	badRho := s1
	badRho.Density = 0
	badH := s1
	badH.Enthalpy = physics.JoulePerKg(inf)
	cases := []struct {
		name   string
		model  gas.Model
		s1     gas.State
		p2     physics.Pascal
		eff    path.Efficiency
		method path.Method
		reason string
	}{
		{"nil model", nil, s1, 3e5, poly(0.8), path.Stepwise, "a gas model is required"},
		{"suction T NaN", m, badT, 3e5, poly(0.8), path.Stepwise, "suction state"},
		{"suction density 0", m, badRho, 3e5, poly(0.8), path.Stepwise, "suction state"},
		{"suction h Inf", m, badH, 3e5, poly(0.8), path.Stepwise, "suction state"},
		{"p2 NaN", m, s1, physics.Pascal(nan), poly(0.8), path.Stepwise, "discharge pressure"},
		{"p2 +Inf", m, s1, physics.Pascal(inf), poly(0.8), path.Stepwise, "discharge pressure"},
		{"p2 negative", m, s1, -1, poly(0.8), path.Stepwise, "discharge pressure"},
		{"p2 below p1", m, s1, 9e4, poly(0.8), path.Stepwise, "discharge pressure must exceed suction pressure"},
		{"p2 equal p1", m, s1, 1e5, poly(0.8), path.Schultz, "discharge pressure must exceed suction pressure"},
		{"eta 0", m, s1, 3e5, poly(0), path.Stepwise, "efficiency"},
		{"eta negative", m, s1, 3e5, poly(-0.5), path.Stepwise, "efficiency"},
		{"eta above 1", m, s1, 3e5, poly(1.0001), path.Stepwise, "efficiency"},
		{"eta NaN", m, s1, 3e5, poly(nan), path.Stepwise, "efficiency"},
		{"eta Inf", m, s1, 3e5, poly(inf), path.Schultz, "efficiency"},
		{"isentropic eta NaN", m, s1, 3e5, path.Efficiency{Basis: path.Isentropic, Value: nan}, path.Stepwise, "isentropic efficiency"},
		{"basis unset", m, s1, 3e5, path.Efficiency{Value: 0.8}, path.Stepwise, "basis"},
		{"basis unknown", m, s1, 3e5, path.Efficiency{Basis: 9, Value: 0.8}, path.Stepwise, "basis"},
		{"method unknown", m, s1, 3e5, poly(0.8), path.Method(7), "method"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := path.Compression(tc.model, tc.s1, tc.p2, tc.eff, tc.method)
			require.ErrorIs(t, err, physics.ErrDomain)
			assert.Contains(t, err.Error(), tc.reason)
			if tc.eff.Basis == path.Polytropic && tc.method == path.Stepwise {
				_, err = path.StepwisePath(tc.model, tc.s1, tc.p2, tc.eff.Value)
				require.ErrorIs(t, err, physics.ErrDomain)
			}
		})
	}
}

func TestCompressionForWorkErrors(t *testing.T) {
	m := airModel(t)
	s1 := suctionState(t, m, 300, 100e3)
	poly := path.Efficiency{Basis: path.Polytropic, Value: 0.8}
	for _, w := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		_, err := path.CompressionForWork(m, s1, physics.JoulePerKg(w), poly, path.Stepwise)
		require.ErrorIs(t, err, physics.ErrDomain, "w = %g", w)
		assert.Contains(t, err.Error(), "work")
	}
	_, err := path.CompressionForWork(nil, s1, 1e5, poly, path.Stepwise)
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = path.CompressionForWork(m, s1, 1e5, path.Efficiency{Basis: path.Isentropic, Value: math.NaN()}, path.Stepwise)
	require.ErrorIs(t, err, physics.ErrDomain)
	_, err = path.CompressionForWork(m, s1, 1e5, poly, path.Method(3))
	require.ErrorIs(t, err, physics.ErrDomain)
}

func TestPerfectGasErrors(t *testing.T) {
	nan := math.NaN()
	cases := []struct {
		name           string
		eta, pr, gamma float64
	}{
		{"eta 0", 0, 3, 1.4},
		{"eta above 1", 1.2, 3, 1.4},
		{"eta NaN", nan, 3, 1.4},
		{"pr 1", 0.8, 1, 1.4},
		{"pr below 1", 0.8, 0.5, 1.4},
		{"pr NaN", 0.8, nan, 1.4},
		{"pr Inf", 0.8, math.Inf(1), 1.4},
		{"gamma 1", 0.8, 3, 1},
		{"gamma above 5/3", 0.8, 3, 1.7},
		{"gamma NaN", 0.8, 3, nan},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := path.PerfectGasIsentropicEfficiency(tc.eta, tc.pr, tc.gamma)
			require.ErrorIs(t, err, physics.ErrDomain)
			_, err = path.PerfectGasPolytropicEfficiency(tc.eta, tc.pr, tc.gamma)
			require.ErrorIs(t, err, physics.ErrDomain)
		})
	}
	// Overflow: pr^((γ−1)/(γ ηp)) beyond float64.
	_, err := path.PerfectGasIsentropicEfficiency(1e-300, 3, 1.4)
	require.ErrorIs(t, err, physics.ErrDomain)
}

func TestSchultzAnalysisErrors(t *testing.T) {
	m := airModel(t)
	s1 := suctionState(t, m, 300, 100e3)
	iso, err := m.StateFromPS(300e3, s1.Entropy)
	require.NoError(t, err)
	dis := suctionState(t, m, 444.14, 300e3)
	other := suctionState(t, m, 444.14, 310e3)
	cold := suctionState(t, m, 400, 300e3) // below the isentropic discharge temperature
	nanState := dis
	nanState.SchultzX = math.NaN()
	cases := []struct {
		name            string
		s1, s2, s2s     gas.State
		reasonFragement string
	}{
		{"discharge pressure not above suction", s1, s1, s1, "discharge pressure must exceed suction pressure"},
		{"isentropic state at another pressure", s1, dis, suctionState(t, m, 410, 310e3), "isentropic discharge state"},
		{"discharge below the isentrope", s1, cold, iso, "not a compression"},
		{"isentropic state swapped", s1, iso, other, "isentropic discharge state"},
		{"NaN in discharge", s1, nanState, iso, "discharge state"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := path.SchultzAnalysis(tc.s1, tc.s2, tc.s2s)
			require.ErrorIs(t, err, physics.ErrDomain)
			assert.Contains(t, err.Error(), tc.reasonFragement)
		})
	}
}

// TestModelErrorsWrapped: an error of the gas model reaches the caller
// with context and still unwraps to physics.ErrDomain. The test virial
// model stops at 1200 K, which a polytropic path at ηp = 0.1 over pr = 3
// passes.
func TestModelErrorsWrapped(t *testing.T) {
	m := co2Virial()
	s1 := suctionState(t, m, 310, 2e6)
	_, err := path.Compression(m, s1, 6e6, path.Efficiency{Basis: path.Polytropic, Value: 0.1}, path.Stepwise)
	require.ErrorIs(t, err, physics.ErrDomain)
	assert.Contains(t, err.Error(), "state on the polytropic path at")
	assert.Contains(t, err.Error(), "test virial model")
	// Isentropic discharge outside the model: pressure above its 20 MPa.
	_, err = path.Compression(m, s1, 30e6, path.Efficiency{Basis: path.Isentropic, Value: 0.8}, path.Schultz)
	require.ErrorIs(t, err, physics.ErrDomain)
	assert.Contains(t, err.Error(), "isentropic discharge state at")
}

// FuzzCompression: any input gives an error that unwraps to ErrDomain or a
// finite result (design rule for physics entry points).
func FuzzCompression(f *testing.F) {
	f.Add(300.0, 1e5, 3.0, 0.8, uint8(2), uint8(0))
	f.Add(250.0, 5e6, 1.0001, 1.0, uint8(1), uint8(1))
	f.Add(1000.0, 1e3, 1e4, 0.05, uint8(2), uint8(1))
	f.Add(math.NaN(), 1e5, 3.0, 0.8, uint8(0), uint8(0))
	m, err := gas.NewConstant(1004.6925, 1.4)
	require.NoError(f, err)
	f.Fuzz(func(t *testing.T, t1, p1, pr, eta float64, basis, method uint8) {
		s1, err := m.State(physics.Kelvin(t1), physics.Pascal(p1))
		if err != nil {
			return
		}
		r, err := path.Compression(m, s1, physics.Pascal(p1*pr), path.Efficiency{Basis: path.Basis(basis), Value: eta}, path.Method(method))
		if err != nil {
			require.ErrorIs(t, err, physics.ErrDomain)
			return
		}
		require.True(t, physics.Finite(float64(r.Work), float64(r.PolytropicHead), float64(r.IsentropicHead),
			r.IsentropicEfficiency, r.PolytropicEfficiency, r.HeadDifference, float64(r.Discharge.Temperature),
			r.Schultz.N, r.Schultz.M, r.Schultz.HeadFactor, r.Stepwise.HeadError, r.Stepwise.Closure))
	})
}

// roughGas is the ideal-constant air with a compressibility function X
// that oscillates faster than any step of the path can resolve: a gas no
// real model is, made to reach the step limit.
type roughGas struct{ gas.Constant }

func (g roughGas) State(t physics.Kelvin, p physics.Pascal) (gas.State, error) {
	s, err := g.Constant.State(t, p)
	s.SchultzX = 0.05 * math.Sin(1e4*float64(t))
	return s, err
}

// TestStepLimit: a path that does not converge in MaxSteps is an error,
// not an unconverged answer.
func TestStepLimit(t *testing.T) {
	m := roughGas{airModel(t)}
	s1 := suctionState(t, m, 300, 1e5)
	_, err := path.StepwisePath(m, s1, 3e5, 0.8)
	require.ErrorIs(t, err, physics.ErrDomain)
	assert.Contains(t, err.Error(), "did not converge in 4096 steps")
}

// TestSchultzEqualDensity: an ideal gas heated in proportion to the pressure
// keeps its density, so n = ln(p2/p1)/ln(v1/v2) is undefined (pack §8
// definition) and the analysis says so instead of returning ±Inf.
func TestSchultzEqualDensity(t *testing.T) {
	m := airModel(t)
	s1 := suctionState(t, m, 300, 1e5)
	iso, err := m.StateFromPS(3e5, s1.Entropy)
	require.NoError(t, err)
	_, err = path.SchultzAnalysis(s1, suctionState(t, m, 900, 3e5), iso)
	require.ErrorIs(t, err, physics.ErrDomain)
	assert.Contains(t, err.Error(), "polytropic volume exponent is undefined")
	// Just off it the head is finite and continuous (logarithmic-mean form).
	a, err := path.SchultzAnalysis(s1, suctionState(t, m, 900.001, 3e5), iso)
	require.NoError(t, err)
	b, err := path.SchultzAnalysis(s1, suctionState(t, m, 899.999, 3e5), iso)
	require.NoError(t, err)
	// n → ∞, n/(n−1) → 1: Hp = f (n/(n−1))(p2 v2 − p1 v1) → v (p2 − p1), f = 1.
	want := 287.055 * 300 / 1e5 * (3e5 - 1e5)
	assert.InEpsilon(t, want, float64(a.Head), 1e-5)
	assert.InEpsilon(t, want, float64(b.Head), 1e-5)
}
