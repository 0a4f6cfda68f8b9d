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
	"stagewright/physics/path"
	"stagewright/physics/stage"
	wat "stagewright/physics/water"
)

// DefaultExitBlockage is the blocked fraction of the impeller exit area
// (blade thickness and boundary layers) used when the duty gives none:
// 0.10 (common practice, no source; blade thickness alone blocks 3-6 % of
// the circumference of a typical process impeller).
const DefaultExitBlockage = 0.10

// SizeStage sizes one centrifugal stage for duty d: the gas model and
// suction state, the compression path, the speed (given, or chosen for a
// tip diameter, a specific speed or a flow coefficient), the efficiency
// (given, or estimated from a published correlation in flow coefficient and
// tip Mach number, iterated with the sizing), the impeller geometry, power
// and driver, the limits and the cautions.
func (s *Service) SizeStage(ctx context.Context, d StageDuty) (StageResult, error) {
	if err := ctx.Err(); err != nil {
		return StageResult{}, err
	}
	var res StageResult
	prov := &res.Provenance
	prov.ModelVersion = ModelVersion
	prov.ServiceVersion = s.version
	prov.InputHash = hashOf(d)
	d.Impeller = withImpellerDefaults(d.Impeller, prov)

	if err := suctionInRange(d.SuctionPressure, d.SuctionTemperature, "suction.pressure", "suction.temperature"); err != nil {
		return StageResult{}, err
	}
	model, gasNotes, err := s.gasModel(d.Gas, d.SuctionTemperature, d.SuctionPressure)
	if err != nil {
		return StageResult{}, err
	}
	prov.GasModel = model.Name()
	prov.Methods = append(prov.Methods, gasNotes.methods...)
	prov.BinaryInteraction = interactionsUsed(model)
	res.Warnings = append(res.Warnings, gasNotes.warnings...)

	suction, err := fullState(model, physics.Kelvin(d.SuctionTemperature), physics.Pascal(d.SuctionPressure))
	if err != nil {
		return StageResult{}, suctionError(err, d)
	}
	phase, screened := suction.Phase, ""
	if ph, ok := idealPhaseScreen(model, d.SuctionTemperature, d.SuctionPressure); ok {
		phase, screened = ph, " by a Peng-Robinson stability test of the composition (the ideal model has no phases)"
	}
	if phase == gas.PhaseLiquid || phase == gas.PhaseTwoPhase {
		return StageResult{}, fieldErr("suction.temperature", reason("suction", fmt.Sprintf(
			"wet or liquid gas at suction: the gas is %s at suction (%.2f K, %.0f Pa)%s; a compressor needs a dry gas at suction; raise the suction temperature or remove the condensable components",
			phase, d.SuctionTemperature, d.SuctionPressure, screened), d.SuctionTemperature))
	}
	p2, err := dischargePressure(d)
	if err != nil {
		return StageResult{}, err
	}
	mdot, err := massFlow(d, model, suction, prov)
	if err != nil {
		return StageResult{}, err
	}
	method, err := polytropicMethod(d, prov)
	if err != nil {
		return StageResult{}, err
	}
	eff, effField, estimate, err := efficiency(d, prov)
	if err != nil {
		return StageResult{}, err
	}
	imp, err := s.impeller(d, prov)
	if err != nil {
		return StageResult{}, err
	}
	inlet, err := inletOf(d.Impeller.Inlet, prov)
	if err != nil {
		return StageResult{}, err
	}
	share, err := lossShare(d, prov)
	if err != nil {
		return StageResult{}, err
	}
	plan, err := speedPlanOf(d, prov)
	if err != nil {
		return StageResult{}, err
	}

	sv := &solver{d: d, model: model, suction: suction, p2: physics.Pascal(p2), mdot: physics.KgPerS(mdot), method: method,
		share: share, imp: imp, inlet: inlet, plan: plan, estimate: estimate, eff: eff, effField: effField}
	n, comp, sz, err := sv.run(ctx, &res)
	if err != nil {
		return StageResult{}, err
	}
	imp, eff, est := sv.imp, sv.eff, sv.est
	res.Path = comp
	res.Sizing = sz
	res.SlipFactor = imp.SlipFactor
	res.Speed = float64(n)
	res.PrewhirlAngle = inlet.PrewhirlAngle
	res.ExitBlockage = imp.ExitBlockage
	res.Impeller = imp
	if d.Impeller.SlipFactor == nil {
		res.BladeCount = d.Impeller.BladeCount
	}
	if estimate {
		res.EfficiencyEstimated = true
		res.EfficiencyInRange = est.InRange
		prov.Methods = append(prov.Methods, Method{Subject: "efficiency",
			Name:   fmt.Sprintf("polytropic efficiency %.4f estimated from flow coefficient %.4f and tip Mach number %.3f", eff.Value, sz.Coefficients.FlowCoefficient, sz.Velocities.MachineMach),
			Source: stage.EfficiencyCorrelationSource})
		prov.Defaults = append(prov.Defaults, Default{Field: "efficiency.polytropic", Value: strconv.FormatFloat(eff.Value, 'f', 4, 64),
			Note: "no efficiency given: estimated from the correlation and iterated with the sizing; " + est.Note})
		if !est.InRange {
			res.Warnings = append(res.Warnings, efficiencyRangeWarning(sz, est))
		}
	}
	prov.Methods = append(prov.Methods,
		Method{Subject: "compression path", Name: "isentropic discharge by (P,s) flash; polytropic " + method.String(),
			Source: "Schultz, ASME J. Eng. Power 84(1):69-82 (1962) and ASME PTC 10-1997 (Schultz); Huntington, ASME J. Eng. Gas Turbines Power 107:872 (1985) (stepwise path)"},
		Method{Subject: "stage sizing", Name: "Euler work with slip and power input factor; continuity at station static densities with exit blockage",
			Source: "Dixon & Hall, Fluid Mechanics and Thermodynamics of Turbomachinery, 7th ed. (2014), ch. 7; Saravanamuttoo et al., Gas Turbine Theory, 6th ed. (2009), ch. 4"})
	if sz.Geometry.EyeChoice == stage.EyeMinShroudMach {
		prov.Methods = append(prov.Methods, Method{Subject: "inducer eye",
			Name:   "eye tip diameter chosen for the least shroud relative Mach number at the mass flow (bounded one-dimensional minimisation)",
			Source: "Dixon & Hall (2014), §7 optimum design of a compressor inlet; Rodgers (from memory)"})
	}
	if d.Impeller.SlipFactor == nil {
		prov.Methods = append(prov.Methods, slipMethod(d.Impeller, imp.SlipFactor, sz.Coefficients.InletTipRatio))
	}

	if r := sz.Coefficients.ExitWidthRatio; !(r <= MaxExitWidthRatio) {
		field := "flow"
		if d.Impeller.ExitMeridionalVelocity != nil {
			field = "impeller.exit_meridional_velocity"
		}
		return StageResult{}, fieldErr(field, reason("exit width ratio", fmt.Sprintf(
			"the impeller exit would be %.3g m wide for a tip diameter of %.3g m (b2/D2 = %.3g): out of range, an impossible geometry above b2/D2 = %g; raise the exit meridional velocity or the speed, or lower the flow",
			float64(sz.Geometry.ExitWidth), float64(sz.Geometry.TipDiameter), r, MaxExitWidthRatio), r))
	}

	res.MassFlow = mdot
	res.SuctionVolumeFlow = sz.SuctionFlow
	res.StandardFlows = standardFlows(model, mdot)
	if holdsWater(model) {
		prov.Methods = append(prov.Methods, Method{Subject: "flow basis", Name: "standard volume flows of the answer on the " + WetBasis,
			Source: "ISO 13443:1996 reference conditions (the flow bases of physics/flowbasis)"})
	}
	res.Power, err = power(d, mdot, float64(comp.Work), prov)
	if err != nil {
		return StageResult{}, err
	}

	phaseWarnings, dew := checkPhases(model, []station{
		{"suction", suction, false},
		{"impeller inlet (static)", sz.Inlet.Static, true},
		{"impeller exit (static)", sz.Exit.Static, true},
		{"discharge", comp.Discharge, false},
	})
	res.Warnings = append(res.Warnings, phaseWarnings...)
	res.WaterDewPoints = WaterDewPoints{Suction: dew[0], Inlet: dew[1], ImpellerExit: dew[2], Discharge: dew[3]}
	if err := s.assess(d, &res); err != nil {
		return StageResult{}, err
	}
	res.Cautions = cautionsFor(model, d, &res)
	res.Machine = machineOf(d, &res)
	return res, nil
}

