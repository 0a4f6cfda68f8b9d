package api

import (
	"context"
	"fmt"
	"log/slog"
	"net/http"
	"strconv"

	"github.com/gin-gonic/gin"

	"stagewright/physics"
	"stagewright/service"
)

// MaxCheckBatch is the largest number of checks one batch may carry.
const MaxCheckBatch = 200

// MachineChecker is what the check handler needs of the service layer.
type MachineChecker interface {
	CheckMachine(ctx context.Context, req service.CheckRequest) (service.CheckResult, error)
	CheckMachineShared(ctx context.Context, req service.CheckRequest, memo *service.CheckMemo) (service.CheckResult, error)
}

type checkHandler struct {
	svc     MachineChecker
	decoder *requestDecoder
	log     *slog.Logger
}

// MachineCheckRequest is a duty-change check: an installed machine (as a
// design endpoint answered it, or typed from a datasheet), the new duty,
// and optionally the duty to compare with.
type MachineCheckRequest struct {
	// Machine is the installed machine, unchanged from a design answer.
	Machine MachineSpec `json:"machine" binding:"required"`
	// Duty is the new duty the machine is checked against.
	Duty CheckDutySpec `json:"duty" binding:"required"`
	// Baseline is the duty to compare with; default the machine's own
	// design duty (first stage's design gas, suction and volume flow, last
	// stage's design discharge pressure).
	Baseline *CheckDutySpec `json:"baseline,omitempty"`
}

// CheckDutySpec is a process duty: the gas, its suction state, one flow and
// the discharge pressure the process needs.
type CheckDutySpec struct {
	Gas     GasSpec     `json:"gas" binding:"required"`
	Suction SuctionSpec `json:"suction" binding:"required"`
	Flow    FlowSpec    `json:"flow" binding:"required"`
	// DischargePressure is the discharge total pressure the process needs, Pa absolute (or a string with a unit).
	DischargePressure *Quantity `json:"discharge_pressure" binding:"required" swaggertype:"primitive,number" format:"double" example:"420000" extensions:"x-unit-string=pressure"`
}

// MachineCheckBatchRequest carries many checks (a case study, a nightly run).
type MachineCheckBatchRequest struct {
	// Checks are run independently; each follows the MachineCheckRequest schema.
	Checks []MachineCheckRequest `json:"checks" binding:"required,min=1,max=200,dive"`
}

