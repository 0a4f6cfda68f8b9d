package offdesign

import (
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// SonicFlux returns the greatest mass flux ρc (kg/(s m²)) that a passage
// can pass from the stagnation state stag, and the velocity at which it
// occurs. Along the isentrope through stag, d(ρc)/dc = ρ (1 − c²/a²), so
// the flux is greatest where the velocity equals the static sound speed:
// the passage is choked (Dixon & Hall 2014, ch. 1, compressible flow and
// choking; any gas). The sonic point is the root of c − a(h0 − c²/2, s0),
// found by regula falsi with the Illinois modification on [0, a0] for
// every gas model (the static states by gas.StaticState). Valid for a
// stagnation state of m with positive density and sound speed.
func SonicFlux(m gas.Model, stag gas.State) (flux float64, c physics.MeterPerS, err error) {
	a0 := float64(stag.SoundSpeed)
	if !(a0 > 0) || !(stag.Density > 0) || math.IsInf(a0, 0) {
		return 0, 0, &physics.DomainError{Name: "stagnation", Value: a0, Want: "a stagnation state with density and sound speed"}
	}
	g := func(v float64) (float64, float64, bool) {
		st, err := gas.StaticState(m, stag, physics.MeterPerS(v))
		if err != nil {
			return 0, 0, false
		}
		return v - float64(st.SoundSpeed), float64(st.Density), true
	}
	lo, hi := 0.0, a0
	glo := -a0
	ghi, _, ok := g(hi)
	for !ok || !(ghi > 0) { // no state or still subsonic at hi: shrink or grow
		if !ok {
			hi *= 0.9
		} else {
			lo, glo = hi, ghi
			hi *= 1.2
		}
		if hi < 1e-6*a0 || hi > 10*a0 {
			return 0, 0, &physics.DomainError{Name: "stagnation", Value: a0, Want: "a sonic point inside the gas model",
				Reason: "no sonic state of the gas model was found below the stagnation state"}
		}
		ghi, _, ok = g(hi)
	}
	side := 0
	var x float64
	for range 200 {
		x = hi - ghi*(hi-lo)/(ghi-glo)
		if !(x > lo && x < hi) {
			x = 0.5 * (lo + hi)
		}
		gx, _, ok := g(x)
		if !ok {
			hi, ghi, side = x, math.Abs(ghi), 0
			continue
		}
		if math.Abs(gx) <= 1e-11*a0 || hi-lo <= 1e-12*a0 {
			break
		}
		if gx > 0 {
			hi, ghi = x, gx
			if side == 1 {
				glo /= 2
			}
			side = 1
		} else {
			lo, glo = x, gx
			if side == -1 {
				ghi /= 2
			}
			side = -1
		}
	}
	_, rho, ok := g(x)
	if !ok || !physics.Finite(rho*x) {
		return 0, 0, &physics.DomainError{Name: "stagnation", Value: a0, Want: "a sonic state inside the gas model"}
	}
	return rho * x, physics.MeterPerS(x), nil
}

// flowAt returns the subsonic velocity at which the mass flux from stag
// is flux (ρc = flux), given the sonic velocity cs and flux fs of stag
// (flux ≤ fs), by regula falsi (Illinois) on [0, cs]: the flux rises
// monotonically with the velocity on the subsonic branch. It returns the
// static state there.
func flowAt(m gas.Model, stag gas.State, flux, cs, fs float64) (gas.State, float64, error) {
	f := func(v float64) (float64, gas.State, bool) {
		st, err := gas.StaticState(m, stag, physics.MeterPerS(v))
		if err != nil {
			return 0, st, false
		}
		return float64(st.Density)*v - flux, st, true
	}
	lo, hi := 0.0, cs
	flo, fhi := -flux, fs-flux
	if fhi < 0 {
		return gas.State{}, 0, &physics.DomainError{Name: "flow", Value: flux, Want: "a flux below the sonic flux", Reason: "the passage is choked"}
	}
	// A first guess from the stagnation density.
	x := math.Min(flux/float64(stag.Density), 0.99*cs)
	side := 0
	for range 200 {
		fx, st, ok := f(x)
		if !ok {
			return gas.State{}, 0, &physics.DomainError{Name: "flow", Value: flux, Want: "a static state inside the gas model"}
		}
		if math.Abs(fx) <= 1e-13*flux || hi-lo <= 1e-14*cs {
			return st, x, nil
		}
		if fx > 0 {
			hi, fhi = x, fx
			if side == 1 {
				flo /= 2
			}
			side = 1
		} else {
			lo, flo = x, fx
			if side == -1 {
				fhi /= 2
			}
			side = -1
		}
		x = hi - fhi*(hi-lo)/(fhi-flo)
		if !(x > lo && x < hi) {
			x = 0.5 * (lo + hi)
		}
	}
	_, st, _ := f(x)
	return st, x, nil
}
