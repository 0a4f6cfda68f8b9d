package api

import (
	"fmt"
	"net/http"
	"runtime"
	"runtime/debug"
	"sync"

	"github.com/gin-gonic/gin"
)

// MaxBatch is the largest number of duties one batch request may carry.
const MaxBatch = 500

// BatchRequest carries many duty points, e.g. from a process simulator.
type BatchRequest struct {
	// Duties are sized independently; each follows the StageRequest schema.
	Duties []StageRequest `json:"duties" binding:"required,min=1,max=500,dive"`
}

// BatchResponse holds one result per duty, in request order.
type BatchResponse struct {
	Results []BatchItem `json:"results" validate:"required"`
	// Succeeded and Failed count the results by outcome.
	Succeeded int `json:"succeeded" validate:"required"`
	Failed    int `json:"failed" validate:"required"`
}

// BatchItem is the outcome of one duty: a result (status 200) or a problem.
type BatchItem struct {
	// Index is the duty's position in the request, from 0.
	Index int `json:"index" validate:"required"`
	// Status is the HTTP status the duty would have had on its own.
	Status  int            `json:"status" example:"200" validate:"required"`
	Result  *StageResponse `json:"result,omitempty"`
	Problem *Problem       `json:"problem,omitempty"`
}

// sizeBatch sizes many duties.
//
//	@Summary		Size many stages in one call
//	@Description	Sizes up to 500 duties independently (in parallel) and returns one item per duty in request order: a result, or the problem the duty would have had on its own (its pointers are relative to the duty). A malformed body or a duty of the wrong JSON shape (unknown or missing field, wrong type) rejects the whole batch with a 400 whose pointers start with /duties/INDEX; a duty whose unit strings do not parse gets a 400 item of its own.
//	@Tags			stage
//	@Accept			json
//	@Produce		json
//	@Param			batch	body		BatchRequest	true	"duty points"
//	@Success		200		{object}	BatchResponse
//	@Failure		400		{object}	Problem	"malformed JSON, unknown field, or a duty of the wrong shape"
//	@Failure		401		{object}	Problem	"no valid bearer token (when the service is configured with tokens)"
//	@Failure		413		{object}	Problem	"body larger than the configured limit (default 1 MiB)"
//	@Failure		408		{object}	Problem	"the body did not arrive within the server's read timeout"
//	@Failure		415		{object}	Problem	"Content-Type is not application/json (or another +json type)"
//	@Failure		500		{object}	Problem
//	@Failure		503		{object}	Problem	"overloaded (retry after the Retry-After header's seconds) or cancelled"
//	@Failure		504		{object}	Problem	"the computation passed the service's compute deadline"
//	@ID			sizeStageBatch
//	@Router			/v1/stage/size/batch [post]
func (h stageHandler) sizeBatch(c *gin.Context) {
	var req BatchRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	ctx := c.Request.Context()
	out := BatchResponse{Results: make([]BatchItem, len(req.Duties))}
	work := make(chan int)
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), len(req.Duties)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range work {
				out.Results[i] = h.one(c, i, req.Duties[i])
			}
		}()
	}
feed:
	for i := range req.Duties {
		select {
		case work <- i:
		case <-ctx.Done(): // deadline or client gone: size no further duty
			break feed
		}
	}
	close(work)
	wg.Wait()
	if err := ctx.Err(); err != nil {
		fail(c, h.log, err) // 504 on the compute deadline; partial results are not sent
		return
	}
	for _, r := range out.Results {
		if r.Status == http.StatusOK {
			out.Succeeded++
		} else {
			out.Failed++
		}
	}
	c.JSON(http.StatusOK, out)
}

// one sizes duty i of a batch. It runs on a worker goroutine, out of reach
// of the recovery middleware, so it recovers a panic itself into a 500 item.
func (h stageHandler) one(c *gin.Context, i int, r StageRequest) (item BatchItem) {
	item = BatchItem{Index: i}
	defer func() {
		if rec := recover(); rec != nil {
			h.log.Error("panic", "request_id", c.GetString(requestIDKey), "route", routeLabel(c), "index", i,
				"panic", fmt.Sprint(rec), "stack", string(debug.Stack()))
			p := Problem{Type: "about:blank", Title: "Internal Server Error", Status: http.StatusInternalServerError}
			item = BatchItem{Index: i, Status: p.Status, Problem: &p}
		}
	}()
	res, err := h.sizeOne(c, r)
	if err != nil {
		p := problemFor(err)
		if p.Status == http.StatusInternalServerError {
			h.log.Error("batch item failed", "request_id", c.GetString(requestIDKey), "index", i, "err", err)
		}
		item.Status, item.Problem = p.Status, &p
		return item
	}
	item.Status, item.Result = http.StatusOK, &res
	return item
}
