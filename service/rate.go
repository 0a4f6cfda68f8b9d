package service

import (
	"context"
	"errors"
	"fmt"
	"math"
	"strconv"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/limits"
	"stagewright/physics/offdesign"
)

// RateDuty is an operating point of an installed machine, SI (Pa absolute,
// K, kg/s, m3/s, rev/min): the machine, the gas and suction state, exactly
// one flow (mass, actual volume at suction, or standard volume with its
// reference) and exactly one of Speed (the first stage's, rev/min) or
// DischargePressure (the speed that makes it is solved for).
type RateDuty struct {
	Machine            Machine  `json:"machine"`
	Gas                GasInput `json:"gas"`
	SuctionPressure    float64  `json:"suction_pressure"`
	SuctionTemperature float64  `json:"suction_temperature"`
	MassFlow           *float64 `json:"mass_flow,omitempty"`
	ActualVolumeFlow   *float64 `json:"actual_volume_flow,omitempty"`
	StandardVolumeFlow *float64 `json:"standard_volume_flow,omitempty"`
	StandardReference  string   `json:"standard_reference,omitempty"`
	Speed              *float64 `json:"speed,omitempty"`
	DischargePressure  *float64 `json:"discharge_pressure,omitempty"`
}

// OperatingPoint places a rating on the machine's estimated map. Flows
// are actual volume flows at the machine's (first stage's) suction, m3/s.
type OperatingPoint struct {
	// FlowCoefficient is the first stage's φ = Q01/(U2 π D2²/4).
	FlowCoefficient float64
	// DesignFlowRatio is Q over the design volume flow at the same speed
	// ratio, Q_design N/N_design (first stage).
	DesignFlowRatio float64
	// SurgeMargin is Q/Q_surge − 1 at this speed (estimated), the least
	// over the stages.
	SurgeMargin float64
	// ChokeMargin is 1 − Q/Q_choke at this speed (estimated), the least
	// over the stages.
	ChokeMargin float64
	// SurgeFlow and ChokeFlow are the machine inlet volume flows, m3/s, at
	// which the first stage to reach each does so at this speed (the later
	// stages' inlet states held at this point's); SurgeStage and ChokeStage
	// name it (1-based), ChokePassage the passage that chokes.
	SurgeFlow, ChokeFlow   float64
	SurgeStage, ChokeStage int
	ChokePassage           string
}

// StageRating is one stage of a rated machine.
type StageRating struct {
	// Stage is the stage number, from 1.
	Stage int
	// Speed is this stage's speed, rev/min.
	Speed float64
	// Suction is the stage's suction stagnation state; MassFlow and
	// VolumeFlow the flows entering it (kg/s, m3/s).
	SuctionPressure, SuctionTemperature float64
	MassFlow, VolumeFlow                float64
	// Point is the off-design solution (velocities, heads, efficiencies,
	// the compression path).
	Point offdesign.Point
	// GasPower is ṁ w, W.
	GasPower float64
	// DesignFlowRatio, SurgeMargin, ChokeMargin as OperatingPoint, for
	// this stage; SurgeFlow and ChokeFlow this stage's inlet volume flows,
	// m3/s.
	DesignFlowRatio, SurgeMargin, ChokeMargin float64
	SurgeFlow, ChokeFlow                      float64
	ChokePassage                              string
	// Cooler is the cooler after the stage, nil when none.
	Cooler *CoolerRating
}

// CoolerRating is a cooler's outlet and what it removed.
type CoolerRating struct {
	OutletPressure, OutletTemperature float64
	// Condensate is the mass flow of liquid removed, kg/s; Duty the heat
	// removed, W.
	Condensate, Duty float64
}