// MachineCheckResponse is the answer of a duty-change check. Every number
// is SI; the unit is in each field's description.
type MachineCheckResponse struct {
	// Verdict is "fits" (a speed in the range, right of the surge control
	// line, short of choke with margin, inside the driver rating and every
	// limit rule's limit), "fits-with-recycle" (left of the control line:
	// anti-surge recycle raises the compressor's flow to it; see recycle),
	// "fits-with-throttling" (even at the minimum speed the machine makes
	// more than the discharge pressure; see throttling) or "does-not-fit"
	// (see reasons).
	Verdict string `json:"verdict" enums:"fits,fits-with-recycle,fits-with-throttling,does-not-fit" example:"fits" validate:"required"`
	// Reasons are the causes of a does-not-fit verdict (empty otherwise).
	Reasons []CheckReasonOut `json:"reasons" validate:"required"`
	// OperatingPoint is the machine at the new duty, with any recycle or throttling.
	OperatingPoint CheckPointOut `json:"operating_point" validate:"required"`
	// BaselinePoint is the machine at the baseline duty.
	BaselinePoint CheckPointOut `json:"baseline_point" validate:"required"`
	// Recycle is the anti-surge recycle of a fits-with-recycle duty.
	Recycle *RecycleOut `json:"recycle,omitempty"`
	// Throttling is the suction throttling of a fits-with-throttling duty.
	Throttling *ThrottlingOut `json:"throttling,omitempty"`
	// Margins are the operating margins (surge, choke, speed to maximum
	// continuous and to minimum, power to driver rating) and every limit
	// rule, before (baseline) and after (new duty).
	Margins []MarginChangeOut `json:"margins" validate:"required"`
	// Changes are the inputs that changed and the results that moved, those
	// with a limit first by how much of their margin the move used up.
	Changes []ChangeOut `json:"changes" validate:"required"`
	// Similarity compares the new duty with the baseline by the ASME PTC 10
	// similarity quantities; a quantity outside its band means the
	// machine's known performance is being extrapolated.
	Similarity []SimilarityOut `json:"similarity" validate:"required"`
	// SpeedRange is the machine's speed range as used (given or default), rev/min.
	SpeedRange CheckSpeedRangeOut `json:"speed_range" validate:"required"`
	// DriverRating is the driver rating as used (given or default), W.
	DriverRating float64 `json:"driver_rating" format:"double" example:"750000" validate:"required"`
	// SurgeControlMargin is the control line's distance from surge as used,
	// a fraction of the surge flow.
	SurgeControlMargin float64 `json:"surge_control_margin" format:"double" example:"0.1" validate:"required"`
	// Warnings are the new duty's warnings (limits, validity of the physics).
	Warnings   []WarningOut  `json:"warnings" validate:"required"`
	Provenance ProvenanceOut `json:"provenance" validate:"required"`
	// Cautions are short sentences: what the verdict is and is not, and the
	// protections the machine needs; they defer to the manufacturer.
	Cautions []string `json:"cautions" validate:"required"`
}

// CheckReasonOut is one cause of a does-not-fit verdict.
type CheckReasonOut struct {
	// Code is "speed-above-maximum", "speed-below-minimum", "choke",
	// "driver-overload", "surge" or a limit rule's code (e.g.
	// "discharge-temperature", "tip-speed").
	Code    string `json:"code" example:"speed-above-maximum" validate:"required"`
	Message string `json:"message" validate:"required"`
	// Value is what the duty needs or reaches, in unit.
	Value float64 `json:"value" format:"double" validate:"required"`
	// Limit is the level it passes, in unit.
	Limit float64 `json:"limit" format:"double" validate:"required"`
	Unit  string  `json:"unit" example:"rev/min" validate:"required"`
}

// CheckSpeedRangeOut is the machine's speed range, rev/min.
type CheckSpeedRangeOut struct {
	Minimum           float64 `json:"minimum" format:"double" example:"8050" validate:"required"`
	MaximumContinuous float64 `json:"maximum_continuous" format:"double" example:"12075" validate:"required"`
}

// CheckPointOut is the machine at one operating point.
type CheckPointOut struct {
	// Speed is the first stage's speed, rev/min.
	Speed float64 `json:"speed" format:"double" example:"11500" validate:"required"`
	// Flow is what the compressor moves (the duty's flow plus any recycle).
	Flow CheckFlowOut `json:"flow" validate:"required"`
	// Suction is the compressor's suction total state (after any throttle valve).
	Suction CheckStateOut `json:"suction" validate:"required"`
	// Discharge is the machine's discharge total state.
	Discharge CheckStateOut `json:"discharge" validate:"required"`
	// Head is the summed head of the stages, J/kg.
	Head HeadOut `json:"head" validate:"required"`
	// Efficiency is the machine's total-to-total efficiency (summed heads over summed work).
	Efficiency CheckEfficiencyOut `json:"efficiency" validate:"required"`
	// Power is gas and shaft power, W, with any recycle.
	Power CheckPowerOut `json:"power" validate:"required"`
	// Surge is the estimated surge line at this speed.
	Surge SurgeOut `json:"surge" validate:"required"`
	// Choke is the estimated choke flow at this speed.
	Choke ChokeOut `json:"choke" validate:"required"`
	// FlowCoefficient is the first stage's φ = Q01/(U2 π D2²/4).
	FlowCoefficient float64 `json:"flow_coefficient" format:"double" example:"0.08" validate:"required"`
	// DesignFlowRatio is the first stage's flow over its design flow at the same speed ratio.
	DesignFlowRatio float64 `json:"design_flow_ratio" format:"double" example:"1" validate:"required"`
	// Stages are the stages at this point, in flow order.
	Stages []CheckStageOut `json:"stages" validate:"required"`
}

