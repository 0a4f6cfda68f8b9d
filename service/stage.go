package service

import (
	"context"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/flowbasis"
	"stagewright/physics/gas"
	"stagewright/physics/limits"
	"stagewright/physics/path"
	"stagewright/physics/stage"
)

// ModelVersion names the version of the physics behind every answer; it
// changes whenever a result for the same input could change.
const ModelVersion = "stagewright-physics 0.2.0"

// Defaults applied when a duty leaves a choice open.
const (
	// DefaultMechanicalEfficiency is gas power over shaft power: bearing
	// and seal losses of 1-2 % of gas power for large process machines
	// (testdata/reference/rules-of-thumb.md §10, common practice, no source).
	DefaultMechanicalEfficiency = 0.98
	// DefaultPowerInputFactor is 1: no disc friction or windage added.
	DefaultPowerInputFactor = 1.0
)

// Cautions is carried by every result: what the numbers are and are not.
const Cautions = "Preliminary engineering estimate from published methods, not a machine selection or guarantee. " +
	"Centrifugal compressors can fail violently and handle toxic, flammable or asphyxiating gases: the machine's " +
	"manufacturer, the applicable standards (API 617 / ISO 10439 and their peers), local codes and licensed engineering " +
	"practice govern overspeed and trip settings, overpressure protection and relief, surge control, discharge " +
	"temperature limits, materials and sealing. Confirm every figure with the manufacturer before use."

// Service runs the use cases. It holds no mutable state and is safe for
// concurrent use.
type Service struct{}

// New returns a Service.
func New() *Service { return &Service{} }

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
	Type               string   `json:"type"`
	DiameterRatio      *float64 `json:"diameter_ratio,omitempty"`
	HubRatio           *float64 `json:"hub_ratio,omitempty"`
	MeridionalVelocity float64  `json:"meridional_velocity"`
}

// ImpellerInput is the blading.
type ImpellerInput struct {
	BladeExitAngle float64 `json:"blade_exit_angle"`
	// SlipFactor is the slip factor given; nil when SlipCorrelation and
	// BladeCount select a published correlation instead.
	SlipFactor             *float64   `json:"slip_factor,omitempty"`
	SlipCorrelation        string     `json:"slip_correlation,omitempty"`
	BladeCount             int        `json:"blade_count,omitempty"`
	PowerInputFactor       *float64   `json:"power_input_factor,omitempty"`
	Inlet                  InletInput `json:"inlet"`
	ExitMeridionalVelocity float64    `json:"exit_meridional_velocity"`
	Construction           string     `json:"construction,omitempty"`
}

// StageDuty is a duty in SI units (Pa absolute, K, kg/s, m3/s, rev/min,
// m/s), as the API has parsed it. Exactly one of DischargePressure and
// PressureRatio, of MassFlow and ActualVolumeFlow, and of
// IsentropicEfficiency and PolytropicEfficiency is set.
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
	StandardReference    string        `json:"standard_reference,omitempty"`
	Speed                float64       `json:"speed"`
	IsentropicEfficiency *float64      `json:"isentropic_efficiency,omitempty"`
	PolytropicEfficiency *float64      `json:"polytropic_efficiency,omitempty"`
	MechanicalEfficiency *float64      `json:"mechanical_efficiency,omitempty"`
	Impeller             ImpellerInput `json:"impeller"`
	Diffuser             string        `json:"diffuser,omitempty"`
	PolytropicMethod     string        `json:"polytropic_method,omitempty"`
	ImpellerLossShare    *float64      `json:"impeller_loss_share,omitempty"`
}

// Warning is a structured concern about a result.
type Warning struct {
	// Measured is false for a notice that carries no value and limit.
	Measured bool
	Code     string
	Severity string
	Message  string
	Value    float64
	Limit    float64
	Margin   float64
	Unit     string
	Source   string
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
	GasModel     string
	Methods      []Method
	Defaults     []Default
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

// StandardFlows are volume flows at reference conditions, m3/s.
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
	Cautions   string
}

