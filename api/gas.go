package api

import (
	"context"
	"log/slog"
	"net/http"

	"github.com/gin-gonic/gin"

	"stagewright/physics"
	"stagewright/physics/gas"
	"stagewright/service"
)

// GasPropertyService is what the gas handlers need of the service layer.
type GasPropertyService interface {
	GasProperties(ctx context.Context, g service.GasInput, t, p float64) (service.PropertiesResult, error)
	Components() []gas.Component
	Mixtures() []gas.Mixture
	DefaultInteractions() []service.DefaultInteraction
}

// PropertiesRequest asks for the properties of a gas at one state.
type PropertiesRequest struct {
	Gas GasSpec `json:"gas" binding:"required"`
	// Temperature, K (or "35 degC").
	Temperature *Quantity `json:"temperature" binding:"required" swaggertype:"primitive,number" format:"double" example:"300" extensions:"x-unit-string=temperature"`
	// Pressure, Pa absolute (or "50 bara", "725 psia").
	Pressure *Quantity `json:"pressure" binding:"required" swaggertype:"primitive,number" format:"double" example:"5000000" extensions:"x-unit-string=pressure"`
	// Ambient pressure for gauge units, Pa absolute; default 101325 Pa.
	Ambient *Quantity `json:"ambient,omitempty" swaggertype:"primitive,number" format:"double" example:"101325" extensions:"x-unit-string=pressure"`
}

// PropertiesResponse is the state of the gas.
type PropertiesResponse struct {
	Model string `json:"model" example:"peng-robinson" validate:"required"`
	// Temperature, K.
	Temperature float64 `json:"temperature" format:"double" validate:"required"`
	// Pressure, Pa absolute.
	Pressure float64 `json:"pressure" format:"double" validate:"required"`
	// Density, kg/m3.
	Density float64 `json:"density" format:"double" validate:"required"`
	// Compressibility is Z = p/(ρ R T).
	Compressibility float64 `json:"compressibility" format:"double" validate:"required"`
	// MolarMass, kg/mol.
	MolarMass float64 `json:"molar_mass" format:"double" validate:"required"`
	// Enthalpy, J/kg (see reference_state).
	Enthalpy float64 `json:"enthalpy" format:"double" validate:"required"`
	// Entropy, J/(kg K) (see reference_state).
	Entropy float64 `json:"entropy" format:"double" validate:"required"`
	// Cp, J/(kg K).
	Cp float64 `json:"cp" format:"double" validate:"required"`
	// Cv, J/(kg K).
	Cv float64 `json:"cv" format:"double" validate:"required"`
	// IsentropicExponent is −(v/p)(∂p/∂v)_T · cp/cv.
	IsentropicExponent float64 `json:"isentropic_exponent" format:"double" validate:"required"`
	// SpeedOfSound, m/s.
	SpeedOfSound float64 `json:"speed_of_sound" format:"double" validate:"required"`
	// JouleThomson is (∂T/∂p)_h, K/Pa.
	JouleThomson float64 `json:"joule_thomson" format:"double" validate:"required"`
	// SchultzX is (T/v)(∂v/∂T)_p − 1 (0 for an ideal gas).
	SchultzX float64 `json:"schultz_x" format:"double" validate:"required"`
	// SchultzY is −(p/v)(∂v/∂p)_T (1 for an ideal gas).
	SchultzY float64 `json:"schultz_y" format:"double" validate:"required"`
	// Phase is "gas", "supercritical", "liquid" or "two-phase".
	Phase string `json:"phase" enums:"gas,supercritical,liquid,two-phase" validate:"required"`
	// WaterDewPoint at this pressure, K (absent without water).
	WaterDewPoint *float64 `json:"water_dew_point,omitempty" format:"double"`
	// Composition is the normalised mole-fraction composition.
	Composition []ComponentFraction `json:"composition" validate:"required"`
	// Notes on validity and phase.
	Notes          []string      `json:"notes" validate:"required"`
	ReferenceState string        `json:"reference_state" validate:"required"`
	Provenance     ProvenanceOut `json:"provenance" validate:"required"`
	// Cautions are short sentences, as in a stage answer: what the numbers
	// are, and that the manufacturer, the standards, local codes and
	// licensed engineering practice govern.
	Cautions []string `json:"cautions" validate:"required"`
}

// ComponentFraction is one component's mole fraction.
type ComponentFraction struct {
	Component    string  `json:"component" example:"methane" validate:"required"`
	MoleFraction float64 `json:"mole_fraction" format:"double" example:"0.9" validate:"required"`
}

