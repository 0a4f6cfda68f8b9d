package offdesign

import (
	"errors"
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/path"
	"stagewright/physics/stage"
)

// DefaultSurgeFlowAngle is the critical absolute flow angle at the
// diffuser inlet, deg from radial, beyond which the stage is taken to
// surge: the middle of the 70-80 deg band of Senoo & Kinoshita (1977) for
// vaneless diffusers (from memory). The same criterion is applied to vaned
// diffusers (a simplification: their surge is set by the vane incidence).
const DefaultSurgeFlowAngle = 75.0

// Line is one speed line of a stage for a gas and suction state: the
// speed, the inducer choke and the efficiency characteristic. Build it
// with NewLine; it is read-only afterwards and safe for concurrent use.
type Line struct {
	model   gas.Model
	suction gas.State
	stage   Stage
	speed   physics.RevPerMin
	u2      float64
	area2   float64 // π D2²/4
	a1      float64 // inlet area
	aExit   float64 // open exit area π D2 b2 (1 − B)
	mu      float64 // U2/a01
	etaPeak float64
	phiPeak float64
	// inducerFlow is the inducer's choke mass flow, kg/s, and
	// inducerPassage the passage that chokes ("inducer-throat" or "eye").
	inducerFlow    float64
	inducerPassage string
	// chokeFlow is the line's greatest flow, kg/s: the inducer choke or,
	// when it comes first, the flow at which the impeller's work falls to
	// zero (ChokeZeroWork); chokePassage names which.
	chokeFlow    float64
	chokePassage string
	// sonicFlux and sonicSpeed are the suction state's sonic flux and
	// velocity (for the eye continuity at every point).
	sonicFlux, sonicSpeed float64
}

// Passages that choke.
const (
	ChokeInducerThroat  = "inducer-throat"
	ChokeEye            = "eye"
	ChokeDiffuserThroat = "diffuser-throat"
	// ChokeZeroWork is the end of a backswept impeller's characteristic
	// before any passage is sonic: the exit meridional velocity carries off
	// all the blade's whirl, cr2 = σ U2 / tan β2', and the work (and head)
	// falls to zero.
	ChokeZeroWork = "zero-work"
)

// NewLine returns the speed line of stage s at speed n for gas m at
// suction stagnation state suction. It finds the inducer choke flow: the
// relative flow at the rms inlet radius reaches sonic speed in the throat
// A1 cos β1 (β1 the inlet blade angle), from the relative stagnation
// state h0,rel = h01 − U1 cθ1 + U1²/2 at the suction entropy (rothalpy
// conserved from the eye; Dixon & Hall 2014, §7.5 inducer choking), or the
// eye annulus itself in the absolute frame, whichever passes less.
func NewLine(m gas.Model, suction gas.State, n physics.RevPerMin, s Stage) (*Line, error) {
	if err := s.Check(); err != nil {
		return nil, err
	}
	switch {
	case m == nil:
		return nil, &physics.DomainError{Name: "gas", Reason: "no gas model"}
	case !(suction.Density > 0) || !(suction.SoundSpeed > 0) || !physics.Finite(float64(suction.Enthalpy), float64(suction.Entropy)):
		return nil, &physics.DomainError{Name: "suction", Value: float64(suction.Density), Want: "a suction state with density and sound speed"}
	case !(n > 0) || math.IsInf(float64(n), 0):
		return nil, &physics.DomainError{Name: "speed", Value: float64(n), Want: "finite, > 0 rev/min",
			Reason: "the rotational speed must be a positive number of rev/min"}
	}
	l := &Line{model: m, suction: suction, stage: s, speed: n}
	l.u2 = float64(stage.PeripheralSpeed(s.TipDiameter, n))
	l.area2 = math.Pi / 4 * sq(float64(s.TipDiameter))
	l.a1 = s.inletArea()
	l.aExit = math.Pi * float64(s.TipDiameter) * float64(s.ExitWidth) * (1 - s.ExitBlockage)
	l.mu = l.u2 / float64(suction.SoundSpeed)
	if err := l.inducerChoke(); err != nil {
		return nil, err
	}
	l.chokeFlow, l.chokePassage = l.inducerFlow, l.inducerPassage
	if z, ok := l.zeroWorkFlow(); ok && z < l.chokeFlow {
		l.chokeFlow, l.chokePassage = z, ChokeZeroWork
	}
	phiChoke := l.chokeFlow / float64(suction.Density) / (l.u2 * l.area2)
	l.phiPeak = s.Design.FlowCoefficient
	if c := s.Design.ChokeFlowCoefficient; c > 0 && phiChoke < c {
		// The peak follows the choke flow to lower flows as the inducer
		// nears choke (Casey & Robinson 2013: the peak moves with the choke
		// flow at high tip Mach number; the proportional shift is ours).
		l.phiPeak *= phiChoke / c
	}
	if !(l.phiPeak < phiChoke) {
		l.phiPeak = 0.9 * phiChoke
	}
	l.etaPeak = PeakEfficiency(s.Design.PolytropicEfficiency, s.Design.FlowCoefficient, s.Design.TipMach, l.mu)
	return l, nil
}

