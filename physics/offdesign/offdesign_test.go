package offdesign_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/offdesign"
	"stagewright/physics/path"
	"stagewright/physics/stage"
)

// air is the constant-property air of the textbook examples (cp = 1005
// J/(kg K), γ = 1.4; Saravanamuttoo et al., Gas Turbine Theory, ch. 4).
func air(t testing.TB) gas.Constant {
	m, err := gas.NewConstant(1005, 1.4)
	require.NoError(t, err)
	return m
}

// demoStage is an invented backswept process stage (D2 = 0.4 m).
func demoStage() offdesign.Stage {
	return offdesign.Stage{TipDiameter: 0.4, ExitWidth: 0.022, BladeExitAngle: 40, SlipFactor: 0.87, PowerInputFactor: 1.0,
		ExitBlockage: 0.1, ImpellerLossShare: stage.DefaultImpellerLossShare, Method: path.Stepwise,
		Inlet:  offdesign.Inlet{Kind: stage.InletAxialEye, EyeTipDiameter: 0.2, EyeHubDiameter: 0.07, BladeAngle: 60},
		Design: offdesign.Design{FlowCoefficient: 0.09, TipMach: 0.75, PolytropicEfficiency: 0.82}}
}

func state(t testing.TB, m gas.Model, tk, p float64) gas.State {
	st, err := m.State(physics.Kelvin(tk), physics.Pascal(p))
	require.NoError(t, err)
	return st
}

// TestInducerChokeIndependent checks the inducer choke flow against an
// independent throat-continuity calculation at Mach 1 in the relative
// frame: relative stagnation temperature T0r = T01 + U1²/(2 cp) at the rms
// radius (rothalpy with no prewhirl, Dixon & Hall 2014 §7.5),
// p0r = p01 (T0r/T01)^(γ/(γ−1)) (isentropic), and the choked mass-flow
// function ṁ* = A ρ0 a0 (2/(γ+1))^((γ+1)/(2(γ−1))) (NACA Report 1135,
// eq. 33 form; Dixon & Hall 2014, ch. 1) through the throat A1 cos β1.
func TestInducerChokeIndependent(t *testing.T) {
	m := air(t)
	cp, g := 1005.0, 1.4
	r := cp * (g - 1) / g
	for _, n := range []float64{6000, 9000, 12000} {
		s := demoStage()
		st := state(t, m, 293.15, 101325)
		line, err := offdesign.NewLine(m, st, physics.RevPerMin(n), s)
		require.NoError(t, err)
		got, passage := line.InducerChoke()
		rms := math.Sqrt((0.2*0.2 + 0.07*0.07) / 8)
		u1 := 2 * math.Pi * rms * n / 60
		t0r := 293.15 + u1*u1/(2*cp)
		p0r := 101325 * math.Pow(t0r/293.15, g/(g-1))
		rho0r := p0r / (r * t0r)
		a0r := math.Sqrt(g * r * t0r)
		area := math.Pi / 4 * (0.2*0.2 - 0.07*0.07) * math.Cos(60*math.Pi/180)
		want := area * rho0r * a0r * math.Pow(2/(g+1), (g+1)/(2*(g-1)))
		// the eye annulus at Mach 1 in the absolute frame (same function)
		eye := math.Pi / 4 * (0.2*0.2 - 0.07*0.07) * float64(st.Density) * float64(st.SoundSpeed) * math.Pow(2/(g+1), (g+1)/(2*(g-1)))
		if eye < want {
			want = eye
			assert.Equal(t, offdesign.ChokeEye, passage)
		} else {
			assert.Equal(t, offdesign.ChokeInducerThroat, passage)
		}
		assert.InEpsilon(t, want, got, 1e-8, "speed %g", n)
	}
}

// TestSonicFluxPerfectGas: the sonic flux of a perfect gas from its
// stagnation state is ρ0 a0 (2/(γ+1))^((γ+1)/(2(γ−1))) = 0.5787 ρ0 a0 for
// γ = 1.4 (NACA Report 1135, Table I at M = 1: ρ/ρ0 = 0.63394,
// a/a0 = √0.83333).
func TestSonicFluxPerfectGas(t *testing.T) {
	m := air(t)
	st := state(t, m, 288.15, 101325)
	f, c, err := offdesign.SonicFlux(m, st)
	require.NoError(t, err)
	want := float64(st.Density) * float64(st.SoundSpeed) * 0.63394 * math.Sqrt(0.83333)
	assert.InEpsilon(t, want, f, 2e-5)
	assert.InEpsilon(t, float64(st.SoundSpeed)*math.Sqrt(0.83333), float64(c), 2e-5)
	_, _, err = offdesign.SonicFlux(m, gas.State{})
	require.ErrorIs(t, err, physics.ErrDomain)
}

