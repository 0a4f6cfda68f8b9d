package service

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strconv"

	"stagewright/physics"
	"stagewright/physics/flowbasis"
	"stagewright/physics/gas"
	"stagewright/physics/limits"
	"stagewright/physics/path"
	"stagewright/physics/stage"
)

// ModelVersion names the version of the physics behind every answer; it
// changes whenever a result for the same input could change.
const ModelVersion = "stagewright-physics 0.5.0"

// Defaults applied when a duty leaves a choice open.
const (
	// MinEfficiency is the least stage efficiency (isentropic or
	// polytropic) accepted: centrifugal stages reach 0.6 to 0.9, and a
	// value below 0.3 is taken for an input mistake (common practice, no
	// source); a tiny one made heads so large that the error landed on
	// another field.
	MinEfficiency = 0.3
	// MinSuctionPressure is the least suction pressure accepted, Pa
	// absolute (common practice, no source: below it no gas model here is
	// meant to be used, and a value of 5e-324 Pa was blamed on the
	// pressure ratio).
	MinSuctionPressure = 100.0
	// MinMechanicalEfficiency is the least mechanical efficiency (gas
	// power over shaft power) accepted, given or from mechanical_losses:
	// bearing, seal and gear losses are a few per cent of the gas power,
	// so losses of more than a quarter of it are taken for an input
	// mistake (common practice, no source).
	MinMechanicalEfficiency = 0.8
	// DefaultMechanicalEfficiency is gas power over shaft power: bearing
	// and seal losses of 1-2 % of gas power for large process machines
	// (testdata/reference/rules-of-thumb.md §10, common practice, no source).
	DefaultMechanicalEfficiency = 0.98
	// DefaultPowerInputFactor is 1: no disc friction or windage added.
	DefaultPowerInputFactor = 1.0
)

// Cautions is carried by every gas-property result, one sentence an
// entry: what the numbers are and are not.
func Cautions() []string {
	return []string{
		"Preliminary engineering estimate from published methods, not a machine selection or guarantee.",
		"Centrifugal compressors can fail violently and handle toxic, flammable or asphyxiating gases: the machine's " +
			"manufacturer, the applicable standards (API 617 / ISO 10439 and their peers), local codes and licensed engineering " +
			"practice govern overspeed and trip settings, overpressure protection and relief, surge control, discharge " +
			"temperature limits, materials and sealing.",
		"Confirm every figure with the manufacturer before use.",
	}
}

// Service runs the use cases. It holds no mutable state and is safe for
// concurrent use.
type Service struct {
	version string
}

// Option configures a Service.
type Option func(*Service)

// WithVersion names the build of the service (reported in provenance).
func WithVersion(v string) Option { return func(s *Service) { s.version = v } }

// New returns a Service.
func New(opts ...Option) *Service {
	s := &Service{version: "dev"}
	for _, o := range opts {
		o(s)
	}
	return s
}

// GasInput selects and parameterises the gas model.
type GasInput struct {
	Model            string             `json:"model"`
	Cp               *float64           `json:"cp,omitempty"`
	Gamma            *float64           `json:"gamma,omitempty"`
	Composition      map[string]float64 `json:"composition,omitempty"`
	CompositionBasis string             `json:"composition_basis,omitempty"`
	Interactions     []Interaction      `json:"binary_interaction,omitempty"`
	RelativeHumidity *float64           `json:"relative_humidity,omitempty"`
	Service          string             `json:"service,omitempty"`
}

// Interaction is one caller-supplied binary interaction parameter.
type Interaction struct {
	A, B string
	Kij  float64
}

// InletInput is the impeller inlet.
type InletInput struct {
	Type          string   `json:"type"`
	DiameterRatio *float64 `json:"diameter_ratio,omitempty"`
	HubRatio      *float64 `json:"hub_ratio,omitempty"`
	// MeridionalVelocity is cm1, m/s: required for a radial inlet; for an
	// axial eye give it, or EyeTipDiameter, or neither (then the eye is
	// chosen for the least shroud relative Mach number).
	MeridionalVelocity *float64 `json:"meridional_velocity,omitempty"`
	// EyeTipDiameter is a given axial-eye tip diameter, m.
	EyeTipDiameter *float64 `json:"eye_tip_diameter,omitempty"`
	// PrewhirlAngle is the inlet-guide-vane flow angle at the eye, deg
	// from axial, positive with rotation.
	PrewhirlAngle *float64 `json:"prewhirl_angle,omitempty"`
}