// Speed is the line's speed, rev/min.
func (l *Line) Speed() physics.RevPerMin { return l.speed }

// TipSpeed is U2, m/s.
func (l *Line) TipSpeed() float64 { return l.u2 }

// TipMach is U2/a01.
func (l *Line) TipMach() float64 { return l.mu }

// PeakEfficiency is the polytropic efficiency at the line's peak.
func (l *Line) PeakEfficiency() float64 { return l.etaPeak }

// PeakFlowCoefficient is the flow coefficient of the line's peak.
func (l *Line) PeakFlowCoefficient() float64 { return l.phiPeak }

// FlowCoefficient returns φ = Q01/(U2 π D2²/4) of mass flow mdot.
func (l *Line) FlowCoefficient(mdot float64) float64 {
	return mdot / float64(l.suction.Density) / (l.u2 * l.area2)
}

// MassFlow returns the mass flow of flow coefficient phi.
func (l *Line) MassFlow(phi float64) float64 {
	return phi * l.u2 * l.area2 * float64(l.suction.Density)
}

// InducerChoke returns the inducer's choke mass flow, kg/s, and the
// passage that chokes (sonic flow only).
func (l *Line) InducerChoke() (float64, string) { return l.inducerFlow, l.inducerPassage }

// MaxFlow returns the line's greatest mass flow, kg/s, before any vaned
// diffuser: the inducer choke, or the zero-work flow when it comes first,
// and which of them.
func (l *Line) MaxFlow() (float64, string) { return l.chokeFlow, l.chokePassage }

// zeroWorkFlow estimates the mass flow at which a backswept impeller's
// Euler work falls to zero (no prewhirl): cr2 = σ U2 / tan β2', the exit
// static state at that velocity from the suction stagnation state (no
// work, no loss), ṁ = ρ2 cr2 π D2 b2 (1 − B); the exit's sonic flux when
// that velocity is supersonic. ok is false for radial blades (no such
// flow).
func (l *Line) zeroWorkFlow() (float64, bool) {
	s := l.stage
	tanB := math.Tan(rad(s.BladeExitAngle))
	if !(tanB > 1e-9) {
		return 0, false
	}
	cr := s.SlipFactor * l.u2 / tanB
	fs, cs, err := SonicFlux(l.model, l.suction)
	if err != nil {
		return 0, false
	}
	if cr >= float64(cs) {
		return fs * l.aExit, true
	}
	st, err := gas.StaticState(l.model, l.suction, physics.MeterPerS(cr))
	if err != nil {
		return fs * l.aExit, true
	}
	return float64(st.Density) * cr * l.aExit, true
}

