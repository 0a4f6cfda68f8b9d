package service

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"stagewright/physics/limits"
)

// LevelOverride replaces the levels of one limit rule for one request.
type LevelOverride struct {
	// Warning is the soft level.
	Warning float64 `json:"warning"`
	// Limit is the hard level; nil keeps the rule without one.
	Limit *float64 `json:"limit,omitempty"`
}

// check is a rule and the value it grades.
type check struct {
	rule  limits.Rule
	value float64
}

// ruleSet returns the limit rules that apply to duty d and the sized stage
// in res, with the caller's overrides applied. Every rule applied is kept
// (asset systems want all margins).
func (s *Service) ruleSet(d StageDuty, res *StageResult) ([]check, error) {
	build := limits.Construction(d.Impeller.Construction)
	if build == "" {
		build = limits.DefaultBuild
		res.Provenance.Defaults = append(res.Provenance.Defaults, Default{Field: "impeller.construction", Value: string(build),
			Note: "tip-speed and stage pressure-ratio levels of a closed (shrouded) steel impeller"})
	}
	tip, err := limits.TipSpeed(build)
	if err != nil {
		return nil, shapeErr("impeller.construction", err)
	}
	svc := limits.Service(d.Gas.Service)
	if svc == "" {
		svc = limits.DefaultService
		res.Provenance.Defaults = append(res.Provenance.Defaults, Default{Field: "gas.service", Value: string(svc),
			Note: "discharge-temperature levels of general process gas"})
	}
	dischargeT, err := limits.DischargeTemperature(svc)
	if err != nil {
		return nil, shapeErr("gas.service", err)
	}
	vaned := d.Diffuser == "vaned"
	if d.Diffuser == "" {
		res.Provenance.Defaults = append(res.Provenance.Defaults, Default{Field: "diffuser.type", Value: "vaneless",
			Note: "diffuser-inlet Mach levels of a vaneless diffuser; the inflow-angle (stall) rule applies"})
	}
	sz := res.Sizing
	v, c := sz.Velocities, sz.Coefficients
	checks := []check{
		{tip, float64(v.TipSpeed)},
		{limits.MachineMach(), v.MachineMach},
		{limits.InducerRelativeMach(), v.InletRelativeMach},
		{limits.DiffuserInletMach(vaned), v.ExitAbsoluteMach},
		{dischargeT, float64(res.Path.Discharge.Temperature)},
		{limits.FlowCoefficientLow(), c.FlowCoefficient},
		{limits.FlowCoefficientHigh(), c.FlowCoefficient},
		{limits.ExitWidthNarrow(), c.ExitWidthRatio},
		{limits.ExitWidthWide(), c.ExitWidthRatio},
		{limits.StagePressureRatio(build), float64(res.Path.Discharge.Pressure) / d.SuctionPressure},
		{limits.HeadCoefficientLow(), c.PolytropicHeadCoefficient},
		{limits.HeadCoefficientHigh(), c.PolytropicHeadCoefficient},
		{limits.RelativeVelocityRatio(), v.RelativeVelocityRatio},
		{limits.RelativeVelocityRatioHigh(), v.RelativeVelocityRatio},
		{limits.SpecificSpeedLow(), c.SpecificSpeed},
		{limits.SpecificSpeedHigh(), c.SpecificSpeed},
		{limits.EyeTipRatio(), c.InletTipRatio},
	}
	if !vaned {
		checks = append(checks, check{limits.DiffuserFlowAngle(), v.ExitFlowAngle})
	}
	// The driver margin is graded when the caller names the driver; the
	// default rating is the rule's own level by construction.
	if d.Driver != nil && (d.Driver.Rating != nil || d.Driver.Margin != nil) {
		checks = append(checks, check{limits.DriverMarginRule(), res.Power.DriverRating / res.Power.Shaft})
	}
	if build == limits.ClosedSteel {
		checks = append(checks, check{limits.ClosedImpellerHead(), float64(res.Path.PolytropicHead)})
	}
	return applyOverrides(checks, d.LimitOverrides)
}