// CheckFlowOut is a flow: mass and actual volume at the suction state.
type CheckFlowOut struct {
	// Mass flow, kg/s.
	Mass float64 `json:"mass" format:"double" example:"4.1" validate:"required"`
	// ActualVolume is the volume flow at the suction state, m3/s.
	ActualVolume float64 `json:"actual_volume" format:"double" example:"1.9" validate:"required"`
}

// CheckStateOut is a total state.
type CheckStateOut struct {
	// Pressure, Pa absolute.
	Pressure float64 `json:"pressure" format:"double" example:"420000" validate:"required"`
	// Temperature, K.
	Temperature float64 `json:"temperature" format:"double" example:"420" validate:"required"`
}

// CheckEfficiencyOut holds the total-to-total efficiencies.
type CheckEfficiencyOut struct {
	Polytropic float64 `json:"polytropic" format:"double" example:"0.8" validate:"required"`
	Isentropic float64 `json:"isentropic" format:"double" example:"0.78" validate:"required"`
}

// CheckPowerOut is the power, W.
type CheckPowerOut struct {
	// Gas is the mass flow × work summed over the stages, W.
	Gas float64 `json:"gas" format:"double" example:"480000" validate:"required"`
	// Shaft is gas power over the mechanical efficiency, W.
	Shaft float64 `json:"shaft" format:"double" example:"490000" validate:"required"`
}

// SurgeOut is the estimated surge line at the point's speed (an estimate).
type SurgeOut struct {
	// Flow is the machine inlet volume flow at which the first stage to surge does so, m3/s (0: not estimated).
	Flow float64 `json:"flow" format:"double" example:"1.3" validate:"required"`
	// ControlFlow is the anti-surge control line's flow at this speed, m3/s.
	ControlFlow float64 `json:"control_flow" format:"double" example:"1.43" validate:"required"`
	// Margin is Q/Q_surge − 1.
	Margin float64 `json:"margin" format:"double" example:"0.3" validate:"required"`
	// Stage is the stage (1-based) that surges first (0: not estimated).
	Stage int `json:"stage" example:"1" validate:"required"`
}

// ChokeOut is the estimated choke flow at the point's speed (an estimate).
type ChokeOut struct {
	// Flow is the machine inlet volume flow at which the first stage to choke does so, m3/s (0: not estimated).
	Flow float64 `json:"flow" format:"double" example:"2.6" validate:"required"`
	// Margin is 1 − Q/Q_choke.
	Margin float64 `json:"margin" format:"double" example:"0.25" validate:"required"`
	// Stage is the stage (1-based) that chokes first (0: not estimated).
	Stage int `json:"stage" example:"1" validate:"required"`
}

// CheckStageOut is one stage at the operating point.
type CheckStageOut struct {
	// Stage number, from 1.
	Stage int `json:"stage" example:"1" validate:"required"`
	// Speed of this stage, rev/min.
	Speed float64 `json:"speed" format:"double" validate:"required"`
	// Suction is the stage's suction total state.
	Suction CheckStateOut `json:"suction" validate:"required"`
	// Discharge is the stage's discharge total state (before any cooler).
	Discharge CheckStateOut `json:"discharge" validate:"required"`
	// VolumeFlow is the actual volume flow entering the stage, m3/s.
	VolumeFlow float64 `json:"volume_flow" format:"double" validate:"required"`
	// PolytropicHead of the stage, J/kg.
	PolytropicHead float64 `json:"polytropic_head" format:"double" validate:"required"`
	// PolytropicEfficiency of the stage.
	PolytropicEfficiency float64 `json:"polytropic_efficiency" format:"double" validate:"required"`
	// FlowCoefficient of the stage.
	FlowCoefficient float64 `json:"flow_coefficient" format:"double" validate:"required"`
	// DesignFlowRatio is the stage's flow over its design flow at the same speed ratio.
	DesignFlowRatio float64 `json:"design_flow_ratio" format:"double" validate:"required"`
	// SurgeMargin is the stage's Q/Q_surge − 1, ChokeMargin its 1 − Q/Q_choke (estimates).
	SurgeMargin float64 `json:"surge_margin" format:"double" validate:"required"`
	ChokeMargin float64 `json:"choke_margin" format:"double" validate:"required"`
}