// ImpellerInput is the blading.
type ImpellerInput struct {
	// BladeExitAngle is the backsweep from radial, deg; nil: DefaultBladeExitAngle.
	BladeExitAngle *float64 `json:"blade_exit_angle,omitempty"`
	// SlipFactor is the slip factor given; nil when SlipModel and
	// BladeCount select a published correlation instead.
	SlipFactor       *float64   `json:"slip_factor,omitempty"`
	SlipModel        string     `json:"slip_model,omitempty"`
	BladeCount       int        `json:"blade_count,omitempty"`
	PowerInputFactor *float64   `json:"power_input_factor,omitempty"`
	Inlet            InletInput `json:"inlet"`
	// ExitMeridionalVelocity is cr2, m/s; nil: cr2 = DefaultExitFlowCoefficient × U2.
	ExitMeridionalVelocity *float64 `json:"exit_meridional_velocity,omitempty"`
	Construction           string   `json:"construction,omitempty"`
	// ExitBlockage is the blocked fraction of the exit area (blades and
	// boundary layers), 0 <= B < 0.5; default DefaultExitBlockage.
	ExitBlockage *float64 `json:"exit_blockage,omitempty"`
}

// SpeedTarget chooses the speed when the duty gives none: one of a
// specific speed Ns = Ω√Q01/Δh_s^0.75 or a flow coefficient
// φ = Q01/(U2 π D2²/4).
type SpeedTarget struct {
	SpecificSpeed   *float64 `json:"specific_speed,omitempty"`
	FlowCoefficient *float64 `json:"flow_coefficient,omitempty"`
}

// DriverInput is the driver: a rating margin over shaft power, or the
// rating of an installed driver.
type DriverInput struct {
	// Margin is the least driver rating over shaft power; default 1.10.
	Margin *float64 `json:"margin,omitempty"`
	// Rating is an installed driver's rating, W; its margin is graded.
	Rating *float64 `json:"rating,omitempty"`
}

// StageDuty is a duty in SI units (Pa absolute, K, kg/s, m3/s, rev/min,
// m/s, m, W), as the API has parsed it. Exactly one of DischargePressure
// and PressureRatio and of the flows is set; at most one of Speed,
// TipDiameter and SpeedTarget (none: the default specific speed); at most
// one of IsentropicEfficiency and PolytropicEfficiency (none: estimated
// from a published correlation).
type StageDuty struct {
	Gas                GasInput `json:"gas"`
	SuctionPressure    float64  `json:"suction_pressure"`
	SuctionTemperature float64  `json:"suction_temperature"`
	DischargePressure  *float64 `json:"discharge_pressure,omitempty"`
	PressureRatio      *float64 `json:"pressure_ratio,omitempty"`
	MassFlow           *float64 `json:"mass_flow,omitempty"`
	ActualVolumeFlow   *float64 `json:"actual_volume_flow,omitempty"`
	StandardVolumeFlow *float64 `json:"standard_volume_flow,omitempty"`
	// StandardReference names the reference condition of
	// StandardVolumeFlow: "normal", "standard" or "us-standard".
	StandardReference    string       `json:"standard_reference,omitempty"`
	Speed                *float64     `json:"speed,omitempty"`
	TipDiameter          *float64     `json:"tip_diameter,omitempty"`
	SpeedTarget          *SpeedTarget `json:"speed_target,omitempty"`
	SpeedStep            *float64     `json:"speed_step,omitempty"`
	IsentropicEfficiency *float64     `json:"isentropic_efficiency,omitempty"`
	PolytropicEfficiency *float64     `json:"polytropic_efficiency,omitempty"`
	MechanicalEfficiency *float64     `json:"mechanical_efficiency,omitempty"`
	// MechanicalLosses are bearing, seal and gear losses, W (instead of
	// MechanicalEfficiency).
	MechanicalLosses  *float64      `json:"mechanical_losses,omitempty"`
	Impeller          ImpellerInput `json:"impeller"`
	Diffuser          string        `json:"diffuser,omitempty"`
	PolytropicMethod  string        `json:"polytropic_method,omitempty"`
	ImpellerLossShare *float64      `json:"impeller_loss_share,omitempty"`
	Driver            *DriverInput  `json:"driver,omitempty"`
	// LimitOverrides replaces the levels of limit rules by rule ID.
	LimitOverrides map[string]LevelOverride `json:"limit_overrides,omitempty"`
}

