package api

import (
	"strconv"

	"stagewright/physics"
	"stagewright/service"
)

// num is a Quantity holding a number in SI.
func num(v float64) *Quantity { return &Quantity{Value: v} }

func numOrNil(v *float64) *Quantity {
	if v == nil {
		return nil
	}
	return num(*v)
}

func pf(v float64) *float64 { return &v }

// machineSpecOf renders a service machine in the request shape (numbers in SI).
func machineSpecOf(m service.Machine) MachineSpec {
	out := MachineSpec{Name: m.Name, Arrangement: m.Arrangement, MechanicalEfficiency: m.MechanicalEfficiency, Stages: []MachineStageSpec{}}
	for _, s := range m.Stages {
		st := MachineStageSpec{TipDiameter: num(s.TipDiameter), ExitWidth: num(s.ExitWidth), BladeExitAngle: pf(s.BladeExitAngle),
			SlipModel: s.SlipModel, SlipFactor: s.SlipFactor, ExitBlockage: pf(s.ExitBlockage), PowerInputFactor: pf(s.PowerInputFactor),
			Construction: s.Construction, PolytropicMethod: s.PolytropicMethod, ImpellerLossShare: s.ImpellerLossShare,
			Inlet: MachineInletSpec{Type: s.Inlet.Type, EyeTipDiameter: numOrNil(s.Inlet.EyeTipDiameter), EyeHubDiameter: numOrNil(s.Inlet.EyeHubDiameter),
				Diameter: numOrNil(s.Inlet.Diameter), Width: numOrNil(s.Inlet.Width), PrewhirlAngle: s.Inlet.PrewhirlAngle},
			Diffuser: &MachineDiffuserSpec{Type: s.Diffuser.Type, ThroatArea: s.Diffuser.ThroatArea}}
		if s.BladeCount > 0 {
			n := s.BladeCount
			st.BladeCount = &n
		}
		d := s.Design
		opt := func(v float64) *float64 {
			if v == 0 {
				return nil
			}
			return pf(v)
		}
		st.Design = DesignPointSpec{Speed: num(d.Speed), VolumeFlow: num(d.VolumeFlow), MassFlow: opt(d.MassFlow), FlowCoefficient: opt(d.FlowCoefficient),
			WorkCoefficient: opt(d.WorkCoefficient), PolytropicEfficiency: pf(d.PolytropicEfficiency), TipMach: opt(d.TipMach),
			PolytropicHead: opt(d.PolytropicHead), Suction: SuctionSpec{Pressure: num(d.SuctionPressure), Temperature: num(d.SuctionTemperature)},
			Gas: gasSpecOf(d.Gas)}
		if d.DischargePressure > 0 {
			st.Design.DischargePressure = num(d.DischargePressure)
		}
		out.Stages = append(out.Stages, st)
	}
	for _, c := range m.Coolers {
		out.Coolers = append(out.Coolers, MachineCoolerSpec{AfterStage: c.AfterStage, OutletTemperature: numOrNil(c.OutletTemperature),
			Approach: c.Approach, CoolantTemperature: numOrNil(c.CoolantTemperature), PressureDrop: num(c.PressureDrop)})
	}
	if r := m.SpeedRange; r != nil {
		out.SpeedRange = &SpeedRangeSpec{Minimum: num(r.Minimum), MaximumContinuous: num(r.MaximumContinuous)}
	}
	if m.Driver != nil {
		out.Driver = &MachineDriverSpec{Rating: numOrNil(m.Driver.Rating)}
	}
	if m.SurgeControl != nil {
		out.SurgeControl = &SurgeControlSpec{Margin: m.SurgeControl.Margin}
	}
	if len(m.LimitOverrides) > 0 {
		out.LimitOverrides = map[string]LevelOverrideSpec{}
		for k, o := range m.LimitOverrides {
			out.LimitOverrides[k] = LevelOverrideSpec{Warning: pf(o.Warning), Limit: o.Limit}
		}
	}
	return out
}

