package service

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/limits"
	"stagewright/physics/path"
)

// MaxSectionStages is the most stages a section may have (given or
// chosen): twelve, past the impellers of any one casing or bull gear.
const MaxSectionStages = 12

// Impellers per casing or gear above which a section is warned: a
// between-bearings casing carries up to about 8-10 impellers on one rotor
// and a bull gear up to 4 pinions with 2 impellers each (common practice,
// from memory: API 617 machines as built).
const (
	inlineImpellersWarning = 8
	inlineImpellersLimit   = 10
	gearedImpellersWarning = 8
)

// SectionDuty is a duty for a whole section: the StageDuty of the overall
// suction, discharge and flow, whose choices (efficiency, impeller,
// diffuser, construction, limit overrides, speed choice) apply to every
// stage, plus the stage count, the arrangement and the intercooling.
type SectionDuty struct {
	StageDuty
	// StageCount is the number of stages; nil: the least that keeps every
	// stage inside its levels.
	StageCount *int `json:"stage_count,omitempty"`
	// Arrangement is "geared" (default) or "inline".
	Arrangement  string        `json:"arrangement,omitempty"`
	Intercooling *Intercooling `json:"intercooling,omitempty"`
}

// Intercooling says where the coolers sit and how they cool.
type Intercooling struct {
	// AfterStages lists the stages (1-based) followed by a cooler; nil: after
	// every stage but the last for "geared", none for "inline".
	AfterStages []int `json:"after_stages,omitempty"`
	// AfterStagesGiven is true when AfterStages was given (possibly empty:
	// no coolers).
	AfterStagesGiven   bool     `json:"after_stages_given,omitempty"`
	OutletTemperature  *float64 `json:"outlet_temperature,omitempty"`
	Approach           *float64 `json:"approach,omitempty"`
	CoolantTemperature *float64 `json:"coolant_temperature,omitempty"`
	// PressureDrop across each cooler, Pa.
	PressureDrop float64 `json:"pressure_drop,omitempty"`
}

// SectionCooler is one intercooler of a sized section.
type SectionCooler struct {
	AfterStage int
	// Inlet and Outlet are the gas states entering and leaving.
	Inlet, Outlet gas.State
	// Duty is the heat taken out, W; Condensate the liquid removed, kg/s.
	Duty, Condensate float64
}

// SectionResult is a sized multi-stage section.
type SectionResult struct {
	StageCount int
	// StageCountBasis is "given" or "chosen".
	StageCountBasis string
	Arrangement     string
	Stages          []StageResult
	Coolers         []SectionCooler
	Discharge       gas.State
	// PolytropicHead is the sum of the stages' polytropic heads, J/kg.
	PolytropicHead float64
	// Power is the section total: the stages' gas power, the mechanical
	// losses once for the shaft (or bull gear), the driver.
	Power Power
	// Speed is the common shaft speed of an "inline" section, rev/min (0
	// for "geared").
	Speed float64
	// Warnings are the section's own (Stage 0) and every stage's (Stage k).
	Warnings []SectionWarning
	Verdict  string
	Machine  Machine
	// Split is how the pressure rise is shared among the stages.
	Split      string
	Provenance Provenance
	Cautions   []string
}

// SectionWarning is a warning of the section (Stage 0) or of one stage.
type SectionWarning struct {
	Warning
	Stage int
}

// sectionPlan is one stage's share of the section: its suction gas and
// state, mass flow and discharge pressure, and the cooler after it.
type sectionPlan struct {
	gas     GasInput
	model   gas.Model
	suction gas.State
	mdot    float64
	p2      float64
	cooler  *cooled
	cIn     gas.State
}

