package api

import (
	"context"
	"errors"
	"fmt"
	"log/slog"
	"net/http"

	"github.com/gin-gonic/gin"

	"stagewright/physics"
	"stagewright/service"
)

// MachineService is what the machine handlers need of the service layer.
type MachineService interface {
	RateMachine(ctx context.Context, d service.RateDuty) (service.Rating, error)
	MapMachine(ctx context.Context, d service.MapDuty) (service.Map, error)
}

type machineHandler struct {
	svc     MachineService
	decoder *requestDecoder
	log     *slog.Logger
}

// suctionOf reads a suction state in SI, with its ambient pressure for gauge units.
func suctionOf(s SuctionSpec) (p, t float64, err error) {
	ambient := float64(physics.StandardAtmosphere)
	if s.Ambient != nil {
		a, err := si(s.Ambient, dimPressure, "suction.ambient", ambient)
		if err != nil {
			return 0, 0, err
		}
		if !(*a > 0) {
			return 0, 0, &service.InputError{Field: "suction.ambient", Err: errors.New("the ambient pressure must be above 0 Pa absolute")}
		}
		ambient = *a
	}
	pp, err := si(s.Pressure, dimPressure, "suction.pressure", ambient)
	if err != nil {
		return 0, 0, err
	}
	tt, err := si(s.Temperature, dimTemperature, "suction.temperature", ambient)
	if err != nil {
		return 0, 0, err
	}
	p, t = must(pp), must(tt)
	if !(p > 0) {
		return 0, 0, &service.InputError{Field: "suction.pressure", Err: fmt.Errorf("the suction pressure must be above 0 Pa absolute, not %g", p)}
	}
	if !(t > 0) {
		return 0, 0, &service.InputError{Field: "suction.temperature", Err: fmt.Errorf("the suction temperature must be above 0 K, not %g K", t)}
	}
	return p, t, nil
}

// rateDutyOf converts a rate request into SI.
func rateDutyOf(r RateRequest) (service.RateDuty, error) {
	m, err := machineOfSpec(r.Machine, "machine")
	if err != nil {
		return service.RateDuty{}, err
	}
	p, t, err := suctionOf(r.Suction)
	if err != nil {
		return service.RateDuty{}, err
	}
	d := service.RateDuty{Machine: m, Gas: gasInputOf(r.Gas), SuctionPressure: p, SuctionTemperature: t}
	if d.MassFlow, err = si(r.Flow.Mass, dimMassFlow, "flow.mass", 0); err != nil {
		return d, err
	}
	if d.ActualVolumeFlow, err = si(r.Flow.ActualVolume, dimVolumeFlow, "flow.actual_volume", 0); err != nil {
		return d, err
	}
	if d.StandardVolumeFlow, d.StandardReference, err = standardFlow(r.Flow); err != nil {
		return d, err
	}
	if d.Speed, err = si(r.Speed, dimSpeed, "speed", 0); err != nil {
		return d, err
	}
	ambient := float64(physics.StandardAtmosphere)
	if r.Suction.Ambient != nil {
		if a, err := si(r.Suction.Ambient, dimPressure, "suction.ambient", ambient); err == nil {
			ambient = *a
		}
	}
	if d.DischargePressure, err = si(r.DischargePressure, dimPressure, "discharge_pressure", ambient); err != nil {
		return d, err
	}
	return d, nil
}

// rate rates an installed machine at one operating point.
//
//	@Summary		Rate an installed machine at an operating point
//	@Description	Takes a machine as /v1/stage/size answers it (or typed from a datasheet: the least it needs is in the README, "Machines"), a gas, a suction state, a flow and the speed (or the discharge pressure, for which the speed is solved), and answers the discharge state, heads, efficiencies, power, the operating point on the estimated map (flow coefficient, design flow ratio, surge and choke margins and flows), the velocity triangles of each stage, every limit check, warnings, provenance and cautions. Off-design work from the Euler equation with slip; efficiency after Casey & Robinson (2013); surge and choke are estimates.
//	@Tags			machine
//	@Accept			json
//	@Produce		json
//	@Param			rating	body		RateRequest	true	"machine and operating point"
//	@Success		200		{object}	RateResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, missing or wrongly shaped field (a machine dimension missing is named under /machine)"
//	@Failure		422		{object}	Problem	"physically impossible machine or operating point (e.g. a flow past the estimated choke flow, named at /flow with the choke flow)"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			rateMachine
//	@Router			/v1/machine/rate [post]
func (h machineHandler) rate(c *gin.Context) {
	var req RateRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	out, err := h.rateOne(c.Request.Context(), req)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	c.JSON(http.StatusOK, out)
}

