package api

import (
	"stagewright/service"
)

// RateRequest is an operating point of an installed machine: the machine
// (as /v1/stage/size answers it, or typed from a datasheet), the gas and
// suction state, the flow, and exactly one of speed or discharge_pressure.
type RateRequest struct {
	Machine MachineSpec `json:"machine" binding:"required"`
	Gas     GasSpec     `json:"gas" binding:"required"`
	Suction SuctionSpec `json:"suction" binding:"required"`
	Flow    FlowSpec    `json:"flow" binding:"required"`
	// Speed is the first stage's rotational speed, rev/min (or "rpm").
	// Give it or discharge_pressure, not both.
	Speed *Quantity `json:"speed,omitempty" binding:"required_without=DischargePressure,excluded_with=DischargePressure" swaggertype:"primitive,number" format:"double" example:"11500" extensions:"x-unit-string=speed"`
	// DischargePressure is the machine's discharge total pressure, Pa
	// absolute (or "bara", "psia"): the speed that makes it at this flow is
	// solved for by a bracketed root search (30-150 % of the design speed).
	DischargePressure *Quantity `json:"discharge_pressure,omitempty" binding:"required_without=Speed,excluded_with=Speed" swaggertype:"primitive,number" format:"double" example:"420000" extensions:"x-unit-string=pressure"`
}

// RateBatchRequest carries many operating points, e.g. from a process simulator.
type RateBatchRequest struct {
	// Ratings are rated independently; each follows the RateRequest schema.
	Ratings []RateRequest `json:"ratings" binding:"required,min=1,max=500,dive"`
}

// RateBatchResponse holds one result per rating, in request order.
type RateBatchResponse struct {
	Results []RateBatchItem `json:"results" validate:"required"`
	// Succeeded and Failed count the results by outcome.
	Succeeded int `json:"succeeded" validate:"required"`
	Failed    int `json:"failed" validate:"required"`
}

// RateBatchItem is the outcome of one rating: a result (status 200) or a problem.
type RateBatchItem struct {
	// Index is the rating's position in the request, from 0.
	Index int `json:"index" validate:"required"`
	// Status is the HTTP status the rating would have had on its own.
	Status  int           `json:"status" example:"200" validate:"required"`
	Result  *RateResponse `json:"result,omitempty"`
	Problem *Problem      `json:"problem,omitempty"`
}

// RateResponse is a machine rated at one operating point. Surge and choke
// figures are estimates (see cautions).
type RateResponse struct {
	// Speed is the first stage's speed, rev/min (given or solved).
	Speed float64 `json:"speed" format:"double" example:"11500" validate:"required"`
	// SpeedBasis says whether the speed was given or solved for the discharge pressure.
	SpeedBasis string `json:"speed_basis" enums:"given,discharge-pressure" example:"given" validate:"required"`
	// MassFlow is the mass flow at suction, kg/s.
	MassFlow float64 `json:"mass_flow" format:"double" example:"4.1" validate:"required"`
	// ActualVolumeFlow is the volume flow at suction, m3/s.
	ActualVolumeFlow   float64          `json:"actual_volume_flow" format:"double" example:"1.9" validate:"required"`
	StandardVolumeFlow StandardFlowsOut `json:"standard_volume_flow" validate:"required"`
	Discharge          RateDischargeOut `json:"discharge" validate:"required"`
	// Head is summed over the stages, J/kg.
	Head HeadOut `json:"head" validate:"required"`
	// Efficiency is the summed heads over the summed work.
	Efficiency RateEfficiencyOut `json:"efficiency" validate:"required"`
	// Work is the summed actual specific work, J/kg.
	Work  float64  `json:"work" format:"double" example:"76000" validate:"required"`
	Power PowerOut `json:"power" validate:"required"`
	// OperatingPoint places the point on the estimated map.
	OperatingPoint OperatingPointOut `json:"operating_point" validate:"required"`
	// SpeedRange is the machine's speed range as used (given or default), rev/min.
	SpeedRange SpeedRangeOut `json:"speed_range" validate:"required"`
	// DesignSpeed is the first stage's design speed, rev/min.
	DesignSpeed float64 `json:"design_speed" format:"double" example:"11500" validate:"required"`
	// DesignShaftPower is the machine's shaft power at its design point, W.
	DesignShaftPower float64 `json:"design_shaft_power" format:"double" example:"480000" validate:"required"`
	// Stages are the stages in flow order.
	Stages []StageRatingOut `json:"stages" validate:"required"`
	// Verdict is the worst severity of the warnings.
	Verdict string `json:"verdict" enums:"within-limits,near-limits,past-warning,past-limit" example:"near-limits" validate:"required"`
	// Limits is every rule applied, with its margin.
	Limits     []LimitOut    `json:"limits" validate:"required"`
	Warnings   []WarningOut  `json:"warnings" validate:"required"`
	Provenance ProvenanceOut `json:"provenance" validate:"required"`
	// Cautions say what the numbers are and are not, and defer to the manufacturer, standards and codes.
	Cautions []string `json:"cautions" validate:"required"`
}

