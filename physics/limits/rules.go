package limits

import (
	"fmt"
	"math"
)

const (
	commonPractice = "common practice, no source (testdata/reference/rules-of-thumb.md)"
)

// Construction is the impeller's build, which sets its tip-speed limit.
type Construction string

// Impeller constructions.
const (
	ClosedSteel    Construction = "closed-steel"
	OpenSteel      Construction = "open-steel"
	OpenAluminium  Construction = "open-aluminium"
	OpenTitanium   Construction = "open-titanium"
	DefaultBuild                = ClosedSteel
	vanelessSource              = "from memory: Senoo's vaneless-diffuser stall criteria give critical inflow angles of roughly 70-80 deg depending on width ratio (testdata/reference/rules-of-thumb.md §3)"
)

// Constructions lists the accepted impeller constructions.
func Constructions() []Construction {
	return []Construction{ClosedSteel, OpenSteel, OpenAluminium, OpenTitanium}
}

// TipSpeed returns the tip-speed rule for an impeller construction
// (rules-of-thumb.md §1: closed steel 300/350, open steel 420/500, open
// aluminium 450/500, open titanium 500/600 m/s; common practice, no source).
func TipSpeed(c Construction) (Rule, error) {
	lim := map[Construction][2]float64{
		ClosedSteel: {300, 350}, OpenSteel: {420, 500}, OpenAluminium: {450, 500}, OpenTitanium: {500, 600},
	}
	l, ok := lim[c]
	if !ok {
		return Rule{}, fmt.Errorf("limits: unknown impeller construction %q", c)
	}
	return Rule{Code: "tip-speed-high", Quantity: "impeller tip speed (" + string(c) + ")", Unit: "m/s", Sense: Above,
		Caution: l[0], Critical: l[1], Source: commonPractice + "; stress scales with U2² and falls with temperature"}, nil
}

// InducerRelativeMach is the inducer shroud (eye tip) relative Mach number
// rule: caution above 0.85, critical above 0.95 (rules-of-thumb.md §2,
// common practice, no source; design target 0.8-0.9).
func InducerRelativeMach() Rule {
	return Rule{Code: "inducer-mach-high", Quantity: "inlet relative Mach number at the blade tip", Unit: "-", Sense: Above,
		Caution: 0.85, Critical: 0.95, Source: commonPractice + "; shock losses grow above 0.9, transonic above 1"}
}

// MachineMach is the rule on U2/a01: caution above 0.9, critical above 1.1
// (rules-of-thumb.md §2, common practice, no source).
func MachineMach() Rule {
	return Rule{Code: "machine-mach-high", Quantity: "machine Mach number U2/a01", Unit: "-", Sense: Above,
		Caution: 0.9, Critical: 1.1, Source: commonPractice}
}

// DiffuserInletMach is the rule on the absolute Mach number at impeller
// exit: vaneless 1.0/1.2, vaned 0.85/1.0 (rules-of-thumb.md §3, common
// practice, no source).
func DiffuserInletMach(vaned bool) Rule {
	r := Rule{Code: "diffuser-inlet-mach-high", Quantity: "absolute Mach number at diffuser inlet (vaneless)", Unit: "-", Sense: Above,
		Caution: 1.0, Critical: 1.2, Source: commonPractice}
	if vaned {
		r.Quantity, r.Caution, r.Critical = "absolute Mach number at diffuser inlet (vaned)", 0.85, 1.0
	}
	return r
}

// DiffuserFlowAngle is the vaneless-diffuser inflow angle rule (from
// radial): caution above 70 deg, critical above 75 deg, a rotating-stall and
// surge risk (rules-of-thumb.md §3, from memory, Senoo).
func DiffuserFlowAngle() Rule {
	return Rule{Code: "diffuser-stall-risk", Quantity: "impeller exit flow angle from radial", Unit: "deg", Sense: Above,
		Caution: 70, Critical: 75, Source: vanelessSource}
}

// Service is the gas service, which sets the discharge-temperature limit.
type Service string

// Gas services.
const (
	ServiceProcess   Service = "process"
	ServiceAir       Service = "air"
	ServiceFouling   Service = "fouling"
	DefaultService           = ServiceProcess
	celsiusOffset            = 273.15
	dischargeTSource         = commonPractice + " (seal and material limits)"
)

// Services lists the accepted gas services.
func Services() []Service { return []Service{ServiceProcess, ServiceAir, ServiceFouling} }

// DischargeTemperature returns the discharge temperature rule in K for a
// service (rules-of-thumb.md §4): process 175/215 degC (critical is the
// middle of the 200-230 degC band), air per stage 200/230 degC, polymerising
// or fouling gases 100/120 degC; common practice, no source.
func DischargeTemperature(s Service) (Rule, error) {
	lim := map[Service][2]float64{ServiceProcess: {175, 215}, ServiceAir: {200, 230}, ServiceFouling: {100, 120}}
	l, ok := lim[s]
	if !ok {
		return Rule{}, fmt.Errorf("limits: unknown gas service %q", s)
	}
	return Rule{Code: "discharge-temperature-high", Quantity: "discharge temperature (" + string(s) + " service)", Unit: "K", Sense: Above,
		Caution: l[0] + celsiusOffset, Critical: l[1] + celsiusOffset, Source: dischargeTSource}, nil
}

// FlowCoefficientLow is the narrow-stage rule: φ = Q01/(U2 π D2²/4) below
// 0.01 means a very narrow impeller whose efficiency falls steeply
// (rules-of-thumb.md §5, common practice, no source); no critical level.
func FlowCoefficientLow() Rule {
	return Rule{Code: "flow-coefficient-low", Quantity: "flow coefficient Q01/(U2 π D2²/4)", Unit: "-", Sense: Below,
		Caution: 0.01, Critical: math.NaN(), Source: commonPractice}
}