// RecycleOut is the anti-surge recycle that holds the compressor on its
// control line.
type RecycleOut struct {
	// Mass is the recycled mass flow, kg/s.
	Mass float64 `json:"mass" format:"double" example:"1.2" validate:"required"`
	// ActualVolume is the recycled volume flow at suction conditions, m3/s.
	ActualVolume float64 `json:"actual_volume" format:"double" example:"0.5" validate:"required"`
	// CompressorFlow is what the compressor then moves (duty plus recycle).
	CompressorFlow CheckFlowOut `json:"compressor_flow" validate:"required"`
	// ShaftPower with the recycle, W.
	ShaftPower float64 `json:"shaft_power" format:"double" example:"520000" validate:"required"`
	// Basis says how the recycle is taken.
	Basis string `json:"basis" validate:"required"`
}

// ThrottlingOut is the suction throttling of a duty below the machine's
// minimum speed, and the recycle that would do instead.
type ThrottlingOut struct {
	// Speed is the minimum speed the machine runs at, rev/min.
	Speed float64 `json:"speed" format:"double" example:"8050" validate:"required"`
	// SuctionPressure is the pressure after the suction throttle valve, Pa absolute.
	SuctionPressure float64 `json:"suction_pressure" format:"double" example:"85000" validate:"required"`
	// PressureDrop is the drop across the throttle valve, Pa.
	PressureDrop float64 `json:"pressure_drop" format:"double" example:"15000" validate:"required"`
	// RecycleMass is the recycle that holds the throttled compressor on the surge control line, kg/s (0: the throttling alone lies right of it).
	RecycleMass float64 `json:"recycle_mass" format:"double" example:"0" validate:"required"`
	// ShaftPower at the throttled point, W.
	ShaftPower float64 `json:"shaft_power" format:"double" example:"400000" validate:"required"`
	// AlternativeRecycle is the recycle alone (no throttle) at the minimum speed that brings the discharge down to the duty's; absent when none lies right of the control line and short of choke.
	AlternativeRecycle *AlternativeRecycleOut `json:"alternative_recycle,omitempty"`
	// Basis says how the throttling is taken.
	Basis string `json:"basis" validate:"required"`
}

// AlternativeRecycleOut is a recycle that would do instead of throttling.
type AlternativeRecycleOut struct {
	// Mass is the recycled mass flow, kg/s.
	Mass float64 `json:"mass" format:"double" example:"0.8" validate:"required"`
	// ShaftPower with it, W.
	ShaftPower float64 `json:"shaft_power" format:"double" example:"450000" validate:"required"`
}

