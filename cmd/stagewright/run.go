package main

import (
	"context"
	"crypto/tls"
	"errors"
	"fmt"
	"io"
	"log/slog"
	"net"
	"net/http"
	"runtime/debug"
	"sync"
	"sync/atomic"
	"time"

	"github.com/gin-gonic/gin"

	"stagewright/api"
	"stagewright/openapi"
	"stagewright/service"
)

// run starts the server and blocks until ctx ends (SIGTERM or SIGINT in
// main), then shuts down gracefully: readiness off (from then on every
// answer says Connection: close, api.Options.Ready), after
// cfg.ShutdownDelay the listener closes, and in-flight requests get
// cfg.ShutdownGrace to finish. It returns nil after a clean shutdown.
func run(ctx context.Context, args []string, getenv func(string) string, stdout, stderr io.Writer) error {
	cfg, err := loadConfig(args, getenv, stderr)
	if err != nil {
		return err
	}
	log := slog.New(slog.NewJSONHandler(stderr, &slog.HandlerOptions{Level: cfg.LogLevel}))
	debug.SetGCPercent(cfg.GCPercent)
	if cfg.MemoryLimit > 0 {
		debug.SetMemoryLimit(cfg.MemoryLimit)
	}
	ver, rev := buildVersion()
	var ready atomic.Bool
	gin.SetMode(gin.ReleaseMode)
	router, err := api.NewRouter(service.New(service.WithVersion(ver)), api.Options{
		Spec: openapi.Swagger2(), Log: log, Tokens: cfg.Tokens, MaxBodyBytes: cfg.MaxBodyBytes,
		ComputeTimeout: cfg.ComputeTimeout, MaxInFlight: cfg.MaxInFlight, CORSOrigins: cfg.CORSOrigins,
		Version: ver, Commit: rev, Ready: ready.Load,
	})
	if err != nil {
		return err
	}
	srv := &http.Server{
		Handler:           router,
		ReadHeaderTimeout: cfg.ReadHeaderTimeout,
		ReadTimeout:       cfg.ReadTimeout,
		WriteTimeout:      cfg.WriteTimeout,
		IdleTimeout:       cfg.IdleTimeout,
		MaxHeaderBytes:    1 << 16,
		ErrorLog:          slog.NewLogLogger(log.Handler(), slog.LevelWarn),
	}
	conns := newConnTracker()
	srv.ConnState = conns.track
	scheme, useTLS := "http", cfg.TLSCertFile != ""
	if useTLS {
		pair, err := tls.LoadX509KeyPair(cfg.TLSCertFile, cfg.TLSKeyFile)
		if err != nil {
			return fmt.Errorf("STAGEWRIGHT_TLS_CERT_FILE / STAGEWRIGHT_TLS_KEY_FILE: %w", err)
		}
		srv.TLSConfig = &tls.Config{Certificates: []tls.Certificate{pair}, MinVersion: tls.VersionTLS12}
		scheme = "https"
	}
	ln, err := listen(cfg.Addr)
	if err != nil {
		return fmt.Errorf("listen on %s: %w", cfg.Addr, err)
	}
	base := scheme + "://" + ln.Addr().String()
	errc := make(chan error, 1)
	go func() { // from here on srv belongs to Serve: its fields are not read
		if useTLS {
			errc <- srv.ServeTLS(ln, "", "")
			return
		}
		errc <- srv.Serve(ln)
	}()
	ready.Store(true)
	log.Info("serving", "addr", ln.Addr().String(), "url", base, "openapi", base+"/openapi.json",
		"version", ver, "commit", rev, "model_version", service.ModelVersion,
		"auth", len(cfg.Tokens) > 0, "tls", useTLS, "max_in_flight", cfg.MaxInFlight,
		"max_body_bytes", cfg.MaxBodyBytes, "compute_timeout", cfg.ComputeTimeout.String(),
		"gc_percent", cfg.GCPercent, "memory_limit", debug.SetMemoryLimit(-1))
	if cfg.Demo {
		token := ""
		if len(cfg.Tokens) > 0 {
			token = cfg.Tokens[0]
		}
		if err := runDemo(ctx, base, cfg.DemoDir, token, stdout); err != nil {
			log.Error("demo failed", "err", err)
		}
	}
	select {
	case err := <-errc:
		ready.Store(false)
		if !errors.Is(err, http.ErrServerClosed) {
			return err
		}
		return nil
	case <-ctx.Done():
	}
	ready.Store(false)
	log.Info("shutting down", "delay", cfg.ShutdownDelay.String(), "grace", cfg.ShutdownGrace.String())
	if cfg.ShutdownDelay > 0 {
		// Still serving, but not ready: load balancers take the instance
		// out of rotation before the listener closes.
		time.Sleep(cfg.ShutdownDelay)
	}
	sctx, cancel := context.WithTimeout(context.Background(), cfg.ShutdownGrace)
	defer cancel()
	// Close the listener first and let every accepted connection finish
	// its request (each answer says Connection: close) before Shutdown;
	// the listener stops new handshakes and first accepts what clients
	// have already queued (drainingListener), which closing it would
	// reset: net/http drops, unanswered, a request it reads once Shutdown
	// has begun, and with keep-alives ending every connection carries one
	// request that may arrive just then. Idle connections are closed.
	_ = ln.Close()
	log.Info("listener closing", "new_connections_refused", ln.filtered.Load(), "accept_drain", acceptDrain.String())
	select { // Serve returns once the listener has taken the last queued connection
	case <-errc:
	case <-sctx.Done():
	}
	conns.drain(sctx)
	if err := srv.Shutdown(sctx); err != nil {
		_ = srv.Close()
		return fmt.Errorf("shutdown: requests still running after the grace period of %s were cut: %w", cfg.ShutdownGrace, err)
	}
	log.Info("stopped")
	return nil
}

