package api

// SectionRequest is a duty for a multi-stage section: the duty of
// /v1/stage/size (whose choices apply to every stage) plus the stage count,
// the arrangement and the intercooling.
type SectionRequest struct {
	Gas     GasSpec     `json:"gas" binding:"required"`
	Suction SuctionSpec `json:"suction" binding:"required"`
	// DischargePressure is the section's discharge total pressure, Pa
	// absolute (or a string with a unit). Give it or pressure_ratio, not both.
	DischargePressure *Quantity `json:"discharge_pressure,omitempty" binding:"required_without=PressureRatio,excluded_with=PressureRatio" swaggertype:"primitive,number" format:"double" example:"900000" extensions:"x-unit-string=pressure"`
	// PressureRatio is the section's overall total pressure ratio (> 1).
	PressureRatio *float64 `json:"pressure_ratio,omitempty" binding:"required_without=DischargePressure,excluded_with=DischargePressure" format:"double" minimum:"1" example:"8"`
	Flow          FlowSpec `json:"flow" binding:"required"`
	// Speed is the shaft speed of an "inline" section, or of every stage of
	// a "geared" one, rev/min; leave it out to have each stage's (geared) or
	// the shaft's (inline) speed chosen.
	Speed *Quantity `json:"speed,omitempty" swaggertype:"primitive,number" format:"double" example:"11000" extensions:"x-unit-string=speed"`
	// TipDiameter is one tip diameter for every stage of a "geared" section, m.
	TipDiameter *Quantity `json:"tip_diameter,omitempty" swaggertype:"primitive,number" format:"double" example:"0.42" extensions:"x-unit-string=length"`
	// SpeedTarget chooses each stage's speed (geared) or the stages' own
	// speeds whose geometric mean is the shaft speed (inline).
	SpeedTarget *SpeedTargetSpec `json:"speed_target,omitempty"`
	// SpeedStep rounds a chosen speed to a multiple of this many rev/min.
	SpeedStep *float64 `json:"speed_step,omitempty" format:"double" minimum:"0" example:"50"`
	// Efficiency is every stage's total-to-total efficiency; leave it out to
	// have each stage's polytropic efficiency estimated.
	Efficiency *EfficiencySpec `json:"efficiency,omitempty"`
	// MechanicalEfficiency is gas power over shaft power of the whole
	// section (one shaft or bull gear); default 0.98.
	MechanicalEfficiency *float64 `json:"mechanical_efficiency,omitempty" binding:"excluded_with=MechanicalLosses" format:"double" minimum:"0" maximum:"1" example:"0.98"`
	// MechanicalLosses are the section's bearing, seal and gear losses, W, counted once.
	MechanicalLosses *Quantity `json:"mechanical_losses,omitempty" swaggertype:"primitive,number" format:"double" example:"40000" extensions:"x-unit-string=power"`
	// Impeller is the blading and inlet of every stage.
	Impeller *ImpellerSpec `json:"impeller,omitempty"`
	Diffuser *DiffuserSpec `json:"diffuser,omitempty"`
	Options  *OptionsSpec  `json:"options,omitempty"`
	// Driver is the section's driver.
	Driver *DriverSpec `json:"driver,omitempty"`
	// LimitOverrides replaces the levels of limit rules for every stage.
	LimitOverrides map[string]LevelOverrideSpec `json:"limit_overrides,omitempty" binding:"omitempty,dive"`
	// StageCount is the number of stages (1 to 12); leave it out to have the
	// least count chosen for which every stage stays inside its levels.
	StageCount *int `json:"stage_count,omitempty" binding:"omitempty,min=1,max=12" minimum:"1" maximum:"12" example:"3"`
	// Arrangement is "geared" (default: each stage on its own pinion speed)
	// or "inline" (one shaft speed for every impeller).
	Arrangement string `json:"arrangement,omitempty" binding:"omitempty,oneof=geared inline" enums:"geared,inline" example:"geared"`
	// Intercooling places and sets the coolers between stages.
	Intercooling *IntercoolingSpec `json:"intercooling,omitempty"`
}

// IntercoolingSpec places the coolers and says how they cool.
type IntercoolingSpec struct {
	// AfterStages lists the stages (1-based) followed by a cooler; default
	// every stage but the last for "geared", none for "inline"; [] for none.
	AfterStages *[]int `json:"after_stages,omitempty" example:"1,2"`
	// OutletTemperature is the gas temperature leaving every cooler, K (or
	// "40 degC"); default the section's suction temperature.
	OutletTemperature *Quantity `json:"outlet_temperature,omitempty" swaggertype:"primitive,number" format:"double" example:"313.15" extensions:"x-unit-string=temperature"`
	// Approach is the outlet temperature above the coolant temperature, K
	// (with coolant_temperature, instead of outlet_temperature).
	Approach *float64 `json:"approach,omitempty" format:"double" minimum:"0" example:"10"`
	// CoolantTemperature is the coolant inlet temperature, K (or "30 degC").
	CoolantTemperature *Quantity `json:"coolant_temperature,omitempty" swaggertype:"primitive,number" format:"double" example:"303.15" extensions:"x-unit-string=temperature"`
	// PressureDrop is the gas pressure drop across each cooler, Pa (or
	// "0.2 bar"); default 0.
	PressureDrop *Quantity `json:"pressure_drop,omitempty" swaggertype:"primitive,number" format:"double" example:"20000" extensions:"x-unit-string=pressure-difference"`
}