// Warning is a structured concern about a result.
type Warning struct {
	Code     string
	Severity string
	Message  string
	Value    float64
	Limit    float64
	Margin   float64
	Unit     string
	// Basis is where the levels come from: a standard, a paper, "common
	// practice, no source" or a caller override.
	Basis string
}

// Method is a method used, with its published source.
type Method struct {
	Subject string
	Name    string
	Source  string
}

// Default is a default the service applied.
type Default struct {
	Field string
	Value string
	Note  string
}

// Provenance says how a result was obtained.
type Provenance struct {
	ModelVersion string
	// ServiceVersion is the build of the service that answered.
	ServiceVersion string
	GasModel       string
	Methods        []Method
	Defaults       []Default
	// BinaryInteraction is the kij of every pair of components of a cubic
	// model, with its source (empty for the other models).
	BinaryInteraction []BinaryInteraction
	// InputHash is the SHA-256 of the normalised duty (SI numbers, defaults
	// not yet applied), hex.
	InputHash string
}

// Power is the power balance, W.
type Power struct {
	Gas                  float64
	Shaft                float64
	MechanicalEfficiency float64
	// DriverRating is Shaft × DriverMargin, the least driver nameplate.
	DriverRating float64
	DriverMargin float64
}

// WetBasis states the basis of every standard volume flow (given or
// reported): the gas as it flows, water vapour included. An inferred
// choice (ISO 13443 names both bases; a dry-basis volume would leave the
// water out), stated in provenance.
const WetBasis = "wet basis: the standard volume is that of the gas as it flows, water vapour included (from relative humidity or the composition), at the density the gas model gives at the reference condition (this project's choice; a dry-basis volume would leave the water out)"

// StandardFlows are volume flows at reference conditions, m3/s, on the wet
// basis (WetBasis).
type StandardFlows struct {
	Normal, Standard, USStandard float64
}

// standardFlows converts mdot to standard volumes with the model's density
// at each reference condition (real-gas Z there for a real model).
func standardFlows(m gas.Model, mdot float64) StandardFlows {
	at := func(ref flowbasis.Reference) float64 {
		q, err := flowbasis.StandardVolumeFlow(physics.KgPerS(mdot), m, ref)
		if err != nil {
			return 0
		}
		return float64(q)
	}
	return StandardFlows{Normal: at(flowbasis.Normal()), Standard: at(flowbasis.Standard()), USStandard: at(flowbasis.USStandard())}
}

// WaterDewPoints are the water dew points at the stations, K (0: no water
// in the gas, or a frost point below the triple point).
type WaterDewPoints struct {
	Suction, Inlet, ImpellerExit, Discharge float64
}

