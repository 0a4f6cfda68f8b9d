package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"log/slog"
	"net"
	"net/http"
	"strconv"
	"strings"
	"time"

	"github.com/gin-gonic/gin"

	"stagewright/api"
	"stagewright/openapi"
	"stagewright/service"
)

// config is the whole configuration, read once and checked before start.
type config struct {
	Addr            string
	LogLevel        slog.Level
	Demo            bool
	DemoDir         string
	ShutdownTimeout time.Duration
}

func loadConfig(args []string, getenv func(string) string, stderr io.Writer) (config, error) {
	cfg := config{Addr: "127.0.0.1:8080", LogLevel: slog.LevelInfo, DemoDir: "testdata/stages", ShutdownTimeout: 10 * time.Second}
	env := func(name, def string) string {
		if v := getenv(name); v != "" {
			return v
		}
		return def
	}
	fs := flag.NewFlagSet("stagewright", flag.ContinueOnError)
	fs.SetOutput(stderr)
	addr := fs.String("addr", env("STAGEWRIGHT_ADDR", cfg.Addr), "listen address host:port (env STAGEWRIGHT_ADDR)")
	level := fs.String("log-level", env("STAGEWRIGHT_LOG_LEVEL", "info"), "log level: debug, info, warn, error (env STAGEWRIGHT_LOG_LEVEL)")
	demoDefault, err := strconv.ParseBool(env("STAGEWRIGHT_DEMO", "false"))
	if err != nil {
		return cfg, fmt.Errorf("STAGEWRIGHT_DEMO: want true or false, got %q", getenv("STAGEWRIGHT_DEMO"))
	}
	demo := fs.Bool("demo", demoDefault, "after start, size the demo duties and print a summary (env STAGEWRIGHT_DEMO)")
	demoDir := fs.String("demo-dir", env("STAGEWRIGHT_DEMO_DIR", cfg.DemoDir), "folder of demo duties *.in.json (env STAGEWRIGHT_DEMO_DIR)")
	if err := fs.Parse(args); err != nil {
		return cfg, err
	}
	if fs.NArg() > 0 {
		return cfg, fmt.Errorf("unexpected arguments: %s", strings.Join(fs.Args(), " "))
	}
	_, port, err := net.SplitHostPort(*addr)
	if err != nil {
		return cfg, fmt.Errorf("listen address %q: %w", *addr, err)
	}
	if n, err := strconv.Atoi(port); err != nil || n < 0 || n > 65535 {
		return cfg, fmt.Errorf("listen address %q: the port must be a number from 0 to 65535", *addr)
	}
	if err := cfg.LogLevel.UnmarshalText([]byte(*level)); err != nil {
		return cfg, fmt.Errorf("log level %q: want debug, info, warn or error", *level)
	}
	cfg.Addr, cfg.Demo, cfg.DemoDir = *addr, *demo, *demoDir
	return cfg, nil
}

// run starts the server and blocks until ctx ends, then shuts down
// gracefully.
func run(ctx context.Context, args []string, getenv func(string) string, stdout, stderr io.Writer) error {
	cfg, err := loadConfig(args, getenv, stderr)
	if err != nil {
		return err
	}
	log := slog.New(slog.NewJSONHandler(stderr, &slog.HandlerOptions{Level: cfg.LogLevel}))
	gin.SetMode(gin.ReleaseMode)
	router, err := api.NewRouter(service.New(), log, openapi.Swagger2())
	if err != nil {
		return err
	}
	ln, err := net.Listen("tcp", cfg.Addr)
	if err != nil {
		return fmt.Errorf("listen on %s: %w", cfg.Addr, err)
	}
	srv := &http.Server{
		Handler:           router,
		ReadHeaderTimeout: 5 * time.Second,
		ReadTimeout:       15 * time.Second,
		WriteTimeout:      30 * time.Second,
		IdleTimeout:       120 * time.Second,
		MaxHeaderBytes:    1 << 16,
	}
	base := "http://" + ln.Addr().String()
	log.Info("serving", "addr", ln.Addr().String(), "url", base, "openapi", base+"/openapi.json", "model_version", service.ModelVersion)
	errc := make(chan error, 1)
	go func() { errc <- srv.Serve(ln) }()
	if cfg.Demo {
		if err := runDemo(ctx, base, cfg.DemoDir, stdout); err != nil {
			log.Error("demo failed", "err", err)
		}
	}
	select {
	case err := <-errc:
		if !errors.Is(err, http.ErrServerClosed) {
			return err
		}
		return nil
	case <-ctx.Done():
	}
	log.Info("shutting down")
	sctx, cancel := context.WithTimeout(context.Background(), cfg.ShutdownTimeout)
	defer cancel()
	if err := srv.Shutdown(sctx); err != nil {
		return fmt.Errorf("shutdown: %w", err)
	}
	return nil
}
