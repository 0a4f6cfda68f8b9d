package cubic

import "math"

// realRoots returns the real roots of z³ + c2 z² + c1 z + c0 = 0 in
// ascending order and their count (1 or 3; a double root is returned
// twice). The depressed cubic y³ + p y + q = 0 (z = y − c2/3) is solved by
// Cardano's formula in the cancellation-free form when it has one real
// root and by the trigonometric (Viète) form when it has three; each root
// is then polished by Newton steps on the original cubic.
//
// Source: W. H. Press et al., Numerical Recipes, 3rd ed. (2007), §5.6
// (quadratic and cubic equations; section number from memory).
func realRoots(c2, c1, c0 float64) (roots [3]float64, n int) {
	shift := -c2 / 3
	p := c1 - c2*c2/3
	q := (2*c2*c2*c2)/27 - c2*c1/3 + c0
	disc := q*q/4 + p*p*p/27
	if disc > 0 || p >= 0 {
		sq := math.Sqrt(math.Max(disc, 0))
		u := -math.Cbrt(q/2 + math.Copysign(sq, q))
		y := u
		if u != 0 {
			y = u - p/(3*u)
		}
		roots[0] = polish(y+shift, c2, c1, c0)
		return roots, 1
	}
	r := 2 * math.Sqrt(-p/3)
	arg := 3 * q / (2 * p) * math.Sqrt(-3/p)
	arg = math.Max(-1, math.Min(1, arg))
	theta := math.Acos(arg) / 3
	const third = 2 * math.Pi / 3
	y0 := r * math.Cos(theta)       // largest
	y1 := r * math.Cos(theta-third) // middle
	y2 := r * math.Cos(theta+third) // smallest
	z0 := polish(y0+shift, c2, c1, c0)
	z1 := polish(y1+shift, c2, c1, c0)
	z2 := polish(y2+shift, c2, c1, c0)
	// Newton can swap neighbours of a near-double root: sort.
	if z2 > z1 {
		z1, z2 = z2, z1
	}
	if z1 > z0 {
		z0, z1 = z1, z0
	}
	if z2 > z1 {
		z1, z2 = z2, z1
	}
	return [3]float64{z2, z1, z0}, 3
}

// polish improves a root estimate z of z³ + c2 z² + c1 z + c0 by up to four
// Newton steps; it stops when a step no longer shrinks the residual.
func polish(z, c2, c1, c0 float64) float64 {
	f := ((z+c2)*z+c1)*z + c0
	for range 4 {
		d := (3*z+2*c2)*z + c1
		if d == 0 || f == 0 {
			break
		}
		zn := z - f/d
		fn := ((zn+c2)*zn+c1)*zn + c0
		if !(math.Abs(fn) < math.Abs(f)) {
			break
		}
		z, f = zn, fn
	}
	return z
}

// zRoots returns the smallest and largest compressibility roots with
// Z > B (v > b) of the generic cubic with reduced parameters
// A = a P/(R T)², B = b P/(R T), and whether three distinct physical roots
// exist (then lo is the liquid-like and hi the vapour-like root; the middle
// root is mechanically unstable and never returned). u = δ1 + δ2,
// w = δ1 δ2:
//
//	Z³ − (1 + B − uB) Z² + (A + wB² − uB − uB²) Z − (AB + wB² + wB³) = 0
//
// Source: Michelsen & Mollerup (2007), ch. 3 (generic two-parameter cubic).
// P(v) falls from +∞ at v → b to 0 at v → ∞, so the number of roots with
// v > b is odd: one or three.
func zRoots(aa, bb, u, w float64) (lo, hi float64, three bool) {
	c2 := -(1 + bb - u*bb)
	c1 := aa + w*bb*bb - u*bb - u*bb*bb
	c0 := -(aa*bb + w*bb*bb + w*bb*bb*bb)
	r, n := realRoots(c2, c1, c0)
	if n == 1 {
		return r[0], r[0], false
	}
	hi = r[2]
	if r[0] > bb && hi-r[0] > 1e-12*hi {
		return r[0], hi, true
	}
	return hi, hi, false
}
