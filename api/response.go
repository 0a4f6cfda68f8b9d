package api

// StageResponse is a sized stage. Every number is SI; the unit is in each
// field's description.
type StageResponse struct {
	// MassFlow through the stage, kg/s.
	MassFlow float64 `json:"mass_flow" format:"double" example:"3.2"`
	// SuctionVolumeFlow is the actual volume flow at suction stagnation conditions, m3/s.
	SuctionVolumeFlow float64 `json:"suction_volume_flow" format:"double" example:"2.7"`
	// StandardVolumeFlow is the flow at reference conditions, m3/s.
	StandardVolumeFlow StandardFlowsOut `json:"standard_volume_flow"`
	// Speed is the rotational speed, rev/min.
	Speed     float64      `json:"speed" format:"double" example:"21000" validate:"required"`
	Discharge DischargeOut `json:"discharge"`
	// Work is the actual specific work h02 − h01, J/kg.
	Work         float64         `json:"work" format:"double" example:"150000"`
	Head         HeadOut         `json:"head"`
	Efficiency   EfficiencyOut   `json:"efficiency"`
	Power        PowerOut        `json:"power" validate:"required"`
	Velocities   VelocitiesOut   `json:"velocities"`
	Geometry     GeometryOut     `json:"geometry" validate:"required"`
	Coefficients CoefficientsOut `json:"coefficients"`
	Stations     StationsOut     `json:"stations"`
	Polytropic   PolytropicOut   `json:"polytropic_methods"`
	// Verdict is the worst severity of the limit checks: "within-limits", "caution" or "critical".
	Verdict string `json:"verdict" enums:"within-limits,caution,critical" example:"caution" validate:"required"`
	// Limits lists every limit checked, with its margin.
	Limits []LimitOut `json:"limits"`
	// Warnings lists the limits past their caution level and other notices.
	Warnings   []WarningOut  `json:"warnings"`
	Provenance ProvenanceOut `json:"provenance"`
	// Cautions says what the numbers are and defers to the manufacturer, the standards and licensed engineering practice.
	Cautions string `json:"cautions" validate:"required"`
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
	Pressure float64 `json:"pressure" format:"double" example:"420000"`
	// Temperature is the discharge total temperature, K.
	Temperature float64 `json:"temperature" format:"double" example:"460"`
	// IsentropicTemperature is the temperature at the discharge pressure and suction entropy, K.
	IsentropicTemperature float64 `json:"isentropic_temperature" format:"double" example:"430"`
}

// HeadOut holds the heads, J/kg.
type HeadOut struct {
	Isentropic float64 `json:"isentropic" format:"double" example:"120000"`
	Polytropic float64 `json:"polytropic" format:"double" example:"125000"`
}

// EfficiencyOut holds both total-to-total efficiencies, each converted from the one given.
type EfficiencyOut struct {
	Isentropic float64 `json:"isentropic" format:"double" example:"0.8"`
	Polytropic float64 `json:"polytropic" format:"double" example:"0.83"`
}

// PowerOut is the power balance, W.
type PowerOut struct {
	// Gas is mass flow × work, W.
	Gas float64 `json:"gas" format:"double" example:"480000"`
	// Shaft is gas power over the mechanical efficiency, W.
	Shaft float64 `json:"shaft" format:"double" example:"490000" validate:"required"`
	// MechanicalEfficiency used, dimensionless.
	MechanicalEfficiency float64 `json:"mechanical_efficiency" format:"double" example:"0.98"`
	// DriverRating is the least driver rating: shaft power × driver_margin, W.
	DriverRating float64 `json:"driver_rating" format:"double" example:"539000"`
	// DriverMargin is the rating factor applied, dimensionless.
	DriverMargin float64 `json:"driver_margin" format:"double" example:"1.1"`
}

