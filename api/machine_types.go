package api

// MachineSpec is an installed compressor as built: the stages in flow
// order, the coolers between them, the speed range and the driver. The
// design endpoints (/v1/stage/size, /v1/section/size) answer one in
// exactly this shape; the machine endpoints (/v1/machine/rate, /map,
// /check) take it back unchanged. An asset system stores it as is; an
// engineer may type one from a datasheet (dimensions as numbers in SI or
// strings with a unit, e.g. "310 mm"). The least a stage needs is listed
// in the README ("Machines").
type MachineSpec struct {
	// Name is a free tag of the caller's (an asset or tag number); not used in the calculation.
	Name string `json:"name,omitempty" example:"K-4101"`
	// Arrangement is "single" (one stage), "geared" (each stage on its own
	// pinion speed, as in an integrally geared machine) or "inline" (one
	// shaft speed for every impeller). Every stage turns at a fixed ratio to
	// the first stage's speed: its design speed over the first stage's.
	Arrangement string `json:"arrangement,omitempty" binding:"omitempty,oneof=single geared inline" enums:"single,geared,inline" example:"single"`
	// Stages are the impellers in flow order (at least one).
	Stages []MachineStageSpec `json:"stages" binding:"required,min=1,max=12,dive" validate:"required"`
	// Coolers are the intercoolers, each after the stage it names (1-based).
	Coolers []MachineCoolerSpec `json:"coolers,omitempty" binding:"omitempty,max=11,dive"`
	// SpeedRange bounds the first stage's speed, rev/min; default 70 % and
	// 105 % of the design speed (recorded in provenance).
	SpeedRange *SpeedRangeSpec `json:"speed_range,omitempty"`
	// Driver is the installed driver; default a rating of 1.10 × the design
	// shaft power (recorded in provenance).
	Driver *MachineDriverSpec `json:"driver,omitempty"`
	// MechanicalEfficiency is gas power over shaft power of the whole
	// machine (bearings, seals, gears); default 0.98.
	MechanicalEfficiency *float64 `json:"mechanical_efficiency,omitempty" format:"double" minimum:"0.8" maximum:"1" example:"0.98"`
	// SurgeControl is the anti-surge control line (used by /v1/machine/check).
	SurgeControl *SurgeControlSpec `json:"surge_control,omitempty"`
	// LimitOverrides replaces the levels of limit rules, keyed by rule
	// (the rule names are in each limits[] entry of a sizing answer).
	LimitOverrides map[string]LevelOverrideSpec `json:"limit_overrides,omitempty" binding:"omitempty,dive"`
}

// MachineStageSpec is one impeller as built, with its inlet, diffuser and
// the design point it was sized for.
type MachineStageSpec struct {
	// TipDiameter is the impeller tip diameter D2, m (or "mm", "in").
	TipDiameter *Quantity `json:"tip_diameter" binding:"required" swaggertype:"primitive,number" format:"double" example:"0.42" extensions:"x-unit-string=length" validate:"required"`
	// ExitWidth is the impeller exit width b2, m (or "mm", "in").
	ExitWidth *Quantity `json:"exit_width" binding:"required" swaggertype:"primitive,number" format:"double" example:"0.021" extensions:"x-unit-string=length" validate:"required"`
	// BladeExitAngle is the blade backsweep at the exit from radial, deg (0: radial blades).
	BladeExitAngle *float64 `json:"blade_exit_angle" binding:"required" format:"double" minimum:"0" maximum:"75" example:"40" validate:"required"`
	// BladeCount is the number of blades at the exit (needed with slip_model).
	BladeCount *int `json:"blade_count,omitempty" minimum:"2" maximum:"60" example:"17"`
	// SlipModel is the slip correlation used with blade_count: "wiesner", "stanitz" or "stodola".
	SlipModel string `json:"slip_model,omitempty" binding:"omitempty,oneof=wiesner stanitz stodola" enums:"wiesner,stanitz,stodola" example:"wiesner"`
	// SlipFactor is a fixed slip factor, 1 − slip velocity / tip speed, instead of slip_model.
	SlipFactor *float64 `json:"slip_factor,omitempty" format:"double" minimum:"0" maximum:"1" example:"0.88"`
	// ExitBlockage is the blocked fraction of the exit area; default 0.1.
	ExitBlockage *float64 `json:"exit_blockage,omitempty" format:"double" minimum:"0" maximum:"0.5" example:"0.1"`
	// PowerInputFactor is actual work over Euler work (disc friction, windage); default 1.
	PowerInputFactor *float64 `json:"power_input_factor,omitempty" format:"double" minimum:"1" maximum:"2" example:"1"`
	// Inlet is the impeller inlet as built.
	Inlet MachineInletSpec `json:"inlet" binding:"required" validate:"required"`
	// Diffuser is the diffuser as built; default vaneless.
	Diffuser *MachineDiffuserSpec `json:"diffuser,omitempty"`
	// Construction sets the tip-speed and pressure-ratio levels: "closed-steel"
	// (default), "open-steel", "open-aluminium" or "open-titanium".
	Construction string `json:"construction,omitempty" binding:"omitempty,oneof=closed-steel open-steel open-aluminium open-titanium" enums:"closed-steel,open-steel,open-aluminium,open-titanium" example:"closed-steel"`
	// Design is the point the stage was sized for.
	Design DesignPointSpec `json:"design" binding:"required" validate:"required"`
	// PolytropicMethod is the method of the design polytropic efficiency and of
	// the rating's compression path: "stepwise" (default) or "schultz" (ASME PTC 10).
	PolytropicMethod string `json:"polytropic_method,omitempty" binding:"omitempty,oneof=stepwise schultz" enums:"stepwise,schultz" example:"stepwise"`
	// ImpellerLossShare is the fraction of the stage loss arising in the
	// impeller (sets the impeller exit density); default 0.5, as the sizing.
	ImpellerLossShare *float64 `json:"impeller_loss_share,omitempty" format:"double" minimum:"0" maximum:"1" example:"0.5"`
}