// idealPhaseScreen gives the phase of the ideal model's composition at
// (t, p): the ideal-gas model itself is always a gas and would size a
// liquid or a wet gas. Water is judged by IAPWS-IF97 (the reference the
// humidity input and the coolers use): the gas is wet when the water's
// partial pressure exceeds its saturation pressure at t by more than
// waterScreenTolerance. The other components are judged by the
// Peng-Robinson model's Michelsen stability test on the composition
// without its water (Peng-Robinson's own water vapour pressure is a few
// per cent off IF97, and a gas saturated by IF97 after a cooler must not
// read as wet). ok is false for the other models, and when the screen
// cannot be built or evaluated (the ideal model's own checks then stand).
func idealPhaseScreen(m gas.Model, t, p float64) (phase gas.Phase, ok bool) {
	if m.Name() != "ideal" {
		return "", false
	}
	comp, found := compositionOfModel(m)
	if !found {
		return "", false
	}
	x := comp.MoleFractions()
	var dry []gas.Fraction
	water := 0.0
	for i := range comp.Len() {
		if comp.Component(i).ID == "water" {
			water += x[i]
			continue
		}
		if x[i] > 0 {
			dry = append(dry, gas.Fraction{Name: comp.Component(i).ID, Value: x[i]})
		}
	}
	if water > 0 {
		psat, err := wat.SaturationPressure(physics.Kelvin(t))
		if err == nil && water*p > float64(psat)*(1+waterScreenTolerance) {
			return gas.PhaseTwoPhase, true
		}
		if err != nil && water >= 1 {
			return "", false
		}
	}
	if len(dry) == 0 {
		return gas.PhaseGas, true
	}
	sum := 0.0
	for _, f := range dry {
		sum += f.Value
	}
	for i := range dry {
		dry[i].Value /= sum
	}
	dc, err := gas.NewComposition(dry, gas.BasisMole)
	if err != nil {
		return "", false
	}
	pr, err := gas.NewModel("peng-robinson", dc, nil)
	if err != nil {
		return "", false
	}
	st, err := pr.State(physics.Kelvin(t), physics.Pascal(p*(1-water)))
	if err != nil {
		return "", false
	}
	return st.Phase, true
}

