package service

import (
	"stagewright/physics/stage"
)

// machineOf returns the stage sized by SizeStage as an installed machine
// (one stage): every geometric fact the off-design model needs, the
// design point, the speed range (DefaultMinimumSpeedFraction and
// DefaultMaximumSpeedFraction of the speed) and the driver rating of the
// sizing.
func machineOf(d StageDuty, res *StageResult) Machine {
	sz := res.Sizing
	g := sz.Geometry
	imp := res.Impeller
	st := MachineStage{
		TipDiameter:      float64(g.TipDiameter),
		ExitWidth:        float64(g.ExitWidth),
		BladeExitAngle:   imp.BladeExitAngle,
		ExitBlockage:     imp.ExitBlockage,
		PowerInputFactor: imp.PowerInputFactor,
		Construction:     d.Impeller.Construction,
		Diffuser:         Diffuser{Type: d.Diffuser},
	}
	if d.PolytropicMethod == "schultz" {
		st.PolytropicMethod = "schultz"
	}
	if d.ImpellerLossShare != nil {
		v := *d.ImpellerLossShare
		st.ImpellerLossShare = &v
	}
	if st.Construction == "" {
		st.Construction = "closed-steel"
	}
	if st.Diffuser.Type == "" {
		st.Diffuser.Type = "vaneless"
	}
	if d.Impeller.SlipFactor != nil {
		v := imp.SlipFactor
		st.SlipFactor = &v
	} else {
		st.SlipModel, st.BladeCount = d.Impeller.SlipModel, res.BladeCount
	}
	ptr := func(v float64) *float64 { return &v }
	switch g.Inlet {
	case stage.InletRadial:
		st.Inlet = MachineInlet{Type: string(stage.InletRadial), Diameter: ptr(float64(g.InletDiameter)), Width: ptr(float64(g.InletWidth))}
	default:
		st.Inlet = MachineInlet{Type: string(stage.InletAxialEye), EyeTipDiameter: ptr(float64(g.InletDiameter)), EyeHubDiameter: ptr(float64(g.EyeHubDiameter))}
		if res.PrewhirlAngle != 0 {
			st.Inlet.PrewhirlAngle = ptr(res.PrewhirlAngle)
		}
	}
	st.Design = DesignPoint{
		Speed:                res.Speed,
		VolumeFlow:           res.SuctionVolumeFlow,
		MassFlow:             res.MassFlow,
		FlowCoefficient:      sz.Coefficients.FlowCoefficient,
		WorkCoefficient:      sz.Coefficients.WorkCoefficient,
		PolytropicEfficiency: res.Path.PolytropicEfficiency,
		TipMach:              sz.Velocities.MachineMach,
		PolytropicHead:       float64(res.Path.PolytropicHead),
		SuctionPressure:      d.SuctionPressure,
		SuctionTemperature:   d.SuctionTemperature,
		DischargePressure:    float64(res.Path.Discharge.Pressure),
		Gas:                  d.Gas,
	}
	rating := res.Power.DriverRating
	mech := res.Power.MechanicalEfficiency
	return Machine{
		Arrangement:          "single",
		Stages:               []MachineStage{st},
		SpeedRange:           &SpeedRange{Minimum: DefaultMinimumSpeedFraction * res.Speed, MaximumContinuous: DefaultMaximumSpeedFraction * res.Speed},
		Driver:               &MachineDriver{Rating: &rating},
		MechanicalEfficiency: &mech,
	}
}
