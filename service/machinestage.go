package service

import (
	"errors"
	"fmt"
	"math"
	"strconv"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/offdesign"
	"stagewright/physics/path"
	"stagewright/physics/stage"
)

// Machine defaults, recorded in provenance when applied.
const (
	// DefaultMinimumSpeedFraction is the minimum operating speed over the
	// first stage's design speed, 70 % (common practice, no source:
	// variable-speed process machines are usually specified for 70-105 %).
	DefaultMinimumSpeedFraction = 0.70
	// DefaultMaximumSpeedFraction is the maximum continuous speed over the
	// design speed, 105 % (API 617 takes the maximum continuous speed as
	// at least 105 % of the highest rated speed, from memory).
	DefaultMaximumSpeedFraction = 1.05
	// DefaultDriverMarginMachine is the driver rating over the design
	// shaft power when no driver rating is given: 1.10, as limits.DriverMargin.
	DefaultDriverMarginMachine = 1.10
	// surgeAngleClearance is the least distance of the critical
	// diffuser-inlet angle above the design angle, deg (a stage is not
	// designed to run at surge; common practice, no source).
	surgeAngleClearance = 5.0
	// maxSurgeFlowAngle bounds the critical diffuser-inlet angle, deg from
	// radial (common practice, no source): at 90 deg the flow would be
	// tangential and the surge criterion cr2 = σU2/(tan α2c + tan β2')
	// meaningless (a blower's design flow typed at a fifth of its own
	// once gave a negative surge flow).
	maxSurgeFlowAngle = 88.0
	// defaultDiffuserChokeFraction is the design flow over the vaned
	// diffuser throat's sonic flow when the throat area is not given
	// (common practice, no source).
	defaultDiffuserChokeFraction = 0.85
	// minSpeedFraction and maxSpeedFraction bound any speed the machine
	// endpoints evaluate, as a fraction of the design speed.
	minSpeedFraction = 0.05
	maxSpeedFraction = 2.0
	// maxTipSpeed is the largest tip speed evaluated at all, m/s: beyond
	// any impeller material (titanium open impellers reach some 600 m/s;
	// common practice, no source).
	maxTipSpeed = 900.0
)

// preparedStage is one machine stage turned into the off-design model,
// with its design point evaluated at its design gas.
type preparedStage struct {
	index  int // 0-based
	field  string
	st     offdesign.Stage
	speed  float64 // design speed, rev/min
	ratio  float64 // design speed over the first stage's design speed
	design offdesign.Point
	// designGas is the stage's design gas model; designMass its design
	// mass flow.
	designGas  gas.Model
	designMass float64
	// vaned is true for a vaned diffuser; construction is the impeller's.
	vaned        bool
	construction string
}

// preparedMachine is a machine ready to be rated.
type preparedMachine struct {
	m      Machine
	stages []preparedStage
	// speedRange is the resolved range of the first stage, rev/min.
	speedRange SpeedRange
	// driverRating is the resolved driver rating, W; mechEff the
	// mechanical efficiency.
	driverRating float64
	mechEff      float64
	// designShaft is the design shaft power, W.
	designShaft float64
	coolers     map[int]MachineCooler // by the stage they follow (1-based)
}

// prefixErr re-roots an input error's field under prefix ("machine.stages.0.design").
func prefixErr(prefix string, err error) error {
	var ie *InputError
	if errors.As(err, &ie) {
		out := *ie
		out.Field = prefix + "." + ie.Field
		return &out
	}
	return fieldErr(prefix, err)
}

