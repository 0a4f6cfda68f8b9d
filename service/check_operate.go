package service

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strconv"

	"stagewright/physics/limits"
)

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