// VelocitiesOut are the velocity triangles: m/s, Mach numbers dimensionless, angles in deg.
type VelocitiesOut struct {
	TipSpeed float64 `json:"tip_speed" format:"double" example:"420"`
	// InletBladeSpeed is U at D1 (radial inlet) or at the eye tip, m/s.
	InletBladeSpeed float64 `json:"inlet_blade_speed" format:"double"`
	// InletMeridional is cm1, m/s.
	InletMeridional float64 `json:"inlet_meridional" format:"double"`
	// InletRelative is W1 at D1 or the eye tip (shroud), m/s.
	InletRelative float64 `json:"inlet_relative" format:"double"`
	// InletRelativeMach is W1/a1 at D1 or the eye tip.
	InletRelativeMach float64 `json:"inlet_relative_mach" format:"double"`
	// InletBladeAngleShroud is the relative flow angle from meridional at D1 or the eye tip, deg.
	InletBladeAngleShroud float64 `json:"inlet_blade_angle_shroud" format:"double"`
	// InletBladeAngleMean is the angle at the rms eye diameter, deg.
	InletBladeAngleMean float64 `json:"inlet_blade_angle_mean" format:"double"`
	// InletBladeAngleHub is the angle at the eye hub, deg.
	InletBladeAngleHub float64 `json:"inlet_blade_angle_hub" format:"double"`
	// ExitMeridional is cr2, m/s.
	ExitMeridional float64 `json:"exit_meridional" format:"double"`
	// ExitWhirl is cθ2, m/s.
	ExitWhirl float64 `json:"exit_whirl" format:"double"`
	// ExitAbsolute is c2, m/s.
	ExitAbsolute float64 `json:"exit_absolute" format:"double"`
	// ExitRelative is W2, m/s.
	ExitRelative float64 `json:"exit_relative" format:"double"`
	// ExitAbsoluteMach is c2/a2 at the diffuser inlet.
	ExitAbsoluteMach float64 `json:"exit_absolute_mach" format:"double"`
	// ExitFlowAngle is the absolute flow angle from radial at impeller exit, deg.
	ExitFlowAngle float64 `json:"exit_flow_angle" format:"double"`
	// RelativeVelocityRatio is W2/W1 (shroud).
	RelativeVelocityRatio float64 `json:"relative_velocity_ratio" format:"double"`
	// MachineMach is U2 over the suction speed of sound.
	MachineMach float64 `json:"machine_mach" format:"double"`
}

// GeometryOut is the sized flow path, m.
type GeometryOut struct {
	TipDiameter float64 `json:"tip_diameter" format:"double" example:"0.38" validate:"required"`
	// InletDiameter is D1 (radial inlet) or the eye tip diameter (axial eye), m.
	InletDiameter float64 `json:"inlet_diameter" format:"double"`
	// InletWidth is the radial-inlet blade width from continuity, or the blade height at the eye, m.
	InletWidth float64 `json:"inlet_width" format:"double"`
	// ExitWidth is b2 from continuity at the exit static density, m.
	ExitWidth float64 `json:"exit_width" format:"double"`
	// EyeHubDiameter is the hub diameter of an axial eye, m (absent for a radial inlet).
	EyeHubDiameter *float64 `json:"eye_hub_diameter,omitempty" format:"double"`
}

// CoefficientsOut are the non-dimensional groups.
type CoefficientsOut struct {
	// Slip is the slip factor used (given, or from the slip correlation).
	Slip float64 `json:"slip_factor" format:"double"`
	// Flow is φ = Q01 / (U2 π D2²/4).
	Flow float64 `json:"flow" format:"double"`
	// ExitFlow is φ2 = cr2/U2.
	ExitFlow float64 `json:"exit_flow" format:"double"`
	// Work is w/U2².
	Work float64 `json:"work" format:"double"`
	// PolytropicHead is Hp/U2².
	PolytropicHead float64 `json:"polytropic_head" format:"double"`
	// SpecificSpeed is Ω √Q01 / Δh_s^0.75 with Ω in rad/s.
	SpecificSpeed float64 `json:"specific_speed" format:"double"`
	// ExitWidthRatio is b2/D2.
	ExitWidthRatio float64 `json:"exit_width_ratio" format:"double"`
	// InletDiameterRatio is D1/D2 (or eye tip over D2).
	InletDiameterRatio float64 `json:"inlet_diameter_ratio" format:"double"`
}

// StateOut is a thermodynamic state.
type StateOut struct {
	// Pressure, Pa absolute.
	Pressure float64 `json:"pressure" format:"double"`
	// Temperature, K.
	Temperature float64 `json:"temperature" format:"double"`
	// Density, kg/m3.
	Density float64 `json:"density" format:"double"`
	// Compressibility is Z = p/(ρ R T).
	Compressibility float64 `json:"compressibility" format:"double"`
	// SpeedOfSound, m/s.
	SpeedOfSound float64 `json:"speed_of_sound" format:"double"`
	// Velocity of the stream at the station, m/s (0 for stagnation states).
	Velocity float64 `json:"velocity" format:"double"`
	// WaterDewPoint is the water dew point at the station's pressure, K (absent when the gas holds no water).
	WaterDewPoint *float64 `json:"water_dew_point,omitempty" format:"double"`
}

