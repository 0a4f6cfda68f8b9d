package service

import (
	"errors"
	"fmt"

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
		return s.mixtureModel(g, t, p, &notes)
	}
	return nil, notes, shapeErr("gas.model", fmt.Errorf("unknown gas model %q: use ideal-constant, ideal, peng-robinson or srk", g.Model))
}