// StageResult is a sized stage.
type StageResult struct {
	WaterDewPoints WaterDewPoints
	// StandardFlows is the flow as standard volume at each reference
	// condition, m3/s (0 where the gas model has no gas state there, e.g. a
	// condensable gas at 0 degC).
	StandardFlows StandardFlows
	// SlipFactor used: given, or from the correlation.
	SlipFactor        float64
	MassFlow          float64
	SuctionVolumeFlow float64
	Speed             float64
	Path              path.Result
	Sizing            stage.Sizing
	Power             Power
	Assessments       []limits.Assessment
	Warnings          []Warning
	// Verdict is "within-limits", "caution" or "critical": the worst
	// severity of the limit checks.
	Verdict    string
	Provenance Provenance
	// Cautions are short sentences: what the numbers are, the protections
	// the duty needs, the hazards of its gas; they defer to the
	// manufacturer, the standards, local codes and licensed practice.
	Cautions []string
	// Speed says how the speed was found: "given", "tip-diameter",
	// "specific-speed" or "flow-coefficient".
	SpeedBasis string
	// SpeedUnrounded is the chosen speed before rounding to SpeedStep
	// (equal to Speed when no step was asked).
	SpeedUnrounded float64
	// EfficiencyEstimated is true when no efficiency was given and the
	// polytropic efficiency came from the correlation.
	EfficiencyEstimated bool
	// EfficiencyInRange is false when the correlation was used outside its
	// range.
	EfficiencyInRange bool
	// SpeedTarget is the specific speed or flow coefficient aimed at, or the
	// tip diameter given (m); 0 for a given speed.
	SpeedTarget float64
	// PrewhirlAngle is the inlet guide-vane angle used, deg.
	PrewhirlAngle float64
	// ExitBlockage is the exit blockage fraction used.
	ExitBlockage float64
	// Impeller is the blading used (given or defaulted; the slip factor
	// after any correlation).
	Impeller stage.Impeller
	// BladeCount is the blade count used by a slip model (0 with a given
	// slip factor).
	BladeCount int
	// Machine is the stage as built, in the shape the machine use cases
	// (RateMachine, MapMachine) take back.
	Machine Machine
}

func hashOf(d any) string {
	b, err := json.Marshal(d)
	if err != nil {
		return ""
	}
	sum := sha256.Sum256(b)
	return hex.EncodeToString(sum[:])
}

func dischargePressure(d StageDuty) (float64, error) {
	switch {
	case d.DischargePressure != nil && d.PressureRatio != nil:
		return 0, shapeErr("discharge_pressure", errors.New("give discharge_pressure or pressure_ratio, not both"))
	case d.DischargePressure != nil:
		p2 := *d.DischargePressure
		if !(p2 > d.SuctionPressure) || math.IsInf(p2, 0) {
			return 0, fieldErr("discharge_pressure", reason("discharge_pressure", fmt.Sprintf(
				"discharge pressure (%.6g Pa) must exceed suction pressure (%.6g Pa)", p2, d.SuctionPressure), p2))
		}
		return p2, nil
	case d.PressureRatio != nil:
		pr := *d.PressureRatio
		if !(pr > 1) || math.IsInf(pr, 0) || pr > 100 {
			return 0, fieldErr("pressure_ratio", reason("pressure_ratio",
				"the pressure ratio must be above 1 (discharge pressure must exceed suction pressure) and at most 100", pr))
		}
		return pr * d.SuctionPressure, nil
	}
	return 0, shapeErr("discharge_pressure", errors.New("give discharge_pressure or pressure_ratio"))
}

func massFlow(d StageDuty, m gas.Model, suction gas.State, prov *Provenance) (float64, error) {
	given := 0
	for _, f := range []*float64{d.MassFlow, d.ActualVolumeFlow, d.StandardVolumeFlow} {
		if f != nil {
			given++
		}
	}
	if given != 1 {
		return 0, shapeErr("flow", errors.New("give exactly one of flow.mass, flow.actual_volume and flow.standard_volume"))
	}
	switch {
	case d.MassFlow != nil:
		v := *d.MassFlow
		if !(v > 0) || math.IsInf(v, 0) {
			return 0, fieldErr("flow.mass", reason("mass", "the mass flow must be a positive number of kg/s", v))
		}
		return v, nil
	case d.ActualVolumeFlow != nil:
		q := *d.ActualVolumeFlow
		if !(q > 0) || math.IsInf(q, 0) {
			return 0, fieldErr("flow.actual_volume", reason("actual_volume", "the actual volume flow must be a positive number of m3/s", q))
		}
		return q * float64(suction.Density), nil
	}
	q := *d.StandardVolumeFlow
	if !(q > 0) || math.IsInf(q, 0) {
		return 0, fieldErr("flow.standard_volume", reason("standard_volume", "the standard volume flow must be a positive number of m3/s at the reference condition", q))
	}
	if d.StandardReference == "" {
		return 0, shapeErr("flow.reference", errors.New("a standard volume flow needs its reference condition: normal (0 degC, 101.325 kPa), standard (ISO 13443: 15 degC, 101.325 kPa) or us-standard (60 degF, 14.696 psia)"))
	}
	ref, err := flowbasis.ReferenceNamed(d.StandardReference)
	if err != nil {
		return 0, shapeErr("flow.reference", err)
	}
	mdot, err := flowbasis.MassFlowFromStandard(physics.CubicMeterPerS(q), m, ref)
	if err != nil {
		return 0, fieldErr("flow.standard_volume", err)
	}
	prov.Methods = append(prov.Methods, Method{Subject: "flow basis", Name: "standard volume at " + ref.Name + " conditions, density of the gas model there; " + WetBasis,
		Source: ref.Source})
	return float64(mdot), nil
}

