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
			return nil, notes, shapeErr("gas.composition", errors.New("gas model ideal-constant takes cp and gamma, not a composition; use model ideal, peng-robinson, srk or gerg-2008 for a composition"))
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
	case "ideal", "peng-robinson", "srk", gas.GERGName:
		if g.Cp != nil || g.Gamma != nil {
			return nil, notes, shapeErr("gas.cp", fmt.Errorf("gas model %s computes cp and gamma from the composition; leave cp and gamma out", g.Model))
		}
		if g.Model == gas.GERGName {
			if err := gergCovers(g); err != nil {
				return nil, notes, err
			}
		}
		return s.mixtureModel(g, t, p, &notes)
	}
	return nil, notes, shapeErr("gas.model", fmt.Errorf("unknown gas model %q: use ideal-constant, ideal, peng-robinson, srk or gerg-2008", g.Model))
}

// gergCovers checks that GERG-2008 covers every component of g's
// composition (named mixtures by their parts): a shape error (400) naming
// the first offender. Unknown names are left to fractionsOf; binary
// interaction parameters to gas.NewModel (422, as for the ideal model).
func gergCovers(g GasInput) error {
	names := make([]string, 0, len(g.Composition))
	for n := range g.Composition {
		names = append(names, n)
	}
	sort.Strings(names) // the same offender for the same request
	for _, n := range names {
		var parts []gas.Component
		if mix, err := gas.NamedMixture(n); err == nil {
			for i := range mix.Len() {
				parts = append(parts, mix.Component(i))
			}
		} else if c, err := gas.LookupComponent(n); err == nil {
			parts = append(parts, c)
		}
		for _, c := range parts {
			if !gas.GERGCovers(c) {
				return shapeErr("gas.composition."+n, fmt.Errorf("gas model gerg-2008 does not cover %s (%s): its 21 components are CH4, N2, CO2, C2H6, C3H8, i-C4H10, n-C4H10, i-C5H12, n-C5H12, n-C6H14, n-C7H16, n-C8H18, n-C9H20, n-C10H22, H2, O2, CO, H2O, H2S, He and Ar (for air give dry-air or N2, O2, Ar, CO2); use peng-robinson or srk for other components", c.ID, c.Formula))
			}
		}
	}
	return nil
}
