package api

import (
	"net/http"

	"github.com/gin-gonic/gin"
)

// CompactStageResponse is the compact view of a sized stage, for machines
// (process simulators, batches): every number of StageResponse, the codes,
// the verdict and the provenance's input hash, without the limit table's
// prose, the bases, the warning messages, the methods, the defaults, the
// binary interaction parameters with their sources, the machine (ask the
// full view once for the machine an asset system stores) and
// the cautions. Those matter to a person reading the answer: the full
// view (POST /v1/stage/size) keeps them.
type CompactStageResponse struct {
	// MassFlow through the stage, kg/s.
	MassFlow float64 `json:"mass_flow" format:"double" validate:"required"`
	// SuctionVolumeFlow is the actual volume flow at suction stagnation conditions, m3/s.
	SuctionVolumeFlow  float64          `json:"suction_volume_flow" format:"double" validate:"required"`
	StandardVolumeFlow StandardFlowsOut `json:"standard_volume_flow" validate:"required"`
	// Speed is the rotational speed, rev/min.
	Speed        float64         `json:"speed" format:"double" validate:"required"`
	SpeedChoice  SpeedChoiceOut  `json:"speed_choice" validate:"required"`
	Discharge    DischargeOut    `json:"discharge" validate:"required"`
	Work         float64         `json:"work" format:"double" validate:"required"`
	Head         HeadOut         `json:"head" validate:"required"`
	Efficiency   EfficiencyOut   `json:"efficiency" validate:"required"`
	Power        PowerOut        `json:"power" validate:"required"`
	Velocities   VelocitiesOut   `json:"velocities" validate:"required"`
	Geometry     GeometryOut     `json:"geometry" validate:"required"`
	Inducer      InducerOut      `json:"inducer" validate:"required"`
	Coefficients CoefficientsOut `json:"coefficients" validate:"required"`
	Stations     StationsOut     `json:"stations" validate:"required"`
	Polytropic   PolytropicOut   `json:"polytropic_methods" validate:"required"`
	// Verdict is as in the full view.
	Verdict string `json:"verdict" enums:"within-limits,near-limits,past-warning,past-limit" validate:"required"`
	// Limits lists every limit rule applied: its levels, value and margin.
	Limits []CompactLimitOut `json:"limits" validate:"required"`
	// Warnings lists every concern by code, with its value and level.
	Warnings   []CompactWarningOut  `json:"warnings" validate:"required"`
	Provenance CompactProvenanceOut `json:"provenance" validate:"required"`
}

// CompactLimitOut is one limit rule applied, without its prose (see LimitOut).
type CompactLimitOut struct {
	Rule     string   `json:"rule" example:"flow-coefficient-low" validate:"required"`
	Code     string   `json:"code" example:"flow-coefficient" validate:"required"`
	Severity string   `json:"severity" enums:"ok,notice,warning,limit" validate:"required"`
	Value    float64  `json:"value" format:"double" validate:"required"`
	Warning  float64  `json:"warning" format:"double" validate:"required"`
	Limit    *float64 `json:"limit,omitempty" format:"double"`
	Margin   float64  `json:"margin" format:"double" validate:"required"`
}

// CompactWarningOut is one warning without its message and basis (see WarningOut).
type CompactWarningOut struct {
	Code     string  `json:"code" example:"inducer-mach" validate:"required"`
	Severity string  `json:"severity" enums:"notice,warning,limit" validate:"required"`
	Value    float64 `json:"value" format:"double" validate:"required"`
	Limit    float64 `json:"limit" format:"double" validate:"required"`
	Margin   float64 `json:"margin" format:"double" validate:"required"`
}

// CompactProvenanceOut names the model and the duty (see ProvenanceOut).
type CompactProvenanceOut struct {
	ModelVersion   string `json:"model_version" validate:"required"`
	ServiceVersion string `json:"service_version" validate:"required"`
	GasModel       string `json:"gas_model" validate:"required"`
	// InputHash is the SHA-256 of the normalised duty in SI units.
	InputHash string `json:"input_hash" validate:"required"`
}

