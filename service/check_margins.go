package service

import (
	"fmt"
	"math"
	"sort"
	"strconv"

	"stagewright/physics/limits"
)

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
