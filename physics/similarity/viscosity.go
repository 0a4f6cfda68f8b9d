package similarity

import (
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// PascalSecond is a dynamic viscosity in Pa s.
type PascalSecond float64

// Species is what the Lucas method needs of one component.
type Species struct {
	// MolarMass, kg/mol.
	MolarMass float64
	// Tc and Pc are the critical temperature and pressure.
	Tc physics.Kelvin
	Pc physics.Pascal
	// Zc is the critical compressibility factor (used only for a polar
	// species).
	Zc float64
	// Dipole is the dipole moment in debye (0: non-polar).
	Dipole float64
	// Quantum is Lucas's quantum parameter Q (He 1.38, H2 0.76, D2 0.52;
	// 0 for other gases).
	Quantum float64
}

// SpeciesOf returns the Lucas parameters of a catalogue component: its
// molar mass and critical constants from the catalogue, and for the polar
// and quantum gases of the catalogue the dipole moment, Zc and Q.
//
// Dipole moments and Zc: Poling et al. (2001), Appendix A (from memory):
// H2O 1.8 D, Zc 0.229; NH3 1.5 D, Zc 0.244; H2S 0.9 D, Zc 0.285; CO
// 0.1 D (reduced dipole far below 0.022: non-polar for the method).
// Q: Poling et al. (2001), §9-4, after eq. 9-4.19 (from memory).
func SpeciesOf(c gas.Component) Species {
	s := Species{MolarMass: c.MolarMass, Tc: c.Tc, Pc: c.Pc}
	switch c.Formula {
	case "H2O":
		s.Dipole, s.Zc = 1.8, 0.229
	case "NH3":
		s.Dipole, s.Zc = 1.5, 0.244
	case "H2S":
		s.Dipole, s.Zc = 0.9, 0.285
	case "H2":
		s.Quantum = 0.76
	case "He":
		s.Quantum = 1.38
	}
	return s
}

// DiluteViscosity returns the viscosity of one gas at low pressure by the
// corresponding-states method of Lucas:
//
//	η ξ = [0.807 Tr^0.618 − 0.357 e^(−0.449 Tr) + 0.340 e^(−4.058 Tr) + 0.018] Fp° Fq°
//	ξ   = 0.176 (Tc / (M³ Pc⁴))^(1/6)        (Tc in K, M in g/mol, Pc in bar, η in μP)
//
// with the polar factor Fp° from the reduced dipole moment
// μr = 52.46 μ² Pc / Tc² (1 below 0.022; 1 + 30.55 (0.292 − Zc)^1.72
// below 0.075; that times |0.96 + 0.1 (Tr − 0.7)| above) and the quantum
// factor Fq° = 1.22 Q^0.15 {1 + 0.00385 [(Tr − 12)²]^(1/M) sign(Tr − 12)}
// for He, H2 and D2.
//
// Source: Poling, Prausnitz & O'Connell, The Properties of Gases and
// Liquids, 5th ed. (2001), eqs. 9-4.15 to 9-4.19 (from memory); errors of a
// few per cent for non-polar gases. Valid for dilute gas (reduced pressure
// well below 1); the dense-gas rise of viscosity is not included.
// Valid for t > 0 and a species with positive M, Tc and Pc.
func DiluteViscosity(t physics.Kelvin, s Species) (PascalSecond, error) {
	switch {
	case !(t > 0) || math.IsInf(float64(t), 0):
		return 0, &physics.DomainError{Name: "temperature", Value: float64(t), Want: "finite, > 0 K"}
	case !(s.MolarMass > 0) || math.IsInf(s.MolarMass, 0):
		return 0, &physics.DomainError{Name: "molar mass", Value: s.MolarMass, Want: "finite, > 0 kg/mol"}
	case !(s.Tc > 0) || math.IsInf(float64(s.Tc), 0):
		return 0, &physics.DomainError{Name: "Tc", Value: float64(s.Tc), Want: "finite, > 0 K"}
	case !(s.Pc > 0) || math.IsInf(float64(s.Pc), 0):
		return 0, &physics.DomainError{Name: "Pc", Value: float64(s.Pc), Want: "finite, > 0 Pa"}
	case !(s.Dipole >= 0) || !(s.Quantum >= 0) || !(s.Zc >= 0 && s.Zc < 1):
		return 0, &physics.DomainError{Name: "species", Value: s.Dipole, Want: "dipole >= 0 D, Q >= 0, 0 <= Zc < 1"}
	}
	tc := float64(s.Tc)
	pc := float64(s.Pc) / 1e5 // bar
	m := s.MolarMass * 1e3    // g/mol
	tr := float64(t) / tc
	xi := 0.176 * math.Pow(tc/(m*m*m*pc*pc*pc*pc), 1.0/6)
	fp := 1.0
	if mur := 52.46 * s.Dipole * s.Dipole * pc / (tc * tc); mur >= 0.022 {
		fp = 1 + 30.55*math.Pow(math.Max(0.292-s.Zc, 0), 1.72)
		if mur >= 0.075 {
			fp = 1 + 30.55*math.Pow(math.Max(0.292-s.Zc, 0), 1.72)*math.Abs(0.96+0.1*(tr-0.7))
		}
	}
	fq := 1.0
	if s.Quantum > 0 {
		d := tr - 12
		sign := 1.0
		if d < 0 {
			sign = -1
		}
		fq = 1.22 * math.Pow(s.Quantum, 0.15) * (1 + 0.00385*math.Pow(d*d, 1/m)*sign)
	}
	eta := (0.807*math.Pow(tr, 0.618) - 0.357*math.Exp(-0.449*tr) + 0.340*math.Exp(-4.058*tr) + 0.018) * fp * fq / xi
	out := PascalSecond(eta * 1e-7) // μP -> Pa s
	if !(out > 0) || math.IsInf(float64(out), 0) {
		return 0, &physics.DomainError{Name: "temperature", Value: float64(t), Want: "a finite positive viscosity"}
	}
	return out, nil
}

// MixtureViscosity returns the dilute-gas viscosity of a mixture of the
// species with mole fractions y by the rule of Wilke:
//
//	η_m = Σi yi ηi / Σj yj φij,
//	φij = [1 + (ηi/ηj)^(1/2) (Mj/Mi)^(1/4)]² / [8 (1 + Mi/Mj)]^(1/2)
//
// with each ηi from DiluteViscosity. Source: Poling, Prausnitz &
// O'Connell (2001), eqs. 9-5.13 and 9-5.14 (Wilke 1950; from memory);
// errors of a few per cent, larger for mixtures of hydrogen with heavy
// gases. y need not be normalised; it must have one non-negative fraction
// per species and a positive sum.
func MixtureViscosity(t physics.Kelvin, species []Species, y []float64) (PascalSecond, error) {
	if len(species) == 0 || len(species) != len(y) {
		return 0, &physics.DomainError{Name: "mole fractions", Value: float64(len(y)), Want: "one per species, at least one"}
	}
	sum := 0.0
	for _, v := range y {
		if !(v >= 0) || math.IsInf(v, 0) {
			return 0, &physics.DomainError{Name: "mole fraction", Value: v, Want: "finite, >= 0"}
		}
		sum += v
	}
	if !(sum > 0) {
		return 0, &physics.DomainError{Name: "mole fractions", Value: sum, Want: "a positive sum"}
	}
	eta := make([]float64, len(species))
	for i, s := range species {
		e, err := DiluteViscosity(t, s)
		if err != nil {
			return 0, err
		}
		eta[i] = float64(e)
	}
	out := 0.0
	for i := range species {
		if y[i] == 0 {
			continue
		}
		den := 0.0
		for j := range species {
			mi, mj := species[i].MolarMass, species[j].MolarMass
			a := 1 + math.Sqrt(eta[i]/eta[j])*math.Pow(mj/mi, 0.25)
			den += y[j] / sum * a * a / math.Sqrt(8*(1+mi/mj))
		}
		out += y[i] / sum * eta[i] / den
	}
	return PascalSecond(out), nil
}