// prepareMachine checks m, builds the off-design model of each stage and
// evaluates each at its design point with its design gas; defaults are
// recorded in prov.
func (s *Service) prepareMachine(m Machine, prov *Provenance) (*preparedMachine, error) {
	if len(m.Stages) == 0 {
		return nil, shapeErr("machine.stages", errors.New("a machine needs at least one stage"))
	}
	if len(m.Stages) > 12 {
		return nil, shapeErr("machine.stages", errors.New("a machine has at most 12 stages"))
	}
	switch m.Arrangement {
	case "", "single", "geared", "inline":
	default:
		return nil, shapeErr("machine.arrangement", fmt.Errorf("unknown arrangement %q: use single, geared or inline", m.Arrangement))
	}
	pm := &preparedMachine{m: m, coolers: map[int]MachineCooler{}}
	for i, c := range m.Coolers {
		f := "machine.coolers." + strconv.Itoa(i)
		if c.AfterStage < 1 || c.AfterStage > len(m.Stages) {
			return nil, fieldErr(f+".after_stage", reason("after_stage", fmt.Sprintf("a cooler follows a stage of the machine: 1 to %d", len(m.Stages)), float64(c.AfterStage)))
		}
		if _, dup := pm.coolers[c.AfterStage]; dup {
			return nil, shapeErr(f+".after_stage", fmt.Errorf("two coolers after stage %d: give one", c.AfterStage))
		}
		pm.coolers[c.AfterStage] = c
	}
	for i := range m.Stages {
		ps, err := s.prepareStage(m, i, prov)
		if err != nil {
			return nil, err
		}
		pm.stages = append(pm.stages, ps)
	}
	n1 := pm.stages[0].speed
	for i := range pm.stages {
		pm.stages[i].ratio = pm.stages[i].speed / n1
	}
	if m.Arrangement == "inline" {
		for i := range pm.stages {
			if math.Abs(pm.stages[i].ratio-1) > 1e-9 {
				return nil, fieldErr("machine.stages."+strconv.Itoa(i)+".design.speed", reason("speed",
					"an inline machine turns every impeller at one shaft speed: every stage's design speed must equal the first stage's", pm.stages[i].speed))
			}
		}
	}
	pm.mechEff = DefaultMechanicalEfficiency
	if m.MechanicalEfficiency != nil {
		pm.mechEff = *m.MechanicalEfficiency
		if !(pm.mechEff >= MinMechanicalEfficiency && pm.mechEff <= 1) {
			return nil, fieldErr("machine.mechanical_efficiency", reason("mechanical_efficiency", fmt.Sprintf(
				"the mechanical efficiency is out of range: %g to 1 (losses past a quarter of the gas power are taken for an input mistake)", MinMechanicalEfficiency), pm.mechEff))
		}
	} else {
		prov.Defaults = append(prov.Defaults, Default{Field: "machine.mechanical_efficiency", Value: "0.98",
			Note: "bearing and seal losses of about 2 % of gas power (common practice, no source)"})
	}
	for _, ps := range pm.stages {
		pm.designShaft += ps.designMass * float64(ps.design.Compression.Work) / pm.mechEff
	}
	if r := m.SpeedRange; r != nil {
		pm.speedRange = *r
		switch {
		case !(r.Minimum > 0) || math.IsInf(r.Minimum, 0):
			return nil, fieldErr("machine.speed_range.minimum", reason("minimum", "the minimum speed must be a positive number of rev/min", r.Minimum))
		case !(r.MaximumContinuous > r.Minimum) || math.IsInf(r.MaximumContinuous, 0):
			return nil, fieldErr("machine.speed_range.maximum_continuous", reason("maximum_continuous", "the maximum continuous speed must exceed the minimum speed", r.MaximumContinuous))
		}
	} else {
		pm.speedRange = SpeedRange{Minimum: DefaultMinimumSpeedFraction * n1, MaximumContinuous: DefaultMaximumSpeedFraction * n1}
		prov.Defaults = append(prov.Defaults, Default{Field: "machine.speed_range",
			Value: strconv.FormatFloat(pm.speedRange.Minimum, 'f', 0, 64) + "-" + strconv.FormatFloat(pm.speedRange.MaximumContinuous, 'f', 0, 64) + " rev/min",
			Note:  "70 % (common practice, no source) to 105 % (API 617 maximum continuous speed, from memory) of the first stage's design speed"})
	}
	if m.Driver != nil && m.Driver.Rating != nil {
		pm.driverRating = *m.Driver.Rating
		if !(pm.driverRating > 0) || math.IsInf(pm.driverRating, 0) {
			return nil, fieldErr("machine.driver.rating", reason("rating", "the driver rating must be a positive number of W", pm.driverRating))
		}
	} else {
		pm.driverRating = DefaultDriverMarginMachine * pm.designShaft
		prov.Defaults = append(prov.Defaults, Default{Field: "machine.driver.rating", Value: strconv.FormatFloat(pm.driverRating, 'f', 0, 64) + " W",
			Note: "1.10 × the design shaft power (" + DriverMarginSourceNote + ")"})
	}
	return pm, nil
}

