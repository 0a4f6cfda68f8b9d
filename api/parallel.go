package api

import (
	"context"
	"fmt"
	"log/slog"
	"net/http"
	"runtime"
	"runtime/debug"
	"sync"

	"github.com/gin-gonic/gin"
)

// runParallel calls do(i) for every i in [0, n) on up to GOMAXPROCS
// workers, in no set order; do writes its own result slot. Once ctx ends
// no further index is handed out, and runParallel returns ctx's error
// after the running calls finish: the batch handlers then answer 504 (or
// 503) rather than partial results.
func runParallel(ctx context.Context, n int, do func(i int)) error {
	work := make(chan int)
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), n) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range work {
				do(i)
			}
		}()
	}
feed:
	for i := range n {
		select {
		case work <- i:
		case <-ctx.Done():
			break feed
		}
	}
	close(work)
	wg.Wait()
	return ctx.Err()
}

// tally counts the items of a batch answered 200 and the others.
func tally[T any](items []T, status func(T) int) (succeeded, failed int) {
	for _, it := range items {
		if status(it) == http.StatusOK {
			succeeded++
		} else {
			failed++
		}
	}
	return succeeded, failed
}

// batchItem runs item i of a batch on a worker goroutine, out of reach of
// the recovery middleware: a panic becomes a 500 problem (logged with its
// stack), an error its problem (a 500 logged, never echoed), else the
// result with status 200.
func batchItem[T any](c *gin.Context, log *slog.Logger, i int, run func() (T, error)) (res *T, status int, prob *Problem) {
	defer func() {
		if rec := recover(); rec != nil {
			log.Error("panic", "request_id", c.GetString(requestIDKey), "route", routeLabel(c), "index", i,
				"panic", fmt.Sprint(rec), "stack", string(debug.Stack()))
			p := Problem{Type: "about:blank", Title: "Internal Server Error", Status: http.StatusInternalServerError}
			res, status, prob = nil, p.Status, &p
		}
	}()
	r, err := run()
	if err != nil {
		p := problemFor(err)
		if p.Status == http.StatusInternalServerError {
			log.Error("batch item failed", "request_id", c.GetString(requestIDKey), "index", i, "err", err)
		}
		return nil, p.Status, &p
	}
	return &r, http.StatusOK, nil
}
