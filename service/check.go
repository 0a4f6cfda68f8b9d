package service

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"sync"
)

// Duty-change check: an installed machine against a new duty (and a
// baseline), answered with a verdict, the margins before and after, what
// changed and whether the new duty is still similar to the baseline in the
// sense of ASME PTC 10.

// Verdicts of a duty-change check (fixed names, a contract).
const (
	CheckFits           = "fits"
	CheckFitsRecycle    = "fits-with-recycle"
	CheckFitsThrottling = "fits-with-throttling"
	CheckDoesNotFit     = "does-not-fit"
)

// Reason codes of a does-not-fit verdict besides the limit rules' own
// codes (fixed names, a contract).
const (
	ReasonSpeedAboveMaximum = "speed-above-maximum"
	ReasonSpeedBelowMinimum = "speed-below-minimum"
	ReasonChoke             = "choke"
	ReasonDriverOverload    = "driver-overload"
	ReasonSurge             = "surge"
)

// Operating-margin codes of a check (the limit rules add their own).
const (
	MarginSurge      = "surge"
	MarginChoke      = "choke"
	MarginSpeedMax   = "speed-to-maximum-continuous"
	MarginSpeedMin   = "speed-to-minimum"
	MarginDriver     = "power-to-driver-rating"
	MarginDischargeT = "discharge-temperature"
)

const (
	// DefaultSurgeControlMargin places the anti-surge control line at
	// 1.10 × the surge flow at the same speed: a 10 % margin is the usual
	// setting of anti-surge control (common practice; API 617 asks for a
	// stable range and a control system but sets no number, from memory).
	DefaultSurgeControlMargin = 0.10
	// SurgeControlBasis is the basis recorded with the default.
	SurgeControlBasis = "control line at 1.10 × the surge flow at the same speed: the usual 10 % anti-surge control margin (common practice; API 617 requires anti-surge protection but sets no number, from memory)"
	// MinChokeMargin is the least distance from choke a fitting duty keeps:
	// the flow at most 95 % of the choke flow at its speed, since the
	// choke estimate is an estimate and efficiency falls steeply near it
	// (common practice, no source).
	MinChokeMargin = 0.05
	// MinChokeMarginBasis is the basis recorded with it.
	MinChokeMarginBasis = "flow at most 95 % of the estimated choke flow at its speed (common practice, no source)"
	// ThrottlingBasis says how the throttling of a fits-with-throttling
	// duty is taken.
	ThrottlingBasis = "suction throttle valve ahead of the compressor at its minimum speed, the throttled gas at the suction temperature (the Joule-Thomson cooling of a real gas across the valve is neglected); the alternative recycles discharge gas, cooled to the suction temperature, at the minimum speed"
)

// CheckDuty is a duty of the check in SI: gas, suction total state, one
// flow and the discharge pressure the process needs (Pa absolute, K, kg/s,
// m3/s).
type CheckDuty struct {
	Gas                GasInput `json:"gas"`
	SuctionPressure    float64  `json:"suction_pressure"`
	SuctionTemperature float64  `json:"suction_temperature"`
	MassFlow           *float64 `json:"mass_flow,omitempty"`
	ActualVolumeFlow   *float64 `json:"actual_volume_flow,omitempty"`
	StandardVolumeFlow *float64 `json:"standard_volume_flow,omitempty"`
	StandardReference  string   `json:"standard_reference,omitempty"`
	DischargePressure  float64  `json:"discharge_pressure"`
}

// CheckRequest is a duty-change check: the machine as built, the new duty
// and the baseline to compare with (nil: the machine's design duty).
type CheckRequest struct {
	Machine  Machine    `json:"machine"`
	Duty     CheckDuty  `json:"duty"`
	Baseline *CheckDuty `json:"baseline,omitempty"`
}

// Reason is one cause of a does-not-fit verdict.
type Reason struct {
	Code    string
	Message string
	Value   float64
	Limit   float64
	Unit    string
}

// MarginChange is one operating margin or limit rule before (baseline) and
// after (new duty). Before and After are the quantity's values, Limit its
// level; MarginBefore and MarginAfter the distance to the level as a
// fraction of it, positive inside.
type MarginChange struct {
	Code string
	Rule string
	// Stage is the stage (1-based) a per-stage limit rule grades; 0 for
	// the machine's margins.
	Stage                     int
	Before, After, Limit      float64
	Unit                      string
	MarginBefore, MarginAfter float64
	// Severity is the new duty's grade for a limit rule ("" for the
	// operating margins).
	Severity string
}