// DriverMarginSourceNote is the basis of the default driver rating.
const DriverMarginSourceNote = "from memory: API 617 driver clause / API 541, driver rated at least 110 % of the greatest power required"

// prepareStage builds stage i of m.
func (s *Service) prepareStage(m Machine, i int, prov *Provenance) (preparedStage, error) {
	ms := m.Stages[i]
	f := "machine.stages." + strconv.Itoa(i)
	ps := preparedStage{index: i, field: f, construction: ms.Construction}
	d := ms.Design
	posFinite := func(name string, v float64, what string) error {
		if !(v > 0) || math.IsInf(v, 0) {
			return fieldErr(f+"."+name, reason(name, what, v))
		}
		return nil
	}
	for _, c := range []struct {
		name string
		v    float64
		what string
	}{
		{"tip_diameter", ms.TipDiameter, "the tip diameter must be a positive number of metres"},
		{"exit_width", ms.ExitWidth, "the exit width must be a positive number of metres"},
		{"design.speed", d.Speed, "the design speed must be a positive number of rev/min"},
		{"design.volume_flow", d.VolumeFlow, "the design volume flow must be a positive number of m3/s"},
	} {
		if err := posFinite(c.name, c.v, c.what); err != nil {
			return ps, err
		}
	}
	if err := suctionInRange(d.SuctionPressure, d.SuctionTemperature, f+".design.suction.pressure", f+".design.suction.temperature"); err != nil {
		return ps, err
	}
	if d.DischargePressure != 0 && (!(d.DischargePressure > d.SuctionPressure) || math.IsInf(d.DischargePressure, 0)) {
		return ps, fieldErr(f+".design.discharge_pressure", reason("discharge_pressure", fmt.Sprintf(
			"the design discharge pressure (%.6g Pa) must exceed the design suction pressure (%.6g Pa)", d.DischargePressure, d.SuctionPressure), d.DischargePressure))
	}
	if !(d.PolytropicEfficiency > 0 && d.PolytropicEfficiency <= 1) {
		return ps, fieldErr(f+".design.polytropic_efficiency", reason("polytropic_efficiency", "the design polytropic efficiency must lie in (0, 1]", d.PolytropicEfficiency))
	}
	ps.speed = d.Speed
	if u2 := math.Pi * ms.TipDiameter * d.Speed / 60; u2 > maxTipSpeed {
		return ps, fieldErr(f+".design.speed", reason("speed", fmt.Sprintf("the design speed gives a tip speed of %.0f m/s with this tip diameter, beyond any impeller (at most %.0f m/s evaluated)", u2, maxTipSpeed), d.Speed))
	}
	// Blading.
	imp := ImpellerInput{BladeExitAngle: &ms.BladeExitAngle, SlipModel: ms.SlipModel, BladeCount: ms.BladeCount, SlipFactor: ms.SlipFactor}
	st := offdesign.Stage{TipDiameter: physics.Meter(ms.TipDiameter), ExitWidth: physics.Meter(ms.ExitWidth), BladeExitAngle: ms.BladeExitAngle,
		PowerInputFactor: ms.PowerInputFactor, ExitBlockage: ms.ExitBlockage, ImpellerLossShare: stage.DefaultImpellerLossShare, Method: path.Stepwise}
	if st.PowerInputFactor == 0 {
		st.PowerInputFactor = DefaultPowerInputFactor
	}
	switch ms.PolytropicMethod {
	case "", "stepwise":
	case "schultz":
		st.Method = path.Schultz
	default:
		return ps, shapeErr(f+".polytropic_method", fmt.Errorf("unknown polytropic method %q: use stepwise or schultz", ms.PolytropicMethod))
	}
	if ms.ImpellerLossShare != nil {
		st.ImpellerLossShare = *ms.ImpellerLossShare
	}
	// Inlet.
	in := ms.Inlet
	switch stage.InletKind(in.Type) {
	case stage.InletAxialEye:
		if in.EyeTipDiameter == nil {
			return ps, shapeErr(f+".inlet.eye_tip_diameter", errors.New("an axial eye needs eye_tip_diameter (and eye_hub_diameter), m"))
		}
		if in.Diameter != nil || in.Width != nil {
			return ps, shapeErr(f+".inlet.diameter", errors.New("diameter and width belong to a radial inlet; an axial eye takes eye_tip_diameter and eye_hub_diameter"))
		}
		st.Inlet = offdesign.Inlet{Kind: stage.InletAxialEye, EyeTipDiameter: physics.Meter(*in.EyeTipDiameter)}
		if in.EyeHubDiameter != nil {
			st.Inlet.EyeHubDiameter = physics.Meter(*in.EyeHubDiameter)
		} else {
			return ps, shapeErr(f+".inlet.eye_hub_diameter", errors.New("an axial eye needs eye_hub_diameter, m (0 for an eye without a hub)"))
		}
	case stage.InletRadial:
		if in.Diameter == nil {
			return ps, shapeErr(f+".inlet.diameter", errors.New("a radial inlet needs diameter (D1) and width (b1), m"))
		}
		if in.Width == nil {
			return ps, shapeErr(f+".inlet.width", errors.New("a radial inlet needs width (b1), m"))
		}
		if in.EyeTipDiameter != nil || in.EyeHubDiameter != nil {
			return ps, shapeErr(f+".inlet.eye_tip_diameter", errors.New("eye diameters belong to an axial eye; a radial inlet takes diameter and width"))
		}
		st.Inlet = offdesign.Inlet{Kind: stage.InletRadial, Diameter: physics.Meter(*in.Diameter), Width: physics.Meter(*in.Width)}
	default:
		return ps, shapeErr(f+".inlet.type", fmt.Errorf("unknown inlet type %q: use axial-eye or radial", in.Type))
	}
	if in.PrewhirlAngle != nil {
		st.Inlet.PrewhirlAngle = *in.PrewhirlAngle
	}
	switch {
	case ms.SlipFactor != nil && (ms.SlipModel != "" || ms.BladeCount != 0) && ms.SlipModel != "":
		return ps, shapeErr(f+".slip_model", errors.New("give slip_factor, or slip_model with blade_count, not both"))
	case ms.SlipFactor != nil:
		st.SlipFactor = *ms.SlipFactor
	case ms.SlipModel == "":
		return ps, shapeErr(f+".slip_factor", errors.New("slip_factor is required, unless slip_model (wiesner, stanitz or stodola) and blade_count are given"))
	case ms.BladeCount <= 0:
		return ps, shapeErr(f+".blade_count", fmt.Errorf("slip model %s needs blade_count, the number of blades at the impeller exit", ms.SlipModel))
	default:
		ratio := 0.0
		if ms.TipDiameter > 0 {
			if st.Inlet.Kind == stage.InletAxialEye {
				ratio = float64(st.Inlet.EyeTipDiameter) / ms.TipDiameter
			} else {
				ratio = float64(st.Inlet.Diameter) / ms.TipDiameter
			}
		}
		sigma, err := slipFrom(imp, ratio)
		if err != nil {
			return ps, prefixErr(f, stripImpeller(err))
		}
		st.SlipFactor = sigma
	}
	switch ms.Diffuser.Type {
	case "", "vaneless":
		if ms.Diffuser.ThroatArea != nil {
			return ps, shapeErr(f+".diffuser.throat_area", errors.New("a throat area belongs to a vaned diffuser"))
		}
	case "vaned":
		ps.vaned = true
	default:
		return ps, shapeErr(f+".diffuser.type", fmt.Errorf("unknown diffuser type %q: use vaneless or vaned", ms.Diffuser.Type))
	}
	// Placeholder design numbers for the checks; set below.
	st.Design = offdesign.Design{FlowCoefficient: 0.05, TipMach: 0.5, PolytropicEfficiency: d.PolytropicEfficiency}
	if err := st.Check(); err != nil {
		return ps, stageErr(f, err)
	}
	// Design gas, suction and flow.
	model, _, err := s.gasModel(d.Gas, d.SuctionTemperature, d.SuctionPressure)
	if err != nil {
		return ps, prefixErr(f+".design", err)
	}
	suction, err := fullState(model, physics.Kelvin(d.SuctionTemperature), physics.Pascal(d.SuctionPressure))
	if err != nil {
		return ps, fieldErr(f+".design.suction.temperature", err)
	}
	if suction.Phase == gas.PhaseLiquid || suction.Phase == gas.PhaseTwoPhase {
		return ps, fieldErr(f+".design.suction.temperature", reason("suction_temperature", "the design gas is not a dry gas at the design suction state", d.SuctionTemperature))
	}
	ps.designGas = model
	ps.designMass = d.VolumeFlow * float64(suction.Density)
	u2 := math.Pi * ms.TipDiameter * d.Speed / 60
	st.Design.FlowCoefficient = d.VolumeFlow / (u2 * math.Pi / 4 * ms.TipDiameter * ms.TipDiameter)
	st.Design.TipMach = u2 / float64(suction.SoundSpeed)
	if err := st.Check(); err != nil {
		return ps, stageErr(f, err)
	}
	beta1, err := offdesign.InletBladeAngle(model, suction, ps.designMass, physics.RevPerMin(d.Speed), st)
	if err != nil {
		return ps, stageErr(f, err)
	}
	st.Inlet.BladeAngle = beta1
	prov.Defaults = append(prov.Defaults, Default{Field: f + ".inlet.blade_angle", Value: strconv.FormatFloat(beta1, 'f', 2, 64) + " deg",
		Note: "inlet blade angle at the rms inlet radius for zero incidence at the design point (common practice, no source); it sets the inducer throat A1 cos(beta1) of the choke estimate"})
	line, err := offdesign.NewLine(model, suction, physics.RevPerMin(d.Speed), st)
	if err != nil {
		return ps, stageErr(f, err)
	}
	chokeMass, _ := line.MaxFlow()
	st.Design.ChokeFlowCoefficient = line.FlowCoefficient(chokeMass)
	if !(ps.designMass < chokeMass) {
		return ps, fieldErr(f+".design.volume_flow", reason("volume_flow", fmt.Sprintf(
			"the design flow (%.5g m3/s) is at or past the choke flow of the inlet as built (%.5g m3/s at the design speed): check the inlet dimensions and the design flow",
			d.VolumeFlow, chokeMass/float64(suction.Density)), d.VolumeFlow))
	}
	if line, err = offdesign.NewLine(model, suction, physics.RevPerMin(d.Speed), st); err != nil {
		return ps, stageErr(f, err)
	}
	dp, err := line.At(ps.designMass)
	if err != nil {
		return ps, fieldErr(f+".design", fmt.Errorf("the stage as built cannot pass its design flow at its design speed: %w", err))
	}
	ps.design = dp
	if dp.ExitFlowAngle+surgeAngleClearance >= maxSurgeFlowAngle {
		return ps, fieldErr(f+".design.volume_flow", reason("volume_flow", fmt.Sprintf(
			"at the design flow (%.5g m3/s) the flow leaves the impeller %.1f deg from radial, almost tangential: a stage as built cannot be designed there (it would be past any surge estimate); check the design volume flow against the exit width and tip diameter",
			d.VolumeFlow, dp.ExitFlowAngle), d.VolumeFlow))
	}
	st.Design.SurgeFlowAngle = math.Max(offdesign.DefaultSurgeFlowAngle, dp.ExitFlowAngle+surgeAngleClearance)
	if st.Design.SurgeFlowAngle > offdesign.DefaultSurgeFlowAngle {
		prov.Defaults = append(prov.Defaults, Default{Field: f + ".surge_flow_angle", Value: strconv.FormatFloat(st.Design.SurgeFlowAngle, 'f', 2, 64) + " deg",
			Note: "the design diffuser-inlet flow angle lies within 5 deg of the 75 deg surge criterion: the critical angle is taken 5 deg above the design angle (common practice, no source)"})
	}
	if ps.vaned {
		if ms.Diffuser.ThroatArea != nil {
			st.DiffuserThroatArea = *ms.Diffuser.ThroatArea
			if !(st.DiffuserThroatArea > 0) || math.IsInf(st.DiffuserThroatArea, 0) {
				return ps, fieldErr(f+".diffuser.throat_area", reason("throat_area", "the diffuser throat area must be a positive number of m2", st.DiffuserThroatArea))
			}
		} else {
			flux, _, err := offdesign.SonicFlux(model, dp.ExitTotal)
			if err != nil {
				return ps, fieldErr(f+".diffuser", err)
			}
			st.DiffuserThroatArea = ps.designMass / (defaultDiffuserChokeFraction * flux)
			prov.Defaults = append(prov.Defaults, Default{Field: f + ".diffuser.throat_area", Value: strconv.FormatFloat(st.DiffuserThroatArea, 'g', 5, 64) + " m2",
				Note: "vaned diffuser throat not given: taken to pass the design flow at 85 % of its sonic flow from the design impeller exit state, a choke margin of 15 % at design (common practice, no source)"})
		}
	}
	ps.st = st
	return ps, nil
}