func (h machineHandler) rateOne(ctx context.Context, req RateRequest) (RateResponse, error) {
	d, err := rateDutyOf(req)
	if err != nil {
		return RateResponse{}, err
	}
	r, err := bounded(ctx, h.log, "machine rating", func(ctx context.Context) (service.Rating, error) { return h.svc.RateMachine(ctx, d) })
	if err != nil {
		return RateResponse{}, err
	}
	return rateResponseOf(r)
}

// rateBatch rates many operating points.
//
//	@Summary		Rate an installed machine at many operating points in one call
//	@Description	Rates up to 500 operating points independently (in parallel over the cores) and returns one item per rating in request order: a result, or the problem the rating would have had on its own (its pointers are relative to the rating). A malformed body or a rating of the wrong JSON shape rejects the whole batch with a 400 whose pointers start with /ratings/INDEX.
//	@Tags			machine
//	@Accept			json
//	@Produce		json
//	@Param			batch	body		RateBatchRequest	true	"operating points"
//	@Success		200		{object}	RateBatchResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, or a rating of the wrong shape"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			rateMachineBatch
//	@Router			/v1/machine/rate/batch [post]
func (h machineHandler) rateBatch(c *gin.Context) {
	var req RateBatchRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	ctx := c.Request.Context()
	out := RateBatchResponse{Results: make([]RateBatchItem, len(req.Ratings))}
	if err := runParallel(ctx, len(req.Ratings), func(i int) { out.Results[i] = h.one(c, i, req.Ratings[i]) }); err != nil {
		fail(c, h.log, err)
		return
	}
	out.Succeeded, out.Failed = tally(out.Results, func(r RateBatchItem) int { return r.Status })
	c.JSON(http.StatusOK, out)
}

// one rates item i of a batch, recovering a panic into a 500 item (the
// worker goroutine is out of reach of the recovery middleware).
func (h machineHandler) one(c *gin.Context, i int, r RateRequest) RateBatchItem {
	res, status, p := batchItem(c, h.log, i, func() (RateResponse, error) { return h.rateOne(c.Request.Context(), r) })
	return RateBatchItem{Index: i, Status: status, Result: res, Problem: p}
}

// Map content types.
const (
	mimeJSON = "application/json"
	mimeSVG  = "image/svg+xml"
	mimeCSV  = "text/csv"
)

// mapChart answers an installed machine's estimated performance map.
//
//	@Summary		Estimated performance map of an installed machine
//	@Description	Speed lines (polytropic head, pressure ratio, efficiency and power against actual inlet volume flow) from the estimated surge flow to just short of the estimated choke flow, the surge and choke lines, the design point and an optional operating point, for a gas at a suction state. Content negotiation on the same request: Accept application/json (default) answers the data, image/svg+xml the chart (drawn with gonum/plot), text/csv one row per point with a header naming the units. Surge and choke are estimates.
//	@Tags			machine
//	@Accept			json
//	@Produce		json
//	@Produce		image/svg+xml
//	@Produce		text/csv
//	@Param			map	body		MapRequest	true	"machine, gas, suction, speeds"
//	@Success		200	{object}	MapResponse
//	@Failure		400	{object}	Problem	"malformed JSON, unknown field, missing or wrongly shaped field"
//	@Failure		422	{object}	Problem	"physically impossible machine, speed outside the machine's range, or a state outside the gas model"
//	@Failure		401	{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413	{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500	{object}	Problem
//	@Failure		503	{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504	{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			mapMachine
//	@Router			/v1/machine/map [post]
func (h machineHandler) mapChart(c *gin.Context) {
	var req MapRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	out, err := h.mapOne(c.Request.Context(), req)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	switch c.NegotiateFormat(mimeJSON, mimeSVG, mimeCSV) {
	case mimeSVG:
		svg, err := mapSVG(out)
		if err != nil {
			fail(c, h.log, fmt.Errorf("api: map chart: %w", err))
			return
		}
		c.Data(http.StatusOK, mimeSVG, svg)
	case mimeCSV:
		c.Data(http.StatusOK, "text/csv; charset=utf-8", mapCSV(out))
	default:
		c.JSON(http.StatusOK, out)
	}
}

func (h machineHandler) mapOne(ctx context.Context, req MapRequest) (MapResponse, error) {
	d, err := mapDutyOf(req)
	if err != nil {
		return MapResponse{}, err
	}
	m, err := bounded(ctx, h.log, "machine map", func(ctx context.Context) (service.Map, error) { return h.svc.MapMachine(ctx, d) })
	if err != nil {
		return MapResponse{}, err
	}
	return mapResponseOf(m)
}