// MachineInletSpec is the inlet as built: an "axial-eye" with its eye tip
// and hub diameters, or a "radial" inlet with its diameter D1 and width b1.
type MachineInletSpec struct {
	// Type is "axial-eye" or "radial".
	Type string `json:"type" binding:"required,oneof=axial-eye radial" enums:"axial-eye,radial" example:"axial-eye" validate:"required"`
	// EyeTipDiameter is the eye (shroud) diameter D1t of an axial eye, m.
	EyeTipDiameter *Quantity `json:"eye_tip_diameter,omitempty" swaggertype:"primitive,number" format:"double" example:"0.2" extensions:"x-unit-string=length"`
	// EyeHubDiameter is the hub diameter at the eye of an axial eye, m.
	EyeHubDiameter *Quantity `json:"eye_hub_diameter,omitempty" swaggertype:"primitive,number" format:"double" example:"0.07" extensions:"x-unit-string=length"`
	// Diameter is the blade inlet diameter D1 of a radial inlet, m.
	Diameter *Quantity `json:"diameter,omitempty" swaggertype:"primitive,number" format:"double" example:"0.19" extensions:"x-unit-string=length"`
	// Width is the blade inlet width b1 of a radial inlet, m.
	Width *Quantity `json:"width,omitempty" swaggertype:"primitive,number" format:"double" example:"0.03" extensions:"x-unit-string=length"`
	// PrewhirlAngle is a fixed inlet-guide-vane flow angle at the eye, deg from axial, positive with rotation.
	PrewhirlAngle *float64 `json:"prewhirl_angle,omitempty" format:"double" minimum:"-30" maximum:"60" example:"0"`
}

// MachineDiffuserSpec is the diffuser as built.
type MachineDiffuserSpec struct {
	// Type is "vaneless" or "vaned".
	Type string `json:"type" binding:"required,oneof=vaneless vaned" enums:"vaneless,vaned" example:"vaneless" validate:"required"`
	// ThroatArea is the total throat area of a vaned diffuser's passages,
	// m2, for the choke estimate (estimated from the exit area when absent).
	ThroatArea *float64 `json:"throat_area,omitempty" format:"double" minimum:"0" example:"0.012"`
}

