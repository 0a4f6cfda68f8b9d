package service

import (
	"errors"
	"fmt"
	"sort"
	"strings"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/water"
)

// mixtureModel builds an "ideal", "peng-robinson", "srk" or "gerg-2008"
// model of g's composition, adding water vapour for a relative humidity at
// suction.
func (s *Service) mixtureModel(g GasInput, t, p float64, notes *gasNotes) (gas.Model, gasNotes, error) {
	fr, err := fractionsOf(g)
	if err != nil {
		return nil, *notes, err
	}
	if g.RelativeHumidity != nil {
		fr, err = humidify(fr, *g.RelativeHumidity, t, p, g.CompositionBasis, notes)
		if err != nil {
			return nil, *notes, err
		}
	}
	basis := gas.Basis(g.CompositionBasis)
	if g.RelativeHumidity != nil {
		basis = gas.BasisMole // humidify returns mole fractions
	}
	comp, err := gas.NewComposition(fr, basis)
	if err != nil {
		return nil, *notes, shapeErr("gas.composition", err)
	}
	var kij []gas.BinaryParameter
	for i, k := range g.Interactions {
		for _, n := range []string{k.A, k.B} {
			if _, err := gas.LookupComponent(n); err != nil {
				return nil, *notes, shapeErr(fmt.Sprintf("gas.binary_interaction.%d.pair", i), err)
			}
		}
		kij = append(kij, gas.BinaryParameter{A: k.A, B: k.B, Kij: k.Kij, Source: "given in the request"})
	}
	m, err := gas.NewModel(g.Model, comp, kij)
	if err != nil {
		var de *physics.DomainError
		if errors.As(err, &de) && strings.HasPrefix(de.Name, "kij") && len(kij) > 0 {
			// "kij[2]" names the third override.
			field := "gas.binary_interaction"
			if i := strings.IndexByte(de.Name, '['); i >= 0 {
				field += "." + strings.TrimSuffix(de.Name[i+1:], "]")
			}
			return nil, *notes, fieldErr(field, err)
		}
		return nil, *notes, fieldErr("gas.composition", err)
	}
	switch g.Model {
	case "ideal":
		notes.methods = append(notes.methods, Method{Subject: "gas properties", Name: "ideal-gas mixture with cp(T)",
			Source: "NIST Chemistry WebBook Shomate fits (Chase 1998, NIST-JANAF 4th ed.); Poling, Prausnitz & O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), App. A"})
	case "peng-robinson":
		notes.methods = append(notes.methods, Method{Subject: "gas properties", Name: "Peng-Robinson cubic equation of state, van der Waals one-fluid mixing with kij",
			Source: "Peng & Robinson, Ind. Eng. Chem. Fundam. 15:59 (1976); Robinson & Peng, GPA RR-28 (1978) kappa for omega > 0.49; ideal-gas part as model ideal; phase by Michelsen, Fluid Phase Equilib. 9:1 (1982)"})
	case "srk":
		notes.methods = append(notes.methods, Method{Subject: "gas properties", Name: "Soave-Redlich-Kwong cubic equation of state, van der Waals one-fluid mixing with kij",
			Source: "Soave, Chem. Eng. Sci. 27:1197 (1972); ideal-gas part as model ideal; phase by Michelsen, Fluid Phase Equilib. 9:1 (1982)"})
	case gas.GERGName:
		notes.methods = append(notes.methods, Method{Subject: "gas properties", Name: "GERG-2008 wide-range equation of state (reduced Helmholtz energy, 21 components), range 60-700 K, up to 70 MPa",
			Source: "Kunz & Wagner, J. Chem. Eng. Data 57:3032 (2012); ISO 20765-2; AGA Report No. 8 Part 2 (2017); checked against NIST's AGA 8 reference implementation; ideal-gas part Jaeschke & Schley (1995); phase: pure fluids by equal Gibbs energy of the GERG-2008 roots, mixtures screened by Michelsen's test (Fluid Phase Equilib. 9:1, 1982) on Peng-Robinson, which also gives the dew point"})
	}
	if g.Model != gas.GERGName {
		notes.methods = append(notes.methods, Method{Subject: "ideal-gas heat capacity", Name: "cp(T) per component by published range, continuous at every hand-over between ranges",
			Source: "NIST Chemistry WebBook Shomate fits (Chase 1998; testdata/reference/shomate.csv); Poling, Prausnitz & O'Connell (2001) App. A cp/R polynomials (from memory); " + gas.HandOverMethod})
	}
	if r, ok := m.(screened); ok {
		return pathModel{screened: r}, *notes, nil
	}
	return m, *notes, nil
}

// screened is a real-gas model with a phase test that its Gas* methods
// skip (gas.Real, gas.GERG).
type screened interface {
	gas.Model
	Composition() gas.Composition
	DewTemperature(p physics.Pascal) (physics.Kelvin, error)
	GasState(t physics.Kelvin, p physics.Pascal) (gas.State, error)
	GasStateFromPH(p physics.Pascal, h physics.JoulePerKg) (gas.State, error)
	GasStateFromPS(p physics.Pascal, s physics.JoulePerKgK) (gas.State, error)
}