// SizeStage sizes one centrifugal stage for duty d.
func (s *Service) SizeStage(ctx context.Context, d StageDuty) (StageResult, error) {
	if err := ctx.Err(); err != nil {
		return StageResult{}, err
	}
	var res StageResult
	prov := &res.Provenance
	prov.ModelVersion = ModelVersion
	prov.InputHash = hashOf(d)

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
	eff, effField, err := efficiency(d)
	if err != nil {
		return StageResult{}, err
	}
	method := path.Stepwise
	switch d.PolytropicMethod {
	case "", "stepwise":
		if d.PolytropicMethod == "" {
			prov.Defaults = append(prov.Defaults, Default{Field: "options.polytropic_method", Value: "stepwise",
				Note: "polytropic head from the path of constant small-stage efficiency integrated step by step"})
		}
	case "schultz":
		method = path.Schultz
	default:
		return StageResult{}, shapeErr("options.polytropic_method", fmt.Errorf("unknown polytropic method %q: use stepwise or schultz", d.PolytropicMethod))
	}
	comp, err := path.Compression(model, suction, physics.Pascal(p2), eff, method)
	if err != nil {
		return StageResult{}, compressionError(err, effField, d)
	}
	res.Path = comp
	if err := ctx.Err(); err != nil { // the path is the costly step under a cubic model
		return StageResult{}, err
	}
	prov.Methods = append(prov.Methods,
		Method{Subject: "compression path", Name: "isentropic discharge by (P,s) flash; polytropic " + method.String(),
			Source: "Schultz, ASME J. Eng. Power 84(1):69-82 (1962) and ASME PTC 10-1997 (Schultz); Huntington, ASME J. Eng. Gas Turbines Power 107:872 (1985) (stepwise path)"},
	)

	imp, err := s.impeller(d, prov)
	if err != nil {
		return StageResult{}, err
	}
	inlet, err := inletOf(d.Impeller.Inlet)
	if err != nil {
		return StageResult{}, err
	}
	share := stage.DefaultImpellerLossShare
	if d.ImpellerLossShare != nil {
		share = *d.ImpellerLossShare
		if !(share >= 0 && share <= 1) {
			return StageResult{}, fieldErr("options.impeller_loss_share", reason("impeller_loss_share",
				"the impeller's share of the stage loss must lie between 0 and 1", share))
		}
	} else {
		prov.Defaults = append(prov.Defaults, Default{Field: "options.impeller_loss_share", Value: "0.5",
			Note: "half the stage loss is taken to arise in the impeller when the exit static state is found (Saravanamuttoo et al., Gas Turbine Theory, Example 4.1, from memory)"})
	}
	duty := stage.Duty{Model: model, Suction: suction, Work: comp.Work, IsentropicHead: comp.IsentropicHead,
		PolytropicHead: comp.PolytropicHead, IsentropicEfficiency: comp.IsentropicEfficiency,
		ImpellerLossShare: share, MassFlow: physics.KgPerS(mdot), Speed: physics.RevPerMin(d.Speed)}
	if !(d.Speed > 0) || math.IsInf(d.Speed, 0) {
		return StageResult{}, fieldErr("speed", reason("speed", "the rotational speed must be a positive number of rev/min", d.Speed))
	}
	sz, err := stage.Size(duty, imp, inlet)
	if err != nil {
		return StageResult{}, sizingError(err)
	}
	if d.Impeller.SlipFactor == nil {
		if err := ctx.Err(); err != nil {
			return StageResult{}, err
		}
		sz, imp, err = refineSlip(d.Impeller, duty, imp, inlet, sz, prov)
		if err != nil {
			return StageResult{}, err
		}
	}
	res.SlipFactor = imp.SlipFactor
	res.Sizing = sz
	prov.Methods = append(prov.Methods,
		Method{Subject: "stage sizing", Name: "Euler work with slip and power input factor; continuity at station static densities",
			Source: "Dixon & Hall, Fluid Mechanics and Thermodynamics of Turbomachinery, 7th ed. (2014), ch. 7; Saravanamuttoo et al., Gas Turbine Theory, 6th ed. (2009), ch. 4"})

	res.MassFlow = mdot
	res.SuctionVolumeFlow = sz.SuctionFlow
	res.StandardFlows = standardFlows(model, mdot)
	res.Speed = d.Speed
	res.Power, err = power(d, mdot, float64(comp.Work), prov)
	if err != nil {
		return StageResult{}, err
	}
	prov.Methods = append(prov.Methods, Method{Subject: "driver rating", Name: "shaft power × 1.10", Source: limits.DriverMarginSource})

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
	res.Cautions = Cautions
	return res, nil
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
	prov.Methods = append(prov.Methods, Method{Subject: "flow basis", Name: "standard volume at " + ref.Name + " conditions, density of the gas model there",
		Source: ref.Source})
	return float64(mdot), nil
}

