package service

import (
	"context"
	"fmt"
	"math"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/physics/water"
)

// ReferenceState states the zero of enthalpy and entropy of the models.
const ReferenceState = "h = 0 and s = 0 for each pure component as an ideal gas at 298.15 K and 101325 Pa; mixtures add the ideal mixing entropy −R Σ x ln x (ideal-constant: h = 0 at 298.15 K, s = 0 at 298.15 K and 101325 Pa)"

// PropertiesResult is the state of a gas at (T, P) with notes.
type PropertiesResult struct {
	State gas.State
	// Components and MoleFractions are the normalised composition (empty
	// for ideal-constant).
	Components    []string
	MoleFractions []float64
	// WaterDewPoint is the water dew point at P, K; zero when the gas holds
	// no water or the dew point lies below the triple point.
	WaterDewPoint float64
	Notes         []string
	Provenance    Provenance
	Cautions      []string
}

// The state range of GasProperties beyond each model's own temperature
// range: the cubic equations of state and the ideal-gas models are used
// here for compressor gases, not for solids, cryogenic liquids or
// pressures above 100 MPa, where they answer numbers without meaning
// (common practice, no source).
const (
	PropertiesMaxPressure    = 100e6 // Pa absolute
	PropertiesMinTemperature = 20.0  // K
)

// GasProperties returns the properties of gas g at temperature t (K) and
// pressure p (Pa absolute); outside the models' range (PropertiesMaxPressure,
// PropertiesMinTemperature and the model's TemperatureRange) it answers an
// InputError naming the field and the range.
func (s *Service) GasProperties(ctx context.Context, g GasInput, t, p float64) (PropertiesResult, error) {
	if err := ctx.Err(); err != nil {
		return PropertiesResult{}, err
	}
	var res PropertiesResult
	res.Provenance.ModelVersion = ModelVersion
	res.Provenance.ServiceVersion = s.version
	res.Provenance.InputHash = hashOf(struct {
		Gas GasInput `json:"gas"`
		T   float64  `json:"temperature"`
		P   float64  `json:"pressure"`
	}{g, t, p})
	if !(t > 0) || !physics.Finite(t) {
		return res, fieldErr("temperature", reason("temperature", "the temperature must be a finite absolute temperature above 0 K", t))
	}
	if !(p > 0) || !physics.Finite(p) {
		return res, fieldErr("pressure", reason("pressure", "the pressure must be a finite absolute pressure above 0 Pa", p))
	}
	if p > PropertiesMaxPressure {
		return res, fieldErr("pressure", reason("pressure", fmt.Sprintf(
			"the pressure is out of range: the models cover up to %g MPa absolute", PropertiesMaxPressure/1e6), p))
	}
	m, notes, err := s.gasModel(g, t, p)
	if err != nil {
		return res, err
	}
	lo, hi := PropertiesMinTemperature, math.Inf(1)
	if r, ok := m.(interface {
		TemperatureRange() (lo, hi physics.Kelvin)
	}); ok {
		mlo, mhi := r.TemperatureRange()
		lo, hi = max(lo, float64(mlo)), float64(mhi)
	}
	if !(t >= lo && t <= hi) {
		rng := fmt.Sprintf("from %g K", lo)
		if !math.IsInf(hi, 1) {
			rng = fmt.Sprintf("%g to %g K", lo, hi)
		}
		return res, fieldErr("temperature", reason("temperature", fmt.Sprintf(
			"the temperature is out of range: the %s model covers %s", m.Name(), rng), t))
	}
	res.Provenance.GasModel = m.Name()
	res.Provenance.Methods = notes.methods
	res.Provenance.BinaryInteraction = interactionsUsed(m)
	st, err := fullState(m, physics.Kelvin(t), physics.Pascal(p))
	if err != nil {
		return res, fieldErr("temperature", err)
	}
	res.State = st
	res.Notes = append(res.Notes, st.Validity.Notes()...)
	switch st.Phase {
	case gas.PhaseLiquid:
		res.Notes = append(res.Notes, "the equation of state gives a liquid (or a vapour root above the vapour pressure) at this state: the properties are those of the root returned, not of a gas")
	case gas.PhaseTwoPhase:
		res.Notes = append(res.Notes, "the stability test finds this state inside the two-phase region: the gas would partly condense; the properties are those of the single-phase root")
	}
	if comp, ok := compositionOfModel(m); ok {
		x := comp.MoleFractions()
		for i := range comp.Len() {
			res.Components = append(res.Components, comp.Component(i).ID)
			res.MoleFractions = append(res.MoleFractions, x[i])
			if comp.Component(i).Formula == "H2O" && x[i] > 0 {
				if c, err := water.WaterCondensation(st.Temperature, x[i], st.Pressure); err == nil && c.DewPointKnown {
					res.WaterDewPoint = float64(c.DewPoint)
					if c.Condenses {
						res.Notes = append(res.Notes, fmt.Sprintf("water would condense: the temperature is below the water dew point of %.2f K", float64(c.DewPoint)))
					}
				}
			}
		}
		if w, ok := cubicAccuracy(m, comp, true, station{"state", st, false}); ok {
			res.Notes = append(res.Notes, w.Message)
		}
	}
	res.Cautions = Cautions()
	return res, nil
}

// Components returns the gas catalogue.
func (s *Service) Components() []gas.Component { return gas.Components() }

// Mixtures returns the named mixtures of the catalogue.
func (s *Service) Mixtures() []gas.Mixture { return gas.Mixtures() }
