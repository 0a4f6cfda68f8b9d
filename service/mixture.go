package service

import (
	"errors"
	"fmt"

	"stagewright/physics/gas"
)

// mixtureModel builds an "ideal", "peng-robinson" or "srk" model of comp.
func (s *Service) mixtureModel(g GasInput, comp gas.Composition, notes *gasNotes) (gas.Model, gasNotes, error) {
	switch g.Model {
	case "ideal":
		m, err := gas.NewIdeal(comp)
		if err != nil {
			return nil, *notes, fieldErr("gas.composition", err)
		}
		notes.methods = append(notes.methods, Method{Subject: "gas properties", Name: "ideal-gas mixture with cp(T)",
			Source: "NIST Chemistry WebBook Shomate fits (Chase 1998) and Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), App. A"})
		return m, *notes, nil
	}
	return nil, *notes, shapeErr("gas.model", errors.New(fmt.Sprint("gas model ", g.Model, " is not wired yet")))
}
