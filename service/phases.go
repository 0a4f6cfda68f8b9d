package service

import (
	"fmt"
	"math"

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
	seenCp := false
	for k, s := range stations {
		full, err := fullState(m, s.st.Temperature, s.st.Pressure)
		if err != nil {
			continue
		}
		if full.Phase == gas.PhaseLiquid || full.Phase == gas.PhaseTwoPhase {
			out = append(out, condensationWarning(m, s, full))
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
					sev := "warning"
					if c.Condenses && !s.static {
						sev = "limit"
					}
					out = append(out, Warning{Code: "water-dew-point", Severity: sev,
						Message: dewMessage(s.name, margin, float64(c.DewPoint)),
						Value:   float64(s.st.Temperature), Limit: float64(c.DewPoint) + 5, Margin: margin / (float64(c.DewPoint) + 5), Unit: "K",
						Basis: "IAPWS-IF97 region 4 saturation temperature at the water partial pressure; 5 K approach is common practice, no source"})
				}
			}
		}
		if full.Validity&gas.CpExtrapolated != 0 && !seenCp {
			if w, ok := cpRangeWarning(comp, hasComp, s); ok {
				out = append(out, w)
				seenCp = true
			}
		}
		if w, ok := cubicAccuracy(m, comp, hasComp, s); ok {
			out = append(out, w)
		}
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
	case gas.GERG:
		return v.Composition(), true
	case gas.Ideal:
		return v.Composition(), true
	}
	return gas.Composition{}, false
}

// Near-critical band of the cubic models, on Kay's-rule pseudo-critical
// constants: T/Tc below nearCriticalTr with p/Pc above nearCriticalPr.
// Derived here: this service's Peng-Robinson against the reference values of
// testdata/reference/real-gas-checks.csv (and the audit of issue 12, CO2 at
// 320 K and 60 bar against GERG-2008) errs in cp by 6 to 24 % and in density
// by up to 6 % at every state with T/Tc 0.92-1.08 and p/Pc 0.56-1.65
// (CO2 280 K 41.6 bar cp -24 %; ethane 300 K 40 bar cp -14 %; propane
// 370 K 40 bar cp -12 %, 400 K 70 bar cp -8 % and density -6 %; methane
// 200 K 50 bar cp -7 %, density +5 %; CO2 320 K 60 bar cp and isentropic
// exponent about 6 %), but within 2.5 % where T/Tc >= 1.18 or p/Pc <= 0.16
// (ethane 360 K 8 bar, methane 280 K 50 bar, CO2 300 K 10 bar). The old
// band (T/Tc < 1.05, p/Pc > 0.5; rules-of-thumb.md §11) missed propane at
// T/Tc 1.08 and CO2 at 1.05; the band is widened to T/Tc < 1.2 and
// p/Pc > 0.4 (the edges are a rounded margin around the states measured,
// not fitted).
const (
	nearCriticalTr = 1.2
	nearCriticalPr = 0.4
)

// nearCriticalBasis is the basis of the near-critical-state warning.
const nearCriticalBasis = "derived here: this service's Peng-Robinson against the reference values of testdata/reference/real-gas-checks.csv and GERG-2008 (issue 12 audit) errs by 6-24 % in cp, about 6 % in the isentropic exponent and up to 6 % in density at T/Tc 0.92-1.08, p/Pc 0.56-1.65, and by less than 2.5 % at T/Tc >= 1.18 or p/Pc <= 0.16; band T/Tc < 1.2 with p/Pc > 0.4 on Kay's-rule pseudo-critical constants (widened from rules-of-thumb.md §11)"

