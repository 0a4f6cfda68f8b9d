package api

import (
	"errors"
	"fmt"
	"math"

	"stagewright/api/units"
	"stagewright/physics"
	"stagewright/physics/limits"
	"stagewright/physics/stage"
	"stagewright/service"
)

// dimension names what a Quantity measures, for unit parsing.
type dimension int

const (
	dimPressure dimension = iota + 1
	dimTemperature
	dimMassFlow
	dimVolumeFlow
	dimSpeed
	dimVelocity
	dimLength
	dimPower
)

// si returns the SI value of q (nil when q is nil), read as dimension dim.
// field is the dotted field name, for errors.
func si(q *Quantity, dim dimension, field string, ambient float64) (*float64, error) {
	if q == nil {
		return nil, nil
	}
	var v float64
	var err error
	switch dim {
	case dimPressure:
		v, err = q.Pressure(ambient)
	case dimTemperature:
		v, err = q.Temperature()
	case dimMassFlow:
		v, err = q.MassFlow()
	case dimVolumeFlow:
		v, err = q.VolumeFlow()
	case dimSpeed:
		v, err = q.Speed()
	case dimVelocity:
		v, err = q.Velocity()
	case dimLength:
		v, err = q.Length()
	case dimPower:
		v, err = q.Power()
	default:
		err = fmt.Errorf("no unit parser for dimension %d", dim)
	}
	if err == nil && (math.IsNaN(v) || math.IsInf(v, 0)) {
		err = errors.New("the value is not a finite number")
	}
	if err != nil {
		return nil, &service.InputError{Field: field, Shape: true, Err: err}
	}
	return &v, nil
}

func intOr0(v *int) int {
	if v == nil {
		return 0
	}
	return *v
}

func must(v *float64) float64 {
	if v == nil {
		return 0
	}
	return *v
}