// waterScreenTolerance is how far the water's partial pressure may exceed
// its IF97 saturation pressure before the ideal model's suction is wet: the
// rounding of a gas saturated exactly at a cooler outlet (1e-6).
const waterScreenTolerance = 1e-6

// MaxExitWidthRatio bounds the impeller exit width b2/D2: the wide-exit
// rule warns above 0.08 and marks the limit of practice at 0.10
// (physics/limits); an exit wider than a quarter of the tip diameter is
// not a centrifugal impeller at all, and the sizing refuses it (common
// practice, no source).
const MaxExitWidthRatio = 0.25

func polytropicMethod(d StageDuty, prov *Provenance) (path.Method, error) {
	switch d.PolytropicMethod {
	case "":
		prov.Defaults = append(prov.Defaults, Default{Field: "options.polytropic_method", Value: "stepwise",
			Note: "polytropic head from the path of constant small-stage efficiency integrated step by step"})
		return path.Stepwise, nil
	case "stepwise":
		return path.Stepwise, nil
	case "schultz":
		return path.Schultz, nil
	}
	return 0, shapeErr("options.polytropic_method", fmt.Errorf("unknown polytropic method %q: use stepwise or schultz", d.PolytropicMethod))
}

func lossShare(d StageDuty, prov *Provenance) (float64, error) {
	if d.ImpellerLossShare == nil {
		prov.Defaults = append(prov.Defaults, Default{Field: "options.impeller_loss_share", Value: "0.5",
			Note: "half the stage loss is taken to arise in the impeller when the exit static state is found (Saravanamuttoo et al., Gas Turbine Theory, Example 4.1, from memory)"})
		return stage.DefaultImpellerLossShare, nil
	}
	share := *d.ImpellerLossShare
	if !(share >= 0 && share <= 1) {
		return 0, fieldErr("options.impeller_loss_share", reason("impeller_loss_share",
			"the impeller's share of the stage loss must lie between 0 and 1", share))
	}
	return share, nil
}

// speedPlan is how the speed is found.
type speedPlan struct {
	basis string // "given", "tip-diameter", "specific-speed", "flow-coefficient"
	value float64
	step  float64 // 0: no rounding
}

