package api

// StageResponse is a sized stage. Every number is SI; the unit is in each
// field's description.
type StageResponse struct {
	// MassFlow through the stage, kg/s.
	MassFlow float64 `json:"mass_flow" format:"double" example:"3.2" validate:"required"`
	// SuctionVolumeFlow is the actual volume flow at suction stagnation conditions, m3/s.
	SuctionVolumeFlow float64 `json:"suction_volume_flow" format:"double" example:"2.7" validate:"required"`
	// StandardVolumeFlow is the flow at reference conditions, m3/s.
	StandardVolumeFlow StandardFlowsOut `json:"standard_volume_flow" validate:"required"`
	// Speed is the rotational speed, rev/min.
	Speed float64 `json:"speed" format:"double" example:"21000" validate:"required"`
	// SpeedChoice says how the speed was found.
	SpeedChoice SpeedChoiceOut `json:"speed_choice" validate:"required"`
	Discharge   DischargeOut   `json:"discharge" validate:"required"`
	// Work is the actual specific work h02 − h01, J/kg.
	Work         float64         `json:"work" format:"double" example:"150000" validate:"required"`
	Head         HeadOut         `json:"head" validate:"required"`
	Efficiency   EfficiencyOut   `json:"efficiency" validate:"required"`
	Power        PowerOut        `json:"power" validate:"required"`
	Velocities   VelocitiesOut   `json:"velocities" validate:"required"`
	Geometry     GeometryOut     `json:"geometry" validate:"required"`
	Inducer      InducerOut      `json:"inducer" validate:"required"`
	Coefficients CoefficientsOut `json:"coefficients" validate:"required"`
	Stations     StationsOut     `json:"stations" validate:"required"`
	Polytropic   PolytropicOut   `json:"polytropic_methods" validate:"required"`
	// Verdict follows the worst warning: "within-limits" (no warning),
	// "near-limits" (notices only), "past-warning" (a warning level passed)
	// or "past-limit" (a limit of normal practice passed).
	Verdict string `json:"verdict" enums:"within-limits,near-limits,past-warning,past-limit" example:"past-warning" validate:"required"`
	// Limits lists every limit rule applied, with its levels and margin.
	Limits []LimitOut `json:"limits" validate:"required"`
	// Warnings lists every concern: limits near (notice) or past their
	// levels, and the validity of the physics (near-critical-state,
	// condensation-risk, water-dew-point, correlation-out-of-range,
	// polytropic-methods-disagree). Each carries a value and a limit.
	Warnings   []WarningOut  `json:"warnings" validate:"required"`
	Provenance ProvenanceOut `json:"provenance" validate:"required"`
	// Cautions are short sentences: what the numbers are, the protections
	// the duty needs and the hazards of its gas; they defer to the
	// manufacturer, the standards, local codes and licensed engineering practice.
	Cautions []string `json:"cautions" validate:"required"`
	// Machine is the stage as built, in exactly the shape /v1/machine/rate
	// and /v1/machine/map take back (numbers in SI).
	Machine MachineSpec `json:"machine" validate:"required"`
}

// SpeedChoiceOut says how the speed was found.
type SpeedChoiceOut struct {
	// Basis is "given", "tip-diameter", "specific-speed" or "flow-coefficient".
	Basis string `json:"basis" enums:"given,tip-diameter,specific-speed,flow-coefficient" example:"specific-speed" validate:"required"`
	// Target is the specific speed or flow coefficient aimed at, or the tip diameter given (m); absent for a given speed.
	Target *float64 `json:"target,omitempty" format:"double" example:"0.7"`
	// Unrounded is the speed before rounding to speed_step, rev/min.
	Unrounded float64 `json:"unrounded" format:"double" example:"21437" validate:"required"`
}

