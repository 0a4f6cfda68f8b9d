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

// slipMethod records the slip model used and its value.
func slipMethod(in ImpellerInput, sigma float64) Method {
	src := map[string]string{
		"wiesner": "Wiesner, ASME J. Eng. Power 89:558 (1967), with its inlet-radius correction (form from memory)",
		"stanitz": "Stanitz, Trans. ASME 74 (1952), in Dixon & Hall (2014) §7.9 (form from memory)",
		"stodola": "Stodola (1927), in Dixon & Hall (2014) §7.9 (form from memory)",
	}[in.SlipModel]
	return Method{Subject: "slip factor",
		Name:   fmt.Sprintf("%s slip model, %d blades: slip factor %.4f", in.SlipModel, in.BladeCount, sigma),
		Source: src}
}