func speedPlanOf(d StageDuty, prov *Provenance) (speedPlan, error) {
	given := 0
	if d.Speed != nil {
		given++
	}
	if d.TipDiameter != nil {
		given++
	}
	if d.SpeedTarget != nil {
		given++
	}
	if given > 1 {
		return speedPlan{}, shapeErr("speed", errors.New("give at most one of speed, tip_diameter and speed_target"))
	}
	var p speedPlan
	switch {
	case d.Speed != nil:
		p = speedPlan{basis: "given", value: *d.Speed}
		if !(p.value > 0) || math.IsInf(p.value, 0) {
			return p, fieldErr("speed", reason("speed", "the rotational speed must be a positive number of rev/min", p.value))
		}
	case d.TipDiameter != nil:
		p = speedPlan{basis: "tip-diameter", value: *d.TipDiameter}
		if !(p.value > 0 && p.value <= float64(stage.MaxTipDiameter)) {
			return p, fieldErr("tip_diameter", reason("tip_diameter",
				fmt.Sprintf("the tip diameter must be a positive number of metres, at most %.0f m", float64(stage.MaxTipDiameter)), p.value))
		}
	case d.SpeedTarget != nil:
		t := d.SpeedTarget
		switch {
		case (t.SpecificSpeed == nil) == (t.FlowCoefficient == nil):
			return p, shapeErr("speed_target", errors.New("give exactly one of speed_target.specific_speed and speed_target.flow_coefficient"))
		case t.SpecificSpeed != nil:
			p = speedPlan{basis: "specific-speed", value: *t.SpecificSpeed}
			if !(p.value >= 0.1 && p.value <= 3) {
				return p, fieldErr("speed_target.specific_speed", reason("specific_speed",
					"the target specific speed Ns = Ω√Q/Δh_s^0.75 must lie between 0.1 and 3 (centrifugal stages run near 0.4-1.2)", p.value))
			}
		default:
			p = speedPlan{basis: "flow-coefficient", value: *t.FlowCoefficient}
			if !(p.value >= 0.002 && p.value <= 0.4) {
				return p, fieldErr("speed_target.flow_coefficient", reason("flow_coefficient",
					"the target flow coefficient φ = Q01/(U2 π D2²/4) must lie between 0.002 and 0.4 (centrifugal stages run near 0.01-0.15)", p.value))
			}
		}
	default:
		p = speedPlan{basis: "specific-speed", value: stage.DefaultSpecificSpeed}
		prov.Defaults = append(prov.Defaults, Default{Field: "speed_target.specific_speed", Value: strconv.FormatFloat(stage.DefaultSpecificSpeed, 'f', -1, 64),
			Note: "no speed given: chosen for the specific speed of best efficiency of the Balje-type charts (Balje 1981, via Dixon & Hall 2014 ch. 7; from memory)"})
	}
	if d.SpeedStep != nil {
		p.step = *d.SpeedStep
		switch {
		case p.basis == "given":
			return p, shapeErr("speed_step", errors.New("speed_step rounds a chosen speed; it cannot be used with a given speed"))
		case p.basis == "tip-diameter":
			return p, shapeErr("speed_step", errors.New("speed_step would move the tip diameter away from the one given; give speed_target or a speed instead"))
		case !(p.step > 0 && p.step <= 10000):
			return p, fieldErr("speed_step", reason("speed_step", "the speed step must be a positive number of rev/min, at most 10000", p.step))
		}
	}
	return p, nil
}

// solver finds the speed, the slip factor, the exit meridional velocity
// and the efficiency together: each depends on the sized stage (the speed
// of a tip-diameter or flow-coefficient target on the tip speed, Wiesner's
// slip factor on the inlet radius ratio, the default cr2 on the tip speed,
// the estimated efficiency on the flow coefficient and tip Mach number), so
// they are updated together by fixed-point iteration until none moves.
type solver struct {
	d        StageDuty
	model    gas.Model
	suction  gas.State
	p2       physics.Pascal
	mdot     physics.KgPerS
	method   path.Method
	share    float64
	imp      stage.Impeller
	inlet    stage.Inlet
	plan     speedPlan
	estimate bool
	eff      path.Efficiency
	effField string
	est      stage.EfficiencyEstimate

	// The least-shroud-Mach eye depends only on the speed (the suction
	// state, flow, hub ratio and prewhirl are fixed), so it is found once
	// per speed; later sizings at that speed pass its meridional velocity,
	// from which continuity gives back the same eye in one static state.
	eyeSpeed physics.RevPerMin
	eyeCm    physics.MeterPerS
	// A given eye's meridional velocity depends on no unknown at all: it is
	// found once (continuity on the subsonic branch) and reused likewise.
	givenEyeCm physics.MeterPerS
}

