package service

import (
	"errors"
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/water"
)

// cooled is the gas leaving an intercooler.
type cooled struct {
	// Model and Gas describe the gas that goes on (its composition less the
	// condensate; the same as the inlet's when nothing condenses).
	Model gas.Model
	Gas   GasInput
	// State is the outlet stagnation state.
	State gas.State
	// MassFlow is the gas mass flow leaving, kg/s; Condensate the liquid
	// removed, kg/s; Duty the heat taken out, W (sensible and latent).
	MassFlow, Condensate, Duty float64
	Warnings                   []Warning
}

// dewApproach is the margin above a dew point below which the gas leaving
// a cooler is warned near its dew point: 5 K (common practice, no source).
const dewApproach = 5.0

// cool takes the gas g (model m, mass flow mdot) at the stagnation state
// in through the intercooler c: the outlet temperature is given, or the
// coolant temperature plus the approach; the pressure falls by the
// pressure drop; liquid that forms at the outlet state is removed:
//
//   - water (under every model with a composition) by the IAPWS-IF97
//     saturation pressure: the gas leaves saturated, x_w = psat(T2)/p2
//     (ideal mixing, enhancement factor neglected, as humidify);
//   - other condensable components with a cubic model by an isothermal
//     flash of the remaining gas (cubic.Mixture.Flash: Michelsen's
//     stability test, Rachford-Rice with successive substitution); when
//     the flash fails, only water is removed and a warning says so.
//
// The duty is the enthalpy change of the inlet gas to the outlet state
// plus the latent heat of the condensate (water: Clausius-Clapeyron on the
// IF97 saturation line; hydrocarbons: the cubic equation's residual
// enthalpies). Errors name the cooler's own fields ("outlet_temperature",
// "approach", "coolant_temperature", "pressure_drop"); callers prefix them
// with prefixField.
func (s *Service) cool(c MachineCooler, g GasInput, m gas.Model, in gas.State, mdot float64) (cooled, error) {
	return s.coolWith(c, g, m, in, mdot, true)
}