// RateDischargeOut is the discharge stagnation state.
type RateDischargeOut struct {
	// Pressure is the discharge total pressure, Pa absolute.
	Pressure float64 `json:"pressure" format:"double" example:"420000" validate:"required"`
	// Temperature is the discharge total temperature, K.
	Temperature float64 `json:"temperature" format:"double" example:"390" validate:"required"`
}

// RateEfficiencyOut are the total-to-total efficiencies.
type RateEfficiencyOut struct {
	Polytropic float64 `json:"polytropic" format:"double" example:"0.82" validate:"required"`
	Isentropic float64 `json:"isentropic" format:"double" example:"0.79" validate:"required"`
}

// SpeedRangeOut is a speed range, rev/min.
type SpeedRangeOut struct {
	Minimum           float64 `json:"minimum" format:"double" example:"8050" validate:"required"`
	MaximumContinuous float64 `json:"maximum_continuous" format:"double" example:"12075" validate:"required"`
}

// OperatingPointOut places a rating on the estimated map; flows are actual
// volume flows at the machine's suction, m3/s. Surge and choke are estimates.
type OperatingPointOut struct {
	// FlowCoefficient is the first stage's φ = Q01/(U2 π D2²/4).
	FlowCoefficient float64 `json:"flow_coefficient" format:"double" example:"0.09" validate:"required"`
	// DesignFlowRatio is Q over the design volume flow at the same speed ratio (Q_design N/N_design).
	DesignFlowRatio float64 `json:"design_flow_ratio" format:"double" example:"1" validate:"required"`
	// SurgeMargin is Q/Q_surge − 1 at this speed (estimated), the least over the stages.
	SurgeMargin float64 `json:"surge_margin" format:"double" example:"0.25" validate:"required"`
	// ChokeMargin is 1 − Q/Q_choke at this speed (estimated), the least over the stages.
	ChokeMargin float64 `json:"choke_margin" format:"double" example:"0.3" validate:"required"`
	// SurgeFlow is the estimated surge flow at this speed, m3/s at the machine's suction.
	SurgeFlow float64 `json:"surge_flow" format:"double" example:"1.5" validate:"required"`
	// ChokeFlow is the estimated choke flow at this speed, m3/s at the machine's suction.
	ChokeFlow float64 `json:"choke_flow" format:"double" example:"2.7" validate:"required"`
	// SurgeStage and ChokeStage are the stages (from 1) that reach surge and choke first.
	SurgeStage int `json:"surge_stage" example:"1" validate:"required"`
	ChokeStage int `json:"choke_stage" example:"1" validate:"required"`
	// ChokePassage is the passage that chokes, or zero-work where a
	// backswept impeller's work falls to zero before any passage is sonic.
	ChokePassage string `json:"choke_passage" enums:"inducer-throat,eye,diffuser-throat,zero-work" example:"inducer-throat" validate:"required"`
}

