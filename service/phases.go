package service

import (
	"fmt"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/water"
)

// station is a named state along the stage.
type station struct {
	name   string
	st     gas.State
	static bool // a static state of a moving stream, not a stagnation state
}

// checkPhases looks at each station (and returns its water dew point in K,
// 0 where the gas holds no water or the dew point is below the triple
// point) with the model's full phase test and
// returns warnings for condensation (model phase, water dew point), states
// where a cubic equation of state loses accuracy, and correlations used
// beyond their range. It never fails the request: the suction state is
// checked before and a wet suction is a 422 there.
func checkPhases(m gas.Model, stations []station) ([]Warning, []float64) {
	var out []Warning
	dew := make([]float64, len(stations))
	comp, hasComp := compositionOfModel(m)
	xw := 0.0
	if hasComp {
		for i := range comp.Len() {
			if comp.Component(i).Formula == "H2O" {
				xw = comp.MoleFractions()[i]
			}
		}
	}
	seenValidity := gas.Validity(0)
	for k, s := range stations {
		full, err := fullState(m, s.st.Temperature, s.st.Pressure)
		if err != nil {
			continue
		}
		if full.Phase == gas.PhaseLiquid || full.Phase == gas.PhaseTwoPhase {
			out = append(out, Warning{Code: "condensation-risk", Severity: "critical",
				Message: fmt.Sprintf("at the %s (%.1f K, %.0f Pa) the gas model finds the gas %s: liquid may form in the machine", s.name, float64(full.Temperature), float64(full.Pressure), full.Phase),
				Source:  "phase from the equation of state's root and the Michelsen tangent-plane stability test (Fluid Phase Equilib. 9:1, 1982)"})
		}
		if xw > 0 {
			c, err := water.WaterCondensation(s.st.Temperature, xw, s.st.Pressure)
			if err == nil && c.DewPointKnown {
				dew[k] = float64(c.DewPoint)
				margin := float64(c.Margin)
				if c.Condenses || margin < 5 {
					// Below the dew point at a stagnation station the gas is wet
					// (critical); at a static station (the eye, the impeller
					// tip) the dip lasts a moment and the gas reheats, so a
					// mist may form but is a caution (common practice, no source).
					sev := "caution"
					if c.Condenses && !s.static {
						sev = "critical"
					}
					out = append(out, Warning{Measured: true, Code: "water-dew-point", Severity: sev,
						Message: dewMessage(s.name, margin, float64(c.DewPoint)),
						Value:   float64(s.st.Temperature), Limit: float64(c.DewPoint) + 5, Margin: margin / (float64(c.DewPoint) + 5), Unit: "K",
						Source: "IAPWS-IF97 region 4 saturation temperature at the water partial pressure; 5 K approach is common practice, no source"})
				}
			}
		}
		seenValidity |= full.Validity
		if w, ok := cubicAccuracy(m, comp, hasComp, s); ok {
			out = append(out, w)
		}
	}
	if seenValidity&gas.CpExtrapolated != 0 {
		out = append(out, Warning{Code: "cp-extrapolated", Severity: "caution",
			Message: "an ideal-gas heat capacity correlation was used beyond its stated temperature range at one or more stations",
			Source:  "ranges of the NIST Shomate fits and Poling et al. (2001) polynomials in the component catalogue"})
	}
	return out, dew
}

// compositionOfModel returns the composition of a mixture model.
func compositionOfModel(m gas.Model) (gas.Composition, bool) {
	switch v := m.(type) {
	case pathModel:
		return v.Composition(), true
	case gas.Real:
		return v.Composition(), true
	case gas.Ideal:
		return v.Composition(), true
	}
	return gas.Composition{}, false
}

// cubicAccuracy warns where a cubic equation of state's density may err by
// more than about 3 %: reduced temperature below 1.05 with reduced pressure
// above 0.5, on pseudo-critical constants by Kay's rule (Σ x Tc, Σ x Pc).
// Source: testdata/reference/rules-of-thumb.md §11, derived from the PR
// deviations in real-gas-checks.csv.
func cubicAccuracy(m gas.Model, comp gas.Composition, ok bool, s station) (Warning, bool) {
	if !ok || m.Name() == "ideal" {
		return Warning{}, false
	}
	var tc, pc float64
	x := comp.MoleFractions()
	for i := range comp.Len() {
		c := comp.Component(i)
		tc += x[i] * float64(c.Tc)
		pc += x[i] * float64(c.Pc)
	}
	tr, pr := float64(s.st.Temperature)/tc, float64(s.st.Pressure)/pc
	if !(tr < 1.05 && pr > 0.5) || !physics.Finite(tr, pr) {
		return Warning{}, false
	}
	return Warning{Measured: true, Code: "near-critical-state", Severity: "caution",
		Message: fmt.Sprintf("at the %s the gas is near its critical point (T/Tc = %.3f, p/Pc = %.2f): cubic-equation densities may err by more than 3 %%", s.name, tr, pr),
		Value:   tr, Limit: 1.05, Margin: (tr - 1.05) / 1.05, Unit: "-",
		Source: "derived from the Peng-Robinson deviations of testdata/reference/real-gas-checks.csv (rules-of-thumb.md §11)"}, true
}

func dewMessage(where string, margin, dew float64) string {
	if margin < 0 {
		return fmt.Sprintf("at the %s the gas is %.1f K below its water dew point of %.1f K: water condenses", where, -margin, dew)
	}
	return fmt.Sprintf("at the %s the gas is only %.1f K above its water dew point of %.1f K", where, margin, dew)
}
