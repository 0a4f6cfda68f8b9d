package api

// StageRequest is one gas duty and the impeller choices to size a stage for.
type StageRequest struct {
	Gas     GasSpec     `json:"gas" binding:"required"`
	Suction SuctionSpec `json:"suction" binding:"required"`
	// DischargePressure is the discharge total pressure, Pa absolute (or a
	// string with a unit). Give it or pressure_ratio, not both.
	DischargePressure *Quantity `json:"discharge_pressure,omitempty" binding:"required_without=PressureRatio,excluded_with=PressureRatio" swaggertype:"primitive,number" format:"double" example:"420000" extensions:"x-unit-string=pressure"`
	// PressureRatio is the total-to-total pressure ratio p02/p01 (> 1).
	PressureRatio *float64 `json:"pressure_ratio,omitempty" binding:"required_without=DischargePressure,excluded_with=DischargePressure" format:"double" minimum:"1" example:"4.2"`
	Flow          FlowSpec `json:"flow" binding:"required"`
	// Speed is the rotational speed, rev/min (or "rpm", "rad/s", "Hz").
	// Give at most one of speed, tip_diameter and speed_target; with none
	// the speed is chosen for the default specific speed (0.7).
	Speed *Quantity `json:"speed,omitempty" swaggertype:"primitive,number" format:"double" example:"21000" extensions:"x-unit-string=speed"`
	// TipDiameter is a given impeller tip diameter D2, m (or "mm", "in"):
	// the speed is then the one at which D2 makes the head.
	TipDiameter *Quantity `json:"tip_diameter,omitempty" swaggertype:"primitive,number" format:"double" example:"0.42" extensions:"x-unit-string=length"`
	// SpeedTarget chooses the speed for a specific speed or a flow coefficient.
	SpeedTarget *SpeedTargetSpec `json:"speed_target,omitempty"`
	// SpeedStep rounds a chosen speed to the nearest multiple of this many
	// rev/min (e.g. 50, or a motor's synchronous speed).
	SpeedStep *float64 `json:"speed_step,omitempty" format:"double" minimum:"0" example:"50"`
	// Efficiency is the stage total-to-total efficiency; leave it out to
	// have the polytropic efficiency estimated from the Casey & Robinson
	// (2013) correlation in flow coefficient and tip Mach number.
	Efficiency *EfficiencySpec `json:"efficiency,omitempty"`
	// MechanicalEfficiency is gas power over shaft power (bearing and seal
	// losses), 0.8 to 1; default 0.98.
	MechanicalEfficiency *float64 `json:"mechanical_efficiency,omitempty" binding:"excluded_with=MechanicalLosses" format:"double" minimum:"0.8" maximum:"1" example:"0.98"`
	// MechanicalLosses are the bearing, seal and gear losses, W (or "kW"),
	// instead of mechanical_efficiency: shaft power = gas power + losses;
	// at most a quarter of the gas power.
	MechanicalLosses *Quantity `json:"mechanical_losses,omitempty" swaggertype:"primitive,number" format:"double" example:"12000" extensions:"x-unit-string=power"`
	// Impeller is the blading and inlet; leave it (or any of its fields)
	// out for the defaults of a backswept process impeller, each recorded
	// in provenance.defaults_applied.
	Impeller *ImpellerSpec `json:"impeller,omitempty"`
	Diffuser *DiffuserSpec `json:"diffuser,omitempty"`
	Options  *OptionsSpec  `json:"options,omitempty"`
	Driver   *DriverSpec   `json:"driver,omitempty"`
	// LimitOverrides replaces the levels of limit rules for this request,
	// keyed by rule ("tip-speed", "discharge-temperature",
	// "flow-coefficient-low", ...; the rule names are in each limits[] entry).
	LimitOverrides map[string]LevelOverrideSpec `json:"limit_overrides,omitempty" binding:"omitempty,dive"`
}

