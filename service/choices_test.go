package service_test

import (
	"context"
	"math"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics/stage"
	"stagewright/service"
)

// hydrogenRecycle is the invented Kestrel Ridge recycle-gas duty with
// nothing but gas, suction, discharge pressure and flow: every design choice
// is the service's.
func hydrogenRecycle() service.StageDuty {
	return service.StageDuty{
		Gas: service.GasInput{Model: "peng-robinson", Composition: map[string]float64{
			"H2": 0.86, "CH4": 0.07, "C2H6": 0.04, "C3H8": 0.02, "H2S": 0.01}},
		SuctionPressure: 21e5, SuctionTemperature: 318.15, DischargePressure: f(24.5e5), MassFlow: f(14000.0 / 3600),
	}
}

// A duty with only gas, suction, discharge pressure and flow gives a whole
// stage, and every choice the service made is the one its source says:
// the speed gives the default specific speed 0.7 (Balje via Dixon & Hall,
// from memory), the efficiency is the Casey & Robinson (2013) estimate at
// the stage's own flow coefficient and tip Mach number (a fixed point),
// the slip factor is Wiesner's for 17 blades at 40 deg, the eye is the
// least-shroud-Mach eye, and cr2/U2 is the default 0.25.
func TestMinimalDutyIsComplete(t *testing.T) {
	res := size(t, hydrogenRecycle())
	sz := res.Sizing
	assert.Equal(t, "specific-speed", res.SpeedBasis)
	assert.InDelta(t, stage.DefaultSpecificSpeed, sz.Coefficients.SpecificSpeed, 1e-9, "Ns of the chosen speed")
	assert.True(t, res.EfficiencyEstimated)
	est, err := stage.PolytropicEfficiencyEstimate(sz.Coefficients.FlowCoefficient, sz.Velocities.MachineMach)
	require.NoError(t, err)
	assert.InDelta(t, est.Value, res.Path.PolytropicEfficiency, 1e-6, "efficiency is the correlation's at the final sizing")
	wiesner, err := stage.WiesnerSlip(17, 40, math.Min(sz.Coefficients.InletTipRatio, 0.999))
	require.NoError(t, err)
	assert.InDelta(t, wiesner, res.SlipFactor, 1e-8)
	assert.Equal(t, "min-shroud-mach", sz.Geometry.EyeChoice)
	assert.InDelta(t, 0.25, float64(sz.Velocities.ExitMeridional)/float64(sz.Velocities.TipSpeed), 1e-6, "default exit flow coefficient")
	assert.InDelta(t, 0.35, float64(sz.Geometry.EyeHubDiameter)/float64(sz.Geometry.InletDiameter), 1e-9)
	for _, v := range []float64{res.Speed, float64(sz.Geometry.TipDiameter), float64(sz.Geometry.ExitWidth), res.Power.Shaft, res.Power.DriverRating} {
		assert.True(t, v > 0 && !math.IsInf(v, 0), "positive finite output %g", v)
	}
	defaults := map[string]bool{}
	for _, d := range res.Provenance.Defaults {
		defaults[d.Field] = true
	}
	for _, f := range []string{"speed_target.specific_speed", "efficiency.polytropic", "impeller.blade_exit_angle", "impeller.slip_model",
		"impeller.blade_count", "impeller.inlet.type", "impeller.inlet.hub_ratio", "impeller.inlet.eye_tip_diameter",
		"impeller.exit_meridional_velocity", "impeller.exit_blockage", "driver.margin", "mechanical_efficiency"} {
		assert.True(t, defaults[f], "default %s recorded", f)
	}
	text := strings.Join(res.Cautions, " ")
	assert.Contains(t, text, "hydrogen sulfide")
	assert.Contains(t, text, "Hydrogen at")
	assert.Contains(t, text, "Flammable gas")
	assert.Contains(t, text, "manufacturer")
}