// Change is one input or result that moved from the baseline to the new
// duty. Change is (After − Before)/|Before| (After − Before when Before is
// 0); TowardLimit is how much of the margin to its limit the move used up
// (MarginBefore − MarginAfter; nil for a quantity without a limit).
type Change struct {
	Quantity      string
	Before, After float64
	Change        float64
	Unit          string
	TowardLimit   *float64
}

// Recycle is the anti-surge recycle of a fits-with-recycle duty.
type Recycle struct {
	// MassFlow and VolumeFlow are the recycled flow (at suction
	// conditions, the recycle cooled back to the suction temperature).
	MassFlow, VolumeFlow float64
	// CompressorMassFlow and CompressorVolumeFlow are what the compressor
	// then moves: the duty's flow plus the recycle, on the control line.
	CompressorMassFlow, CompressorVolumeFlow float64
	// ShaftPower with the recycle, W; ShaftPowerExtra is what the recycle
	// costs over the same speed line's power at the duty's own flow
	// (0 when that point lies past surge and has no rating).
	ShaftPower float64
	Basis      string
}

// Throttling is the suction throttling of a fits-with-throttling duty.
type Throttling struct {
	// Speed is the minimum speed the machine then runs at, rev/min.
	Speed float64
	// SuctionPressure is the pressure after the suction throttle valve,
	// Pa absolute; PressureDrop the drop across it, Pa.
	SuctionPressure, PressureDrop float64
	// ShaftPower at the throttled point, W.
	ShaftPower float64
	// RecycleMassFlow is the recycle that holds the throttled compressor
	// on the surge control line (0: the throttling alone is right of it).
	RecycleMassFlow float64
	// AlternativeRecycleMassFlow is the recycle alone (no throttle) at the
	// minimum speed that brings the discharge down to the duty's, with its
	// shaft power (0: none right of the control line and short of choke).
	AlternativeRecycleMassFlow, AlternativeShaftPower float64
}

// SimilarityCheck is one PTC 10 similarity quantity, baseline against
// new duty.
type SimilarityCheck struct {
	Quantity  string
	Baseline  float64
	Duty      float64
	Measure   float64
	Kind      string
	Low, High float64
	Within    bool
	Basis     string
}

// CheckStage is one stage at an operating point.
type CheckStage struct {
	Stage                                   int
	Speed                                   float64
	SuctionPressure, SuctionTemperature     float64
	DischargePressure, DischargeTemperature float64
	VolumeFlow                              float64
	PolytropicHead, PolytropicEfficiency    float64
	SurgeFlow, ChokeFlow                    float64
	SurgeMargin, ChokeMargin                float64
	FlowCoefficient, DesignFlowRatio        float64
}

// CheckPoint is the machine at an operating point.
type CheckPoint struct {
	Speed                                      float64
	MassFlow, VolumeFlow                       float64
	SuctionPressure, SuctionTemperature        float64
	DischargePressure, DischargeTemperature    float64
	PolytropicHead, IsentropicHead             float64
	PolytropicEfficiency, IsentropicEfficiency float64
	GasPower, ShaftPower                       float64
	// SurgeFlow, ControlFlow and ChokeFlow are at this speed, as actual
	// volume flows at the machine's suction (m3/s); SurgeStage and
	// ChokeStage the stage (1-based) that reaches each first.
	SurgeFlow, ControlFlow, ChokeFlow float64
	SurgeStage, ChokeStage            int
	// SurgeMargin is (Q − Q_surge)/Q_surge, ChokeMargin (Q_choke − Q)/Q_choke.
	SurgeMargin, ChokeMargin         float64
	FlowCoefficient, DesignFlowRatio float64
	Stages                           []CheckStage
}

// CheckResult is the answer of a duty-change check.
type CheckResult struct {
	Verdict        string
	Reasons        []Reason
	OperatingPoint CheckPoint
	BaselinePoint  CheckPoint
	Recycle        *Recycle
	Throttling     *Throttling
	Margins        []MarginChange
	Changes        []Change
	Similarity     []SimilarityCheck
	// SpeedRange and DriverRating are the machine's, given or defaulted.
	MinimumSpeed, MaximumContinuousSpeed float64
	DriverRating                         float64
	SurgeControlMargin                   float64
	Warnings                             []Warning
	Provenance                           Provenance
	Cautions                             []string
}

// ErrSpeedOutOfReach is what a rating returns when no speed makes the
// discharge pressure at the flow (above the highest or below the lowest
// speed the rating searches).
var ErrSpeedOutOfReach = errors.New("service: no speed makes the discharge pressure")

// ErrChoked is what a rating at a given speed returns when the flow is at
// or past the estimated choke flow.
var ErrChoked = errors.New("service: flow at or past choke")