// SpeedTargetSpec is one of a target specific speed or flow coefficient.
type SpeedTargetSpec struct {
	// SpecificSpeed is Ns = Ω √Q01 / Δh_s^0.75 (Ω rad/s, Q01 m3/s, Δh_s J/kg); best efficiency near 0.6-0.8.
	SpecificSpeed *float64 `json:"specific_speed,omitempty" format:"double" minimum:"0.1" maximum:"3" example:"0.7"`
	// FlowCoefficient is φ = Q01 / (U2 π D2²/4); best efficiency near 0.08-0.13.
	FlowCoefficient *float64 `json:"flow_coefficient,omitempty" format:"double" minimum:"0.002" maximum:"0.4" example:"0.09"`
}

// DriverSpec is the driver: a rating margin, or an installed rating.
type DriverSpec struct {
	// Margin is the least driver rating over shaft power; default 1.10
	// (API 617 / API 541 motor rule, from memory).
	Margin *float64 `json:"margin,omitempty" format:"double" minimum:"1" maximum:"3" example:"1.1"`
	// Rating is the rating of an installed driver, W (or "kW", "MW", "hp"); its margin is graded.
	Rating *Quantity `json:"rating,omitempty" swaggertype:"primitive,number" format:"double" example:"750000" extensions:"x-unit-string=power"`
}

// LevelOverrideSpec replaces a limit rule's levels, in the rule's unit
// (SI: K for temperatures, m/s, J/kg, or dimensionless).
type LevelOverrideSpec struct {
	// Warning is the soft level.
	Warning *float64 `json:"warning" binding:"required" format:"double" example:"320"`
	// Limit is the hard level (leave out for none).
	Limit *float64 `json:"limit,omitempty" format:"double" example:"380"`
}

// GasSpec selects the gas model. "ideal-constant" needs cp and gamma; the
// other models need a composition.
type GasSpec struct {
	// Model is the property model.
	Model string `json:"model" binding:"required,oneof=ideal-constant ideal peng-robinson srk gerg-2008" enums:"ideal-constant,ideal,peng-robinson,srk,gerg-2008" example:"ideal-constant"`
	// Cp is the isobaric specific heat capacity for "ideal-constant", J/(kg K).
	Cp *float64 `json:"cp,omitempty" format:"double" minimum:"0" example:"1005"`
	// Gamma is the ratio of specific heats cp/cv for "ideal-constant":
	// above 1, at most 5/3 (1.6667 accepted).
	Gamma *float64 `json:"gamma,omitempty" format:"double" minimum:"1" maximum:"1.6667" extensions:"x-exclusive-minimum=true" example:"1.4"`
	// Composition maps component (formula or name, e.g. "CH4", "methane")
	// to its fraction, for the "ideal", "peng-robinson", "srk" and "gerg-2008"
	// models ("gerg-2008" takes only its 21 components).
	Composition map[string]float64 `json:"composition,omitempty" swaggertype:"object,number" example:"CH4:0.9,C2H6:0.1"`
	// CompositionBasis says whether the fractions are mole (default) or mass fractions.
	CompositionBasis string `json:"composition_basis,omitempty" binding:"omitempty,oneof=mole mass" enums:"mole,mass" example:"mole"`
	// BinaryInteraction overrides the cubic-EOS kij of component pairs
	// (peng-robinson and srk only).
	BinaryInteraction []BinaryInteractionSpec `json:"binary_interaction,omitempty" binding:"omitempty,dive"`
	// RelativeHumidity of air at suction, 0..1 (adds water vapour).
	RelativeHumidity *float64 `json:"relative_humidity,omitempty" format:"double" minimum:"0" maximum:"1" example:"0.6"`
	// Service sets the discharge-temperature limit: "process" (default),
	// "air" (per stage before intercooling) or "fouling" (polymerising gases).
	Service string `json:"service,omitempty" binding:"omitempty,oneof=process air fouling" enums:"process,air,fouling" example:"air"`
}

// BinaryInteractionSpec is one kij override.
type BinaryInteractionSpec struct {
	// Pair names the two components.
	Pair []string `json:"pair" binding:"required,len=2" example:"CH4,CO2"`
	// Kij is the binary interaction parameter, dimensionless.
	Kij *float64 `json:"kij" binding:"required" format:"double" example:"0.1"`
}

