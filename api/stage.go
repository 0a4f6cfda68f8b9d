package api

import (
	"context"
	"log/slog"
	"net/http"

	"github.com/gin-gonic/gin"

	"stagewright/service"
)

// StageSizer is what the stage handler needs of the service layer.
type StageSizer interface {
	SizeStage(ctx context.Context, d service.StageDuty) (service.StageResult, error)
}

type stageHandler struct {
	svc     StageSizer
	decoder *requestDecoder
	enc     *answerEncoder
	log     *slog.Logger
}

// size sizes one stage.
//
//	@Summary		Size one centrifugal stage for a gas duty
//	@Description	Turns a gas duty (gas, suction state, discharge pressure or pressure ratio, flow, speed, efficiency) and impeller choices (blade exit angle, slip factor, power input factor, inlet) into the tip speed and diameters, inlet and exit widths, heads, discharge temperature, gas and shaft power, driver rating, every limit check with its margin, warnings and provenance. Physical inputs are SI numbers or strings with a unit ("35 degC", "14.7 psia"). Results are preliminary estimates; see the cautions field.
//	@Tags			stage
//	@Accept			json
//	@Produce		json
//	@Param			duty	body		StageRequest	true	"gas duty and impeller choices"
//	@Success		200		{object}	StageResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, missing or wrongly shaped field"
//	@Failure		422		{object}	Problem	"physically impossible duty or a state outside the gas model"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		408		{object}	Problem	"the body did not arrive within the server's read timeout"
//	@Failure		415		{object}	Problem	"Content-Type is not application/json (or another +json type)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			sizeStage
//	@Router			/v1/stage/size [post]
func (h stageHandler) size(c *gin.Context) {
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
	h.enc.write(c, h.log, http.StatusOK, &out)
}

// sizeOne converts, sizes and renders one checked request.
func (h stageHandler) sizeOne(c *gin.Context, req StageRequest) (StageResponse, error) {
	duty, err := dutyOf(req)
	if err != nil {
		return StageResponse{}, err
	}
	res, err := h.svc.SizeStage(c.Request.Context(), duty)
	if err != nil {
		return StageResponse{}, err
	}
	return responseOf(res)
}