// dutyOf converts a decoded, shape-checked request into the service duty in SI.
func dutyOf(r StageRequest) (service.StageDuty, error) {
	ambient := float64(physics.StandardAtmosphere)
	if r.Suction.Ambient != nil {
		a, err := si(r.Suction.Ambient, dimPressure, "suction.ambient", ambient)
		if err != nil {
			return service.StageDuty{}, err
		}
		ambient = *a
		if !(ambient > 0) {
			return service.StageDuty{}, &service.InputError{Field: "suction.ambient", Err: errors.New("the ambient pressure must be above 0 Pa absolute")}
		}
	}
	d := service.StageDuty{
		Gas:                  gasInputOf(r.Gas),
		PressureRatio:        r.PressureRatio,
		MechanicalEfficiency: r.MechanicalEfficiency,
		SpeedStep:            r.SpeedStep,
	}
	imp := ImpellerSpec{}
	if r.Impeller != nil {
		imp = *r.Impeller
	}
	inlet := InletSpec{}
	if imp.Inlet != nil {
		inlet = *imp.Inlet
	}
	d.Impeller = service.ImpellerInput{BladeExitAngle: imp.BladeExitAngle, SlipFactor: imp.SlipFactor,
		SlipModel: imp.SlipModel, BladeCount: intOr0(imp.BladeCount),
		PowerInputFactor: imp.PowerInputFactor, Construction: imp.Construction, ExitBlockage: imp.ExitBlockage,
		Inlet: service.InletInput{Type: inlet.Type, DiameterRatio: inlet.DiameterRatio, HubRatio: inlet.HubRatio,
			PrewhirlAngle: inlet.PrewhirlAngle}}
	if r.Efficiency != nil {
		d.IsentropicEfficiency, d.PolytropicEfficiency = r.Efficiency.Isentropic, r.Efficiency.Polytropic
	}
	if r.SpeedTarget != nil {
		d.SpeedTarget = &service.SpeedTarget{SpecificSpeed: r.SpeedTarget.SpecificSpeed, FlowCoefficient: r.SpeedTarget.FlowCoefficient}
	}
	if len(r.LimitOverrides) > 0 {
		d.LimitOverrides = make(map[string]service.LevelOverride, len(r.LimitOverrides))
		for k, o := range r.LimitOverrides {
			d.LimitOverrides[k] = service.LevelOverride{Warning: must(o.Warning), Limit: o.Limit}
		}
	}
	if r.Diffuser != nil {
		d.Diffuser = r.Diffuser.Type
	}
	if r.Options != nil {
		d.PolytropicMethod = r.Options.PolytropicMethod
		d.ImpellerLossShare = r.Options.ImpellerLossShare
	}
	var err error
	conv := func(q *Quantity, dim dimension, field string) *float64 {
		if err != nil {
			return nil
		}
		var v *float64
		v, err = si(q, dim, field, ambient)
		return v
	}
	d.SuctionPressure = must(conv(r.Suction.Pressure, dimPressure, "suction.pressure"))
	d.SuctionTemperature = must(conv(r.Suction.Temperature, dimTemperature, "suction.temperature"))
	d.DischargePressure = conv(r.DischargePressure, dimPressure, "discharge_pressure")
	d.MassFlow = conv(r.Flow.Mass, dimMassFlow, "flow.mass")
	d.ActualVolumeFlow = conv(r.Flow.ActualVolume, dimVolumeFlow, "flow.actual_volume")
	if err == nil {
		d.StandardVolumeFlow, d.StandardReference, err = standardFlow(r.Flow)
	}
	d.Speed = conv(r.Speed, dimSpeed, "speed")
	d.TipDiameter = conv(r.TipDiameter, dimLength, "tip_diameter")
	d.Impeller.ExitMeridionalVelocity = conv(imp.ExitMeridionalVelocity, dimVelocity, "impeller.exit_meridional_velocity")
	d.Impeller.Inlet.MeridionalVelocity = conv(inlet.MeridionalVelocity, dimVelocity, "impeller.inlet.meridional_velocity")
	d.Impeller.Inlet.EyeTipDiameter = conv(inlet.EyeTipDiameter, dimLength, "impeller.inlet.eye_tip_diameter")
	d.MechanicalLosses = conv(r.MechanicalLosses, dimPower, "mechanical_losses")
	if r.Driver != nil {
		d.Driver = &service.DriverInput{Margin: r.Driver.Margin, Rating: conv(r.Driver.Rating, dimPower, "driver.rating")}
	}
	if err != nil {
		return service.StageDuty{}, err
	}
	if !(d.SuctionPressure > 0) {
		return service.StageDuty{}, &service.InputError{Field: "suction.pressure", Err: fmt.Errorf("the suction pressure must be above 0 Pa absolute, not %g", d.SuctionPressure)}
	}
	if !(d.SuctionTemperature > 0) {
		return service.StageDuty{}, &service.InputError{Field: "suction.temperature", Err: fmt.Errorf("the suction temperature must be above 0 K, not %g K", d.SuctionTemperature)}
	}
	return d, nil
}

// standardFlow reads flow.standard_volume with its reference condition.
func standardFlow(f FlowSpec) (*float64, string, error) {
	q := f.StandardVolume
	if q == nil {
		if f.Reference != "" {
			return nil, "", &service.InputError{Field: "flow.reference", Shape: true, Err: errors.New("flow.reference applies only to flow.standard_volume")}
		}
		return nil, "", nil
	}
	if !q.IsText() {
		v := q.Value
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, "", &service.InputError{Field: "flow.standard_volume", Shape: true, Err: errors.New("the value is not a finite number")}
		}
		return &v, f.Reference, nil
	}
	sf, err := units.ParseStandardVolumeFlow(q.Text)
	if err != nil {
		return nil, "", &service.InputError{Field: "flow.standard_volume", Shape: true, Err: err}
	}
	if f.Reference != "" && f.Reference != sf.Reference {
		return nil, "", &service.InputError{Field: "flow.reference", Shape: true,
			Err: fmt.Errorf("flow.standard_volume %q is at %s conditions but flow.reference says %s", q.Text, sf.Reference, f.Reference)}
	}
	return &sf.Flow, sf.Reference, nil
}

// errNotFinite marks a computed output that is NaN or ±Inf: a defect of
// the service, never sent to a client.
var errNotFinite = errors.New("api: a computed output is not finite")