// SuctionSpec is the suction stagnation state.
type SuctionSpec struct {
	// Pressure is the suction total pressure, Pa absolute (or "1.013 bara", "14.7 psia", "0.2 barg").
	Pressure *Quantity `json:"pressure" binding:"required" swaggertype:"primitive,number" format:"double" example:"100000" extensions:"x-unit-string=pressure"`
	// Temperature is the suction total temperature, K (or "35 degC", "95 degF").
	Temperature *Quantity `json:"temperature" binding:"required" swaggertype:"primitive,number" format:"double" example:"300" extensions:"x-unit-string=temperature"`
	// Ambient is the ambient pressure for gauge units ("barg", "psig"), Pa
	// absolute; default the standard atmosphere 101325 Pa.
	Ambient *Quantity `json:"ambient,omitempty" swaggertype:"primitive,number" format:"double" example:"101325" extensions:"x-unit-string=pressure"`
}

// FlowSpec is the flow through the stage: exactly one of mass,
// actual_volume and standard_volume.
type FlowSpec struct {
	// Mass is the mass flow, kg/s (or "kg/h", "t/h", "lb/h").
	Mass *Quantity `json:"mass,omitempty" swaggertype:"primitive,number" format:"double" example:"3.2" extensions:"x-unit-string=mass-flow"`
	// ActualVolume is the volume flow at suction conditions, m3/s (or "m3/h", "acfm").
	ActualVolume *Quantity `json:"actual_volume,omitempty" swaggertype:"primitive,number" format:"double" example:"2.7" extensions:"x-unit-string=volume-flow"`
	// StandardVolume is the volume flow at a reference condition, m3/s (or
	// "2400 Nm3/h", "48 MMSCFD", "1500 SCFM", which name their reference).
	StandardVolume *Quantity `json:"standard_volume,omitempty" swaggertype:"primitive,number" format:"double" example:"0.65" extensions:"x-unit-string=standard-volume-flow"`
	// Reference names the reference condition of a numeric standard_volume:
	// "normal" (0 degC, 101.325 kPa), "standard" (ISO 13443: 15 degC,
	// 101.325 kPa) or "us-standard" (60 degF, 14.696 psia).
	Reference string `json:"reference,omitempty" binding:"omitempty,oneof=normal standard us-standard" enums:"normal,standard,us-standard" example:"normal"`
}

// EfficiencySpec is the stage total-to-total efficiency: exactly one of
// isentropic or polytropic, each in [0.3, 1].
type EfficiencySpec struct {
	Isentropic *float64 `json:"isentropic,omitempty" binding:"required_without=Polytropic,excluded_with=Polytropic" format:"double" minimum:"0.3" maximum:"1" example:"0.8"`
	Polytropic *float64 `json:"polytropic,omitempty" binding:"required_without=Isentropic,excluded_with=Isentropic" format:"double" minimum:"0.3" maximum:"1" example:"0.82"`
}

// ImpellerSpec is the blading and inlet of the impeller.
type ImpellerSpec struct {
	// BladeExitAngle is the backsweep from radial, deg; 0 = radial blades; default 40.
	BladeExitAngle *float64 `json:"blade_exit_angle,omitempty" format:"double" minimum:"0" maximum:"75" example:"40"`
	// SlipFactor is 1 − slip velocity / tip speed, so that
	// cθ2 = U2 (slip_factor − φ2 tan(blade_exit_angle)), in (0, 1].
	// Give it, or slip_model with blade_count.
	SlipFactor *float64 `json:"slip_factor,omitempty" format:"double" minimum:"0" maximum:"1" example:"0.9"`
	// SlipModel computes the slip factor when slip_factor is not given:
	// "wiesner" (1967, with its limiting inlet radius-ratio correction;
	// the default, with 17 blades), "stanitz" or "stodola".
	SlipModel string `json:"slip_model,omitempty" binding:"omitempty,oneof=wiesner stanitz stodola" enums:"wiesner,stanitz,stodola" example:"wiesner"`
	// BladeCount is the number of blades at the impeller exit (with slip_model).
	BladeCount *int `json:"blade_count,omitempty" minimum:"2" maximum:"60" example:"17"`
	// PowerInputFactor is actual work over Euler work (>= 1; disc friction
	// and windage); default 1.
	PowerInputFactor *float64 `json:"power_input_factor,omitempty" format:"double" minimum:"1" example:"1.04"`
	// Inlet is the inlet; default an axial eye of hub ratio 0.35 sized for the least shroud relative Mach number.
	Inlet *InletSpec `json:"inlet,omitempty"`
	// ExitMeridionalVelocity is the radial velocity cr2 at the tip, m/s;
	// default 0.25 × the tip speed (exit flow coefficient 0.25).
	ExitMeridionalVelocity *Quantity `json:"exit_meridional_velocity,omitempty" swaggertype:"primitive,number" format:"double" example:"110" extensions:"x-unit-string=velocity"`
	// Construction sets the tip-speed and stage pressure-ratio levels:
	// "closed-steel" (default), "open-steel", "open-aluminium", "open-titanium".
	Construction string `json:"construction,omitempty" binding:"omitempty,oneof=closed-steel open-steel open-aluminium open-titanium" enums:"closed-steel,open-steel,open-aluminium,open-titanium" example:"open-aluminium"`
	// ExitBlockage is the blocked fraction of the exit area (blades and
	// boundary layers), 0 <= B < 0.5, so that b2 = ṁ/(ρ2 cr2 π D2 (1 − B)); default 0.1.
	ExitBlockage *float64 `json:"exit_blockage,omitempty" format:"double" minimum:"0" maximum:"0.5" example:"0.1"`
}

