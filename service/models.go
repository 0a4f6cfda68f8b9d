package service

import (
	"errors"
	"fmt"
	"sort"

	"stagewright/physics"
	"stagewright/physics/gas"
)

// gasNotes carries what building the gas model adds to a result.
type gasNotes struct {
	methods  []Method
	warnings []Warning
}

// gasModel builds the property model that g selects. t and p are the
// suction state, for notes on the model's validity there.
func (s *Service) gasModel(g GasInput, t, p float64) (gas.Model, gasNotes, error) {
	var notes gasNotes
	switch g.Model {
	case "ideal-constant":
		if g.Cp == nil {
			return nil, notes, shapeErr("gas.cp", errors.New("gas model ideal-constant needs cp, the isobaric heat capacity in J/(kg K)"))
		}
		if g.Gamma == nil {
			return nil, notes, shapeErr("gas.gamma", errors.New("gas model ideal-constant needs gamma, the ratio of specific heats"))
		}
		if len(g.Composition) > 0 {
			return nil, notes, shapeErr("gas.composition", errors.New("gas model ideal-constant takes cp and gamma, not a composition; use model ideal, peng-robinson or srk for a composition"))
		}
		m, err := gas.NewConstant(physics.JoulePerKgK(*g.Cp), *g.Gamma)
		if err != nil {
			var de *physics.DomainError
			if errors.As(err, &de) && de.Name == "gamma" {
				return nil, notes, fieldErr("gas.gamma", err)
			}
			return nil, notes, fieldErr("gas.cp", err)
		}
		notes.methods = append(notes.methods, Method{Subject: "gas properties", Name: "ideal gas, constant cp and gamma",
			Source: "Çengel & Boles, Thermodynamics: An Engineering Approach, 6th ed. (2008), ch. 7"})
		return m, notes, nil
	case "ideal", "peng-robinson", "srk":
		if g.Cp != nil || g.Gamma != nil {
			return nil, notes, shapeErr("gas.cp", fmt.Errorf("gas model %s computes cp and gamma from the composition; leave cp and gamma out", g.Model))
		}
		comp, err := compositionOf(g)
		if err != nil {
			return nil, notes, err
		}
		return s.mixtureModel(g, comp, &notes)
	}
	return nil, notes, shapeErr("gas.model", fmt.Errorf("unknown gas model %q: use ideal-constant, ideal, peng-robinson or srk", g.Model))
}

// compositionOf checks and normalises the composition of g.
func compositionOf(g GasInput) (gas.Composition, error) {
	if len(g.Composition) == 0 {
		return gas.Composition{}, shapeErr("gas.composition", fmt.Errorf("gas model %s needs a composition: component names or formulas with their fractions, e.g. {\"CH4\": 0.9, \"C2H6\": 0.1}", g.Model))
	}
	names := make([]string, 0, len(g.Composition))
	for n := range g.Composition {
		names = append(names, n)
	}
	sort.Strings(names) // deterministic order, hence deterministic results
	fr := make([]gas.Fraction, 0, len(names))
	for _, n := range names {
		fr = append(fr, gas.Fraction{Name: n, Value: g.Composition[n]})
	}
	for _, f := range fr {
		if _, err := gas.LookupComponent(f.Name); err != nil {
			return gas.Composition{}, shapeErr("gas.composition."+f.Name, err)
		}
		if !(f.Value >= 0 && f.Value <= 1) {
			return gas.Composition{}, shapeErr("gas.composition."+f.Name, fmt.Errorf("the fraction of %s must lie in [0, 1], not %g", f.Name, f.Value))
		}
	}
	comp, err := gas.NewComposition(fr, gas.Basis(g.CompositionBasis))
	if err != nil {
		return gas.Composition{}, shapeErr("gas.composition", err)
	}
	return comp, nil
}
