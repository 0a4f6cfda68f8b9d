package stage_test

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/stage"
)

// TestEyeGivenDiameterTextbook sizes the three textbook inducers of
// stage-examples.md with the eye tip diameter and hub ratio of each example
// given, so that cm1 comes from the continuity iteration on the static
// inlet density; the pack's "computed here" values are the oracle (0.2 %).
func TestEyeGivenDiameterTextbook(t *testing.T) {
	air := textbookAir(t)
	// §4a (Gorla & Khan 2003, Ex. 4.11, inputs stored): the stored inputs
	// give Ca = 145 m/s, T01 = 290 K and 10 kg/s through a double-sided
	// impeller (5 kg/s per eye) but no p01. p01 is derived here so that
	// continuity through the 0.28/0.14 m eye gives Ca = 145 m/s:
	// T1 = 290 − 145²/(2·1005), ρ1 = 5/(A1·145), p01 = ρ1 R T1 (T01/T1)^3.5.
	t1a := 290 - 145.0*145/(2*1005)
	a1a := math.Pi / 4 * (0.28*0.28 - 0.14*0.14)
	p01a := 5 / (a1a * 145) * float64(air.GasConstant()) * t1a * math.Pow(290/t1a, 3.5)
	cases := []struct {
		name                      string
		t01, p01, mdot, n, dt, nu float64
		// expected, from the pack ("computed here")
		cm, t1, u1t, w1t, mach, betaTip, betaHub float64
		rho1                                     float64 // 0: not given
	}{
		// §2 Saravanamuttoo et al. Ex. 4.1 (inputs from memory): eye 0.3/0.15 m;
		// computed here: Ca 142.6 m/s, T1 284.9 K, ρ1 1.191 kg/m3, U1t 273.3,
		// W1t 308.3 m/s, M1rel,t 0.911, vane angles 27.5/46.2 deg from tangential.
		{"Saravanamuttoo 4.1", 295, 1.1e5, 9, 17400, 0.30, 0.5,
			142.6, 284.9, 273.3, 308.3, 0.911, 90 - 27.5, 90 - 46.2, 1.191},
		// §4a Gorla & Khan Ex. 4.11: U 219.91/109.96 m/s, W1t 263.41 m/s,
		// T1 279.54 K, M 0.786, vane angles 33.40/52.83 deg from tangential.
		{"Gorla-Khan 4.11", 290, p01a, 5, 15000, 0.28, 0.5,
			145, 279.54, 219.91, 263.41, 0.786, 90 - 33.40, 90 - 52.83, 0},
		// §4b Gorla & Khan Ex. 4.13 (inputs stored), clean annulus column:
		// ρ1 1.119 kg/m3, Ca 133.5 m/s, T1 279.1 K, U 215.98 m/s, angles
		// from axial 58.27/38.96 deg, M 0.758.
		{"Gorla-Khan 4.13", 288, 1e5, 5.5, 16500, 0.25, 0.5,
			133.5, 279.1, 215.98, 0, 0.758, 58.27, 38.96, 1.119},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			s01 := suctionState(t, air, tc.t01, tc.p01)
			d := stage.Duty{Model: air, Suction: s01, Work: 190e3, IsentropicEfficiency: 0.8,
				ImpellerLossShare: stage.DefaultImpellerLossShare, MassFlow: physics.KgPerS(tc.mdot), Speed: physics.RevPerMin(tc.n)}
			imp := stage.Impeller{SlipFactor: 0.9, PowerInputFactor: 1.04, ExitMeridionalVelocity: 120}
			in := stage.Inlet{Kind: stage.InletAxialEye, HubRatio: tc.nu, EyeTipDiameter: physics.Meter(tc.dt)}
			got, err := stage.Size(d, imp, in)
			require.NoError(t, err)
			v := got.Velocities
			assert.Equal(t, stage.EyeGivenDiameter, got.Geometry.EyeChoice)
			assert.InEpsilon(t, tc.dt, float64(got.Geometry.InletDiameter), 1e-12)
			assert.InEpsilon(t, tc.nu*tc.dt, float64(got.Geometry.EyeHubDiameter), 1e-12)
			assert.InEpsilon(t, tc.cm, float64(v.InletMeridional), 2e-3)
			assert.InEpsilon(t, tc.t1, float64(got.Inlet.Static.Temperature), 5e-4)
			if tc.rho1 > 0 {
				assert.InEpsilon(t, tc.rho1, float64(got.Inlet.Static.Density), 2e-3)
			}
			assert.InEpsilon(t, tc.u1t, float64(v.InletBladeSpeed), 2e-3)
			if tc.w1t > 0 {
				assert.InEpsilon(t, tc.w1t, float64(v.InletRelative), 2e-3)
			}
			assert.InEpsilon(t, tc.mach, v.InletRelativeMach, 2e-3)
			assert.InDelta(t, tc.betaTip, v.InletBladeAngleShroud, 0.15)
			assert.InDelta(t, tc.betaHub, v.InletBladeAngleHub, 0.15)
			// continuity holds at the reported state (definition)
			assert.InEpsilon(t, tc.mdot, float64(got.Inlet.Static.Density)*float64(v.InletMeridional)*got.Geometry.InletArea, 1e-8)
			assert.Zero(t, float64(v.InletWhirl))
		})
	}
}