// pathModel is a real-gas model whose State skips the phase-stability test:
// the compression path evaluates hundreds of states along a line whose end
// states the service checks with the full test (checkPhases).
type pathModel struct{ screened }

// State returns the state without the stability test.
func (m pathModel) State(t physics.Kelvin, p physics.Pascal) (gas.State, error) {
	return m.screened.GasState(t, p)
}

// StateFromPH solves the (P,h) flash without the stability test.
func (m pathModel) StateFromPH(p physics.Pascal, h physics.JoulePerKg) (gas.State, error) {
	return m.screened.GasStateFromPH(p, h)
}

// StateFromPS solves the (P,s) flash without the stability test.
func (m pathModel) StateFromPS(p physics.Pascal, s physics.JoulePerKgK) (gas.State, error) {
	return m.screened.GasStateFromPS(p, s)
}

// fullState returns the state with the phase test.
func fullState(m gas.Model, t physics.Kelvin, p physics.Pascal) (gas.State, error) {
	if pm, ok := m.(pathModel); ok {
		return pm.screened.State(t, p)
	}
	return m.State(t, p)
}

// fractionsOf checks the names and fractions of g's composition and
// returns them in a deterministic order.
func fractionsOf(g GasInput) ([]gas.Fraction, error) {
	if len(g.Composition) == 0 {
		return nil, shapeErr("gas.composition", fmt.Errorf("gas model %s needs a composition: component names or formulas with their fractions, e.g. {\"CH4\": 0.9, \"C2H6\": 0.1}", g.Model))
	}
	names := make([]string, 0, len(g.Composition))
	for n := range g.Composition {
		names = append(names, n)
	}
	sort.Strings(names) // deterministic order, hence deterministic results
	fr := make([]gas.Fraction, 0, len(names))
	given := map[string]string{} // catalogue id -> name as given, for components named directly
	expanded := map[string]int{} // catalogue id -> index in fr, for parts of named mixtures
	for _, n := range names {
		v := g.Composition[n]
		if !(v >= 0 && v <= 1) {
			return nil, shapeErr("gas.composition."+n, fmt.Errorf("the fraction of %s must lie in [0, 1], not %g", n, v))
		}
		// A named mixture (e.g. "dry-air") expands into its components; it
		// is looked for first, since the air pseudo-component also answers
		// to "dry air". Its parts merge with components given directly.
		if mix, err := gas.NamedMixture(n); err == nil {
			x := mix.MoleFractions()
			for i := range mix.Len() {
				id := mix.Component(i).ID
				if k, ok := expanded[id]; ok {
					fr[k].Value += v * x[i]
					continue
				}
				expanded[id] = len(fr)
				fr = append(fr, gas.Fraction{Name: id, Value: v * x[i]})
			}
			continue
		}
		c, err := gas.LookupComponent(n)
		if err != nil {
			return nil, shapeErr("gas.composition."+n, err)
		}
		if other, dup := given[c.ID]; dup {
			return nil, shapeErr("gas.composition."+n, fmt.Errorf("%s and %s name the same component (%s): give it once", other, n, c.ID))
		}
		given[c.ID] = n
		if k, ok := expanded[c.ID]; ok {
			fr[k].Value += v
			continue
		}
		expanded[c.ID] = len(fr)
		fr = append(fr, gas.Fraction{Name: c.ID, Value: v})
	}
	return fr, nil
}

// humidify adds the water vapour of relative humidity rh at suction (t, p)
// to a dry composition: x_w = rh psat(T)/p (IAPWS-IF97 region 4, ideal
// mixing, enhancement factor neglected), the dry fractions scaled by 1 − x_w.
func humidify(fr []gas.Fraction, rh, t, p float64, basis string, notes *gasNotes) ([]gas.Fraction, error) {
	for _, f := range fr {
		c, err := gas.LookupComponent(f.Name)
		if err == nil && c.Formula == "H2O" && f.Value > 0 {
			return nil, shapeErr("gas.relative_humidity", errors.New("give relative_humidity or water in the composition, not both"))
		}
	}
	xw, err := water.WaterMoleFraction(rh, physics.Kelvin(t), physics.Pascal(p))
	if err != nil {
		return nil, fieldErr("gas.relative_humidity", err)
	}
	dry, err := gas.NewComposition(fr, gas.Basis(basis))
	if err != nil {
		return nil, shapeErr("gas.composition", err)
	}
	x := dry.MoleFractions()
	out := make([]gas.Fraction, 0, len(x)+1)
	for i, xi := range x {
		out = append(out, gas.Fraction{Name: dry.Component(i).ID, Value: xi * (1 - xw)})
	}
	out = append(out, gas.Fraction{Name: "H2O", Value: xw})
	notes.methods = append(notes.methods, Method{Subject: "humidity", Name: fmt.Sprintf("water mole fraction %.5f from relative humidity %.3f", xw, rh),
		Source: "IAPWS-IF97 region 4 saturation pressure (IAPWS R7-97, 2007); ideal mixing, enhancement factor neglected"})
	return out, nil
}