// connTracker follows the server's connections (http.Server.ConnState) so
// that shutdown can wait for the accepted ones to finish.
type connTracker struct {
	mu    sync.Mutex
	conns map[net.Conn]http.ConnState
}

func newConnTracker() *connTracker { return &connTracker{conns: map[net.Conn]http.ConnState{}} }

func (t *connTracker) track(c net.Conn, st http.ConnState) {
	t.mu.Lock()
	defer t.mu.Unlock()
	switch st {
	case http.StateClosed, http.StateHijacked:
		delete(t.conns, c)
	default:
		t.conns[c] = st
	}
}

// drain closes idle connections and waits until no connection is left or
// ctx ends.
func (t *connTracker) drain(ctx context.Context) {
	tick := time.NewTicker(5 * time.Millisecond)
	defer tick.Stop()
	for {
		t.mu.Lock()
		for c, st := range t.conns {
			if st == http.StateIdle {
				_ = c.Close()
			}
		}
		n := len(t.conns)
		t.mu.Unlock()
		if n == 0 {
			return
		}
		select {
		case <-ctx.Done():
			return
		case <-tick.C:
		}
	}
}

// acceptDrain is how long a closing listener waits for connections the
// kernel may still be completing; the drain goes on while its accept queue
// holds any, up to acceptDrainMax (a bound for systems where new ones
// cannot be refused and the queue may never empty).
const (
	acceptDrain    = 50 * time.Millisecond
	acceptDrainMax = 2 * time.Second
)

// listen opens the service's TCP listener. Plain TCP, not the multipath
// TCP Go asks for by default: the graceful close filters the listening
// socket (refuseNewConnections), which an MPTCP socket refuses
// (EOPNOTSUPP).
func listen(addr string) (*drainingListener, error) {
	lc := net.ListenConfig{}
	lc.SetMultipathTCP(false)
	ln, err := lc.Listen(context.Background(), "tcp", addr)
	if err != nil {
		return nil, err
	}
	return &drainingListener{TCPListener: ln.(*net.TCPListener)}, nil
}

// drainingListener closes gracefully. Closing a listening socket resets
// every connection still in its accept queue, and a request a client has
// already written on one is lost. So Close first stops the kernel from
// starting new handshakes (refuseNewConnections, on Linux), then the
// listener goes on accepting what the kernel has queued until the queue is
// empty (acceptQueueLen) and acceptDrain has passed, then it closes.
// Without the filter (other systems) clients keep connecting during the
// drain and one queued in its last instant may still be reset.
type drainingListener struct {
	*net.TCPListener
	closing  atomic.Bool
	filtered atomic.Bool // new handshakes refused since Close
	until    time.Time   // the drain's bound; Accept's goroutine only
}

func (l *drainingListener) Accept() (net.Conn, error) {
	for {
		c, err := l.TCPListener.Accept()
		if err == nil || !l.closing.Load() {
			return c, err
		}
		// Closing and the drain deadline has passed: go on while the
		// kernel still holds completed connections.
		if l.until.IsZero() {
			l.until = time.Now().Add(acceptDrainMax)
		}
		if n, qerr := acceptQueueLen(l.TCPListener); qerr == nil && n > 0 && time.Now().Before(l.until) {
			_ = l.TCPListener.SetDeadline(time.Now().Add(acceptDrain))
			continue
		}
		_ = l.TCPListener.Close()
		return nil, net.ErrClosed
	}
}

func (l *drainingListener) Close() error {
	if l.closing.Swap(true) {
		return nil
	}
	l.filtered.Store(refuseNewConnections(l.TCPListener) == nil)
	return l.TCPListener.SetDeadline(time.Now().Add(acceptDrain))
}