// applyOverrides replaces the levels of the rules named in o (by rule ID).
// An ID that names no rule applied to this duty is a 400 naming the key.
func applyOverrides(checks []check, o map[string]LevelOverride) ([]check, error) {
	if len(o) == 0 {
		return checks, nil
	}
	ids := make([]string, 0, len(o))
	for id := range o {
		ids = append(ids, id)
	}
	sort.Strings(ids)
	for _, id := range ids {
		ov := o[id]
		field := "limit_overrides." + id
		found := false
		for i := range checks {
			if checks[i].rule.ID != id {
				continue
			}
			found = true
			limit := math.NaN()
			if ov.Limit != nil {
				limit = *ov.Limit
			}
			r, err := checks[i].rule.Override(ov.Warning, limit)
			if err != nil {
				return nil, fieldErr(field, reason(id, strings.TrimPrefix(err.Error(), "limits: "+id+": "), ov.Warning))
			}
			checks[i].rule = r
		}
		if !found {
			known := make([]string, 0, len(checks))
			for _, ch := range checks {
				known = append(known, ch.rule.ID)
			}
			return nil, shapeErr(field, fmt.Errorf("no limit rule %q applies to this duty; the rules applied are: %s", id, strings.Join(known, ", ")))
		}
	}
	return checks, nil
}

// assess grades the sized stage against the design limits, keeps every
// assessment and turns those near or past their levels into warnings; the
// verdict follows the worst severity of all warnings.
func (s *Service) assess(d StageDuty, res *StageResult) error {
	checks, err := s.ruleSet(d, res)
	if err != nil {
		return err
	}
	for _, ch := range checks {
		a, err := ch.rule.Check(ch.value)
		if err != nil {
			return fmt.Errorf("service: assess: %w", err)
		}
		res.Assessments = append(res.Assessments, a)
		if a.Severity == limits.OK {
			continue
		}
		res.Warnings = append(res.Warnings, Warning{Code: a.Rule.Code, Severity: string(a.Severity), Message: a.Message(),
			Value: a.Value, Limit: a.Level, Margin: a.Margin, Unit: a.Rule.Unit, Basis: a.Rule.Basis})
	}
	if hd := res.Path.HeadDifference; math.Abs(hd) > 0.005 {
		res.Warnings = append(res.Warnings, Warning{Code: "polytropic-methods-disagree", Severity: string(limits.Warning),
			Message: fmt.Sprintf("the Schultz (PTC 10) and stepwise polytropic heads differ by %.2f %%; the stepwise path is the reference for a real gas", 100*hd),
			Value:   math.Abs(hd), Limit: 0.005, Margin: (0.005 - math.Abs(hd)) / 0.005, Unit: "-",
			Basis: "Sandberg & Colby, Texas A&M Turbomachinery Symposium 2013 (PTC 10 head-factor error for non-ideal gases); threshold common practice, no source"})
	}
	res.Verdict = verdictOf(res.Warnings)
	return nil
}

// Verdicts, by the worst warning severity.
const (
	VerdictWithin  = "within-limits" // no warning at all
	VerdictNear    = "near-limits"   // notices only: inside every level but close to one
	VerdictWarning = "past-warning"  // at least one warning level passed
	VerdictLimit   = "past-limit"    // at least one limit of normal practice passed
)

func verdictOf(ws []Warning) string {
	worst := limits.OK
	for _, w := range ws {
		if sev := limits.Severity(w.Severity); sev.Rank() > worst.Rank() {
			worst = sev
		}
	}
	switch worst {
	case limits.Notice:
		return VerdictNear
	case limits.Warning:
		return VerdictWarning
	case limits.Limit:
		return VerdictLimit
	}
	return VerdictWithin
}
