package stage

import (
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// How the eye tip diameter of an axial eye was found (Geometry.EyeChoice).
const (
	// EyeGivenDiameter: the caller gave the eye tip diameter; cm1 follows
	// from continuity (subsonic root).
	EyeGivenDiameter = "given-diameter"
	// EyeMeridionalVelocity: the caller gave cm1; the eye follows from
	// continuity.
	EyeMeridionalVelocity = "meridional-velocity"
	// EyeMinShroudMach: the eye was chosen for the least shroud relative
	// Mach number at the flow, speed, hub ratio and prewhirl.
	EyeMinShroudMach = "min-shroud-mach"
)

// Range of the inlet guide-vane prewhirl angle α1 (deg from meridional,
// positive with the rotation). Guide vanes turning the flow against the
// rotation by more than about 30 deg, or with it by more than about 60 deg,
// are outside usual practice (common practice, no source).
const (
	MinPrewhirlAngle = -30.0
	MaxPrewhirlAngle = 60.0
)

// eyeFlow evaluates the static state entering an axial eye at a given
// meridional velocity cm1, the absolute velocity being c1 = cm1/cos α1.
// For the constant-property gas it uses the closed form
//
//	T1/T01 = 1 − c1²/(2 cp T01),  ρ1 = ρ01 (T1/T01)^(1/(γ−1)),  a1 = a01 √(T1/T01)
//
// (isentropic relations of a perfect gas, Dixon & Hall 2014, ch. 1-2),
// which is what gas.StaticState gives for that model, without the flash
// iterations; for any other model it calls gas.StaticState.
type eyeFlow struct {
	model              gas.Model
	stag               gas.State
	perfect            bool
	gamma, cpT0, expo  float64
	rho0, a0           float64
	cosAlpha, tanAlpha float64
}

func newEyeFlow(m gas.Model, stag gas.State, alphaDeg float64) eyeFlow {
	f := eyeFlow{model: m, stag: stag, cosAlpha: math.Cos(rad(alphaDeg)), tanAlpha: math.Tan(rad(alphaDeg)),
		rho0: float64(stag.Density), a0: float64(stag.SoundSpeed)}
	var g float64
	switch c := m.(type) {
	case gas.Constant:
		g, f.perfect = c.Gamma(), true
	case *gas.Constant:
		g, f.perfect = c.Gamma(), c != nil
	}
	if f.perfect {
		f.gamma = g
		f.cpT0 = float64(stag.Cp) * float64(stag.Temperature)
		f.expo = 1 / (g - 1)
	}
	return f
}

// static returns ρ1 and a1 at meridional velocity cm; ok is false where the
// static state does not exist (static temperature at or below 0 K or
// outside the model).
func (f *eyeFlow) static(cm float64) (rho, a float64, ok bool) {
	c := cm / f.cosAlpha
	if f.perfect {
		tr := 1 - c*c/(2*f.cpT0)
		if !(tr > 0) {
			return 0, 0, false
		}
		return f.rho0 * math.Pow(tr, f.expo), f.a0 * math.Sqrt(tr), true
	}
	st, err := gas.StaticState(f.model, f.stag, physics.MeterPerS(c))
	if err != nil {
		return 0, 0, false
	}
	return float64(st.Density), float64(st.SoundSpeed), true
}

// choke returns the meridional velocity at which the mass flux ρ1 cm1 is
// greatest and that flux. Along an isentrope d(ρc)/dc = ρ (1 − c²/a²), so
// the greatest flux is where the absolute velocity equals the static sound
// speed (Dixon & Hall 2014, §1 compressible flow, choking; any gas): for
// the perfect gas c1* = √(2 (γ−1) cp T01/(γ+1)), otherwise c1 = a1 is found
// by bisection.
func (f *eyeFlow) choke() (cm, flux float64, ok bool) {
	if f.perfect {
		cm = math.Sqrt(2*f.cpT0*(f.gamma-1)/(f.gamma+1)) * f.cosAlpha
		rho, _, ok := f.static(cm)
		return cm, rho * cm, ok
	}
	// c1 = 0 is subsonic; c1 = a01 is supersonic (the static sound speed
	// falls with the static temperature) or has no static state. The sonic
	// point is the root of g(cm) = c1 − a1, found by regula falsi with the
	// Illinois modification (bisection where the state does not exist).
	lo, hi := 0.0, f.a0*f.cosAlpha
	glo, ghi := -f.a0, math.NaN() // NaN: no static state at hi (yet)
	if _, a, ok := f.static(hi); ok {
		ghi = hi/f.cosAlpha - a
	}
	side := 0
	for range 200 {
		var mid float64
		if math.IsNaN(ghi) || !(ghi > 0) {
			mid = 0.5 * (lo + hi)
		} else {
			mid = (lo*ghi - hi*glo) / (ghi - glo)
			if !(mid > lo && mid < hi) {
				mid = 0.5 * (lo + hi)
			}
		}
		_, a, ok := f.static(mid)
		switch {
		case !ok:
			hi, ghi, side = mid, math.NaN(), 0
		case mid/f.cosAlpha >= a:
			hi, ghi = mid, mid/f.cosAlpha-a
			if side == -1 {
				glo /= 2
			}
			side = -1
		default:
			lo, glo = mid, mid/f.cosAlpha-a
			if side == 1 && !math.IsNaN(ghi) {
				ghi /= 2
			}
			side = 1
		}
		if hi-lo <= 1e-12*hi || math.Abs(glo) <= 1e-12*f.a0 {
			break
		}
	}
	rho, _, ok := f.static(lo)
	return lo, rho * lo, ok && lo > 0
}

// meridionalForFlux returns the subsonic cm1 at which ρ1 cm1 = flux, for
// 0 < flux ≤ fluxMax (the flux at cmMax, the choke point), by the Illinois
// variant of regula falsi on the bracket (0, cmMax), on which the flux
// rises monotonically (see choke).
func (f *eyeFlow) meridionalForFlux(flux, cmMax, fluxMax float64) float64 {
	a, fa := 0.0, -1.0
	b, fb := cmMax, fluxMax/flux-1
	if fb <= 0 {
		return cmMax
	}
	side := 0
	c := b
	for range 100 {
		c = (a*fb - b*fa) / (fb - fa)
		if !(c > a && c < b) {
			c = 0.5 * (a + b)
		}
		rho, _, ok := f.static(c)
		if !ok {
			b, fb = c, 1 // cannot happen below the choke point; shrink
			continue
		}
		fc := rho*c/flux - 1
		if math.Abs(fc) <= 1e-14 || b-a <= 1e-14*b {
			return c
		}
		if fc > 0 {
			b, fb = c, fc
			if side == -1 {
				fa /= 2
			}
			side = -1
		} else {
			a, fa = c, fc
			if side == 1 {
				fb /= 2
			}
			side = 1
		}
	}
	return c
}

// shroudMach returns W1s/a1 at meridional velocity cm for an eye sized by
// continuity at that velocity: D1t = √(4 ṁ/(π ρ1 cm (1 − ν²))),
// U1s = Ω D1t/2, W1s = √(cm² + (U1s − cm tan α1)²). k is
// (π N/60)·√(4 ṁ/(π (1 − ν²))), so that U1s = k/√(ρ1 cm).
func (f *eyeFlow) shroudMach(cm, k float64) (float64, bool) {
	rho, a, ok := f.static(cm)
	if !ok {
		return 0, false
	}
	u := k / math.Sqrt(rho*cm)
	return math.Hypot(cm, u-cm*f.tanAlpha) / a, true
}

// optimumMeridional returns the cm1 in (0, cmMax) that minimises the shroud
// relative Mach number, by Brent's minimiser (golden section with parabolic
// interpolation): R. P. Brent, Algorithms for Minimization without
// Derivatives (1973), ch. 5, procedure localmin. Each cm1 maps to one eye
// tip diameter by continuity and the map is monotonic on the subsonic
// branch (smaller eye, faster flow), so this is the search over D1t between
// the choke limit (cmMax) and a very large eye (cm1 = 1e-4 cmMax), without
// an inner continuity iteration. cm1 is fixed to 1e-9 relative (about the
// square root of the float64 resolution, the best a minimiser can do on a
// smooth minimum), which fixes D1t to better than 1e-9 relative
// (D1t ∝ (ρ1 cm1)^(−1/2), and d ln(ρ1 cm1)/d ln cm1 = 1 − M1² < 1).
func (f *eyeFlow) optimumMeridional(cmMax, k float64) (float64, bool) {
	const (
		golden = 0.3819660112501051 // (3 − √5)/2
		rtol   = 1e-7               // on cm; the Mach number is flat to 1e-14 there, far below any use
	)
	a, b := 1e-4*cmMax, cmMax
	x := a + golden*(b-a)
	w, v := x, x
	fx, ok := f.shroudMach(x, k)
	if !ok {
		return 0, false
	}
	fw, fv := fx, fx
	var d, e float64
	for range 200 {
		m := 0.5 * (a + b)
		tol := rtol * math.Abs(x)
		t2 := 2 * tol
		if math.Abs(x-m) <= t2-0.5*(b-a) {
			break
		}
		var p, q, r float64
		if math.Abs(e) > tol { // trial parabola through x, w, v
			r = (x - w) * (fx - fv)
			q = (x - v) * (fx - fw)
			p = (x-v)*q - (x-w)*r
			q = 2 * (q - r)
			if q > 0 {
				p = -p
			} else {
				q = -q
			}
			r, e = e, d
		}
		if math.Abs(p) < math.Abs(0.5*q*r) && p > q*(a-x) && p < q*(b-x) {
			d = p / q // parabolic step
			if u := x + d; u-a < t2 || b-u < t2 {
				d = tol
				if x >= m {
					d = -tol
				}
			}
		} else { // golden-section step into the larger part
			e = b - x
			if x >= m {
				e = a - x
			}
			d = golden * e
		}
		u := x + d
		if math.Abs(d) < tol {
			u = x + math.Copysign(tol, d)
		}
		fu, ok := f.shroudMach(u, k)
		if !ok {
			return 0, false
		}
		if fu <= fx {
			if u < x {
				b = x
			} else {
				a = x
			}
			v, fv, w, fw, x, fx = w, fw, x, fx, u, fu
		} else {
			if u < x {
				a = u
			} else {
				b = u
			}
			if fu <= fw || w == x {
				v, fv, w, fw = w, fw, u, fu
			} else if fu <= fv || v == x || v == w {
				v, fv = u, fu
			}
		}
	}
	return x, true
}

// sizeEye sizes an axial eye before the impeller tip (it depends only on
// the suction state, flow, speed, hub ratio and prewhirl) and fills the
// inlet geometry, velocities and station of out. It returns the blade speed
// at the rms eye diameter and the inlet whirl for the Euler work.
func sizeEye(d Duty, in Inlet, out *Sizing) (u1rms, ct1 physics.MeterPerS, err error) {
	nu := in.HubRatio
	alpha := in.PrewhirlAngle
	switch {
	case !(nu >= 0 && nu < 0.95):
		return 0, 0, &physics.DomainError{Name: "inlet.hub_ratio", Value: nu, Want: "0 <= hub_ratio < 0.95",
			Reason: "the eye hub ratio (hub over eye tip diameter) must lie in [0, 0.95)"}
	case !(alpha >= MinPrewhirlAngle && alpha <= MaxPrewhirlAngle):
		return 0, 0, &physics.DomainError{Name: "inlet.prewhirl_angle", Value: alpha, Want: "-30 <= prewhirl_angle <= 60 deg",
			Reason: "the prewhirl angle is the inlet guide-vane flow angle from the axial direction in degrees, positive with the rotation: it must lie between -30 and 60"}
	case !(in.EyeTipDiameter >= 0) || math.IsInf(float64(in.EyeTipDiameter), 0):
		return 0, 0, &physics.DomainError{Name: "inlet.eye_tip_diameter", Value: float64(in.EyeTipDiameter), Want: "finite, > 0 m (0: not given)",
			Reason: "the eye tip diameter must be a positive length in m (or left out)"}
	case in.EyeTipDiameter == 0 && (!(in.MeridionalVelocity >= 0) || math.IsInf(float64(in.MeridionalVelocity), 0)):
		return 0, 0, &physics.DomainError{Name: "inlet.meridional_velocity", Value: float64(in.MeridionalVelocity), Want: "finite, > 0 m/s (0: not given)",
			Reason: "the inlet meridional velocity must be positive (or left out to choose the eye)"}
	}
	f := newEyeFlow(d.Model, d.Suction, alpha)
	mdot := float64(d.MassFlow)
	omega := math.Pi * float64(d.Speed) / 60 // U = omega·D
	g := &out.Geometry
	var cm, dt float64
	switch {
	case in.EyeTipDiameter > 0:
		g.EyeChoice = EyeGivenDiameter
		dt = float64(in.EyeTipDiameter)
		area := math.Pi / 4 * dt * dt * (1 - nu*nu)
		cmMax, fluxMax, ok := f.choke()
		if !ok {
			return 0, 0, &physics.DomainError{Name: "suction", Value: float64(d.Suction.Temperature), Want: "a suction state with a sonic static state",
				Reason: "the choking flow of the eye could not be found for this suction state and gas model"}
		}
		flux := mdot / area
		if flux > fluxMax {
			return 0, 0, &physics.DomainError{Name: "inlet.eye_tip_diameter", Value: dt, Want: "an eye large enough to pass the flow",
				Reason: fmt.Sprintf("the eye is too small for the flow: with a tip diameter of %.4g m and hub ratio %.3g it chokes (the absolute inlet velocity reaches the speed of sound) at %.4g kg/s, below the %.4g kg/s asked for; give a larger eye tip diameter or leave it out to have the eye chosen",
					dt, nu, fluxMax*area, mdot)}
		}
		cm = f.meridionalForFlux(flux, cmMax, fluxMax)
	case in.MeridionalVelocity > 0:
		g.EyeChoice = EyeMeridionalVelocity
		cm = float64(in.MeridionalVelocity)
	default:
		g.EyeChoice = EyeMinShroudMach
		cmMax, _, ok := f.choke()
		if !ok {
			return 0, 0, &physics.DomainError{Name: "suction", Value: float64(d.Suction.Temperature), Want: "a suction state with a sonic static state",
				Reason: "the choking flow of the eye could not be found for this suction state and gas model"}
		}
		k := omega * math.Sqrt(4*mdot/(math.Pi*(1-nu*nu)))
		opt, ok := f.optimumMeridional(cmMax, k)
		if !ok {
			return 0, 0, &physics.DomainError{Name: "inlet", Value: alpha, Want: "an eye with a least shroud Mach number",
				Reason: "the search for the eye of least shroud relative Mach number left the range where the gas model has a static state; give the eye tip diameter or the meridional velocity"}
		}
		if opt >= (1-1e-6)*cmMax {
			return 0, 0, &physics.DomainError{Name: "inlet.prewhirl_angle", Value: alpha, Want: "a prewhirl leaving an optimum eye below choking",
				Reason: fmt.Sprintf("with %.3g deg of prewhirl the shroud relative Mach number keeps falling until the eye chokes, so there is no optimum eye: use less prewhirl, or give the eye tip diameter or the meridional velocity", alpha)}
		}
		cm = opt
	}
	c1 := cm / f.cosAlpha
	st, err := gas.StaticState(d.Model, d.Suction, physics.MeterPerS(c1))
	if err != nil {
		return 0, 0, fmt.Errorf("inlet static state: %w", err)
	}
	if dt == 0 {
		dt = math.Sqrt(4 * mdot / (float64(st.Density) * cm * math.Pi * (1 - nu*nu)))
	}
	g.Inlet = InletAxialEye
	g.InletDiameter = physics.Meter(dt)
	g.EyeHubDiameter = physics.Meter(nu * dt)
	g.InletWidth = physics.Meter((dt - nu*dt) / 2)
	g.InletArea = math.Pi / 4 * dt * dt * (1 - nu*nu)

	ct := cm * f.tanAlpha
	us := omega * dt
	uh := nu * us
	um := us * math.Sqrt((1+nu*nu)/2)
	a1 := float64(st.SoundSpeed)
	v := &out.Velocities
	v.InletBladeSpeed = physics.MeterPerS(us)
	v.InletMeridional = physics.MeterPerS(cm)
	v.InletWhirl = physics.MeterPerS(ct)
	v.InletRelative = physics.MeterPerS(math.Hypot(cm, us-ct))
	v.InletRelativeMach = float64(v.InletRelative) / a1
	v.InletAbsoluteMach = c1 / a1
	v.InletBladeAngleShroud = math.Atan2(us-ct, cm) * 180 / math.Pi
	v.InletBladeAngleMean = math.Atan2(um-ct, cm) * 180 / math.Pi
	v.InletBladeAngleHub = math.Atan2(uh-ct, cm) * 180 / math.Pi
	out.Inlet = Station{Static: st, Velocity: physics.MeterPerS(c1), Mach: c1 / a1}
	return physics.MeterPerS(um), physics.MeterPerS(ct), nil
}