// DesignPointSpec is the point a stage was sized for. speed, volume_flow,
// polytropic_efficiency, the suction state and the gas define it; the
// derived numbers (mass_flow, flow_coefficient, work_coefficient,
// tip_mach, polytropic_head) are answered by the design endpoints and may
// be left out when a machine is typed from a datasheet: they are then
// computed from the rest.
type DesignPointSpec struct {
	// Speed is the stage's design rotational speed, rev/min (or "rpm").
	Speed *Quantity `json:"speed" binding:"required" swaggertype:"primitive,number" format:"double" example:"11500" extensions:"x-unit-string=speed" validate:"required"`
	// VolumeFlow is the design actual volume flow at the stage's suction, m3/s (or "m3/h", "acfm").
	VolumeFlow *Quantity `json:"volume_flow" binding:"required" swaggertype:"primitive,number" format:"double" example:"1.9" extensions:"x-unit-string=volume-flow" validate:"required"`
	// MassFlow is the design mass flow, kg/s.
	MassFlow *float64 `json:"mass_flow,omitempty" format:"double" minimum:"0" example:"4.1"`
	// FlowCoefficient is φ = Q01/(U2 π D2²/4) at design.
	FlowCoefficient *float64 `json:"flow_coefficient,omitempty" format:"double" minimum:"0" example:"0.09"`
	// WorkCoefficient is λ = w/U2² at design (actual work, with the power input factor).
	WorkCoefficient *float64 `json:"work_coefficient,omitempty" format:"double" minimum:"0" example:"0.62"`
	// PolytropicEfficiency is the design total-to-total polytropic efficiency.
	PolytropicEfficiency *float64 `json:"polytropic_efficiency" binding:"required" format:"double" minimum:"0" maximum:"1" example:"0.82" validate:"required"`
	// TipMach is the machine Mach number U2/a01 at design.
	TipMach *float64 `json:"tip_mach,omitempty" format:"double" minimum:"0" example:"0.78"`
	// PolytropicHead is the design polytropic head, J/kg.
	PolytropicHead *float64 `json:"polytropic_head,omitempty" format:"double" minimum:"0" example:"62000"`
	// Suction is the stage's design suction total state.
	Suction SuctionSpec `json:"suction" binding:"required" validate:"required"`
	// DischargePressure is the stage's design discharge total pressure, Pa absolute.
	DischargePressure *Quantity `json:"discharge_pressure,omitempty" swaggertype:"primitive,number" format:"double" example:"420000" extensions:"x-unit-string=pressure"`
	// Gas is the gas the stage was sized for.
	Gas GasSpec `json:"gas" binding:"required" validate:"required"`
}

// MachineCoolerSpec is an intercooler: the gas leaves at
// outlet_temperature, or at coolant_temperature + approach, with
// pressure_drop across it; condensate that forms is removed.
type MachineCoolerSpec struct {
	// AfterStage is the stage (1-based) the cooler follows.
	AfterStage int `json:"after_stage" binding:"required,min=1" minimum:"1" example:"1" validate:"required"`
	// OutletTemperature is the gas temperature leaving the cooler, K (or "40 degC").
	OutletTemperature *Quantity `json:"outlet_temperature,omitempty" swaggertype:"primitive,number" format:"double" example:"313.15" extensions:"x-unit-string=temperature"`
	// Approach is the outlet temperature above the coolant temperature, K.
	Approach *float64 `json:"approach,omitempty" format:"double" minimum:"0" example:"10"`
	// CoolantTemperature is the coolant inlet temperature, K (or "30 degC").
	CoolantTemperature *Quantity `json:"coolant_temperature,omitempty" swaggertype:"primitive,number" format:"double" example:"303.15" extensions:"x-unit-string=temperature"`
	// PressureDrop is the gas pressure drop across the cooler, Pa (or "0.3 bar").
	PressureDrop *Quantity `json:"pressure_drop,omitempty" swaggertype:"primitive,number" format:"double" example:"30000" extensions:"x-unit-string=pressure-difference"`
}

// SpeedRangeSpec bounds the first stage's speed, rev/min.
type SpeedRangeSpec struct {
	// Minimum is the minimum operating speed, rev/min.
	Minimum *Quantity `json:"minimum" binding:"required" swaggertype:"primitive,number" format:"double" example:"8050" extensions:"x-unit-string=speed" validate:"required"`
	// MaximumContinuous is the maximum continuous speed, rev/min.
	MaximumContinuous *Quantity `json:"maximum_continuous" binding:"required" swaggertype:"primitive,number" format:"double" example:"12075" extensions:"x-unit-string=speed" validate:"required"`
}

// MachineDriverSpec is the installed driver.
type MachineDriverSpec struct {
	// Rating is the driver's rated power, W (or "kW", "MW", "hp").
	Rating *Quantity `json:"rating,omitempty" swaggertype:"primitive,number" format:"double" example:"750000" extensions:"x-unit-string=power"`
}

// SurgeControlSpec is the anti-surge control line.
type SurgeControlSpec struct {
	// Margin is the control line's distance from surge as a fraction of the
	// surge flow at the same speed (0.1: control at 1.1 × the surge flow).
	Margin *float64 `json:"margin,omitempty" format:"double" minimum:"0" maximum:"0.5" example:"0.1"`
}
