package service

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"sync"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/limits"
	"stagewright/physics/similarity"
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

// opPoint is one rated operating point as the check judges it.
type opPoint struct {
	Point CheckPoint
	// Density is the suction density, DischargeDensity the machine's
	// discharge density, kg/m3.
	Density, DischargeDensity float64
	// TipSpeed, MachineMach and ExitWidth are the first stage's; Viscosity
	// the suction viscosity, Pa s (0: unknown).
	TipSpeed, MachineMach, ExitWidth, Viscosity float64
	MolarMass                                   float64
	Composition                                 map[string]float64
	Limits                                      []limits.Assessment
	Warnings                                    []Warning
	Provenance                                  Provenance
	Cautions                                    []string
	// MinSpeed, MaxSpeed and DriverRating are the machine's resolved frame.
	MinSpeed, MaxSpeed, DriverRating float64
}

// rateQuery asks for one rated point: the duty's gas and suction state,
// its flow or a mass flow (MassFlow > 0), an optional suction pressure
// (SuctionPressure > 0, a throttled suction) and either a speed
// (Speed > 0) or the duty's discharge pressure (the speed is solved).
type rateQuery struct {
	Duty CheckDuty
	// FlowScale multiplies the duty's flow (0: 1).
	FlowScale float64
	MassFlow  float64
	// VolumeFlow (> 0) is an actual volume flow at the (throttled) suction.
	VolumeFlow      float64
	SuctionPressure float64
	Speed           float64
}

// rateFunc rates the machine; it returns ErrSpeedOutOfReach (wrapped)
// when no speed makes the discharge pressure.
type rateFunc func(ctx context.Context, q rateQuery) (opPoint, error)

// operated is a duty run on the machine: the point the machine runs at
// (with any recycle or throttling), the verdict and its reasons.
type operated struct {
	pt         opPoint
	verdict    string
	reasons    []Reason
	recycle    *Recycle
	throttling *Throttling
	// processMass and processVolume are the duty's own flow at its own
	// suction state (the machine's flow less any recycle).
	processMass, processVolume float64
}

// operate finds the operating point of duty d on the machine and judges
// it: the speed that makes the discharge pressure; below the minimum
// speed, throttling at the minimum speed; left of the control line, the
// recycle up to it; then the limits.
func operate(ctx context.Context, rate rateFunc, d, design CheckDuty, designSpeed, control float64) (operated, error) {
	var op operated
	pt, err := rate(ctx, rateQuery{Duty: d})
	outOfReach := errors.Is(err, ErrSpeedOutOfReach)
	if err != nil && !outOfReach {
		return op, err
	}
	if outOfReach {
		return beyondReach(ctx, rate, d, design, designSpeed, control)
	}
	op.processMass, op.processVolume = pt.Point.MassFlow, pt.Point.VolumeFlow
	if pt.Point.Speed >= pt.MinSpeed*(1-1e-9) && !rightOfControl(pt.Point, control) {
		// Left of the control line: the machine runs on it with the recycle,
		// at the speed that makes the discharge pressure there.
		op.pt = pt
		if err := recycle(ctx, rate, d, &op, control); err != nil {
			return op, err
		}
		judgeLimits(&op)
		return op, nil
	}
	switch {
	case pt.Point.Speed > pt.MaxSpeed*(1+1e-9):
		op.pt = pt
		op.reasons = append(op.reasons, Reason{Code: ReasonSpeedAboveMaximum, Unit: "rev/min",
			Message: fmt.Sprintf("the duty needs %.0f rev/min, above the maximum continuous speed of %.0f rev/min", pt.Point.Speed, pt.MaxSpeed),
			Value:   pt.Point.Speed, Limit: pt.MaxSpeed})
		judgeLimits(&op)
		return op, nil
	case pt.Point.Speed < pt.MinSpeed*(1-1e-9):
		at, err := rate(ctx, rateQuery{Duty: d, Speed: pt.MinSpeed})
		if errors.Is(err, ErrChoked) {
			op.pt = pt
			op.reasons = append(op.reasons, Reason{Code: ReasonSpeedBelowMinimum, Unit: "rev/min",
				Message: fmt.Sprintf("the duty needs %.0f rev/min, below the minimum speed of %.0f rev/min, and at the minimum speed the flow is past the estimated choke flow: neither throttling nor recycle fits it",
					pt.Point.Speed, pt.MinSpeed),
				Value: pt.Point.Speed, Limit: pt.MinSpeed})
			judgeLimits(&op)
			return op, nil
		}
		if err != nil {
			return op, err
		}
		op, err = throttle(ctx, rate, d, at, control)
		op.processMass, op.processVolume = pt.Point.MassFlow, pt.Point.VolumeFlow
		return op, err
	}
	op.pt = pt
	judgeLimits(&op)
	return op, nil
}