// Rating is a machine rated at one operating point.
type Rating struct {
	// Speed is the first stage's speed, rev/min; SpeedBasis "given" or
	// "discharge-pressure" (solved).
	Speed      float64
	SpeedBasis string
	// MassFlow at suction, kg/s; ActualVolumeFlow at suction, m3/s.
	MassFlow, ActualVolumeFlow float64
	StandardFlows              StandardFlows
	// Discharge is the machine's discharge stagnation state.
	DischargePressure, DischargeTemperature float64
	// PolytropicHead and IsentropicHead, J/kg, summed over the stages;
	// the efficiencies are the summed heads over the summed work.
	PolytropicHead, IsentropicHead             float64
	PolytropicEfficiency, IsentropicEfficiency float64
	// Work is the summed actual specific work, J/kg.
	Work float64
	// Power: gas and shaft power, W; the mechanical efficiency; the
	// driver rating (installed or default) and its margin over shaft power.
	Power          Power
	OperatingPoint OperatingPoint
	Stages         []StageRating
	// SpeedRange is the machine's speed range as used (given or default).
	SpeedRange SpeedRange
	// DesignSpeed is the first stage's design speed, rev/min; DesignShaftPower
	// the machine's shaft power at its design point, W.
	DesignSpeed, DesignShaftPower float64
	Assessments                   []limits.Assessment
	Warnings                      []Warning
	Verdict                       string
	Provenance                    Provenance
	Cautions                      []string
}

// RateMachine rates machine d.Machine at one operating point: each stage
// from its geometry and design point by the off-design model (Euler work
// with slip at any flow, efficiency from the map method, choke and surge
// estimates), stacked stage after stage (each stage's suction the previous
// outlet after its cooler; every stage at its design speed ratio to the
// first); the first stage's speed given, or solved for the discharge
// pressure by a bracketed root search.
func (s *Service) RateMachine(ctx context.Context, d RateDuty) (Rating, error) {
	if err := ctx.Err(); err != nil {
		return Rating{}, err
	}
	var r Rating
	prov := &r.Provenance
	prov.ModelVersion = ModelVersion
	prov.ServiceVersion = s.version
	prov.InputHash = hashOf(d)
	pm, err := s.prepareMachine(d.Machine, prov)
	if err != nil {
		return Rating{}, err
	}
	if d.MassFlow == nil && d.ActualVolumeFlow == nil && d.StandardVolumeFlow == nil {
		return Rating{}, shapeErr("flow", errors.New("give exactly one of flow.mass, flow.actual_volume and flow.standard_volume"))
	}
	op, err := s.operatingGas(d.Gas, d.SuctionTemperature, d.SuctionPressure, d.MassFlow, d.ActualVolumeFlow, d.StandardVolumeFlow, d.StandardReference, prov)
	if err != nil {
		return Rating{}, err
	}
	r.Warnings = append(r.Warnings, op.notes.warnings...)
	n1d := pm.stages[0].speed
	var n1 float64
	switch {
	case d.Speed != nil && d.DischargePressure != nil:
		return Rating{}, shapeErr("speed", errors.New("give speed or discharge_pressure, not both: the speed that makes a discharge pressure is solved for"))
	case d.Speed != nil:
		n1 = *d.Speed
		if err := checkSpeed(pm, n1, "speed"); err != nil {
			return Rating{}, err
		}
		r.SpeedBasis = "given"
	case d.DischargePressure != nil:
		p2 := *d.DischargePressure
		if !(p2 > d.SuctionPressure) || math.IsInf(p2, 0) {
			return Rating{}, fieldErr("discharge_pressure", reason("discharge_pressure", fmt.Sprintf(
				"the discharge pressure (%.6g Pa) must exceed the suction pressure (%.6g Pa)", p2, d.SuctionPressure), p2))
		}
		if n1, err = s.speedForPressure(ctx, pm, op, p2); err != nil {
			return Rating{}, err
		}
		r.SpeedBasis = "discharge-pressure"
		prov.Methods = append(prov.Methods, Method{Subject: "speed", Name: "first stage's speed for the discharge pressure by a bracketed root search (Illinois regula falsi) between 30 % and 150 % of the design speed",
			Source: "Dowell & Jarratt, BIT 11:168 (1971) (Illinois method)"})
	default:
		return Rating{}, shapeErr("speed", errors.New("give speed (rev/min) or discharge_pressure (Pa absolute)"))
	}
	st, err := s.stack(ctx, pm, op, n1, true)
	if err != nil {
		return Rating{}, err
	}
	r.Speed = n1
	r.MassFlow, r.ActualVolumeFlow = op.mdot, op.mdot/float64(op.suction.Density)
	r.StandardFlows = standardFlows(op.model, op.mdot)
	r.SpeedRange = pm.speedRange
	r.DesignSpeed = n1d
	r.DesignShaftPower = pm.designShaft
	fillRating(&r, pm, st)
	prov.GasModel = op.model.Name()
	prov.Methods = append(prov.Methods, op.notes.methods...)
	prov.Methods = append(prov.Methods, machineMethods(pm)...)
	if err := s.assessRating(pm, d, &r); err != nil {
		return Rating{}, err
	}
	r.Cautions = ratingCautions(op.model, &r)
	if !ratingFinite(&r) {
		return Rating{}, fieldErr("flow", reason("flow", "the rating gave no finite result at this operating point", op.mdot))
	}
	return r, nil
}