// StageRatingOut is one stage of a rated machine.
type StageRatingOut struct {
	// Stage is the stage number, from 1.
	Stage int `json:"stage" example:"1" validate:"required"`
	// Speed is this stage's speed, rev/min.
	Speed float64 `json:"speed" format:"double" example:"11500" validate:"required"`
	// Suction is the stage's suction total state (velocity 0).
	Suction StateOut `json:"suction" validate:"required"`
	// MassFlow entering the stage, kg/s; VolumeFlow at its suction, m3/s.
	MassFlow   float64 `json:"mass_flow" format:"double" validate:"required"`
	VolumeFlow float64 `json:"volume_flow" format:"double" validate:"required"`
	// Discharge is the stage's discharge total state (velocity 0).
	Discharge  StateOut          `json:"discharge" validate:"required"`
	Head       HeadOut           `json:"head" validate:"required"`
	Efficiency RateEfficiencyOut `json:"efficiency" validate:"required"`
	// Work is the actual specific work, J/kg; GasPower ṁ w, W.
	Work     float64 `json:"work" format:"double" validate:"required"`
	GasPower float64 `json:"gas_power" format:"double" validate:"required"`
	// FlowCoefficient φ, WorkCoefficient w/U2², HeadCoefficient Hp/U2².
	FlowCoefficient float64 `json:"flow_coefficient" format:"double" validate:"required"`
	WorkCoefficient float64 `json:"work_coefficient" format:"double" validate:"required"`
	HeadCoefficient float64 `json:"head_coefficient" format:"double" validate:"required"`
	// DesignFlowRatio, SurgeMargin and ChokeMargin for this stage.
	DesignFlowRatio float64 `json:"design_flow_ratio" format:"double" validate:"required"`
	SurgeMargin     float64 `json:"surge_margin" format:"double" validate:"required"`
	ChokeMargin     float64 `json:"choke_margin" format:"double" validate:"required"`
	// SurgeFlow and ChokeFlow are this stage's estimated surge and choke flows at its suction, m3/s.
	SurgeFlow    float64 `json:"surge_flow" format:"double" validate:"required"`
	ChokeFlow    float64 `json:"choke_flow" format:"double" validate:"required"`
	ChokePassage string  `json:"choke_passage" enums:"inducer-throat,eye,diffuser-throat,zero-work" validate:"required"`
	// Velocities are the velocity triangles and Mach numbers at this point.
	Velocities RatingVelocitiesOut `json:"velocities" validate:"required"`
	// Cooler is the cooler after this stage, when there is one.
	Cooler *CoolerOut `json:"cooler,omitempty"`
}

// RatingVelocitiesOut are the velocity triangles at an operating point, m/s and deg.
type RatingVelocitiesOut struct {
	TipSpeed float64 `json:"tip_speed" format:"double" validate:"required"`
	// MachineMach is U2/a01.
	MachineMach float64 `json:"machine_mach" format:"double" validate:"required"`
	// InletMeridional is cm1; InletWhirl cθ1 (prewhirl).
	InletMeridional float64 `json:"inlet_meridional" format:"double" validate:"required"`
	InletWhirl      float64 `json:"inlet_whirl" format:"double" validate:"required"`
	// InletRelativeMach is W1/a1 at the eye tip (shroud) or D1.
	InletRelativeMach float64 `json:"inlet_relative_mach" format:"double" validate:"required"`
	// InletAbsoluteMach is c1/a1.
	InletAbsoluteMach float64 `json:"inlet_absolute_mach" format:"double" validate:"required"`
	// InletIncidence is the relative flow angle less the blade angle at the rms inlet radius, deg (positive towards surge).
	InletIncidence float64 `json:"inlet_incidence" format:"double" validate:"required"`
	ExitMeridional float64 `json:"exit_meridional" format:"double" validate:"required"`
	ExitWhirl      float64 `json:"exit_whirl" format:"double" validate:"required"`
	ExitAbsolute   float64 `json:"exit_absolute" format:"double" validate:"required"`
	ExitRelative   float64 `json:"exit_relative" format:"double" validate:"required"`
	// ExitAbsoluteMach is c2/a2 at the diffuser inlet.
	ExitAbsoluteMach float64 `json:"exit_absolute_mach" format:"double" validate:"required"`
	// ExitFlowAngle is α2 from radial, deg (the surge criterion's angle).
	ExitFlowAngle float64 `json:"exit_flow_angle" format:"double" validate:"required"`
	// ExitFlowCoefficient is cr2/U2.
	ExitFlowCoefficient float64 `json:"exit_flow_coefficient" format:"double" validate:"required"`
}

// CoolerOut is a cooler's outlet and what it removed.
type CoolerOut struct {
	// OutletPressure, Pa absolute, and OutletTemperature, K.
	OutletPressure    float64 `json:"outlet_pressure" format:"double" validate:"required"`
	OutletTemperature float64 `json:"outlet_temperature" format:"double" validate:"required"`
	// Condensate is the liquid removed, kg/s; Duty the heat removed, W.
	Condensate float64 `json:"condensate" format:"double" validate:"required"`
	Duty       float64 `json:"duty" format:"double" validate:"required"`
}

