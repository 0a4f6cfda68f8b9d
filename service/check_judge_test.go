package service

import (
	"context"
	"fmt"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/physics/limits"
)

// toyMachine is a one-stage machine with a closed-form characteristic, to
// test the check's judging apart from the rating's physics: polytropic
// head coefficient μ = Hp/U² = 0.65 − 1.5 φ at constant ηp = 0.8 for an
// ideal gas (γ = 1.4, M = 28 g/mol), surge at φ = 0.05, choke at φ = 0.16.
// The pressure ratio is the ideal-gas polytropic relation
// pr = (1 + Hp (n−1)/n / (R T1))^(n/(n−1)), (n−1)/n = (γ−1)/(γ ηp)
// (Dixon & Hall 2014, §2.6). Invented numbers: a harness, not a check of
// physics.
type toyMachine struct {
	n0, d, eta, r, minSpeed, maxSpeed, driver float64
}

func newToy() *toyMachine {
	return &toyMachine{n0: 10000, d: 0.4, eta: 0.8, r: 8.314462618 / 0.028, minSpeed: 7000, maxSpeed: 10500, driver: 1e9}
}

const toyK = (1.4 - 1) / (1.4 * 0.8)

func (tm *toyMachine) pr(n, q, t1 float64) float64 {
	u := math.Pi * tm.d * n / 60
	phi := q / (u * math.Pi * tm.d * tm.d / 4)
	hp := (0.65 - 1.5*phi) * u * u
	return math.Pow(1+hp*toyK/(tm.r*t1), 1/toyK)
}

func (tm *toyMachine) rate(_ context.Context, q rateQuery) (opPoint, error) {
	d := q.Duty
	p1 := d.SuctionPressure
	if q.SuctionPressure > 0 {
		p1 = q.SuctionPressure
	}
	t1 := d.SuctionTemperature
	rho := p1 / (tm.r * t1)
	var mdot float64
	switch {
	case q.MassFlow > 0:
		mdot = q.MassFlow
	case q.VolumeFlow > 0:
		mdot = q.VolumeFlow * rho
	case d.MassFlow != nil:
		mdot = *d.MassFlow
	default:
		mdot = *d.ActualVolumeFlow * d.SuctionPressure / (tm.r * t1)
	}
	if q.FlowScale > 0 && q.MassFlow == 0 {
		mdot *= q.FlowScale
	}
	vol := mdot / rho
	n := q.Speed
	if n == 0 {
		target := d.DischargePressure / p1
		lo, hi := 0.2*tm.n0, 2*tm.n0
		// A choked flow is too slow: search only above the choke speed.
		lo = math.Max(lo, 1.001*vol/(0.16*math.Pi*tm.d*tm.d/4)*60/(math.Pi*tm.d))
		if vol >= 0.16*math.Pi*tm.d*hi/60*math.Pi*tm.d*tm.d/4 || tm.pr(hi, vol, t1) < target || tm.pr(lo, vol, t1) > target {
			return opPoint{}, fmt.Errorf("toy: %w", ErrSpeedOutOfReach)
		}
		for range 200 {
			n = (lo + hi) / 2
			if tm.pr(n, vol, t1) < target {
				lo = n
			} else {
				hi = n
			}
		}
	}
	u := math.Pi * tm.d * n / 60
	area := math.Pi * tm.d * tm.d / 4
	if vol >= 0.16*u*area {
		return opPoint{}, fmt.Errorf("toy: %w", ErrChoked)
	}
	pr := tm.pr(n, vol, t1)
	hp := (0.65 - 1.5*vol/(u*area)) * u * u
	t2 := t1 * math.Pow(pr, toyK)
	surge, choke := 0.05*u*area, 0.16*u*area
	rule, _ := limits.DischargeTemperature(limits.ServiceProcess)
	a, _ := rule.Check(t2)
	shaft := mdot * hp / tm.eta / 0.98
	return opPoint{
		Point: CheckPoint{Speed: n, MassFlow: mdot, VolumeFlow: vol, SuctionPressure: p1, SuctionTemperature: t1,
			DischargePressure: p1 * pr, DischargeTemperature: t2, PolytropicHead: hp, PolytropicEfficiency: tm.eta,
			GasPower: mdot * hp / tm.eta, ShaftPower: shaft, SurgeFlow: surge, ChokeFlow: choke, SurgeStage: 1, ChokeStage: 1,
			SurgeMargin: (vol - surge) / surge, ChokeMargin: (choke - vol) / choke, FlowCoefficient: vol / (u * area), DesignFlowRatio: vol / (u * area) / 0.08},
		Density: rho, DischargeDensity: p1 * pr / (tm.r * t2), TipSpeed: u, MachineMach: u / math.Sqrt(1.4*tm.r*t1), ExitWidth: 0.02,
		MolarMass: 0.028, Limits: []limits.Assessment{a},
		MinSpeed: tm.minSpeed, MaxSpeed: tm.maxSpeed, DriverRating: tm.driver,
	}, nil
}

