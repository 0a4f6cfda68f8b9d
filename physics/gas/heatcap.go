package gas

import (
	"math"

	"stagewright/physics"
)

// CpForm names the functional form of an ideal-gas heat-capacity fit.
type CpForm string

// Forms of ideal-gas heat-capacity correlation in the catalogue.
const (
	// FormShomate is the NIST Chemistry WebBook Shomate equation,
	//	cp = A + B t + C t² + D t³ + E/t²,  t = T/(1000 K),  cp in J/(mol K),
	// with Coef = [A, B, C, D, E].
	FormShomate CpForm = "shomate"
	// FormPolyR is the fourth-order polynomial of Poling, Prausnitz &
	// O'Connell, The Properties of Gases and Liquids, 5th ed. (2001),
	// Appendix A, Section C:
	//	cp/R = a0 + a1 T + a2 T² + a3 T³ + a4 T⁴,  T in K,
	// with Coef = [a0, a1, a2, a3, a4] in SI (the book prints a1·10³,
	// a2·10⁵, a3·10⁸, a4·10¹¹). A monatomic gas is a0 = 5/2, the rest 0.
	FormPolyR CpForm = "poly-r"
)

// CpRange is one temperature range of an ideal-gas heat-capacity fit.
type CpRange struct {
	Form  CpForm
	TLow  physics.Kelvin
	THigh physics.Kelvin
	Coef  [5]float64
	// Source names the publication; coefficients recalled without a stored
	// copy say "from memory".
	Source string
}

// BlendTerm is one constituent of a pseudo-component whose ideal-gas cp is
// the mole-fraction-weighted sum of other catalogue components.
type BlendTerm struct {
	Component string // catalogue id of the constituent
	Fraction  float64
}

// HeatCapacity is the ideal-gas isobaric heat capacity of a component as a
// function of temperature: either contiguous Ranges in ascending
// temperature, or a Blend of other components (for the air
// pseudo-component).
type HeatCapacity struct {
	Ranges []CpRange
	Blend  []BlendTerm
}

// Extrapolation margins beyond the lowest and highest temperature of a
// component's correlation. Inside the margin a state is computed from the
// nearest range's formula and flagged CpExtrapolated; beyond it the models
// return a DomainError. The margins are common practice (no source): a
// smooth cp fit drifts by well under 1 % over 50 K below its lower limit and
// 200 K above its upper limit for the forms used here.
const (
	ExtrapolationBelow physics.Kelvin = 50
	ExtrapolationAbove physics.Kelvin = 200
)

// HandOverWidth is the width of the temperature band below each boundary
// between two ranges of a component's cp correlation over which the range
// below is blended into the range above (see HandOverMethod).
const HandOverWidth physics.Kelvin = 50

// HandOverMethod describes how cp is made continuous where one published
// correlation hands over to the next, for provenance and the catalogue.
const HandOverMethod = "cp hand-over between ranges: two published fits differ at their common boundary (CH4 -0.36 %, CO2 +0.29 %, H2 +0.22 %, CO +0.41 % at 298 K, water -0.44 % at 500 K); " +
	"the range below each boundary carries, over the 50 K below it (half the range if shorter), a cubic correction x²(α + βx) (x = T − (Tb − 50 K)) that brings its cp and dcp/dT to the values of the range above at Tb, " +
	"so cp and its slope are continuous and the range above is used as published; h and s° are the analytic integrals of the corrected cp (this project's construction)"

// cpPiece is a CpRange prepared for evaluation: the enthalpy and entropy
// integration constants make h and s° continuous at the range boundaries and
// zero at ReferenceTemperature; a piece followed by another carries the
// hand-over correction x²(α + βx), x = T − ta, over [ta, tTop].
type cpPiece struct {
	form       CpForm
	tLow, tTop float64
	c          [5]float64
	hOff, sOff float64 // J/mol and J/(mol K)
	// hand-over correction; ta = tTop when there is none
	ta          float64
	alpha, beta float64 // J/(mol K³), J/(mol K⁴)
}

// cpTerm is a weighted species inside a prepared mixture (a component or a
// constituent of a pseudo-component).
type cpTerm struct {
	weight float64
	pieces []cpPiece
}

// primitive returns cp (J/(mol K)) and the antiderivatives of cp and cp/T
// at T for one piece, without integration constants:
//
//	Shomate: H = 1000 (A t + B t²/2 + C t³/3 + D t⁴/4 − E/t),
//	         S = A ln t + B t + C t²/2 + D t³/3 − E/(2t²)
//	PolyR:   H/R = a0 T + a1 T²/2 + a2 T³/3 + a3 T⁴/4 + a4 T⁵/5,
//	         S/R = a0 ln T + a1 T + a2 T²/2 + a3 T³/3 + a4 T⁴/4
//
// Source: NIST Chemistry WebBook, Shomate equation notes (Chase 1998,
// NIST-JANAF 4th ed.); the polynomial integrals are elementary.
//
// Above ta the hand-over correction adds, with x = T − ta and L = ln(T/ta),
//
//	Δcp = x²(α + βx),  ∫Δcp dT = αx³/3 + βx⁴/4,
//	∫Δcp/T dT = α(x²/2 − ta x + ta² L) + β(x³/3 − ta x²/2 + ta² x − ta³ L)
//
// (elementary: x²/T = x − ta + ta²/T and x³/T = x² − ta x + ta² − ta³/T).
func (p *cpPiece) primitive(t float64) (cp, h, s float64) {
	l := tLogs{t: t}
	return p.primitiveLogs(&l)
}