// beyondReach judges a duty that no speed of the rating's search makes:
// at the maximum continuous speed the machine makes too little (or the
// flow chokes), or at the minimum speed too much (then throttling).
func beyondReach(ctx context.Context, rate rateFunc, d, design CheckDuty, designSpeed, control float64) (operated, error) {
	var op operated
	// The design point at the design speed names the speed range.
	fr, err := rate(ctx, rateQuery{Duty: design, Speed: designSpeed})
	if err != nil {
		return op, fmt.Errorf("service: check: the machine at its own design point: %w", err)
	}
	hi, err := rate(ctx, rateQuery{Duty: d, Speed: fr.MaxSpeed})
	switch {
	case errors.Is(err, ErrChoked):
		return chokedAtMaximum(ctx, rate, d, fr.MaxSpeed)
	case err != nil:
		return op, err
	}
	op.processMass, op.processVolume = hi.Point.MassFlow, hi.Point.VolumeFlow
	if hi.Point.DischargePressure < d.DischargePressure {
		op.pt = hi
		op.reasons = append(op.reasons, Reason{Code: ReasonSpeedAboveMaximum, Unit: "Pa",
			Message: fmt.Sprintf("at the maximum continuous speed (%.0f rev/min) the machine makes only %.0f kPa of the %.0f kPa the duty needs",
				hi.MaxSpeed, hi.Point.DischargePressure/1e3, d.DischargePressure/1e3),
			Value: hi.Point.DischargePressure, Limit: d.DischargePressure})
		judgeLimits(&op)
		return op, nil
	}
	lo, err := rate(ctx, rateQuery{Duty: d, Speed: fr.MinSpeed})
	if err != nil {
		return op, err
	}
	op, err = throttle(ctx, rate, d, lo, control)
	op.processMass, op.processVolume = lo.Point.MassFlow, lo.Point.VolumeFlow
	return op, err
}

// chokedAtMaximum answers a duty whose flow chokes the machine even at the
// maximum continuous speed: the flow is halved until the machine passes
// it, to learn the choke flow at that speed, and the point shown is the
// machine at 98 % of that choke flow.
func chokedAtMaximum(ctx context.Context, rate rateFunc, d CheckDuty, nmax float64) (operated, error) {
	var op operated
	var pt opPoint
	var err error
	scale := 1.0
	for range 12 {
		scale /= 2
		pt, err = rate(ctx, rateQuery{Duty: d, Speed: nmax, FlowScale: scale})
		if !errors.Is(err, ErrChoked) {
			break
		}
	}
	if err != nil {
		return op, err
	}
	op.processMass, op.processVolume = pt.Point.MassFlow/scale, pt.Point.VolumeFlow/scale
	qc := pt.Point.ChokeFlow
	where := ""
	if pt.Point.ChokeStage > 0 {
		where = ", stage " + strconv.Itoa(pt.Point.ChokeStage) + " first"
	}
	if qc > 0 && pt.Density > 0 {
		if at, err := rate(ctx, rateQuery{Duty: d, Speed: nmax, MassFlow: 0.98 * qc * pt.Density}); err == nil {
			pt = at
		}
	}
	op.pt = pt
	op.reasons = append(op.reasons, Reason{Code: ReasonChoke, Unit: "m3/s",
		Message: fmt.Sprintf("the flow (%.4g m3/s at suction) is past the estimated choke flow at every speed up to the maximum continuous speed (%.4g m3/s at %.0f rev/min%s); the operating point shown is the machine at that speed near its choke flow, and the choke flow is an estimate",
			op.processVolume, qc, nmax, where),
		Value: op.processVolume, Limit: qc})
	judgeLimits(&op)
	return op, nil
}