// toyDuty is the toy's design duty: φ = 0.08 at 10 000 rev/min, air-like
// gas at 1 bar, 300 K.
func toyDuty(tm *toyMachine, flowScale, p2 float64) CheckDuty {
	u := math.Pi * tm.d * tm.n0 / 60
	q := 0.08 * u * math.Pi * tm.d * tm.d / 4 * flowScale
	if p2 == 0 {
		p2 = 1e5 * tm.pr(tm.n0, q/flowScale, 300)
	}
	return CheckDuty{Gas: GasInput{Model: "ideal-constant"}, SuctionPressure: 1e5, SuctionTemperature: 300, ActualVolumeFlow: &q, DischargePressure: p2}
}

func toyCheck(t *testing.T, tm *toyMachine, d CheckDuty) CheckResult {
	t.Helper()
	base := toyDuty(tm, 1, 0)
	m := Machine{Stages: []MachineStage{{Design: DesignPoint{Speed: tm.n0, SuctionPressure: base.SuctionPressure,
		SuctionTemperature: base.SuctionTemperature, VolumeFlow: *base.ActualVolumeFlow}}}}
	res, err := New().check(context.Background(), CheckRequest{Machine: m, Duty: d, Baseline: &base}, tm.rate, nil)
	require.NoError(t, err)
	return res
}

func TestCheckJudgingOwnDutyFits(t *testing.T) {
	tm := newToy()
	res := toyCheck(t, tm, toyDuty(tm, 1, 0))
	assert.Equal(t, CheckFits, res.Verdict)
	assert.Empty(t, res.Reasons)
	assert.InEpsilon(t, tm.n0, res.OperatingPoint.Speed, 1e-9)
	require.NotEmpty(t, res.Margins)
	for _, m := range res.Margins {
		assert.InDelta(t, m.Before, m.After, 1e-9*math.Max(1, math.Abs(m.Before)), m.Code)
		assert.InDelta(t, m.MarginBefore, m.MarginAfter, 1e-9, m.Code)
	}
	assert.Empty(t, res.Changes)
	for _, s := range res.Similarity {
		assert.True(t, s.Within, s.Quantity)
	}
}

func TestCheckJudgingMoreFlowMoreSpeed(t *testing.T) {
	tm := newToy()
	res := toyCheck(t, tm, toyDuty(tm, 1.05, 0))
	assert.Equal(t, CheckFits, res.Verdict)
	assert.Greater(t, res.OperatingPoint.Speed, tm.n0)
	// The change list puts the speed's move toward maximum continuous
	// before changes without a limit.
	require.NotEmpty(t, res.Changes)
	assert.NotNil(t, res.Changes[0].TowardLimit)
}

func TestCheckJudgingRecycleToControlLine(t *testing.T) {
	tm := newToy()
	d := toyDuty(tm, 0.4, 0)
	res := toyCheck(t, tm, d)
	require.Equal(t, CheckFitsRecycle, res.Verdict, "%+v", res.Reasons)
	require.NotNil(t, res.Recycle)
	op := res.OperatingPoint
	// On the control line: Q = 1.10 Q_surge at the speed found.
	assert.InEpsilon(t, 1.10*op.SurgeFlow, op.VolumeFlow, 1e-5)
	assert.InEpsilon(t, op.VolumeFlow-*d.ActualVolumeFlow, res.Recycle.VolumeFlow, 1e-5)
	assert.InEpsilon(t, op.ShaftPower, res.Recycle.ShaftPower, 1e-12)
	assert.InEpsilon(t, d.DischargePressure, op.DischargePressure, 1e-6)
}

func TestCheckJudgingFarAboveDoesNotFit(t *testing.T) {
	tm := newToy()
	res := toyCheck(t, tm, toyDuty(tm, 1.6, 0))
	require.Equal(t, CheckDoesNotFit, res.Verdict)
	codes := map[string]bool{}
	for _, r := range res.Reasons {
		codes[r.Code] = true
	}
	assert.True(t, codes[ReasonChoke] || codes[ReasonSpeedAboveMaximum], "%+v", res.Reasons)
}

