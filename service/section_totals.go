package service

import (
	"fmt"
	"math"

	"stagewright/physics/limits"
)

// warningRules are the rules without a hard limit that still bound the
// stage count at their warning level: the pressure ratio and head of a
// closed impeller and the flow-coefficient band.
var warningRules = [...]string{"stage-pressure-ratio", "impeller-head", "flow-coefficient-low", "flow-coefficient-high"}

// levelMisses lists the levels the stages of res miss: every rule with a
// hard limit (tip speed of the construction, discharge temperature, the
// Mach numbers, ...) past that limit, and the warningRules past their
// warning level.
func levelMisses(res *SectionResult) []string {
	var out []string
	for k, st := range res.Stages {
		for _, a := range st.Assessments {
			soft := false
			for _, id := range warningRules {
				soft = soft || a.Rule.ID == id
			}
			hard := !math.IsNaN(a.Rule.Limit)
			if (hard && a.Severity == limits.Limit) || (soft && !hard && a.Severity.Rank() >= limits.Warning.Rank()) {
				out = append(out, fmt.Sprintf("stage %d: %s", k+1, a.Rule.ID))
			}
		}
	}
	return out
}

// sectionTotals fills the totals, the section's own warnings, the machine
// and the cautions of a sized section.
func (s *Service) sectionTotals(d SectionDuty, arr string, ic Intercooling, res *SectionResult) error {
	n := len(res.Stages)
	last := res.Stages[n-1]
	res.Discharge = last.Path.Discharge
	gasPower := 0.0
	res.PolytropicHead = 0
	for _, st := range res.Stages {
		res.PolytropicHead += float64(st.Path.PolytropicHead)
		gasPower += st.Power.Gas
	}
	// Mechanical losses once for the shaft (inline) or the bull gear
	// (geared): one mechanical efficiency or one loss figure on the total.
	pw, err := power(d.StageDuty, 1, gasPower, &res.Provenance)
	if err != nil {
		return err
	}
	res.Power = pw
	if arr == "inline" {
		res.Speed = res.Stages[0].Speed
	}
	var own []SectionWarning
	switch {
	case arr == "inline" && n > inlineImpellersWarning:
		sev := limits.Warning
		if n > inlineImpellersLimit {
			sev = limits.Limit
		}
		own = append(own, SectionWarning{Warning: Warning{Code: "impellers-per-casing", Severity: string(sev),
			Message: fmt.Sprintf("%d impellers on one inline rotor: a between-bearings casing carries about 8 to 10; split the section into two casings", n),
			Value:   float64(n), Limit: inlineImpellersWarning, Margin: float64(inlineImpellersWarning-n) / inlineImpellersWarning, Unit: "-",
			Basis: "common practice, from memory (rotor length and critical speeds of API 617 between-bearings machines)"}})
	case arr == "geared" && n > gearedImpellersWarning:
		own = append(own, SectionWarning{Warning: Warning{Code: "impellers-per-casing", Severity: string(limits.Warning),
			Message: fmt.Sprintf("%d stages on one bull gear: a gear takes up to 4 pinions with 2 impellers each; two gear units are needed", n),
			Value:   float64(n), Limit: gearedImpellersWarning, Margin: float64(gearedImpellersWarning-n) / gearedImpellersWarning, Unit: "-",
			Basis: "common practice, from memory (integrally geared compressors, API 617 chapter 3)"}})
	}
	for _, c := range res.Coolers {
		st := res.Stages[c.AfterStage-1]
		for _, a := range st.Assessments {
			if a.Rule.ID == "discharge-temperature" && a.Severity != limits.OK {
				own = append(own, SectionWarning{Stage: c.AfterStage, Warning: Warning{Code: "cooler-inlet-temperature", Severity: string(a.Severity),
					Message: fmt.Sprintf("the gas enters the cooler after stage %d at %.1f K (%.0f degC): %s", c.AfterStage, float64(c.Inlet.Temperature), float64(c.Inlet.Temperature)-273.15, a.Message()),
					Value:   a.Value, Limit: a.Level, Margin: a.Margin, Unit: a.Rule.Unit, Basis: a.Rule.Basis}})
			}
		}
		if c.Condensate > 0 && c.AfterStage < n {
			own = append(own, SectionWarning{Stage: c.AfterStage + 1, Warning: Warning{Code: "stage-inlet-condensate", Severity: string(limits.Warning),
				Message: fmt.Sprintf("stage %d takes the gas saturated from the cooler before it (%.4g kg/s of condensate removed there): a separator with a level-controlled drain, and a little reheat or heat tracing, must keep liquid out of the impeller", c.AfterStage+1, c.Condensate),
				Value:   c.Condensate, Limit: 0, Margin: -c.Condensate / res.Stages[c.AfterStage-1].MassFlow, Unit: "kg/s",
				Basis: "condensate at the cooler outlet by the flash; liquid carry-over erodes impellers (common practice, no source)"}})
		}
	}
	all := append(own, res.Warnings...)
	for k, st := range res.Stages {
		for _, w := range st.Warnings {
			all = append(all, SectionWarning{Warning: w, Stage: k + 1})
		}
	}
	res.Warnings = all
	res.Machine = sectionMachine(d, arr, ic, res)
	res.Cautions = sectionCautions(res)
	return nil
}

// sectionMachine describes the sized section as built: each stage as
// SizeStage answers it (machineOf), the coolers, the first stage's speed
// range, the section's driver and mechanical efficiency.
func sectionMachine(d SectionDuty, arr string, ic Intercooling, res *SectionResult) Machine {
	m := Machine{Arrangement: arr, LimitOverrides: d.LimitOverrides, SpeedRange: res.Stages[0].Machine.SpeedRange}
	if len(res.Stages) == 1 {
		m.Arrangement = "single"
	}
	eta := res.Power.MechanicalEfficiency
	m.MechanicalEfficiency = &eta
	rating := res.Power.DriverRating
	m.Driver = &MachineDriver{Rating: &rating}
	for _, st := range res.Stages {
		m.Stages = append(m.Stages, st.Machine.Stages[0])
	}
	for _, c := range res.Coolers {
		m.Coolers = append(m.Coolers, *coolerAfter(ic, c.AfterStage, len(res.Stages)))
	}
	return m
}

// sectionCautions are the first stage's cautions with the section's own.
func sectionCautions(res *SectionResult) []string {
	first := res.Stages[0].Cautions
	out := make([]string, 0, len(first)+3)
	out = append(out, first[:len(first)-1]...)
	out = append(out, fmt.Sprintf("Section: %d stages; each stage's overspeed, overpressure and temperature cautions are in its own answer; the discharge reaches %.0f kPa absolute and %.0f degC.",
		res.StageCount, float64(res.Discharge.Pressure)/1e3, float64(res.Discharge.Temperature)-273.15))
	if len(res.Coolers) > 0 {
		out = append(out, "Intercoolers: condensate must be separated and drained before the next stage; a tube leak puts coolant into the gas (or gas into the coolant system); the coolers' pressure rating and relief follow the pressure codes.")
	}
	out = append(out, "Surge and choke of the stages interact (stage matching): rate the machine over its operating range (/v1/machine/rate and /map, estimates) and provide anti-surge control for the section.")
	out = append(out, first[len(first)-1])
	return out
}

func joinComma(v []string) string {
	out := ""
	for i, s := range v {
		if i > 0 {
			out += ", "
		}
		out += s
	}
	return out
}