// primitiveLogs is primitive with the logarithms of T shared (tLogs).
func (p *cpPiece) primitiveLogs(l *tLogs) (cp, h, s float64) {
	t := l.t
	cp, h, s = p.publishedLogs(l)
	if t > p.ta {
		x, ta := t-p.ta, p.ta
		l := math.Log1p(x / ta)
		cp += x * x * (p.alpha + p.beta*x)
		h += x * x * x * (p.alpha/3 + p.beta*x/4)
		s += p.alpha*(x*x/2-ta*x+ta*ta*l) + p.beta*(x*x*x/3-ta*x*x/2+ta*ta*x-ta*ta*ta*l)
	}
	return cp, h, s
}

// published returns cp and the antiderivatives of cp and cp/T of the
// piece's published correlation (no hand-over correction).
func (p *cpPiece) published(t float64) (cp, h, s float64) {
	l := tLogs{t: t}
	return p.publishedLogs(&l)
}

// publishedLogs is published with the logarithms of T shared (tLogs).
func (p *cpPiece) publishedLogs(l *tLogs) (cp, h, s float64) {
	c, t := &p.c, l.t
	if p.form == FormShomate {
		x := t / 1000
		x2 := x * x
		cp = c[0] + x*(c[1]+x*(c[2]+x*c[3])) + c[4]/x2
		h = 1000 * (x*(c[0]+x*(c[1]/2+x*(c[2]/3+x*c[3]/4))) - c[4]/x)
		s = c[0]*l.lnX() + x*(c[1]+x*(c[2]/2+x*c[3]/3)) - c[4]/(2*x2)
		return cp, h, s
	}
	const r = physics.UniversalGasConstant
	cp = r * (c[0] + t*(c[1]+t*(c[2]+t*(c[3]+t*c[4]))))
	h = r * t * (c[0] + t*(c[1]/2+t*(c[2]/3+t*(c[3]/4+t*c[4]/5))))
	s = r * (c[0]*l.lnT() + t*(c[1]+t*(c[2]/2+t*(c[3]/3+t*c[4]/4))))
	return cp, h, s
}

// tLogs holds ln T and ln(T/1000 K) of one temperature, each computed on
// first use, so that the components of a mixture share them: the
// logarithms were a fifth of the time of a real-gas map (one per
// component per state). The values are the ones each piece computed for
// itself before, bit for bit.
type tLogs struct {
	t            float64
	lt, lx       float64
	haveT, haveX bool
}

func (l *tLogs) lnT() float64 {
	if !l.haveT {
		l.lt, l.haveT = math.Log(l.t), true
	}
	return l.lt
}

func (l *tLogs) lnX() float64 {
	if !l.haveX {
		l.lx, l.haveX = math.Log(l.t/1000), true
	}
	return l.lx
}

// publishedSlope returns dcp/dT (J/(mol K²)) of the published correlation.
func (p *cpPiece) publishedSlope(t float64) float64 {
	c := &p.c
	if p.form == FormShomate {
		x := t / 1000
		return (c[1] + x*(2*c[2]+3*x*c[3]) - 2*c[4]/(x*x*x)) / 1000
	}
	return physics.UniversalGasConstant * (c[1] + t*(2*c[2]+t*(3*c[3]+4*t*c[4])))
}

// handOver sets the correction of piece lo, followed by piece hi at
// boundary tb, so that lo's cp and dcp/dT equal hi's at tb: over
// [ta, tb], ta = tb − w, w = min(HandOverWidth, half of lo's range),
//
//	Δcp = x²(α + βx),  α = (3J − J′w)/w²,  β = (J′w − 2J)/w³
//
// with J and J′ the steps of cp and dcp/dT at tb (Δ(ta) = Δ′(ta) = 0,
// Δ(tb) = J, Δ′(tb) = J′: a cubic Hermite segment).
func handOver(lo, hi *cpPiece) {
	tb := lo.tTop
	w := math.Min(float64(HandOverWidth), (lo.tTop-lo.tLow)/2)
	cpA, _, _ := lo.published(tb)
	cpB, _, _ := hi.published(tb)
	j, jp := cpB-cpA, hi.publishedSlope(tb)-lo.publishedSlope(tb)
	lo.ta = tb - w
	lo.alpha = (3*j - jp*w) / (w * w)
	lo.beta = (jp*w - 2*j) / (w * w * w)
}