// operating is the gas and flow of a rating request.
type operating struct {
	gasIn   GasInput
	model   gas.Model
	suction gas.State
	mdot    float64
	notes   gasNotes
}

func (s *Service) operatingGas(g GasInput, t, p float64, mass, actual, std *float64, ref string, prov *Provenance) (operating, error) {
	if err := suctionInRange(p, t, "suction.pressure", "suction.temperature"); err != nil {
		return operating{}, err
	}
	model, notes, err := s.gasModel(g, t, p)
	if err != nil {
		return operating{}, err
	}
	suction, err := fullState(model, physics.Kelvin(t), physics.Pascal(p))
	if err != nil {
		return operating{}, suctionError(err, StageDuty{})
	}
	if suction.Phase == gas.PhaseLiquid || suction.Phase == gas.PhaseTwoPhase {
		return operating{}, fieldErr("suction.temperature", reason("suction", fmt.Sprintf(
			"the gas is %s at suction (%.2f K, %.0f Pa): a compressor needs a dry gas at suction", suction.Phase, t, p), t))
	}
	op := operating{gasIn: g, model: model, suction: suction, notes: notes}
	if mass == nil && actual == nil && std == nil {
		return op, nil // the map takes no flow
	}
	op.mdot, err = massFlow(StageDuty{MassFlow: mass, ActualVolumeFlow: actual, StandardVolumeFlow: std, StandardReference: ref}, model, suction, prov)
	return op, err
}

// checkSpeed refuses a first-stage speed outside any physical range of
// the machine.
func checkSpeed(pm *preparedMachine, n1 float64, field string) error {
	n1d := pm.stages[0].speed
	if !(n1 >= minSpeedFraction*n1d && n1 <= maxSpeedFraction*n1d) {
		return fieldErr(field, reason(field, fmt.Sprintf("the speed of %.6g rev/min lies outside what the machine model covers: %.0f to %.0f rev/min (%.0f %% to %.0f %% of the design speed %.0f rev/min)",
			n1, minSpeedFraction*n1d, maxSpeedFraction*n1d, 100*minSpeedFraction, 100*maxSpeedFraction, n1d), n1))
	}
	for _, ps := range pm.stages {
		u2 := math.Pi * float64(ps.st.TipDiameter) * n1 * ps.ratio / 60
		if u2 > maxTipSpeed {
			return fieldErr(field, reason(field, fmt.Sprintf("at %.6g rev/min stage %d's tip speed would be %.0f m/s, beyond any impeller (at most %.0f m/s evaluated)", n1, ps.index+1, u2, maxTipSpeed), n1))
		}
	}
	return nil
}

// stacked is the machine evaluated stage after stage.
type stacked struct {
	stages []StageRating
	// discharge is the last stage's outlet (before any aftercooler).
	discharge gas.State
	mdotOut   float64
}