type eyeCase struct {
	name     string
	model    gas.Model
	t01, p01 float64
	mdot, n  float64
	nu       float64
	alpha    float64
}

func eyeCases(t *testing.T) []eyeCase {
	t.Helper()
	air := textbookAir(t)
	co2, err := gas.NewConstant(850, 1.29) // CO2-like constants (common practice values)
	require.NoError(t, err)
	he, err := gas.NewConstant(5193, 5.0/3) // helium, monatomic ideal gas
	require.NoError(t, err)
	ch4c, err := gas.PureComposition("CH4")
	require.NoError(t, err)
	ch4, err := gas.NewIdeal(ch4c) // variable-cp ideal gas: the general static-state path
	require.NoError(t, err)
	var out []eyeCase
	for _, g := range []struct {
		name     string
		m        gas.Model
		t01, p01 float64
		mdot, n  float64
	}{
		{"air", air, 295, 1.1e5, 9, 17400},
		{"air small", air, 300, 1e5, 1.2, 40000},
		{"CO2-like", co2, 310, 20e5, 30, 9000},
		{"helium", he, 300, 10e5, 2, 30000},
		{"methane ideal", ch4, 300, 30e5, 25, 11000},
	} {
		for _, nu := range []float64{0, 0.35, 0.6} {
			for _, alpha := range []float64{-20, 0, 30, 50} {
				out = append(out, eyeCase{g.name, g.m, g.t01, g.p01, g.mdot, g.n, nu, alpha})
			}
		}
	}
	return out
}

func eyeDuty(t *testing.T, c eyeCase) (stage.Duty, stage.Impeller) {
	t.Helper()
	s01 := suctionState(t, c.model, c.t01, c.p01)
	// a work large enough that the impeller is well larger than the eye
	w := 3.0 * float64(s01.Cp) * c.t01 * 0.2
	d := stage.Duty{Model: c.model, Suction: s01, Work: physics.JoulePerKg(w), IsentropicEfficiency: 0.8,
		ImpellerLossShare: stage.DefaultImpellerLossShare, MassFlow: physics.KgPerS(c.mdot), Speed: physics.RevPerMin(c.n)}
	return d, stage.Impeller{SlipFactor: 0.9, PowerInputFactor: 1.02, BladeExitAngle: 30, ExitMeridionalVelocity: 80}
}

