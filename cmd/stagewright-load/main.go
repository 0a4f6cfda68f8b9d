// Command stagewright-load is a bounded load test of a stagewright server
// on this machine's loopback interface.
//
// It posts demo duties (testdata/stages/*.in.json) to POST /v1/stage/size
// with a fixed number of requests, a fixed concurrency and a cap on the
// duration, then reports throughput, latency percentiles and errors:
//
//	go run ./cmd/stagewright --addr 127.0.0.1:18181 &
//	go run ./cmd/stagewright-load --url http://127.0.0.1:18181 -n 5000 -c 4
//
// It refuses any target that is not a literal loopback address (127.0.0.0/8
// or ::1), follows no redirects and checks the address of every connection
// it opens. The exit status is 1 when any request failed.
package main

import (
	"context"
	"fmt"
	"os"
	"os/signal"
	"syscall"
)

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	if err := run(ctx, os.Args[1:], os.Stdout, os.Stderr); err != nil {
		fmt.Fprintln(os.Stderr, "stagewright-load:", err)
		os.Exit(1)
	}
}