// InducerOut is the inlet of the blades: at the eye (axial eye) or at D1 (radial inlet).
type InducerOut struct {
	// EyeChoice is how the eye tip diameter was found: "given-diameter",
	// "meridional-velocity" or "min-shroud-mach" (absent for a radial inlet).
	EyeChoice string `json:"eye_choice,omitempty" enums:"given-diameter,meridional-velocity,min-shroud-mach" example:"min-shroud-mach"`
	// ShroudRelativeMach is W1/a1 at the eye tip (or at D1 of a radial inlet).
	ShroudRelativeMach float64 `json:"shroud_relative_mach" format:"double" example:"0.82" validate:"required"`
	// AbsoluteMach is c1/a1 entering the blades.
	AbsoluteMach float64 `json:"absolute_mach" format:"double" example:"0.4" validate:"required"`
	// PrewhirlAngle is the inlet guide-vane flow angle used, deg from axial.
	PrewhirlAngle float64 `json:"prewhirl_angle" format:"double" example:"0" validate:"required"`
	// BladeAngleHub, BladeAngleMean and BladeAngleShroud are the relative
	// flow angles from the meridional direction at the eye hub, the rms
	// diameter and the eye tip, deg (all equal for a radial inlet).
	BladeAngleHub    float64 `json:"blade_angle_hub" format:"double" example:"35" validate:"required"`
	BladeAngleMean   float64 `json:"blade_angle_mean" format:"double" example:"52" validate:"required"`
	BladeAngleShroud float64 `json:"blade_angle_shroud" format:"double" example:"60" validate:"required"`
}

// StandardFlowsOut is the flow as standard volume, m3/s, at each reference
// condition (absent where the gas would not be a gas there).
type StandardFlowsOut struct {
	// Normal is at 0 degC and 101.325 kPa (DIN 1343), m3/s.
	Normal *float64 `json:"normal,omitempty" format:"double"`
	// Standard is at 15 degC and 101.325 kPa (ISO 13443), m3/s.
	Standard *float64 `json:"standard,omitempty" format:"double"`
	// USStandard is at 60 degF and 14.696 psia, m3/s.
	USStandard *float64 `json:"us_standard,omitempty" format:"double"`
}

// DischargeOut is the discharge total state.
type DischargeOut struct {
	// Pressure is the discharge total pressure, Pa absolute.
	Pressure float64 `json:"pressure" format:"double" example:"420000" validate:"required"`
	// Temperature is the discharge total temperature, K.
	Temperature float64 `json:"temperature" format:"double" example:"460" validate:"required"`
	// IsentropicTemperature is the temperature at the discharge pressure and suction entropy, K.
	IsentropicTemperature float64 `json:"isentropic_temperature" format:"double" example:"430" validate:"required"`
}

// HeadOut holds the heads, J/kg.
type HeadOut struct {
	Isentropic float64 `json:"isentropic" format:"double" example:"120000" validate:"required"`
	Polytropic float64 `json:"polytropic" format:"double" example:"125000" validate:"required"`
}

// EfficiencyOut holds both total-to-total efficiencies, each converted from the one given.
type EfficiencyOut struct {
	Isentropic float64 `json:"isentropic" format:"double" example:"0.8" validate:"required"`
	Polytropic float64 `json:"polytropic" format:"double" example:"0.83" validate:"required"`
	// Estimated is true when no efficiency was given and the polytropic
	// efficiency is the Casey & Robinson (2013) estimate.
	Estimated bool `json:"estimated" example:"false" validate:"required"`
	// InRange is false when that estimate was made outside the correlation's range.
	InRange bool `json:"in_range" example:"true" validate:"required"`
}

// PowerOut is the power balance, W.
type PowerOut struct {
	// Gas is mass flow × work, W.
	Gas float64 `json:"gas" format:"double" example:"480000" validate:"required"`
	// Shaft is gas power over the mechanical efficiency, W.
	Shaft float64 `json:"shaft" format:"double" example:"490000" validate:"required"`
	// MechanicalEfficiency used, dimensionless.
	MechanicalEfficiency float64 `json:"mechanical_efficiency" format:"double" example:"0.98" validate:"required"`
	// DriverRating is the least driver rating: shaft power × driver_margin, W.
	DriverRating float64 `json:"driver_rating" format:"double" example:"539000" validate:"required"`
	// DriverMargin is the rating factor applied, dimensionless.
	DriverMargin float64 `json:"driver_margin" format:"double" example:"1.1" validate:"required"`
}