// stack evaluates the machine at first-stage speed n1: stage k's suction
// is stage k−1's outlet after its cooler. With margins it also estimates
// each stage's surge and choke flows at its speed.
func (s *Service) stack(ctx context.Context, pm *preparedMachine, op operating, n1 float64, margins bool) (stacked, error) {
	var out stacked
	in, mdot, gasIn, model := op.suction, op.mdot, op.gasIn, op.model
	for k, ps := range pm.stages {
		if err := ctx.Err(); err != nil {
			return out, err
		}
		line, err := ps.lineFor(model, in, n1)
		if err != nil {
			return out, stageErr(ps.field, err)
		}
		p, err := line.At(mdot)
		if err != nil {
			if errors.Is(err, offdesign.ErrPastChoke) {
				if !margins { // a search step: the choke flow itself is not needed
					mc, passage := line.MaxFlow()
					return out, s.chokeProblemAt(mc, passage, in, mdot, k, len(pm.stages))
				}
				return out, s.chokeProblem(line, in, mdot, k, len(pm.stages))
			}
			return out, fieldErr("flow", fmt.Errorf("stage %d: %w", k+1, err))
		}
		sr := StageRating{Stage: k + 1, Speed: n1 * ps.ratio, SuctionPressure: float64(in.Pressure), SuctionTemperature: float64(in.Temperature),
			MassFlow: mdot, VolumeFlow: mdot / float64(in.Density), Point: p, GasPower: mdot * float64(p.Compression.Work)}
		qd := ps.designMass / float64(ps.design.Compression.Suction.Density)
		sr.DesignFlowRatio = sr.VolumeFlow / (qd * ps.ratio * n1 / ps.speed)
		if margins {
			ms, err := line.Surge()
			if err != nil {
				return out, fieldErr("flow", fmt.Errorf("stage %d surge estimate: %w", k+1, err))
			}
			mc, passage, err := line.Choke()
			if err != nil {
				return out, fieldErr("flow", fmt.Errorf("stage %d choke estimate: %w", k+1, err))
			}
			if !(mdot < mc) {
				return out, s.chokeProblemAt(mc, passage, in, mdot, k, len(pm.stages))
			}
			sr.SurgeFlow, sr.ChokeFlow = ms/float64(in.Density), mc/float64(in.Density)
			sr.SurgeMargin, sr.ChokeMargin, sr.ChokePassage = mdot/ms-1, 1-mdot/mc, passage
		}
		out.discharge = p.Compression.Discharge
		in = p.Compression.Discharge
		if c, ok := pm.coolers[k+1]; ok && k+1 < len(pm.stages) {
			cr, next, nextMass, nextGas, nextModel, err := s.coolBetween(c, gasIn, model, in, mdot, k)
			if err != nil {
				return out, err
			}
			sr.Cooler = &cr
			in, mdot, gasIn, model = next, nextMass, nextGas, nextModel
		}
		out.stages = append(out.stages, sr)
	}
	out.mdotOut = mdot
	return out, nil
}

// chokeProblem is the 422 of a flow past a stage's choke, with the choke
// flow in the message.
func (s *Service) chokeProblem(line *offdesign.Line, in gas.State, mdot float64, k, n int) error {
	mc, passage, err := line.Choke()
	if err != nil {
		mc, passage = line.MaxFlow()
	}
	return s.chokeProblemAt(mc, passage, in, mdot, k, n)
}

func (s *Service) chokeProblemAt(mc float64, passage string, in gas.State, mdot float64, k, n int) error {
	who := "the machine"
	if n > 1 {
		who = "stage " + strconv.Itoa(k+1)
	}
	q, qc := mdot/float64(in.Density), mc/float64(in.Density)
	return fieldErr("flow", reason("flow", fmt.Sprintf(
		"the flow of %.5g m3/s (%.5g kg/s) at %s's suction is past its estimated choke flow of %.5g m3/s (%.5g kg/s; %s) at this speed: lower the flow or raise the speed (the choke flow is an estimate)",
		q, mdot, who, qc, mc, passageText(passage)), q))
}

