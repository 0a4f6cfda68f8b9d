package service_test

import (
	"context"
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// kestrelAirMachine sizes the demo asset of the service tests once: a
// plant-air blower of the invented Kestrel Ridge plant (constant-property
// air, 1 bar, 300 K, pressure ratio 1.6, 5 kg/s; everything else chosen
// by the service). Invented data: the demo, not a check value.
func kestrelAirMachine(t *testing.T) (service.Machine, service.CheckDuty) {
	t.Helper()
	res := size(t, service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300, PressureRatio: f(1.6), MassFlow: f(5)})
	d := service.CheckDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300, MassFlow: f(5),
		DischargePressure: float64(res.Path.Discharge.Pressure)}
	return res.Machine, d
}

func check(t *testing.T, m service.Machine, d service.CheckDuty) service.CheckResult {
	t.Helper()
	res, err := service.New().CheckMachine(context.Background(), service.CheckRequest{Machine: m, Duty: d})
	require.NoError(t, err)
	return res
}

func withMass(d service.CheckDuty, m float64) service.CheckDuty {
	d.MassFlow = &m
	return d
}

// The machine at its own design duty fits, and every margin is the same
// before and after (the baseline is the design duty).
func TestCheckOwnDutyFits(t *testing.T) {
	m, d := kestrelAirMachine(t)
	res := check(t, m, d)
	assert.Equal(t, service.CheckFits, res.Verdict, "%+v", res.Reasons)
	assert.InEpsilon(t, m.Stages[0].Design.Speed, res.OperatingPoint.Speed, 1e-6)
	require.NotEmpty(t, res.Margins)
	for _, mg := range res.Margins {
		assert.InDelta(t, mg.Before, mg.After, 1e-6*math.Max(1, math.Abs(mg.Before)), mg.Code)
	}
	for _, s := range res.Similarity {
		assert.True(t, s.Within, s.Quantity)
	}
	// The defaults of a machine without a surge-control margin are recorded.
	found := false
	for _, df := range res.Provenance.Defaults {
		found = found || df.Field == "machine.surge_control.margin"
	}
	assert.True(t, found)
}

// More flow at the same pressures needs more speed on a falling head
// characteristic (Dixon & Hall 2014, §7: the work coefficient falls with
// the flow coefficient for backswept blades).
func TestCheckMoreFlowMoreSpeed(t *testing.T) {
	m, d := kestrelAirMachine(t)
	res := check(t, m, withMass(d, 5.25))
	assert.Equal(t, service.CheckFits, res.Verdict, "%+v", res.Reasons)
	assert.Greater(t, res.OperatingPoint.Speed, m.Stages[0].Design.Speed)
	require.NotEmpty(t, res.Changes)
	assert.NotNil(t, res.Changes[0].TowardLimit, "a change toward a limit comes first")
}

// A flow far below design needs the anti-surge recycle up to the control
// line: 1.10 × the surge flow at the speed found (default control margin).
func TestCheckFarBelowRecycles(t *testing.T) {
	m, d := kestrelAirMachine(t)
	res := check(t, m, withMass(d, 2))
	require.Equal(t, service.CheckFitsRecycle, res.Verdict, "%+v", res.Reasons)
	op := res.OperatingPoint
	assert.InEpsilon(t, 1.10*op.SurgeFlow, op.VolumeFlow, 1e-4)
	require.NotNil(t, res.Recycle)
	assert.InEpsilon(t, op.MassFlow-2, res.Recycle.MassFlow, 1e-6)
	assert.InEpsilon(t, op.ShaftPower, res.Recycle.ShaftPower, 1e-12)
	assert.InEpsilon(t, d.DischargePressure, op.DischargePressure, 1e-6)
}

// A flow far above design does not fit: choke, speed or driver.
func TestCheckFarAboveDoesNotFit(t *testing.T) {
	m, d := kestrelAirMachine(t)
	res := check(t, m, withMass(d, 9))
	require.Equal(t, service.CheckDoesNotFit, res.Verdict)
	codes := map[string]bool{}
	for _, r := range res.Reasons {
		codes[r.Code] = true
	}
	assert.True(t, codes[service.ReasonChoke] || codes[service.ReasonSpeedAboveMaximum] || codes[service.ReasonDriverOverload], "%+v", res.Reasons)
}