func (l *Line) inducerChoke() error {
	s, m, st := l.stage, l.model, l.suction
	in := s.Inlet
	u1 := 2 * math.Pi * l.stage.inletRadius() * float64(l.speed) / 60
	tanA := math.Tan(rad(in.PrewhirlAngle))
	cosA := math.Cos(rad(in.PrewhirlAngle))
	// The eye annulus in the absolute frame: c1 = cm1/cos α1.
	fs, cs, err := SonicFlux(m, st)
	if err != nil {
		return fmt.Errorf("eye choke: %w", err)
	}
	l.sonicFlux, l.sonicSpeed = fs, float64(cs)
	eyeFlow := fs * cosA * l.a1
	throat := l.a1 * math.Cos(rad(in.BladeAngle))
	// Relative frame: h0,rel depends on cθ1 = cm1 tan α1, itself on the
	// flow with prewhirl; iterate (no iteration without prewhirl).
	ct1 := 0.0
	var relFlow float64
	for range 30 {
		h0r := st.Enthalpy + physics.JoulePerKg(0.5*u1*u1-u1*ct1)
		rel, err := gas.StateFromHS(m, h0r, st.Entropy, st.Pressure)
		if err != nil {
			return fmt.Errorf("inducer relative stagnation state: %w", err)
		}
		f, _, err := SonicFlux(m, rel)
		if err != nil {
			return fmt.Errorf("inducer choke: %w", err)
		}
		next := f * throat
		done := math.Abs(next-relFlow) <= 1e-12*next
		relFlow = next
		if tanA == 0 || done {
			break
		}
		mdot := math.Min(relFlow, 0.999999*eyeFlow)
		sst, c, err := flowAt(m, st, mdot/(l.a1*cosA), float64(cs), fs)
		if err != nil {
			break
		}
		_ = sst
		ct1 = c * cosA * tanA
	}
	l.inducerFlow, l.inducerPassage = relFlow, ChokeInducerThroat
	if eyeFlow < relFlow {
		l.inducerFlow, l.inducerPassage = eyeFlow, ChokeEye
	}
	if !(l.inducerFlow > 0) || math.IsInf(l.inducerFlow, 0) {
		return &physics.DomainError{Name: "inlet", Value: l.inducerFlow, Want: "a finite choke flow"}
	}
	return nil
}

// Point is the stage at one mass flow on a speed line.
type Point struct {
	MassFlow float64 // kg/s
	// VolumeFlow is the actual volume flow at suction, m³/s.
	VolumeFlow      float64
	FlowCoefficient float64
	// WorkCoefficient is w/U2², HeadCoefficient Hp/U2².
	WorkCoefficient, HeadCoefficient float64
	TipSpeed                         float64 // m/s
	TipMach                          float64 // U2/a01
	// Compression is the total-to-total compression at the work and
	// efficiency of the point.
	Compression path.Result
	// PolytropicEfficiency is the map's efficiency at the point.
	PolytropicEfficiency float64
	// Inlet velocities, m/s, at the rms radius unless named.
	InletMeridional, InletWhirl, InletBladeSpeedShroud float64
	InletAbsoluteMach, InletRelativeMachShroud         float64
	// InletIncidence is the relative flow angle at the rms radius less the
	// blade angle, deg (positive towards surge).
	InletIncidence float64
	InletStatic    gas.State
	// Exit velocities, m/s, and the absolute flow angle from radial, deg.
	ExitMeridional, ExitWhirl, ExitAbsolute, ExitRelative float64
	ExitFlowAngle, ExitAbsoluteMach                       float64
	ExitFlowCoefficient                                   float64 // cr2/U2
	ExitStatic, ExitTotal                                 gas.State
}

// ErrPastChoke is wrapped by the error of a flow at or past choke.
var ErrPastChoke = errors.New("physics: flow at or past choke")

// chokeError is a DomainError that also unwraps to ErrPastChoke.
type chokeError struct{ *physics.DomainError }

func (e chokeError) Unwrap() []error { return []error{e.DomainError, ErrPastChoke} }

func pastChoke(mdot, choke float64, passage string) error {
	return chokeError{&physics.DomainError{Name: "flow", Value: mdot, Want: fmt.Sprintf("a mass flow below the choke flow %.6g kg/s", choke),
		Reason: fmt.Sprintf("the flow of %.6g kg/s is at or past the estimated choke flow of %.6g kg/s (sonic flow in the %s) at this speed", mdot, choke, passage)}}
}

