// Command stagewright serves the centrifugal-stage sizing API over HTTP.
//
// Configuration comes from flags and STAGEWRIGHT_* environment variables
// (a flag wins over its variable); every setting is checked before the
// server starts, and a bad one stops it with a message naming the
// variable or flag. The full table is in README.md (Configuration) and in
// `stagewright -help`.
//
// Build stamping: go build -ldflags "-X main.version=1.4.0 -X main.commit=$(git rev-parse HEAD)".
// Without it, the commit comes from the VCS information the go command
// records in the binary.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"os"
	"os/signal"
	"syscall"
)

// version and commit name the build; set them with -ldflags -X (see the
// package comment). They are written only by the linker.
var (
	version = "dev"
	commit  = "unknown"
)

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	if err := run(ctx, os.Args[1:], os.Getenv, os.Stdout, os.Stderr); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return // -help printed the flags
		}
		fmt.Fprintln(os.Stderr, "stagewright:", err)
		os.Exit(1)
	}
}