// VelocitiesOut are the velocity triangles: m/s, Mach numbers dimensionless, angles in deg.
type VelocitiesOut struct {
	TipSpeed float64 `json:"tip_speed" format:"double" example:"420" validate:"required"`
	// InletBladeSpeed is U at D1 (radial inlet) or at the eye tip, m/s.
	InletBladeSpeed float64 `json:"inlet_blade_speed" format:"double" validate:"required"`
	// InletMeridional is cm1, m/s.
	InletMeridional float64 `json:"inlet_meridional" format:"double" validate:"required"`
	// InletWhirl is cθ1 = cm1 tan(prewhirl angle), m/s (0 without inlet guide vanes).
	InletWhirl float64 `json:"inlet_whirl" format:"double" validate:"required"`
	// InletRelative is W1 = √(cm1² + (U1 − cθ1)²) at D1 or the eye tip (shroud), m/s.
	InletRelative float64 `json:"inlet_relative" format:"double" validate:"required"`
	// InletRelativeMach is W1/a1 at D1 or the eye tip.
	InletRelativeMach float64 `json:"inlet_relative_mach" format:"double" validate:"required"`
	// InletBladeAngleShroud is the relative flow angle from meridional at D1 or the eye tip, deg.
	InletBladeAngleShroud float64 `json:"inlet_blade_angle_shroud" format:"double" validate:"required"`
	// InletBladeAngleMean is the angle at the rms eye diameter, deg.
	InletBladeAngleMean float64 `json:"inlet_blade_angle_mean" format:"double" validate:"required"`
	// InletBladeAngleHub is the angle at the eye hub, deg.
	InletBladeAngleHub float64 `json:"inlet_blade_angle_hub" format:"double" validate:"required"`
	// ExitMeridional is cr2, m/s.
	ExitMeridional float64 `json:"exit_meridional" format:"double" validate:"required"`
	// ExitWhirl is cθ2, m/s.
	ExitWhirl float64 `json:"exit_whirl" format:"double" validate:"required"`
	// ExitAbsolute is c2, m/s.
	ExitAbsolute float64 `json:"exit_absolute" format:"double" validate:"required"`
	// ExitRelative is W2, m/s.
	ExitRelative float64 `json:"exit_relative" format:"double" validate:"required"`
	// ExitAbsoluteMach is c2/a2 at the diffuser inlet.
	ExitAbsoluteMach float64 `json:"exit_absolute_mach" format:"double" validate:"required"`
	// ExitFlowAngle is the absolute flow angle from radial at impeller exit, deg.
	ExitFlowAngle float64 `json:"exit_flow_angle" format:"double" validate:"required"`
	// RelativeVelocityRatio is W2/W1 (shroud).
	RelativeVelocityRatio float64 `json:"relative_velocity_ratio" format:"double" validate:"required"`
	// MachineMach is U2 over the suction speed of sound.
	MachineMach float64 `json:"machine_mach" format:"double" validate:"required"`
}

// GeometryOut is the sized flow path, m.
type GeometryOut struct {
	TipDiameter float64 `json:"tip_diameter" format:"double" example:"0.38" validate:"required"`
	// InletDiameter is D1 (radial inlet) or the eye tip diameter (axial eye), m.
	InletDiameter float64 `json:"inlet_diameter" format:"double" validate:"required"`
	// InletWidth is the radial-inlet blade width from continuity, or the blade height at the eye, m.
	InletWidth float64 `json:"inlet_width" format:"double" validate:"required"`
	// ExitWidth is b2 from continuity at the exit static density, m.
	ExitWidth float64 `json:"exit_width" format:"double" validate:"required"`
	// EyeTipDiameter is the tip diameter of an axial eye, m (absent for a radial inlet).
	EyeTipDiameter *float64 `json:"eye_tip_diameter,omitempty" format:"double"`
	// EyeHubDiameter is the hub diameter of an axial eye, m (absent for a radial inlet).
	EyeHubDiameter *float64 `json:"eye_hub_diameter,omitempty" format:"double"`
	// ExitBlockage is the blocked fraction of the exit area used for b2.
	ExitBlockage float64 `json:"exit_blockage" format:"double" example:"0.1" validate:"required"`
	// BladeExitAngle is the backsweep from radial used, deg.
	BladeExitAngle float64 `json:"blade_exit_angle" format:"double" example:"40" validate:"required"`
	// BladeCount is the exit blade count of the slip model (absent when a slip factor was given).
	BladeCount *int `json:"blade_count,omitempty" example:"17"`
}