// coolWith is cool; warn false leaves out the dew-point warnings of the gas
// leaving (a dew-point search costs some 200 µs per cooler), for loops
// that only need the state (the section's head split, stacked ratings).
func (s *Service) coolWith(c MachineCooler, g GasInput, m gas.Model, in gas.State, mdot float64, warn bool) (cooled, error) {
	t2, tField, err := coolerOutletTemperature(c)
	if err != nil {
		return cooled{}, err
	}
	t1, p1 := float64(in.Temperature), float64(in.Pressure)
	if t2 > t1+1e-9 {
		return cooled{}, fieldErr(tField, reason(tField, fmt.Sprintf(
			"the cooler outlet (%.2f K) would be hotter than its inlet (%.2f K): a cooler cannot heat the gas", t2, t1), t2))
	}
	dp := c.PressureDrop
	if !(dp >= 0) || !(dp < p1) {
		return cooled{}, fieldErr("pressure_drop", reason("pressure_drop", fmt.Sprintf(
			"the cooler pressure drop must be at least 0 Pa and below the cooler inlet pressure (%.6g Pa)", p1), dp))
	}
	p2 := p1 - dp
	out := cooled{Model: m, Gas: g, MassFlow: mdot}

	// Sensible part: the inlet gas, as a gas, at the outlet state.
	hot, err := m.State(physics.Kelvin(t2), physics.Pascal(p2))
	if err != nil {
		return cooled{}, fieldErr(tField, fmt.Errorf("cooler outlet state: %w", err))
	}
	out.Duty = mdot * float64(in.Enthalpy-hot.Enthalpy)
	comp, ok := compositionOfModel(m)
	if !ok { // ideal-constant: nothing condenses
		out.State = hot
		return out, nil
	}
	x := comp.MoleFractions()
	n := comp.Len()
	molar := make([]float64, n)
	iw := -1
	for i := range n {
		molar[i] = comp.Component(i).MolarMass
		if comp.Component(i).Formula == "H2O" {
			iw = i
		}
	}
	feedMolar := comp.MolarMass()        // kg per mole of feed
	nFeed := mdot / feedMolar            // mol/s
	left := append([]float64(nil), x...) // moles left per mole of feed
	removed := make([]float64, n)        // moles removed per mole of feed
	latent := 0.0                        // W
	if iw >= 0 && x[iw] > 0 {
		if t2 < float64(water.TriplePointTemperature) {
			return cooled{}, fieldErr(tField, reason(tField, fmt.Sprintf(
				"the cooler outlet (%.2f K) lies below the freezing point of water and the gas holds water: ice or hydrate may form, which is not modelled", t2), t2))
		}
		psat, err := water.SaturationPressure(physics.Kelvin(t2))
		if err != nil {
			return cooled{}, fieldErr(tField, err)
		}
		ysat := float64(psat) / p2
		if ysat < 1 && x[iw] > ysat {
			// Saturated: n_w/(n_dry + n_w) = ysat, less 1e-9 so that the
			// next stage's dew-point test does not find liquid by rounding.
			keep := ysat / (1 - ysat) * (1 - x[iw]) * (1 - 1e-9)
			removed[iw] = x[iw] - keep
			left[iw] = keep
			hfg, err := water.VaporizationEnthalpy(physics.Kelvin(t2))
			if err != nil {
				return cooled{}, fieldErr(tField, err)
			}
			latent += nFeed * removed[iw] * molar[iw] * float64(hfg)
		}
	}
	var flashErr error
	dryLeft := append([]float64(nil), left...)
	if iw >= 0 {
		dryLeft[iw] = 0
	}
	if isCubic(m) && sum(dryLeft) > 0 {
		// The other components flash on the water-free basis: water is set
		// by IF97 above (a cubic equation with its default kij represents
		// water with hydrocarbons and air poorly), and the liquid
		// hydrocarbon is taken to dissolve no water.
		_, modelNow, err := s.rebuiltGas(g, comp, dryLeft, t2, p2)
		if err != nil {
			return cooled{}, err
		}
		if r, ok := realOf(modelNow); ok {
			fl, err := r.Flash(physics.Kelvin(t2), physics.Pascal(p2))
			switch {
			case err != nil:
				flashErr = err
			case fl.TwoPhase:
				total := sum(dryLeft)
				rc, _ := compositionOfModel(modelNow)
				// Map the flash's order (the rebuilt composition's) back.
				idx := indexByID(comp)
				for j := range rc.Len() {
					i := idx[rc.Component(j).ID]
					liq := total * (1 - fl.VapourFraction) * fl.Liquid[j]
					removed[i] += liq
					left[i] = total * fl.VapourFraction * fl.Vapour[j]
				}
				latent += nFeed * total * fl.CondensationEnthalpy
			}
		}
	}
	condMoles := sum(removed)
	if condMoles > 0 {
		condMass := 0.0
		for i, r := range removed {
			condMass += r * molar[i]
		}
		out.Condensate = nFeed * condMass
		out.MassFlow = mdot - out.Condensate
		out.Duty += latent
		out.Warnings = append(out.Warnings, Warning{Code: "cooler-condensate", Severity: "notice",
			Message: fmt.Sprintf("%.4g kg/s of liquid condenses in the cooler (%.1f %% of the gas) and is removed: the next stage takes %.4g kg/s of the remaining gas",
				out.Condensate, 100*out.Condensate/mdot, out.MassFlow),
			Value: out.Condensate, Limit: 0, Margin: -out.Condensate / mdot, Unit: "kg/s",
			Basis: "flash at the cooler outlet: water by the IAPWS-IF97 saturation pressure (IAPWS R7-97); other components by the cubic equation of state (Michelsen & Mollerup 2007, ch. 10)"})
	}
	if condMoles > 0 || g.RelativeHumidity != nil {
		// A relative humidity is a suction quantity: the gas goes on with
		// its water as an explicit mole fraction.
		out.Gas, out.Model, err = s.rebuiltGas(g, comp, left, t2, p2)
		if err != nil {
			return cooled{}, err
		}
	}
	st, err := out.Model.State(physics.Kelvin(t2), physics.Pascal(p2))
	if err != nil {
		return cooled{}, fieldErr(tField, fmt.Errorf("cooler outlet state: %w", err))
	}
	out.State = st
	var dryModel gas.Model
	if isCubic(m) && warn {
		dryModel = out.Model
		if iw >= 0 && left[iw] > 0 {
			for i := range dryLeft {
				dryLeft[i] = left[i]
			}
			dryLeft[iw] = 0
			dryModel = nil
			if sum(dryLeft) > 0 {
				if _, dm, err := s.rebuiltGas(g, comp, dryLeft, t2, p2); err == nil {
					dryModel = dm
				}
			}
		}
	}
	if warn || flashErr != nil {
		out.Warnings = append(out.Warnings, leavingDewWarnings(out.Model, dryModel, st, flashErr)...)
	}
	if !physics.Finite(out.Duty, out.MassFlow, out.Condensate) {
		return cooled{}, fieldErr(tField, reason(tField, "the cooler balance gave no finite result at this outlet state", t2))
	}
	return out, nil
}