// At returns the stage at mass flow mdot on the line: the work from the
// Euler equation with slip, backsweep and inlet whirl,
//
//	w = ψ (U2 cθ2 − U1 cθ1),  cθ2 = σ U2 − cr2 tan β2',  cr2 = ṁ/(ρ2 π D2 b2 (1 − B))
//
// with the exit static density ρ2 from the compression at that work and
// the map efficiency (the impeller exit total pressure at the impeller's
// isentropic efficiency 1 − share (1 − ηs), the static state at
// c2 = √(cr2² + cθ2²)), iterated to a fixed point in cr2 by the secant
// method; the discharge by path.CompressionForWork. The same relations size
// the stage (package stage), so at the design flow and speed it gives the
// design back. Sources: Dixon & Hall (2014) eq. 7.1 and §7.9; continuity
// with blockage as stage.Size.
func (l *Line) At(mdot float64) (Point, error) { return l.AtFrom(mdot, nil) }

// AtFrom is At with a neighbouring point as the first guess of the
// iteration (nil: none).
func (l *Line) AtFrom(mdot float64, near *Point) (Point, error) {
	if !(mdot > 0) || math.IsInf(mdot, 0) {
		return Point{}, &physics.DomainError{Name: "flow", Value: mdot, Want: "finite, > 0 kg/s", Reason: "the flow must be a positive number"}
	}
	if mdot >= l.chokeFlow {
		return Point{}, pastChoke(mdot, l.chokeFlow, l.passageName(l.chokePassage))
	}
	s, m, st := l.stage, l.model, l.suction
	var p Point
	p.MassFlow, p.VolumeFlow = mdot, mdot/float64(st.Density)
	p.FlowCoefficient = l.FlowCoefficient(mdot)
	p.TipSpeed, p.TipMach = l.u2, l.mu
	eta, err := Efficiency(p.FlowCoefficient, l.phiPeak, l.FlowCoefficient(l.chokeFlow), l.etaPeak, ChokeSideExponent(l.mu))
	if err != nil {
		return Point{}, pastChoke(mdot, l.chokeFlow, l.passageName(l.chokePassage))
	}
	p.PolytropicEfficiency = eta

	// Inlet: continuity at the static density in the eye (subsonic branch).
	in := s.Inlet
	cosA, tanA := math.Cos(rad(in.PrewhirlAngle)), math.Tan(rad(in.PrewhirlAngle))
	ist, c1, err := flowAt(m, st, mdot/(l.a1*cosA), l.sonicSpeed, l.sonicFlux)
	if err != nil {
		return Point{}, pastChoke(mdot, l.chokeFlow, l.passageName(ChokeEye))
	}
	cm1 := c1 * cosA
	ct1 := cm1 * tanA
	r1 := s.inletRadius()
	n := float64(l.speed)
	u1 := 2 * math.Pi * r1 * n / 60
	u1s := 2 * math.Pi * s.shroudRadius() * n / 60
	p.InletStatic = ist
	p.InletMeridional, p.InletWhirl, p.InletBladeSpeedShroud = cm1, ct1, u1s
	p.InletAbsoluteMach = c1 / float64(ist.SoundSpeed)
	p.InletRelativeMachShroud = math.Hypot(cm1, u1s-ct1) / float64(ist.SoundSpeed)
	p.InletIncidence = math.Atan2(u1-ct1, cm1)*180/math.Pi - in.BladeAngle

	// Exit: fixed point in cr2.
	tanB := math.Tan(rad(s.BladeExitAngle))
	psi, sigma := s.PowerInputFactor, s.SlipFactor
	eff := path.Efficiency{Basis: path.Polytropic, Value: eta}
	etaS, _ := l.isentropicGuess(eta, p.FlowCoefficient) // first guess of the stage isentropic efficiency
	cr2 := 0.25 * l.u2 * p.FlowCoefficient / s.Design.FlowCoefficient
	if near != nil && near.TipSpeed > 0 && near.FlowCoefficient > 0 {
		cr2 = near.ExitFlowCoefficient * l.u2 * p.FlowCoefficient / near.FlowCoefficient
		etaS = near.Compression.IsentropicEfficiency
	}
	var ex exitState
	var comp path.Result
	// A first guess of the discharge pressure: the neighbour's, then the
	// previous pass's (the perfect-gas guess from below slows Newton,
	// which converges from the isothermal bound above).
	var near2 physics.Pascal
	if near != nil {
		near2 = near.Compression.Discharge.Pressure
	}
	// The path end of the previous pass: a pass changes only the work, so
	// the next Newton solve, which starts at that pass's pressure, takes
	// the path already integrated there.
	var end path.End
	var prevEnd *path.End
	for outer := 0; ; outer++ {
		ex, cr2, err = l.exitFixedPoint(mdot, cr2, etaS, u1, ct1, tanB, psi, sigma)
		if err != nil {
			return Point{}, err
		}
		comp, end, err = path.CompressionForWorkFrom(m, st, physics.JoulePerKg(ex.w), eff, s.Method, near2, prevEnd)
		prevEnd = &end
		if err != nil {
			return Point{}, fmt.Errorf("compression at %.6g J/kg: %w", ex.w, err)
		}
		if math.Abs(comp.IsentropicEfficiency-etaS) <= etaSTolerance || outer >= 8 {
			break
		}
		near2 = comp.Discharge.Pressure
		etaS = comp.IsentropicEfficiency
	}
	p.Compression = comp
	u2sq := l.u2 * l.u2
	p.WorkCoefficient = ex.w / u2sq
	p.HeadCoefficient = float64(comp.PolytropicHead) / u2sq
	p.ExitMeridional, p.ExitWhirl = cr2, ex.ct2
	p.ExitAbsolute = math.Hypot(cr2, ex.ct2)
	p.ExitRelative = math.Hypot(cr2, l.u2-ex.ct2)
	p.ExitFlowAngle = math.Atan2(ex.ct2, cr2) * 180 / math.Pi
	p.ExitAbsoluteMach = p.ExitAbsolute / float64(ex.static.SoundSpeed)
	p.ExitFlowCoefficient = cr2 / l.u2
	p.ExitStatic, p.ExitTotal = ex.static, ex.total
	if !physics.Finite(p.WorkCoefficient, p.HeadCoefficient, p.ExitAbsolute, p.ExitFlowAngle, p.ExitAbsoluteMach,
		p.InletRelativeMachShroud, p.InletAbsoluteMach, p.InletIncidence, float64(comp.Discharge.Pressure)) {
		return Point{}, &physics.DomainError{Name: "flow", Value: mdot, Want: "a finite operating point"}
	}
	return p, nil
}

