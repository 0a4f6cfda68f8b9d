package api

import (
	"context"
	"fmt"
	"log/slog"
	"runtime/debug"
	"sync/atomic"
	"time"
)

// lateEnd is how long after its request gave up a computation may end
// without a warning in the log.
const lateEnd = time.Second

// bounded runs a use case on a goroutine of its own and returns its
// result, or ctx's error as soon as ctx ends (the compute deadline, the
// client gone), so that the handler answers 504 (or 503) on time. The
// service polls the deadline only between its steps (stages, points,
// operating-point searches); a step that runs long, as a design suction
// of 1e9 Pa once made one run for minutes, would otherwise hold the
// request far past the deadline the README promises. The abandoned
// computation cannot be stopped: it runs to its end, and an end more
// than lateEnd after the request gave up is logged (a warning with what
// it was and how long it took) so that such inputs can be found and
// refused; a service that stops at its next deadline check ends sooner
// and is not logged. A panic on the goroutine is raised
// again on the caller's (the recovery middleware or the batch item turns
// it into a 500), or logged if the caller has gone.
//
// It is used on the routes whose use case takes milliseconds (machines,
// sections, checks); the microsecond stage sizing calls the service
// directly, where a goroutine would be a noticeable part of the cost.
func bounded[T any](ctx context.Context, log *slog.Logger, what string, run func(context.Context) (T, error)) (T, error) {
	if ctx.Done() == nil {
		return run(ctx)
	}
	type outcome struct {
		v     T
		err   error
		panic any
		stack []byte
	}
	done := make(chan outcome, 1)
	var abandonedAt atomic.Int64 // unix ns when the caller gave up; 0: it has not
	start := time.Now()
	go func() {
		var o outcome
		defer func() {
			if r := recover(); r != nil {
				o = outcome{panic: r, stack: debug.Stack()}
			}
			select {
			case done <- o:
			default:
			}
			if at := abandonedAt.Load(); at != 0 {
				late := time.Since(time.Unix(0, at))
				switch {
				case o.panic != nil:
					log.Error("panic in a computation its request had abandoned", "what", what,
						"panic", fmt.Sprint(o.panic), "stack", string(o.stack))
				case late > lateEnd:
					log.Warn("computation ran on after its request had ended (compute deadline or client gone)", "what", what,
						"duration_ms", float64(time.Since(start).Microseconds())/1e3,
						"late_ms", float64(late.Microseconds())/1e3, "cause", context.Cause(ctx).Error())
				}
			}
		}()
		o.v, o.err = run(ctx)
	}()
	select {
	case o := <-done:
		if o.panic != nil {
			panic(fmt.Sprintf("%v\n%s", o.panic, o.stack))
		}
		return o.v, o.err
	case <-ctx.Done():
		abandonedAt.Store(time.Now().UnixNano())
		var zero T
		return zero, ctx.Err()
	}
}