// efficiency returns the efficiency given, or, when none is given, a first
// guess of the polytropic efficiency and estimate = true (the correlation
// is then iterated with the sizing).
func efficiency(d StageDuty, prov *Provenance) (eff path.Efficiency, field string, estimate bool, err error) {
	switch {
	case d.IsentropicEfficiency != nil && d.PolytropicEfficiency != nil:
		return path.Efficiency{}, "efficiency", false, shapeErr("efficiency", errors.New("give efficiency.isentropic or efficiency.polytropic, not both"))
	case d.IsentropicEfficiency != nil:
		eff, field, err = checkedEff(path.Isentropic, *d.IsentropicEfficiency, "efficiency.isentropic")
		return eff, field, false, err
	case d.PolytropicEfficiency != nil:
		eff, field, err = checkedEff(path.Polytropic, *d.PolytropicEfficiency, "efficiency.polytropic")
		return eff, field, false, err
	}
	return path.Efficiency{Basis: path.Polytropic, Value: 0.8}, "efficiency", true, nil
}

func checkedEff(b path.Basis, v float64, field string) (path.Efficiency, string, error) {
	if !(v >= MinEfficiency && v <= 1) {
		return path.Efficiency{}, field, fieldErr(field, reason(field, fmt.Sprintf("the efficiency is out of range: it must lie in [%g, 1]", MinEfficiency), v))
	}
	return path.Efficiency{Basis: b, Value: v}, field, nil
}