// CoefficientsOut are the non-dimensional groups.
type CoefficientsOut struct {
	// Slip is the slip factor used (given, or from the slip model).
	Slip float64 `json:"slip_factor" format:"double" validate:"required"`
	// PowerInputFactor is the work over the Euler work used (>= 1).
	PowerInputFactor float64 `json:"power_input_factor" format:"double" validate:"required"`
	// Flow is φ = Q01 / (U2 π D2²/4).
	Flow float64 `json:"flow" format:"double" validate:"required"`
	// ExitFlow is φ2 = cr2/U2.
	ExitFlow float64 `json:"exit_flow" format:"double" validate:"required"`
	// Work is w/U2².
	Work float64 `json:"work" format:"double" validate:"required"`
	// PolytropicHead is Hp/U2².
	PolytropicHead float64 `json:"polytropic_head" format:"double" validate:"required"`
	// SpecificSpeed is Ns = Ω √Q01 / Δh_s^0.75 with Ω in rad/s, Q01 in m3/s, Δh_s in J/kg.
	SpecificSpeed float64 `json:"specific_speed" format:"double" validate:"required"`
	// SpecificDiameter is Ds = D2 Δh_s^0.25 / √Q01 (Balje), SI units.
	SpecificDiameter float64 `json:"specific_diameter" format:"double" validate:"required"`
	// ExitWidthRatio is b2/D2.
	ExitWidthRatio float64 `json:"exit_width_ratio" format:"double" validate:"required"`
	// InletDiameterRatio is D1/D2 (or eye tip over D2).
	InletDiameterRatio float64 `json:"inlet_diameter_ratio" format:"double" validate:"required"`
}

// StateOut is a thermodynamic state.
type StateOut struct {
	// Pressure, Pa absolute.
	Pressure float64 `json:"pressure" format:"double" validate:"required"`
	// Temperature, K.
	Temperature float64 `json:"temperature" format:"double" validate:"required"`
	// Density, kg/m3.
	Density float64 `json:"density" format:"double" validate:"required"`
	// Compressibility is Z = p/(ρ R T).
	Compressibility float64 `json:"compressibility" format:"double" validate:"required"`
	// SpeedOfSound, m/s.
	SpeedOfSound float64 `json:"speed_of_sound" format:"double" validate:"required"`
	// Velocity of the stream at the station, m/s (0 for stagnation states).
	Velocity float64 `json:"velocity" format:"double" validate:"required"`
	// WaterDewPoint is the water dew point at the station's pressure, K (absent when the gas holds no water).
	WaterDewPoint *float64 `json:"water_dew_point,omitempty" format:"double"`
}

// StationsOut are the states along the stage.
type StationsOut struct {
	// Suction is the suction stagnation state.
	Suction StateOut `json:"suction" validate:"required"`
	// Inlet is the static state entering the blades.
	Inlet StateOut `json:"inlet" validate:"required"`
	// ImpellerExit is the static state at the impeller tip.
	ImpellerExit StateOut `json:"impeller_exit" validate:"required"`
	// ImpellerExitTotalPressure is p02 at the impeller tip, Pa absolute.
	ImpellerExitTotalPressure float64 `json:"impeller_exit_total_pressure" format:"double" validate:"required"`
	// ImpellerEfficiency is the impeller's own isentropic efficiency under the loss-share assumption.
	ImpellerEfficiency float64 `json:"impeller_efficiency" format:"double" validate:"required"`
	// Discharge is the discharge stagnation state.
	Discharge StateOut `json:"discharge" validate:"required"`
}

// PolytropicOut compares the two polytropic methods on the same end states.
type PolytropicOut struct {
	// Used is the method behind head.polytropic: "stepwise" or "schultz".
	Used string `json:"used" enums:"stepwise,schultz" validate:"required"`
	// StepwiseHead is the head of the path of constant small-stage efficiency, J/kg.
	StepwiseHead float64 `json:"stepwise_head" format:"double" validate:"required"`
	// StepwiseSteps is the number of integration steps (0: the closed form of a constant-property gas).
	StepwiseSteps int `json:"stepwise_steps" validate:"required"`
	// SchultzHead is the ASME PTC 10 / Schultz head, J/kg.
	SchultzHead float64 `json:"schultz_head" format:"double" validate:"required"`
	// SchultzFactor is the Schultz polytropic head factor f.
	SchultzFactor float64 `json:"schultz_factor" format:"double" validate:"required"`
	// Difference is (schultz − stepwise)/stepwise.
	Difference float64 `json:"difference" format:"double" validate:"required"`
}

