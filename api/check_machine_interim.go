package api

import (
	"strconv"

	"stagewright/physics"
	"stagewright/service"
)

// machineOfSpec converts a decoded machine into SI; field names the
// machine's place in the request ("machine"). Interim: the machine branch
// lands the shared conversion; this one goes when it does.
func machineOfSpec(s MachineSpec, field string) (service.Machine, error) {
	amb := float64(physics.StandardAtmosphere)
	m := service.Machine{Name: s.Name, Arrangement: s.Arrangement, MechanicalEfficiency: s.MechanicalEfficiency}
	var err error
	conv := func(q *Quantity, dim dimension, f string) *float64 {
		if err != nil {
			return nil
		}
		var v *float64
		v, err = si(q, dim, field+"."+f, amb)
		return v
	}
	for i, st := range s.Stages {
		p := "stages." + strconv.Itoa(i) + "."
		ms := service.MachineStage{TipDiameter: must(conv(st.TipDiameter, dimLength, p+"tip_diameter")),
			ExitWidth: must(conv(st.ExitWidth, dimLength, p+"exit_width")), BladeExitAngle: must(st.BladeExitAngle),
			BladeCount: intOr0(st.BladeCount), SlipModel: st.SlipModel, SlipFactor: st.SlipFactor,
			ExitBlockage: service.DefaultExitBlockage, PowerInputFactor: service.DefaultPowerInputFactor, Construction: st.Construction}
		if st.ExitBlockage != nil {
			ms.ExitBlockage = *st.ExitBlockage
		}
		if st.PowerInputFactor != nil {
			ms.PowerInputFactor = *st.PowerInputFactor
		}
		if ms.Construction == "" {
			ms.Construction = "closed-steel"
		}
		ms.Diffuser = service.Diffuser{Type: "vaneless"}
		if st.Diffuser != nil {
			ms.Diffuser = service.Diffuser{Type: st.Diffuser.Type, ThroatArea: st.Diffuser.ThroatArea}
		}
		in := st.Inlet
		ms.Inlet = service.MachineInlet{Type: in.Type, EyeTipDiameter: conv(in.EyeTipDiameter, dimLength, p+"inlet.eye_tip_diameter"),
			EyeHubDiameter: conv(in.EyeHubDiameter, dimLength, p+"inlet.eye_hub_diameter"), Diameter: conv(in.Diameter, dimLength, p+"inlet.diameter"),
			Width: conv(in.Width, dimLength, p+"inlet.width"), PrewhirlAngle: in.PrewhirlAngle}
		d := st.Design
		dp := service.DesignPoint{Speed: must(conv(d.Speed, dimSpeed, p+"design.speed")), VolumeFlow: must(conv(d.VolumeFlow, dimVolumeFlow, p+"design.volume_flow")),
			MassFlow: must(d.MassFlow), FlowCoefficient: must(d.FlowCoefficient), WorkCoefficient: must(d.WorkCoefficient),
			PolytropicEfficiency: must(d.PolytropicEfficiency), TipMach: must(d.TipMach), PolytropicHead: must(d.PolytropicHead),
			SuctionPressure:    must(conv(d.Suction.Pressure, dimPressure, p+"design.suction.pressure")),
			SuctionTemperature: must(conv(d.Suction.Temperature, dimTemperature, p+"design.suction.temperature")),
			DischargePressure:  must(conv(d.DischargePressure, dimPressure, p+"design.discharge_pressure")), Gas: gasInputOf(d.Gas)}
		ms.Design = dp
		m.Stages = append(m.Stages, ms)
	}
	for i, c := range s.Coolers {
		p := "coolers." + strconv.Itoa(i) + "."
		mc := service.MachineCooler{AfterStage: c.AfterStage, OutletTemperature: conv(c.OutletTemperature, dimTemperature, p+"outlet_temperature"),
			Approach: c.Approach, CoolantTemperature: conv(c.CoolantTemperature, dimTemperature, p+"coolant_temperature")}
		mc.PressureDrop = must(conv(c.PressureDrop, dimPressure, p+"pressure_drop"))
		m.Coolers = append(m.Coolers, mc)
	}
	if r := s.SpeedRange; r != nil {
		m.SpeedRange = &service.SpeedRange{Minimum: must(conv(r.Minimum, dimSpeed, "speed_range.minimum")),
			MaximumContinuous: must(conv(r.MaximumContinuous, dimSpeed, "speed_range.maximum_continuous"))}
	}
	if s.Driver != nil {
		m.Driver = &service.MachineDriver{Rating: conv(s.Driver.Rating, dimPower, "driver.rating")}
	}
	if s.SurgeControl != nil {
		m.SurgeControl = &service.SurgeControl{Margin: s.SurgeControl.Margin}
	}
	if len(s.LimitOverrides) > 0 {
		m.LimitOverrides = map[string]service.LevelOverride{}
		for k, o := range s.LimitOverrides {
			m.LimitOverrides[k] = service.LevelOverride{Warning: must(o.Warning), Limit: o.Limit}
		}
	}
	return m, err
}

