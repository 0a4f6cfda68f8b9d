package api

import (
	"context"
	"log/slog"
	"net/http"

	"github.com/gin-gonic/gin"

	"stagewright/physics"
	"stagewright/service"
)

// SectionSizer is what the section handler needs of the service layer.
type SectionSizer interface {
	SizeSection(ctx context.Context, d service.SectionDuty) (service.SectionResult, error)
}

type sectionHandler struct {
	svc     SectionSizer
	decoder *requestDecoder
	log     *slog.Logger
}

// size sizes a multi-stage section.
//
//	@Summary		Size a multi-stage section with intercooling
//	@Description	Turns a duty too big for one impeller into a section: the stage count (given, or the least for which every stage stays inside its levels: tip speed, stage pressure ratio and head, discharge temperature, flow-coefficient band), the split (equal polytropic head), coolers between stages (outlet temperature or coolant + approach, pressure drop, condensate removed by a flash at the outlet), every stage's full answer, the section totals (mechanical losses once per shaft), warnings and the machine as built for /v1/machine/rate, /map and /check. "geared" gives each stage its own speed; "inline" one shaft speed. Results are preliminary estimates; see the cautions field.
//	@Tags			section
//	@Accept			json
//	@Produce		json
//	@Param			duty	body		SectionRequest	true	"section duty: the stage duty plus stage count, arrangement and intercooling"
//	@Success		200		{object}	SectionResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, missing or wrongly shaped field"
//	@Failure		422		{object}	Problem	"physically impossible duty, cooler or stage count, or a state outside the gas model"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			sizeSection
//	@Router			/v1/section/size [post]
func (h sectionHandler) size(c *gin.Context) {
	var req SectionRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	duty, err := sectionDutyOf(req)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	res, err := bounded(c.Request.Context(), h.log, "section sizing", func(ctx context.Context) (service.SectionResult, error) { return h.svc.SizeSection(ctx, duty) })
	if err != nil {
		fail(c, h.log, err)
		return
	}
	out, err := sectionResponseOf(res)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	c.JSON(http.StatusOK, out)
}

// sectionDutyOf converts a decoded section request into the service duty.
func sectionDutyOf(r SectionRequest) (service.SectionDuty, error) {
	sd, err := dutyOf(StageRequest{Gas: r.Gas, Suction: r.Suction, DischargePressure: r.DischargePressure, PressureRatio: r.PressureRatio,
		Flow: r.Flow, Speed: r.Speed, TipDiameter: r.TipDiameter, SpeedTarget: r.SpeedTarget, SpeedStep: r.SpeedStep,
		Efficiency: r.Efficiency, MechanicalEfficiency: r.MechanicalEfficiency, MechanicalLosses: r.MechanicalLosses,
		Impeller: r.Impeller, Diffuser: r.Diffuser, Options: r.Options, Driver: r.Driver, LimitOverrides: r.LimitOverrides})
	if err != nil {
		return service.SectionDuty{}, err
	}
	d := service.SectionDuty{StageDuty: sd, StageCount: r.StageCount, Arrangement: r.Arrangement}
	if ic := r.Intercooling; ic != nil {
		out := &service.Intercooling{Approach: ic.Approach}
		if ic.AfterStages != nil {
			out.AfterStages, out.AfterStagesGiven = append([]int{}, (*ic.AfterStages)...), true
		}
		ambient := float64(physics.StandardAtmosphere)
		if out.OutletTemperature, err = si(ic.OutletTemperature, dimTemperature, "intercooling.outlet_temperature", ambient); err != nil {
			return d, err
		}
		if out.CoolantTemperature, err = si(ic.CoolantTemperature, dimTemperature, "intercooling.coolant_temperature", ambient); err != nil {
			return d, err
		}
		// A difference: gauge units ("0.2 barg") add no ambient pressure.
		dp, err := si(ic.PressureDrop, dimPressure, "intercooling.pressure_drop", 0)
		if err != nil {
			return d, err
		}
		if dp != nil {
			out.PressureDrop = *dp
		}
		d.Intercooling = out
	}
	return d, nil
}

// sectionResponseOf renders a sized section.
func sectionResponseOf(res service.SectionResult) (SectionResponse, error) {
	out := SectionResponse{StageCount: res.StageCount, StageCountBasis: res.StageCountBasis, Arrangement: res.Arrangement,
		Stages: []StageResponse{}, Coolers: []SectionCoolerOut{}, Warnings: []SectionWarningOut{},
		Discharge: SectionStateOut{Pressure: float64(res.Discharge.Pressure), Temperature: float64(res.Discharge.Temperature)},
		Head:      SectionHeadOut{Polytropic: res.PolytropicHead},
		Power: PowerOut{Gas: res.Power.Gas, Shaft: res.Power.Shaft, MechanicalEfficiency: res.Power.MechanicalEfficiency,
			DriverRating: res.Power.DriverRating, DriverMargin: res.Power.DriverMargin},
		Split: res.Split, Verdict: res.Verdict, Provenance: provenanceOut(res.Provenance), Cautions: res.Cautions}
	if res.Speed > 0 {
		v := res.Speed
		out.Speed = &v
	}
	for _, st := range res.Stages {
		so, err := responseOf(st)
		if err != nil {
			return SectionResponse{}, err
		}
		out.Stages = append(out.Stages, so)
	}
	for _, c := range res.Coolers {
		out.Coolers = append(out.Coolers, SectionCoolerOut{AfterStage: c.AfterStage, Duty: c.Duty, Condensate: c.Condensate,
			Inlet:  SectionStateOut{Pressure: float64(c.Inlet.Pressure), Temperature: float64(c.Inlet.Temperature)},
			Outlet: SectionStateOut{Pressure: float64(c.Outlet.Pressure), Temperature: float64(c.Outlet.Temperature)}})
	}
	for _, w := range res.Warnings {
		out.Warnings = append(out.Warnings, SectionWarningOut{Code: w.Code, Severity: w.Severity, Message: w.Message,
			Value: w.Value, Limit: w.Limit, Margin: w.Margin, Unit: w.Unit, Basis: w.Basis, Stage: w.Stage})
	}
	out.Machine = machineSpecOf(res.Machine)
	if err := allFinite(out); err != nil {
		return SectionResponse{}, err
	}
	return out, nil
}

// gasSpecOf is the API form of a service gas input (the inverse of gasInputOf).
func gasSpecOf(g service.GasInput) GasSpec {
	out := GasSpec{Model: g.Model, Cp: g.Cp, Gamma: g.Gamma, Composition: g.Composition, CompositionBasis: g.CompositionBasis,
		RelativeHumidity: g.RelativeHumidity, Service: g.Service}
	for _, k := range g.Interactions {
		kij := k.Kij
		out.BinaryInteraction = append(out.BinaryInteraction, BinaryInteractionSpec{Pair: []string{k.A, k.B}, Kij: &kij})
	}
	return out
}