// TestEfficiencyShape: the characteristic peaks at the peak flow with the
// peak efficiency, falls on both sides, falls faster towards choke than
// towards surge (Casey & Robinson 2013: a flat surge side and a steep
// choke side; the form is from memory), and refuses flows at or past
// choke and NaN.
func TestEfficiencyShape(t *testing.T) {
	peak, err := offdesign.Efficiency(0.09, 0.09, 0.15, 0.82, 3)
	require.NoError(t, err)
	assert.InDelta(t, 0.82, peak, 1e-15)
	prev := 0.0
	for phi := 0.03; phi <= 0.09+1e-12; phi += 0.005 {
		e, err := offdesign.Efficiency(phi, 0.09, 0.15, 0.82, 3)
		require.NoError(t, err)
		assert.GreaterOrEqual(t, e, prev, "rises to the peak at %g", phi)
		prev = e
	}
	for phi := 0.095; phi < 0.15; phi += 0.005 {
		e, err := offdesign.Efficiency(phi, 0.09, 0.15, 0.82, 3)
		require.NoError(t, err)
		assert.Less(t, e, prev, "falls after the peak at %g", phi)
		prev = e
	}
	surge, _ := offdesign.Efficiency(0.09*0.8, 0.09, 0.15, 0.82, 3)
	choke, _ := offdesign.Efficiency(0.09+0.6*0.06, 0.09, 0.15, 0.82, 3) // 60 % of the way to choke
	assert.Less(t, 0.82-surge, 0.82-choke)
	// a transonic line keeps its efficiency longer, then falls to choke
	low, _ := offdesign.Efficiency(0.11, 0.09, 0.15, 0.82, offdesign.ChokeSideExponent(0.3))
	high, _ := offdesign.Efficiency(0.11, 0.09, 0.15, 0.82, offdesign.ChokeSideExponent(1.1))
	assert.Less(t, low, high)
	assert.InDelta(t, 4.0, offdesign.ChokeSideExponent(1.3), 1e-15)
	assert.InDelta(t, 2.0, offdesign.ChokeSideExponent(0), 1e-15)
	_, err = offdesign.Efficiency(0.05, 0.09, 0.15, 0.82, math.NaN())
	require.ErrorIs(t, err, physics.ErrDomain)
	for _, bad := range [][4]float64{{0.15, 0.09, 0.15, 0.82}, {0.2, 0.09, 0.15, 0.82}, {math.NaN(), 0.09, 0.15, 0.82},
		{0.05, 0.09, 0.08, 0.82}, {0.05, 0.09, 0.15, 1.2}, {0.05, math.NaN(), 0.15, 0.8}} {
		_, err := offdesign.Efficiency(bad[0], bad[1], bad[2], bad[3], 3)
		require.ErrorIs(t, err, physics.ErrDomain, "%v", bad)
	}
}

// TestPeakEfficiencyMach: the peak equals the design value at the design
// tip Mach number, does not move below Mu2 = 0.8 and falls above it
// (Casey & Robinson 2013 tip-Mach term, from memory).
func TestPeakEfficiencyMach(t *testing.T) {
	assert.InDelta(t, 0.82, offdesign.PeakEfficiency(0.82, 0.09, 1.1, 1.1), 1e-15)
	assert.InDelta(t, 0.82, offdesign.PeakEfficiency(0.82, 0.09, 0.5, 0.3), 1e-15)
	assert.InDelta(t, 0.82, offdesign.PeakEfficiency(0.82, 0.09, 0.5, 0.8), 1e-15)
	assert.Less(t, offdesign.PeakEfficiency(0.82, 0.09, 0.8, 1.2), 0.82)
	assert.Greater(t, offdesign.PeakEfficiency(0.82, 0.09, 1.2, 0.9), 0.82)
}