// TestEyeOptimumIsMinimum: the eye chosen for the least shroud relative
// Mach number is a minimum: any other eye tip diameter (±0.01 %, ±1 %,
// ±5 %) given to the continuity path gives a higher shroud Mach number, or
// chokes (a smaller eye that cannot pass the flow). Property of the
// optimisation (issue 4); several gases, flows, hub ratios and prewhirl.
func TestEyeOptimumIsMinimum(t *testing.T) {
	for _, c := range eyeCases(t) {
		t.Run(c.name, func(t *testing.T) {
			d, imp := eyeDuty(t, c)
			in := stage.Inlet{Kind: stage.InletAxialEye, HubRatio: c.nu, PrewhirlAngle: c.alpha}
			opt, err := stage.Size(d, imp, in)
			require.NoError(t, err, "nu %v alpha %v", c.nu, c.alpha)
			require.Equal(t, stage.EyeMinShroudMach, opt.Geometry.EyeChoice)
			m0 := opt.Velocities.InletRelativeMach
			d0 := float64(opt.Geometry.InletDiameter)
			for _, eps := range []float64{-0.05, -0.01, -1e-4, 1e-4, 0.01, 0.05} {
				given := in
				given.EyeTipDiameter = physics.Meter(d0 * (1 + eps))
				got, err := stage.Size(d, imp, given)
				if err != nil {
					var de *physics.DomainError
					require.ErrorAs(t, err, &de)
					require.Equal(t, "inlet.eye_tip_diameter", de.Name, "nu %v alpha %v eps %v: %v", c.nu, c.alpha, eps, err)
					require.Less(t, eps, 0.0, "only a smaller eye may choke")
					continue
				}
				assert.Greater(t, got.Velocities.InletRelativeMach, m0, "nu %v alpha %v eps %v", c.nu, c.alpha, eps)
			}
			// the reported state is the continuity solution for the chosen eye
			assert.InEpsilon(t, c.mdot, float64(opt.Inlet.Static.Density)*float64(opt.Velocities.InletMeridional)*opt.Geometry.InletArea, 1e-8)
		})
	}
}

// TestEyeOptimumBladeAngle: without prewhirl the optimum shroud relative
// flow angle is about 60 deg from axial (rules-of-thumb.md §2, from memory:
// Dixon & Hall, optimum inducer). Derived here: in the incompressible
// limit, W² = cm² + K/cm is least at U² = 2 cm², tan β = √2, β = 54.74 deg;
// compressibility (the static density and sound speed falling as cm rises)
// moves the optimum to larger β as the Mach number rises. So a low-Mach
// eye must come out at 54.74 deg and eyes of 0.55-1.0 relative Mach
// eyes between 56 and 63 deg.
func TestEyeOptimumBladeAngle(t *testing.T) {
	air := textbookAir(t)
	s01 := suctionState(t, air, 300, 1e5)
	base := stage.Duty{Model: air, Suction: s01, Work: 150e3, IsentropicEfficiency: 0.8,
		ImpellerLossShare: 0.5, MassFlow: 9, Speed: 17400}
	imp := stage.Impeller{SlipFactor: 0.9, PowerInputFactor: 1.02, ExitMeridionalVelocity: 100}
	// low Mach: 0.05 kg/s at 3000 rev/min and a big work (large D2)
	low := base
	low.MassFlow, low.Speed, low.Work = 0.5, 3000, 20e3
	got, err := stage.Size(low, imp, stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.2})
	require.NoError(t, err)
	require.Less(t, got.Velocities.InletRelativeMach, 0.12)
	assert.InDelta(t, math.Atan(math.Sqrt2)*180/math.Pi, got.Velocities.InletBladeAngleShroud, 0.3)
	prev := 0.0
	for _, mdot := range []float64{3, 6, 9, 12} {
		d := base
		d.MassFlow = physics.KgPerS(mdot)
		got, err := stage.Size(d, imp, stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.2})
		require.NoError(t, err)
		m := got.Velocities.InletRelativeMach
		b := got.Velocities.InletBladeAngleShroud
		t.Logf("mdot %v: M1rel,s %.3f, beta_s %.2f deg", mdot, m, b)
		assert.Greater(t, m, 0.5)
		assert.Less(t, m, 1.05)
		assert.GreaterOrEqual(t, b, 56.0, "mdot %v M %v", mdot, m)
		assert.LessOrEqual(t, b, 63.0, "mdot %v M %v", mdot, m)
		assert.Greater(t, b, prev, "the optimum angle rises with the Mach number")
		prev = b
	}
}

