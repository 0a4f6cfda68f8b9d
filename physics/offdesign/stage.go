package offdesign

import (
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/path"
	"stagewright/physics/stage"
)

// Inlet is the impeller inlet as built.
type Inlet struct {
	Kind stage.InletKind
	// EyeTipDiameter and EyeHubDiameter are the axial eye's diameters, m.
	EyeTipDiameter, EyeHubDiameter physics.Meter
	// Diameter and Width are a radial inlet's D1 and b1, m.
	Diameter, Width physics.Meter
	// PrewhirlAngle is a fixed guide-vane flow angle at an axial eye, deg
	// from axial, positive with rotation (constant across the span).
	PrewhirlAngle float64
	// BladeAngle is the inlet blade angle from the meridional direction at
	// the rms eye diameter (axial eye) or at D1 (radial), deg: it sets the
	// inducer throat area A1 cos β1 (see InletBladeAngle).
	BladeAngle float64
}

// Stage is one impeller with its diffuser as built, and the numbers of
// its design point that the map method scales from.
type Stage struct {
	TipDiameter, ExitWidth physics.Meter
	// BladeExitAngle is the backsweep from radial, deg.
	BladeExitAngle float64
	SlipFactor     float64
	// PowerInputFactor is actual over Euler work (≥ 1).
	PowerInputFactor float64
	// ExitBlockage is the blocked fraction of π D2 b2.
	ExitBlockage float64
	// ImpellerLossShare is the share of the stage loss arising in the
	// impeller (for the exit total pressure; stage.DefaultImpellerLossShare).
	ImpellerLossShare float64
	Inlet             Inlet
	// DiffuserThroatArea is the total throat area of a vaned diffuser, m²
	// (0: vaneless, no diffuser choke).
	DiffuserThroatArea float64
	// Method is the polytropic method of the compression path.
	Method path.Method
	Design Design
}

// Design holds the design-point numbers of the map method.
type Design struct {
	// FlowCoefficient φ = Q01/(U2 π D2²/4) at design: the peak of the
	// design speed line.
	FlowCoefficient float64
	// TipMach is U2/a01 at design.
	TipMach float64
	// PolytropicEfficiency at design: the peak of the design speed line.
	PolytropicEfficiency float64
	// ChokeFlowCoefficient is the choke flow coefficient at the design
	// speed and gas (0: not known, the peak flow does not move).
	ChokeFlowCoefficient float64
	// SurgeFlowAngle is the critical diffuser-inlet flow angle, deg from
	// radial (0: DefaultSurgeFlowAngle).
	SurgeFlowAngle float64
}

