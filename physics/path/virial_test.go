package path_test

import (
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// virialGas is a test-only real-gas model: the volume-explicit virial
// equation truncated after the second coefficient,
//
//	v = R T/p + B(T)   (molar),   Z = 1 + B p/(R T),
//
// with B(T) from the Tsonopoulos (1974) correlation for non-polar gases,
//
//	B Pc/(R Tc) = f0(Tr) + ω f1(Tr)
//	f0 = 0.1445 − 0.330/Tr − 0.1385/Tr² − 0.0121/Tr³ − 0.000607/Tr⁸
//	f1 = 0.0637 + 0.331/Tr² − 0.423/Tr³ − 0.008/Tr⁸
//
// (C. Tsonopoulos, AIChE J. 20(2):263-272 (1974); coefficients from
// memory), and the ideal-gas heat capacity of the NIST Shomate equation.
// The residual properties follow from the volume equation exactly
// (Çengel & Boles, Thermodynamics: An Engineering Approach, 6th ed. (2008),
// ch. 12, departure functions at constant T from p = 0):
//
//	h − h° = p (B − T B'),   s − s° = −p B',   cp − cp° = −p T B''
//	cv = cp − (R + p B')²/R,   X = (T B' − B)/v,   Y = R T/(p v) = 1/Z
//
// It is valid where the second virial coefficient dominates (densities
// well below half the critical density); here it only has to be a
// thermodynamically consistent non-ideal gas.
type virialGas struct {
	name                 string
	molarMass            float64 // kg/mol
	tc, pc, omega        float64
	a, b, c, d, e, f, hh float64 // Shomate A..E, F, H (kJ/mol units as NIST gives them)
	g                    float64 // Shomate G
	tMin, tMax           float64
}

// co2Virial: CO2 with M, Tc, Pc, ω of the reference pack
// (critical-constants.csv: Span & Wagner 1996) and the NIST WebBook Shomate
// row 298-1200 K (shomate.csv, Chase 1998); used here from 250 K (a small
// extrapolation of the Shomate fit) to 1200 K.
func co2Virial() virialGas {
	return virialGas{
		name: "test-virial-co2", molarMass: 44.0098e-3,
		tc: 304.1282, pc: 7.3773e6, omega: 0.22394,
		a: 24.99735, b: 55.18696, c: -33.69137, d: 7.948387, e: -0.136638,
		f: -403.6075, g: 228.2431, hh: -393.5224,
		tMin: 250, tMax: 1200,
	}
}

const ru = physics.UniversalGasConstant

// second returns B, dB/dT, d²B/dT² in m³/mol, m³/(mol K), m³/(mol K²).
func (m virialGas) second(t float64) (b, b1, b2 float64) {
	tr := t / m.tc
	k := ru * m.tc / m.pc
	i := 1 / tr
	i2, i3 := i*i, i*i*i
	i4, i5 := i2*i2, i2*i3
	i8 := i4 * i4
	f0 := 0.1445 - 0.330*i - 0.1385*i2 - 0.0121*i3 - 0.000607*i8
	f1 := 0.0637 + 0.331*i2 - 0.423*i3 - 0.008*i8
	d0 := 0.330*i2 + 0.277*i3 + 0.0363*i4 + 0.004856*i8*i
	d1 := -0.662*i3 + 1.269*i4 + 0.064*i8*i
	e0 := -0.660*i3 - 0.831*i4 - 0.1452*i5 - 0.043704*i8*i2
	e1 := 1.986*i4 - 5.076*i5 - 0.576*i8*i2
	return k * (f0 + m.omega*f1), k * (d0 + m.omega*d1) / m.tc, k * (e0 + m.omega*e1) / (m.tc * m.tc)
}

// ideal returns the Shomate cp°, h° − h°(298.15 K) and s°(1 bar) per mol.
func (m virialGas) ideal(t float64) (cp, h, s float64) {
	x := t / 1000
	cp = m.a + m.b*x + m.c*x*x + m.d*x*x*x + m.e/(x*x)
	h = 1000 * (m.a*x + m.b*x*x/2 + m.c*x*x*x/3 + m.d*x*x*x*x/4 - m.e/x + m.f - m.hh)
	s = m.a*math.Log(x) + m.b*x + m.c*x*x/2 + m.d*x*x*x/3 - m.e/(2*x*x) + m.g
	return cp, h, s
}

func (m virialGas) Name() string       { return m.name }
func (m virialGas) MolarMass() float64 { return m.molarMass }

func (m virialGas) State(t physics.Kelvin, p physics.Pascal) (gas.State, error) {
	tt, pp := float64(t), float64(p)
	if !(tt >= m.tMin) || !(tt <= m.tMax) {
		return gas.State{}, &physics.DomainError{Name: "temperature", Value: tt, Want: "250 K to 1200 K",
			Reason: "temperature outside the range of the test virial model"}
	}
	if !(pp > 0) || !(pp <= 2e7) {
		return gas.State{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "0 to 20 MPa",
			Reason: "pressure outside the range of the test virial model"}
	}
	b, b1, b2 := m.second(tt)
	v := ru*tt/pp + b
	if !(v > 0.5*ru*tt/pp) {
		return gas.State{}, &physics.DomainError{Name: "pressure", Value: pp, Want: "Z > 0.5",
			Reason: "the state lies outside the range of the truncated virial equation"}
	}
	cp0, h0, s0 := m.ideal(tt)
	cp := cp0 - pp*tt*b2
	cv := cp - (ru+pp*b1)*(ru+pp*b1)/ru
	z := pp * v / (ru * tt)
	kappa := z * cp / cv
	mm := m.molarMass
	return gas.State{
		Temperature:        t,
		Pressure:           p,
		Density:            physics.KgPerCubicMeter(mm / v),
		Compressibility:    z,
		MolarMass:          mm,
		Enthalpy:           physics.JoulePerKg((h0 + pp*(b-tt*b1)) / mm),
		Entropy:            physics.JoulePerKgK((s0 - ru*math.Log(pp/1e5) - pp*b1) / mm),
		Cp:                 physics.JoulePerKgK(cp / mm),
		Cv:                 physics.JoulePerKgK(cv / mm),
		IsentropicExponent: kappa,
		SoundSpeed:         physics.MeterPerS(math.Sqrt(kappa * pp * v / mm)),
		JouleThomson:       (tt*b1 - b) / cp,
		SchultzX:           (tt*b1 - b) / v,
		SchultzY:           ru * tt / (pp * v),
		Phase:              gas.PhaseGas,
	}, nil
}

// lowest returns the lowest temperature (in 5 K steps) at which the model
// holds at pressure p, the lower end of the flash bracket.
func (m virialGas) lowest(p physics.Pascal) physics.Kelvin {
	for t := m.tMin; t < m.tMax; t += 5 {
		if b, _, _ := m.second(t); ru*t/float64(p)+b > 0.5*ru*t/float64(p) {
			return physics.Kelvin(t)
		}
	}
	return physics.Kelvin(m.tMax)
}

func (m virialGas) StateFromPH(p physics.Pascal, h physics.JoulePerKg) (gas.State, error) {
	at := func(t physics.Kelvin) (gas.State, error) { return m.State(t, p) }
	return gas.TemperatureSolve(at, float64(h),
		func(s gas.State) float64 { return float64(s.Enthalpy) },
		func(s gas.State) float64 { return float64(s.Cp) },
		m.lowest(p), physics.Kelvin(m.tMax))
}

func (m virialGas) StateFromPS(p physics.Pascal, s physics.JoulePerKgK) (gas.State, error) {
	at := func(t physics.Kelvin) (gas.State, error) { return m.State(t, p) }
	return gas.TemperatureSolve(at, float64(s),
		func(st gas.State) float64 { return float64(st.Entropy) },
		func(st gas.State) float64 { return float64(st.Cp) / float64(st.Temperature) },
		m.lowest(p), physics.Kelvin(m.tMax))
}