// A given tip diameter comes back as the sized one, and a flow-coefficient
// target as the stage's flow coefficient (definitions of φ and of the
// peripheral speed; rules-of-thumb.md §5); a speed step lands the speed on
// its grid.
func TestSpeedChoices(t *testing.T) {
	d := hydrogenRecycle()
	d.PolytropicEfficiency = f(0.8)
	d.TipDiameter = f(0.5)
	res := size(t, d)
	assert.Equal(t, "tip-diameter", res.SpeedBasis)
	assert.InDelta(t, 0.5, float64(res.Sizing.Geometry.TipDiameter), 1e-8)

	d.TipDiameter = nil
	d.SpeedTarget = &service.SpeedTarget{FlowCoefficient: f(0.07)}
	res = size(t, d)
	assert.InDelta(t, 0.07, res.Sizing.Coefficients.FlowCoefficient, 1e-8)

	d.SpeedStep = f(50)
	res = size(t, d)
	assert.InDelta(t, 0, math.Mod(res.Speed, 50), 1e-9)
	assert.InDelta(t, res.SpeedUnrounded, res.Speed, 25+1e-9)
	assert.InDelta(t, 0.07, res.Sizing.Coefficients.FlowCoefficient, 0.07*0.01, "rounding moves φ a little")

	d.SpeedStep = nil
	d.SpeedTarget = &service.SpeedTarget{SpecificSpeed: f(0.9)}
	res = size(t, d)
	assert.InDelta(t, 0.9, res.Sizing.Coefficients.SpecificSpeed, 1e-9)
}

func TestChoiceErrors(t *testing.T) {
	cases := []struct {
		name  string
		mut   func(*service.StageDuty)
		field string
		shape bool
	}{
		{"speed and tip diameter", func(d *service.StageDuty) { d.Speed, d.TipDiameter = f(12000), f(0.4) }, "speed", true},
		{"step with given speed", func(d *service.StageDuty) { d.Speed, d.SpeedStep = f(12000), f(50) }, "speed_step", true},
		{"step with tip diameter", func(d *service.StageDuty) { d.TipDiameter, d.SpeedStep = f(0.4), f(50) }, "speed_step", true},
		{"step zero", func(d *service.StageDuty) { d.SpeedStep = f(0) }, "speed_step", false},
		{"two targets", func(d *service.StageDuty) {
			d.SpeedTarget = &service.SpeedTarget{SpecificSpeed: f(0.7), FlowCoefficient: f(0.08)}
		}, "speed_target", true},
		{"target NaN", func(d *service.StageDuty) { d.SpeedTarget = &service.SpeedTarget{SpecificSpeed: f(math.NaN())} }, "speed_target.specific_speed", false},
		{"flow coefficient 2", func(d *service.StageDuty) { d.SpeedTarget = &service.SpeedTarget{FlowCoefficient: f(2)} }, "speed_target.flow_coefficient", false},
		{"tip diameter 9 m", func(d *service.StageDuty) { d.TipDiameter = f(9) }, "tip_diameter", false},
		{"tip diameter too small for the eye", func(d *service.StageDuty) { d.TipDiameter = f(0.05) }, "tip_diameter", false},
		{"blockage 0.6", func(d *service.StageDuty) { d.Impeller.ExitBlockage = f(0.6) }, "impeller.exit_blockage", false},
		{"prewhirl on a radial inlet", func(d *service.StageDuty) {
			d.Impeller.Inlet = service.InletInput{Type: "radial", DiameterRatio: f(0.5), MeridionalVelocity: f(60), PrewhirlAngle: f(10)}
		}, "impeller.inlet.prewhirl_angle", true},
		{"prewhirl 80", func(d *service.StageDuty) { d.Impeller.Inlet.PrewhirlAngle = f(80) }, "impeller.inlet.prewhirl_angle", false},
		{"eye diameter and velocity", func(d *service.StageDuty) {
			d.Impeller.Inlet.EyeTipDiameter, d.Impeller.Inlet.MeridionalVelocity = f(0.1), f(60)
		}, "impeller.inlet.eye_tip_diameter", true},
		{"radial inlet without velocity", func(d *service.StageDuty) {
			d.Impeller.Inlet = service.InletInput{Type: "radial", DiameterRatio: f(0.5)}
		}, "impeller.inlet.meridional_velocity", true},
		{"driver margin and rating", func(d *service.StageDuty) {
			d.Driver = &service.DriverInput{Margin: f(1.1), Rating: f(1e6)}
		}, "driver.rating", true},
		{"mechanical losses and efficiency", func(d *service.StageDuty) { d.MechanicalEfficiency, d.MechanicalLosses = f(0.98), f(5e3) }, "mechanical_losses", true},
		{"negative mechanical losses", func(d *service.StageDuty) { d.MechanicalLosses = f(-1) }, "mechanical_losses", false},
		{"driver margin 0.9", func(d *service.StageDuty) { d.Driver = &service.DriverInput{Margin: f(0.9)} }, "driver.margin", false},
		{"override of no rule", func(d *service.StageDuty) {
			d.LimitOverrides = map[string]service.LevelOverride{"tip-sped": {Warning: 300}}
		}, "limit_overrides.tip-sped", true},
		{"override in the wrong order", func(d *service.StageDuty) {
			d.LimitOverrides = map[string]service.LevelOverride{"tip-speed": {Warning: 400, Limit: f(350)}}
		}, "limit_overrides.tip-speed", false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			d := hydrogenRecycle()
			tc.mut(&d)
			_, err := service.New().SizeStage(context.Background(), d)
			require.ErrorIs(t, err, service.ErrInput)
			var ie *service.InputError
			require.ErrorAs(t, err, &ie)
			assert.Equal(t, tc.field, ie.Field, err.Error())
			assert.Equal(t, tc.shape, ie.Shape, err.Error())
		})
	}
}

