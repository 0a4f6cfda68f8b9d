package service

// Machine is an installed compressor as built: one or several stages in
// flow order, the coolers between them, its speed range and its driver.
// Design use cases (SizeStage, SizeSection) answer one; the machine use
// cases (rating, map, duty-change check) take it back unchanged. All
// numbers are SI (m, deg, Pa absolute, K, kg/s, m3/s, W), speeds in rev/min.
type Machine struct {
	// Name is a free tag of the caller's (an asset number); not used.
	Name string `json:"name,omitempty"`
	// Arrangement is "single" (one stage), "geared" (each stage on its own
	// pinion speed) or "inline" (one shaft speed for every impeller). For
	// rating, every stage turns at a fixed ratio to the first stage's speed:
	// its design speed over the first stage's design speed.
	Arrangement string         `json:"arrangement,omitempty"`
	Stages      []MachineStage `json:"stages"`
	// Coolers sit after the stages they name (1-based).
	Coolers []MachineCooler `json:"coolers,omitempty"`
	// SpeedRange bounds the first stage's speed; nil: the documented
	// defaults (a fraction of the design speed, recorded in provenance).
	SpeedRange *SpeedRange `json:"speed_range,omitempty"`
	// Driver is the installed driver; nil or no rating: the design shaft
	// power times the default margin (recorded in provenance).
	Driver *MachineDriver `json:"driver,omitempty"`
	// MechanicalEfficiency is gas power over shaft power for the whole
	// machine; nil: the service default.
	MechanicalEfficiency *float64 `json:"mechanical_efficiency,omitempty"`
	// SurgeControl is the anti-surge control line; nil: the default margin.
	SurgeControl *SurgeControl `json:"surge_control,omitempty"`
	// LimitOverrides replaces the levels of limit rules by rule ID.
	LimitOverrides map[string]LevelOverride `json:"limit_overrides,omitempty"`
}

// MachineStage is one impeller with its inlet and diffuser, as built, and
// the design point it was sized for.
type MachineStage struct {
	// TipDiameter is D2, m.
	TipDiameter float64 `json:"tip_diameter"`
	// ExitWidth is b2, m.
	ExitWidth float64 `json:"exit_width"`
	// BladeExitAngle is the backsweep from radial, deg.
	BladeExitAngle float64 `json:"blade_exit_angle"`
	// BladeCount is the number of blades at the exit (0: not known; then
	// SlipFactor must be given).
	BladeCount int `json:"blade_count,omitempty"`
	// SlipModel names the slip correlation ("wiesner", "stanitz",
	// "stodola") used with BladeCount; empty with a SlipFactor.
	SlipModel string `json:"slip_model,omitempty"`
	// SlipFactor is a fixed slip factor, or nil when SlipModel applies.
	SlipFactor *float64 `json:"slip_factor,omitempty"`
	// ExitBlockage is the blocked fraction of the exit area.
	ExitBlockage float64 `json:"exit_blockage"`
	// PowerInputFactor is actual work over Euler work (>= 1).
	PowerInputFactor float64      `json:"power_input_factor"`
	Inlet            MachineInlet `json:"inlet"`
	Diffuser         Diffuser     `json:"diffuser"`
	// Construction names the impeller type for the tip-speed and
	// pressure-ratio levels ("closed-steel", ...).
	Construction string      `json:"construction"`
	Design       DesignPoint `json:"design"`
	// PolytropicMethod is the method of the design polytropic efficiency
	// and of the rating's compression path ("stepwise" or "schultz");
	// empty: stepwise.
	PolytropicMethod string `json:"polytropic_method,omitempty"`
	// ImpellerLossShare is the share of the stage loss arising in the
	// impeller (for the exit density); nil: 0.5 as in the sizing.
	ImpellerLossShare *float64 `json:"impeller_loss_share,omitempty"`
}