// SizeSection sizes a multi-stage section for duty d: the pressure rise
// split by equal polytropic head among the stages, each stage's suction the
// previous stage's discharge after its cooler (condensate removed), each
// stage sized by SizeStage; the stage count, when not given, the least
// for which every stage stays inside its levels.
func (s *Service) SizeSection(ctx context.Context, d SectionDuty) (SectionResult, error) {
	if err := ctx.Err(); err != nil {
		return SectionResult{}, err
	}
	var prov Provenance
	prov.ModelVersion = ModelVersion
	prov.ServiceVersion = s.version
	prov.InputHash = hashOf(d)
	arr := d.Arrangement
	switch arr {
	case "":
		arr = "geared"
		prov.Defaults = append(prov.Defaults, Default{Field: "arrangement", Value: "geared",
			Note: "each stage on its own pinion speed, as in an integrally geared machine"})
	case "geared", "inline":
	default:
		return SectionResult{}, shapeErr("arrangement", fmt.Errorf("unknown arrangement %q: use geared or inline", d.Arrangement))
	}
	if d.StageCount != nil && !(*d.StageCount >= 1 && *d.StageCount <= MaxSectionStages) {
		return SectionResult{}, fieldErr("stage_count", reason("stage_count",
			fmt.Sprintf("the stage count must lie between 1 and %d", MaxSectionStages), float64(*d.StageCount)))
	}
	if arr == "inline" && (d.TipDiameter != nil) {
		return SectionResult{}, shapeErr("tip_diameter", errors.New("an inline section turns every impeller at one speed and their diameters differ: give speed or speed_target, not tip_diameter"))
	}
	ic, err := intercoolingOf(d, arr, &prov)
	if err != nil {
		return SectionResult{}, err
	}
	base, err := s.sectionBase(d)
	if err != nil {
		return SectionResult{}, err
	}
	prov.GasModel = base.model.Name()
	prov.Methods = append(prov.Methods, base.notes...)

	lo, hi := 1, MaxSectionStages
	if d.StageCount != nil {
		lo, hi = *d.StageCount, *d.StageCount
	}
	for _, k := range ic.AfterStages {
		if k+1 > lo && d.StageCount == nil {
			lo = k + 1 // a cooler after stage k needs a stage after it
		}
	}
	var best *SectionResult
	bestMisses := math.MaxInt
	var tried []string
	for n := lo; n <= hi; n++ {
		if err := ctx.Err(); err != nil {
			return SectionResult{}, err
		}
		res, err := s.designSection(ctx, d, base, arr, ic, n)
		if err != nil {
			return SectionResult{}, err
		}
		misses := levelMisses(&res)
		tried = append(tried, fmt.Sprintf("%d: %d", n, len(misses)))
		if len(misses) < bestMisses {
			r := res
			best, bestMisses = &r, len(misses)
		}
		if len(misses) == 0 {
			break
		}
	}
	res := *best
	res.Arrangement = arr
	res.StageCountBasis = "given"
	if d.StageCount == nil {
		res.StageCountBasis = "chosen"
		prov.Methods = append(prov.Methods, Method{Subject: "stage count",
			Name: fmt.Sprintf("the least stage count for which every stage stays inside its levels (no hard limit passed: tip speed of its construction, discharge temperature, Mach numbers ...; no warning level passed of the closed-impeller pressure ratio and head and of the flow-coefficient band): %d (stage counts tried: levels missed %s)",
				res.StageCount, joinComma(tried)),
			Source: "levels of physics/limits (common practice, each with its basis in limits[])"})
		if bestMisses > 0 {
			res.Warnings = append(res.Warnings, SectionWarning{Warning: Warning{Code: "stage-count-levels", Severity: string(limits.Warning),
				Message: fmt.Sprintf("no stage count up to %d keeps every stage inside its levels; the count with the fewest levels missed (%d) is shown: see the stages' warnings", hi, bestMisses),
				Value:   float64(bestMisses), Limit: 0, Margin: -float64(bestMisses), Unit: "-", Basis: "levels of physics/limits"}})
		}
	}
	prov.Methods = append(prov.Methods, Method{Subject: "stage split", Name: res.Split,
		Source: "equal polytropic head per stage (common practice for stages of one construction; Lüdtke, Process Centrifugal Compressors, 2004, ch. 2, from memory)"})
	if len(res.Coolers) > 0 {
		prov.Methods = append(prov.Methods, Method{Subject: "intercooling",
			Name:   "cooler outlet at the given temperature or coolant + approach, pressure drop; condensate removed by a flash at the outlet (water by IAPWS-IF97 saturation, other components by the cubic equation), the gas going on with its new composition and mass flow; duty = enthalpy change + latent heat",
			Source: "IAPWS R7-97 (2007) region 4; Rachford & Rice, J. Pet. Technol. 4(10) (1952); Michelsen & Mollerup, Thermodynamic Models (2007), ch. 10; Clausius-Clapeyron for the latent heat of water"})
	}
	res.Provenance.ModelVersion, res.Provenance.ServiceVersion, res.Provenance.InputHash = prov.ModelVersion, prov.ServiceVersion, prov.InputHash
	// Each stage's duty holds computed pressures and temperatures, whose
	// last bits differ between platforms: the stages carry the section
	// duty's hash instead.
	for i := range res.Stages {
		res.Stages[i].Provenance.InputHash = prov.InputHash
	}
	res.Provenance.GasModel = prov.GasModel
	res.Provenance.Methods = append(prov.Methods, res.Provenance.Methods...)
	res.Provenance.Defaults = append(prov.Defaults, res.Provenance.Defaults...)
	var ws []Warning
	for _, w := range res.Warnings {
		ws = append(ws, w.Warning)
	}
	res.Verdict = verdictOf(ws)
	return res, nil
}