// A lighter gas at the same pressures needs more head and speed. For an
// ideal gas the polytropic head of a pressure ratio is
// Hp = (n/(n−1)) R T1 (pr^((n−1)/n) − 1) (Dixon & Hall 2014, eq. 2.45 in
// polytropic form): at the same γ, efficiency and pressure ratio it scales
// with R = Ru/M, so Hp_new/Hp_base = M_base/M_new, up to the small change
// of the map efficiency at the new point.
func TestCheckLighterGasNeedsMoreSpeed(t *testing.T) {
	m, d := kestrelAirMachine(t)
	light := d
	// Same γ, cp × 1.04: R × 1.04, M / 1.04.
	light.Gas = service.GasInput{Model: "ideal-constant", Cp: f(1005 * 1.04), Gamma: f(1.4)}
	res := check(t, m, light)
	assert.Greater(t, res.OperatingPoint.Speed, res.BaselinePoint.Speed)
	ratio := res.OperatingPoint.PolytropicHead / res.BaselinePoint.PolytropicHead
	assert.InEpsilon(t, 1.04, ratio, 0.005, "head ratio %.5f", ratio)
	var mm *service.Change
	for i := range res.Changes {
		if res.Changes[i].Quantity == "gas.molar_mass" {
			mm = &res.Changes[i]
		}
	}
	require.NotNil(t, mm)
	assert.InEpsilon(t, 1/1.04, mm.After/mm.Before, 1e-9)
}

// A much heavier gas (or a much colder suction) at the same pressures needs
// so little head that the speed would fall below the minimum: the suction
// is throttled at the minimum speed until the machine makes just the
// discharge pressure.
func TestCheckHeavierGasThrottles(t *testing.T) {
	m, d := kestrelAirMachine(t)
	heavy := d
	heavy.Gas = service.GasInput{Model: "ideal-constant", Cp: f(1005 / 2.6), Gamma: f(1.4)}
	res := check(t, m, heavy)
	require.Equal(t, service.CheckFitsThrottling, res.Verdict, "%+v", res.Reasons)
	require.NotNil(t, res.Throttling)
	assert.InEpsilon(t, res.MinimumSpeed, res.OperatingPoint.Speed, 1e-9)
	assert.InEpsilon(t, d.DischargePressure, res.OperatingPoint.DischargePressure, 1e-5)
	assert.Less(t, res.Throttling.SuctionPressure, d.SuctionPressure)
	// Colder suction needs less head for the same pressure ratio (Hp ∝ T1).
	cold := d
	cold.SuctionTemperature = 250
	res = check(t, m, cold)
	assert.Less(t, res.OperatingPoint.Speed, res.BaselinePoint.Speed)
}

// A machine without speed range or driver rating gets the documented
// defaults, recorded in provenance; a wet suction is a 422 naming it.
func TestCheckDefaultsAndBadInput(t *testing.T) {
	m, d := kestrelAirMachine(t)
	m.SpeedRange, m.Driver = nil, nil
	res := check(t, m, d)
	fields := map[string]bool{}
	for _, df := range res.Provenance.Defaults {
		fields[df.Field] = true
	}
	assert.True(t, fields["machine.speed_range"], "%+v", res.Provenance.Defaults)
	assert.True(t, fields["machine.driver.rating"])
	assert.InEpsilon(t, service.DefaultMinimumSpeedFraction*m.Stages[0].Design.Speed, res.MinimumSpeed, 1e-12)
	assert.InEpsilon(t, service.DefaultMaximumSpeedFraction*m.Stages[0].Design.Speed, res.MaximumContinuousSpeed, 1e-12)

	// Humid air below its dew point: water at 5 % mole fraction and 300 K
	// at 1 bar is above the saturation pressure of water (3.54 kPa at
	// 300 K, IAPWS-IF97 region 4), so the suction is wet.
	wet := service.CheckDuty{Gas: service.GasInput{Model: "peng-robinson", Composition: map[string]float64{"N2": 0.75, "O2": 0.2, "H2O": 0.05}},
		SuctionPressure: 1e5, SuctionTemperature: 300, MassFlow: f(5), DischargePressure: 1.6e5}
	_, err := service.New().CheckMachine(context.Background(), service.CheckRequest{Machine: m, Duty: wet})
	var ie *service.InputError
	require.True(t, errors.As(err, &ie), "%v", err)
	assert.Equal(t, "duty.suction.temperature", ie.Field)
	assert.False(t, ie.Shape)
}