func passageText(p string) string {
	switch p {
	case offdesign.ChokeEye:
		return "sonic flow in the impeller eye"
	case offdesign.ChokeDiffuserThroat:
		return "sonic flow in the vaned diffuser throat"
	case offdesign.ChokeZeroWork:
		return "the impeller's work and head fall to zero there, before any passage is sonic"
	}
	return "sonic flow in the inducer throat"
}

// coolBetween takes the gas through the cooler after stage k (0-based)
// with the section's cooler model (cool: outlet temperature, pressure
// drop, condensate removed by a flash at the outlet).
func (s *Service) coolBetween(c MachineCooler, g GasInput, m gas.Model, in gas.State, mdot float64, k int) (CoolerRating, gas.State, float64, GasInput, gas.Model, error) {
	out, err := s.coolWith(c, g, m, in, mdot, false) // its warnings are not reported by a rating
	if err != nil {
		var ie *InputError
		if errors.As(err, &ie) {
			cp := *ie
			cp.Field = "machine.coolers"
			cp.Err = fmt.Errorf("the cooler after stage %d (%s): %w", c.AfterStage, ie.Field, ie.Err)
			return CoolerRating{}, in, mdot, g, m, &cp
		}
		return CoolerRating{}, in, mdot, g, m, err
	}
	cr := CoolerRating{OutletPressure: float64(out.State.Pressure), OutletTemperature: float64(out.State.Temperature),
		Condensate: out.Condensate, Duty: out.Duty}
	return cr, out.State, out.MassFlow, out.Gas, out.Model, nil
}

// fillRating sums the stacked stages into the rating.
func fillRating(r *Rating, pm *preparedMachine, st stacked) {
	r.Stages = st.stages
	var hp, hs, w float64
	gp := 0.0
	for _, sr := range st.stages {
		c := sr.Point.Compression
		hp += float64(c.PolytropicHead)
		hs += float64(c.IsentropicHead)
		w += float64(c.Work)
		gp += sr.GasPower
	}
	r.PolytropicHead, r.IsentropicHead, r.Work = hp, hs, w
	r.PolytropicEfficiency, r.IsentropicEfficiency = hp/w, hs/w
	r.DischargePressure, r.DischargeTemperature = float64(st.discharge.Pressure), float64(st.discharge.Temperature)
	shaft := gp / pm.mechEff
	// The margin to 9 significant digits: the default rating is exactly
	// 1.10 × the design shaft power, which the design point must not grade
	// as below 1.10 by the solver's last digits.
	margin := pm.driverRating / shaft
	if e := math.Floor(math.Log10(margin)); physics.Finite(e) {
		scale := math.Pow(10, 8-e)
		if r := math.Round(margin*scale) / scale; physics.Finite(scale, r) {
			margin = r // a rating of 1e-300 W would scale past float64
		}
	}
	r.Power = Power{Gas: gp, Shaft: shaft, MechanicalEfficiency: pm.mechEff, DriverRating: pm.driverRating, DriverMargin: margin}
	first := st.stages[0]
	opp := OperatingPoint{FlowCoefficient: first.Point.FlowCoefficient, DesignFlowRatio: first.DesignFlowRatio,
		SurgeMargin: math.Inf(1), ChokeMargin: math.Inf(1)}
	for _, sr := range st.stages {
		if sr.SurgeFlow == 0 {
			continue
		}
		if sr.SurgeMargin < opp.SurgeMargin {
			opp.SurgeMargin, opp.SurgeStage = sr.SurgeMargin, sr.Stage
		}
		if sr.ChokeMargin < opp.ChokeMargin {
			opp.ChokeMargin, opp.ChokeStage, opp.ChokePassage = sr.ChokeMargin, sr.Stage, sr.ChokePassage
		}
	}
	if opp.SurgeStage > 0 {
		q := r.ActualVolumeFlow
		opp.SurgeFlow = q / (1 + opp.SurgeMargin)
		opp.ChokeFlow = q / (1 - opp.ChokeMargin)
	} else {
		opp.SurgeMargin, opp.ChokeMargin = 0, 0
	}
	r.OperatingPoint = opp
}

