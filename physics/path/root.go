package path

import (
	"math"

	"stagewright/physics"
)

// rootIncreasing solves g(x) = 0 for a function g that rises with x, from
// two starting points x0 ≠ x1 inside [lo, hi]. Secant steps (bounded to at
// most four times the previous step) extend the search until the root is
// bracketed; then false position with the Illinois modification closes the
// bracket (Press et al., Numerical Recipes, 3rd ed. (2007), §9.2). It stops
// when |g| ≤ tolG or the bracket is narrower than tolX.
func rootIncreasing(g func(float64) (float64, error), x0, x1, lo, hi, tolG, tolX float64) (float64, error) {
	g0, err := g(x0)
	if err != nil {
		return 0, err
	}
	if math.Abs(g0) <= tolG {
		return x0, nil
	}
	g1, err := g(x1)
	if err != nil {
		return 0, err
	}
	for range 60 {
		if math.Abs(g1) <= tolG {
			return x1, nil
		}
		if (g0 < 0) != (g1 < 0) {
			break
		}
		step := x1 - x0
		next := x1 - g1*step/(g1-g0)
		// g rises with x: move down if g > 0, up if g < 0, by at most 4 steps.
		dir := -1.0
		if g1 < 0 {
			dir = 1
		}
		if !physics.Finite(next) || (next-x1)*dir <= 0 {
			next = x1 + dir*2*math.Abs(step)
		}
		maxStep := 4 * math.Abs(step)
		next = math.Max(math.Min(next, x1+maxStep), x1-maxStep)
		next = math.Max(math.Min(next, hi), lo)
		if next == x1 {
			return 0, noRoot()
		}
		x0, g0 = x1, g1
		x1 = next
		if g1, err = g(x1); err != nil {
			return 0, err
		}
	}
	if (g0 < 0) == (g1 < 0) {
		return 0, noRoot()
	}
	a, ga, b, gb := x0, g0, x1, g1 // ga < 0 < gb after the swap below
	if ga > 0 {
		a, ga, b, gb = b, gb, a, ga
	}
	side := 0
	for range 200 {
		x := a - ga*(b-a)/(gb-ga)
		if !(x > math.Min(a, b) && x < math.Max(a, b)) {
			x = 0.5 * (a + b)
		}
		gx, err := g(x)
		if err != nil {
			return 0, err
		}
		if math.Abs(gx) <= tolG || math.Abs(b-a) <= tolX {
			return x, nil
		}
		if gx < 0 {
			a, ga = x, gx
			if side == -1 {
				gb /= 2
			}
			side = -1
		} else {
			b, gb = x, gx
			if side == 1 {
				ga /= 2
			}
			side = 1
		}
	}
	return 0, noRoot()
}

func noRoot() error {
	return &physics.DomainError{Name: "efficiency", Value: 0, Want: "a converged path",
		Reason: "no compression path of the gas model matches this efficiency and discharge pressure (the search did not converge)"}
}