// TestEyePrewhirl: guide-vane prewhirl with the rotation lowers the shroud
// relative Mach number of the optimum eye and the Euler work at a given
// U2 (Dixon & Hall 2014, eq. 7.1: w = ψ (U2 cθ2 − U1 cθ1)), so the tip
// speed for the same work rises; the sized stage satisfies the Euler
// equation with the whirl term at the rms eye diameter.
func TestEyePrewhirl(t *testing.T) {
	d, imp, _ := saravanamuttooDuty(t)
	var prevMach, prevU2 float64
	for i, alpha := range []float64{0, 15, 30, 45} {
		in := stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.5, PrewhirlAngle: alpha}
		got, err := stage.Size(d, imp, in)
		require.NoError(t, err)
		v := got.Velocities
		g := got.Geometry
		assert.InEpsilon(t, float64(v.InletMeridional)*math.Tan(alpha*math.Pi/180)+1e-300, float64(v.InletWhirl)+1e-300, 1e-12)
		assert.InEpsilon(t, float64(v.InletMeridional)/math.Cos(alpha*math.Pi/180), float64(got.Inlet.Velocity), 1e-12)
		assert.InEpsilon(t, float64(got.Inlet.Velocity)/float64(got.Inlet.Static.SoundSpeed), v.InletAbsoluteMach, 1e-12)
		// Euler work with the inlet term at the rms eye diameter gives back w
		um := stage.PeripheralSpeed(physics.Meter(math.Sqrt((float64(g.InletDiameter)*float64(g.InletDiameter)+float64(g.EyeHubDiameter)*float64(g.EyeHubDiameter))/2)), d.Speed)
		w, err := stage.EulerWorkWithPrewhirl(v.TipSpeed, imp.SlipFactor, imp.PowerInputFactor, imp.BladeExitAngle, imp.ExitMeridionalVelocity, um, v.InletWhirl)
		require.NoError(t, err)
		assert.InEpsilon(t, float64(d.Work), float64(w), 1e-9)
		// relative flow angles with the whirl: atan((U − cθ1)/cm)
		assert.InDelta(t, math.Atan2(float64(v.InletBladeSpeed-v.InletWhirl), float64(v.InletMeridional))*180/math.Pi, v.InletBladeAngleShroud, 1e-9)
		if i > 0 {
			assert.Less(t, v.InletRelativeMach, prevMach, "alpha %v", alpha)
			assert.Greater(t, float64(v.TipSpeed), prevU2, "alpha %v", alpha)
		}
		prevMach, prevU2 = v.InletRelativeMach, float64(v.TipSpeed)
	}
	// at a given U2 the prewhirl takes ψ U1 cθ1 off the Euler work
	w0, err := stage.EulerWork(455, 0.9, 1.04, 0, 140)
	require.NoError(t, err)
	w1, err := stage.EulerWorkWithPrewhirl(455, 0.9, 1.04, 0, 140, 200, 50)
	require.NoError(t, err)
	assert.InEpsilon(t, float64(w0)-1.04*200*50, float64(w1), 1e-12)
	u2, err := stage.TipSpeedWithPrewhirl(w1, 0.9, 1.04, 0, 140, 200, 50)
	require.NoError(t, err)
	assert.InEpsilon(t, 455, float64(u2), 1e-12)
	u2n, err := stage.TipSpeedWithPrewhirl(w1, 0.9, 1.04, 0, 140, 0, 0)
	require.NoError(t, err)
	u2t, err := stage.TipSpeed(w1, 0.9, 1.04, 0, 140)
	require.NoError(t, err)
	assert.InEpsilon(t, float64(u2t), float64(u2n), 1e-15)
	for _, bad := range [][2]float64{{math.NaN(), 10}, {200, math.NaN()}, {-1, 10}, {200, math.Inf(1)}, {1e4, -1e4}} {
		_, err := stage.TipSpeedWithPrewhirl(1e4, 0.9, 1.04, 0, 140, physics.MeterPerS(bad[0]), physics.MeterPerS(bad[1]))
		require.ErrorIs(t, err, physics.ErrDomain, "%v", bad)
		if bad != [2]float64{1e4, -1e4} {
			_, err = stage.EulerWorkWithPrewhirl(455, 0.9, 1.04, 0, 140, physics.MeterPerS(bad[0]), physics.MeterPerS(bad[1]))
			require.ErrorIs(t, err, physics.ErrDomain, "%v", bad)
		}
	}
}