// Convergence of the joint iteration.
const (
	maxSolverIterations = 60
	solverTolerance     = 1e-10 // relative on speed, absolute on the slip factor
	efficiencyTolerance = 1e-9  // absolute on ηp
)

func (sv *solver) field() string {
	switch sv.plan.basis {
	case "tip-diameter":
		return "tip_diameter"
	case "flow-coefficient":
		return "speed_target.flow_coefficient"
	case "specific-speed":
		if sv.d.SpeedTarget != nil {
			return "speed_target.specific_speed"
		}
		if sv.d.Speed == nil { // the default specific speed chose it: the flow is what the client sent
			switch {
			case sv.d.MassFlow != nil:
				return "flow.mass"
			case sv.d.ActualVolumeFlow != nil:
				return "flow.actual_volume"
			case sv.d.StandardVolumeFlow != nil:
				return "flow.standard_volume"
			}
		}
	}
	return "speed"
}

func (sv *solver) compression() (path.Result, error) {
	comp, err := path.Compression(sv.model, sv.suction, sv.p2, sv.eff, sv.method)
	if err != nil {
		return path.Result{}, compressionError(err, sv.effField, sv.d)
	}
	return comp, nil
}

func (sv *solver) duty(comp path.Result, n physics.RevPerMin) stage.Duty {
	return stage.Duty{Model: sv.model, Suction: sv.suction, Work: comp.Work, IsentropicHead: comp.IsentropicHead,
		PolytropicHead: comp.PolytropicHead, IsentropicEfficiency: comp.IsentropicEfficiency,
		ImpellerLossShare: sv.share, MassFlow: sv.mdot, Speed: n}
}

// size sizes the stage at speed n with the current blading, reusing the
// optimum eye found at the same speed.
func (sv *solver) size(comp path.Result, n physics.RevPerMin) (stage.Sizing, error) {
	in := sv.inlet
	axial := in.Kind == stage.InletAxialEye && in.MeridionalVelocity == 0
	cached, givenCached := false, false
	switch {
	case axial && in.EyeTipDiameter > 0 && sv.givenEyeCm > 0:
		in.MeridionalVelocity, in.EyeTipDiameter, givenCached = sv.givenEyeCm, 0, true
	case axial && in.EyeTipDiameter == 0 && sv.eyeCm > 0 && sv.eyeSpeed == n:
		in.MeridionalVelocity, cached = sv.eyeCm, true
	}
	sz, err := stage.Size(sv.duty(comp, n), sv.imp, in)
	if err != nil {
		return sz, sizingError(err, sv.field())
	}
	switch {
	case cached:
		sz.Geometry.EyeChoice = stage.EyeMinShroudMach
	case givenCached:
		sz.Geometry.EyeChoice = stage.EyeGivenDiameter
	case sz.Geometry.EyeChoice == stage.EyeMinShroudMach:
		sv.eyeSpeed, sv.eyeCm = n, sz.Velocities.InletMeridional
	case sz.Geometry.EyeChoice == stage.EyeGivenDiameter:
		sv.givenEyeCm = sz.Velocities.InletMeridional
	}
	return sz, nil
}

