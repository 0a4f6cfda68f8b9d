package service

import (
	"fmt"
	"math"

	"stagewright/physics/stage"
)

// slipFrom returns the slip factor of the correlation in.SlipModel
// for in.BladeCount blades; radiusRatio is the inlet shroud over tip
// radius for Wiesner's correction (0: not known yet, no correction).
func slipFrom(in ImpellerInput, radiusRatio float64) (float64, error) {
	var sigma float64
	var err error
	switch in.SlipModel {
	case "wiesner":
		r := radiusRatio
		if r <= 0 {
			r = 1e-6 // below any limiting ratio: no correction
		}
		sigma, err = stage.WiesnerSlip(in.BladeCount, *in.BladeExitAngle, math.Min(r, 0.999))
	case "stanitz":
		sigma, err = stage.StanitzSlip(in.BladeCount, *in.BladeExitAngle)
	case "stodola":
		sigma, err = stage.StodolaSlip(in.BladeCount, *in.BladeExitAngle)
	default:
		return 0, shapeErr("impeller.slip_model", fmt.Errorf("unknown slip model %q: use wiesner, stanitz or stodola", in.SlipModel))
	}
	if err != nil {
		return 0, fieldErr("impeller.blade_count", err)
	}
	return sigma, nil
}

// WiesnerRadiusChoice says which inlet radius the service puts into
// Wiesner's limiting radius ratio: the eye tip (shroud) diameter over the
// impeller tip diameter, D1t/D2 (D1/D2 for a radial inlet). Texts differ on
// the inlet radius meant (tip or mean, from memory); the tip is the largest
// inlet radius and so gives the larger correction (the lower slip factor).
// An inferred choice, stated in provenance.
const WiesnerRadiusChoice = "Wiesner's inlet radius ratio is taken at the eye tip (shroud): D1t/D2 (D1/D2 for a radial inlet); texts differ on which inlet radius is meant (tip or mean, from memory), and the tip radius gives the larger correction, i.e. the lower slip factor (this project's inferred choice)"

// slipMethod records the slip model used and its value; ratio is the inlet
// tip diameter ratio the Wiesner correction was evaluated at.
func slipMethod(in ImpellerInput, sigma, ratio float64) Method {
	if in.SlipModel == "wiesner" {
		lim := stage.WiesnerLimitRatio(in.BladeCount, *in.BladeExitAngle)
		applied := "not needed"
		if ratio > lim {
			applied = "applied"
		}
		return Method{Subject: "slip factor",
			Name: fmt.Sprintf("wiesner slip model, %d blades: slip factor %.4f; inlet-radius correction %s at D1t/D2 = %.4f against the limiting ratio %.4f",
				in.BladeCount, sigma, applied, ratio, lim),
			Source: "Wiesner, ASME J. Eng. Power 89:558 (1967), with its inlet-radius correction (form from memory); " + WiesnerRadiusChoice}
	}
	src := map[string]string{
		"stanitz": "Stanitz, Trans. ASME 74 (1952), in Dixon & Hall (2014) §7.9 (form from memory)",
		"stodola": "Stodola (1927), in Dixon & Hall (2014) §7.9 (form from memory)",
	}[in.SlipModel]
	return Method{Subject: "slip factor",
		Name:   fmt.Sprintf("%s slip model, %d blades: slip factor %.4f", in.SlipModel, in.BladeCount, sigma),
		Source: src}
}