// kestrelAirSection sizes a two-stage, intercooled plant-air section of the
// invented Kestrel Ridge plant (constant-property air, 1 bar, 300 K to
// 3 bar, 4 kg/s, in-line, cooled to 305 K with a 0.1 bar drop). Invented
// data: the demo, not a check value.
func kestrelAirSection(t *testing.T) (service.Machine, service.CheckDuty) {
	t.Helper()
	n := 2
	out, drop := 305.0, 0.1e5
	res, err := service.New().SizeSection(context.Background(), service.SectionDuty{
		StageDuty:  service.StageDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300, DischargePressure: f(3e5), MassFlow: f(4)},
		StageCount: &n, Arrangement: "inline",
		Intercooling: &service.Intercooling{OutletTemperature: &out, PressureDrop: drop}})
	require.NoError(t, err)
	require.Len(t, res.Machine.Stages, 2)
	return res.Machine, service.CheckDuty{Gas: textbookAir(), SuctionPressure: 1e5, SuctionTemperature: 300, MassFlow: f(4),
		DischargePressure: float64(res.Discharge.Pressure)}
}

// A multi-stage machine at its own duty fits with every margin unchanged;
// with much more flow one stage chokes first and is named (in a stack the
// later stages see the flow squeezed by less than the first's pressure
// rise as the speed climbs, so which one depends on the machine: the
// reason names the stage the rating found).
func TestCheckMultiStage(t *testing.T) {
	m, d := kestrelAirSection(t)
	res := check(t, m, d)
	assert.Equal(t, service.CheckFits, res.Verdict, "%+v", res.Reasons)
	require.Len(t, res.OperatingPoint.Stages, 2)
	for _, mg := range res.Margins {
		assert.InDelta(t, mg.Before, mg.After, 1e-6*math.Max(1, math.Abs(mg.Before)), mg.Code)
	}
	stages := map[int]bool{}
	for _, mg := range res.Margins {
		stages[mg.Stage] = true
	}
	assert.True(t, stages[1] && stages[2], "limit rules of both stages in the margins")

	var choked *service.CheckResult
	for _, scale := range []float64{1.3, 1.6, 2, 2.5, 3} {
		r := check(t, m, withMass(d, 4*scale))
		for _, rs := range r.Reasons {
			if rs.Code == service.ReasonChoke {
				choked = &r
			}
		}
		if choked != nil {
			break
		}
	}
	require.NotNil(t, choked, "some flow up to 3 × design chokes the machine")
	st := choked.OperatingPoint.ChokeStage
	t.Logf("choke first at stage %d: %s", st, choked.Reasons[0].Message)
	assert.True(t, st == 1 || st == 2, "choke stage %d", st)
	found := false
	for _, rs := range choked.Reasons {
		if rs.Code == service.ReasonChoke {
			found = true
			assert.Contains(t, rs.Message, "stage "+string(rune('0'+st)))
		}
	}
	assert.True(t, found)
}

// A batch's memo finds the baseline once and changes no answer: checks run
// concurrently through one memo equal the checks run alone.
func TestCheckMemoSharesBaseline(t *testing.T) {
	m, d := kestrelAirMachine(t)
	svc := service.New()
	memo := service.NewCheckMemo()
	flows := []float64{2, 4.5, 5, 5.25, 9}
	shared := make([]service.CheckResult, len(flows))
	errs := make([]error, len(flows))
	done := make(chan int)
	for i, q := range flows {
		go func() {
			shared[i], errs[i] = svc.CheckMachineShared(context.Background(), service.CheckRequest{Machine: m, Duty: withMass(d, q)}, memo)
			done <- i
		}()
	}
	for range flows {
		<-done
	}
	for i, q := range flows {
		require.NoError(t, errs[i])
		alone := check(t, m, withMass(d, q))
		assert.Equal(t, alone, shared[i], "flow %g", q)
	}
}