// recycle raises the compressor's flow to the control line at the speed
// that makes the discharge pressure there: Q = (1 + m) Q_surge(N(Q)), a
// fixed point found by successive substitution (the surge flow moves
// little with the small change of speed).
func recycle(ctx context.Context, rate rateFunc, d CheckDuty, op *operated, control float64) error {
	own := op.pt
	rho := own.Density
	if !(rho > 0) {
		return fmt.Errorf("service: check: suction density %g", rho)
	}
	q := (1 + control) * own.Point.SurgeFlow
	var at opPoint
	for range 8 {
		pt, err := rate(ctx, rateQuery{Duty: d, MassFlow: q * rho})
		if errors.Is(err, ErrSpeedOutOfReach) {
			break
		}
		if err != nil {
			return err
		}
		at = pt
		next := (1 + control) * pt.Point.SurgeFlow
		if math.Abs(next-q) <= 1e-6*q {
			break
		}
		q = next
	}
	if at.Point.Speed == 0 {
		op.reasons = append(op.reasons, Reason{Code: ReasonSurge, Unit: "m3/s",
			Message: "the flow is left of the surge control line and no speed makes the discharge pressure on the control line: recycle cannot hold the machine out of surge at this duty",
			Value:   own.Point.VolumeFlow, Limit: (1 + control) * own.Point.SurgeFlow})
		return nil
	}
	op.pt = at
	op.recycle = &Recycle{
		MassFlow: at.Point.MassFlow - own.Point.MassFlow, VolumeFlow: at.Point.VolumeFlow - own.Point.VolumeFlow,
		CompressorMassFlow: at.Point.MassFlow, CompressorVolumeFlow: at.Point.VolumeFlow,
		ShaftPower: at.Point.ShaftPower,
		Basis:      "recycle from discharge to suction through the anti-surge valve, cooled back to the suction temperature; the compressor runs on the control line at the speed that makes the discharge pressure there",
	}
	switch {
	case at.Point.Speed > at.MaxSpeed*(1+1e-9):
		op.reasons = append(op.reasons, Reason{Code: ReasonSpeedAboveMaximum, Unit: "rev/min",
			Message: fmt.Sprintf("with the recycle on the control line the duty needs %.0f rev/min, above the maximum continuous speed of %.0f rev/min", at.Point.Speed, at.MaxSpeed),
			Value:   at.Point.Speed, Limit: at.MaxSpeed})
	case at.Point.Speed < at.MinSpeed*(1-1e-9):
		op.reasons = append(op.reasons, Reason{Code: ReasonSpeedBelowMinimum, Unit: "rev/min",
			Message: fmt.Sprintf("with the recycle on the control line the duty needs %.0f rev/min, below the minimum speed of %.0f rev/min", at.Point.Speed, at.MinSpeed),
			Value:   at.Point.Speed, Limit: at.MinSpeed})
	}
	return nil
}

// secantRoot finds x with f(x) = 0 by the secant method from x0 (where
// f is f0) and x1, each step clamped to [lo, hi]; a choked point (ErrChoked)
// steps back halfway towards the previous x. It returns the point at the
// root, or ok = false.
func secantRoot(f func(x float64) (opPoint, float64, error), x0, f0, x1, lo, hi, tol float64) (opPoint, float64, bool, error) {
	pt, f1, err := f(x1)
	for range 40 {
		if errors.Is(err, ErrChoked) {
			x1 = 0.5 * (x0 + x1)
			pt, f1, err = f(x1)
			continue
		}
		if err != nil {
			var ie *InputError
			if errors.Is(err, ErrSpeedOutOfReach) || errors.As(err, &ie) {
				return pt, x1, false, nil
			}
			return pt, x1, false, err
		}
		if math.Abs(f1) <= tol {
			return pt, x1, true, nil
		}
		if f1 == f0 {
			return pt, x1, false, nil
		}
		x2 := math.Min(math.Max(x1-f1*(x1-x0)/(f1-f0), lo), hi)
		x0, f0, x1 = x1, f1, x2
		pt, f1, err = f(x1)
	}
	return pt, x1, false, nil
}

// rightOfControl reports whether a point lies on or right of the surge
// control line (or has no surge estimate).
func rightOfControl(p CheckPoint, control float64) bool {
	return !(p.SurgeFlow > 0) || p.VolumeFlow >= (1+control)*p.SurgeFlow*(1-1e-6)
}