// cubicAccuracy warns where a cubic equation of state's cp, isentropic
// exponent and density may err by several percent: inside the near-critical
// band (nearCriticalTr, nearCriticalPr) on pseudo-critical constants by
// Kay's rule (Σ x Tc, Σ x Pc). Only the cubic models ("peng-robinson",
// "srk") get it; the message points to the gerg-2008 model.
func cubicAccuracy(m gas.Model, comp gas.Composition, ok bool, s station) (Warning, bool) {
	if name := m.Name(); !ok || (name != "peng-robinson" && name != "srk") {
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
	if !nearCritical(tr, pr) {
		return Warning{}, false
	}
	return Warning{Code: "near-critical-state", Severity: "warning",
		Message: fmt.Sprintf("at the %s the gas is near its critical point (T/Tc = %.3f, p/Pc = %.2f): the cubic equation's cp and isentropic exponent may err by 5-25 %% and its density by up to 6 %% (and the head, power and discharge temperature with them); prefer gas model gerg-2008, the reference equation for natural gas, CO2 and hydrogen blends, where it covers the components", s.name, tr, pr),
		Value:   tr, Limit: nearCriticalTr, Margin: (tr - nearCriticalTr) / nearCriticalTr, Unit: "-",
		Basis: nearCriticalBasis}, true
}

// nearCritical reports whether reduced temperature tr and reduced pressure
// pr lie inside the near-critical band of the cubic models.
func nearCritical(tr, pr float64) bool {
	return physics.Finite(tr, pr) && tr < nearCriticalTr && pr > nearCriticalPr
}

func dewMessage(where string, margin, dew float64) string {
	if margin < 0 {
		return fmt.Sprintf("at the %s the gas is %.1f K below its water dew point of %.1f K: water condenses", where, -margin, dew)
	}
	return fmt.Sprintf("at the %s the gas is only %.1f K above its water dew point of %.1f K", where, margin, dew)
}

// dewPointer is a model that can locate its dew point (the cubic models).
type dewPointer interface {
	DewTemperature(p physics.Pascal) (physics.Kelvin, error)
}

// condensationWarning reports a station the model finds liquid or two-phase,
// with the station temperature against the dew-point temperature at its
// pressure (Michelsen 1982; found only here, when condensation is already
// known, because it costs some 200 µs). A liquid state at a stagnation
// station is a "limit"; at a static station (eye, impeller tip) the state
// lasts a moment, so it is a "warning" (common practice, no source).
func condensationWarning(m gas.Model, s station, full gas.State) Warning {
	sev := "limit"
	if s.static {
		sev = "warning"
	}
	t := float64(full.Temperature)
	w := Warning{Code: "condensation-risk", Severity: sev, Value: t, Limit: t, Unit: "K",
		Basis: "phase from the equation of state's root and the Michelsen tangent-plane stability test (Fluid Phase Equilib. 9:1, 1982); dew point by Michelsen & Mollerup (2007), ch. 12"}
	if dp, ok := m.(dewPointer); ok {
		if td, err := dp.DewTemperature(full.Pressure); err == nil && physics.Finite(float64(td)) && td > 0 {
			w.Limit = float64(td)
			w.Margin = (t - float64(td)) / float64(td)
			w.Message = fmt.Sprintf("at the %s (%.1f K, %.0f Pa) the gas model finds the gas %s, %.1f K below its dew point of %.1f K: liquid may form in the machine",
				s.name, t, float64(full.Pressure), full.Phase, float64(td)-t, float64(td))
			return w
		}
	}
	w.Message = fmt.Sprintf("at the %s (%.1f K, %.0f Pa) the gas model finds the gas %s (the dew point could not be located, so the limit shown is the station temperature itself): liquid may form in the machine",
		s.name, t, float64(full.Pressure), full.Phase)
	return w
}

// cpRangeWarning reports the first station whose temperature lies outside
// a component's ideal-gas cp correlation range, with the nearest range end
// as the limit (ranges of the NIST Shomate fits and the Poling et al. 2001
// polynomials in the catalogue).
func cpRangeWarning(comp gas.Composition, ok bool, s station) (Warning, bool) {
	if !ok {
		return Warning{}, false
	}
	t := float64(s.st.Temperature)
	x := comp.MoleFractions()
	for i := range comp.Len() {
		if x[i] <= 0 {
			continue
		}
		c := comp.Component(i)
		lo, hi := c.TemperatureRange()
		limit := 0.0
		switch {
		case t < float64(lo):
			limit = float64(lo)
		case t > float64(hi):
			limit = float64(hi)
		default:
			continue
		}
		return Warning{Code: "correlation-out-of-range", Severity: "notice",
			Message: fmt.Sprintf("at the %s (%.1f K) the ideal-gas heat capacity of %s is extrapolated beyond its fitted range (%.0f-%.0f K)", s.name, t, c.ID, float64(lo), float64(hi)),
			Value:   t, Limit: limit, Margin: -math.Abs(t-limit) / limit, Unit: "K",
			Basis: "fitted ranges of the NIST Shomate coefficients and Poling et al. (2001) polynomials in the component catalogue"}, true
	}
	return Warning{}, false
}
