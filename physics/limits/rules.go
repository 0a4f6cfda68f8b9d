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
	return Rule{ID: "tip-speed", Code: "tip-speed", Quantity: "impeller tip speed (" + string(c) + ")", Unit: "m/s", Sense: Above,
		Warning: l[0], Limit: l[1], Basis: commonPractice + "; stress scales with U2² and falls with temperature"}, nil
}

// InducerRelativeMach is the inducer shroud (eye tip) relative Mach number
// rule: warning above 0.85, limit above 0.95 (rules-of-thumb.md §2,
// common practice, no source; design target 0.8-0.9).
func InducerRelativeMach() Rule {
	return Rule{ID: "inducer-mach", Code: "inducer-mach", Quantity: "inlet relative Mach number at the blade tip", Unit: "-", Sense: Above,
		Warning: 0.85, Limit: 0.95, Basis: commonPractice + "; shock losses grow above 0.9, transonic above 1"}
}

// MachineMach is the rule on U2/a01: warning above 0.9, limit above 1.1
// (rules-of-thumb.md §2, common practice, no source).
func MachineMach() Rule {
	return Rule{ID: "machine-mach", Code: "machine-mach", Quantity: "machine Mach number U2/a01", Unit: "-", Sense: Above,
		Warning: 0.9, Limit: 1.1, Basis: commonPractice}
}

// DiffuserInletMach is the rule on the absolute Mach number at impeller
// exit: vaneless 1.0/1.2, vaned 0.85/1.0 (rules-of-thumb.md §3, common
// practice, no source).
func DiffuserInletMach(vaned bool) Rule {
	r := Rule{ID: "diffuser-inlet-mach", Code: "diffuser-inlet-mach", Quantity: "absolute Mach number at diffuser inlet (vaneless)", Unit: "-", Sense: Above,
		Warning: 1.0, Limit: 1.2, Basis: commonPractice}
	if vaned {
		r.Quantity, r.Warning, r.Limit = "absolute Mach number at diffuser inlet (vaned)", 0.85, 1.0
	}
	return r
}

// DiffuserFlowAngle is the vaneless-diffuser inflow angle rule (from
// radial): warning above 70 deg, limit above 75 deg, a rotating-stall and
// surge risk (rules-of-thumb.md §3, from memory, Senoo).
func DiffuserFlowAngle() Rule {
	return Rule{ID: "diffuser-inlet-angle", Code: "diffuser-inlet-angle", Quantity: "impeller exit flow angle from radial", Unit: "deg", Sense: Above,
		Warning: 70, Limit: 75, Basis: vanelessSource}
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
	return Rule{ID: "discharge-temperature", Code: "discharge-temperature", Quantity: "discharge temperature (" + string(s) + " service)", Unit: "K", Sense: Above,
		Warning: l[0] + celsiusOffset, Limit: l[1] + celsiusOffset, Basis: dischargeTSource}, nil
}

// FlowCoefficientLow is the narrow-stage rule: φ = Q01/(U2 π D2²/4) below
// 0.01 means a very narrow impeller whose efficiency falls steeply
// (rules-of-thumb.md §5, common practice, no source); no critical level.
func FlowCoefficientLow() Rule {
	return Rule{ID: "flow-coefficient-low", Code: "flow-coefficient", Quantity: "flow coefficient Q01/(U2 π D2²/4)", Unit: "-", Sense: Below,
		Warning: 0.01, Limit: math.NaN(), Basis: commonPractice}
}

// FlowCoefficientHigh is the wide-stage rule: φ above 0.15 means a large inducer Mach number and
// hub-tip ratio (rules-of-thumb.md §5, common practice, no source).
func FlowCoefficientHigh() Rule {
	return Rule{ID: "flow-coefficient-high", Code: "flow-coefficient", Quantity: "flow coefficient Q01/(U2 π D2²/4)", Unit: "-", Sense: Above,
		Warning: 0.15, Limit: math.NaN(), Basis: commonPractice}
}