// throttle handles a duty whose speed would fall below the minimum: at the
// minimum speed the machine makes more than the discharge pressure. In
// order: the suction throttled until the machine makes just that (secant
// on the throttled suction pressure at the duty's mass flow), when that
// point lies right of the surge control line; else the suction throttled
// with the recycle holding the compressor on the control line. The recycle
// alone at the minimum speed (no throttle) is reported as the alternative
// when it lies right of the control line and short of choke.
func throttle(ctx context.Context, rate rateFunc, d CheckDuty, atMin opPoint, control float64) (operated, error) {
	op := operated{pt: atMin}
	mdot := atMin.Point.MassFlow
	p1, p2 := d.SuctionPressure, d.DischargePressure
	nmin := atMin.MinSpeed
	tol := 1e-7 * p2
	excess := atMin.Point.DischargePressure - p2
	throttled := func(q func(ps float64) rateQuery) func(float64) (opPoint, float64, error) {
		return func(ps float64) (opPoint, float64, error) {
			pt, err := rate(ctx, q(ps))
			if err != nil {
				return pt, 0, err
			}
			return pt, pt.Point.DischargePressure - p2, nil
		}
	}
	first := p1 * p2 / atMin.Point.DischargePressure
	pt, ps, ok, err := secantRoot(throttled(func(ps float64) rateQuery {
		return rateQuery{Duty: d, MassFlow: mdot, SuctionPressure: ps, Speed: nmin}
	}), p1, excess, first, 0.05*p1, p1, tol)
	if err != nil {
		return op, err
	}
	if ok && !rightOfControl(pt.Point, control) {
		// Throttle with the recycle on the control line: the compressor's
		// volume flow at its (throttled) suction is the control flow.
		qc := (1 + control) * pt.Point.SurgeFlow
		pt, ps, ok, err = secantRoot(throttled(func(ps float64) rateQuery {
			return rateQuery{Duty: d, VolumeFlow: qc, SuctionPressure: ps, Speed: nmin}
		}), p1, excess, first, 0.05*p1, p1, tol)
		if err != nil {
			return op, err
		}
		ok = ok && pt.Point.MassFlow >= mdot*(1-1e-9) && rightOfControl(pt.Point, control)
	}
	if !ok {
		op.reasons = append(op.reasons, Reason{Code: ReasonSpeedBelowMinimum, Unit: "Pa",
			Message: fmt.Sprintf("even at the minimum speed (%.0f rev/min) the machine makes %.0f kPa, more than the %.0f kPa the duty needs, and no suction throttling (with recycle on the surge control line) found brings it down",
				nmin, atMin.Point.DischargePressure/1e3, p2/1e3),
			Value: atMin.Point.DischargePressure, Limit: p2})
		judgeLimits(&op)
		return op, nil
	}
	op.pt = pt
	op.throttling = &Throttling{Speed: nmin, SuctionPressure: ps, PressureDrop: p1 - ps, ShaftPower: pt.Point.ShaftPower,
		RecycleMassFlow: math.Max(pt.Point.MassFlow-mdot, 0)}
	// The alternative: recycle alone at the minimum speed, a secant on the
	// compressor's mass flow at the duty's own suction.
	alt, _, ok, err := secantRoot(func(m float64) (opPoint, float64, error) {
		pt, err := rate(ctx, rateQuery{Duty: d, MassFlow: m, Speed: nmin})
		if err != nil {
			return pt, 0, err
		}
		return pt, pt.Point.DischargePressure - p2, nil
	}, mdot, excess, 1.1*mdot, mdot, 4*mdot, tol)
	if err != nil {
		return op, err
	}
	if ok && rightOfControl(alt.Point, control) && !(alt.Point.ChokeFlow > 0 && alt.Point.ChokeMargin < 0) {
		op.throttling.AlternativeRecycleMassFlow = alt.Point.MassFlow - mdot
		op.throttling.AlternativeShaftPower = alt.Point.ShaftPower
	}
	judgeLimits(&op)
	return op, nil
}