// Overrides replace the levels (the basis says so); an installed driver's
// rating is graded against the API 617 / API 541 110 % rule (from memory).
func TestOverridesAndDriverRating(t *testing.T) {
	d := hydrogenRecycle()
	d.PolytropicEfficiency = f(0.8)
	base := size(t, d)
	u2 := float64(base.Sizing.Velocities.TipSpeed)

	d.LimitOverrides = map[string]service.LevelOverride{"tip-speed": {Warning: u2 * 0.9, Limit: f(u2 * 0.95)}}
	res := size(t, d)
	w := warning(res, "tip-speed")
	require.NotNil(t, w)
	assert.Equal(t, "limit", w.Severity)
	assert.InDelta(t, u2*0.95, w.Limit, 1e-9)
	assert.Contains(t, w.Basis, "caller override")
	assert.Equal(t, service.VerdictLimit, res.Verdict)

	d.LimitOverrides = map[string]service.LevelOverride{"tip-speed": {Warning: u2 * 2}}
	res = size(t, d)
	assert.Nil(t, warning(res, "tip-speed"), "far inside the raised level")

	d.LimitOverrides = nil
	d.MechanicalLosses = f(7500) // shaft = gas + losses (definition)
	withLosses := size(t, d)
	assert.InDelta(t, withLosses.Power.Gas+7500, withLosses.Power.Shaft, 1e-6)
	d.MechanicalLosses = nil
	d.Driver = &service.DriverInput{Rating: f(base.Power.Shaft * 1.05)}
	res = size(t, d)
	w = warning(res, "driver-margin")
	require.NotNil(t, w)
	assert.Equal(t, "warning", w.Severity)
	assert.InDelta(t, 1.05, w.Value, 1e-9)
	assert.InDelta(t, base.Power.Shaft*1.05, res.Power.DriverRating, 1e-6)
	d.Driver = &service.DriverInput{Rating: f(base.Power.Shaft * 0.9)}
	w = warning(size(t, d), "driver-margin")
	require.NotNil(t, w)
	assert.Equal(t, "limit", w.Severity, "a driver below the shaft power")
}

// Every warning carries a value, a limit, a unit and a basis, and its
// severity is one of the three (issue 4's contract); the verdict follows the
// worst.
func TestWarningsAreMeasured(t *testing.T) {
	for _, d := range []service.StageDuty{hydrogenRecycle(), fuelGasDuty("peng-robinson")} {
		res := size(t, d)
		worst := 0
		rank := map[string]int{"notice": 1, "warning": 2, "limit": 3}
		for _, w := range res.Warnings {
			assert.Contains(t, rank, w.Severity, w.Code)
			assert.NotEmpty(t, w.Unit, w.Code)
			assert.NotEmpty(t, w.Basis, w.Code)
			assert.NotEmpty(t, w.Message, w.Code)
			assert.False(t, math.IsNaN(w.Value) || math.IsNaN(w.Limit) || math.IsNaN(w.Margin), w.Code)
			worst = max(worst, rank[w.Severity])
		}
		assert.Equal(t, []string{service.VerdictWithin, service.VerdictNear, service.VerdictWarning, service.VerdictLimit}[worst], res.Verdict)
	}
}

