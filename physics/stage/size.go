package stage

import (
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// InletKind says how the gas reaches the impeller blades.
type InletKind string

// Inlet kinds.
const (
	// InletRadial: the gas meets the blades at diameter D1 = ratio·D2 across
	// a blade width b1 found from continuity (radial-inflow blade row).
	InletRadial InletKind = "radial"
	// InletAxialEye: the gas enters axially through an annular eye of hub
	// ratio ν = Dh/D1t whose tip diameter D1t follows from continuity.
	InletAxialEye InletKind = "axial-eye"
)

// MaxTipDiameter bounds the impellers the sizing covers (m). The largest
// process impellers are about 2.5 m (common practice, no source); a duty
// that needs more at the given speed cannot be made by one stage at that
// speed.
const MaxTipDiameter physics.Meter = 4.0

// MinPassageWidth is the narrowest inlet or exit passage the sizing
// covers (m): below about 1 mm impellers cannot be made or lose most of
// their efficiency to friction and leakage (common practice, no source).
const MinPassageWidth physics.Meter = 0.5e-3

// DefaultImpellerLossShare is the fraction of the stage loss taken to arise
// in the impeller when the exit static state is found: half, following
// Saravanamuttoo et al., Gas Turbine Theory (2009), Example 4.1 (from
// memory), i.e. η_imp = 1 − 0.5 (1 − η_stage).
const DefaultImpellerLossShare = 0.5

// Inlet is the inlet configuration.
type Inlet struct {
	Kind InletKind
	// DiameterRatio is D1/D2 for a radial inlet, 0 < ratio < 1.
	DiameterRatio float64
	// HubRatio is Dh/D1t for an axial eye, 0 ≤ ν < 0.95.
	HubRatio float64
	// MeridionalVelocity is cm1 entering the blades, m/s. Radial inlet:
	// required, > 0. Axial eye: when > 0 and no EyeTipDiameter is given the
	// eye follows from continuity at this velocity; 0 leaves it to the eye
	// choice (see EyeTipDiameter).
	MeridionalVelocity physics.MeterPerS
	// EyeTipDiameter is a given eye tip diameter D1t of an axial eye, m
	// (0: not given). It takes precedence over MeridionalVelocity: cm1
	// then follows from continuity at the static inlet density (subsonic
	// root). When both are 0 the eye is chosen for the least shroud
	// relative Mach number (EyeMinShroudMach). Ignored for a radial inlet.
	EyeTipDiameter physics.Meter
	// PrewhirlAngle is the absolute flow angle α1 set by inlet guide vanes
	// at an axial eye, deg from the axial (meridional) direction, positive
	// in the direction of rotation, MinPrewhirlAngle ≤ α1 ≤
	// MaxPrewhirlAngle; 0 is no prewhirl. The angle is taken constant
	// across the span (not a free-vortex distribution): cθ1 = cm1 tan α1 at
	// hub, mean and shroud. A radial inlet takes no prewhirl.
	PrewhirlAngle float64
}

// Impeller is the blading of the impeller.
type Impeller struct {
	BladeExitAngle         float64 // β2', deg from radial, backsweep positive
	SlipFactor             float64 // σ = 1 − Δcθ/U2
	PowerInputFactor       float64 // ψ ≥ 1
	ExitMeridionalVelocity physics.MeterPerS
	// ExitBlockage is the fraction B of the geometric exit area π D2 b2
	// taken up by blade thickness and boundary layers, 0 ≤ B < 0.5; the
	// exit width is b2 = ṁ / (ρ2 cr2 π D2 (1 − B)). 0 means no blockage.
	ExitBlockage float64
}

// Duty is what the stage must do, with the compression path already solved.
type Duty struct {
	Model   gas.Model
	Suction gas.State // suction stagnation state
	// Work is the actual specific work h02 − h01, J/kg.
	Work physics.JoulePerKg
	// IsentropicHead and PolytropicHead, J/kg, for the head coefficients.
	IsentropicHead physics.JoulePerKg
	PolytropicHead physics.JoulePerKg
	// IsentropicEfficiency is the stage total-to-total efficiency.
	IsentropicEfficiency float64
	// ImpellerLossShare is the fraction of the stage loss in the impeller
	// (0 ≤ share ≤ 1; use DefaultImpellerLossShare).
	ImpellerLossShare float64
	MassFlow          physics.KgPerS
	Speed             physics.RevPerMin
}

// Station is a static state with its velocity.
type Station struct {
	Static gas.State
	// Velocity is the absolute velocity at the station, m/s.
	Velocity physics.MeterPerS
	// Mach is Velocity over the static speed of sound.
	Mach float64
}

// Geometry is the sized flow path. Lengths in m.
type Geometry struct {
	// Inlet is the inlet kind the geometry was sized for.
	Inlet       InletKind
	TipDiameter physics.Meter
	// InletDiameter is D1 (radial inlet) or the eye tip diameter D1t.
	InletDiameter physics.Meter
	// InletWidth is the radial-inlet blade width b1, or the blade height at
	// the eye (D1t − Dh)/2.
	InletWidth physics.Meter
	// EyeHubDiameter is Dh for an axial eye, 0 otherwise.
	EyeHubDiameter physics.Meter
	// EyeChoice says how the eye tip diameter was found: EyeGivenDiameter,
	// EyeMeridionalVelocity or EyeMinShroudMach; empty for a radial inlet.
	EyeChoice string
	ExitWidth physics.Meter
	InletArea float64 // m2, the eye annulus or π D1 b1
	// ExitArea is the geometric exit area π D2 b2, m2; the area open to
	// the flow is (1 − ExitBlockage) times it.
	ExitArea float64
}

// Velocities are the velocity triangles, m/s and deg.
type Velocities struct {
	TipSpeed physics.MeterPerS
	// InletBladeSpeed is U at D1 (radial inlet) or at the eye tip.
	InletBladeSpeed        physics.MeterPerS
	InletMeridional        physics.MeterPerS
	InletWhirl             physics.MeterPerS // cθ1 = cm1 tan α1 (prewhirl), 0 without
	InletAbsoluteMach      float64           // c1/a1, c1 = cm1/cos α1
	InletRelative          physics.MeterPerS // W1 at D1 or the eye tip (shroud)
	InletRelativeMach      float64           // W1/a1 at D1 or the eye tip (shroud)
	InletBladeAngleShroud  float64           // relative flow angle from meridional at D1 or eye tip, deg (atan((U − cθ1)/cm1))
	InletBladeAngleMean    float64           // at the rms eye diameter (axial eye), deg
	InletBladeAngleHub     float64           // at the eye hub (axial eye), deg
	ExitMeridional         physics.MeterPerS // cr2
	ExitWhirl              physics.MeterPerS // cθ2
	ExitAbsolute           physics.MeterPerS // c2
	ExitRelative           physics.MeterPerS // W2
	ExitAbsoluteMach       float64           // c2/a2 (diffuser inlet)
	ExitFlowAngle          float64           // α2 from radial, deg
	RelativeVelocityRatio  float64           // W2/W1 (shroud), de Haller-type ratio
	MachineMach            float64           // U2/a01
	FlowCoefficientExit    float64           // φ2 = cr2/U2
	ImpellerIsentropicEff  float64           // η of the impeller alone (loss share model)
	ExitStagnationPressure physics.Pascal
}

// Coefficients are the non-dimensional groups of the stage.
type Coefficients struct {
	// FlowCoefficient φ = Q01 / (U2 π D2²/4), Q01 the suction volume flow.
	FlowCoefficient float64
	// WorkCoefficient is w / U2².
	WorkCoefficient float64
	// PolytropicHeadCoefficient μp is Hp / U2².
	PolytropicHeadCoefficient float64
	// SpecificSpeed Ns = Ω √Q01 / Δh_s^0.75 (Ω in rad/s).
	SpecificSpeed float64
	// SpecificDiameter Ds = D2 Δh_s^0.25 / √Q01, dimensionless in SI units
	// (O. E. Balje, Turbomachines: A Guide to Design, Selection and Theory
	// (1981), the Ns-Ds diagram; from memory). 0 when no isentropic head
	// is given.
	SpecificDiameter float64
	// ExitWidthRatio is b2/D2.
	ExitWidthRatio float64
	// InletTipRatio is D1/D2 (or D1t/D2).
	InletTipRatio float64
}

// Sizing is the sized stage.
type Sizing struct {
	Geometry     Geometry
	Velocities   Velocities
	Coefficients Coefficients
	Inlet        Station   // static state entering the blades
	Exit         Station   // static state at impeller exit
	ExitTotal    gas.State // stagnation state at impeller exit
	SuctionFlow  float64   // m3/s at suction stagnation
}

// Size sizes the impeller for duty d with blading imp and inlet in:
//
//  1. Axial eye first (it depends only on the suction state, flow, speed,
//     hub ratio and prewhirl): the eye tip diameter is given (cm1 from
//     continuity, iterating the static density), follows from a given
//     cm1, or is chosen for the least shroud relative Mach number (see
//     sizeEye and the Inlet fields). Static state h1 = h01 − c1²/2 at s01,
//     c1 = cm1/cos α1; A1 = ṁ/(ρ1 cm1) = π/4 D1t² (1 − ν²).
//  2. U2 from the Euler equation with slip and power input factor and the
//     inlet whirl at the rms eye diameter, w = ψ (U2 cθ2 − U1 cθ1)
//     (TipSpeedWithPrewhirl; TipSpeed without prewhirl); D2 = 60 U2/(π N);
//     the eye must be smaller than D2.
//  3. Radial inlet (no prewhirl): D1 = ratio·D2, A1 = ṁ/(ρ1 cm1),
//     b1 = A1/(π D1).
//  4. Impeller exit: h02 = h01 + w; the impeller has isentropic efficiency
//     η_imp = 1 − share (1 − η_stage), so p02 is the pressure at
//     (h01 + η_imp w, s01); the static state is h2 = h02 − c2²/2 at s(p02,
//     h02), c2² = cr2² + cθ2²; b2 = ṁ/(ρ2 cr2 π D2 (1 − B)) with the exit
//     blockage B (continuity with a blockage factor: Aungier, Centrifugal
//     Compressors: A Strategy for Aerodynamic Design and Analysis (2000),
//     ch. 5, and Dixon & Hall (2014), §7.4; both from memory).
//
// Sources: continuity and velocity triangles, Saravanamuttoo et al., Gas
// Turbine Theory, 6th ed. (2009), §4.2-4.3 (the inlet static-density
// iteration and the impeller depth from the exit density); Dixon & Hall
// (2014), §7.4-7.9; the inducer optimisation as in Dixon & Hall (2014), §7
// "optimum design of a compressor inlet", after Rodgers (from memory).
// Valid within the checks below; geometry the service cannot size (eye
// larger than the impeller, impeller over 4 m, choked eye) is a DomainError
// whose Reason says what to change.
func Size(d Duty, imp Impeller, in Inlet) (Sizing, error) {
	if err := checkDuty(d); err != nil {
		return Sizing{}, err
	}
	if err := checkImpeller(imp.SlipFactor, imp.PowerInputFactor, imp.BladeExitAngle); err != nil {
		return Sizing{}, err
	}
	var out Sizing
	var u1, ct1 physics.MeterPerS
	switch in.Kind {
	case InletAxialEye:
		var err error
		if u1, ct1, err = sizeEye(d, in, &out); err != nil {
			return Sizing{}, err
		}
	case InletRadial:
		if in.PrewhirlAngle != 0 {
			return Sizing{}, &physics.DomainError{Name: "inlet.prewhirl_angle", Value: in.PrewhirlAngle, Want: "0 for a radial inlet",
				Reason: "inlet prewhirl is supported only for an axial eye: leave the prewhirl angle out (0) for a radial inlet"}
		}
	default:
		return Sizing{}, &physics.DomainError{Name: "inlet.type", Want: `"radial" or "axial-eye"`,
			Reason: fmt.Sprintf("unknown inlet type %q: use \"radial\" or \"axial-eye\"", in.Kind)}
	}
	if ct1 != 0 && d.Work > 0 && !(float64(d.Work)+imp.PowerInputFactor*float64(u1)*float64(ct1) > 0) {
		return Sizing{}, &physics.DomainError{Name: "inlet.prewhirl_angle", Value: in.PrewhirlAngle, Want: "a counter-swirl doing less than the stage work",
			Reason: fmt.Sprintf("the counter-rotating prewhirl of %.3g deg alone makes the impeller do %.4g J/kg of Euler work (ψ U1 |cθ1|), more than the %.4g J/kg the stage is to do: use less counter-swirl",
				in.PrewhirlAngle, -imp.PowerInputFactor*float64(u1)*float64(ct1), float64(d.Work))}
	}
	u2, err := TipSpeedWithPrewhirl(d.Work, imp.SlipFactor, imp.PowerInputFactor, imp.BladeExitAngle, imp.ExitMeridionalVelocity, u1, ct1)
	if err != nil {
		return Sizing{}, err
	}
	if !(imp.ExitMeridionalVelocity > 0) {
		return Sizing{}, &physics.DomainError{Name: "exit_meridional_velocity", Value: float64(imp.ExitMeridionalVelocity),
			Want: "> 0 m/s", Reason: "the exit meridional velocity must be positive: it carries the flow out of the impeller"}
	}
	if !(imp.ExitBlockage >= 0 && imp.ExitBlockage < 0.5) {
		return Sizing{}, &physics.DomainError{Name: "exit_blockage", Value: imp.ExitBlockage, Want: "0 <= exit_blockage < 0.5",
			Reason: "the exit blockage is the blocked fraction of the impeller exit area: it must lie in [0, 0.5)"}
	}
	d2, err := TipDiameter(u2, d.Speed)
	if err != nil {
		return Sizing{}, err
	}
	if d2 > MaxTipDiameter {
		return Sizing{}, &physics.DomainError{Name: "speed", Value: float64(d.Speed), Want: "a speed giving D2 <= 4 m",
			Reason: fmt.Sprintf("the speed is too low for this head: at %.4g rev/min the impeller would need a tip diameter of %.4g m to reach the tip speed of %.0f m/s that the work requires; no single stage of at most %.0f m makes this head at this speed: raise the speed or split the head over more stages",
				float64(d.Speed), float64(d2), float64(u2), float64(MaxTipDiameter))}
	}
	out.SuctionFlow = float64(d.MassFlow) / float64(d.Suction.Density)
	out.Geometry.TipDiameter = d2
	v := &out.Velocities
	v.TipSpeed = u2
	v.MachineMach = float64(u2) / float64(d.Suction.SoundSpeed)

	if in.Kind == InletAxialEye {
		if err := checkEyeFits(d, in, out.Geometry); err != nil {
			return Sizing{}, err
		}
	} else if err := sizeRadialInlet(d, in, &out); err != nil {
		return Sizing{}, err
	}
	if err := sizeExit(d, imp, &out); err != nil {
		return Sizing{}, err
	}

	if b := math.Min(float64(out.Geometry.ExitWidth), float64(out.Geometry.InletWidth)); b < float64(MinPassageWidth) {
		return Sizing{}, &physics.DomainError{Name: "flow", Value: b, Want: "passage widths of at least 0.5 mm",
			Reason: fmt.Sprintf("the flow is too small for a centrifugal impeller at this speed: the narrowest passage would be %.3g mm wide, under the %.1f mm the sizing covers; lower the speed, raise the flow or choose another machine type",
				b*1e3, float64(MinPassageWidth)*1e3)}
	}
	c := &out.Coefficients
	area2 := math.Pi * float64(d2) * float64(d2) / 4
	c.FlowCoefficient = out.SuctionFlow / (float64(u2) * area2)
	c.WorkCoefficient = float64(d.Work) / (float64(u2) * float64(u2))
	c.PolytropicHeadCoefficient = float64(d.PolytropicHead) / (float64(u2) * float64(u2))
	if d.IsentropicHead > 0 {
		omega := float64(d.Speed) * 2 * math.Pi / 60
		c.SpecificSpeed = omega * math.Sqrt(out.SuctionFlow) / math.Pow(float64(d.IsentropicHead), 0.75)
		c.SpecificDiameter = float64(d2) * math.Pow(float64(d.IsentropicHead), 0.25) / math.Sqrt(out.SuctionFlow)
	}
	c.ExitWidthRatio = float64(out.Geometry.ExitWidth) / float64(d2)
	c.InletTipRatio = float64(out.Geometry.InletDiameter) / float64(d2)
	if !sizingFinite(out) {
		return Sizing{}, &physics.DomainError{Name: "duty", Value: float64(d.Work), Want: "a finite sized stage",
			Reason: "the stage sizing did not give finite numbers for this duty"}
	}
	return out, nil
}

// checkEyeFits checks that the eye sized first is smaller than the
// impeller tip found afterwards, with advice that fits the eye choice.
func checkEyeFits(d Duty, in Inlet, g Geometry) error {
	if g.InletDiameter < g.TipDiameter {
		return nil
	}
	switch g.EyeChoice {
	case EyeGivenDiameter:
		return &physics.DomainError{Name: "inlet.eye_tip_diameter", Value: float64(g.InletDiameter), Want: "an eye smaller than the impeller",
			Reason: fmt.Sprintf("the given eye tip diameter of %.4g m is not smaller than the impeller tip diameter of %.4g m at %.4g rev/min: give a smaller eye or lower the speed",
				float64(g.InletDiameter), float64(g.TipDiameter), float64(d.Speed))}
	case EyeMinShroudMach:
		return &physics.DomainError{Name: "speed", Value: float64(d.Speed), Want: "an eye smaller than the impeller",
			Reason: fmt.Sprintf("the speed is too high for this flow: the eye of least shroud Mach number needs a tip diameter of %.4g m, but at %.4g rev/min the impeller tip diameter is only %.4g m; lower the speed or give a smaller eye",
				float64(g.InletDiameter), float64(d.Speed), float64(g.TipDiameter))}
	}
	return &physics.DomainError{Name: "speed", Value: float64(d.Speed), Want: "an eye smaller than the impeller",
		Reason: fmt.Sprintf("the speed is too high for this flow: the eye needs a tip diameter of %.4g m, but at %.4g rev/min the impeller tip diameter is only %.4g m; lower the speed or raise the inlet meridional velocity",
			float64(g.InletDiameter), float64(d.Speed), float64(g.TipDiameter))}
}

func checkDuty(d Duty) error {
	switch {
	case d.Model == nil:
		return &physics.DomainError{Name: "gas", Want: "a gas model", Reason: "no gas model was given"}
	case !(d.Suction.Density > 0) || !(d.Suction.SoundSpeed > 0):
		return &physics.DomainError{Name: "suction", Value: float64(d.Suction.Density), Want: "a suction state with density and sound speed"}
	case !(d.MassFlow > 0) || math.IsInf(float64(d.MassFlow), 0):
		return &physics.DomainError{Name: "flow", Value: float64(d.MassFlow), Want: "finite, > 0 kg/s",
			Reason: "the flow must be positive"}
	case !(d.Speed > 0) || math.IsInf(float64(d.Speed), 0):
		return &physics.DomainError{Name: "speed", Value: float64(d.Speed), Want: "finite, > 0 rev/min",
			Reason: "the rotational speed must be a positive number of rev/min"}
	case !(d.IsentropicEfficiency > 0 && d.IsentropicEfficiency <= 1):
		return &physics.DomainError{Name: "efficiency", Value: d.IsentropicEfficiency, Want: "0 < efficiency <= 1"}
	case !(d.ImpellerLossShare >= 0 && d.ImpellerLossShare <= 1):
		return &physics.DomainError{Name: "impeller_loss_share", Value: d.ImpellerLossShare, Want: "0 <= share <= 1"}
	}
	return nil
}

// sizeRadialInlet sizes a radial inlet at D1 = ratio·D2 (no prewhirl).
func sizeRadialInlet(d Duty, in Inlet, out *Sizing) error {
	cm := in.MeridionalVelocity
	if !(cm > 0) || math.IsInf(float64(cm), 0) {
		return &physics.DomainError{Name: "inlet.meridional_velocity", Value: float64(cm), Want: "finite, > 0 m/s",
			Reason: "the inlet meridional velocity must be positive"}
	}
	if !(in.DiameterRatio > 0 && in.DiameterRatio < 1) {
		return &physics.DomainError{Name: "inlet.diameter_ratio", Value: in.DiameterRatio, Want: "0 < D1/D2 < 1",
			Reason: "the inlet diameter ratio D1/D2 must lie between 0 and 1"}
	}
	st, err := gas.StaticState(d.Model, d.Suction, cm)
	if err != nil {
		return fmt.Errorf("inlet static state: %w", err)
	}
	a1 := float64(d.MassFlow) / (float64(st.Density) * float64(cm))
	g := &out.Geometry
	v := &out.Velocities
	g.InletArea = a1
	g.Inlet = InletRadial
	g.InletDiameter = physics.Meter(in.DiameterRatio) * g.TipDiameter
	g.InletWidth = physics.Meter(a1 / (math.Pi * float64(g.InletDiameter)))
	u1 := PeripheralSpeed(g.InletDiameter, d.Speed)
	w1 := math.Hypot(float64(cm), float64(u1))
	v.InletBladeSpeed = u1
	v.InletMeridional = cm
	v.InletRelative = physics.MeterPerS(w1)
	v.InletRelativeMach = w1 / float64(st.SoundSpeed)
	v.InletAbsoluteMach = float64(cm) / float64(st.SoundSpeed)
	v.InletBladeAngleShroud = math.Atan2(float64(u1), float64(cm)) * 180 / math.Pi
	v.InletBladeAngleMean = v.InletBladeAngleShroud
	v.InletBladeAngleHub = v.InletBladeAngleShroud
	out.Inlet = Station{Static: st, Velocity: cm, Mach: v.InletAbsoluteMach}
	return nil
}

func sizeExit(d Duty, imp Impeller, out *Sizing) error {
	v := &out.Velocities
	u2 := v.TipSpeed
	cr2 := imp.ExitMeridionalVelocity
	ct2 := Whirl(u2, imp.SlipFactor, imp.BladeExitAngle, cr2)
	c2 := math.Hypot(float64(cr2), float64(ct2))
	etaImp := 1 - d.ImpellerLossShare*(1-d.IsentropicEfficiency)
	h01 := d.Suction.Enthalpy
	ideal, err := gas.StateFromHS(d.Model, h01+physics.JoulePerKg(etaImp)*d.Work, d.Suction.Entropy, d.Suction.Pressure)
	if err != nil {
		return fmt.Errorf("impeller exit total pressure: %w", err)
	}
	p02 := ideal.Pressure
	total, err := d.Model.StateFromPH(p02, h01+d.Work)
	if err != nil {
		return fmt.Errorf("impeller exit total state: %w", err)
	}
	st, err := gas.StaticState(d.Model, total, physics.MeterPerS(c2))
	if err != nil {
		return &physics.DomainError{Name: "exit_meridional_velocity", Value: c2, Want: "a static exit temperature above 0 K",
			Reason: fmt.Sprintf("the impeller exit velocity of %.0f m/s is so high that the static temperature at the impeller exit falls outside the gas model: lower the exit meridional velocity or the work per stage", c2)}
	}
	d2 := out.Geometry.TipDiameter
	a2 := float64(d.MassFlow) / (float64(st.Density) * float64(cr2)) / (1 - imp.ExitBlockage)
	out.Geometry.ExitArea = a2
	out.Geometry.ExitWidth = physics.Meter(a2 / (math.Pi * float64(d2)))
	w2 := math.Hypot(float64(cr2), float64(u2)-float64(ct2))
	v.ExitMeridional = cr2
	v.ExitWhirl = ct2
	v.ExitAbsolute = physics.MeterPerS(c2)
	v.ExitRelative = physics.MeterPerS(w2)
	v.ExitAbsoluteMach = c2 / float64(st.SoundSpeed)
	v.ExitFlowAngle = math.Atan2(float64(ct2), float64(cr2)) * 180 / math.Pi
	v.RelativeVelocityRatio = w2 / float64(v.InletRelative)
	v.FlowCoefficientExit = float64(cr2) / float64(u2)
	v.ImpellerIsentropicEff = etaImp
	v.ExitStagnationPressure = p02
	out.Exit = Station{Static: st, Velocity: physics.MeterPerS(c2), Mach: v.ExitAbsoluteMach}
	out.ExitTotal = total
	return nil
}

func sizingFinite(s Sizing) bool {
	g, v, c := s.Geometry, s.Velocities, s.Coefficients
	return physics.Finite(float64(g.TipDiameter), float64(g.InletDiameter), float64(g.InletWidth), float64(g.EyeHubDiameter),
		float64(g.ExitWidth), g.InletArea, g.ExitArea,
		float64(v.TipSpeed), float64(v.InletBladeSpeed), float64(v.InletRelative), v.InletRelativeMach,
		float64(v.InletWhirl), v.InletAbsoluteMach, float64(v.InletMeridional),
		v.InletBladeAngleShroud, v.InletBladeAngleMean, v.InletBladeAngleHub, float64(v.ExitWhirl), float64(v.ExitAbsolute),
		float64(v.ExitRelative), v.ExitAbsoluteMach, v.ExitFlowAngle, v.RelativeVelocityRatio, v.MachineMach,
		float64(v.ExitStagnationPressure), c.FlowCoefficient, c.WorkCoefficient, c.PolytropicHeadCoefficient,
		c.SpecificSpeed, c.SpecificDiameter, c.ExitWidthRatio, c.InletTipRatio, s.SuctionFlow,
		float64(s.Inlet.Static.Temperature), float64(s.Inlet.Static.Pressure), float64(s.Inlet.Static.Density),
		float64(s.Exit.Static.Temperature), float64(s.Exit.Static.Pressure), float64(s.Exit.Static.Density))
}