// TestEyeInputErrors: each new inlet input out of range is a DomainError
// naming it (STYLE.md: every range check has an error row, NaN included).
func TestEyeInputErrors(t *testing.T) {
	d, imp, _ := saravanamuttooDuty(t)
	nan, inf := math.NaN(), math.Inf(1)
	eye := func(mut func(*stage.Inlet)) stage.Inlet {
		in := stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.5}
		mut(&in)
		return in
	}
	cases := []struct {
		name   string
		in     stage.Inlet
		field  string
		reason string
	}{
		{"eye NaN", eye(func(in *stage.Inlet) { in.EyeTipDiameter = physics.Meter(nan) }), "inlet.eye_tip_diameter", ""},
		{"eye negative", eye(func(in *stage.Inlet) { in.EyeTipDiameter = -0.3 }), "inlet.eye_tip_diameter", ""},
		{"eye Inf", eye(func(in *stage.Inlet) { in.EyeTipDiameter = physics.Meter(inf) }), "inlet.eye_tip_diameter", ""},
		// 9 kg/s cannot pass a 0.1/0.05 m eye: ρ* c* A = 0.74 kg/s (choke)
		{"eye chokes", eye(func(in *stage.Inlet) { in.EyeTipDiameter = 0.1 }), "inlet.eye_tip_diameter", "chokes"},
		{"eye larger than D2", eye(func(in *stage.Inlet) { in.EyeTipDiameter = 0.6 }), "inlet.eye_tip_diameter", "not smaller than the impeller"},
		{"prewhirl NaN", eye(func(in *stage.Inlet) { in.PrewhirlAngle = nan }), "inlet.prewhirl_angle", ""},
		{"prewhirl -31", eye(func(in *stage.Inlet) { in.PrewhirlAngle = -31 }), "inlet.prewhirl_angle", ""},
		{"prewhirl 61", eye(func(in *stage.Inlet) { in.PrewhirlAngle = 61 }), "inlet.prewhirl_angle", ""},
		{"prewhirl Inf", eye(func(in *stage.Inlet) { in.PrewhirlAngle = inf }), "inlet.prewhirl_angle", ""},
		{"radial with prewhirl", stage.Inlet{Kind: stage.InletRadial, DiameterRatio: 0.5, MeridionalVelocity: 100, PrewhirlAngle: 10}, "inlet.prewhirl_angle", "only for an axial eye"},
		{"cm NaN", eye(func(in *stage.Inlet) { in.MeridionalVelocity = physics.MeterPerS(nan) }), "inlet.meridional_velocity", ""},
		{"hub 0.95 optimum", eye(func(in *stage.Inlet) { in.HubRatio = 0.95 }), "inlet.hub_ratio", ""},
		{"hub NaN given eye", eye(func(in *stage.Inlet) { in.HubRatio = nan; in.EyeTipDiameter = 0.3 }), "inlet.hub_ratio", ""},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := stage.Size(d, imp, tc.in)
			require.ErrorIs(t, err, physics.ErrDomain)
			var de *physics.DomainError
			require.ErrorAs(t, err, &de)
			assert.Equal(t, tc.field, de.Name)
			assert.Contains(t, err.Error(), tc.reason)
		})
	}
	// no interior optimum: at 50 000 rev/min with 45 deg of prewhirl the
	// shroud Mach number falls all the way to choking (dW²/dcm1 at the
	// choke point is 2 cm1 − 2 tan α1 (U1s − cm1 tan α1) < 0 for a fast
	// eye, derived here), and an optimum eye larger than the impeller
	for name, tc := range map[string]struct {
		work, speed, alpha float64
		field, reason      string
	}{
		"optimum at choke":     {400e3, 50000, 45, "inlet.prewhirl_angle", "until the eye chokes"},
		"optimum eye above D2": {float64(d.Work), 60000, 0, "speed", "eye of least shroud Mach number"},
	} {
		dd := d
		dd.Work, dd.Speed = physics.JoulePerKg(tc.work), physics.RevPerMin(tc.speed)
		_, err := stage.Size(dd, imp, stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.3, PrewhirlAngle: tc.alpha})
		var de *physics.DomainError
		require.ErrorAs(t, err, &de, name)
		assert.Equal(t, tc.field, de.Name, name)
		assert.Contains(t, err.Error(), tc.reason, name)
	}
	// counter-swirl (−30 deg: ψ U1 |cθ1| ≈ 13 kJ/kg here) doing more than the
	// 5 kJ/kg of work alone: a named error, not a NaN tip speed
	small := d
	small.Work = 5e3
	_, err := stage.Size(small, imp, stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.3, PrewhirlAngle: -30})
	var de *physics.DomainError
	require.ErrorAs(t, err, &de)
	assert.Equal(t, "inlet.prewhirl_angle", de.Name)
	assert.Contains(t, err.Error(), "counter-swirl")
	// ρ* c* of the 0.1 m eye: T* = 2 T01/(γ+1), ρ* = ρ01 (T*/T01)^2.5
	// (perfect gas, Dixon & Hall 2014 ch. 1), A = π/4 (0.1² − 0.05²)
	ts := 2 * 295.0 / 2.4
	rhos := float64(d.Suction.Density) * math.Pow(ts/295, 2.5)
	cs := math.Sqrt(1.4 * 1005 * 0.4 / 1.4 * ts)
	assert.Less(t, rhos*cs*math.Pi/4*(0.01-0.0025), 9.0)
	// an eye given with a meridional velocity too: the eye wins (Inlet doc)
	both := stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.5, EyeTipDiameter: 0.3, MeridionalVelocity: 50}
	got, err := stage.Size(d, imp, both)
	require.NoError(t, err)
	assert.Equal(t, stage.EyeGivenDiameter, got.Geometry.EyeChoice)
	assert.InEpsilon(t, 142.6, float64(got.Velocities.InletMeridional), 2e-3) // §2, computed there
	// radial inlet: no eye choice, blade angle reported at D1
	rad, err := stage.Size(d, imp, stage.Inlet{Kind: stage.InletRadial, DiameterRatio: 0.5, MeridionalVelocity: 100})
	require.NoError(t, err)
	assert.Empty(t, rad.Geometry.EyeChoice)
	assert.InDelta(t, math.Atan2(float64(rad.Velocities.InletBladeSpeed), 100)*180/math.Pi, rad.Velocities.InletBladeAngleShroud, 1e-9)
	assert.InDelta(t, 100/float64(rad.Inlet.Static.SoundSpeed), rad.Velocities.InletAbsoluteMach, 1e-12)
}