func warning(res service.StageResult, code string) *service.Warning {
	for i := range res.Warnings {
		if res.Warnings[i].Code == code {
			return &res.Warnings[i]
		}
	}
	return nil
}

// BenchmarkSizeStageChosenIdealConstant is issue 4's benchmark: the whole
// use case with every choice made by the service (speed for Ns 0.7,
// Casey & Robinson efficiency iterated with the sizing, Wiesner slip, the
// least-shroud-Mach eye, default cr2/U2) for a constant-property gas.
func BenchmarkSizeStageChosenIdealConstant(b *testing.B) {
	svc := service.New()
	d := service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300,
		PressureRatio: f(2.5), MassFlow: f(3)}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := svc.SizeStage(context.Background(), d); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkSizeStageChosenRealGas is the same for the Peng-Robinson
// hydrogen-rich demo duty.
func BenchmarkSizeStageChosenRealGas(b *testing.B) {
	svc := service.New()
	d := hydrogenRecycle()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := svc.SizeStage(context.Background(), d); err != nil {
			b.Fatal(err)
		}
	}
}

// Warnings on textbook stages (testdata/reference/stage-examples.md, values
// from memory or computed there; levels from rules-of-thumb.md, common
// practice, no source): the Saravanamuttoo Example 4.1 inducer runs at a
// shroud relative Mach number of 0.911, past the 0.85 warning level but
// inside the 0.95 limit; its 455.5 m/s tip speed is past the 350 m/s limit
// of a closed steel impeller and past the 450 m/s warning level (inside
// the 500 m/s limit) of an open aluminium one; the Dixon & Hall example
// reaches an absolute Mach number of 1.012 at the diffuser inlet, past the
// 1.0 warning level of a vaneless diffuser and past the 1.0 limit of a
// vaned one.
func TestTextbookStagesWarn(t *testing.T) {
	sar := service.StageDuty{Gas: textbookAir(), SuctionPressure: 1.1e5, SuctionTemperature: 295,
		PressureRatio: f(4.241), MassFlow: f(9), Speed: f(17400), IsentropicEfficiency: f(0.78),
		Impeller: service.ImpellerInput{BladeExitAngle: f(0), SlipFactor: f(0.9), PowerInputFactor: f(1.04), ExitMeridionalVelocity: f(142.6),
			ExitBlockage: f(0), Inlet: service.InletInput{Type: "axial-eye", HubRatio: f(0.5), MeridionalVelocity: f(142.6)}}}
	res := size(t, sar)
	w := warning(res, "inducer-mach")
	require.NotNil(t, w)
	assert.Equal(t, "warning", w.Severity)
	assert.InDelta(t, 0.911, w.Value, 0.002)
	assert.InDelta(t, 0.85, w.Limit, 1e-12)
	w = warning(res, "tip-speed")
	require.NotNil(t, w)
	assert.Equal(t, "limit", w.Severity, "closed steel")
	assert.InDelta(t, 455.5, w.Value, 0.5)
	assert.InDelta(t, 350, w.Limit, 1e-12)
	sar.Impeller.Construction = "open-aluminium"
	w = warning(size(t, sar), "tip-speed")
	require.NotNil(t, w)
	assert.Equal(t, "warning", w.Severity, "open aluminium")
	assert.InDelta(t, 450, w.Limit, 1e-12)

	dix := service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 295.15,
		PressureRatio: f(4.2), MassFlow: f(2), Speed: f(15000), IsentropicEfficiency: f(0.83), MechanicalEfficiency: f(0.97),
		Impeller: service.ImpellerInput{BladeExitAngle: f(0), SlipFactor: f(1 - 2.0/17), ExitMeridionalVelocity: f(50.16),
			Inlet: service.InletInput{Type: "radial", DiameterRatio: f(0.45), MeridionalVelocity: f(100)}}}
	res = size(t, dix)
	w = warning(res, "diffuser-inlet-mach")
	require.NotNil(t, w)
	assert.Equal(t, "warning", w.Severity, "vaneless")
	assert.InDelta(t, 1.012, w.Value, 0.005)
	dix.Diffuser = "vaned"
	w = warning(size(t, dix), "diffuser-inlet-mach")
	require.NotNil(t, w)
	assert.Equal(t, "limit", w.Severity, "vaned")
	assert.InDelta(t, 1.0, w.Limit, 1e-12)
}
