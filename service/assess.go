package service

import (
	"fmt"
	"math"

	"stagewright/physics/limits"
)

// assess checks the sized stage against the design limits, keeps every
// assessment (asset systems want all margins) and turns those past their
// caution level into warnings; the verdict is the worst severity.
func (s *Service) assess(d StageDuty, res *StageResult) error {
	build := limits.Construction(d.Impeller.Construction)
	if build == "" {
		build = limits.DefaultBuild
		res.Provenance.Defaults = append(res.Provenance.Defaults, Default{Field: "impeller.construction", Value: string(build),
			Note: "tip-speed limit of a closed (shrouded) steel impeller"})
	}
	tip, err := limits.TipSpeed(build)
	if err != nil {
		return shapeErr("impeller.construction", err)
	}
	svc := limits.Service(d.Gas.Service)
	if svc == "" {
		svc = limits.DefaultService
		res.Provenance.Defaults = append(res.Provenance.Defaults, Default{Field: "gas.service", Value: string(svc),
			Note: "discharge-temperature limit of general process gas"})
	}
	dischargeT, err := limits.DischargeTemperature(svc)
	if err != nil {
		return shapeErr("gas.service", err)
	}
	vaned := d.Diffuser == "vaned"
	if d.Diffuser == "" {
		res.Provenance.Defaults = append(res.Provenance.Defaults, Default{Field: "diffuser.type", Value: "vaneless",
			Note: "diffuser-inlet Mach limit of a vaneless diffuser; flow-angle stall rule applied"})
	}
	sz := res.Sizing
	v, c := sz.Velocities, sz.Coefficients
	checks := []struct {
		rule  limits.Rule
		value float64
	}{
		{tip, float64(v.TipSpeed)},
		{limits.InducerRelativeMach(), v.InletRelativeMach},
		{limits.MachineMach(), v.MachineMach},
		{limits.DiffuserInletMach(vaned), v.ExitAbsoluteMach},
		{dischargeT, float64(res.Path.Discharge.Temperature)},
		{limits.FlowCoefficientLow(), c.FlowCoefficient},
		{limits.FlowCoefficientHigh(), c.FlowCoefficient},
		{limits.ExitWidthNarrow(), c.ExitWidthRatio},
		{limits.ExitWidthWide(), c.ExitWidthRatio},
		{limits.HeadCoefficientLow(), c.PolytropicHeadCoefficient},
		{limits.HeadCoefficientHigh(), c.PolytropicHeadCoefficient},
		{limits.RelativeVelocityRatio(), v.RelativeVelocityRatio},
		{limits.SpecificSpeedLow(), c.SpecificSpeed},
		{limits.SpecificSpeedHigh(), c.SpecificSpeed},
		{limits.EyeTipRatio(), c.InletTipRatio},
	}
	if !vaned {
		checks = append(checks, struct {
			rule  limits.Rule
			value float64
		}{limits.DiffuserFlowAngle(), v.ExitFlowAngle})
	}
	if build == limits.ClosedSteel {
		checks = append(checks, struct {
			rule  limits.Rule
			value float64
		}{limits.ClosedImpellerHead(), float64(res.Path.PolytropicHead)})
	}
	verdict := limits.Within
	for _, ch := range checks {
		a, err := ch.rule.Check(ch.value)
		if err != nil {
			return fmt.Errorf("service: assess: %w", err)
		}
		res.Assessments = append(res.Assessments, a)
		if a.Severity == limits.Within {
			continue
		}
		if a.Severity == limits.Critical || verdict == limits.Within {
			verdict = a.Severity
		}
		res.Warnings = append(res.Warnings, Warning{Measured: true, Code: a.Rule.Code, Severity: string(a.Severity), Message: a.Message(),
			Value: a.Value, Limit: a.Limit, Margin: a.Margin, Unit: a.Rule.Unit, Source: a.Rule.Source})
	}
	if hd := res.Path.HeadDifference; math.Abs(hd) > 0.005 {
		res.Warnings = append(res.Warnings, Warning{Measured: true, Code: "polytropic-methods-disagree", Severity: string(limits.Caution),
			Message: fmt.Sprintf("the Schultz (PTC 10) and stepwise polytropic heads differ by %.2f %%; the stepwise path is the reference for a real gas", 100*hd),
			Value:   hd, Limit: 0.005, Margin: (0.005 - math.Abs(hd)) / 0.005, Unit: "-",
			Source: "Sandberg & Colby, Texas A&M Turbomachinery Symposium 2013 (PTC 10 head-factor error for non-ideal gases); threshold common practice, no source"})
	}
	for _, w := range res.Warnings {
		switch {
		case w.Severity == string(limits.Critical):
			verdict = limits.Critical
		case w.Severity == string(limits.Caution) && verdict == limits.Within:
			verdict = limits.Caution
		}
	}
	switch verdict {
	case limits.Within:
		res.Verdict = "within-limits"
	default:
		res.Verdict = string(verdict)
	}
	res.Warnings = append(res.Warnings, Warning{Code: "surge-margin-not-estimated", Severity: "notice",
		Message: "surge margin is not estimated by a single-point sizing; the diffuser flow-angle and flow-coefficient checks are its only proxies here",
		Source:  "common practice: at least 10 % surge margin in flow at rated speed (no source)"})
	return nil
}
