package stage

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// The slip correlations below return σ in this package's convention,
// σ = 1 − Δcθ/U2 (slip velocity over tip speed). Dixon & Hall (2014, §7.9)
// write Stodola's and Stanitz's results against the no-slip whirl instead,
// σ_D = cθ2/cθ2∞; the two are related by 1 − σ = (1 − σ_D)(1 − φ2 tan β2').

// StodolaSlip returns Stodola's slip factor for z blades with exit angle
// β2' (deg from radial, backsweep positive):
//
//	σ = 1 − π cos β2' / z
//
// Source: A. Stodola, Steam and Gas Turbines (1927); in Dixon & Hall
// (2014), eq. 7.18 (form from memory). Valid for 2 ≤ z ≤ 60, 0 ≤ β2' ≤ 75°
// where the result is positive: a few radial blades (z ≤ 3 at β2' = 0)
// give σ ≤ 0, which is returned as a DomainError.
func StodolaSlip(z int, bladeExitAngle float64) (float64, error) {
	if err := checkBlades(z, bladeExitAngle); err != nil {
		return 0, err
	}
	sigma := 1 - math.Pi*math.Cos(rad(bladeExitAngle))/float64(z)
	if !(sigma > 0) {
		return 0, &physics.DomainError{Name: "blade_count", Value: float64(z), Want: "enough blades for a positive Stodola slip factor",
			Reason: fmt.Sprintf("Stodola's slip factor 1 − π cos β2'/z is %.3g for %d blades at %g deg: it needs more blades (or more backsweep) to be positive", sigma, z, bladeExitAngle)}
	}
	return sigma, nil
}

// StanitzSlip returns Stanitz's slip factor:
//
//	σ = 1 − 0.63 π / z
//
// (the slip velocity of Stanitz does not depend on β2'). Source: J. D.
// Stanitz, "Some theoretical aerodynamic investigations of impellers in
// radial- and mixed-flow centrifugal compressors", Trans. ASME 74 (1952);
// in Dixon & Hall (2014), eq. 7.19 (form from memory). Valid for
// 2 ≤ z ≤ 60 and 0 ≤ β2' ≤ 45° as derived; used to 75° with care.
func StanitzSlip(z int, bladeExitAngle float64) (float64, error) {
	if err := checkBlades(z, bladeExitAngle); err != nil {
		return 0, err
	}
	return 1 - 0.63*math.Pi/float64(z), nil
}

// WiesnerSlip returns Wiesner's slip factor with its inlet-radius
// correction:
//
//	σ = 1 − √(cos β2') / z^0.7
//	ε_lim = exp(−8.16 cos β2' / z); for r1/r2 > ε_lim multiply
//	σ by 1 − ((r1/r2 − ε_lim)/(1 − ε_lim))³
//
// Source: F. J. Wiesner, "A review of slip factors for centrifugal
// impellers", ASME J. Eng. Power 89:558-572 (1967) (form from memory).
// radiusRatio is the inlet shroud (eye tip) to tip radius ratio, 0 < r < 1.
func WiesnerSlip(z int, bladeExitAngle, radiusRatio float64) (float64, error) {
	if err := checkBlades(z, bladeExitAngle); err != nil {
		return 0, err
	}
	if !(radiusRatio > 0 && radiusRatio < 1) {
		return 0, &physics.DomainError{Name: "radius_ratio", Value: radiusRatio, Want: "0 < r1/r2 < 1"}
	}
	c := math.Cos(rad(bladeExitAngle))
	sigma := 1 - math.Sqrt(c)/math.Pow(float64(z), 0.7)
	if lim := WiesnerLimitRatio(z, bladeExitAngle); radiusRatio > lim {
		sigma *= 1 - math.Pow((radiusRatio-lim)/(1-lim), 3)
	}
	return sigma, nil
}

// WiesnerLimitRatio returns ε_lim = exp(−8.16 cos β2' / z), the inlet/exit
// radius ratio above which Wiesner's correlation needs its correction
// (source as WiesnerSlip). Valid for 2 ≤ z ≤ 60, 0 ≤ β2' ≤ 75° (the range
// of WiesnerSlip); it does not check its inputs, and NaN in gives NaN out.
func WiesnerLimitRatio(z int, bladeExitAngle float64) float64 {
	return math.Exp(-8.16 * math.Cos(rad(bladeExitAngle)) / float64(z))
}

func checkBlades(z int, bladeExitAngle float64) error {
	switch {
	case z < 2 || z > 60:
		return &physics.DomainError{Name: "blade_count", Value: float64(z), Want: "2 <= blade_count <= 60",
			Reason: "the blade count of an impeller must lie between 2 and 60"}
	case !(bladeExitAngle >= 0 && bladeExitAngle <= MaxBladeExitAngle):
		return &physics.DomainError{Name: "blade_exit_angle", Value: bladeExitAngle, Want: "0 <= blade_exit_angle <= 75 deg"}
	}
	return nil
}

func rad(deg float64) float64 { return deg * math.Pi / 180 }