func efficiency(d StageDuty) (path.Efficiency, string, error) {
	switch {
	case d.IsentropicEfficiency != nil && d.PolytropicEfficiency != nil:
		return path.Efficiency{}, "efficiency", shapeErr("efficiency", errors.New("give efficiency.isentropic or efficiency.polytropic, not both"))
	case d.IsentropicEfficiency != nil:
		return checkedEff(path.Isentropic, *d.IsentropicEfficiency, "efficiency.isentropic")
	case d.PolytropicEfficiency != nil:
		return checkedEff(path.Polytropic, *d.PolytropicEfficiency, "efficiency.polytropic")
	}
	return path.Efficiency{}, "efficiency", shapeErr("efficiency", errors.New("give efficiency.isentropic or efficiency.polytropic"))
}

func checkedEff(b path.Basis, v float64, field string) (path.Efficiency, string, error) {
	if !(v > 0 && v <= 1) {
		return path.Efficiency{}, field, fieldErr(field, reason(field, "the efficiency must lie in (0, 1]: above 0 and at most 1", v))
	}
	return path.Efficiency{Basis: b, Value: v}, field, nil
}

func (s *Service) impeller(d StageDuty, prov *Provenance) (stage.Impeller, error) {
	in := d.Impeller
	imp := stage.Impeller{BladeExitAngle: in.BladeExitAngle,
		PowerInputFactor: DefaultPowerInputFactor, ExitMeridionalVelocity: physics.MeterPerS(in.ExitMeridionalVelocity)}
	switch {
	case in.SlipFactor != nil && (in.SlipCorrelation != "" || in.BladeCount != 0):
		return imp, shapeErr("impeller.slip_correlation", errors.New("give slip_factor, or slip_correlation with blade_count, not both"))
	case in.SlipFactor != nil:
		imp.SlipFactor = *in.SlipFactor
	case in.SlipCorrelation == "":
		return imp, shapeErr("impeller.slip_factor", errors.New("slip_factor is required, unless slip_correlation (wiesner, stanitz or stodola) and blade_count are given"))
	default:
		if in.BladeCount == 0 {
			return imp, shapeErr("impeller.blade_count", fmt.Errorf("slip correlation %s needs blade_count, the number of blades at the impeller exit", in.SlipCorrelation))
		}
		// First estimate; Wiesner's inlet-radius correction is applied
		// once the inlet diameter is known (refineSlip).
		sigma, err := slipFrom(in, 0)
		if err != nil {
			return imp, err
		}
		imp.SlipFactor = sigma
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

func inletOf(in InletInput) (stage.Inlet, error) {
	out := stage.Inlet{Kind: stage.InletKind(in.Type), MeridionalVelocity: physics.MeterPerS(in.MeridionalVelocity)}
	if !(in.MeridionalVelocity > 0) || math.IsInf(in.MeridionalVelocity, 0) {
		return out, fieldErr("impeller.inlet.meridional_velocity", reason("meridional_velocity",
			"the inlet meridional velocity must be a positive number of m/s", in.MeridionalVelocity))
	}
	switch out.Kind {
	case stage.InletRadial:
		if in.DiameterRatio == nil {
			return out, shapeErr("impeller.inlet.diameter_ratio", errors.New("a radial inlet needs diameter_ratio (D1/D2)"))
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
	default:
		return out, shapeErr("impeller.inlet.type", fmt.Errorf("unknown inlet type %q: use radial or axial-eye", in.Type))
	}
	return out, nil
}

func power(d StageDuty, mdot, work float64, prov *Provenance) (Power, error) {
	eta := DefaultMechanicalEfficiency
	if d.MechanicalEfficiency != nil {
		eta = *d.MechanicalEfficiency
		if !(eta > 0 && eta <= 1) {
			return Power{}, fieldErr("mechanical_efficiency", reason("mechanical_efficiency",
				"the mechanical efficiency must lie in (0, 1]", eta))
		}
	} else {
		prov.Defaults = append(prov.Defaults, Default{Field: "mechanical_efficiency", Value: "0.98",
			Note: "bearing and seal losses of about 2 % of gas power (common practice, no source)"})
	}
	g := mdot * work
	shaft := g / eta
	return Power{Gas: g, Shaft: shaft, MechanicalEfficiency: eta, DriverRating: shaft * limits.DriverMargin, DriverMargin: limits.DriverMargin}, nil
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

// sizingError names the field a stage-sizing error belongs to.
func sizingError(err error) error {
	var de *physics.DomainError
	if !errors.As(err, &de) {
		return err
	}
	field := map[string]string{
		"speed":                     "speed",
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