// judgeLimits adds the reasons of the point's choke margin, driver load
// and limit rules, and sets the verdict.
func judgeLimits(op *operated) {
	p := op.pt.Point
	choked := false
	for _, r := range op.reasons {
		choked = choked || r.Code == ReasonChoke
	}
	if !choked && p.ChokeFlow > 0 && p.ChokeMargin < MinChokeMargin {
		where := ""
		if p.ChokeStage > 0 {
			where = " at stage " + strconv.Itoa(p.ChokeStage)
		}
		op.reasons = append(op.reasons, Reason{Code: ReasonChoke, Unit: "-",
			Message: fmt.Sprintf("the flow is %.1f %% short of the estimated choke flow%s, less than the %.0f %% a fitting duty keeps (the choke flow is an estimate)",
				100*p.ChokeMargin, where, 100*MinChokeMargin),
			Value: p.ChokeMargin, Limit: MinChokeMargin})
	}
	if op.pt.DriverRating > 0 && p.ShaftPower > op.pt.DriverRating {
		op.reasons = append(op.reasons, Reason{Code: ReasonDriverOverload, Unit: "W",
			Message: fmt.Sprintf("the shaft power (%.0f kW) exceeds the driver rating (%.0f kW)", p.ShaftPower/1e3, op.pt.DriverRating/1e3),
			Value:   p.ShaftPower, Limit: op.pt.DriverRating})
	}
	stages := stagesOfAssessments(op.pt.Limits)
	for i, a := range op.pt.Limits {
		if a.Severity != limits.Limit || coveredRules[a.Rule.ID] {
			continue
		}
		msg := a.Message()
		if stages[i] > 0 && len(op.pt.Point.Stages) > 1 {
			msg = "stage " + strconv.Itoa(stages[i]) + ": " + msg
		}
		op.reasons = append(op.reasons, Reason{Code: a.Rule.Code, Unit: a.Rule.Unit, Message: msg, Value: a.Value, Limit: a.Level})
	}
	switch {
	case len(op.reasons) > 0:
		op.verdict = CheckDoesNotFit
	case op.throttling != nil:
		op.verdict = CheckFitsThrottling
	case op.recycle != nil:
		op.verdict = CheckFitsRecycle
	default:
		op.verdict = CheckFits
	}
}

// coveredRules are the rating's rules whose limits the check judges with
// its own reasons (choke, speed range, driver overload) or settles by
// recycle (surge): they stay in the margins but raise no second reason.
var coveredRules = map[string]bool{"surge-margin": true, "choke-margin": true, "speed-above-range": true,
	"speed-below-range": true, "driver-margin": true}

// stagesOfAssessments returns the stage (1-based; 0 for the machine-level
// rules) of each assessment of a rating: RateMachine lists each stage's
// rules in flow order, every stage's first with the tip-speed rule, then
// the machine's rules (surge, choke, speed range, driver).
func stagesOfAssessments(as []limits.Assessment) []int {
	out := make([]int, len(as))
	k := 0
	for i, a := range as {
		switch {
		case a.Rule.ID == "tip-speed":
			k++
		case coveredRules[a.Rule.ID]:
			k = -1
		}
		out[i] = max(k, 0)
	}
	return out
}

// relMargin is the distance of v to the level as a fraction of it,
// positive inside: above a lower level (below = true) or under an upper one.
func relMargin(v, level float64, below bool) float64 {
	if level == 0 {
		return 0
	}
	if below {
		return (v - level) / math.Abs(level)
	}
	return (level - v) / math.Abs(level)
}