// BenchmarkSizeOptimumEye is the whole stage sizing with the eye chosen for
// the least shroud Mach number, constant-property air (issue 4 target:
// <= 20 us).
func BenchmarkSizeOptimumEye(b *testing.B) {
	benchSize(b, stage.Impeller{SlipFactor: 0.9, PowerInputFactor: 1.04, ExitMeridionalVelocity: 142.6, ExitBlockage: 0.05},
		stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.5, PrewhirlAngle: 10})
}

// BenchmarkSizeGivenEye is the same with the eye tip diameter given (the
// continuity iteration).
func BenchmarkSizeGivenEye(b *testing.B) {
	benchSize(b, stage.Impeller{SlipFactor: 0.9, PowerInputFactor: 1.04, ExitMeridionalVelocity: 142.6},
		stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.5, EyeTipDiameter: 0.3})
}

// BenchmarkSizeOptimumEyeIdealCH4 is the optimum-eye sizing on the general
// static-state path (variable-cp ideal methane, gas.StaticState per
// evaluation); no target, for comparison.
func BenchmarkSizeOptimumEyeIdealCH4(b *testing.B) {
	c, err := gas.PureComposition("CH4")
	if err != nil {
		b.Fatal(err)
	}
	m, err := gas.NewIdeal(c)
	if err != nil {
		b.Fatal(err)
	}
	s01, err := m.State(300, 30e5)
	if err != nil {
		b.Fatal(err)
	}
	d := stage.Duty{Model: m, Suction: s01, Work: 120e3, IsentropicEfficiency: 0.8, ImpellerLossShare: 0.5, MassFlow: 25, Speed: 11000}
	imp := stage.Impeller{SlipFactor: 0.9, PowerInputFactor: 1.02, BladeExitAngle: 30, ExitMeridionalVelocity: 80}
	in := stage.Inlet{Kind: stage.InletAxialEye, HubRatio: 0.35}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := stage.Size(d, imp, in); err != nil {
			b.Fatal(err)
		}
	}
}