// ExitWidthNarrow is the narrow-exit rule: b2/D2 warning below 0.015, limit below 0.01
// (rules-of-thumb.md §7, common practice, no source).
func ExitWidthNarrow() Rule {
	return Rule{ID: "exit-width-ratio-low", Code: "exit-width-ratio", Quantity: "exit width ratio b2/D2", Unit: "-", Sense: Below,
		Warning: 0.015, Limit: 0.01, Basis: commonPractice + "; friction and leakage losses rise in narrow passages"}
}

// ExitWidthWide is the wide-exit rule: b2/D2 warning above 0.08, limit above 0.10
// (rules-of-thumb.md §7, common practice, no source).
func ExitWidthWide() Rule {
	return Rule{ID: "exit-width-ratio-high", Code: "exit-width-ratio", Quantity: "exit width ratio b2/D2", Unit: "-", Sense: Above,
		Warning: 0.08, Limit: 0.10, Basis: commonPractice}
}

// HeadCoefficientLow is the lower polytropic head coefficient rule;
// together with HeadCoefficientHigh it bounds the polytropic head
// coefficient μp = Hp/U2²: typical 0.45-0.60, caution outside 0.35-0.70
// (rules-of-thumb.md §6, common practice, no source).
func HeadCoefficientLow() Rule {
	return Rule{ID: "head-coefficient-low", Code: "head-coefficient", Quantity: "polytropic head coefficient Hp/U2²", Unit: "-", Sense: Below,
		Warning: 0.35, Limit: math.NaN(), Basis: commonPractice}
}

// HeadCoefficientHigh is the upper polytropic head coefficient rule:
// warning above 0.70 (see HeadCoefficientLow; common practice, no source).
func HeadCoefficientHigh() Rule {
	return Rule{ID: "head-coefficient-high", Code: "head-coefficient", Quantity: "polytropic head coefficient Hp/U2²", Unit: "-", Sense: Above,
		Warning: 0.70, Limit: math.NaN(), Basis: commonPractice}
}

// ClosedImpellerHead is the rule on the polytropic head per closed impeller, warning above
// 40 kJ/kg (rules-of-thumb.md §8 gives 35-40 kJ/kg; common practice, no
// source). Applies to closed impellers only.
func ClosedImpellerHead() Rule {
	return Rule{ID: "impeller-head", Code: "impeller-head", Quantity: "polytropic head of one closed impeller", Unit: "J/kg", Sense: Above,
		Warning: 40e3, Limit: math.NaN(), Basis: commonPractice}
}

// RelativeVelocityRatio is the impeller diffusion rule (the low side of
// W2/W1): W2/W1 below 0.7 means too much diffusion in the impeller
// (rules-of-thumb.md §8, a de Haller-type limit carried over from axial
// practice; common practice, no source). Its ID, "relative-velocity-ratio",
// predates the high rule and is kept: it is the key of limit_overrides.
func RelativeVelocityRatio() Rule {
	return Rule{ID: "relative-velocity-ratio", Code: "relative-velocity-ratio", Quantity: "relative velocity ratio W2/W1 (shroud)", Unit: "-", Sense: Below,
		Warning: 0.7, Limit: math.NaN(), Basis: commonPractice}
}

// RelativeVelocityRatioHigh is the impeller acceleration rule (the high
// side of W2/W1, same code as RelativeVelocityRatio, ID
// "relative-velocity-ratio-high"): an impeller passage is a diffuser, so a
// relative velocity at the tip above that at the eye shroud (W2/W1 > 1)
// means the relative flow accelerates through the impeller: the exit is too
// narrow or the exit meridional velocity too high for the eye, and the
// impeller recovers none of its relative kinetic energy. Warning above 1.0
// (no diffusion at all), limit above 1.2. Common practice, no source; the
// usual design range of the diffusion ratio W1t/W2 is about 1.2-1.9
// (W2/W1 0.5-0.85), from memory (Dixon & Hall 2014, centrifugal chapter).
func RelativeVelocityRatioHigh() Rule {
	return Rule{ID: "relative-velocity-ratio-high", Code: "relative-velocity-ratio", Quantity: "relative velocity ratio W2/W1 (shroud)", Unit: "-", Sense: Above,
		Warning: 1.0, Limit: 1.2, Basis: commonPractice + "; W2/W1 above 1 means the relative flow accelerates through the impeller (no diffusion): the exit is too narrow or its meridional velocity too high for the eye; a usual design diffusion ratio W1t/W2 is 1.2-1.9, from memory (Dixon & Hall 2014)"}
}