// ComponentsResponse is the gas catalogue.
type ComponentsResponse struct {
	Components []ComponentOut `json:"components" validate:"required"`
	Mixtures   []MixtureOut   `json:"mixtures" validate:"required"`
	// BinaryInteraction is the built-in kij table of the cubic models, each
	// value with its source; pairs not listed use kij = 0.
	BinaryInteraction []DefaultInteractionOut `json:"binary_interaction" validate:"required"`
	// HeatCapacityHandOver says how cp is made continuous where one range
	// of a component's correlation hands over to the next (the ranges in
	// heat_capacity are the published ones).
	HeatCapacityHandOver string `json:"heat_capacity_hand_over" validate:"required"`
}

// DefaultInteractionOut is one built-in kij of a cubic model.
type DefaultInteractionOut struct {
	// Model is "peng-robinson" or "srk".
	Model string `json:"model" example:"peng-robinson" validate:"required"`
	BinaryInteractionOut
}

// ComponentOut is one catalogue component.
type ComponentOut struct {
	ID      string   `json:"id" example:"methane" validate:"required"`
	Formula string   `json:"formula" example:"CH4" validate:"required"`
	Names   []string `json:"names" validate:"required"`
	// MolarMass, kg/mol.
	MolarMass float64 `json:"molar_mass" format:"double" validate:"required"`
	// CriticalTemperature, K.
	CriticalTemperature float64 `json:"critical_temperature" format:"double" validate:"required"`
	// CriticalPressure, Pa.
	CriticalPressure float64 `json:"critical_pressure" format:"double" validate:"required"`
	// AcentricFactor, dimensionless.
	AcentricFactor float64 `json:"acentric_factor" format:"double" validate:"required"`
	// HeatCapacity lists the ideal-gas cp correlations with their ranges.
	HeatCapacity []CpRangeOut `json:"heat_capacity" validate:"required"`
	// HeatCapacityBlend names the constituents of a pseudo-component's cp.
	HeatCapacityBlend []ComponentFraction `json:"heat_capacity_blend,omitempty"`
	Sources           []string            `json:"sources" validate:"required"`
}

// CpRangeOut is one ideal-gas cp correlation range.
type CpRangeOut struct {
	// Form is "shomate" (NIST, cp in J/(mol K) of t = T/1000) or "poly-r" (cp/R polynomial in T).
	Form string `json:"form" enums:"shomate,poly-r" validate:"required"`
	// TLow and THigh bound the range, K.
	TLow         float64   `json:"t_low" format:"double" validate:"required"`
	THigh        float64   `json:"t_high" format:"double" validate:"required"`
	Coefficients []float64 `json:"coefficients" validate:"required"`
	Source       string    `json:"source" validate:"required"`
}

// MixtureOut is a named mixture.
type MixtureOut struct {
	ID        string              `json:"id" example:"dry-air" validate:"required"`
	Names     []string            `json:"names" validate:"required"`
	Fractions []ComponentFraction `json:"fractions" validate:"required"`
	Source    string              `json:"source" validate:"required"`
}

type gasHandler struct {
	svc     GasPropertyService
	decoder *requestDecoder
	enc     *answerEncoder
	log     *slog.Logger
}

// properties returns the properties of a gas at one state.
//
//	@Summary		Properties of a gas at one state
//	@Description	Density, compressibility, enthalpy, entropy, cp, cv, real-gas isentropic exponent, speed of sound, Joule-Thomson coefficient and Schultz X/Y of a gas under the chosen model, with its phase and validity notes.
//	@Tags			gas
//	@Accept			json
//	@Produce		json
//	@Param			state	body		PropertiesRequest	true	"gas and state"
//	@Success		200		{object}	PropertiesResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field or bad composition"
//	@Failure		422		{object}	Problem	"state outside the model"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		408		{object}	Problem	"the body did not arrive within the server's read timeout"
//	@Failure		415		{object}	Problem	"Content-Type is not application/json (or another +json type)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			gasProperties
//	@Router			/v1/gas/properties [post]
func (h gasHandler) properties(c *gin.Context) {
	var req PropertiesRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	ambient := float64(physics.StandardAtmosphere)
	if req.Ambient != nil {
		a, err := si(req.Ambient, dimPressure, "ambient", ambient)
		if err != nil {
			fail(c, h.log, err)
			return
		}
		ambient = *a
	}
	t, err := si(req.Temperature, dimTemperature, "temperature", ambient)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	p, err := si(req.Pressure, dimPressure, "pressure", ambient)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	res, err := h.svc.GasProperties(c.Request.Context(), gasInputOf(req.Gas), *t, *p)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	st := res.State
	out := PropertiesResponse{Model: res.Provenance.GasModel, Temperature: float64(st.Temperature), Pressure: float64(st.Pressure),
		Density: float64(st.Density), Compressibility: st.Compressibility, MolarMass: st.MolarMass,
		Enthalpy: float64(st.Enthalpy), Entropy: float64(st.Entropy), Cp: float64(st.Cp), Cv: float64(st.Cv),
		IsentropicExponent: st.IsentropicExponent, SpeedOfSound: float64(st.SoundSpeed), JouleThomson: st.JouleThomson,
		SchultzX: st.SchultzX, SchultzY: st.SchultzY, Phase: string(st.Phase), Composition: make([]ComponentFraction, 0, len(res.Components)),
		Notes: append([]string{}, res.Notes...), ReferenceState: service.ReferenceState, Provenance: provenanceOut(res.Provenance),
		Cautions: res.Cautions}
	if res.WaterDewPoint > 0 {
		dp := res.WaterDewPoint
		out.WaterDewPoint = &dp
	}
	for i, n := range res.Components {
		out.Composition = append(out.Composition, ComponentFraction{Component: n, MoleFraction: res.MoleFractions[i]})
	}
	if err := propsFinite.check(&out); err != nil {
		fail(c, h.log, err)
		return
	}
	h.enc.write(c, h.log, http.StatusOK, &out)
}

