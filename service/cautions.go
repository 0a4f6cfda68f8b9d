package service

import (
	"fmt"
	"strings"

	"stagewright/physics/gas"
)

// Hazard thresholds for the gas-specific cautions (mole fractions).
const (
	// oxygenRich is the O2 fraction above which a gas is oxygen-enriched:
	// 23.5 % is the enrichment level of the oxygen-safety guidance
	// (EIGA Doc. 04 / CGA G-4.4, from memory).
	oxygenRich = 0.235
	// traceFraction is the least fraction named as present: 10 ppm.
	traceFraction = 1e-5
)

// cautionsFor returns the cautions of a sized stage: what the numbers are,
// the protections every compressor needs (with this duty's figures), the
// hazards of the gas named in its composition, and the authorities that
// govern. Sentences, not codes: they are for people.
func cautionsFor(m gas.Model, d StageDuty, res *StageResult) []string {
	out := []string{
		"Preliminary engineering estimate from published methods and rules of thumb, not a machine selection, rating or guarantee: confirm every figure with the compressor's manufacturer.",
		fmt.Sprintf("Overspeed: the stage runs at %.0f rev/min with a tip speed of %.0f m/s; the trip speed, overspeed protection and the impeller's stress limits are set by the manufacturer and the driver standard.",
			res.Speed, float64(res.Sizing.Velocities.TipSpeed)),
		fmt.Sprintf("Overpressure: the discharge reaches %.0f kPa absolute at this duty and more at surge or blocked outlet; relief devices and the casing's design pressure must be set per the applicable pressure codes.",
			float64(res.Path.Discharge.Pressure)/1e3),
		"Surge: this sizing is a single design point; the estimated surge and choke lines of the sized stage come from POST /v1/machine/map and /v1/machine/rate with the answer's machine, and they are estimates (about ±10-15 % in flow): an anti-surge control system and the manufacturer's tested map are required.",
		fmt.Sprintf("Discharge temperature: %.0f degC at this duty; seals, materials, lubricant and downstream equipment limits govern, and it rises at off-design points.",
			float64(res.Path.Discharge.Temperature)-273.15),
	}
	if res.EfficiencyEstimated {
		out = append(out, fmt.Sprintf("Efficiency: no efficiency was given, so %.3f polytropic was estimated from a published correlation whose form and coefficients the service holds only from memory and could not check against the paper; head, power and discharge temperature inherit that uncertainty: give the manufacturer's or a tested efficiency.",
			res.Path.PolytropicEfficiency))
	}
	out = append(out, gasHazards(m)...)
	out = append(out, "Defer to the machine's manufacturer, the applicable standards (API 617, ISO 10439 and their peers), local codes and licensed engineering practice.")
	return out
}

// gasHazards names the toxic, flammable, oxidising or embrittling
// components of the model's composition.
func gasHazards(m gas.Model) []string {
	comp, ok := compositionOfModel(m)
	if !ok {
		return []string{"Gas hazards: the constant-property model carries no composition; check the gas for toxic, flammable or oxidising components and the hazardous-area classification."}
	}
	x := comp.MoleFractions()
	present := map[string]float64{}
	var fuels []string
	for i := range comp.Len() {
		if x[i] < traceFraction {
			continue
		}
		c := comp.Component(i)
		present[c.Formula] += x[i]
		switch c.Formula {
		case "H2", "CO", "CH4", "C2H6", "C3H8", "i-C4H10", "n-C4H10", "i-C5H12", "n-C5H12", "n-C6H14", "n-C7H16", "n-C8H18", "n-C9H20", "n-C10H22", "C2H4", "C3H6", "H2S", "NH3":
			fuels = append(fuels, c.Formula)
		}
	}
	var out []string
	if f, ok := present["H2S"]; ok {
		out = append(out, fmt.Sprintf("Toxic gas: hydrogen sulfide at %s; seal leakage, venting and gas detection need toxic-service design, and materials need sour-service qualification (NACE MR0175 / ISO 15156).", pct(f)))
	}
	if f, ok := present["CO"]; ok {
		out = append(out, fmt.Sprintf("Toxic gas: carbon monoxide at %s; seal leakage and venting need toxic-service design and gas detection.", pct(f)))
	}
	if f, ok := present["NH3"]; ok {
		out = append(out, fmt.Sprintf("Toxic gas: ammonia at %s; seal leakage and venting need toxic-service design and gas detection.", pct(f)))
	}
	if len(fuels) > 0 {
		out = append(out, "Flammable gas ("+strings.Join(fuels, ", ")+"): hazardous-area classification, seal-gas and vent design, and purging before start-up apply.")
	}
	if f, ok := present["H2"]; ok && f >= 0.01 {
		out = append(out, fmt.Sprintf("Hydrogen at %s: low molar mass needs high tip speed per unit head, and hydrogen embrittlement limits impeller and casing materials.", pct(f)))
	}
	if f, ok := present["O2"]; ok && f > oxygenRich {
		out = append(out, fmt.Sprintf("Oxygen-enriched gas (O2 %s): oxygen-compatible materials, cleanliness, and velocity and temperature limits of oxygen service apply.", pct(f)))
	}
	if _, ok := present["air"]; ok && len(fuels) > 0 {
		out = append(out, "Air mixed with flammable components: check the mixture against its flammability limits before compressing it.")
	}
	if _, ok := present["O2"]; ok && len(fuels) > 0 {
		out = append(out, "Oxygen mixed with flammable components: check the mixture against its flammability limits before compressing it.")
	}
	return out
}

func pct(f float64) string {
	if f < 0.001 {
		return fmt.Sprintf("%.0f ppm", f*1e6)
	}
	return fmt.Sprintf("%.3g %%", 100*f)
}
