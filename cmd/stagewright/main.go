// Command stagewright serves the centrifugal-stage sizing API over HTTP.
//
// Configuration comes from flags and STAGEWRIGHT_* environment variables
// (a flag wins over its variable):
//
//	--addr / STAGEWRIGHT_ADDR            listen address (default 127.0.0.1:8080)
//	--log-level / STAGEWRIGHT_LOG_LEVEL  debug, info, warn, error (default info)
//	--demo / STAGEWRIGHT_DEMO            after start, size the demo duties in
//	                                     --demo-dir and print a summary
//	--demo-dir / STAGEWRIGHT_DEMO_DIR    default testdata/stages
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
	if err := run(ctx, os.Args[1:], os.Getenv, os.Stdout, os.Stderr); err != nil {
		fmt.Fprintln(os.Stderr, "stagewright:", err)
		os.Exit(1)
	}
}