// sectionBase is what every stage count shares: the suction model and
// state, mass flow, final pressure and first efficiency.
type sectionBase struct {
	gas0     GasInput
	explicit GasInput // gas0 with a relative humidity turned into its water fraction
	model    gas.Model
	suction  gas.State
	mdot     float64
	p2       float64
	eff      path.Efficiency
	estimate bool
	method   path.Method
	notes    []Method
}

func (s *Service) sectionBase(d SectionDuty) (sectionBase, error) {
	var b sectionBase
	model, notes, err := s.gasModel(d.Gas, d.SuctionTemperature, d.SuctionPressure)
	if err != nil {
		return b, err
	}
	suction, err := fullState(model, physics.Kelvin(d.SuctionTemperature), physics.Pascal(d.SuctionPressure))
	if err != nil {
		return b, suctionError(err, d.StageDuty)
	}
	if suction.Phase == gas.PhaseLiquid || suction.Phase == gas.PhaseTwoPhase {
		return b, fieldErr("suction.temperature", reason("suction", fmt.Sprintf(
			"the gas is %s at suction (%.2f K, %.0f Pa): a compressor needs a dry gas at suction", suction.Phase, d.SuctionTemperature, d.SuctionPressure), d.SuctionTemperature))
	}
	p2, err := dischargePressure(d.StageDuty)
	if err != nil {
		return b, err
	}
	var scratch Provenance
	mdot, err := massFlow(d.StageDuty, model, suction, &scratch)
	if err != nil {
		return b, err
	}
	eff, _, estimate, err := efficiency(d.StageDuty, &scratch)
	if err != nil {
		return b, err
	}
	method, err := polytropicMethod(d.StageDuty, &scratch)
	if err != nil {
		return b, err
	}
	explicit := d.Gas
	if comp, ok := compositionOfModel(model); ok && d.Gas.RelativeHumidity != nil {
		if explicit, _, err = s.rebuiltGas(d.Gas, comp, comp.MoleFractions(), d.SuctionTemperature, d.SuctionPressure); err != nil {
			return b, err
		}
	}
	return sectionBase{gas0: d.Gas, explicit: explicit, model: model, suction: suction, mdot: mdot, p2: p2, eff: eff, estimate: estimate, method: method,
		notes: append(notes.methods, scratch.Methods...)}, nil
}