func (s *Service) impeller(d StageDuty, prov *Provenance) (stage.Impeller, error) {
	in := d.Impeller
	imp := stage.Impeller{BladeExitAngle: *in.BladeExitAngle, ExitBlockage: DefaultExitBlockage,
		PowerInputFactor: DefaultPowerInputFactor, ExitMeridionalVelocity: 1}
	if in.ExitMeridionalVelocity != nil {
		imp.ExitMeridionalVelocity = physics.MeterPerS(*in.ExitMeridionalVelocity)
	}
	switch {
	case in.SlipFactor != nil && (in.SlipModel != "" || in.BladeCount != 0):
		return imp, shapeErr("impeller.slip_model", errors.New("give slip_factor, or slip_model with blade_count, not both"))
	case in.SlipFactor != nil:
		imp.SlipFactor = *in.SlipFactor
	case in.SlipModel == "":
		return imp, shapeErr("impeller.slip_factor", errors.New("slip_factor is required, unless slip_model (wiesner, stanitz or stodola) and blade_count are given"))
	default:
		if in.BladeCount == 0 {
			return imp, shapeErr("impeller.blade_count", fmt.Errorf("slip model %s needs blade_count, the number of blades at the impeller exit", in.SlipModel))
		}
		// First estimate; Wiesner's inlet-radius correction is applied
		// once the inlet diameter is known (refineSlip).
		sigma, err := slipFrom(in, 0)
		if err != nil {
			return imp, err
		}
		imp.SlipFactor = sigma
	}
	if in.ExitBlockage != nil {
		imp.ExitBlockage = *in.ExitBlockage
		if !(imp.ExitBlockage >= 0 && imp.ExitBlockage < 0.5) {
			return imp, fieldErr("impeller.exit_blockage", reason("exit_blockage",
				"the exit blockage is the blocked fraction of the exit area: at least 0 and below 0.5", imp.ExitBlockage))
		}
	} else {
		prov.Defaults = append(prov.Defaults, Default{Field: "impeller.exit_blockage", Value: strconv.FormatFloat(DefaultExitBlockage, 'f', -1, 64),
			Note: "blade and boundary-layer blockage of the exit area (common practice, no source)"})
	}
	if in.PowerInputFactor != nil {
		imp.PowerInputFactor = *in.PowerInputFactor
	} else {
		prov.Defaults = append(prov.Defaults, Default{Field: "impeller.power_input_factor", Value: "1",
			Note: "no disc friction or windage added to the Euler work"})
	}
	// Range checks here so that each error names its field.
	switch {
	case !(imp.SlipFactor > 0 && imp.SlipFactor <= 1):
		return imp, fieldErr("impeller.slip_factor", reason("slip_factor",
			"the slip factor must lie in (0, 1]: it is 1 minus the slip velocity over the tip speed", imp.SlipFactor))
	case !(imp.BladeExitAngle >= 0 && imp.BladeExitAngle <= stage.MaxBladeExitAngle):
		return imp, fieldErr("impeller.blade_exit_angle", reason("blade_exit_angle",
			"the blade exit angle is the backsweep from radial in degrees: 0 for radial blades, at most 75", imp.BladeExitAngle))
	case !(imp.PowerInputFactor >= 1 && imp.PowerInputFactor <= 2):
		return imp, fieldErr("impeller.power_input_factor", reason("power_input_factor",
			"the power input factor must be at least 1 (it adds disc friction and windage to the Euler work) and at most 2", imp.PowerInputFactor))
	case !(imp.ExitMeridionalVelocity > 0) || math.IsInf(float64(imp.ExitMeridionalVelocity), 0):
		return imp, fieldErr("impeller.exit_meridional_velocity", reason("exit_meridional_velocity",
			"the exit meridional velocity must be a positive number of m/s: it carries the flow out of the impeller", float64(imp.ExitMeridionalVelocity)))
	}
	return imp, nil
}