// coolerOutletTemperature returns the outlet temperature of c and the
// field that set it.
func coolerOutletTemperature(c MachineCooler) (float64, string, error) {
	if c.CoolantTemperature != nil {
		tc := *c.CoolantTemperature
		if !(tc > 0) || math.IsInf(tc, 0) {
			return 0, "coolant_temperature", fieldErr("coolant_temperature", reason("coolant_temperature",
				"the coolant temperature must be a finite absolute temperature above 0 K", tc))
		}
	}
	switch {
	case c.OutletTemperature != nil && c.Approach != nil:
		return 0, "approach", shapeErr("approach", errors.New("give outlet_temperature, or approach with coolant_temperature, not both"))
	case c.OutletTemperature != nil:
		t := *c.OutletTemperature
		if !(t > 0) || math.IsInf(t, 0) {
			return 0, "outlet_temperature", fieldErr("outlet_temperature", reason("outlet_temperature",
				"the cooler outlet temperature must be a finite absolute temperature above 0 K", t))
		}
		if c.CoolantTemperature != nil && t < *c.CoolantTemperature {
			return 0, "outlet_temperature", fieldErr("outlet_temperature", reason("outlet_temperature", fmt.Sprintf(
				"the cooler outlet (%.2f K) cannot be colder than the coolant (%.2f K)", t, *c.CoolantTemperature), t))
		}
		return t, "outlet_temperature", nil
	case c.Approach != nil:
		a := *c.Approach
		if c.CoolantTemperature == nil {
			return 0, "coolant_temperature", shapeErr("coolant_temperature", errors.New("an approach needs coolant_temperature: the gas leaves at the coolant temperature plus the approach"))
		}
		if !(a >= 0) || !(a <= 500) {
			return 0, "approach", fieldErr("approach", reason("approach",
				"the approach is the outlet temperature less the coolant temperature: at least 0 K (a gas cannot leave colder than its coolant) and at most 500 K", a))
		}
		return *c.CoolantTemperature + a, "approach", nil
	}
	return 0, "outlet_temperature", shapeErr("outlet_temperature", errors.New("a cooler needs outlet_temperature, or approach with coolant_temperature"))
}