// intercoolingOf checks the intercooling and fills its defaults.
func intercoolingOf(d SectionDuty, arr string, prov *Provenance) (Intercooling, error) {
	var ic Intercooling
	if d.Intercooling != nil {
		ic = *d.Intercooling
	}
	given := d.Intercooling != nil && (ic.AfterStagesGiven || ic.AfterStages != nil)
	if !given {
		ic.AfterStages = nil
		if arr == "geared" {
			ic.AfterStages = []int{-1} // after every stage but the last, filled per count
			prov.Defaults = append(prov.Defaults, Default{Field: "intercooling.after_stages", Value: "every stage but the last",
				Note: "geared sections are cooled between all stages by default"})
		} else {
			prov.Defaults = append(prov.Defaults, Default{Field: "intercooling.after_stages", Value: "none",
				Note: "inline sections are not cooled between stages by default"})
		}
	}
	seen := map[int]bool{}
	for i, k := range ic.AfterStages {
		if k == -1 && !given {
			continue
		}
		field := "intercooling.after_stages." + strconv.Itoa(i)
		if k < 1 || k >= MaxSectionStages {
			return ic, fieldErr(field, reason("after_stages", fmt.Sprintf("a cooler sits after stage 1 to %d of the section (stages are numbered from 1; none after the last)", MaxSectionStages-1), float64(k)))
		}
		if d.StageCount != nil && k >= *d.StageCount {
			return ic, fieldErr(field, reason("after_stages", fmt.Sprintf(
				"stage %d is not followed by another of the %d stages: a cooler after the last stage is an aftercooler, not part of the section", k, *d.StageCount), float64(k)))
		}
		if seen[k] {
			return ic, shapeErr(field, fmt.Errorf("stage %d is listed twice", k))
		}
		seen[k] = true
	}
	sort.Ints(ic.AfterStages)
	needsCooler := len(ic.AfterStages) > 0
	if needsCooler && ic.OutletTemperature == nil && ic.Approach == nil {
		t := d.SuctionTemperature
		ic.OutletTemperature = &t
		prov.Defaults = append(prov.Defaults, Default{Field: "intercooling.outlet_temperature", Value: strconv.FormatFloat(t, 'f', 2, 64) + " K",
			Note: "coolers return the gas to the section's suction temperature (give outlet_temperature or approach with coolant_temperature)"})
	}
	if needsCooler && !(ic.PressureDrop >= 0) || math.IsInf(ic.PressureDrop, 0) {
		return ic, fieldErr("intercooling.pressure_drop", reason("pressure_drop", "the cooler pressure drop must be a finite pressure of at least 0 Pa", ic.PressureDrop))
	}
	return ic, nil
}

// coolerAfter returns the cooler after stage k of n, or nil.
func coolerAfter(ic Intercooling, k, n int) *MachineCooler {
	for _, a := range ic.AfterStages {
		if a == k || (a == -1 && k < n) {
			return &MachineCooler{AfterStage: k, OutletTemperature: ic.OutletTemperature, Approach: ic.Approach,
				CoolantTemperature: ic.CoolantTemperature, PressureDrop: ic.PressureDrop}
		}
	}
	return nil
}

// Convergence of the equal-head split.
const (
	splitTolerance = 1e-9 // relative on the final pressure
	splitMaxIter   = 60
	splitPasses    = 4 // efficiency updates with an estimated efficiency
)

// designSection sizes a section of n stages.
func (s *Service) designSection(ctx context.Context, d SectionDuty, b sectionBase, arr string, ic Intercooling, n int) (SectionResult, error) {
	effs := make([]path.Efficiency, n)
	for i := range effs {
		effs[i] = b.eff
	}
	var res SectionResult
	var plans []sectionPlan
	var err error
	hint := 0.0 // the head per stage of the previous pass
	for pass := range splitPasses {
		plans, hint, err = s.splitEqualHead(ctx, b, ic, effs, n, hint)
		if err != nil {
			return res, err
		}
		res, err = s.sizeStages(ctx, d, ic, b.p2, plans, 0)
		if err != nil {
			return res, err
		}
		if !b.estimate {
			break
		}
		moved := 0.0
		for i, st := range res.Stages {
			moved = math.Max(moved, math.Abs(st.Path.PolytropicEfficiency-effs[i].Value))
			effs[i] = path.Efficiency{Basis: path.Polytropic, Value: st.Path.PolytropicEfficiency}
		}
		if moved < 1e-4 || pass == splitPasses-1 {
			break
		}
	}
	if arr == "inline" && d.Speed == nil {
		// One speed for all: the geometric mean of the speeds the stages
		// take on their own at the speed target (default specific speed),
		// so that no stage's specific speed is further from the target than
		// the square root of the ratio of the extreme stage speeds.
		lg := 0.0
		for _, st := range res.Stages {
			lg += math.Log(st.Speed)
		}
		speed := math.Exp(lg / float64(n))
		if d.SpeedStep != nil {
			step := *d.SpeedStep
			speed = math.Max(step, math.Round(speed/step)*step)
		}
		res, err = s.sizeStages(ctx, d, ic, b.p2, plans, speed)
		if err != nil {
			return res, err
		}
		res.Provenance.Methods = append(res.Provenance.Methods, Method{Subject: "shaft speed (inline)",
			Name:   fmt.Sprintf("%.0f rev/min: the geometric mean of the speeds the %d stages would take alone at the speed target, so that the stages share the departure from it", speed, n),
			Source: "common practice, no source"})
	}
	res.StageCount = n
	if err := s.sectionTotals(d, arr, ic, &res); err != nil {
		return res, err
	}
	res.Split = fmt.Sprintf("equal polytropic head per stage (%d stages, %.0f J/kg each at the efficiencies of the sized stages)", n, res.PolytropicHead/float64(n))
	return res, nil
}