// components lists the gas catalogue.
//
//	@Summary		The gas component catalogue
//	@Description	Every component with its molar mass, critical constants, acentric factor, ideal-gas cp correlations and their sources, the named mixtures, the built-in binary interaction parameters (kij) of the cubic models with their sources, and how cp is made continuous between correlation ranges.
//	@Tags			gas
//	@Produce		json
//	@Success		200	{object}	ComponentsResponse
//	@Failure		401	{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		503	{object}	Problem	"overloaded (retry after the Retry-After header's seconds)"
//	@ID				gasComponents
//	@Router			/v1/gas/components [get]
func (h gasHandler) components(c *gin.Context) {
	out := ComponentsResponse{Components: []ComponentOut{}, Mixtures: []MixtureOut{}, BinaryInteraction: []DefaultInteractionOut{},
		HeatCapacityHandOver: gas.HandOverMethod}
	for _, k := range h.svc.DefaultInteractions() {
		out.BinaryInteraction = append(out.BinaryInteraction, DefaultInteractionOut{Model: k.Model,
			BinaryInteractionOut: BinaryInteractionOut{Pair: []string{k.A, k.B}, Kij: k.Kij, Source: k.Source}})
	}
	for _, k := range h.svc.Components() {
		co := ComponentOut{ID: k.ID, Formula: k.Formula, Names: k.Names, MolarMass: k.MolarMass,
			CriticalTemperature: float64(k.Tc), CriticalPressure: float64(k.Pc), AcentricFactor: k.Omega,
			HeatCapacity: []CpRangeOut{}, Sources: k.Sources}
		for _, r := range k.HeatCapacity.Ranges {
			co.HeatCapacity = append(co.HeatCapacity, CpRangeOut{Form: string(r.Form), TLow: float64(r.TLow), THigh: float64(r.THigh),
				Coefficients: append([]float64(nil), r.Coef[:]...), Source: r.Source})
		}
		for _, b := range k.HeatCapacity.Blend {
			co.HeatCapacityBlend = append(co.HeatCapacityBlend, ComponentFraction{Component: b.Component, MoleFraction: b.Fraction})
		}
		out.Components = append(out.Components, co)
	}
	for _, m := range h.svc.Mixtures() {
		mo := MixtureOut{ID: m.ID, Names: m.Names, Source: m.Source}
		for _, f := range m.Fractions {
			mo.Fractions = append(mo.Fractions, ComponentFraction{Component: f.Name, MoleFraction: f.Value})
		}
		out.Mixtures = append(out.Mixtures, mo)
	}
	c.JSON(http.StatusOK, out)
}

// gasInputOf converts the gas part of a request.
func gasInputOf(g GasSpec) service.GasInput {
	in := service.GasInput{Model: g.Model, Cp: g.Cp, Gamma: g.Gamma, Composition: g.Composition,
		CompositionBasis: g.CompositionBasis, RelativeHumidity: g.RelativeHumidity, Service: g.Service}
	for _, k := range g.BinaryInteraction {
		in.Interactions = append(in.Interactions, service.Interaction{A: k.Pair[0], B: k.Pair[1], Kij: must(k.Kij)})
	}
	return in
}

func provenanceOut(p service.Provenance) ProvenanceOut {
	out := ProvenanceOut{ModelVersion: p.ModelVersion, ServiceVersion: p.ServiceVersion, GasModel: p.GasModel, InputHash: p.InputHash,
		Methods: make([]MethodOut, 0, len(p.Methods)), DefaultsApplied: make([]DefaultOut, 0, len(p.Defaults))}
	for _, m := range p.Methods {
		out.Methods = append(out.Methods, MethodOut(m))
	}
	for _, d := range p.Defaults {
		out.DefaultsApplied = append(out.DefaultsApplied, DefaultOut(d))
	}
	for _, k := range p.BinaryInteraction {
		out.BinaryInteraction = append(out.BinaryInteraction, BinaryInteractionOut{Pair: []string{k.A, k.B}, Kij: k.Kij, Source: k.Source})
	}
	return out
}