// InletSpec is the inlet configuration: "radial" (blades met at D1 =
// diameter_ratio·D2 with meridional_velocity) or "axial-eye" (an annular
// eye of hub_ratio whose tip diameter is given, follows from
// meridional_velocity, or, with neither, is chosen for the least shroud
// relative Mach number).
type InletSpec struct {
	// Type is "radial" or "axial-eye" (default).
	Type string `json:"type,omitempty" binding:"omitempty,oneof=radial axial-eye" enums:"radial,axial-eye" example:"axial-eye"`
	// DiameterRatio is D1/D2 for a radial inlet.
	DiameterRatio *float64 `json:"diameter_ratio,omitempty" binding:"required_if=Type radial,excluded_unless=Type radial" format:"double" minimum:"0" maximum:"1" example:"0.45"`
	// HubRatio is eye hub diameter / eye tip diameter for an axial eye; default 0.35.
	HubRatio *float64 `json:"hub_ratio,omitempty" binding:"excluded_if=Type radial" format:"double" minimum:"0" maximum:"0.95" example:"0.35"`
	// MeridionalVelocity is the velocity entering the blades, m/s (required for a radial inlet).
	MeridionalVelocity *Quantity `json:"meridional_velocity,omitempty" binding:"required_if=Type radial" swaggertype:"primitive,number" format:"double" example:"130" extensions:"x-unit-string=velocity"`
	// EyeTipDiameter is a given eye tip diameter of an axial eye, m.
	EyeTipDiameter *Quantity `json:"eye_tip_diameter,omitempty" binding:"excluded_if=Type radial" swaggertype:"primitive,number" format:"double" example:"0.2" extensions:"x-unit-string=length"`
	// PrewhirlAngle is the inlet-guide-vane absolute flow angle at the eye,
	// deg from axial, positive with rotation, uniform across the span (axial eye only).
	PrewhirlAngle *float64 `json:"prewhirl_angle,omitempty" binding:"excluded_if=Type radial" format:"double" minimum:"-30" maximum:"60" example:"15"`
}

// DiffuserSpec names the diffuser downstream of the impeller; it sets the
// diffuser-inlet Mach limit and whether the flow-angle (stall) rule applies.
type DiffuserSpec struct {
	Type string `json:"type" binding:"required,oneof=vaneless vaned" enums:"vaneless,vaned" example:"vaneless"`
}

// OptionsSpec holds method choices.
type OptionsSpec struct {
	// PolytropicMethod picks the polytropic head reported: "stepwise"
	// (default, the path integrated in small steps) or "schultz" (ASME PTC 10).
	PolytropicMethod string `json:"polytropic_method,omitempty" binding:"omitempty,oneof=stepwise schultz" enums:"stepwise,schultz" example:"stepwise"`
	// ImpellerLossShare is the fraction of the stage loss that arises in the
	// impeller when the exit static state is found; default 0.5.
	ImpellerLossShare *float64 `json:"impeller_loss_share,omitempty" format:"double" minimum:"0" maximum:"1" example:"0.5"`
}