// TestFanLawsInTheLimit: at the same flow coefficient, head ~ N², flow ~ N
// and power ~ N³ (the fan laws, e.g. Dixon & Hall 2014 ch. 1, similarity),
// with the deviation shrinking as the tip Mach number falls: the model
// does not assume them, they come out of the compressible calculation.
func TestFanLawsInTheLimit(t *testing.T) {
	m := air(t)
	st := state(t, m, 293.15, 101325)
	s := demoStage()
	a01 := float64(st.SoundSpeed)
	prevDev := math.Inf(1)
	for _, mach := range []float64{0.6, 0.4, 0.2, 0.1, 0.03} {
		n0 := mach * a01 * 60 / (math.Pi * 0.4)
		var heads, powers, flows [2]float64
		for i, k := range []float64{1, 1.2} {
			line, err := offdesign.NewLine(m, st, physics.RevPerMin(n0*k), s)
			require.NoError(t, err)
			mdot := line.MassFlow(0.09)
			p, err := line.At(mdot)
			require.NoError(t, err)
			heads[i], powers[i], flows[i] = float64(p.Compression.PolytropicHead), mdot*float64(p.Compression.Work), p.VolumeFlow
		}
		assert.InEpsilon(t, 1.2, flows[1]/flows[0], 1e-12)
		dev := math.Max(math.Abs(heads[1]/heads[0]/1.44-1), math.Abs(powers[1]/powers[0]/1.728-1))
		t.Logf("Mu2 %.2f: head ratio/1.44 - 1 = %.2e, power ratio/1.728 - 1 = %.2e", mach, heads[1]/heads[0]/1.44-1, powers[1]/powers[0]/1.728-1)
		assert.Less(t, dev, prevDev, "the deviation shrinks as the tip Mach number falls (%g)", mach)
		prevDev = dev
	}
	assert.Less(t, prevDev, 1e-3)
}

// TestSpeedLineShape: on a speed line of a backswept impeller the surge
// flow lies below the peak flow and the choke flow above it, the exit flow
// angle at the surge estimate is the critical angle, the head rises
// towards surge (Euler work rising as the exit flow coefficient falls,
// Dixon & Hall 2014 §7.9), and a flow past choke is an error naming it.
func TestSpeedLineShape(t *testing.T) {
	m := air(t)
	st := state(t, m, 293.15, 101325)
	s := demoStage()
	for _, n := range []float64{8000, 10000, 12000} {
		line, err := offdesign.NewLine(m, st, physics.RevPerMin(n), s)
		require.NoError(t, err)
		ms, err := line.Surge()
		require.NoError(t, err)
		mc, _, err := line.Choke()
		require.NoError(t, err)
		mp := line.MassFlow(line.PeakFlowCoefficient())
		assert.Less(t, ms, mp)
		assert.Less(t, mp, mc)
		ps, err := line.At(ms)
		require.NoError(t, err)
		assert.InDelta(t, offdesign.DefaultSurgeFlowAngle, ps.ExitFlowAngle, 1e-6)
		pp, err := line.At(mp)
		require.NoError(t, err)
		assert.Greater(t, float64(ps.Compression.PolytropicHead), float64(pp.Compression.PolytropicHead), "head rises towards surge at %g", n)
		assert.Greater(t, ps.WorkCoefficient, pp.WorkCoefficient)
		_, err = line.At(mc * 1.01)
		require.ErrorIs(t, err, offdesign.ErrPastChoke)
		require.ErrorIs(t, err, physics.ErrDomain)
	}
}

// TestStageCheck: dimensions outside what the model covers are
// DomainErrors naming the field.
func TestStageCheck(t *testing.T) {
	cases := []struct {
		name  string
		edit  func(*offdesign.Stage)
		field string
	}{
		{"exit width wider than the tip diameter", func(s *offdesign.Stage) { s.ExitWidth = 0.5 }, "exit_width"},
		{"negative tip diameter", func(s *offdesign.Stage) { s.TipDiameter = -1 }, "tip_diameter"},
		{"NaN tip diameter", func(s *offdesign.Stage) { s.TipDiameter = physics.Meter(math.NaN()) }, "tip_diameter"},
		{"eye larger than the impeller", func(s *offdesign.Stage) { s.Inlet.EyeTipDiameter = 0.5 }, "inlet.eye_tip_diameter"},
		{"hub larger than the eye", func(s *offdesign.Stage) { s.Inlet.EyeHubDiameter = 0.3 }, "inlet.eye_hub_diameter"},
		{"backsweep 80 deg", func(s *offdesign.Stage) { s.BladeExitAngle = 80 }, "blade_exit_angle"},
		{"slip above 1", func(s *offdesign.Stage) { s.SlipFactor = 1.2 }, "slip_factor"},
	}
	for _, tc := range cases {
		s := demoStage()
		tc.edit(&s)
		err := s.Check()
		var de *physics.DomainError
		require.ErrorAs(t, err, &de, tc.name)
		assert.Equal(t, tc.field, de.Name, tc.name)
	}
	require.NoError(t, demoStage().Check())
}