// machineMethods lists the off-design methods with their sources.
func machineMethods(pm *preparedMachine) []Method {
	ms := []Method{
		{Subject: "off-design work", Name: "Euler work with slip, backsweep and inlet whirl at the operating flow; impeller exit density from the off-design compression, iterated (secant) with the exit continuity",
			Source: "Dixon & Hall, Fluid Mechanics and Thermodynamics of Turbomachinery, 7th ed. (2014), eq. 7.1 and §7.9; continuity with blockage as in the stage sizing"},
		{Subject: "off-design efficiency", Name: "efficiency relative to each speed line's peak in the flow relative to the peak flow (gentle towards surge, falling to zero at choke), the peak at the design point scaled with the tip Mach number; the peak follows the choke flow at high tip Mach number",
			Source: "after Casey & Robinson, ASME J. Turbomach. 135(2):021034 (2013); the expressions and coefficients are from memory, not checked against the paper"},
		{Subject: "choke (estimate)", Name: "sonic relative flow in the inducer throat A1 cos(beta1) from the relative stagnation state at the rms radius (rothalpy), or sonic absolute flow in the eye; for a vaned diffuser also sonic flow in its throat from the impeller exit stagnation state",
			Source: "Dixon & Hall (2014), §7.5 (inducer choking) and ch. 1 (choked flow, any gas by the sonic point of the isentrope)"},
		{Subject: "surge (estimate)", Name: "critical absolute flow angle at the diffuser inlet, 75 deg from radial (or 5 deg above the design angle); real surge lines scatter by some ±10-15 % in flow about any such criterion",
			Source: "Senoo & Kinoshita, ASME J. Fluids Eng. 99:98 (1977), critical angles of 70-80 deg (from memory); uncertainty band: Casey & Robinson (2013) and common practice, no source"},
		{Subject: "compression path", Name: "discharge for the off-design work at the map efficiency: polytropic stepwise path of the same gas model as the sizing",
			Source: "Huntington, ASME J. Eng. Gas Turbines Power 107:872 (1985) (stepwise path); Schultz (1962) and ASME PTC 10-1997"},
	}
	if len(pm.stages) > 1 {
		ms = append(ms, Method{Subject: "stacking", Name: "stage after stage: each stage's suction is the previous stage's outlet (after its cooler); every stage at its design speed ratio to the first stage",
			Source: "stage stacking, e.g. Dixon & Hall (2014) ch. 5 (multistage matching, from memory)"})
	}
	return ms
}

