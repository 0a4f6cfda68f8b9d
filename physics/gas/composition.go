package gas

import (
	"math"
	"strconv"

	"stagewright/physics"
)

// Basis says whether fractions are mole or mass fractions.
type Basis string

// Fraction bases.
const (
	BasisMole Basis = "mole"
	BasisMass Basis = "mass"
)

// Fraction is one named component of a composition with its fraction.
type Fraction struct {
	Name  string
	Value float64
}

// SumTolerance is how far the given fractions may sum away from 1 and
// still be normalised silently; beyond it NewComposition returns a
// DomainError. (Common practice: analyses are quoted to 4-6 decimals.)
const SumTolerance = 1e-6

// Composition is a gas mixture: catalogue components and their mole
// fractions (summing to 1). The zero value is empty and not usable; build
// one with NewComposition, PureComposition or NamedMixture. A Composition
// is immutable; its accessors return copies.
type Composition struct {
	comps []Component
	x     []float64
}

// NewComposition builds a composition from names and fractions on the
// given basis ("" means mole). Each name is looked up with LookupComponent.
// It rejects an empty list, an unknown component (named), a negative or
// non-finite fraction, a component given twice (under any alias) and
// fractions that do not sum to 1 within SumTolerance; within the tolerance
// they are normalised. Mass fractions are converted to mole fractions by
//
//	x_i = (w_i/M_i) / Σ_j (w_j/M_j)
//
// Components with zero fraction are kept (they do no harm).
func NewComposition(fractions []Fraction, basis Basis) (Composition, error) {
	if basis == "" {
		basis = BasisMole
	}
	if basis != BasisMole && basis != BasisMass {
		return Composition{}, &physics.DomainError{Name: "basis", Want: `"mole" or "mass"`,
			Reason: "the composition basis must be \"mole\" or \"mass\", not \"" + string(basis) + "\""}
	}
	if len(fractions) == 0 {
		return Composition{}, &physics.DomainError{Name: "composition", Want: "at least one component",
			Reason: "the composition is empty: give at least one component with its fraction"}
	}
	comps := make([]Component, 0, len(fractions))
	x := make([]float64, 0, len(fractions))
	sum := 0.0
	for i, f := range fractions {
		field := "composition[" + strconv.Itoa(i) + "]"
		c, err := LookupComponent(f.Name)
		if err != nil {
			return Composition{}, err
		}
		if !(f.Value >= 0) || math.IsInf(f.Value, 0) {
			return Composition{}, &physics.DomainError{Name: field + ".fraction", Value: f.Value, Want: "finite, >= 0",
				Reason: "the fraction of " + f.Name + " must be a finite number of at least 0"}
		}
		for _, seen := range comps {
			if seen.ID == c.ID {
				return Composition{}, &physics.DomainError{Name: field + ".name", Want: "each component once",
					Reason: "component " + c.ID + " is given more than once (\"" + f.Name + "\")"}
			}
		}
		comps = append(comps, c)
		x = append(x, f.Value)
		sum += f.Value
	}
	if !(math.Abs(sum-1) <= SumTolerance) {
		return Composition{}, &physics.DomainError{Name: "composition", Value: sum, Want: "fractions summing to 1",
			Reason: "the " + string(basis) + " fractions sum to " + strconv.FormatFloat(sum, 'g', 10, 64) +
				", not 1 (tolerance 1e-6): correct or normalise the analysis"}
	}
	for i := range x {
		x[i] /= sum
	}
	if basis == BasisMass {
		d := 0.0
		for i := range x {
			x[i] /= comps[i].MolarMass
			d += x[i]
		}
		for i := range x {
			x[i] /= d
		}
	}
	return Composition{comps: comps, x: x}, nil
}

// PureComposition returns the composition of one catalogue component.
func PureComposition(name string) (Composition, error) {
	return NewComposition([]Fraction{{Name: name, Value: 1}}, BasisMole)
}

// Mixture is a named mixture of the catalogue.
type Mixture struct {
	ID        string
	Names     []string
	Fractions []Fraction // mole fractions as published (may not sum to 1)
	Source    string
}

// Mixtures returns the named mixtures (a fresh slice): "dry-air", the
// N2/O2/Ar/CO2 part of ISO 2533 dry air, normalised to 1.
func Mixtures() []Mixture {
	return []Mixture{{
		ID: "dry-air", Names: []string{"dry-air", "iso-air", "standard air"},
		Fractions: isoAirFractions(),
		Source: "ISO 2533:1975 Standard Atmosphere, Table 1 (from memory): N2 0.78084, O2 0.209476, Ar 0.00934, CO2 0.000314; " +
			"the minor gases (Ne, He, Kr, ...; 0.003 %) are left out and the four fractions normalised to 1",
	}}
}

// NamedMixture returns the composition of a named mixture (see Mixtures),
// its published fractions normalised to 1.
func NamedMixture(name string) (Composition, error) {
	key := normName(name)
	for _, m := range Mixtures() {
		for _, n := range m.Names {
			if normName(n) == key {
				sum := 0.0
				for _, f := range m.Fractions {
					sum += f.Value
				}
				fr := make([]Fraction, len(m.Fractions))
				for i, f := range m.Fractions {
					fr[i] = Fraction{Name: f.Name, Value: f.Value / sum}
				}
				return NewComposition(fr, BasisMole)
			}
		}
	}
	return Composition{}, unknownComponent(name)
}

// Len returns the number of components.
func (c Composition) Len() int { return len(c.x) }

// Component returns the i-th component (0 <= i < Len()).
func (c Composition) Component(i int) Component { return c.comps[i] }

// MoleFractions returns a copy of the mole fractions.
func (c Composition) MoleFractions() []float64 { return append([]float64(nil), c.x...) }

// MassFractions returns the mass fractions w_i = x_i M_i / Σ x_j M_j.
func (c Composition) MassFractions() []float64 {
	m := c.MolarMass()
	w := make([]float64, len(c.x))
	for i := range c.x {
		w[i] = c.x[i] * c.comps[i].MolarMass / m
	}
	return w
}

// MolarMass returns the mixture molar mass Σ x_i M_i in kg/mol.
func (c Composition) MolarMass() float64 {
	m := 0.0
	for i := range c.x {
		m += c.x[i] * c.comps[i].MolarMass
	}
	return m
}

// IDs returns the catalogue ids of the components in order.
func (c Composition) IDs() []string {
	ids := make([]string, len(c.comps))
	for i := range c.comps {
		ids[i] = c.comps[i].ID
	}
	return ids
}

// MixingEntropy returns the ideal entropy of mixing per mole,
// −R Σ x_i ln x_i in J/(mol K) (terms with x_i = 0 contribute 0).
//
// Source: e.g. Smith, Van Ness & Abbott, Introduction to Chemical
// Engineering Thermodynamics, 7th ed. (2005), eq. 11.26 (ideal-gas mixture).
func (c Composition) MixingEntropy() float64 {
	s := 0.0
	for _, xi := range c.x {
		if xi > 0 {
			s -= xi * math.Log(xi)
		}
	}
	return physics.UniversalGasConstant * s
}