// rateResponseOf renders a rating, refusing any non-finite number.
func rateResponseOf(r service.Rating) (RateResponse, error) {
	op := r.OperatingPoint
	out := RateResponse{Speed: r.Speed, SpeedBasis: r.SpeedBasis, MassFlow: r.MassFlow, ActualVolumeFlow: r.ActualVolumeFlow,
		Discharge:  RateDischargeOut{Pressure: r.DischargePressure, Temperature: r.DischargeTemperature},
		Head:       HeadOut{Isentropic: r.IsentropicHead, Polytropic: r.PolytropicHead},
		Efficiency: RateEfficiencyOut{Polytropic: r.PolytropicEfficiency, Isentropic: r.IsentropicEfficiency},
		Work:       r.Work,
		Power: PowerOut{Gas: r.Power.Gas, Shaft: r.Power.Shaft, MechanicalEfficiency: r.Power.MechanicalEfficiency,
			DriverRating: r.Power.DriverRating, DriverMargin: r.Power.DriverMargin},
		OperatingPoint: OperatingPointOut{FlowCoefficient: op.FlowCoefficient, DesignFlowRatio: op.DesignFlowRatio, SurgeMargin: op.SurgeMargin,
			ChokeMargin: op.ChokeMargin, SurgeFlow: op.SurgeFlow, ChokeFlow: op.ChokeFlow, SurgeStage: op.SurgeStage, ChokeStage: op.ChokeStage,
			ChokePassage: op.ChokePassage},
		SpeedRange:  SpeedRangeOut{Minimum: r.SpeedRange.Minimum, MaximumContinuous: r.SpeedRange.MaximumContinuous},
		DesignSpeed: r.DesignSpeed, DesignShaftPower: r.DesignShaftPower,
		Stages: []StageRatingOut{}, Verdict: r.Verdict, Limits: []LimitOut{}, Warnings: []WarningOut{}, Cautions: r.Cautions,
		Provenance: provenanceOut(r.Provenance)}
	pos := func(v float64) *float64 {
		if v > 0 {
			return &v
		}
		return nil
	}
	out.StandardVolumeFlow = StandardFlowsOut{Normal: pos(r.StandardFlows.Normal), Standard: pos(r.StandardFlows.Standard), USStandard: pos(r.StandardFlows.USStandard)}
	for _, s := range r.Stages {
		p := s.Point
		c := p.Compression
		so := StageRatingOut{Stage: s.Stage, Speed: s.Speed,
			Suction:  stateOut(c.Suction.Pressure, c.Suction.Temperature, c.Suction.Density, c.Suction.Compressibility, c.Suction.SoundSpeed, 0),
			MassFlow: s.MassFlow, VolumeFlow: s.VolumeFlow,
			Discharge:  stateOut(c.Discharge.Pressure, c.Discharge.Temperature, c.Discharge.Density, c.Discharge.Compressibility, c.Discharge.SoundSpeed, 0),
			Head:       HeadOut{Isentropic: float64(c.IsentropicHead), Polytropic: float64(c.PolytropicHead)},
			Efficiency: RateEfficiencyOut{Polytropic: c.PolytropicEfficiency, Isentropic: c.IsentropicEfficiency},
			Work:       float64(c.Work), GasPower: s.GasPower,
			FlowCoefficient: p.FlowCoefficient, WorkCoefficient: p.WorkCoefficient, HeadCoefficient: p.HeadCoefficient,
			DesignFlowRatio: s.DesignFlowRatio, SurgeMargin: s.SurgeMargin, ChokeMargin: s.ChokeMargin,
			SurgeFlow: s.SurgeFlow, ChokeFlow: s.ChokeFlow, ChokePassage: s.ChokePassage,
			Velocities: RatingVelocitiesOut{TipSpeed: p.TipSpeed, MachineMach: p.TipMach, InletMeridional: p.InletMeridional, InletWhirl: p.InletWhirl,
				InletRelativeMach: p.InletRelativeMachShroud, InletAbsoluteMach: p.InletAbsoluteMach, InletIncidence: p.InletIncidence,
				ExitMeridional: p.ExitMeridional, ExitWhirl: p.ExitWhirl, ExitAbsolute: p.ExitAbsolute, ExitRelative: p.ExitRelative,
				ExitAbsoluteMach: p.ExitAbsoluteMach, ExitFlowAngle: p.ExitFlowAngle, ExitFlowCoefficient: p.ExitFlowCoefficient}}
		if s.Cooler != nil {
			so.Cooler = &CoolerOut{OutletPressure: s.Cooler.OutletPressure, OutletTemperature: s.Cooler.OutletTemperature,
				Condensate: s.Cooler.Condensate, Duty: s.Cooler.Duty}
		}
		out.Stages = append(out.Stages, so)
	}
	out.Limits = appendLimits(out.Limits, r.Assessments)
	out.Warnings = appendWarnings(out.Warnings, r.Warnings)
	if err := allFinite(out); err != nil {
		return RateResponse{}, err
	}
	return out, nil
}