// run iterates to the joint fixed point and records the speed choice.
func (sv *solver) run(ctx context.Context, res *StageResult) (physics.RevPerMin, path.Result, stage.Sizing, error) {
	comp, err := sv.compression()
	if err != nil {
		return 0, comp, stage.Sizing{}, err
	}
	q := physics.CubicMeterPerS(float64(sv.mdot) / float64(sv.suction.Density))
	field := sv.field()
	var n physics.RevPerMin
	fixed := true
	switch sv.plan.basis {
	case "given":
		n = physics.RevPerMin(sv.plan.value)
	case "specific-speed": // Δh_s does not depend on the efficiency
		if n, err = stage.SpeedForSpecificSpeed(sv.plan.value, q, comp.IsentropicHead); err != nil {
			return 0, comp, stage.Sizing{}, fieldErr(field, err)
		}
	default:
		fixed = false
		if n, err = sv.targetSpeed(q, comp, 0); err != nil {
			return 0, comp, stage.Sizing{}, err
		}
	}
	unrounded, rounded := n, false
	// Outer loop: the efficiency, by the secant method on
	// f(η) = estimate(η) − η once two points are known (plain substitution
	// converges only linearly); each step first settles the speed, slip
	// factor and exit velocity at the work of that efficiency.
	var prevEta, prevF float64
	havePrev := false
	for range maxSolverIterations {
		if err := ctx.Err(); err != nil {
			return 0, comp, stage.Sizing{}, err
		}
		sz, next, err := sv.settle(ctx, q, comp, n, fixed || rounded)
		if err != nil {
			return 0, comp, sz, err
		}
		n = next
		if !rounded {
			unrounded = n
		}
		if sv.estimate {
			sv.est, err = stage.PolytropicEfficiencyEstimate(sz.Coefficients.FlowCoefficient, sz.Velocities.MachineMach)
			if err != nil {
				return 0, comp, sz, fieldErr("efficiency", fmt.Errorf("efficiency estimate: %w", err))
			}
			if f := sv.est.Value - sv.eff.Value; math.Abs(f) > efficiencyTolerance {
				step := sv.est.Value
				if havePrev && f != prevF {
					if s := sv.eff.Value - f*(sv.eff.Value-prevEta)/(f-prevF); s > 0.2 && s < 1 {
						step = s
					}
				}
				prevEta, prevF, havePrev = sv.eff.Value, f, true
				sv.eff.Value = step
				if comp, err = sv.compression(); err != nil {
					return 0, comp, sz, err
				}
				continue
			}
		}
		if sv.plan.step > 0 && !rounded {
			unrounded, rounded = n, true
			if n, err = stage.RoundSpeed(n, physics.RevPerMin(sv.plan.step)); err != nil {
				return 0, comp, sz, fieldErr("speed_step", err)
			}
			havePrev = false // the speed moved under the slope
			continue
		}
		res.SpeedBasis = sv.plan.basis
		res.SpeedUnrounded = float64(unrounded)
		if sv.plan.basis != "given" {
			res.SpeedTarget = sv.plan.value
		}
		return n, comp, sz, nil
	}
	return 0, comp, stage.Sizing{}, fieldErr("efficiency", reason("efficiency",
		"the efficiency estimate did not settle with the sizing for this duty; give efficiency.polytropic or efficiency.isentropic", sv.eff.Value))
}

// settle sizes the stage at the work of comp, updating the speed of a
// target (unless fixed), Wiesner's slip factor and the default exit
// velocity until none moves, and returns the sizing and the speed.
func (sv *solver) settle(ctx context.Context, q physics.CubicMeterPerS, comp path.Result, n physics.RevPerMin, fixed bool) (stage.Sizing, physics.RevPerMin, error) {
	for range maxSolverIterations {
		if err := ctx.Err(); err != nil {
			return stage.Sizing{}, n, err
		}
		if sv.d.Impeller.ExitMeridionalVelocity == nil {
			cr2, ok := exitVelocityFor(comp.Work, sv.imp)
			if !ok {
				return stage.Sizing{}, n, fieldErr("impeller.blade_exit_angle", reason("blade_exit_angle",
					"the blades are swept back too far for the default exit flow coefficient cr2/U2 = 0.25: give impeller.exit_meridional_velocity or less backsweep", sv.imp.BladeExitAngle))
			}
			sv.imp.ExitMeridionalVelocity = cr2
		}
		sz, err := sv.size(comp, n)
		if err != nil {
			return sz, n, err
		}
		moved := false
		if sv.d.Impeller.SlipFactor == nil {
			sigma, err := slipFrom(sv.d.Impeller, sz.Coefficients.InletTipRatio)
			if err != nil {
				return sz, n, err
			}
			if math.Abs(sigma-sv.imp.SlipFactor) > solverTolerance {
				sv.imp.SlipFactor, moved = sigma, true
			}
		}
		if !fixed {
			next, err := sv.targetSpeed(q, comp, sz.Velocities.TipSpeed)
			if err != nil {
				return sz, n, err
			}
			if math.Abs(float64(next/n)-1) > solverTolerance {
				n, moved = next, true
			}
		}
		if !moved {
			return sz, n, nil
		}
	}
	field := sv.field()
	return stage.Sizing{}, n, fieldErr(field, reason(field, "the speed, slip factor and exit velocity did not settle for this duty; give the speed and the slip factor", sv.plan.value))
}