// etaSTolerance is the change of the stage isentropic efficiency (which
// sets the impeller exit pressure through the loss share) at which the
// exit iteration stops: its effect on the work is some 1e-3 of it, far
// below the 1e-9 of the results.
const etaSTolerance = 1e-9

// isentropicGuess is a first guess of the stage isentropic efficiency and
// pressure ratio for the polytropic efficiency eta at flow coefficient
// phi (0 for the ratio when no guess is made): the perfect-gas
// conversion at the suction state's isentropic exponent and the pressure
// ratio of the Euler work of the design exit flow coefficient scaled with
// phi (Dixon & Hall 2014, ch. 2, small-stage efficiency).
func (l *Line) isentropicGuess(eta, phi float64) (etaS, pr float64) {
	st, s := l.suction, l.stage
	k := st.IsentropicExponent
	if !(k > 1) || !(k < 2) {
		return eta, 0
	}
	cr2 := 0.25 * l.u2 * phi / s.Design.FlowCoefficient
	w := s.PowerInputFactor * l.u2 * (s.SlipFactor*l.u2 - cr2*math.Tan(rad(s.BladeExitAngle)))
	cpT := float64(st.Pressure) / float64(st.Density) * k / (k - 1)
	if !(w > 0) || !(cpT > 0) {
		return eta, 0
	}
	tr := 1 + w/cpT
	pr = math.Pow(tr, eta*k/(k-1))
	es, err := path.PerfectGasIsentropicEfficiency(eta, pr, k)
	if err != nil || !(es > 0 && es <= 1) || !physics.Finite(pr) {
		return eta, 0
	}
	return es, pr
}

type exitState struct {
	w, ct2        float64
	total, static gas.State
}