// MarginChangeOut is one margin before (baseline) and after (new duty).
type MarginChangeOut struct {
	// Code is "surge", "choke", "speed-to-maximum-continuous",
	// "speed-to-minimum", "power-to-driver-rating" or a limit rule's code.
	Code string `json:"code" example:"surge" validate:"required"`
	// Rule is the limit rule (it keys limit_overrides); absent for the operating margins.
	Rule string `json:"rule,omitempty" example:"discharge-temperature"`
	// Stage is the stage (from 1) a per-stage limit rule grades; absent for the machine's margins.
	Stage int `json:"stage,omitempty" example:"1"`
	// Before and After are the quantity's values at the baseline and the new duty, in unit.
	Before float64 `json:"before" format:"double" validate:"required"`
	After  float64 `json:"after" format:"double" validate:"required"`
	// Limit is the level (for a limit rule its warning level; for surge the control margin; for choke the least choke margin), in unit.
	Limit float64 `json:"limit" format:"double" validate:"required"`
	Unit  string  `json:"unit" example:"-" validate:"required"`
	// MarginBefore and MarginAfter are the distances to the level as a fraction of it, positive inside.
	MarginBefore float64 `json:"margin_before" format:"double" validate:"required"`
	MarginAfter  float64 `json:"margin_after" format:"double" validate:"required"`
	// Severity is a limit rule's grade at the new duty.
	Severity string `json:"severity,omitempty" enums:"ok,notice,warning,limit" example:"ok"`
}

// ChangeOut is one input or result that moved from the baseline to the new duty.
type ChangeOut struct {
	// Quantity names it ("speed", "power.shaft", "suction.pressure", "gas.composition.methane", ...).
	Quantity string  `json:"quantity" example:"speed" validate:"required"`
	Before   float64 `json:"before" format:"double" validate:"required"`
	After    float64 `json:"after" format:"double" validate:"required"`
	// Change is (after − before)/|before| (after − before when before is 0).
	Change float64 `json:"change" format:"double" example:"0.04" validate:"required"`
	Unit   string  `json:"unit" example:"rev/min" validate:"required"`
	// TowardLimit is how much of the margin to its limit the move used up (margin before − margin after); absent for a quantity without a limit.
	TowardLimit *float64 `json:"toward_limit,omitempty" format:"double" example:"0.04"`
}

// SimilarityOut is one ASME PTC 10 similarity quantity.
type SimilarityOut struct {
	// Quantity is "specific-volume-ratio", "machine-mach", "machine-reynolds" or "flow-coefficient".
	Quantity string  `json:"quantity" example:"machine-mach" validate:"required"`
	Baseline float64 `json:"baseline" format:"double" validate:"required"`
	Duty     float64 `json:"duty" format:"double" validate:"required"`
	// Measure is duty/baseline, or duty − baseline for the machine Mach number (kind).
	Measure float64 `json:"measure" format:"double" validate:"required"`
	Kind    string  `json:"kind" enums:"ratio,difference" example:"ratio" validate:"required"`
	// Low and High bound the measure in the code.
	Low  float64 `json:"low" format:"double" validate:"required"`
	High float64 `json:"high" format:"double" validate:"required"`
	// Within is false when the new duty lies outside the code's band.
	Within bool   `json:"within" validate:"required"`
	Basis  string `json:"basis" validate:"required"`
}

// MachineCheckBatchResponse holds one result per check, in request order.
type MachineCheckBatchResponse struct {
	Results []MachineCheckBatchItem `json:"results" validate:"required"`
	// Succeeded and Failed count the results by outcome.
	Succeeded int `json:"succeeded" validate:"required"`
	Failed    int `json:"failed" validate:"required"`
}

// MachineCheckBatchItem is the outcome of one check: a result (status 200) or a problem.
type MachineCheckBatchItem struct {
	// Index is the check's position in the request, from 0.
	Index int `json:"index" validate:"required"`
	// Status is the HTTP status the check would have had on its own.
	Status  int                   `json:"status" example:"200" validate:"required"`
	Result  *MachineCheckResponse `json:"result,omitempty"`
	Problem *Problem              `json:"problem,omitempty"`
}

