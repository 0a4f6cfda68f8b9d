package service

import "stagewright/physics/gas"

// BinaryInteraction is a binary interaction parameter kij a cubic model
// used for a pair of components (catalogue ids), with its source: the
// published table it comes from (gas.DefaultBinaryParameters), the request
// (gas.SourceRequest), or none (gas.SourceNoDefault: 0).
type BinaryInteraction struct {
	A, B   string
	Kij    float64
	Source string
}

// DefaultInteraction is one built-in kij of a model.
type DefaultInteraction struct {
	Model string
	BinaryInteraction
}

// interactionsUsed returns the kij of every pair of a cubic model's
// components with its source; nil for the other models.
func interactionsUsed(m gas.Model) []BinaryInteraction {
	if pm, ok := m.(pathModel); ok {
		m = pm.screened
	}
	r, ok := m.(gas.Real)
	if !ok {
		return nil
	}
	used := r.BinaryParameters()
	out := make([]BinaryInteraction, 0, len(used))
	for _, bp := range used {
		out = append(out, BinaryInteraction{A: bp.A, B: bp.B, Kij: bp.Kij, Source: bp.Source})
	}
	return out
}

// DefaultInteractions returns the built-in kij tables of the cubic models
// ("peng-robinson", then "srk"), each value with its source. Pairs not
// listed use kij = 0.
func (s *Service) DefaultInteractions() []DefaultInteraction {
	var out []DefaultInteraction
	for _, model := range []string{"peng-robinson", "srk"} {
		for _, bp := range gas.DefaultBinaryParameters(model) {
			a, b := bp.A, bp.B
			if ca, err := gas.LookupComponent(a); err == nil {
				a = ca.ID
			}
			if cb, err := gas.LookupComponent(b); err == nil {
				b = cb.ID
			}
			out = append(out, DefaultInteraction{Model: model, BinaryInteraction: BinaryInteraction{A: a, B: b, Kij: bp.Kij, Source: bp.Source}})
		}
	}
	return out
}

// holdsWater reports whether a mixture model's gas holds water vapour.
func holdsWater(m gas.Model) bool {
	comp, ok := compositionOfModel(m)
	if !ok {
		return false
	}
	x := comp.MoleFractions()
	for i := range comp.Len() {
		if comp.Component(i).Formula == "H2O" && x[i] > 0 {
			return true
		}
	}
	return false
}
