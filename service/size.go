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
)

// DefaultExitBlockage is the blocked fraction of the impeller exit area
// (blade thickness and boundary layers) used when the duty gives none:
// 0.10 (common practice, no source; blade thickness alone blocks 3-6 % of
// the circumference of a typical process impeller).
const DefaultExitBlockage = 0.10

// Iteration bounds of the choices the service makes.
const (
	maxSpeedIterations      = 40
	maxEfficiencyIterations = 40
	speedTolerance          = 1e-10 // relative, on D2 or φ
	efficiencyTolerance     = 1e-7  // absolute, on ηp
)

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

	model, gasNotes, err := s.gasModel(d.Gas, d.SuctionTemperature, d.SuctionPressure)
	if err != nil {
		return StageResult{}, err
	}
	prov.GasModel = model.Name()
	prov.Methods = append(prov.Methods, gasNotes.methods...)
	res.Warnings = append(res.Warnings, gasNotes.warnings...)

	suction, err := fullState(model, physics.Kelvin(d.SuctionTemperature), physics.Pascal(d.SuctionPressure))
	if err != nil {
		return StageResult{}, suctionError(err, d)
	}
	if suction.Phase == gas.PhaseLiquid || suction.Phase == gas.PhaseTwoPhase {
		return StageResult{}, fieldErr("suction.temperature", reason("suction", fmt.Sprintf(
			"the gas is %s at suction (%.2f K, %.0f Pa): a compressor needs a dry gas at suction; raise the suction temperature or remove the condensable components",
			suction.Phase, d.SuctionTemperature, d.SuctionPressure), d.SuctionTemperature))
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

	// The efficiency estimate depends on the flow coefficient and tip Mach
	// number, which depend on the work the efficiency sets: iterate to a
	// fixed point (a given efficiency needs one pass).
	var comp path.Result
	var sz stage.Sizing
	var n physics.RevPerMin
	var est stage.EfficiencyEstimate
	converged := false
	for range maxEfficiencyIterations {
		if err := ctx.Err(); err != nil {
			return StageResult{}, err
		}
		comp, err = path.Compression(model, suction, physics.Pascal(p2), eff, method)
		if err != nil {
			return StageResult{}, compressionError(err, effField, d)
		}
		duty := stage.Duty{Model: model, Suction: suction, Work: comp.Work, IsentropicHead: comp.IsentropicHead,
			PolytropicHead: comp.PolytropicHead, IsentropicEfficiency: comp.IsentropicEfficiency,
			ImpellerLossShare: share, MassFlow: physics.KgPerS(mdot)}
		n, sz, imp, err = plan.size(d, duty, imp, inlet, &res)
		if err != nil {
			return StageResult{}, err
		}
		if !estimate {
			converged = true
			break
		}
		est, err = stage.PolytropicEfficiencyEstimate(sz.Coefficients.FlowCoefficient, sz.Velocities.MachineMach)
		if err != nil {
			return StageResult{}, fieldErr("efficiency", fmt.Errorf("efficiency estimate: %w", err))
		}
		if math.Abs(est.Value-eff.Value) < efficiencyTolerance {
			converged = true
			break
		}
		eff.Value = est.Value
	}
	if !converged {
		return StageResult{}, fieldErr("efficiency", reason("efficiency",
			"the efficiency estimate did not settle with the sizing for this duty; give efficiency.polytropic or efficiency.isentropic", eff.Value))
	}
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
	if sz.Geometry.EyeChoice == "min-shroud-mach" {
		prov.Methods = append(prov.Methods, Method{Subject: "inducer eye",
			Name:   "eye tip diameter chosen for the least shroud relative Mach number at the mass flow (bounded one-dimensional minimisation)",
			Source: "Dixon & Hall (2014), §7 optimum design of a compressor inlet; Rodgers (from memory)"})
	}
	if d.Impeller.SlipFactor == nil {
		prov.Methods = append(prov.Methods, slipMethod(d.Impeller, imp.SlipFactor))
	}

	res.MassFlow = mdot
	res.SuctionVolumeFlow = sz.SuctionFlow
	res.StandardFlows = standardFlows(model, mdot)
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
	return res, nil
}

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

