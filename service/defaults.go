package service

import (
	"math"
	"strconv"

	"stagewright/physics"
	"stagewright/physics/stage"
)

// Impeller defaults for a duty that names no impeller: a backswept process
// impeller with an axial eye, the usual choices of a first design.
const (
	// DefaultBladeExitAngle is 40 deg backsweep from radial, the middle of
	// the 30-50 deg of backswept process impellers (rules-of-thumb.md §6,
	// common practice, no source).
	DefaultBladeExitAngle = 40.0
	// DefaultBladeCount is 17 blades at exit with the Wiesner slip model
	// (process impellers carry some 13-21 full blades; common practice, no
	// source).
	DefaultBladeCount = 17
	// DefaultHubRatio is the eye hub over tip diameter of a shaft-mounted
	// axial eye, 0.35 (common practice, no source).
	DefaultHubRatio = 0.35
	// DefaultExitFlowCoefficient is φ2 = cr2/U2 = 0.25 at impeller exit,
	// within the 0.2-0.3 of backswept process stages (common practice, no
	// source).
	DefaultExitFlowCoefficient = 0.25
)

// withImpellerDefaults fills the impeller choices a duty leaves open and
// records each in the provenance.
func withImpellerDefaults(in ImpellerInput, prov *Provenance) ImpellerInput {
	fmtF := func(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }
	if in.BladeExitAngle == nil {
		v := DefaultBladeExitAngle
		in.BladeExitAngle = &v
		prov.Defaults = append(prov.Defaults, Default{Field: "impeller.blade_exit_angle", Value: fmtF(v),
			Note: "backsweep of a process impeller, middle of 30-50 deg (common practice, no source)"})
	}
	if in.SlipFactor == nil && in.SlipModel == "" {
		in.SlipModel = "wiesner"
		prov.Defaults = append(prov.Defaults, Default{Field: "impeller.slip_model", Value: "wiesner",
			Note: "slip factor from Wiesner (1967) with its limiting inlet radius-ratio correction"})
		if in.BladeCount == 0 {
			in.BladeCount = DefaultBladeCount
			prov.Defaults = append(prov.Defaults, Default{Field: "impeller.blade_count", Value: strconv.Itoa(DefaultBladeCount),
				Note: "full blades at the exit of a process impeller (common practice, no source)"})
		}
	}
	if in.Inlet.Type == "" {
		in.Inlet.Type = string(stage.InletAxialEye)
		prov.Defaults = append(prov.Defaults, Default{Field: "impeller.inlet.type", Value: "axial-eye",
			Note: "an axial eye, sized for the least shroud relative Mach number unless eye_tip_diameter or meridional_velocity is given"})
	}
	if in.Inlet.Type == string(stage.InletAxialEye) && in.Inlet.HubRatio == nil {
		v := DefaultHubRatio
		in.Inlet.HubRatio = &v
		prov.Defaults = append(prov.Defaults, Default{Field: "impeller.inlet.hub_ratio", Value: fmtF(v),
			Note: "eye hub over tip diameter of a shaft-mounted eye (common practice, no source)"})
	}
	if in.ExitMeridionalVelocity == nil {
		prov.Defaults = append(prov.Defaults, Default{Field: "impeller.exit_meridional_velocity", Value: "0.25 × tip speed",
			Note: "exit flow coefficient cr2/U2 = 0.25, within the 0.2-0.3 of backswept process stages (common practice, no source)"})
	}
	return in
}

// exitVelocityFor returns cr2 = φ2 U2 for the default exit flow
// coefficient, with U2 from the Euler work at that φ2:
//
//	w = ψ U2 (σ U2 − φ2 U2 tan β2')  ⇒  U2 = √(w / (ψ (σ − φ2 tan β2')))
//
// (no prewhirl; Dixon & Hall 2014, eq. 7.1 with slip). ok is false when
// σ − φ2 tan β2' is not positive (the blade is swept back too far for the
// default φ2).
func exitVelocityFor(w physics.JoulePerKg, imp stage.Impeller) (physics.MeterPerS, bool) {
	k := imp.SlipFactor - DefaultExitFlowCoefficient*math.Tan(imp.BladeExitAngle*math.Pi/180)
	if !(k > 0) || !(w > 0) || !(imp.PowerInputFactor > 0) {
		return 0, false
	}
	u2 := math.Sqrt(float64(w) / (imp.PowerInputFactor * k))
	return physics.MeterPerS(DefaultExitFlowCoefficient * u2), true
}