// preparePieces turns contiguous ranges into pieces with the hand-over
// correction below every boundary (cp and dcp/dT continuous) and stitched
// integration constants so that h(Tref) = 0 and s°(Tref) = 0 and h, s° are
// continuous at every boundary.
func preparePieces(ranges []CpRange) []cpPiece {
	ps := make([]cpPiece, len(ranges))
	for i, r := range ranges {
		ps[i] = cpPiece{form: r.Form, tLow: float64(r.TLow), tTop: float64(r.THigh), c: r.Coef, ta: float64(r.THigh)}
	}
	for i := 1; i < len(ps); i++ {
		handOver(&ps[i-1], &ps[i])
	}
	tref := float64(ReferenceTemperature)
	k0 := len(ps) - 1
	for i := range ps {
		if tref <= ps[i].tTop {
			k0 = i
			break
		}
	}
	_, h0, s0 := ps[k0].primitive(tref)
	ps[k0].hOff, ps[k0].sOff = -h0, -s0
	for i := k0 + 1; i < len(ps); i++ {
		tb := ps[i].tLow
		_, hPrev, sPrev := ps[i-1].primitive(tb)
		_, hNext, sNext := ps[i].primitive(tb)
		ps[i].hOff = hPrev + ps[i-1].hOff - hNext
		ps[i].sOff = sPrev + ps[i-1].sOff - sNext
	}
	for i := k0 - 1; i >= 0; i-- {
		tb := ps[i].tTop
		_, hNext, sNext := ps[i+1].primitive(tb)
		_, hThis, sThis := ps[i].primitive(tb)
		ps[i].hOff = hNext + ps[i+1].hOff - hThis
		ps[i].sOff = sNext + ps[i+1].sOff - sThis
	}
	return ps
}

// evalPieces returns the ideal-gas cp, h and s° (J/mol, J/(mol K), at the
// reference pressure) at t; t outside all pieces uses the nearest one.
func evalPieces(ps []cpPiece, t float64) (cp, h, s float64) {
	l := tLogs{t: t}
	return evalPiecesLogs(ps, &l)
}

// evalPiecesLogs is evalPieces with the logarithms of T shared (tLogs).
func evalPiecesLogs(ps []cpPiece, l *tLogs) (cp, h, s float64) {
	t := l.t
	k := len(ps) - 1
	for i := range ps {
		if t <= ps[i].tTop {
			k = i
			break
		}
	}
	p := &ps[k]
	cp, h, s = p.primitiveLogs(l)
	return cp, h + p.hOff, s + p.sOff
}

// IdealGasProperties returns the ideal-gas molar heat capacity cp
// (J/(mol K)), enthalpy h (J/mol) and standard entropy s° (J/(mol K), at
// ReferencePressure) of a catalogue component at temperature t, with the
// reference state h = 0 and s° = 0 at 298.15 K, 101 325 Pa:
//
//	h(T) = ∫ cp dT from 298.15 K,  s°(T) = ∫ cp/T dT from 298.15 K
//
// The integrals are analytic per range and stitched to be continuous at
// range boundaries. The correlation of each component and its source are in
// Component.HeatCapacity. Valid from the lowest range limit minus
// ExtrapolationBelow to the highest limit plus ExtrapolationAbove; inside
// the margins the result is extrapolated and flagged with CpExtrapolated.
func IdealGasProperties(name string, t physics.Kelvin) (cp, h, s float64, v Validity, err error) {
	c, err := LookupComponent(name)
	if err != nil {
		return 0, 0, 0, 0, err
	}
	terms, lo, hi := componentTerms(c, 1)
	v, err = checkIdealRange(t, lo, hi)
	if err != nil {
		return 0, 0, 0, 0, err
	}
	for _, tm := range terms {
		cpk, hk, sk := evalPieces(tm.pieces, float64(t))
		cp += tm.weight * cpk
		h += tm.weight * hk
		s += tm.weight * sk
	}
	return cp, h, s, v, nil
}

// checkIdealRange checks t against the correlation limits [lo, hi] with
// the extrapolation margins.
func checkIdealRange(t physics.Kelvin, lo, hi float64) (Validity, error) {
	tt := float64(t)
	min, max := lo-float64(ExtrapolationBelow), hi+float64(ExtrapolationAbove)
	if min < 1 {
		min = 1
	}
	if !(tt >= min) || !(tt <= max) {
		return 0, &physics.DomainError{Name: "temperature", Value: tt, Want: "within the ideal-gas heat-capacity range",
			Reason: "temperature " + formatK(tt) + " is outside the range of the ideal-gas heat-capacity correlations of this gas (" +
				formatK(min) + " to " + formatK(max) + ")"}
	}
	if tt < lo || tt > hi {
		return CpExtrapolated, nil
	}
	return 0, nil
}
