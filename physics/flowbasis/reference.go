package flowbasis

import (
	"fmt"
	"math"

	"stagewright/physics"
)

// Names of the reference conditions, as the API spells them.
const (
	NameNormal     = "normal"
	NameStandard   = "standard"
	NameUSStandard = "us-standard"
)

// Reference is a named pair of reference temperature and pressure for
// standard volume flows, with the document that defines it.
type Reference struct {
	Name        string
	Temperature physics.Kelvin
	Pressure    physics.Pascal
	Source      string
}

// Normal returns the "normal" reference conditions of the Nm3:
// 273.15 K (0 °C) and 101 325 Pa.
//
// Source: DIN 1343:1990, normal conditions (Tn = 273.15 K,
// pn = 101 325 Pa).
func Normal() Reference {
	return Reference{Name: NameNormal, Temperature: 273.15, Pressure: 101325,
		Source: "DIN 1343:1990 normal conditions, 273.15 K and 101325 Pa"}
}

// Standard returns the "standard" reference conditions of the Sm3:
// 288.15 K (15 °C) and 101 325 Pa.
//
// Source: ISO 13443:1996, Natural gas - Standard reference conditions.
func Standard() Reference {
	return Reference{Name: NameStandard, Temperature: 288.15, Pressure: 101325,
		Source: "ISO 13443:1996 standard reference conditions, 288.15 K and 101325 Pa"}
}

// USStandard returns the "us-standard" reference conditions of the
// standard cubic foot (scf) used by MMSCFD and SCFM: 60 °F and 14.696 psia.
// Converted exactly with NIST SP 811 (2008) Appendix B:
//
//	T = (60 + 459.67) · 5/9 K = 288.705 555… K
//	p = 14.696 · 6894.757 293 168… Pa = 101 325.353… Pa
//
// (14.696 psia is 101 325 Pa rounded to five digits in psi; the exact
// conversion lies 0.35 Pa above one standard atmosphere.)
//
// Source: 60 °F and 14.696 psia are the base conditions of the US gas
// industry and of the GPSA Engineering Data Book, 13th ed. (2012), sec. 1
// (from memory). Some sales contracts use 14.73 psia instead (from memory);
// pass a Reference of your own for those.
func USStandard() Reference {
	return Reference{Name: NameUSStandard, Temperature: (60 + 459.67) * 5.0 / 9.0, Pressure: 14.696 * psi,
		Source: "US gas-industry base conditions 60 degF and 14.696 psia (GPSA Engineering Data Book), converted with NIST SP 811 (2008) Appendix B"}
}

// psi is one pound-force per square inch in Pa: lbf = 4.448 221 615 260 5 N
// and in = 0.0254 m, both exact (NIST SP 811 (2008), Appendix B.8).
const psi = 4.4482216152605 / (0.0254 * 0.0254)

// ReferenceNamed returns the reference conditions called name: "normal",
// "standard" or "us-standard".
func ReferenceNamed(name string) (Reference, error) {
	switch name {
	case NameNormal:
		return Normal(), nil
	case NameStandard:
		return Standard(), nil
	case NameUSStandard:
		return USStandard(), nil
	}
	return Reference{}, &physics.DomainError{Name: "reference", Value: math.NaN(), Want: "normal, standard or us-standard",
		Reason: fmt.Sprintf("unknown reference conditions %q; use \"normal\" (0 °C, 101.325 kPa), \"standard\" (15 °C, 101.325 kPa) or \"us-standard\" (60 °F, 14.696 psia)", name)}
}

// check reports whether the reference conditions are a usable state.
func (r Reference) check() error {
	if !(r.Temperature > 0) || math.IsInf(float64(r.Temperature), 0) ||
		!(r.Pressure > 0) || math.IsInf(float64(r.Pressure), 0) {
		return &physics.DomainError{Name: "reference", Value: float64(r.Temperature), Want: "finite T > 0 K and p > 0 Pa",
			Reason: fmt.Sprintf("reference conditions %q must have a finite temperature above 0 K and pressure above 0 Pa", r.Name)}
	}
	return nil
}