// SectionResponse is a sized multi-stage section. Every number is SI.
type SectionResponse struct {
	// StageCount is the number of stages.
	StageCount int `json:"stage_count" example:"3" validate:"required"`
	// StageCountBasis is "given" or "chosen" (the least count inside every stage's levels).
	StageCountBasis string `json:"stage_count_basis" enums:"given,chosen" example:"chosen" validate:"required"`
	// Arrangement is "geared" or "inline".
	Arrangement string `json:"arrangement" enums:"geared,inline" example:"geared" validate:"required"`
	// Stages are the full stage answers in flow order, each with its own
	// suction state, mass flow and speed (their provenance.input_hash is
	// the section duty's).
	Stages []StageResponse `json:"stages" validate:"required"`
	// Coolers are the intercoolers.
	Coolers []SectionCoolerOut `json:"coolers" validate:"required"`
	// Discharge is the section's discharge state.
	Discharge SectionStateOut `json:"discharge" validate:"required"`
	// Head is the sum of the stages' polytropic heads.
	Head SectionHeadOut `json:"head" validate:"required"`
	// Power is the section total: gas power of the stages, shaft power with
	// the mechanical losses counted once for the shaft or bull gear.
	Power PowerOut `json:"power" validate:"required"`
	// Speed is the common shaft speed of an "inline" section, rev/min
	// (absent for "geared": each stage has its own).
	Speed *float64 `json:"speed,omitempty" format:"double" example:"11000"`
	// Split says how the pressure rise is shared among the stages.
	Split string `json:"split" validate:"required"`
	// Warnings are the section's own (stage 0: impellers per casing,
	// stage-count levels), the coolers' (stage: the stage before), and every
	// stage's (stage: its number).
	Warnings []SectionWarningOut `json:"warnings" validate:"required"`
	// Verdict follows the worst warning of the section and its stages.
	Verdict string `json:"verdict" enums:"within-limits,near-limits,past-warning,past-limit" example:"past-warning" validate:"required"`
	// Machine is the section as built, for /v1/machine/rate, /map and /check.
	Machine    MachineSpec   `json:"machine" validate:"required"`
	Provenance ProvenanceOut `json:"provenance" validate:"required"`
	// Cautions are short sentences for people; they defer to the
	// manufacturer, the standards, local codes and licensed practice.
	Cautions []string `json:"cautions" validate:"required"`
}

// SectionCoolerOut is one intercooler of the section.
type SectionCoolerOut struct {
	// AfterStage is the stage (1-based) the cooler follows.
	AfterStage int `json:"after_stage" example:"1" validate:"required"`
	// Inlet is the gas entering (the stage's discharge).
	Inlet SectionStateOut `json:"inlet" validate:"required"`
	// Outlet is the gas leaving.
	Outlet SectionStateOut `json:"outlet" validate:"required"`
	// Duty is the heat taken out, W (sensible and latent).
	Duty float64 `json:"duty" format:"double" example:"420000" validate:"required"`
	// Condensate is the liquid removed at the outlet, kg/s.
	Condensate float64 `json:"condensate" format:"double" example:"0.02" validate:"required"`
}

// SectionStateOut is a total state.
type SectionStateOut struct {
	// Pressure, Pa absolute.
	Pressure float64 `json:"pressure" format:"double" example:"200000" validate:"required"`
	// Temperature, K.
	Temperature float64 `json:"temperature" format:"double" example:"313.15" validate:"required"`
}

// SectionHeadOut is the section's head.
type SectionHeadOut struct {
	// Polytropic is the sum of the stages' polytropic heads, J/kg.
	Polytropic float64 `json:"polytropic" format:"double" example:"210000" validate:"required"`
}

// SectionWarningOut is a warning of the section or of one of its stages.
type SectionWarningOut struct {
	// Code is our own name for the concern, e.g. "tip-speed", "impellers-per-casing", "stage-inlet-condensate".
	Code string `json:"code" example:"stage-inlet-condensate" validate:"required"`
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
	// Stage is the stage the warning belongs to (1-based); 0 for the section.
	Stage int `json:"stage" example:"2" validate:"required"`
}