// responseOf converts a service result, refusing any non-finite number.
func responseOf(res service.StageResult) (StageResponse, error) {
	p, sz := res.Path, res.Sizing
	g, v, c := sz.Geometry, sz.Velocities, sz.Coefficients
	out := StageResponse{
		MassFlow: res.MassFlow, SuctionVolumeFlow: res.SuctionVolumeFlow, Speed: res.Speed,
		Discharge: DischargeOut{Pressure: float64(p.Discharge.Pressure), Temperature: float64(p.Discharge.Temperature),
			IsentropicTemperature: float64(p.IsentropicDischarge.Temperature)},
		Work: float64(p.Work),
		Head: HeadOut{Isentropic: float64(p.IsentropicHead), Polytropic: float64(p.PolytropicHead)},
		Efficiency: EfficiencyOut{Isentropic: p.IsentropicEfficiency, Polytropic: p.PolytropicEfficiency,
			Estimated: res.EfficiencyEstimated, InRange: !res.EfficiencyEstimated || res.EfficiencyInRange},
		SpeedChoice: SpeedChoiceOut{Basis: res.SpeedBasis, Unrounded: res.SpeedUnrounded},
		Inducer: InducerOut{EyeChoice: g.EyeChoice, ShroudRelativeMach: v.InletRelativeMach, AbsoluteMach: v.InletAbsoluteMach,
			PrewhirlAngle: res.PrewhirlAngle, BladeAngleHub: v.InletBladeAngleHub, BladeAngleMean: v.InletBladeAngleMean,
			BladeAngleShroud: v.InletBladeAngleShroud},
		Power: PowerOut{Gas: res.Power.Gas, Shaft: res.Power.Shaft, MechanicalEfficiency: res.Power.MechanicalEfficiency,
			DriverRating: res.Power.DriverRating, DriverMargin: res.Power.DriverMargin},
		Velocities: VelocitiesOut{TipSpeed: float64(v.TipSpeed), InletBladeSpeed: float64(v.InletBladeSpeed),
			InletMeridional: float64(v.InletMeridional), InletWhirl: float64(v.InletWhirl), InletRelative: float64(v.InletRelative), InletRelativeMach: v.InletRelativeMach,
			InletBladeAngleShroud: v.InletBladeAngleShroud, InletBladeAngleMean: v.InletBladeAngleMean, InletBladeAngleHub: v.InletBladeAngleHub,
			ExitMeridional: float64(v.ExitMeridional), ExitWhirl: float64(v.ExitWhirl), ExitAbsolute: float64(v.ExitAbsolute),
			ExitRelative: float64(v.ExitRelative), ExitAbsoluteMach: v.ExitAbsoluteMach, ExitFlowAngle: v.ExitFlowAngle,
			RelativeVelocityRatio: v.RelativeVelocityRatio, MachineMach: v.MachineMach},
		Geometry: GeometryOut{TipDiameter: float64(g.TipDiameter), InletDiameter: float64(g.InletDiameter),
			InletWidth: float64(g.InletWidth), ExitWidth: float64(g.ExitWidth), ExitBlockage: res.ExitBlockage,
			BladeExitAngle: res.Impeller.BladeExitAngle},
		Coefficients: CoefficientsOut{Slip: res.SlipFactor, PowerInputFactor: res.Impeller.PowerInputFactor, Flow: c.FlowCoefficient, ExitFlow: v.FlowCoefficientExit, Work: c.WorkCoefficient,
			PolytropicHead: c.PolytropicHeadCoefficient, SpecificSpeed: c.SpecificSpeed, SpecificDiameter: c.SpecificDiameter, ExitWidthRatio: c.ExitWidthRatio,
			InletDiameterRatio: c.InletTipRatio},
		Stations: StationsOut{
			Suction:                   stateOut(p.Suction.Pressure, p.Suction.Temperature, p.Suction.Density, p.Suction.Compressibility, p.Suction.SoundSpeed, 0),
			Inlet:                     stateOut(sz.Inlet.Static.Pressure, sz.Inlet.Static.Temperature, sz.Inlet.Static.Density, sz.Inlet.Static.Compressibility, sz.Inlet.Static.SoundSpeed, sz.Inlet.Velocity),
			ImpellerExit:              stateOut(sz.Exit.Static.Pressure, sz.Exit.Static.Temperature, sz.Exit.Static.Density, sz.Exit.Static.Compressibility, sz.Exit.Static.SoundSpeed, sz.Exit.Velocity),
			ImpellerExitTotalPressure: float64(v.ExitStagnationPressure),
			ImpellerEfficiency:        v.ImpellerIsentropicEff,
			Discharge:                 stateOut(p.Discharge.Pressure, p.Discharge.Temperature, p.Discharge.Density, p.Discharge.Compressibility, p.Discharge.SoundSpeed, 0),
		},
		Polytropic: PolytropicOut{Used: p.Method.String(), StepwiseHead: float64(p.Stepwise.Head), StepwiseSteps: p.Stepwise.Steps,
			SchultzHead: float64(p.Schultz.Head), SchultzFactor: p.Schultz.HeadFactor, Difference: p.HeadDifference},
		Verdict:  res.Verdict,
		Limits:   make([]LimitOut, 0, len(res.Assessments)),
		Warnings: make([]WarningOut, 0, len(res.Warnings)),
		Cautions: res.Cautions,
	}
	pos := func(v float64) *float64 {
		if v > 0 {
			return &v
		}
		return nil
	}
	out.StandardVolumeFlow = StandardFlowsOut{Normal: pos(res.StandardFlows.Normal), Standard: pos(res.StandardFlows.Standard),
		USStandard: pos(res.StandardFlows.USStandard)}
	dews := []struct {
		st *StateOut
		v  float64
	}{{&out.Stations.Suction, res.WaterDewPoints.Suction}, {&out.Stations.Inlet, res.WaterDewPoints.Inlet},
		{&out.Stations.ImpellerExit, res.WaterDewPoints.ImpellerExit}, {&out.Stations.Discharge, res.WaterDewPoints.Discharge}}
	for _, d := range dews {
		if d.v > 0 {
			v := d.v
			d.st.WaterDewPoint = &v
		}
	}
	if g.Inlet == stage.InletAxialEye {
		h, t := float64(g.EyeHubDiameter), float64(g.InletDiameter)
		out.Geometry.EyeHubDiameter, out.Geometry.EyeTipDiameter = &h, &t
	}
	if res.BladeCount > 0 {
		n := res.BladeCount
		out.Geometry.BladeCount = &n
	}
	if res.SpeedBasis != "given" {
		t := res.SpeedTarget
		out.SpeedChoice.Target = &t
	}
	out.Limits = appendLimits(out.Limits, res.Assessments)
	out.Warnings = appendWarnings(out.Warnings, res.Warnings)
	out.Provenance = provenanceOut(res.Provenance)
	out.Machine = machineSpecOf(res.Machine)
	if err := stageFinite.check(&out); err != nil {
		return StageResponse{}, err
	}
	return out, nil
}

