// Package limits holds the design limits a sized stage is checked against,
// each with its two levels (caution: a soft limit; critical: outside normal
// practice), the source of its numbers, and the check that turns a value
// into an assessment with its margin.
//
// Most trade limits have no published source; the rules say so ("common
// practice, no source") or name the standard they are recalled from ("from
// memory"). The numbers are those of the project's reference pack,
// testdata/reference/rules-of-thumb.md.
package limits

import (
	"fmt"
	"math"
)

// Sense says on which side of its limit a value becomes a concern.
type Sense int

// Senses of a rule.
const (
	Above Sense = iota + 1 // concern when the value exceeds the limit
	Below                  // concern when the value falls under the limit
)

// Severity grades an assessment.
type Severity string

// Severities, mildest first.
const (
	Within   Severity = "within"   // inside the caution limit
	Caution  Severity = "caution"  // past the soft limit
	Critical Severity = "critical" // past the limit of normal practice
)

// Rule is one design limit.
type Rule struct {
	Code     string  // our own name, kebab-case, e.g. "tip-speed-high"
	Quantity string  // what is measured, e.g. "impeller tip speed"
	Unit     string  // unit of the value and limits, e.g. "m/s"
	Sense    Sense   // Above or Below
	Caution  float64 // soft limit
	Critical float64 // hard limit of normal practice; NaN when the source gives none
	Source   string  // where the numbers come from
}

// Assessment is a rule applied to a value.
type Assessment struct {
	Rule     Rule
	Value    float64
	Severity Severity
	// Limit is the limit that decides the severity: the critical limit when
	// it is exceeded, the caution limit otherwise.
	Limit float64
	// Margin is the distance to the caution limit as a fraction of it,
	// positive inside the limit and negative past it:
	// (limit − value)/limit for Above, (value − limit)/limit for Below.
	Margin float64
}

// Check applies rule r to value v and grades it (Within, Caution or
// Critical) with the margin to the caution limit:
//
//	Above: margin = (caution − v)/|caution|,  Below: margin = (v − caution)/|caution|
//
// (margin 0 when caution is 0). Definition; the limits' sources are in
// r.Source. A non-finite value or a non-finite caution limit (or ±Inf
// critical limit) yields an error: the caller must not have produced one.
func (r Rule) Check(v float64) (Assessment, error) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Assessment{}, fmt.Errorf("limits: %s: value %g is not finite", r.Code, v)
	}
	// A rule built by hand may carry a bad caution limit; the critical
	// limit may be NaN (none) but never ±Inf.
	if math.IsNaN(r.Caution) || math.IsInf(r.Caution, 0) || math.IsInf(r.Critical, 0) {
		return Assessment{}, fmt.Errorf("limits: %s: caution limit %g and critical limit %g must be finite (critical may be NaN: none)", r.Code, r.Caution, r.Critical)
	}
	a := Assessment{Rule: r, Value: v, Severity: Within, Limit: r.Caution}
	past := func(limit float64) bool {
		if math.IsNaN(limit) {
			return false
		}
		if r.Sense == Below {
			return v < limit
		}
		return v > limit
	}
	switch {
	case past(r.Critical):
		a.Severity, a.Limit = Critical, r.Critical
	case past(r.Caution):
		a.Severity = Caution
	}
	if r.Caution != 0 {
		if r.Sense == Below {
			a.Margin = (v - r.Caution) / math.Abs(r.Caution)
		} else {
			a.Margin = (r.Caution - v) / math.Abs(r.Caution)
		}
	}
	return a, nil
}

// Message is a sentence for an engineer, e.g. "impeller tip speed 372 m/s
// exceeds the critical limit of 350 m/s".
func (a Assessment) Message() string {
	verb, level := "exceeds", "caution"
	if a.Rule.Sense == Below {
		verb = "is below"
	}
	if a.Severity == Critical {
		level = "critical"
	}
	unit := ""
	if a.Rule.Unit != "" && a.Rule.Unit != "-" {
		unit = " " + a.Rule.Unit
	}
	if a.Severity == Within {
		return fmt.Sprintf("%s %s%s is within the caution limit of %s%s", a.Rule.Quantity, num(a.Value), unit, num(a.Rule.Caution), unit)
	}
	return fmt.Sprintf("%s %s%s %s the %s limit of %s%s", a.Rule.Quantity, num(a.Value), unit, verb, level, num(a.Limit), unit)
}

func num(v float64) string { return fmt.Sprintf("%.4g", v) }