// splitEqualHead finds the discharge pressures that give every stage the
// same polytropic head h, each stage's suction being the previous
// discharge after its cooler, and the last discharge the duty's: the
// final pressure rises monotonically with h, so h is found by the
// Illinois variant of regula falsi.
func (s *Service) splitEqualHead(ctx context.Context, b sectionBase, ic Intercooling, effs []path.Efficiency, n int, hint float64) ([]sectionPlan, float64, error) {
	target := b.p2
	march := func(h float64) ([]sectionPlan, float64, error) {
		plans := make([]sectionPlan, 0, n)
		g, m, st, mdot := b.gas0, b.model, b.suction, b.mdot
		for k := 1; k <= n; k++ {
			if err := ctx.Err(); err != nil {
				return nil, 0, err
			}
			p2, comp, err := pressureForHead(m, st, h, effs[k-1], b.method)
			if err != nil {
				return nil, 0, err
			}
			pl := sectionPlan{gas: g, model: m, suction: st, mdot: mdot, p2: p2}
			if c := coolerAfter(ic, k, n); c != nil {
				out, err := s.coolWith(*c, g, m, comp.Discharge, mdot, false)
				if err != nil {
					return nil, 0, prefixField(err, "intercooling.")
				}
				pl.cooler, pl.cIn = &out, comp.Discharge
				g, m, st, mdot = out.Gas, out.Model, out.State, out.MassFlow
			} else {
				st = comp.Discharge
				if k == 1 {
					g = b.explicit
				}
			}
			plans = append(plans, pl)
		}
		return plans, float64(plans[n-1].p2), nil
	}
	// Bracket: the head of one path over the whole ratio split n ways is a
	// first guess (or the previous pass's head, hint, within 1 %); cooling
	// lowers the head needed, so it brackets from above after at most a few
	// doublings.
	hLo, hHi := 0.0, hint*1.01
	fLo := math.Log(float64(b.suction.Pressure) / target)
	var plans []sectionPlan
	var fHi float64
	bracketed := false
	if hint > 0 {
		pl, p, err := march(hint * 0.99)
		if err != nil {
			return nil, 0, err
		}
		if f := math.Log(p / target); f < 0 {
			hLo, fLo = hint*0.99, f
		} else {
			hHi, fHi, plans, bracketed = hint*0.99, f, pl, true
		}
	} else {
		whole, err := path.Compression(b.model, b.suction, physics.Pascal(target), b.eff, b.method)
		if err != nil {
			return nil, 0, compressionError(err, "efficiency", StageDuty{DischargePressure: &target})
		}
		hHi = float64(whole.PolytropicHead) / float64(n)
	}
	for i := 0; i < 20 && !bracketed; i++ {
		var p float64
		var err error
		if plans, p, err = march(hHi); err != nil {
			return nil, 0, err
		}
		if fHi = math.Log(p / target); fHi >= 0 {
			break
		}
		hLo, fLo = hHi, fHi
		hHi *= 1.5
	}
	if fHi < 0 {
		return nil, 0, fieldErr("discharge_pressure", reason("discharge_pressure", "the section cannot reach the discharge pressure with these coolers (their pressure drops take more than the stages make)", target))
	}
	side := 0
	for range splitMaxIter {
		if math.Abs(fHi) < splitTolerance {
			return plans, hHi, nil
		}
		h := hHi - fHi*(hHi-hLo)/(fHi-fLo)
		if !(h > hLo && h < hHi) {
			h = 0.5 * (hLo + hHi)
		}
		pl, p, err := march(h)
		if err != nil {
			return nil, 0, err
		}
		f := math.Log(p / target)
		if math.Abs(f) < splitTolerance {
			return pl, h, nil
		}
		if f > 0 {
			hHi, fHi, plans = h, f, pl
			if side == 1 {
				fLo /= 2
			}
			side = 1
		} else {
			hLo, fLo = h, f
			if side == -1 {
				fHi /= 2
			}
			side = -1
		}
	}
	return plans, hHi, nil // closest from above; the stage sizing uses its pressures as they are
}