// marginsOf returns the operating margins and every limit rule of the
// baseline (b) and the new duty (a).
func marginsOf(b, a opPoint, control float64) []MarginChange {
	var out []MarginChange
	if b.Point.SurgeFlow > 0 && a.Point.SurgeFlow > 0 {
		// Flow to the control line as a fraction of the control-line flow.
		m := func(p CheckPoint) float64 { return (p.SurgeMargin - control) / (1 + control) }
		out = append(out, MarginChange{Code: MarginSurge, Before: b.Point.SurgeMargin, After: a.Point.SurgeMargin, Limit: control, Unit: "-",
			MarginBefore: m(b.Point), MarginAfter: m(a.Point)})
	}
	if b.Point.ChokeFlow > 0 && a.Point.ChokeFlow > 0 {
		m := func(p CheckPoint) float64 { return (p.ChokeMargin - MinChokeMargin) / (1 - MinChokeMargin) }
		out = append(out, MarginChange{Code: MarginChoke, Before: b.Point.ChokeMargin, After: a.Point.ChokeMargin, Limit: MinChokeMargin, Unit: "-",
			MarginBefore: m(b.Point), MarginAfter: m(a.Point)})
	}
	out = append(out,
		MarginChange{Code: MarginSpeedMax, Before: b.Point.Speed, After: a.Point.Speed, Limit: a.MaxSpeed, Unit: "rev/min",
			MarginBefore: relMargin(b.Point.Speed, b.MaxSpeed, false), MarginAfter: relMargin(a.Point.Speed, a.MaxSpeed, false)},
		MarginChange{Code: MarginSpeedMin, Before: b.Point.Speed, After: a.Point.Speed, Limit: a.MinSpeed, Unit: "rev/min",
			MarginBefore: relMargin(b.Point.Speed, b.MinSpeed, true), MarginAfter: relMargin(a.Point.Speed, a.MinSpeed, true)},
		MarginChange{Code: MarginDriver, Before: b.Point.ShaftPower, After: a.Point.ShaftPower, Limit: a.DriverRating, Unit: "W",
			MarginBefore: relMargin(b.Point.ShaftPower, b.DriverRating, false), MarginAfter: relMargin(a.Point.ShaftPower, a.DriverRating, false)},
	)
	// The same machine lists the same rules in the same order at both
	// points; pair them by stage and rule.
	type key struct {
		stage int
		id    string
	}
	before := map[key]limits.Assessment{}
	for i, st := range stagesOfAssessments(b.Limits) {
		before[key{st, b.Limits[i].Rule.ID}] = b.Limits[i]
	}
	for i, st := range stagesOfAssessments(a.Limits) {
		l := a.Limits[i]
		bl, ok := before[key{st, l.Rule.ID}]
		if !ok {
			continue
		}
		out = append(out, MarginChange{Code: l.Rule.Code, Rule: l.Rule.ID, Stage: st, Before: bl.Value, After: l.Value, Limit: l.Rule.Warning, Unit: l.Rule.Unit,
			MarginBefore: bl.Margin, MarginAfter: l.Margin, Severity: string(l.Severity)})
	}
	return out
}