// Check returns a DomainError naming the first dimension of s outside
// what the model covers (names as the machine's fields: tip_diameter,
// exit_width, blade_exit_angle, slip_factor, power_input_factor,
// exit_blockage, inlet.eye_tip_diameter, inlet.eye_hub_diameter,
// inlet.diameter, inlet.width, inlet.prewhirl_angle, diffuser.throat_area,
// design.*).
func (s Stage) Check() error {
	d2 := float64(s.TipDiameter)
	bad := func(name string, v float64, reason string) error {
		return &physics.DomainError{Name: name, Value: v, Reason: reason}
	}
	switch {
	case !(d2 > 0 && d2 <= float64(stage.MaxTipDiameter)):
		return bad("tip_diameter", d2, fmt.Sprintf("the tip diameter must be a positive number of metres, at most %.0f m", float64(stage.MaxTipDiameter)))
	case !(s.ExitWidth > 0):
		return bad("exit_width", float64(s.ExitWidth), "the exit width must be a positive number of metres")
	case !(float64(s.ExitWidth) < 0.5*d2):
		return bad("exit_width", float64(s.ExitWidth), fmt.Sprintf("the exit width (%.4g m) must be well below the tip diameter (%.4g m): b2/D2 of centrifugal impellers lies below about 0.15", float64(s.ExitWidth), d2))
	case !(s.BladeExitAngle >= 0 && s.BladeExitAngle <= stage.MaxBladeExitAngle):
		return bad("blade_exit_angle", s.BladeExitAngle, "the blade exit angle is the backsweep from radial in degrees: 0 for radial blades, at most 75")
	case !(s.SlipFactor > 0 && s.SlipFactor <= 1):
		return bad("slip_factor", s.SlipFactor, "the slip factor must lie in (0, 1]")
	case !(s.PowerInputFactor >= 1 && s.PowerInputFactor <= 2):
		return bad("power_input_factor", s.PowerInputFactor, "the power input factor must lie between 1 and 2")
	case !(s.ExitBlockage >= 0 && s.ExitBlockage < 0.5):
		return bad("exit_blockage", s.ExitBlockage, "the exit blockage must lie in [0, 0.5)")
	case !(s.ImpellerLossShare >= 0 && s.ImpellerLossShare <= 1):
		return bad("impeller_loss_share", s.ImpellerLossShare, "the impeller loss share must lie in [0, 1]")
	case !(s.DiffuserThroatArea >= 0) || math.IsInf(s.DiffuserThroatArea, 0):
		return bad("diffuser.throat_area", s.DiffuserThroatArea, "the diffuser throat area must be a positive number of m2")
	case !(s.Design.FlowCoefficient > 0 && s.Design.FlowCoefficient < 1):
		return bad("design.flow_coefficient", s.Design.FlowCoefficient, "the design flow coefficient must lie in (0, 1)")
	case !(s.Design.TipMach > 0 && s.Design.TipMach < 5):
		return bad("design.tip_mach", s.Design.TipMach, "the design tip Mach number must lie in (0, 5)")
	case !(s.Design.PolytropicEfficiency > 0 && s.Design.PolytropicEfficiency <= 1):
		return bad("design.polytropic_efficiency", s.Design.PolytropicEfficiency, "the design polytropic efficiency must lie in (0, 1]")
	}
	in := s.Inlet
	switch in.Kind {
	case stage.InletAxialEye:
		switch {
		case !(in.EyeTipDiameter > 0 && float64(in.EyeTipDiameter) < d2):
			return bad("inlet.eye_tip_diameter", float64(in.EyeTipDiameter), fmt.Sprintf("the eye tip diameter must be positive and smaller than the tip diameter (%.4g m)", d2))
		case !(in.EyeHubDiameter >= 0 && in.EyeHubDiameter < in.EyeTipDiameter):
			return bad("inlet.eye_hub_diameter", float64(in.EyeHubDiameter), "the eye hub diameter must be at least 0 and smaller than the eye tip diameter")
		case !(in.PrewhirlAngle >= stage.MinPrewhirlAngle && in.PrewhirlAngle <= stage.MaxPrewhirlAngle):
			return bad("inlet.prewhirl_angle", in.PrewhirlAngle, "the prewhirl angle must lie between -30 and 60 deg")
		}
	case stage.InletRadial:
		switch {
		case !(in.Diameter > 0 && float64(in.Diameter) < d2):
			return bad("inlet.diameter", float64(in.Diameter), fmt.Sprintf("the inlet diameter must be positive and smaller than the tip diameter (%.4g m)", d2))
		case !(in.Width > 0 && float64(in.Width) < float64(in.Diameter)):
			return bad("inlet.width", float64(in.Width), "the inlet width must be positive and smaller than the inlet diameter")
		case in.PrewhirlAngle != 0:
			return bad("inlet.prewhirl_angle", in.PrewhirlAngle, "prewhirl is modelled for an axial eye only")
		}
	default:
		return bad("inlet.type", 0, fmt.Sprintf("unknown inlet type %q: use radial or axial-eye", in.Kind))
	}
	if !(in.BladeAngle >= 0 && in.BladeAngle < 89) {
		return bad("inlet.blade_angle", in.BladeAngle, "the inlet blade angle must lie in [0, 89) deg from the meridional direction")
	}
	return nil
}

// inletArea is the eye annulus π/4 (D1t² − Dh²) or π D1 b1.
func (s Stage) inletArea() float64 {
	in := s.Inlet
	if in.Kind == stage.InletRadial {
		return math.Pi * float64(in.Diameter) * float64(in.Width)
	}
	return math.Pi / 4 * (sq(float64(in.EyeTipDiameter)) - sq(float64(in.EyeHubDiameter)))
}

// inletRadius returns the radius of the blade angle: the rms eye radius
// √((D1t² + Dh²)/8) or D1/2.
func (s Stage) inletRadius() float64 {
	in := s.Inlet
	if in.Kind == stage.InletRadial {
		return float64(in.Diameter) / 2
	}
	return math.Sqrt((sq(float64(in.EyeTipDiameter)) + sq(float64(in.EyeHubDiameter))) / 8)
}

// shroudRadius is the eye tip radius or D1/2.
func (s Stage) shroudRadius() float64 {
	if s.Inlet.Kind == stage.InletRadial {
		return float64(s.Inlet.Diameter) / 2
	}
	return float64(s.Inlet.EyeTipDiameter) / 2
}

func sq(x float64) float64 { return x * x }

func rad(deg float64) float64 { return deg * math.Pi / 180 }