// designDuty is the machine's own design duty: the first stage's gas,
// suction state and volume flow, and the last stage's design discharge
// pressure.
func designDuty(m Machine) (CheckDuty, error) {
	first, last := m.Stages[0].Design, m.Stages[len(m.Stages)-1].Design
	if !(last.DischargePressure > 0) {
		return CheckDuty{}, shapeErr("machine.stages."+strconv.Itoa(len(m.Stages)-1)+".design.discharge_pressure",
			errors.New("the machine's design discharge pressure is needed when no baseline is given: give it, or give a baseline duty"))
	}
	q := first.VolumeFlow
	return CheckDuty{Gas: first.Gas, SuctionPressure: first.SuctionPressure, SuctionTemperature: first.SuctionTemperature,
		ActualVolumeFlow: &q, DischargePressure: last.DischargePressure}, nil
}

// checkDutyShape checks what the rating does not: the discharge pressure
// above the suction pressure, and one flow.
func checkDutyShape(d CheckDuty, prefix string) error {
	if err := suctionInRange(d.SuctionPressure, d.SuctionTemperature, prefix+"suction.pressure", prefix+"suction.temperature"); err != nil {
		return err
	}
	switch {
	case !(d.DischargePressure > d.SuctionPressure) || math.IsInf(d.DischargePressure, 0):
		return fieldErr(prefix+"discharge_pressure", reason("discharge_pressure", fmt.Sprintf(
			"discharge pressure (%.6g Pa) must exceed suction pressure (%.6g Pa)", d.DischargePressure, d.SuctionPressure), d.DischargePressure))
	}
	n := 0
	for _, f := range []*float64{d.MassFlow, d.ActualVolumeFlow, d.StandardVolumeFlow} {
		if f != nil {
			n++
		}
	}
	if n != 1 {
		return shapeErr(prefix+"flow", errors.New("give exactly one of flow.mass, flow.actual_volume and flow.standard_volume"))
	}
	return nil
}

// prefixed names an input error's field inside the check request: a duty
// field under prefix ("duty." or "baseline."), a machine field as it is.
func prefixed(err error, prefix string) error {
	var ie *InputError
	if prefix == "" || (errors.As(err, &ie) && strings.HasPrefix(ie.Field, "machine")) {
		return err
	}
	return prefixField(err, prefix)
}

// check runs a duty-change check with the rating rate.
func (s *Service) check(ctx context.Context, req CheckRequest, rate rateFunc, memo *CheckMemo) (CheckResult, error) {
	var res CheckResult
	if err := ctx.Err(); err != nil {
		return res, err
	}
	m := req.Machine
	if len(m.Stages) == 0 {
		return res, shapeErr("machine.stages", errors.New("the machine needs at least one stage"))
	}
	var checkDefaults []Default
	control := DefaultSurgeControlMargin
	if m.SurgeControl != nil && m.SurgeControl.Margin != nil {
		control = *m.SurgeControl.Margin
		if !(control >= 0 && control <= 0.5) {
			return res, fieldErr("machine.surge_control.margin", reason("margin",
				"the surge control margin is the control line's distance from surge as a fraction of the surge flow: at least 0, at most 0.5", control))
		}
	} else {
		checkDefaults = append(checkDefaults, Default{Field: "machine.surge_control.margin", Value: strconv.FormatFloat(control, 'f', -1, 64), Note: SurgeControlBasis})
	}
	if err := checkDutyShape(req.Duty, "duty."); err != nil {
		return res, err
	}
	base, basePrefix := req.Baseline, "baseline."
	if base == nil {
		d, err := designDuty(m)
		if err != nil {
			return res, err
		}
		base, basePrefix = &d, "machine.stages.0.design."
		checkDefaults = append(checkDefaults, Default{Field: "baseline", Value: "the machine's design duty",
			Note: "no baseline given: the first stage's design gas, suction state and volume flow, and the last stage's design discharge pressure"})
	} else if err := checkDutyShape(*base, basePrefix); err != nil {
		return res, err
	}
	designSpeed := m.Stages[0].Design.Speed
	design := CheckDuty{Gas: m.Stages[0].Design.Gas, SuctionPressure: m.Stages[0].Design.SuctionPressure,
		SuctionTemperature: m.Stages[0].Design.SuctionTemperature, ActualVolumeFlow: &m.Stages[0].Design.VolumeFlow}
	bo, err := memo.baseline(hashOf(struct {
		Machine  Machine
		Baseline CheckDuty
		Control  float64
	}{m, *base, control}), func() (operated, error) {
		return operate(ctx, rate, *base, design, designSpeed, control)
	})
	if err != nil {
		return res, prefixed(err, basePrefix)
	}
	ao, err := operate(ctx, rate, req.Duty, design, designSpeed, control)
	if err != nil {
		return res, prefixed(err, "duty.")
	}
	a := ao.pt
	res.Verdict, res.Reasons = ao.verdict, ao.reasons
	res.OperatingPoint, res.BaselinePoint = withControl(a.Point, control), withControl(bo.pt.Point, control)
	res.Recycle, res.Throttling = ao.recycle, ao.throttling
	res.MinimumSpeed, res.MaximumContinuousSpeed, res.DriverRating = a.MinSpeed, a.MaxSpeed, a.DriverRating
	res.SurgeControlMargin = control
	res.Margins = marginsOf(bo.pt, a, control)
	res.Changes = changesOf(*base, req.Duty, bo, ao, res.Margins)
	res.Similarity = similarityOf(bo.pt, a)
	res.Warnings = append(res.Warnings, a.Warnings...)
	res.Provenance = a.Provenance
	res.Provenance.ModelVersion, res.Provenance.ServiceVersion = ModelVersion, s.version
	res.Provenance.InputHash = hashOf(req)
	res.Provenance.Defaults = append(append([]Default(nil), a.Provenance.Defaults...), checkDefaults...)
	res.Provenance.Methods = append(append([]Method(nil), a.Provenance.Methods...), checkMethods(control)...)
	res.Cautions = checkCautions(res, a.Cautions)
	return res, nil
}