// changesOf lists the inputs and results that moved from the baseline to
// the new duty, those with a limit first by how much of their margin the
// move used up (most first), then the rest by the size of the change.
func changesOf(bd, ad CheckDuty, bo, ao operated, margins []MarginChange) []Change {
	b, a := bo.pt, ao.pt
	var out []Change
	add := func(q string, before, after float64, unit string, toward *float64) {
		if !(math.Abs(after-before) > 1e-9*math.Max(math.Abs(before), math.Abs(after))) {
			return
		}
		c := after - before
		if before != 0 {
			c /= math.Abs(before)
		}
		out = append(out, Change{Quantity: q, Before: before, After: after, Change: c, Unit: unit, TowardLimit: toward})
	}
	add("gas.molar_mass", b.MolarMass, a.MolarMass, "kg/mol", nil)
	names := map[string]bool{}
	for k := range b.Composition {
		names[k] = true
	}
	for k := range a.Composition {
		names[k] = true
	}
	keys := make([]string, 0, len(names))
	for k := range names {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	for _, k := range keys {
		add("gas.composition."+k, b.Composition[k], a.Composition[k], "mole fraction", nil)
	}
	add("suction.pressure", bd.SuctionPressure, ad.SuctionPressure, "Pa", nil)
	add("suction.temperature", bd.SuctionTemperature, ad.SuctionTemperature, "K", nil)
	add("discharge_pressure", bd.DischargePressure, ad.DischargePressure, "Pa", nil)
	add("pressure_ratio", bd.DischargePressure/bd.SuctionPressure, ad.DischargePressure/ad.SuctionPressure, "-", nil)
	// The duty's own flow: the machine's flow less any recycle.
	add("flow.mass", bo.processMass, ao.processMass, "kg/s", nil)
	add("flow.actual_volume", bo.processVolume, ao.processVolume, "m3/s", nil)
	// A quantity's margin: the operating margins, and the discharge
	// temperature rule of the last stage (the machine's discharge).
	byCode := map[string]MarginChange{}
	for _, m := range margins {
		if m.Rule == "" || m.Rule == m.Code {
			byCode[m.Code] = m
		}
	}
	toward := func(code string) *float64 {
		m, ok := byCode[code]
		if !ok {
			return nil
		}
		v := m.MarginBefore - m.MarginAfter
		return &v
	}
	add("speed", b.Point.Speed, a.Point.Speed, "rev/min", toward(MarginSpeedMax))
	add("head.polytropic", b.Point.PolytropicHead, a.Point.PolytropicHead, "J/kg", nil)
	add("efficiency.polytropic", b.Point.PolytropicEfficiency, a.Point.PolytropicEfficiency, "-", nil)
	add("power.shaft", b.Point.ShaftPower, a.Point.ShaftPower, "W", toward(MarginDriver))
	add("discharge.temperature", b.Point.DischargeTemperature, a.Point.DischargeTemperature, "K", toward(MarginDischargeT))
	if b.Point.SurgeFlow > 0 && a.Point.SurgeFlow > 0 {
		add("surge_margin", b.Point.SurgeMargin, a.Point.SurgeMargin, "-", toward(MarginSurge))
	}
	if b.Point.ChokeFlow > 0 && a.Point.ChokeFlow > 0 {
		add("choke_margin", b.Point.ChokeMargin, a.Point.ChokeMargin, "-", toward(MarginChoke))
	}
	sort.SliceStable(out, func(i, j int) bool {
		ti, tj := out[i].TowardLimit, out[j].TowardLimit
		switch {
		case ti != nil && tj != nil:
			return *ti > *tj
		case ti != nil:
			return true
		case tj != nil:
			return false
		}
		return math.Abs(out[i].Change) > math.Abs(out[j].Change)
	})
	return out
}

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
	switch {
	case !(d.SuctionPressure > 0) || math.IsInf(d.SuctionPressure, 0):
		return fieldErr(prefix+"suction.pressure", reason("pressure", "the suction pressure must be a finite absolute pressure above 0 Pa", d.SuctionPressure))
	case !(d.SuctionTemperature > 0) || math.IsInf(d.SuctionTemperature, 0):
		return fieldErr(prefix+"suction.temperature", reason("temperature", "the suction temperature must be a finite absolute temperature above 0 K", d.SuctionTemperature))
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
	if !errors.As(err, &ie) || prefix == "" {
		return err
	}
	if len(ie.Field) >= 7 && ie.Field[:7] == "machine" {
		return err
	}
	out := *ie
	out.Field = prefix + ie.Field
	return &out
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

// similarityOf compares the new duty's point with the baseline's by the
// PTC 10 similarity quantities (nil when a point lacks one of them).
func similarityOf(b, a opPoint) []SimilarityCheck {
	pt := func(p opPoint) similarity.Point {
		out := similarity.Point{MachineMach: p.MachineMach, FlowCoefficient: p.Point.FlowCoefficient}
		if p.DischargeDensity > 0 {
			out.SpecificVolumeRatio = p.DischargeDensity / p.Density
		}
		if p.Viscosity > 0 {
			re, err := similarity.MachineReynoldsNumber(physics.MeterPerS(p.TipSpeed), physics.Meter(p.ExitWidth),
				physics.KgPerCubicMeter(p.Density), similarity.PascalSecond(p.Viscosity))
			if err == nil {
				out.MachineReynolds = re
			}
		}
		return out
	}
	ds, err := similarity.Compare(pt(b), pt(a))
	if err != nil {
		return nil
	}
	out := make([]SimilarityCheck, len(ds))
	for i, d := range ds {
		out[i] = SimilarityCheck{Quantity: d.Quantity, Baseline: d.Reference, Duty: d.Value, Measure: d.Measure, Kind: d.Kind,
			Low: d.Low, High: d.High, Within: d.Within, Basis: d.Basis}
	}
	return out
}

// viscosityOf returns the dilute-gas viscosity of the model's gas at t
// (Lucas with Wilke's rule), or 0 when the model has no composition.
func viscosityOf(m gas.Model, t float64) float64 {
	comp, ok := compositionOfModel(m)
	if !ok {
		return 0
	}
	sp := make([]similarity.Species, comp.Len())
	for i := range sp {
		sp[i] = similarity.SpeciesOf(comp.Component(i))
	}
	eta, err := similarity.MixtureViscosity(physics.Kelvin(t), sp, comp.MoleFractions())
	if err != nil {
		return 0
	}
	return float64(eta)
}