// SpecificSpeedLow is the lower specific-speed rule; with
// SpecificSpeedHigh it bounds Ns = Ω √Q01/Δh_s^0.75, best near
// 0.6-0.8, caution outside 0.4-1.0, critical outside 0.3-1.2
// (rules-of-thumb.md §9, from memory: Balje-type charts in Dixon & Hall).
func SpecificSpeedLow() Rule {
	return Rule{ID: "specific-speed-low", Code: "specific-speed", Quantity: "specific speed Ω√Q01/Δh_s^0.75", Unit: "-", Sense: Below,
		Warning: 0.4, Limit: 0.3, Basis: "from memory: Balje-type efficiency charts as reproduced in Dixon & Hall (2014)"}
}

// SpecificSpeedHigh is the upper specific-speed rule: warning above 1.0,
// limit above 1.2 (see SpecificSpeedLow; from memory).
func SpecificSpeedHigh() Rule {
	return Rule{ID: "specific-speed-high", Code: "specific-speed", Quantity: "specific speed Ω√Q01/Δh_s^0.75", Unit: "-", Sense: Above,
		Warning: 1.0, Limit: 1.2, Basis: "from memory: Balje-type efficiency charts as reproduced in Dixon & Hall (2014)"}
}

// EyeTipRatio is the eye-size rule: an eye tip diameter above 0.7 D2 leaves little radial
// passage for the work and raises the inducer Mach number (common practice,
// no source); critical at 0.85.
func EyeTipRatio() Rule {
	return Rule{ID: "eye-diameter-ratio", Code: "eye-diameter-ratio", Quantity: "inlet diameter ratio D1/D2", Unit: "-", Sense: Above,
		Warning: 0.7, Limit: 0.85, Basis: commonPractice}
}

// DriverMargin is the rating margin applied to the greatest shaft power
// for a motor driver: at least 110 % (rules-of-thumb.md §10, from memory:
// API 617 driver clause / API 541).
const DriverMargin = 1.10

// DriverMarginSource names the source of DriverMargin.
const DriverMarginSource = "from memory: API 617 driver clause / API 541 (motor rated at least 110 % of the greatest power required)"

// DriverMarginRule is the rule on driver rating over shaft power: a warning
// below 1.10 (DriverMargin; from memory, API 617 / API 541), a limit below
// 1.0, where the driver cannot deliver the shaft power at all (definition).
func DriverMarginRule() Rule {
	return Rule{ID: "driver-margin", Code: "driver-margin", Quantity: "driver rating over shaft power", Unit: "-", Sense: Below,
		Warning: DriverMargin, Limit: 1.0, Basis: DriverMarginSource + "; below 1 the driver is overloaded (definition)"}
}

// StagePressureRatio is the rule on the total pressure ratio of one stage.
// A closed (shrouded) process impeller typically makes 1.3-2.0 on an
// air-like gas: warning above 2.0, no hard limit given (rules-of-thumb.md
// §8, common practice, no source). A single open impeller on air reaches
// 4-5: warning above 4, limit above 5 (rules-of-thumb.md §8, common
// practice, no source; the textbook stages of stage-examples.md give
// 4.2-5.2).
func StagePressureRatio(c Construction) Rule {
	r := Rule{ID: "stage-pressure-ratio", Code: "stage-pressure-ratio", Quantity: "stage total pressure ratio (open impeller)", Unit: "-", Sense: Above,
		Warning: 4, Limit: 5, Basis: commonPractice + " (single open impellers on air reach 4-5)"}
	if c == ClosedSteel {
		r.Quantity, r.Warning, r.Limit = "stage total pressure ratio (closed impeller)", 2.0, math.NaN()
		r.Basis = commonPractice + " (closed process impellers typically 1.3-2.0 per stage)"
	}
	return r
}