// StationsOut are the states along the stage.
type StationsOut struct {
	// Suction is the suction stagnation state.
	Suction StateOut `json:"suction"`
	// Inlet is the static state entering the blades.
	Inlet StateOut `json:"inlet"`
	// ImpellerExit is the static state at the impeller tip.
	ImpellerExit StateOut `json:"impeller_exit"`
	// ImpellerExitTotalPressure is p02 at the impeller tip, Pa absolute.
	ImpellerExitTotalPressure float64 `json:"impeller_exit_total_pressure" format:"double"`
	// ImpellerEfficiency is the impeller's own isentropic efficiency under the loss-share assumption.
	ImpellerEfficiency float64 `json:"impeller_efficiency" format:"double"`
	// Discharge is the discharge stagnation state.
	Discharge StateOut `json:"discharge"`
}

// PolytropicOut compares the two polytropic methods on the same end states.
type PolytropicOut struct {
	// Used is the method behind head.polytropic: "stepwise" or "schultz".
	Used string `json:"used" enums:"stepwise,schultz"`
	// StepwiseHead is the head of the path of constant small-stage efficiency, J/kg.
	StepwiseHead float64 `json:"stepwise_head" format:"double"`
	// StepwiseSteps is the number of integration steps.
	StepwiseSteps int `json:"stepwise_steps"`
	// SchultzHead is the ASME PTC 10 / Schultz head, J/kg.
	SchultzHead float64 `json:"schultz_head" format:"double"`
	// SchultzFactor is the Schultz polytropic head factor f.
	SchultzFactor float64 `json:"schultz_factor" format:"double"`
	// Difference is (schultz − stepwise)/stepwise.
	Difference float64 `json:"difference" format:"double"`
}

// LimitOut is one limit check.
type LimitOut struct {
	Code     string  `json:"code" example:"tip-speed-high"`
	Quantity string  `json:"quantity" example:"impeller tip speed (closed-steel)"`
	Severity string  `json:"severity" enums:"within,caution,critical" example:"within"`
	Value    float64 `json:"value" format:"double"`
	// Caution is the soft limit.
	Caution float64 `json:"caution" format:"double"`
	// Critical is the limit of normal practice (absent when the source gives none).
	Critical *float64 `json:"critical,omitempty" format:"double"`
	// Margin is (limit − value)/limit against the caution limit: positive inside, negative past it.
	Margin float64 `json:"margin" format:"double"`
	Unit   string  `json:"unit" example:"m/s"`
	Source string  `json:"source"`
}

// WarningOut is a structured warning.
type WarningOut struct {
	Code     string `json:"code" example:"inducer-mach-high"`
	Severity string `json:"severity" enums:"notice,caution,critical" example:"caution"`
	Message  string `json:"message"`
	// Value measured (absent for a notice).
	Value *float64 `json:"value,omitempty" format:"double"`
	// Limit passed (absent for a notice).
	Limit *float64 `json:"limit,omitempty" format:"double"`
	// Margin to the caution limit as a fraction of it (absent for a notice).
	Margin *float64 `json:"margin,omitempty" format:"double"`
	Unit   string   `json:"unit,omitempty"`
	Source string   `json:"source"`
}

// ProvenanceOut says how the result was obtained.
type ProvenanceOut struct {
	ModelVersion string      `json:"model_version" example:"stagewright-physics 0.2.0"`
	GasModel     string      `json:"gas_model" example:"ideal-constant"`
	Methods      []MethodOut `json:"methods"`
	// DefaultsApplied lists every default the service filled in.
	DefaultsApplied []DefaultOut `json:"defaults_applied"`
	// InputHash is the SHA-256 of the normalised duty in SI units.
	InputHash string `json:"input_hash"`
}

// MethodOut is a method and its published source.
type MethodOut struct {
	Subject string `json:"subject"`
	Name    string `json:"name"`
	Source  string `json:"source"`
}

// DefaultOut is one default applied.
type DefaultOut struct {
	Field string `json:"field" example:"mechanical_efficiency"`
	Value string `json:"value" example:"0.98"`
	Note  string `json:"note"`
}

// Health is the answer of GET /healthz.
type Health struct {
	Status       string `json:"status" example:"ok" validate:"required"`
	ModelVersion string `json:"model_version" example:"stagewright-physics 0.2.0" validate:"required"`
}