// compactOf is the compact view of a full (already checked) answer.
func compactOf(r *StageResponse) CompactStageResponse {
	out := CompactStageResponse{MassFlow: r.MassFlow, SuctionVolumeFlow: r.SuctionVolumeFlow, StandardVolumeFlow: r.StandardVolumeFlow,
		Speed: r.Speed, SpeedChoice: r.SpeedChoice, Discharge: r.Discharge, Work: r.Work, Head: r.Head, Efficiency: r.Efficiency,
		Power: r.Power, Velocities: r.Velocities, Geometry: r.Geometry, Inducer: r.Inducer, Coefficients: r.Coefficients,
		Stations: r.Stations, Polytropic: r.Polytropic, Verdict: r.Verdict,
		Limits: make([]CompactLimitOut, len(r.Limits)), Warnings: make([]CompactWarningOut, len(r.Warnings)),
		Provenance: CompactProvenanceOut{ModelVersion: r.Provenance.ModelVersion, ServiceVersion: r.Provenance.ServiceVersion,
			GasModel: r.Provenance.GasModel, InputHash: r.Provenance.InputHash}}
	for i, l := range r.Limits {
		out.Limits[i] = CompactLimitOut{Rule: l.Rule, Code: l.Code, Severity: l.Severity, Value: l.Value, Warning: l.Warning,
			Limit: l.Limit, Margin: l.Margin}
	}
	for i, w := range r.Warnings {
		out.Warnings[i] = CompactWarningOut{Code: w.Code, Severity: w.Severity, Value: w.Value, Limit: w.Limit, Margin: w.Margin}
	}
	return out
}

// sizeCompact sizes one stage and answers the compact view.
//
//	@Summary		Size one stage: compact answer for machines
//	@Description	The same sizing as POST /v1/stage/size (same request, same problems) answered in the compact view: every number, code and the verdict, the provenance's model and input hash, without the limit table's prose and bases, the warning messages, the methods, the defaults, the kij table, the machine object (take it from the full answer) and the cautions (about half the bytes of the full answer). For process simulators and other machines; a person reading a result should use the full view, whose cautions apply to this answer too.
//	@Tags			stage
//	@Accept			json
//	@Produce		json
//	@Param			duty	body		StageRequest	true	"gas duty and impeller choices"
//	@Success		200		{object}	CompactStageResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, missing or wrongly shaped field"
//	@Failure		422		{object}	Problem	"physically impossible duty or a state outside the gas model"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			sizeStageCompact
//	@Router			/v1/stage/size/compact [post]
func (h stageHandler) sizeCompact(c *gin.Context) {
	var req StageRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	out, err := h.sizeOne(c, req)
	if err != nil {
		fail(c, h.log, err)
		return
	}
	compact := compactOf(&out)
	h.enc.write(c, h.log, http.StatusOK, &compact)
}

// CompactBatchResponse is a batch answered in the compact view.
type CompactBatchResponse struct {
	Results []CompactBatchItem `json:"results" validate:"required"`
	// Succeeded and Failed count the results by outcome.
	Succeeded int `json:"succeeded" validate:"required"`
	Failed    int `json:"failed" validate:"required"`
}

// CompactBatchItem is the outcome of one duty: a compact result (status 200) or a problem.
type CompactBatchItem struct {
	// Index is the duty's position in the request, from 0.
	Index int `json:"index" validate:"required"`
	// Status is the HTTP status the duty would have had on its own.
	Status  int                   `json:"status" example:"200" validate:"required"`
	Result  *CompactStageResponse `json:"result,omitempty"`
	Problem *Problem              `json:"problem,omitempty"`
}

// sizeBatchCompact sizes many duties and answers the compact view.
//
//	@Summary		Size many stages: compact answers for machines
//	@Description	The same batch as POST /v1/stage/size/batch (same request, limits, streaming, NDJSON with `Accept: application/x-ndjson`, deadline behaviour), each result in the compact view of POST /v1/stage/size/compact.
//	@Tags			stage
//	@Accept			json
//	@Produce		json
//	@Param			batch	body		BatchRequest	true	"duty points"
//	@Success		200		{object}	CompactBatchResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, or a duty of the wrong shape"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			sizeStageBatchCompact
//	@Router			/v1/stage/size/batch/compact [post]
func (h stageHandler) sizeBatchCompact(c *gin.Context) {
	h.batch(c, true)
}