// check runs one duty-change check.
//
//	@Summary		Check an installed machine against a new duty
//	@Description	Finds the operating point of the machine (as a design endpoint answered it, or typed from a datasheet) at the new duty and at the baseline (default its design duty): the speed that makes the discharge pressure at the flow, stages stacked. Answers a verdict (fits, fits-with-recycle, fits-with-throttling, does-not-fit) with reasons, the operating point, the operating margins and every limit rule before and after, what changed ordered by how much margin it used up, and the ASME PTC 10 similarity of the new duty to the baseline. Surge, choke and the control line are estimates; see the cautions.
//	@Tags			machine
//	@Accept			json
//	@Produce		json
//	@Param			check	body		MachineCheckRequest	true	"machine, new duty and optional baseline"
//	@Success		200		{object}	MachineCheckResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, missing or wrongly shaped field"
//	@Failure		422		{object}	Problem	"physically impossible duty or machine (e.g. a wet suction), or a state outside the gas model"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			checkMachine
//	@Router			/v1/machine/check [post]
func (h checkHandler) check(c *gin.Context) {
	var req MachineCheckRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	out, err := h.checkOne(c.Request.Context(), req, nil)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	c.JSON(http.StatusOK, out)
}

// checkBatch runs many checks.
//
//	@Summary		Check installed machines against many duties in one call
//	@Description	Runs up to 200 duty-change checks independently (in parallel over the cores) and returns one item per check in request order: a result, or the problem the check would have had on its own, its pointers naming the field in the batch (/checks/INDEX/...). A malformed body or a check of the wrong JSON shape rejects the whole batch with a 400 whose pointers start with /checks/INDEX; a check whose unit strings do not parse, or whose duty is physically impossible, gets a problem item of its own.
//	@Tags			machine
//	@Accept			json
//	@Produce		json
//	@Param			batch	body		MachineCheckBatchRequest	true	"checks"
//	@Success		200		{object}	MachineCheckBatchResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, or a check of the wrong shape"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			checkMachineBatch
//	@Router			/v1/machine/check/batch [post]
func (h checkHandler) checkBatch(c *gin.Context) {
	var req MachineCheckBatchRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	ctx := c.Request.Context()
	out := MachineCheckBatchResponse{Results: make([]MachineCheckBatchItem, len(req.Checks))}
	memo := service.NewCheckMemo() // checks of one machine and baseline share it
	err := runParallel(ctx, len(req.Checks), func(i int) { out.Results[i] = h.one(c, i, req.Checks[i], memo) })
	if err != nil { // deadline or client gone: no further check ran
		fail(c, h.log, err) // 504 on the compute deadline; partial results are not sent
		return
	}
	out.Succeeded, out.Failed = tally(out.Results, func(r MachineCheckBatchItem) int { return r.Status })
	c.JSON(http.StatusOK, out)
}

// one runs check i of a batch on a worker goroutine; it recovers a panic
// itself into a 500 item.
func (h checkHandler) one(c *gin.Context, i int, r MachineCheckRequest, memo *service.CheckMemo) MachineCheckBatchItem {
	res, status, p := batchItem(c, h.log, i, func() (MachineCheckResponse, error) { return h.checkOne(c.Request.Context(), r, memo) })
	if p != nil {
		// Pointers name the field in the batch request: /checks/N/...
		prefix := "/checks/" + strconv.Itoa(i)
		for k := range p.Errors {
			p.Errors[k].Pointer = prefix + p.Errors[k].Pointer
		}
	}
	return MachineCheckBatchItem{Index: i, Status: status, Result: res, Problem: p}
}