// stripImpeller turns an "impeller.x" field into "x".
func stripImpeller(err error) error {
	var ie *InputError
	if errors.As(err, &ie) && len(ie.Field) > len("impeller.") && ie.Field[:len("impeller.")] == "impeller." {
		out := *ie
		out.Field = ie.Field[len("impeller."):]
		return &out
	}
	return err
}

// stageErr names the machine field of an off-design domain error.
func stageErr(prefix string, err error) error {
	var de *physics.DomainError
	if errors.As(err, &de) {
		switch de.Name {
		case "tip_diameter", "exit_width", "blade_exit_angle", "slip_factor", "power_input_factor", "exit_blockage",
			"inlet.eye_tip_diameter", "inlet.eye_hub_diameter", "inlet.diameter", "inlet.width", "inlet.prewhirl_angle", "inlet.type",
			"diffuser.throat_area":
			return fieldErr(prefix+"."+de.Name, err)
		case "inlet.blade_angle":
			return fieldErr(prefix+".inlet", err)
		case "design.flow_coefficient", "design.tip_mach":
			return fieldErr(prefix+".design.speed", err)
		case "design.volume_flow", "design.polytropic_efficiency":
			return fieldErr(prefix+"."+de.Name, err)
		}
	}
	return fieldErr(prefix, err)
}

// lineFor returns stage ps's speed line at first-stage speed n1 for gas m
// at suction state in.
func (ps preparedStage) lineFor(m gas.Model, in gas.State, n1 float64) (*offdesign.Line, error) {
	n := n1 * ps.ratio
	return offdesign.NewLine(m, in, physics.RevPerMin(n), ps.st)
}