// leavingDewWarnings warns when the gas leaving a cooler at st lies within
// dewApproach of its water dew point (IF97, model m) or of the dew point
// of its water-free part by the cubic equation (dry; nil for other
// models), or when the hydrocarbon flash failed.
func leavingDewWarnings(m, dry gas.Model, st gas.State, flashErr error) []Warning {
	var out []Warning
	t := float64(st.Temperature)
	comp, ok := compositionOfModel(m)
	if ok {
		x := comp.MoleFractions()
		for i := range comp.Len() {
			if comp.Component(i).Formula != "H2O" || x[i] <= 0 {
				continue
			}
			c, err := water.WaterCondensation(st.Temperature, x[i], st.Pressure)
			if err == nil && c.DewPointKnown && float64(c.Margin) < dewApproach {
				out = append(out, Warning{Code: "cooler-outlet-near-dew-point", Severity: "warning",
					Message: fmt.Sprintf("the gas leaves the cooler %.1f K above its water dew point (%.1f K): any heat loss or pressure rise before the next impeller condenses water; drain and separate, or heat-trace the line",
						float64(c.Margin), float64(c.DewPoint)),
					Value: t, Limit: float64(c.DewPoint) + dewApproach, Margin: (t - float64(c.DewPoint) - dewApproach) / (float64(c.DewPoint) + dewApproach), Unit: "K",
					Basis: "IAPWS-IF97 region 4 saturation temperature at the water partial pressure; 5 K approach is common practice, no source"})
			}
		}
	}
	if r, ok := realOf(dry); ok && dry != nil {
		td, err := r.DewTemperature(st.Pressure)
		if err == nil && physics.Finite(float64(td)) && td > 0 && t-float64(td) < dewApproach {
			out = append(out, Warning{Code: "cooler-outlet-near-dew-point", Severity: "warning",
				Message: fmt.Sprintf("the gas leaves the cooler %.1f K above its dew point by the gas model (%.1f K): liquid may form before the next impeller; separate and drain",
					t-float64(td), float64(td)),
				Value: t, Limit: float64(td) + dewApproach, Margin: (t - float64(td) - dewApproach) / (float64(td) + dewApproach), Unit: "K",
				Basis: "dew point by the equation of state (Michelsen 1982; Michelsen & Mollerup 2007, ch. 12); 5 K approach is common practice, no source"})
		}
	}
	if flashErr != nil {
		out = append(out, Warning{Code: "cooler-flash-incomplete", Severity: "warning",
			Message: "the two-phase flash at the cooler outlet did not finish (" + flashErr.Error() + "): only water was removed; heavier components near their dew point may condense too",
			Value:   t, Limit: t, Unit: "K",
			Basis: "Rachford-Rice flash with successive substitution (Michelsen & Mollerup 2007, ch. 10)"})
	}
	return out
}

// rebuiltGas returns the gas input and model of g's components with the
// mole amounts left (any scale): the same model and interactions, the
// composition as mole fractions by catalogue id, no relative humidity
// (its water is in the composition).
func (s *Service) rebuiltGas(g GasInput, comp gas.Composition, left []float64, t, p float64) (GasInput, gas.Model, error) {
	total := sum(left)
	out := g
	out.RelativeHumidity = nil
	out.CompositionBasis = "mole"
	out.Composition = make(map[string]float64, len(left))
	for i, v := range left {
		if v > 0 {
			out.Composition[comp.Component(i).ID] = v / total
		}
	}
	m, _, err := s.gasModel(out, t, p)
	if err != nil {
		return GasInput{}, nil, fieldErr("gas.composition", fmt.Errorf("the gas leaving the cooler: %w", err))
	}
	return out, m, nil
}

// isCubic reports whether m is a cubic equation-of-state model.
func isCubic(m gas.Model) bool {
	_, ok := realOf(m)
	return ok
}

// realOf returns the cubic model behind m.
func realOf(m gas.Model) (gas.Real, bool) {
	switch v := m.(type) {
	case pathModel:
		return v.Real, true
	case gas.Real:
		return v, true
	}
	return gas.Real{}, false
}

func indexByID(c gas.Composition) map[string]int {
	out := make(map[string]int, c.Len())
	for i := range c.Len() {
		out[c.Component(i).ID] = i
	}
	return out
}

func sum(v []float64) float64 {
	s := 0.0
	for _, x := range v {
		s += x
	}
	return s
}

// prefixField returns err with the field of an *InputError prefixed, e.g.
// "intercooling." or "machine.coolers.1.", so that a cooler's error names
// the field in the caller's request.
func prefixField(err error, prefix string) error {
	var ie *InputError
	if errors.As(err, &ie) {
		cp := *ie
		cp.Field = prefix + ie.Field
		return &cp
	}
	return err
}