func inletOf(in InletInput, prov *Provenance) (stage.Inlet, error) {
	out := stage.Inlet{Kind: stage.InletKind(in.Type)}
	if in.MeridionalVelocity != nil {
		out.MeridionalVelocity = physics.MeterPerS(*in.MeridionalVelocity)
		if !(*in.MeridionalVelocity > 0) || math.IsInf(*in.MeridionalVelocity, 0) {
			return out, fieldErr("impeller.inlet.meridional_velocity", reason("meridional_velocity",
				"the inlet meridional velocity must be a positive number of m/s", *in.MeridionalVelocity))
		}
	}
	if in.PrewhirlAngle != nil {
		out.PrewhirlAngle = *in.PrewhirlAngle
		if out.Kind != stage.InletAxialEye {
			return out, shapeErr("impeller.inlet.prewhirl_angle", errors.New("inlet guide-vane prewhirl is modelled for an axial eye only"))
		}
		if !(out.PrewhirlAngle >= -30 && out.PrewhirlAngle <= 60) {
			return out, fieldErr("impeller.inlet.prewhirl_angle", reason("prewhirl_angle",
				"the prewhirl angle is the inlet guide-vane flow angle from axial in degrees, positive with rotation: between -30 and 60", out.PrewhirlAngle))
		}
	}
	switch out.Kind {
	case stage.InletRadial:
		switch {
		case in.DiameterRatio == nil:
			return out, shapeErr("impeller.inlet.diameter_ratio", errors.New("a radial inlet needs diameter_ratio (D1/D2)"))
		case in.MeridionalVelocity == nil:
			return out, shapeErr("impeller.inlet.meridional_velocity", errors.New("a radial inlet needs meridional_velocity, the velocity entering the blades"))
		case in.EyeTipDiameter != nil:
			return out, shapeErr("impeller.inlet.eye_tip_diameter", errors.New("eye_tip_diameter belongs to an axial-eye inlet"))
		}
		out.DiameterRatio = *in.DiameterRatio
		if !(out.DiameterRatio > 0 && out.DiameterRatio < 1) {
			return out, fieldErr("impeller.inlet.diameter_ratio", reason("diameter_ratio",
				"the inlet diameter ratio D1/D2 must lie between 0 and 1", out.DiameterRatio))
		}
	case stage.InletAxialEye:
		if in.HubRatio == nil {
			return out, shapeErr("impeller.inlet.hub_ratio", errors.New("an axial eye needs hub_ratio (hub over eye tip diameter)"))
		}
		out.HubRatio = *in.HubRatio
		if !(out.HubRatio >= 0 && out.HubRatio < 0.95) {
			return out, fieldErr("impeller.inlet.hub_ratio", reason("hub_ratio",
				"the eye hub ratio (hub over eye tip diameter) must lie in [0, 0.95)", out.HubRatio))
		}
		if in.EyeTipDiameter != nil {
			if in.MeridionalVelocity != nil {
				return out, shapeErr("impeller.inlet.eye_tip_diameter", errors.New("give eye_tip_diameter or meridional_velocity, not both: either sets the other by continuity"))
			}
			out.EyeTipDiameter = physics.Meter(*in.EyeTipDiameter)
			if !(*in.EyeTipDiameter > 0 && *in.EyeTipDiameter < float64(stage.MaxTipDiameter)) {
				return out, fieldErr("impeller.inlet.eye_tip_diameter", reason("eye_tip_diameter",
					"the eye tip diameter must be a positive number of metres, below the largest impeller the sizing covers", *in.EyeTipDiameter))
			}
		}
		if in.EyeTipDiameter == nil && in.MeridionalVelocity == nil {
			prov.Defaults = append(prov.Defaults, Default{Field: "impeller.inlet.eye_tip_diameter", Value: "least shroud relative Mach number",
				Note: "neither eye_tip_diameter nor meridional_velocity given: the eye is chosen for the least relative Mach number at the eye tip"})
		}
	default:
		return out, shapeErr("impeller.inlet.type", fmt.Errorf("unknown inlet type %q: use radial or axial-eye", in.Type))
	}
	return out, nil
}

func power(d StageDuty, mdot, work float64, prov *Provenance) (Power, error) {
	eta := DefaultMechanicalEfficiency
	g := mdot * work
	switch {
	case d.MechanicalEfficiency != nil && d.MechanicalLosses != nil:
		return Power{}, shapeErr("mechanical_losses", errors.New("give mechanical_efficiency or mechanical_losses, not both"))
	case d.MechanicalLosses != nil:
		l := *d.MechanicalLosses
		if !(l >= 0) || math.IsInf(l, 0) {
			return Power{}, fieldErr("mechanical_losses", reason("mechanical_losses", "the mechanical losses must be a number of W, at least 0", l))
		}
		eta = g / (g + l)
		if !(eta >= MinMechanicalEfficiency) {
			return Power{}, fieldErr("mechanical_losses", reason("mechanical_losses", fmt.Sprintf(
				"the mechanical losses are out of range: at most a quarter of the gas power (%.4g W here), a mechanical efficiency of at least %g", g/4, MinMechanicalEfficiency), l))
		}
	case d.MechanicalEfficiency != nil:
		eta = *d.MechanicalEfficiency
		if !(eta >= MinMechanicalEfficiency && eta <= 1) {
			return Power{}, fieldErr("mechanical_efficiency", reason("mechanical_efficiency", fmt.Sprintf(
				"the mechanical efficiency is out of range: it must lie in [%g, 1] (bearing, seal and gear losses of at most a quarter of the gas power)", MinMechanicalEfficiency), eta))
		}
	default:
		prov.Defaults = append(prov.Defaults, Default{Field: "mechanical_efficiency", Value: "0.98",
			Note: "bearing and seal losses of about 2 % of gas power (common practice, no source)"})
	}
	shaft := g / eta
	out := Power{Gas: g, Shaft: shaft, MechanicalEfficiency: eta}
	var dr DriverInput
	if d.Driver != nil {
		dr = *d.Driver
	}
	switch {
	case dr.Margin != nil && dr.Rating != nil:
		return Power{}, shapeErr("driver.rating", errors.New("give driver.margin or driver.rating, not both: the rating of an installed driver fixes its margin"))
	case dr.Rating != nil:
		r := *dr.Rating
		if !(r > 0) || math.IsInf(r, 0) {
			return Power{}, fieldErr("driver.rating", reason("rating", "the driver rating must be a positive number of W", r))
		}
		out.DriverRating, out.DriverMargin = r, r/shaft
		prov.Methods = append(prov.Methods, Method{Subject: "driver rating", Name: "installed driver rating given; its margin over shaft power is graded", Source: limits.DriverMarginSource})
	case dr.Margin != nil:
		m := *dr.Margin
		if !(m >= 1 && m <= 3) {
			return Power{}, fieldErr("driver.margin", reason("margin", "the driver margin is the rating over shaft power: at least 1, at most 3", m))
		}
		out.DriverRating, out.DriverMargin = shaft*m, m
		prov.Methods = append(prov.Methods, Method{Subject: "driver rating", Name: "shaft power × the margin given", Source: limits.DriverMarginSource})
	default:
		out.DriverRating, out.DriverMargin = shaft*limits.DriverMargin, limits.DriverMargin
		prov.Defaults = append(prov.Defaults, Default{Field: "driver.margin", Value: "1.1", Note: limits.DriverMarginSource})
		prov.Methods = append(prov.Methods, Method{Subject: "driver rating", Name: "shaft power × 1.10", Source: limits.DriverMarginSource})
	}
	return out, nil
}