// CheckMemo shares the baseline operating points among the checks of one
// batch: checks of the same machine against the same baseline (and surge
// control margin) find it once. Safe for concurrent use; make one per
// batch with NewCheckMemo (a nil *CheckMemo shares nothing).
type CheckMemo struct {
	mu sync.Mutex
	m  map[string]*memoEntry
}

type memoEntry struct {
	once sync.Once
	op   operated
	err  error
}

// NewCheckMemo returns an empty memo.
func NewCheckMemo() *CheckMemo { return &CheckMemo{m: map[string]*memoEntry{}} }

// baseline returns the memo's operated baseline under key, running find
// once per key (callers of the same key wait for the first).
func (c *CheckMemo) baseline(key string, find func() (operated, error)) (operated, error) {
	if c == nil || key == "" {
		return find()
	}
	c.mu.Lock()
	e, ok := c.m[key]
	if !ok {
		e = &memoEntry{}
		c.m[key] = e
	}
	c.mu.Unlock()
	e.once.Do(func() { e.op, e.err = find() })
	return e.op, e.err
}

// withControl fills the control-line flow of a point.
func withControl(p CheckPoint, control float64) CheckPoint {
	if p.SurgeFlow > 0 {
		p.ControlFlow = (1 + control) * p.SurgeFlow
	}
	return p
}

func checkMethods(control float64) []Method {
	return []Method{
		{Subject: "operating point", Name: "the speed at which the machine makes the discharge pressure at the duty's flow (stages stacked at fixed speed ratios)",
			Source: "stage stacking: Dixon & Hall (2014) ch. 7 with the off-design method of the rating"},
		{Subject: "surge control line", Name: "control line at " + strconv.FormatFloat(1+control, 'f', -1, 64) + " × the estimated surge flow at the same speed; anti-surge recycle raises the compressor's flow to it",
			Source: SurgeControlBasis},
		{Subject: "choke", Name: "a fitting duty keeps at least 5 % of the estimated choke flow", Source: MinChokeMarginBasis},
		{Subject: "similarity", Name: "ratio of specific-volume ratios, machine Mach number, machine Reynolds number (dilute-gas viscosity by Lucas, Wilke mixing) and flow coefficient, baseline against duty",
			Source: "ASME PTC 10-1997, Table 3.2 and Figs. 3.3 and 3.5 (from memory); Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), §9-4 and §9-5"},
	}
}

// checkCautions adds what a check is and is not to the rating's cautions.
func checkCautions(res CheckResult, rating []string) []string {
	out := []string{
		"The verdict is an estimate from the machine's geometry and design point with published off-design methods, not the manufacturer's tested map: confirm any change of duty with the manufacturer before operating at it.",
		"Surge and choke flows here are estimates; the anti-surge controller must be set from the manufacturer's map and field surge tests, never from these figures.",
	}
	for _, s := range res.Similarity {
		if !s.Within {
			out = append(out, "The new duty is not similar to the baseline in the sense of ASME PTC 10 ("+s.Quantity+" outside the code's band): the machine's known performance is being extrapolated, and the estimate is less certain.")
			break
		}
	}
	return append(out, rating...)
}