// pressureForHead returns the discharge pressure at which a stage from
// suction st makes polytropic head h: secant steps on ln(p2/p1) from the
// isothermal estimate ln r = h/(p/ρ), which overestimates the ratio.
func pressureForHead(m gas.Model, st gas.State, h float64, eff path.Efficiency, method path.Method) (float64, path.Result, error) {
	p1 := float64(st.Pressure)
	if h <= 0 {
		h = 1e-9 * p1 / float64(st.Density)
	}
	rt := p1 / float64(st.Density)
	var last path.Result
	head := func(x float64) (float64, error) {
		r, err := path.Compression(m, st, physics.Pascal(p1*math.Exp(x)), eff, method)
		if err != nil {
			return 0, fieldErr("discharge_pressure", fmt.Errorf("stage split: %w", err))
		}
		last = r
		return float64(r.PolytropicHead) - h, nil
	}
	x0 := h / rt
	x1 := 0.8 * x0
	f0, err := head(x0)
	if err != nil {
		return 0, last, err
	}
	f1, err := head(x1)
	if err != nil {
		return 0, last, err
	}
	for range 40 {
		if math.Abs(f1) < 1e-10*h || f1 == f0 {
			break
		}
		x2 := x1 - f1*(x1-x0)/(f1-f0)
		if !(x2 > 0) {
			x2 = 0.5 * x1
		}
		x0, f0 = x1, f1
		x1 = x2
		if f1, err = head(x1); err != nil {
			return 0, last, err
		}
	}
	return p1 * math.Exp(x1), last, nil
}

// sizeStages sizes every planned stage with SizeStage; speed > 0 turns
// every stage at that speed (inline).
func (s *Service) sizeStages(ctx context.Context, d SectionDuty, ic Intercooling, target float64, plans []sectionPlan, speed float64) (SectionResult, error) {
	var res SectionResult
	n := len(plans)
	for k, pl := range plans {
		sd := d.StageDuty
		if k > 0 {
			sd.Gas = pl.gas
		}
		suction := pl.suction
		if k > 0 && plans[k-1].cooler == nil {
			suction = res.Stages[k-1].Path.Discharge // the stage before as sized
		}
		sd.SuctionPressure, sd.SuctionTemperature = float64(suction.Pressure), float64(suction.Temperature)
		p2, mdot := pl.p2, pl.mdot
		if k == n-1 {
			p2 = target
		}
		sd.DischargePressure, sd.PressureRatio = &p2, nil
		sd.MassFlow, sd.ActualVolumeFlow, sd.StandardVolumeFlow, sd.StandardReference = &mdot, nil, nil, ""
		sd.Driver = nil
		if sd.MechanicalLosses != nil {
			one := 1.0
			sd.MechanicalEfficiency, sd.MechanicalLosses = &one, nil
		}
		if speed > 0 {
			v := speed
			sd.Speed, sd.TipDiameter, sd.SpeedTarget, sd.SpeedStep = &v, nil, nil, nil
		}
		delete(sd.LimitOverrides, "driver-margin")
		st, err := s.SizeStage(ctx, sd)
		if err != nil {
			return res, sectionStageErr(err, k+1)
		}
		res.Stages = append(res.Stages, st)
		if pl.cooler != nil {
			// The cooler again from the stage's discharge as sized (the
			// outlet depends only on its temperature and pressure; the duty
			// on the inlet too).
			c := coolerAfter(ic, k+1, n)
			out, err := s.cool(*c, sd.Gas, pl.model, st.Path.Discharge, mdot)
			if err != nil {
				return res, prefixField(err, "intercooling.")
			}
			res.Coolers = append(res.Coolers, SectionCooler{AfterStage: k + 1, Inlet: st.Path.Discharge, Outlet: out.State,
				Duty: out.Duty, Condensate: out.Condensate})
			for _, w := range out.Warnings {
				w.Message = fmt.Sprintf("cooler after stage %d: %s", k+1, w.Message)
				res.Warnings = append(res.Warnings, SectionWarning{Warning: w, Stage: k + 1})
			}
		}
	}
	return res, nil
}

// sectionStageErr keeps an error's field (it is the section duty's field too)
// and says which stage it came from.
func sectionStageErr(err error, k int) error {
	var ie *InputError
	if errors.As(err, &ie) {
		cp := *ie
		cp.Err = fmt.Errorf("stage %d of the section: %w", k, ie.Err)
		return &cp
	}
	return err
}