// suctionError names the suction field a model error belongs to.
func suctionError(err error, d StageDuty) error {
	var de *physics.DomainError
	if errors.As(err, &de) && de.Name == "pressure" {
		return fieldErr("suction.pressure", err)
	}
	return fieldErr("suction.temperature", err)
}

func compressionError(err error, effField string, d StageDuty) error {
	var de *physics.DomainError
	if errors.As(err, &de) {
		switch {
		case de.Name == "pressure ratio" || de.Name == "p2":
			if d.PressureRatio != nil {
				return fieldErr("pressure_ratio", err)
			}
			return fieldErr("discharge_pressure", err)
		case de.Name == "isentropic efficiency" || de.Name == "polytropic efficiency" || de.Name == "efficiency":
			return fieldErr(effField, err)
		}
	}
	if d.PressureRatio != nil {
		return fieldErr("pressure_ratio", fmt.Errorf("compression path: %w", err))
	}
	return fieldErr("discharge_pressure", fmt.Errorf("compression path: %w", err))
}

// sizingError names the field a stage-sizing error belongs to; speedField
// is the input that set the speed (speed, tip_diameter or a speed target).
func sizingError(err error, speedField string) error {
	var de *physics.DomainError
	if !errors.As(err, &de) {
		return err
	}
	field := map[string]string{
		"speed":                     speedField,
		"exit_blockage":             "impeller.exit_blockage",
		"inlet.eye_tip_diameter":    "impeller.inlet.eye_tip_diameter",
		"inlet.prewhirl_angle":      "impeller.inlet.prewhirl_angle",
		"slip_factor":               "impeller.slip_factor",
		"power_input_factor":        "impeller.power_input_factor",
		"blade_exit_angle":          "impeller.blade_exit_angle",
		"exit_meridional_velocity":  "impeller.exit_meridional_velocity",
		"inlet.meridional_velocity": "impeller.inlet.meridional_velocity",
		"inlet.diameter_ratio":      "impeller.inlet.diameter_ratio",
		"inlet.hub_ratio":           "impeller.inlet.hub_ratio",
		"inlet.type":                "impeller.inlet.type",
		"velocity":                  "impeller.inlet.meridional_velocity",
		"flow":                      "flow",
	}[de.Name]
	if field == "" {
		field = "impeller"
	}
	return fieldErr(field, err)
}