// FlowCoefficientHigh is the wide-stage rule: φ above 0.15 means a large inducer Mach number and
// hub-tip ratio (rules-of-thumb.md §5, common practice, no source).
func FlowCoefficientHigh() Rule {
	return Rule{Code: "flow-coefficient-high", Quantity: "flow coefficient Q01/(U2 π D2²/4)", Unit: "-", Sense: Above,
		Caution: 0.15, Critical: math.NaN(), Source: commonPractice}
}

// ExitWidthNarrow is the narrow-exit rule: b2/D2 caution below 0.015, critical below 0.01
// (rules-of-thumb.md §7, common practice, no source).
func ExitWidthNarrow() Rule {
	return Rule{Code: "exit-width-narrow", Quantity: "exit width ratio b2/D2", Unit: "-", Sense: Below,
		Caution: 0.015, Critical: 0.01, Source: commonPractice + "; friction and leakage losses rise in narrow passages"}
}

// ExitWidthWide is the wide-exit rule: b2/D2 caution above 0.08, critical above 0.10
// (rules-of-thumb.md §7, common practice, no source).
func ExitWidthWide() Rule {
	return Rule{Code: "exit-width-wide", Quantity: "exit width ratio b2/D2", Unit: "-", Sense: Above,
		Caution: 0.08, Critical: 0.10, Source: commonPractice}
}

// HeadCoefficientLow is the lower polytropic head coefficient rule;
// together with HeadCoefficientHigh it bounds the polytropic head
// coefficient μp = Hp/U2²: typical 0.45-0.60, caution outside 0.35-0.70
// (rules-of-thumb.md §6, common practice, no source).
func HeadCoefficientLow() Rule {
	return Rule{Code: "head-coefficient-low", Quantity: "polytropic head coefficient Hp/U2²", Unit: "-", Sense: Below,
		Caution: 0.35, Critical: math.NaN(), Source: commonPractice}
}

// HeadCoefficientHigh is the upper polytropic head coefficient rule:
// caution above 0.70 (see HeadCoefficientLow; common practice, no source).
func HeadCoefficientHigh() Rule {
	return Rule{Code: "head-coefficient-high", Quantity: "polytropic head coefficient Hp/U2²", Unit: "-", Sense: Above,
		Caution: 0.70, Critical: math.NaN(), Source: commonPractice}
}

// ClosedImpellerHead is the rule on the polytropic head per closed impeller, caution above
// 40 kJ/kg (rules-of-thumb.md §8 gives 35-40 kJ/kg; common practice, no
// source). Applies to closed impellers only.
func ClosedImpellerHead() Rule {
	return Rule{Code: "impeller-head-high", Quantity: "polytropic head of one closed impeller", Unit: "J/kg", Sense: Above,
		Caution: 40e3, Critical: math.NaN(), Source: commonPractice}
}

// RelativeVelocityRatio is the impeller diffusion rule: W2/W1 below 0.7 means too much diffusion in the
// impeller (rules-of-thumb.md §8, a de Haller-type limit carried over from
// axial practice; common practice, no source).
func RelativeVelocityRatio() Rule {
	return Rule{Code: "impeller-diffusion-high", Quantity: "relative velocity ratio W2/W1 (shroud)", Unit: "-", Sense: Below,
		Caution: 0.7, Critical: math.NaN(), Source: commonPractice}
}

// SpecificSpeedLow is the lower specific-speed rule; with
// SpecificSpeedHigh it bounds Ns = Ω √Q01/Δh_s^0.75, best near
// 0.6-0.8, caution outside 0.4-1.0, critical outside 0.3-1.2
// (rules-of-thumb.md §9, from memory: Balje-type charts in Dixon & Hall).
func SpecificSpeedLow() Rule {
	return Rule{Code: "specific-speed-low", Quantity: "specific speed Ω√Q01/Δh_s^0.75", Unit: "-", Sense: Below,
		Caution: 0.4, Critical: 0.3, Source: "from memory: Balje-type efficiency charts as reproduced in Dixon & Hall (2014)"}
}

// SpecificSpeedHigh is the upper specific-speed rule: caution above 1.0,
// critical above 1.2 (see SpecificSpeedLow; from memory).
func SpecificSpeedHigh() Rule {
	return Rule{Code: "specific-speed-high", Quantity: "specific speed Ω√Q01/Δh_s^0.75", Unit: "-", Sense: Above,
		Caution: 1.0, Critical: 1.2, Source: "from memory: Balje-type efficiency charts as reproduced in Dixon & Hall (2014)"}
}

// EyeTipRatio is the eye-size rule: an eye tip diameter above 0.7 D2 leaves little radial
// passage for the work and raises the inducer Mach number (common practice,
// no source); critical at 0.85.
func EyeTipRatio() Rule {
	return Rule{Code: "eye-diameter-large", Quantity: "inlet diameter ratio D1/D2", Unit: "-", Sense: Above,
		Caution: 0.7, Critical: 0.85, Source: commonPractice}
}

// DriverMargin is the rating margin applied to the greatest shaft power
// for a motor driver: at least 110 % (rules-of-thumb.md §10, from memory:
// API 617 driver clause / API 541).
const DriverMargin = 1.10

// DriverMarginSource names the source of DriverMargin.
const DriverMarginSource = "from memory: API 617 driver clause / API 541 (motor rated at least 110 % of the greatest power required)"