// targetSpeed is the speed at which the tip speed u2 gives the target tip
// diameter or flow coefficient; u2 = 0 asks for a first estimate from the
// Euler work without the inlet terms.
func (sv *solver) targetSpeed(q physics.CubicMeterPerS, comp path.Result, u2 physics.MeterPerS) (physics.RevPerMin, error) {
	field := sv.field()
	if u2 == 0 {
		cr2 := sv.imp.ExitMeridionalVelocity
		if sv.d.Impeller.ExitMeridionalVelocity == nil {
			var ok bool
			if cr2, ok = exitVelocityFor(comp.Work, sv.imp); !ok {
				cr2 = 1
			}
		}
		var err error
		u2, err = stage.TipSpeed(comp.Work, sv.imp.SlipFactor, sv.imp.PowerInputFactor, sv.imp.BladeExitAngle, cr2)
		if err != nil {
			return 0, sizingError(err, field)
		}
	}
	d2 := physics.Meter(sv.plan.value)
	if sv.plan.basis == "flow-coefficient" {
		var err error
		if d2, err = stage.TipDiameterForFlowCoefficient(sv.plan.value, q, u2); err != nil {
			return 0, fieldErr(field, err)
		}
	}
	n, err := stage.SpeedForTipDiameter(u2, d2)
	if err != nil {
		return 0, fieldErr(field, err)
	}
	return n, nil
}

// efficiencyRangeWarning reports the correlation used outside its range,
// with the flow coefficient against the nearer end of the range.
func efficiencyRangeWarning(sz stage.Sizing, est stage.EfficiencyEstimate) Warning {
	phi, mu := sz.Coefficients.FlowCoefficient, sz.Velocities.MachineMach
	lo, hi := stage.EfficiencyCorrelationFlowRange()
	w := Warning{Code: "correlation-out-of-range", Severity: string(limits.Warning), Unit: "-",
		Basis: stage.EfficiencyCorrelationSource}
	switch {
	case phi < lo:
		w.Value, w.Limit, w.Margin = phi, lo, (phi-lo)/lo
		w.Message = fmt.Sprintf("the efficiency correlation (form and coefficients from memory, unverified) is used below its flow-coefficient range (%.4g < %.4g): the estimated efficiency is an extrapolation; give the efficiency", phi, lo)
	case phi > hi:
		w.Value, w.Limit, w.Margin = phi, hi, (hi-phi)/hi
		w.Message = fmt.Sprintf("the efficiency correlation (form and coefficients from memory, unverified) is used above its flow-coefficient range (%.4g > %.4g): the estimated efficiency is an extrapolation; give the efficiency", phi, hi)
	default:
		mlo, mhi := stage.EfficiencyCorrelationMachRange()
		limit := mhi
		if mu < mlo {
			limit = mlo
		}
		w.Value, w.Limit, w.Margin = mu, limit, -math.Abs(mu-limit)/limit
		w.Message = fmt.Sprintf("the efficiency correlation (form and coefficients from memory, unverified) is used outside its tip Mach number range (%.3g, range %.3g-%.3g): %s", mu, mlo, mhi, est.Note)
	}
	return w
}

// suctionInRange refuses a suction state outside what any gas model here
// is meant for: pressure from MinSuctionPressure to PropertiesMaxPressure,
// temperature from PropertiesMinTemperature (finite). Every suction the
// service reads passes it: a duty's, an operating point's and a machine
// stage's design suction (a design suction of 1e9 Pa once kept a rating
// computing for minutes).
func suctionInRange(p, t float64, pField, tField string) error {
	if !(p >= MinSuctionPressure && p <= PropertiesMaxPressure) {
		return fieldErr(pField, reason("suction pressure", fmt.Sprintf(
			"the suction pressure is out of range: %g Pa to %g MPa absolute", MinSuctionPressure, PropertiesMaxPressure/1e6), p))
	}
	if !(t >= PropertiesMinTemperature) || math.IsInf(t, 0) {
		return fieldErr(tField, reason("suction temperature", fmt.Sprintf(
			"the suction temperature is out of range: at least %g K", PropertiesMinTemperature), t))
	}
	return nil
}