// checkOne converts, checks and renders one request.
// memo (nil for a single check) shares baselines among a batch's checks.
func (h checkHandler) checkOne(ctx context.Context, req MachineCheckRequest, memo *service.CheckMemo) (MachineCheckResponse, error) {
	m, err := machineOfSpec(req.Machine, "machine")
	if err != nil {
		return MachineCheckResponse{}, err
	}
	sr := service.CheckRequest{Machine: m}
	if sr.Duty, err = checkDutyOf(req.Duty, "duty."); err != nil {
		return MachineCheckResponse{}, err
	}
	if req.Baseline != nil {
		b, err := checkDutyOf(*req.Baseline, "baseline.")
		if err != nil {
			return MachineCheckResponse{}, err
		}
		sr.Baseline = &b
	}
	res, err := bounded(ctx, h.log, "duty-change check", func(ctx context.Context) (service.CheckResult, error) {
		if memo != nil {
			return h.svc.CheckMachineShared(ctx, sr, memo)
		}
		return h.svc.CheckMachine(ctx, sr)
	})
	if err != nil {
		return MachineCheckResponse{}, err
	}
	return checkResponseOf(res)
}

// checkDutyOf converts a duty of a check into SI; prefix names it in errors.
func checkDutyOf(r CheckDutySpec, prefix string) (service.CheckDuty, error) {
	ambient := float64(physics.StandardAtmosphere)
	d := service.CheckDuty{Gas: gasInputOf(r.Gas)}
	if r.Suction.Ambient != nil {
		a, err := si(r.Suction.Ambient, dimPressure, prefix+"suction.ambient", ambient)
		if err != nil {
			return d, err
		}
		if !(*a > 0) {
			return d, &service.InputError{Field: prefix + "suction.ambient", Err: fmt.Errorf("the ambient pressure must be above 0 Pa absolute, not %g", *a)}
		}
		ambient = *a
	}
	var err error
	conv := func(q *Quantity, dim dimension, field string) *float64 {
		if err != nil {
			return nil
		}
		var v *float64
		v, err = si(q, dim, prefix+field, ambient)
		return v
	}
	d.SuctionPressure = must(conv(r.Suction.Pressure, dimPressure, "suction.pressure"))
	d.SuctionTemperature = must(conv(r.Suction.Temperature, dimTemperature, "suction.temperature"))
	d.DischargePressure = must(conv(r.DischargePressure, dimPressure, "discharge_pressure"))
	d.MassFlow = conv(r.Flow.Mass, dimMassFlow, "flow.mass")
	d.ActualVolumeFlow = conv(r.Flow.ActualVolume, dimVolumeFlow, "flow.actual_volume")
	if err == nil {
		d.StandardVolumeFlow, d.StandardReference, err = standardFlow(r.Flow)
		if ie, ok := err.(*service.InputError); ok {
			cp := *ie
			cp.Field = prefix + ie.Field
			err = &cp
		}
	}
	return d, err
}