// assessRating grades the rating: the stage limit rules at the operating
// point, surge and choke margins, the speed range and the driver.
func (s *Service) assessRating(pm *preparedMachine, d RateDuty, r *Rating) error {
	var checks []check
	label := make([]string, 0)
	multi := len(r.Stages) > 1
	svc := limits.Service(d.Gas.Service)
	if svc == "" {
		svc = limits.DefaultService
	}
	dischargeT, err := limits.DischargeTemperature(svc)
	if err != nil {
		return shapeErr("gas.service", err)
	}
	for k, sr := range r.Stages {
		ps := pm.stages[k]
		build := limits.Construction(ps.construction)
		if build == "" {
			build = limits.DefaultBuild
		}
		tip, err := limits.TipSpeed(build)
		if err != nil {
			return shapeErr(ps.field+".construction", err)
		}
		p := sr.Point
		pr := float64(p.Compression.Discharge.Pressure) / sr.SuctionPressure
		cs := []check{
			{tip, p.TipSpeed},
			{limits.MachineMach(), p.TipMach},
			{limits.InducerRelativeMach(), p.InletRelativeMachShroud},
			{limits.DiffuserInletMach(ps.vaned), p.ExitAbsoluteMach},
			{dischargeT, float64(p.Compression.Discharge.Temperature)},
			{limits.StagePressureRatio(build), pr},
		}
		if !ps.vaned {
			cs = append(cs, check{limits.DiffuserFlowAngle(), p.ExitFlowAngle})
		}
		if build == limits.ClosedSteel {
			cs = append(cs, check{limits.ClosedImpellerHead(), float64(p.Compression.PolytropicHead)})
		}
		prefix := ""
		if multi {
			prefix = "stage " + strconv.Itoa(k+1) + ": "
		}
		for range cs {
			label = append(label, prefix)
		}
		checks = append(checks, cs...)
	}
	op := r.OperatingPoint
	mc := []check{
		{limits.SurgeMargin(), op.SurgeMargin},
		{limits.ChokeMargin(), op.ChokeMargin},
		{limits.SpeedAboveRange(), r.Speed / r.SpeedRange.MaximumContinuous},
		{limits.SpeedBelowRange(), r.Speed / r.SpeedRange.Minimum},
		{limits.DriverMarginRule(), r.Power.DriverMargin},
	}
	for range mc {
		label = append(label, "")
	}
	checks = append(checks, mc...)
	if len(d.Machine.LimitOverrides) > 0 {
		checks, err = applyOverrides(checks, d.Machine.LimitOverrides)
		if err != nil {
			var ie *InputError
			if errors.As(err, &ie) {
				ie.Field = "machine." + ie.Field
			}
			return err
		}
	}
	for i, ch := range checks {
		a, err := ch.rule.Check(ch.value)
		if err != nil {
			return fmt.Errorf("service: assess rating: %w", err)
		}
		r.Assessments = append(r.Assessments, a)
		if a.Severity == limits.OK {
			continue
		}
		msg := label[i] + a.Message()
		switch a.Rule.ID {
		case "surge-margin", "choke-margin":
			msg += " (the surge and choke flows are estimates)"
		}
		r.Warnings = append(r.Warnings, Warning{Code: a.Rule.Code, Severity: string(a.Severity), Message: msg,
			Value: a.Value, Limit: a.Level, Margin: a.Margin, Unit: a.Rule.Unit, Basis: a.Rule.Basis})
	}
	r.Verdict = verdictOf(r.Warnings)
	return nil
}

// ratingCautions are the cautions of a rating.
func ratingCautions(m gas.Model, r *Rating) []string {
	op := r.OperatingPoint
	out := []string{
		"Preliminary engineering estimate of an installed machine's off-design performance from its geometry and design point by published methods, not the manufacturer's performance curves or a guarantee: confirm every figure with the manufacturer's test and map.",
		fmt.Sprintf("Surge and choke are estimates: the estimated surge flow at this speed is %.4g m3/s and the choke flow %.4g m3/s; real surge lines scatter by some ±10-15 %% in flow about such estimates, so the anti-surge control line must come from the manufacturer's map and field tests, never from these figures.",
			op.SurgeFlow, op.ChokeFlow),
		fmt.Sprintf("Overspeed: the machine turns at %.0f rev/min here (maximum continuous %.0f rev/min); the trip speed, overspeed protection and the impellers' stress limits are set by the manufacturer and the driver standard.",
			r.Speed, r.SpeedRange.MaximumContinuous),
		fmt.Sprintf("Overpressure: the discharge reaches %.0f kPa absolute at this point and more towards surge or against a blocked outlet; relief devices and the casing's design pressure must be set per the applicable pressure codes.",
			r.DischargePressure/1e3),
		fmt.Sprintf("Discharge temperature: %.0f degC at this point; seals, materials, lubricant and downstream equipment limits govern.", r.DischargeTemperature-273.15),
	}
	out = append(out, gasHazards(m)...)
	out = append(out, "Defer to the machine's manufacturer, the applicable standards (API 617, ISO 10439 and their peers), local codes and licensed engineering practice.")
	return out
}

