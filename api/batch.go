package api

import (
	"net/http"
	"runtime"
	"strconv"
	"strings"
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
//	@Description	Sizes up to 500 duties independently (in parallel) and returns one item per duty in request order: a result, or the problem the duty would have had on its own (its pointers are relative to the duty). A malformed body or a duty of the wrong JSON shape (unknown or missing field, wrong type) rejects the whole batch with a 400 whose pointers start with /duties/INDEX; a duty whose unit strings do not parse gets a 400 item of its own. The answer is streamed item by item as the duties are sized (memory per request stays bounded). With `Accept: application/x-ndjson` the answer is newline-delimited JSON instead: one BatchItem per line, in request order, without the counts. When the compute deadline passes before the first duty is sized the whole batch answers 504; once the answer has begun, each duty not sized by the deadline gets a 504 compute-timeout item.
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
	h.batch(c, false)
}

// batch sizes the duties of a batch request, each item in the compact or
// the full view.
func (h stageHandler) batch(c *gin.Context, compact bool) {
	var req BatchRequest
	if err := decodeStrict(c.Request, &req, h.decoder); err != nil {
		fail(c, h.log, err)
		return
	}
	ndjson := wantsNDJSON(c.Request.Header.Get("Accept"))
	n := len(req.Duties)
	workers := min(runtime.GOMAXPROCS(0), n)
	// At most window items are sized and encoded ahead of the one being
	// written: a worker's item goes to ring[i%window], and duty i is
	// handed out only once item i-window has been written.
	window := min(batchWindow*workers, n)
	ring := make([]chan batchEncoded, window)
	for i := range ring {
		ring[i] = make(chan batchEncoded, 1)
	}
	free := make(chan struct{}, window)
	for range window {
		free <- struct{}{}
	}
	quit := make(chan struct{})
	work := make(chan int)
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range work {
				ring[i%window] <- h.encodedItem(c, i, req.Duties[i], compact)
			}
		}()
	}
	go func() {
		defer close(work)
		for i := range n {
			select {
			case <-free:
			case <-quit:
				return
			}
			work <- i
		}
	}()
	defer func() {
		close(quit)
		wg.Wait()
	}()

	var succeeded, failed int
	for i := range n {
		it := <-ring[i%window]
		if i == 0 && it.ctxErr != nil {
			// Deadline or client gone before anything was sized: the
			// whole batch is a 504 (or 503), no partial results.
			h.enc.put(it.buf)
			fail(c, h.log, it.ctxErr)
			return
		}
		if i == 0 {
			if ndjson {
				c.Header("Content-Type", "application/x-ndjson")
			} else {
				c.Header("Content-Type", "application/json; charset=utf-8")
			}
			c.Status(http.StatusOK)
		}
		if it.status == http.StatusOK {
			succeeded++
		} else {
			failed++
		}
		var sep string
		switch {
		case ndjson:
		case i == 0:
			sep = `{"results":[`
		default:
			sep = ","
		}
		_, _ = c.Writer.WriteString(sep)
		_, _ = c.Writer.Write(*it.buf)
		if ndjson {
			_, _ = c.Writer.WriteString("\n")
		}
		h.enc.put(it.buf)
		free <- struct{}{}
	}
	if !ndjson {
		_, _ = c.Writer.WriteString(`],"succeeded":` + strconv.Itoa(succeeded) + `,"failed":` + strconv.Itoa(failed) + `}`)
	}
}

// batchWindow is the number of items per worker that may wait, sized and
// encoded, for their turn to be written: a batch holds about
// batchWindow x GOMAXPROCS encoded answers at once, whatever its length.
const batchWindow = 4

// batchEncoded is one batch item, encoded by the worker that sized it.
type batchEncoded struct {
	buf    *[]byte // the item's JSON (pooled: put back once written)
	status int
	ctxErr error // the duty was not sized: the deadline passed or the client left
}

// wantsNDJSON reports whether the Accept header asks for newline-delimited
// JSON (application/x-ndjson) rather than one JSON document.
func wantsNDJSON(accept string) bool {
	for part := range strings.SplitSeq(accept, ",") {
		mt, _, _ := strings.Cut(part, ";")
		if strings.EqualFold(strings.TrimSpace(mt), "application/x-ndjson") {
			return true
		}
	}
	return false
}

// encodedItem sizes duty i and encodes its item. Once the context is done
// (compute deadline, client gone) it sizes no further duty: the item is
// the deadline's problem.
func (h stageHandler) encodedItem(c *gin.Context, i int, r StageRequest, compact bool) batchEncoded {
	var item BatchItem
	var ctxErr error
	if err := c.Request.Context().Err(); err != nil {
		p := problemFor(err)
		item, ctxErr = BatchItem{Index: i, Status: p.Status, Problem: &p}, err
	} else {
		item = h.one(c, i, r)
		if item.Status == http.StatusGatewayTimeout || item.Status == http.StatusServiceUnavailable {
			ctxErr = c.Request.Context().Err()
		}
	}
	var buf *[]byte
	var err error
	if compact {
		ci := CompactBatchItem{Index: item.Index, Status: item.Status, Problem: item.Problem}
		if item.Result != nil {
			r := compactOf(item.Result)
			ci.Result = &r
		}
		buf, err = h.enc.encode(&ci)
	} else {
		buf, err = h.enc.encode(&item)
	}
	if err != nil {
		h.log.Error("batch item failed", "request_id", c.GetString(requestIDKey), "index", i, "err", err)
		buf = h.enc.get()
		*buf = append(*buf, `{"index":`+strconv.Itoa(i)+`,"status":500,"problem":{"type":"about:blank","title":"Internal Server Error","status":500}}`...)
		return batchEncoded{buf: buf, status: http.StatusInternalServerError}
	}
	return batchEncoded{buf: buf, status: item.Status, ctxErr: ctxErr}
}

// one sizes duty i of a batch. It runs on a worker goroutine, out of reach
// of the recovery middleware, so it recovers a panic itself into a 500 item.
func (h stageHandler) one(c *gin.Context, i int, r StageRequest) BatchItem {
	res, status, p := batchItem(c, h.log, i, func() (StageResponse, error) { return h.sizeOne(c, r) })
	return BatchItem{Index: i, Status: status, Result: res, Problem: p}
}