// checkResponseOf renders a check, refusing any non-finite number.
func checkResponseOf(res service.CheckResult) (MachineCheckResponse, error) {
	out := MachineCheckResponse{
		Verdict: res.Verdict, Reasons: []CheckReasonOut{},
		OperatingPoint: checkPointOut(res.OperatingPoint), BaselinePoint: checkPointOut(res.BaselinePoint),
		Margins: []MarginChangeOut{}, Changes: []ChangeOut{}, Similarity: []SimilarityOut{},
		SpeedRange:   CheckSpeedRangeOut{Minimum: res.MinimumSpeed, MaximumContinuous: res.MaximumContinuousSpeed},
		DriverRating: res.DriverRating, SurgeControlMargin: res.SurgeControlMargin,
		Warnings: []WarningOut{}, Provenance: provenanceOut(res.Provenance), Cautions: res.Cautions,
	}
	for _, r := range res.Reasons {
		out.Reasons = append(out.Reasons, CheckReasonOut{Code: r.Code, Message: r.Message, Value: r.Value, Limit: r.Limit, Unit: r.Unit})
	}
	if r := res.Recycle; r != nil {
		out.Recycle = &RecycleOut{Mass: r.MassFlow, ActualVolume: r.VolumeFlow,
			CompressorFlow: CheckFlowOut{Mass: r.CompressorMassFlow, ActualVolume: r.CompressorVolumeFlow}, ShaftPower: r.ShaftPower, Basis: r.Basis}
	}
	if t := res.Throttling; t != nil {
		out.Throttling = &ThrottlingOut{Speed: t.Speed, SuctionPressure: t.SuctionPressure, PressureDrop: t.PressureDrop,
			RecycleMass: t.RecycleMassFlow, ShaftPower: t.ShaftPower, Basis: service.ThrottlingBasis}
		if t.AlternativeRecycleMassFlow > 0 {
			out.Throttling.AlternativeRecycle = &AlternativeRecycleOut{Mass: t.AlternativeRecycleMassFlow, ShaftPower: t.AlternativeShaftPower}
		}
	}
	for _, m := range res.Margins {
		out.Margins = append(out.Margins, MarginChangeOut{Code: m.Code, Rule: m.Rule, Stage: m.Stage, Before: m.Before, After: m.After, Limit: m.Limit,
			Unit: m.Unit, MarginBefore: m.MarginBefore, MarginAfter: m.MarginAfter, Severity: m.Severity})
	}
	for _, ch := range res.Changes {
		out.Changes = append(out.Changes, ChangeOut{Quantity: ch.Quantity, Before: ch.Before, After: ch.After, Change: ch.Change,
			Unit: ch.Unit, TowardLimit: ch.TowardLimit})
	}
	for _, s := range res.Similarity {
		out.Similarity = append(out.Similarity, SimilarityOut{Quantity: s.Quantity, Baseline: s.Baseline, Duty: s.Duty, Measure: s.Measure,
			Kind: s.Kind, Low: s.Low, High: s.High, Within: s.Within, Basis: s.Basis})
	}
	out.Warnings = appendWarnings(out.Warnings, res.Warnings)
	if err := allFinite(out); err != nil {
		return MachineCheckResponse{}, err
	}
	return out, nil
}

func checkPointOut(p service.CheckPoint) CheckPointOut {
	out := CheckPointOut{Speed: p.Speed, Flow: CheckFlowOut{Mass: p.MassFlow, ActualVolume: p.VolumeFlow},
		Suction:         CheckStateOut{Pressure: p.SuctionPressure, Temperature: p.SuctionTemperature},
		Discharge:       CheckStateOut{Pressure: p.DischargePressure, Temperature: p.DischargeTemperature},
		Head:            HeadOut{Polytropic: p.PolytropicHead, Isentropic: p.IsentropicHead},
		Efficiency:      CheckEfficiencyOut{Polytropic: p.PolytropicEfficiency, Isentropic: p.IsentropicEfficiency},
		Power:           CheckPowerOut{Gas: p.GasPower, Shaft: p.ShaftPower},
		Surge:           SurgeOut{Flow: p.SurgeFlow, ControlFlow: p.ControlFlow, Margin: p.SurgeMargin, Stage: p.SurgeStage},
		Choke:           ChokeOut{Flow: p.ChokeFlow, Margin: p.ChokeMargin, Stage: p.ChokeStage},
		FlowCoefficient: p.FlowCoefficient, DesignFlowRatio: p.DesignFlowRatio, Stages: []CheckStageOut{}}
	for _, s := range p.Stages {
		out.Stages = append(out.Stages, CheckStageOut{Stage: s.Stage, Speed: s.Speed,
			Suction:    CheckStateOut{Pressure: s.SuctionPressure, Temperature: s.SuctionTemperature},
			Discharge:  CheckStateOut{Pressure: s.DischargePressure, Temperature: s.DischargeTemperature},
			VolumeFlow: s.VolumeFlow, PolytropicHead: s.PolytropicHead, PolytropicEfficiency: s.PolytropicEfficiency,
			FlowCoefficient: s.FlowCoefficient, DesignFlowRatio: s.DesignFlowRatio, SurgeMargin: s.SurgeMargin, ChokeMargin: s.ChokeMargin})
	}
	return out
}