func stateOut(p physics.Pascal, t physics.Kelvin, rho physics.KgPerCubicMeter, z float64, a, c physics.MeterPerS) StateOut {
	return StateOut{Pressure: float64(p), Temperature: float64(t), Density: float64(rho), Compressibility: z,
		SpeedOfSound: float64(a), Velocity: float64(c)}
}

// appendLimits appends the limit table of a result to out: every rule
// applied with its levels, value, margin and basis (no limit level: none).
func appendLimits(out []LimitOut, as []limits.Assessment) []LimitOut {
	for _, a := range as {
		l := LimitOut{Rule: a.Rule.ID, Code: a.Rule.Code, Quantity: a.Rule.Quantity, Severity: string(a.Severity), Value: a.Value,
			Warning: a.Rule.Warning, Margin: a.Margin, Unit: a.Rule.Unit, Basis: a.Rule.Basis}
		if !math.IsNaN(a.Rule.Limit) {
			lim := a.Rule.Limit
			l.Limit = &lim
		}
		out = append(out, l)
	}
	return out
}

// appendWarnings appends a result's warnings to out.
func appendWarnings(out []WarningOut, ws []service.Warning) []WarningOut {
	for _, w := range ws {
		out = append(out, WarningOut{Code: w.Code, Severity: w.Severity, Message: w.Message,
			Value: w.Value, Limit: w.Limit, Margin: w.Margin, Unit: w.Unit, Basis: w.Basis})
	}
	return out
}