func ratingFinite(r *Rating) bool {
	op := r.OperatingPoint
	if !physics.Finite(r.Speed, r.MassFlow, r.ActualVolumeFlow, r.DischargePressure, r.DischargeTemperature, r.PolytropicHead, r.IsentropicHead,
		r.PolytropicEfficiency, r.IsentropicEfficiency, r.Power.Gas, r.Power.Shaft, r.Power.DriverMargin,
		op.FlowCoefficient, op.DesignFlowRatio, op.SurgeMargin, op.ChokeMargin, op.SurgeFlow, op.ChokeFlow) {
		return false
	}
	for _, w := range r.Warnings {
		if !physics.Finite(w.Value, w.Limit, w.Margin) {
			return false
		}
	}
	return true
}

// Speed search bracket, as fractions of the first stage's design speed.
const (
	speedSearchLow  = 0.30
	speedSearchHigh = 1.50
)

// speedForPressure returns the first stage's speed at which the machine
// discharges at p2: the root of p(N) − p2 by regula falsi with the
// Illinois modification in [0.3, 1.5] × the design speed (tip speed
// capped). A speed at which the flow is past choke counts as too low
// (the flow chokes first at low speed).
func (s *Service) speedForPressure(ctx context.Context, pm *preparedMachine, op operating, p2 float64) (float64, error) {
	n1d := pm.stages[0].speed
	hi := speedSearchHigh * n1d
	for _, ps := range pm.stages {
		if cap := maxTipSpeed * 60 / (math.Pi * float64(ps.st.TipDiameter) * ps.ratio); cap < hi {
			hi = cap
		}
	}
	lo := speedSearchLow * n1d
	f := func(n float64) (float64, bool, error) {
		st, err := s.stack(ctx, pm, op, n, false)
		if err != nil {
			var ie *InputError
			if errors.As(err, &ie) && ie.Field == "flow" {
				return 0, false, nil // choked or no work: too slow
			}
			return 0, false, err
		}
		return float64(st.discharge.Pressure) - p2, true, nil
	}
	fhi, ok, err := f(hi)
	if err != nil {
		return 0, err
	}
	if !ok || fhi < 0 {
		return 0, fieldErr("discharge_pressure", reason("discharge_pressure", fmt.Sprintf(
			"no speed up to %.0f rev/min (%.0f %% of the design speed) makes a discharge pressure of %.6g Pa at this flow: the machine cannot reach it", hi, 100*hi/n1d, p2), p2))
	}
	flo, okLo, err := f(lo)
	if err != nil {
		return 0, err
	}
	if okLo && flo > 0 {
		return 0, fieldErr("discharge_pressure", reason("discharge_pressure", fmt.Sprintf(
			"even at %.0f rev/min (%.0f %% of the design speed) the machine discharges above %.6g Pa at this flow: the pressure asked for is below the machine's range (throttle or recycle)", lo, 100*speedSearchLow, p2), p2))
	}
	side := 0
	x := 0.5 * (lo + hi)
	for range 80 {
		if okLo {
			x = hi - fhi*(hi-lo)/(fhi-flo)
			if !(x > lo && x < hi) {
				x = 0.5 * (lo + hi)
			}
		} else {
			x = 0.5 * (lo + hi)
		}
		fx, ok, err := f(x)
		if err != nil {
			return 0, err
		}
		switch {
		case !ok:
			lo, okLo, side = x, false, 0
			continue
		case math.Abs(fx) <= 1e-11*p2 || hi-lo <= 1e-12*n1d:
			return x, nil
		case fx > 0:
			hi, fhi = x, fx
			if side == 1 {
				flo /= 2
			}
			side = 1
		default:
			lo, flo, okLo = x, fx, true
			if side == -1 {
				fhi /= 2
			}
			side = -1
		}
	}
	return x, nil
}
