package stage_test

import (
	"fmt"
	"math"

	"stagewright/physics/stage"
)

// Radial blades with Saravanamuttoo et al. (2009) Example 4.1 constants
// (σ = 0.9, ψ = 1.04, from memory; stage-examples.md §2): the tip speed
// for Δh0 = 1005 × 193.26 J/kg and the tip diameter at 17 400 rev/min.
func ExampleTipSpeed() {
	u2, err := stage.TipSpeed(1005*193.26, 0.9, 1.04, 0, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	d2, err := stage.TipDiameter(u2, 17400)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("U2 = %.1f m/s, D2 = %.3f m\n", u2, d2)
	// Output: U2 = 455.5 m/s, D2 = 0.500 m
}

// Slip factors for 19 radial blades (stage-examples.md §7).
func ExampleWiesnerSlip() {
	w, err := stage.WiesnerSlip(19, 0, 0.4)
	if err != nil {
		fmt.Println(err)
		return
	}
	s, err := stage.StodolaSlip(19, 0)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Wiesner %.4f, Stodola %.4f\n", w, s)
	// Output: Wiesner 0.8727, Stodola 0.8347
}

// Peak polytropic efficiency at the optimum flow coefficient of Casey &
// Robinson (2013) (φ_CR = 0.08, i.e. φ = 0.1019 here) and tip Mach 1.2
// (correlation coefficients from memory).
func ExamplePolytropicEfficiencyEstimate() {
	e, err := stage.PolytropicEfficiencyEstimate(0.08*4/math.Pi, 1.2)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("eta_p = %.4f, in range %v\n", e.Value, e.InRange)
	// Output: eta_p = 0.8553, in range true
}

// Guide-vane prewhirl of cθ1 = 50 m/s at an rms eye blade speed of
// 200 m/s takes ψ U1 cθ1 = 10.4 kJ/kg off the Euler work at U2 = 455 m/s
// (Dixon & Hall 2014, eq. 7.1; numbers invented for the example), and
// TipSpeedWithPrewhirl inverts it.
func ExampleEulerWorkWithPrewhirl() {
	w, err := stage.EulerWorkWithPrewhirl(455, 0.9, 1.04, 0, 140, 200, 50)
	if err != nil {
		fmt.Println(err)
		return
	}
	u2, err := stage.TipSpeedWithPrewhirl(w, 0.9, 1.04, 0, 140, 200, 50)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("w = %.1f kJ/kg, U2 = %.1f m/s\n", w/1e3, u2)
	// Output: w = 183.4 kJ/kg, U2 = 455.0 m/s
}

// Radial blades, σ = 0.9, ψ = 1.04 (stage-examples.md §2 constants, from
// memory) and Δh0 = 1005 × 193.26 J/kg: 20 deg of guide-vane prewhirl
// giving cθ1 = 52 m/s at an rms eye blade speed of 216 m/s (numbers
// invented for the example) needs a faster tip than TipSpeed's 455.5 m/s:
// U2 = √((w + ψ U1 cθ1)/(ψ σ)) = 469.0 m/s (computed here).
func ExampleTipSpeedWithPrewhirl() {
	u2, err := stage.TipSpeedWithPrewhirl(1005*193.26, 0.9, 1.04, 0, 0, 216, 52)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("U2 = %.1f m/s\n", u2)
	// Output: U2 = 469.0 m/s
}