// exitFixedPoint solves cr2 = ṁ/(ρ2(cr2) A2) at a fixed stage isentropic
// efficiency etaS: secant steps on r(cr2) = F(cr2) − cr2 after two
// substitutions.
func (l *Line) exitFixedPoint(mdot, cr2, etaS, u1, ct1, tanB, psi, sigma float64) (exitState, float64, error) {
	s, m, st := l.stage, l.model, l.suction
	etaImp := 1 - s.ImpellerLossShare*(1-etaS)
	eval := func(cr2 float64) (exitState, float64, error) {
		var ex exitState
		ex.ct2 = sigma*l.u2 - cr2*tanB
		ex.w = psi * (l.u2*ex.ct2 - u1*ct1)
		if !(ex.w > 0) {
			return ex, 0, pastChoke(mdot, mdot, "impeller exit (no work is left at this flow)")
		}
		ideal, err := gas.StateFromHS(m, st.Enthalpy+physics.JoulePerKg(etaImp*ex.w), st.Entropy, st.Pressure)
		if err != nil {
			return ex, 0, fmt.Errorf("impeller exit total pressure: %w", err)
		}
		if ex.total, err = m.StateFromPH(ideal.Pressure, st.Enthalpy+physics.JoulePerKg(ex.w)); err != nil {
			return ex, 0, fmt.Errorf("impeller exit total state: %w", err)
		}
		c2 := math.Hypot(cr2, ex.ct2)
		if ex.static, err = gas.StaticState(m, ex.total, physics.MeterPerS(c2)); err != nil {
			return ex, 0, pastChoke(mdot, mdot, "impeller exit")
		}
		return ex, mdot / (float64(ex.static.Density) * l.aExit), nil
	}
	var x0, r0 float64
	have := false
	x := cr2
	for range 40 {
		ex, next, err := eval(x)
		if err != nil {
			return ex, x, err
		}
		r := next - x
		if math.Abs(r) <= 1e-13*x {
			return ex, x, nil
		}
		step := next
		if have && r != r0 {
			if s := x - r*(x-x0)/(r-r0); s > 0 && s < 4*x {
				step = s
			}
		}
		x0, r0, have = x, r, true
		x = step
	}
	return exitState{}, x, &physics.DomainError{Name: "flow", Value: mdot, Want: "a settled impeller exit",
		Reason: "the impeller exit density did not settle at this flow and speed (the flow may be close to choke)"}
}

func (l *Line) passageName(p string) string {
	switch p {
	case ChokeEye:
		return "impeller eye"
	case ChokeDiffuserThroat:
		return "vaned diffuser throat"
	case ChokeInducerThroat:
		return "inducer throat"
	case ChokeZeroWork:
		return "impeller (its work falls to zero at this flow)"
	}
	return p
}

// Surge returns the estimated surge mass flow of the line, kg/s: the flow
// at which the absolute flow angle at the diffuser inlet reaches the
// critical angle α2c (Design.SurgeFlowAngle, default 75 deg from radial;
// Senoo & Kinoshita 1977, from memory). With tan α2 = cθ2/cr2 and
// cθ2 = σU2 − cr2 tan β2' the critical exit velocity is
// cr2c = σ U2 / (tan α2c + tan β2'), and the surge flow is the fixed
// point ṁ = ρ2(ṁ) cr2c π D2 b2 (1 − B). It is an estimate: real surge
// lines scatter by some ±10-15 % in flow about any such criterion.
func (l *Line) Surge() (float64, error) {
	s := l.stage
	ac := s.Design.SurgeFlowAngle
	if ac == 0 {
		ac = DefaultSurgeFlowAngle
	}
	crc := s.SlipFactor * l.u2 / (math.Tan(rad(ac)) + math.Tan(rad(s.BladeExitAngle)))
	mdot := crc * l.aExit * float64(l.suction.Density)
	var prev *Point
	for range 40 {
		if mdot >= l.chokeFlow {
			mdot = 0.98 * l.chokeFlow
		}
		p, err := l.AtFrom(mdot, prev)
		if err != nil {
			return 0, fmt.Errorf("surge estimate: %w", err)
		}
		next := float64(p.ExitStatic.Density) * crc * l.aExit
		if math.Abs(next-mdot) <= 1e-9*mdot {
			return next, nil
		}
		mdot, prev = next, &p
	}
	return mdot, nil
}