// machineOfSpec converts a decoded machine into SI; field names the
// machine's place in the request ("machine").
func machineOfSpec(s MachineSpec, field string) (service.Machine, error) {
	m := service.Machine{Name: s.Name, Arrangement: s.Arrangement, MechanicalEfficiency: s.MechanicalEfficiency}
	var err error
	conv := func(q *Quantity, dim dimension, f string) *float64 {
		if err != nil {
			return nil
		}
		var v *float64
		v, err = si(q, dim, f, float64(physics.StandardAtmosphere))
		return v
	}
	for i, st := range s.Stages {
		f := field + ".stages." + strconv.Itoa(i)
		ms := service.MachineStage{SlipModel: st.SlipModel, SlipFactor: st.SlipFactor, Construction: st.Construction,
			PolytropicMethod: st.PolytropicMethod, ImpellerLossShare: st.ImpellerLossShare,
			ExitBlockage: service.DefaultExitBlockage, PowerInputFactor: service.DefaultPowerInputFactor}
		ms.TipDiameter = must(conv(st.TipDiameter, dimLength, f+".tip_diameter"))
		ms.ExitWidth = must(conv(st.ExitWidth, dimLength, f+".exit_width"))
		ms.BladeExitAngle = must(st.BladeExitAngle)
		ms.BladeCount = intOr0(st.BladeCount)
		if st.ExitBlockage != nil {
			ms.ExitBlockage = *st.ExitBlockage
		}
		if st.PowerInputFactor != nil {
			ms.PowerInputFactor = *st.PowerInputFactor
		}
		in := st.Inlet
		ms.Inlet = service.MachineInlet{Type: in.Type, PrewhirlAngle: in.PrewhirlAngle,
			EyeTipDiameter: conv(in.EyeTipDiameter, dimLength, f+".inlet.eye_tip_diameter"),
			EyeHubDiameter: conv(in.EyeHubDiameter, dimLength, f+".inlet.eye_hub_diameter"),
			Diameter:       conv(in.Diameter, dimLength, f+".inlet.diameter"),
			Width:          conv(in.Width, dimLength, f+".inlet.width")}
		if st.Diffuser != nil {
			ms.Diffuser = service.Diffuser{Type: st.Diffuser.Type, ThroatArea: st.Diffuser.ThroatArea}
		}
		d := st.Design
		ms.Design = service.DesignPoint{Speed: must(conv(d.Speed, dimSpeed, f+".design.speed")),
			VolumeFlow: must(conv(d.VolumeFlow, dimVolumeFlow, f+".design.volume_flow")),
			MassFlow:   must(d.MassFlow), FlowCoefficient: must(d.FlowCoefficient), WorkCoefficient: must(d.WorkCoefficient),
			PolytropicEfficiency: must(d.PolytropicEfficiency), TipMach: must(d.TipMach), PolytropicHead: must(d.PolytropicHead),
			SuctionPressure:    must(conv(d.Suction.Pressure, dimPressure, f+".design.suction.pressure")),
			SuctionTemperature: must(conv(d.Suction.Temperature, dimTemperature, f+".design.suction.temperature")),
			DischargePressure:  must(conv(d.DischargePressure, dimPressure, f+".design.discharge_pressure")),
			Gas:                gasInputOf(d.Gas)}
		m.Stages = append(m.Stages, ms)
	}
	for i, c := range s.Coolers {
		f := field + ".coolers." + strconv.Itoa(i)
		mc := service.MachineCooler{AfterStage: c.AfterStage, Approach: c.Approach,
			OutletTemperature:  conv(c.OutletTemperature, dimTemperature, f+".outlet_temperature"),
			CoolantTemperature: conv(c.CoolantTemperature, dimTemperature, f+".coolant_temperature")}
		if c.PressureDrop != nil {
			if err == nil {
				var v float64
				if v, err = c.PressureDrop.Pressure(0); err != nil {
					err = &service.InputError{Field: f + ".pressure_drop", Shape: true, Err: err}
				}
				mc.PressureDrop = v
			}
		}
		m.Coolers = append(m.Coolers, mc)
	}
	if r := s.SpeedRange; r != nil {
		m.SpeedRange = &service.SpeedRange{Minimum: must(conv(r.Minimum, dimSpeed, field+".speed_range.minimum")),
			MaximumContinuous: must(conv(r.MaximumContinuous, dimSpeed, field+".speed_range.maximum_continuous"))}
	}
	if s.Driver != nil {
		m.Driver = &service.MachineDriver{Rating: conv(s.Driver.Rating, dimPower, field+".driver.rating")}
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
	if err != nil {
		return service.Machine{}, err
	}
	return m, nil
}
