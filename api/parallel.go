package api

import (
	"context"
	"net/http"
	"runtime"
	"sync"
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