// Choke returns the choke mass flow of the line, kg/s, and the passage
// that chokes: the inducer (see NewLine), the zero-work flow, or, for a
// vaned diffuser, its throat, where the absolute flow from the impeller
// exit total state reaches sonic speed: the root of
// h(ṁ) = A_th (ρc)*(h02(ṁ), s02(ṁ)) − ṁ (SonicFlux; Dixon & Hall 2014,
// ch. 1 and §7.11, vaned diffuser), which falls with the flow, found by
// regula falsi (Illinois) between a fifth of the line's greatest flow and
// that flow; a flow the stage cannot reach counts as past the root.
func (l *Line) Choke() (float64, string, error) {
	if l.stage.DiffuserThroatArea <= 0 {
		return l.chokeFlow, l.chokePassage, nil
	}
	h := func(mdot float64) (float64, bool) {
		p, err := l.At(mdot)
		if err != nil {
			return 0, false
		}
		f, _, err := SonicFlux(l.model, p.ExitTotal)
		if err != nil {
			return 0, false
		}
		return f*l.stage.DiffuserThroatArea - mdot, true
	}
	hiM := l.chokeFlow * (1 - 1e-9)
	hHi, ok := h(hiM)
	if ok && hHi >= 0 {
		return l.chokeFlow, l.chokePassage, nil
	}
	loM := 0.2 * l.chokeFlow
	hLo, ok := h(loM)
	if !ok || hLo <= 0 {
		return loM, ChokeDiffuserThroat, nil // chokes below a fifth of the line's greatest flow
	}
	okHi := !math.IsNaN(hHi) && ok && hHi < 0
	if !okHi {
		hHi = math.NaN()
	}
	side := 0
	x := 0.5 * (loM + hiM)
	for range 60 {
		if okHi {
			x = hiM - hHi*(hiM-loM)/(hHi-hLo)
			if !(x > loM && x < hiM) {
				x = 0.5 * (loM + hiM)
			}
		} else {
			x = 0.5 * (loM + hiM)
		}
		hx, ok := h(x)
		switch {
		case !ok:
			hiM, okHi, side = x, false, 0
			continue
		case math.Abs(hx) <= 1e-10*x || hiM-loM <= 1e-10*x:
			return x, ChokeDiffuserThroat, nil
		case hx > 0:
			loM, hLo = x, hx
			if side == -1 {
				hHi /= 2
			}
			side = -1
		default:
			hiM, hHi, okHi = x, hx, true
			if side == 1 {
				hLo /= 2
			}
			side = 1
		}
	}
	return x, ChokeDiffuserThroat, nil
}

// InletBladeAngle returns the inlet blade angle β1 (deg from meridional)
// of a stage designed for zero incidence at mass flow mdot and speed n
// from suction state suction: the relative flow angle
// atan((U1 − cθ1)/cm1) at the rms eye radius (or D1), with cm1 from
// continuity at the static inlet density. It stands in for the blade
// angle of a machine whose datasheet does not give it (Dixon & Hall 2014,
// §7.5; zero design incidence is common practice, no source).
func InletBladeAngle(m gas.Model, suction gas.State, mdot float64, n physics.RevPerMin, s Stage) (float64, error) {
	s.Inlet.BladeAngle = 0
	if err := s.Check(); err != nil {
		return 0, err
	}
	in := s.Inlet
	cosA, tanA := math.Cos(rad(in.PrewhirlAngle)), math.Tan(rad(in.PrewhirlAngle))
	fs, cs, err := SonicFlux(m, suction)
	if err != nil {
		return 0, err
	}
	_, c1, err := flowAt(m, suction, mdot/(s.inletArea()*cosA), float64(cs), fs)
	if err != nil {
		return 0, &physics.DomainError{Name: "design.volume_flow", Value: mdot, Reason: "the design flow chokes the inlet as built"}
	}
	cm1 := c1 * cosA
	u1 := 2 * math.Pi * s.inletRadius() * float64(n) / 60
	return math.Atan2(u1-cm1*tanA, cm1) * 180 / math.Pi, nil
}