// MachineInlet is the inlet as built: an axial eye (EyeTipDiameter,
// EyeHubDiameter, optional fixed PrewhirlAngle) or a radial inlet
// (Diameter D1 and Width b1).
type MachineInlet struct {
	Type           string   `json:"type"`
	EyeTipDiameter *float64 `json:"eye_tip_diameter,omitempty"`
	EyeHubDiameter *float64 `json:"eye_hub_diameter,omitempty"`
	Diameter       *float64 `json:"diameter,omitempty"`
	Width          *float64 `json:"width,omitempty"`
	PrewhirlAngle  *float64 `json:"prewhirl_angle,omitempty"`
}

// Diffuser is the diffuser as built: "vaneless" or "vaned"; a vaned
// diffuser may give its throat area (m2, all passages) for the choke
// estimate.
type Diffuser struct {
	Type       string   `json:"type"`
	ThroatArea *float64 `json:"throat_area,omitempty"`
}

// DesignPoint is the point a stage was sized for: the four numbers a map
// method scales from (flow coefficient, work coefficient, tip Mach number,
// polytropic efficiency), the speed and flows, and the suction state and
// gas. Derived numbers (FlowCoefficient, WorkCoefficient, TipMach,
// MassFlow, PolytropicHead) may be left at 0 by a caller typing a machine
// from a datasheet; the service then computes them from the rest.
type DesignPoint struct {
	// Speed of this stage, rev/min.
	Speed float64 `json:"speed"`
	// VolumeFlow is the actual volume flow at this stage's suction, m3/s.
	VolumeFlow float64 `json:"volume_flow"`
	// MassFlow, kg/s.
	MassFlow float64 `json:"mass_flow,omitempty"`
	// FlowCoefficient φ = Q01/(U2 π D2²/4).
	FlowCoefficient float64 `json:"flow_coefficient,omitempty"`
	// WorkCoefficient λ = w/U2² (actual work, with the power input factor).
	WorkCoefficient float64 `json:"work_coefficient,omitempty"`
	// PolytropicEfficiency, total-to-total.
	PolytropicEfficiency float64 `json:"polytropic_efficiency"`
	// TipMach is the machine Mach number U2/a01.
	TipMach float64 `json:"tip_mach,omitempty"`
	// PolytropicHead, J/kg.
	PolytropicHead float64 `json:"polytropic_head,omitempty"`
	// SuctionPressure and SuctionTemperature are the stage's suction total
	// state, Pa absolute and K; DischargePressure its discharge total
	// pressure, Pa absolute.
	SuctionPressure    float64  `json:"suction_pressure"`
	SuctionTemperature float64  `json:"suction_temperature"`
	DischargePressure  float64  `json:"discharge_pressure,omitempty"`
	Gas                GasInput `json:"gas"`
}

// MachineCooler is an intercooler after stage AfterStage (1-based): the
// gas leaves it at OutletTemperature, or at CoolantTemperature + Approach,
// with PressureDrop (Pa) across it; condensate that forms is removed.
type MachineCooler struct {
	AfterStage         int      `json:"after_stage"`
	OutletTemperature  *float64 `json:"outlet_temperature,omitempty"`
	Approach           *float64 `json:"approach,omitempty"`
	CoolantTemperature *float64 `json:"coolant_temperature,omitempty"`
	PressureDrop       float64  `json:"pressure_drop"`
}

// SpeedRange bounds the first stage's speed, rev/min.
type SpeedRange struct {
	Minimum           float64 `json:"minimum"`
	MaximumContinuous float64 `json:"maximum_continuous"`
}

// MachineDriver is the installed driver.
type MachineDriver struct {
	// Rating, W.
	Rating *float64 `json:"rating,omitempty"`
}

// SurgeControl is the anti-surge control line.
type SurgeControl struct {
	// Margin is the control line's distance from surge as a fraction of
	// the surge flow at the same speed (0.1: control at 1.1 × Q_surge).
	Margin *float64 `json:"margin,omitempty"`
}