func TestCheckJudgingThrottling(t *testing.T) {
	tm := newToy()
	base := toyDuty(tm, 1, 0)
	d := toyDuty(tm, 1, 1e5+0.42*(base.DischargePressure-1e5))
	res := toyCheck(t, tm, d)
	require.Equal(t, CheckFitsThrottling, res.Verdict, "%+v", res.Reasons)
	require.NotNil(t, res.Throttling)
	assert.InEpsilon(t, tm.minSpeed, res.OperatingPoint.Speed, 1e-12)
	assert.InEpsilon(t, d.DischargePressure, res.OperatingPoint.DischargePressure, 1e-6)
	assert.Less(t, res.Throttling.SuctionPressure, d.SuctionPressure)
	assert.InEpsilon(t, d.SuctionPressure-res.Throttling.SuctionPressure, res.Throttling.PressureDrop, 1e-9)
	assert.Greater(t, res.Throttling.AlternativeRecycleMassFlow, 0.0)
}

func TestCheckJudgingDriverOverload(t *testing.T) {
	tm := newToy()
	design, err := tm.rate(context.Background(), rateQuery{Duty: toyDuty(tm, 1, 0)})
	require.NoError(t, err)
	tm.driver = 1.02 * design.Point.ShaftPower
	res := toyCheck(t, tm, toyDuty(tm, 1.1, 0))
	require.Equal(t, CheckDoesNotFit, res.Verdict)
	assert.Equal(t, ReasonDriverOverload, res.Reasons[0].Code)
	assert.InEpsilon(t, tm.driver, res.Reasons[0].Limit, 1e-12)
}

func TestCheckJudgingBadInput(t *testing.T) {
	tm := newToy()
	m := Machine{Stages: []MachineStage{{Design: DesignPoint{Speed: tm.n0}}}}
	d := toyDuty(tm, 1, 0)
	d.DischargePressure = 0.5e5
	_, err := New().check(context.Background(), CheckRequest{Machine: m, Duty: d}, tm.rate, nil)
	var ie *InputError
	require.ErrorAs(t, err, &ie)
	assert.Equal(t, "duty.discharge_pressure", ie.Field)
	bad := 0.9
	m.SurgeControl = &SurgeControl{Margin: &bad}
	_, err = New().check(context.Background(), CheckRequest{Machine: m, Duty: toyDuty(tm, 1, 0)}, tm.rate, nil)
	require.ErrorAs(t, err, &ie)
	assert.Equal(t, "machine.surge_control.margin", ie.Field)
	m.SurgeControl = nil
	_, err = New().check(context.Background(), CheckRequest{Machine: m, Duty: toyDuty(tm, 1, 0)}, tm.rate, nil)
	require.ErrorAs(t, err, &ie, "no baseline and no design discharge pressure")
	assert.Equal(t, "machine.stages.0.design.discharge_pressure", ie.Field)
}

// When no speed the rating searches makes the pressure, the check rates
// at the ends of the speed range to say which side the duty lies on.
func TestCheckJudgingOutOfReach(t *testing.T) {
	tm := newToy()
	res := toyCheck(t, tm, toyDuty(tm, 1, 40e5))
	require.Equal(t, CheckDoesNotFit, res.Verdict)
	assert.Equal(t, ReasonSpeedAboveMaximum, res.Reasons[0].Code)
	assert.Equal(t, "Pa", res.Reasons[0].Unit)
	assert.InEpsilon(t, tm.maxSpeed, res.OperatingPoint.Speed, 1e-12)
	res = toyCheck(t, tm, toyDuty(tm, 1, 1.001e5))
	require.Equal(t, CheckFitsThrottling, res.Verdict, "%+v", res.Reasons)
	assert.InEpsilon(t, 1.001e5, res.OperatingPoint.DischargePressure, 1e-6)
}

// A flow past choke at every speed is does-not-fit for choke, shown at
// the maximum continuous speed near its choke flow.
func TestCheckJudgingChokedEverywhere(t *testing.T) {
	tm := newToy()
	d := toyDuty(tm, 3, 0)
	res := toyCheck(t, tm, d)
	require.Equal(t, CheckDoesNotFit, res.Verdict)
	require.Len(t, res.Reasons, 1, "%+v", res.Reasons)
	assert.Equal(t, ReasonChoke, res.Reasons[0].Code)
	assert.InEpsilon(t, *d.ActualVolumeFlow, res.Reasons[0].Value, 1e-9)
	// Toy choke at φ = 0.16 at 10 500 rev/min.
	u := math.Pi * tm.d * tm.maxSpeed / 60
	assert.InEpsilon(t, 0.16*u*math.Pi*tm.d*tm.d/4, res.Reasons[0].Limit, 1e-9)
	assert.InEpsilon(t, tm.maxSpeed, res.OperatingPoint.Speed, 1e-12)
}