// LimitOut is one limit rule applied to the stage.
type LimitOut struct {
	// Rule names the rule; it keys limit_overrides.
	Rule string `json:"rule" example:"flow-coefficient-low" validate:"required"`
	// Code is the warning code the rule raises (shared by the low and high rules of a quantity).
	Code     string `json:"code" example:"flow-coefficient" validate:"required"`
	Quantity string `json:"quantity" example:"flow coefficient Q01/(U2 π D2²/4)" validate:"required"`
	// Severity is "ok", "notice" (within 5 % of the warning level), "warning" or "limit".
	Severity string  `json:"severity" enums:"ok,notice,warning,limit" example:"ok" validate:"required"`
	Value    float64 `json:"value" format:"double" validate:"required"`
	// Warning is the soft level.
	Warning float64 `json:"warning" format:"double" validate:"required"`
	// Limit is the level of normal practice (absent when the source gives none).
	Limit *float64 `json:"limit,omitempty" format:"double"`
	// Margin is the distance to the warning level as a fraction of it: positive inside, negative past it.
	Margin float64 `json:"margin" format:"double" validate:"required"`
	Unit   string  `json:"unit" example:"m/s" validate:"required"`
	// Basis is where the levels come from: a standard or paper, "common practice, no source", or a caller override.
	Basis string `json:"basis" validate:"required"`
}

// WarningOut is a structured warning: every warning carries the value
// measured and the level it is near or past.
type WarningOut struct {
	// Code is our own name for the concern, e.g. "tip-speed", "inducer-mach", "condensation-risk".
	Code string `json:"code" example:"inducer-mach" validate:"required"`
	// Severity is "notice" (near a level), "warning" (past the soft level) or "limit" (past the limit of normal practice).
	Severity string `json:"severity" enums:"notice,warning,limit" example:"warning" validate:"required"`
	Message  string `json:"message" validate:"required"`
	// Value measured, in unit.
	Value float64 `json:"value" format:"double" validate:"required"`
	// Limit is the level the value is near or past, in unit.
	Limit float64 `json:"limit" format:"double" validate:"required"`
	// Margin is the distance to the warning level as a fraction of it: positive inside, negative past it.
	Margin float64 `json:"margin" format:"double" validate:"required"`
	Unit   string  `json:"unit" example:"-" validate:"required"`
	// Basis is where the level comes from: a standard or paper, "common practice, no source", or a caller override.
	Basis string `json:"basis" validate:"required"`
}

// ProvenanceOut says how the result was obtained.
type ProvenanceOut struct {
	ModelVersion string `json:"model_version" example:"stagewright-physics 0.3.0" validate:"required"`
	// ServiceVersion is the build of the service that answered.
	ServiceVersion string      `json:"service_version" example:"v0.3.0" validate:"required"`
	GasModel       string      `json:"gas_model" example:"ideal-constant" validate:"required"`
	Methods        []MethodOut `json:"methods" validate:"required"`
	// DefaultsApplied lists every default the service filled in.
	DefaultsApplied []DefaultOut `json:"defaults_applied" validate:"required"`
	// InputHash is the SHA-256 of the normalised duty in SI units.
	InputHash string `json:"input_hash" validate:"required"`
}

// MethodOut is a method and its published source.
type MethodOut struct {
	Subject string `json:"subject" validate:"required"`
	Name    string `json:"name" validate:"required"`
	Source  string `json:"source" validate:"required"`
}

// DefaultOut is one default applied.
type DefaultOut struct {
	Field string `json:"field" example:"mechanical_efficiency" validate:"required"`
	Value string `json:"value" example:"0.98" validate:"required"`
	Note  string `json:"note" validate:"required"`
}

// Health is the answer of GET /healthz.
type Health struct {
	Status       string `json:"status" example:"ok" validate:"required"`
	ModelVersion string `json:"model_version" example:"stagewright-physics 0.2.0" validate:"required"`
}