// machineSpecOf renders a service machine in the request shape (numbers
// in SI). Interim, as machineOfSpec.
func machineSpecOf(m service.Machine) MachineSpec {
	num := func(v float64) *Quantity { return &Quantity{Value: v} }
	opt := func(v *float64) *Quantity {
		if v == nil {
			return nil
		}
		return num(*v)
	}
	s := MachineSpec{Name: m.Name, Arrangement: m.Arrangement, MechanicalEfficiency: m.MechanicalEfficiency}
	for _, st := range m.Stages {
		angle, eb, pif := st.BladeExitAngle, st.ExitBlockage, st.PowerInputFactor
		ms := MachineStageSpec{TipDiameter: num(st.TipDiameter), ExitWidth: num(st.ExitWidth), BladeExitAngle: &angle,
			SlipModel: st.SlipModel, SlipFactor: st.SlipFactor, ExitBlockage: &eb, PowerInputFactor: &pif, Construction: st.Construction,
			Inlet: MachineInletSpec{Type: st.Inlet.Type, EyeTipDiameter: opt(st.Inlet.EyeTipDiameter), EyeHubDiameter: opt(st.Inlet.EyeHubDiameter),
				Diameter: opt(st.Inlet.Diameter), Width: opt(st.Inlet.Width), PrewhirlAngle: st.Inlet.PrewhirlAngle},
			Diffuser: &MachineDiffuserSpec{Type: st.Diffuser.Type, ThroatArea: st.Diffuser.ThroatArea}}
		if st.BladeCount > 0 {
			n := st.BladeCount
			ms.BladeCount = &n
		}
		d := st.Design
		pos := func(v float64) *float64 {
			if v == 0 {
				return nil
			}
			return &v
		}
		eta := d.PolytropicEfficiency
		g := d.Gas
		ms.Design = DesignPointSpec{Speed: num(d.Speed), VolumeFlow: num(d.VolumeFlow), MassFlow: pos(d.MassFlow),
			FlowCoefficient: pos(d.FlowCoefficient), WorkCoefficient: pos(d.WorkCoefficient), PolytropicEfficiency: &eta,
			TipMach: pos(d.TipMach), PolytropicHead: pos(d.PolytropicHead),
			Suction: SuctionSpec{Pressure: num(d.SuctionPressure), Temperature: num(d.SuctionTemperature)},
			Gas:     GasSpec{Model: g.Model, Cp: g.Cp, Gamma: g.Gamma, Composition: g.Composition, CompositionBasis: g.CompositionBasis, RelativeHumidity: g.RelativeHumidity, Service: g.Service}}
		if d.DischargePressure > 0 {
			ms.Design.DischargePressure = num(d.DischargePressure)
		}
		s.Stages = append(s.Stages, ms)
	}
	for _, c := range m.Coolers {
		s.Coolers = append(s.Coolers, MachineCoolerSpec{AfterStage: c.AfterStage, OutletTemperature: opt(c.OutletTemperature),
			Approach: c.Approach, CoolantTemperature: opt(c.CoolantTemperature), PressureDrop: num(c.PressureDrop)})
	}
	if r := m.SpeedRange; r != nil {
		s.SpeedRange = &SpeedRangeSpec{Minimum: num(r.Minimum), MaximumContinuous: num(r.MaximumContinuous)}
	}
	if m.Driver != nil {
		s.Driver = &MachineDriverSpec{Rating: opt(m.Driver.Rating)}
	}
	return s
}