// size finds the speed of plan p and sizes the stage at it (with
// Wiesner's inlet-radius slip correction when a slip model is used).
func (p speedPlan) size(d StageDuty, duty stage.Duty, imp stage.Impeller, inlet stage.Inlet, res *StageResult) (physics.RevPerMin, stage.Sizing, stage.Impeller, error) {
	field := map[string]string{"given": "speed", "tip-diameter": "tip_diameter",
		"specific-speed": "speed_target.specific_speed", "flow-coefficient": "speed_target.flow_coefficient"}[p.basis]
	if p.basis == "specific-speed" && d.SpeedTarget == nil {
		field = "speed"
	}
	at := func(n physics.RevPerMin) (stage.Sizing, error) {
		duty.Speed = n
		var sz stage.Sizing
		// With the default exit flow coefficient, cr2 follows U2, which
		// follows the slip factor: iterate until the slip factor settles.
		for range 20 {
			sigma := imp.SlipFactor
			if d.Impeller.ExitMeridionalVelocity == nil {
				cr2, ok := exitVelocityFor(duty.Work, imp)
				if !ok {
					return sz, fieldErr("impeller.blade_exit_angle", reason("blade_exit_angle",
						"the blades are swept back too far for the default exit flow coefficient cr2/U2 = 0.25: give impeller.exit_meridional_velocity or less backsweep", imp.BladeExitAngle))
				}
				imp.ExitMeridionalVelocity = cr2
			}
			var err error
			sz, err = stage.Size(duty, imp, inlet)
			if err != nil {
				return sz, sizingError(err, field)
			}
			if d.Impeller.SlipFactor == nil {
				sz, imp, err = refineSlip(d.Impeller, duty, imp, inlet, sz)
				if err != nil {
					return sz, err
				}
			}
			if d.Impeller.ExitMeridionalVelocity != nil || math.Abs(imp.SlipFactor-sigma) < 1e-10 {
				break
			}
		}
		return sz, nil
	}
	var n physics.RevPerMin
	var err error
	switch p.basis {
	case "given":
		n = physics.RevPerMin(p.value)
	case "specific-speed":
		q := physics.CubicMeterPerS(float64(duty.MassFlow) / float64(duty.Suction.Density))
		n, err = stage.SpeedForSpecificSpeed(p.value, q, duty.IsentropicHead)
		if err != nil {
			return 0, stage.Sizing{}, imp, fieldErr(field, err)
		}
	default:
		n, err = p.iterate(duty, imp, at, field)
		if err != nil {
			return 0, stage.Sizing{}, imp, err
		}
	}
	res.SpeedBasis = p.basis
	res.SpeedUnrounded = float64(n)
	if p.basis != "given" {
		res.SpeedTarget = p.value
	}
	if p.step > 0 {
		n, err = stage.RoundSpeed(n, physics.RevPerMin(p.step))
		if err != nil {
			return 0, stage.Sizing{}, imp, fieldErr("speed_step", err)
		}
	}
	sz, err := at(n)
	if err != nil {
		return 0, stage.Sizing{}, imp, err
	}
	return n, sz, imp, nil
}

// iterate finds the speed giving the target tip diameter or flow
// coefficient: the tip speed the work needs varies a little with speed
// (slip correction, prewhirl at the eye), so N is corrected by fixed-point
// iteration on D2 = 60 U2/(π N).
func (p speedPlan) iterate(duty stage.Duty, imp stage.Impeller, at func(physics.RevPerMin) (stage.Sizing, error), field string) (physics.RevPerMin, error) {
	q := physics.CubicMeterPerS(float64(duty.MassFlow) / float64(duty.Suction.Density))
	u2, err := stage.TipSpeed(duty.Work, imp.SlipFactor, imp.PowerInputFactor, imp.BladeExitAngle, imp.ExitMeridionalVelocity)
	if err != nil {
		return 0, sizingError(err, field)
	}
	target := func(u2 physics.MeterPerS) (physics.Meter, error) {
		if p.basis == "tip-diameter" {
			return physics.Meter(p.value), nil
		}
		return stage.TipDiameterForFlowCoefficient(p.value, q, u2)
	}
	for range maxSpeedIterations {
		d2, err := target(u2)
		if err != nil {
			return 0, fieldErr(field, err)
		}
		n, err := stage.SpeedForTipDiameter(u2, d2)
		if err != nil {
			return 0, fieldErr(field, err)
		}
		sz, err := at(n)
		if err != nil {
			return 0, err
		}
		if math.Abs(float64(sz.Geometry.TipDiameter)/float64(d2)-1) < speedTolerance {
			return n, nil
		}
		u2 = sz.Velocities.TipSpeed
	}
	return 0, fieldErr(field, reason(field, "the speed for this target did not settle; give the speed instead", p.value))
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
		w.Message = fmt.Sprintf("the efficiency correlation is used below its flow-coefficient range (%.4g < %.4g): the estimated efficiency is an extrapolation; give the efficiency", phi, lo)
	case phi > hi:
		w.Value, w.Limit, w.Margin = phi, hi, (hi-phi)/hi
		w.Message = fmt.Sprintf("the efficiency correlation is used above its flow-coefficient range (%.4g > %.4g): the estimated efficiency is an extrapolation; give the efficiency", phi, hi)
	default:
		mlo, mhi := stage.EfficiencyCorrelationMachRange()
		limit := mhi
		if mu < mlo {
			limit = mlo
		}
		w.Value, w.Limit, w.Margin = mu, limit, -math.Abs(mu-limit)/limit
		w.Message = fmt.Sprintf("the efficiency correlation is used outside its tip Mach number range (%.3g, range %.3g-%.3g): %s", mu, mlo, mhi, est.Note)
	}
	return w
}
