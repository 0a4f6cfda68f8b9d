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
	"strconv"
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

// Severities, mildest first. The names are the warning severities of the
// API: a "notice" is inside the warning level but within NoticeMargin of it.
const (
	OK      Severity = "ok"      // inside the warning level with room to spare
	Notice  Severity = "notice"  // inside the warning level, within NoticeMargin of it
	Warning Severity = "warning" // past the soft (warning) level
	Limit   Severity = "limit"   // past the limit of normal practice
)

// NoticeMargin is the margin below which a value still inside its warning
// level is reported as a notice: within 5 % of the level (common practice,
// no source).
const NoticeMargin = 0.05

// Rank orders severities: OK 0, Notice 1, Warning 2, Limit 3.
func (s Severity) Rank() int {
	switch s {
	case Notice:
		return 1
	case Warning:
		return 2
	case Limit:
		return 3
	}
	return 0
}

// Rule is one design limit.
type Rule struct {
	// ID names the rule, e.g. "flow-coefficient-low"; it keys per-request
	// overrides. For a one-sided quantity it equals Code.
	ID string
	// Code is the warning code other systems key on, e.g. "flow-coefficient"
	// (shared by the low and high rules of a two-sided quantity).
	Code     string
	Quantity string  // what is measured, e.g. "impeller tip speed"
	Unit     string  // unit of the value and levels, e.g. "m/s"
	Sense    Sense   // Above or Below
	Warning  float64 // soft level
	Limit    float64 // level of normal practice; NaN when the source gives none
	Basis    string  // where the numbers come from ("common practice, no source", a standard, ...)
}

// Assessment is a rule applied to a value.
type Assessment struct {
	Rule     Rule
	Value    float64
	Severity Severity
	// Level is the level that decides the severity: the hard limit when it
	// is passed, the warning level otherwise.
	Level float64
	// Margin is the distance to the warning level as a fraction of it,
	// positive inside and negative past it:
	// (warning − value)/|warning| for Above, (value − warning)/|warning| for Below.
	Margin float64
}

// Check applies rule r to value v and grades it (OK, Notice, Warning or
// Limit) with the margin to the warning level:
//
//	Above: margin = (warning − v)/|warning|,  Below: margin = (v − warning)/|warning|
//
// (margin 0 when the warning level is 0). Definition; the levels' sources
// are in r.Basis. A non-finite value or warning level (or a ±Inf limit)
// yields an error: the caller must not have produced one.
func (r Rule) Check(v float64) (Assessment, error) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Assessment{}, fmt.Errorf("limits: %s: value %g is not finite", r.ID, v)
	}
	if math.IsNaN(r.Warning) || math.IsInf(r.Warning, 0) || math.IsInf(r.Limit, 0) {
		return Assessment{}, fmt.Errorf("limits: %s: warning level %g and limit %g must be finite (the limit may be NaN: none)", r.ID, r.Warning, r.Limit)
	}
	a := Assessment{Rule: r, Value: v, Severity: OK, Level: r.Warning}
	past := func(level float64) bool {
		if math.IsNaN(level) {
			return false
		}
		if r.Sense == Below {
			return v < level
		}
		return v > level
	}
	if r.Warning != 0 {
		if r.Sense == Below {
			a.Margin = (v - r.Warning) / math.Abs(r.Warning)
		} else {
			a.Margin = (r.Warning - v) / math.Abs(r.Warning)
		}
	}
	switch {
	case past(r.Limit):
		a.Severity, a.Level = Limit, r.Limit
	case past(r.Warning):
		a.Severity = Warning
	case a.Margin < NoticeMargin:
		a.Severity = Notice
	}
	return a, nil
}

// Override replaces a rule's levels with a caller's, after checking that
// they are finite and ordered (for Above, warning <= limit; for Below,
// warning >= limit). A NaN limit keeps "no hard limit".
func (r Rule) Override(warning, limit float64) (Rule, error) {
	if math.IsNaN(warning) || math.IsInf(warning, 0) || math.IsInf(limit, 0) {
		return r, fmt.Errorf("limits: %s: the warning level and limit must be finite numbers", r.ID)
	}
	if !math.IsNaN(limit) && ((r.Sense == Above && limit < warning) || (r.Sense == Below && limit > warning)) {
		if r.Sense == Above {
			return r, fmt.Errorf("limits: %s: the limit (%g) must not be below the warning level (%g): the quantity is a concern when it rises", r.ID, limit, warning)
		}
		return r, fmt.Errorf("limits: %s: the limit (%g) must not be above the warning level (%g): the quantity is a concern when it falls", r.ID, limit, warning)
	}
	r.Warning, r.Limit = warning, limit
	r.Basis = "caller override (replaces: " + r.Basis + ")"
	return r, nil
}

// Message is a sentence for an engineer, e.g. "impeller tip speed 372 m/s
// exceeds the limit of 350 m/s".
func (a Assessment) Message() string {
	verb, level := "exceeds", "warning level"
	if a.Rule.Sense == Below {
		verb = "is below"
	}
	if a.Severity == Limit {
		level = "limit"
	}
	unit := ""
	if a.Rule.Unit != "" && a.Rule.Unit != "-" {
		unit = " " + a.Rule.Unit
	}
	switch a.Severity {
	case OK:
		return a.Rule.Quantity + " " + num(a.Value) + unit + " is within the warning level of " + num(a.Rule.Warning) + unit
	case Notice:
		return a.Rule.Quantity + " " + num(a.Value) + unit + " is within " + strconv.FormatFloat(100*NoticeMargin, 'f', 0, 64) +
			" % of the warning level of " + num(a.Rule.Warning) + unit
	}
	return a.Rule.Quantity + " " + num(a.Value) + unit + " " + verb + " the " + level + " of " + num(a.Level) + unit
}

func num(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }
