package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"log/slog"
	"net"
	"net/url"
	"os"
	"runtime/debug"
	"strconv"
	"strings"
	"time"
)

// config is the whole configuration, read once and checked before start.
type config struct {
	Addr     string
	LogLevel slog.Level
	Demo     bool
	DemoDir  string

	Tokens       []string // bearer tokens for /v1; none: no authentication
	MaxBodyBytes int64
	MaxInFlight  int
	CORSOrigins  []string

	ReadHeaderTimeout time.Duration
	ReadTimeout       time.Duration
	WriteTimeout      time.Duration
	IdleTimeout       time.Duration
	ComputeTimeout    time.Duration
	ShutdownGrace     time.Duration
	ShutdownDelay     time.Duration

	TLSCertFile string
	TLSKeyFile  string

	// GCPercent is the garbage collector's target (GOGC): the heap may
	// grow this many percent over the live heap before a collection.
	GCPercent int
	// MemoryLimit is Go's soft memory limit in bytes (GOMEMLIMIT); 0
	// leaves the runtime's (GOMEMLIMIT or none).
	MemoryLimit int64
}

// defaultConfig is the configuration with nothing set.
func defaultConfig() config {
	return config{
		Addr: "127.0.0.1:8080", LogLevel: slog.LevelInfo, DemoDir: "testdata/stages",
		MaxBodyBytes: 1 << 20, MaxInFlight: 64,
		ReadHeaderTimeout: 5 * time.Second, ReadTimeout: 15 * time.Second, WriteTimeout: 30 * time.Second,
		IdleTimeout: 120 * time.Second, ComputeTimeout: 20 * time.Second, ShutdownGrace: 10 * time.Second,
		GCPercent: DefaultGCPercent,
	}
}

// DefaultGCPercent is the default garbage-collection target. A request
// allocates tens of kilobytes that die at once and the live heap is a few
// megabytes, so collecting at 5x the live heap instead of Go's 2x cuts the
// collector's CPU share (issue 14: about 18 % of a sizing's CPU at GOGC
// 100) for about 12 MB more resident memory.
const DefaultGCPercent = 400

// minTokenLength is the shortest bearer token accepted (16 characters:
// common practice for a random secret, e.g. 96 bits in base64).
const minTokenLength = 16

// setting is one configuration value from a flag or its variable.
type setting struct {
	env, flag string
	value     *string
	fs        *flag.FlagSet
}

// name says where the value came from, for error messages.
func (s setting) name() string {
	set := false
	s.fs.Visit(func(f *flag.Flag) { set = set || f.Name == s.flag })
	if set {
		return "--" + s.flag
	}
	return s.env
}

func loadConfig(args []string, getenv func(string) string, stderr io.Writer) (config, error) {
	cfg := defaultConfig()
	fs := flag.NewFlagSet("stagewright", flag.ContinueOnError)
	fs.SetOutput(stderr)
	str := func(flagName, env, def, usage string) setting {
		if v := getenv(env); v != "" {
			def = v
		}
		return setting{env: env, flag: flagName, fs: fs, value: fs.String(flagName, def, usage+" (env "+env+")")}
	}
	dur := func(flagName, env string, def time.Duration, usage string) setting {
		return str(flagName, env, def.String(), usage+"; a Go duration such as 15s or 2m")
	}
	addr := str("addr", "STAGEWRIGHT_ADDR", cfg.Addr, "listen address host:port")
	level := str("log-level", "STAGEWRIGHT_LOG_LEVEL", "info", "log level: debug, info, warn, error")
	demoEnv := getenv("STAGEWRIGHT_DEMO")
	demoDefault := false
	if demoEnv != "" {
		b, err := strconv.ParseBool(demoEnv)
		if err != nil {
			return cfg, fmt.Errorf("STAGEWRIGHT_DEMO: want true or false, got %q", demoEnv)
		}
		demoDefault = b
	}
	demo := fs.Bool("demo", demoDefault, "after start, size the demo duties and print a summary (env STAGEWRIGHT_DEMO)")
	demoDir := str("demo-dir", "STAGEWRIGHT_DEMO_DIR", cfg.DemoDir, "folder of demo duties *.in.json")
	maxBody := str("max-body-bytes", "STAGEWRIGHT_MAX_BODY_BYTES", strconv.FormatInt(cfg.MaxBodyBytes, 10), "largest request body in bytes; larger ones get 413")
	maxInFlight := str("max-in-flight", "STAGEWRIGHT_MAX_IN_FLIGHT", strconv.Itoa(cfg.MaxInFlight), "most /v1 requests served at once; more get 503 with Retry-After")
	cors := str("cors-origins", "STAGEWRIGHT_CORS_ORIGINS", "", "comma-separated origins (scheme://host[:port]) allowed from browsers; empty: CORS off")
	readHeader := dur("read-header-timeout", "STAGEWRIGHT_READ_HEADER_TIMEOUT", cfg.ReadHeaderTimeout, "time to read the request headers")
	read := dur("read-timeout", "STAGEWRIGHT_READ_TIMEOUT", cfg.ReadTimeout, "time to read the whole request")
	write := dur("write-timeout", "STAGEWRIGHT_WRITE_TIMEOUT", cfg.WriteTimeout, "time from the end of the request headers to the end of the response")
	idle := dur("idle-timeout", "STAGEWRIGHT_IDLE_TIMEOUT", cfg.IdleTimeout, "time a keep-alive connection may stay idle")
	compute := dur("compute-timeout", "STAGEWRIGHT_COMPUTE_TIMEOUT", cfg.ComputeTimeout, "deadline of one /v1 request's computation (then 504)")
	grace := dur("shutdown-grace", "STAGEWRIGHT_SHUTDOWN_GRACE", cfg.ShutdownGrace, "time in-flight requests get to finish after SIGTERM")
	delay := dur("shutdown-delay", "STAGEWRIGHT_SHUTDOWN_DELAY", cfg.ShutdownDelay, "time between SIGTERM (readiness off) and closing the listener, for load balancers to notice; 0s: none")
	cert := str("tls-cert-file", "STAGEWRIGHT_TLS_CERT_FILE", "", "PEM certificate chain; with --tls-key-file, serve HTTPS")
	key := str("tls-key-file", "STAGEWRIGHT_TLS_KEY_FILE", "", "PEM private key of --tls-cert-file")
	gcPercent := str("gc-percent", "STAGEWRIGHT_GC_PERCENT", strconv.Itoa(cfg.GCPercent), "garbage-collection target in percent of the live heap (as GOGC, which it overrides)")
	memLimit := str("memory-limit", "STAGEWRIGHT_MEMORY_LIMIT", "", "Go's soft memory limit, e.g. 230MiB (as GOMEMLIMIT, which it overrides); empty: GOMEMLIMIT or none")
	fs.Usage = func() {
		fmt.Fprintln(fs.Output(), "Usage of stagewright (every flag also reads its STAGEWRIGHT_* variable; a flag wins):")
		fs.PrintDefaults()
		fmt.Fprintln(fs.Output(), "  STAGEWRIGHT_API_TOKENS (environment only)\n    \tcomma-separated bearer tokens of at least 16 characters; when set, every /v1 request needs one")
	}
	if err := fs.Parse(args); err != nil {
		return cfg, err
	}
	if fs.NArg() > 0 {
		return cfg, fmt.Errorf("unexpected arguments: %s", strings.Join(fs.Args(), " "))
	}

	var errs []error
	bad := func(s setting, format string, a ...any) {
		errs = append(errs, fmt.Errorf("%s %q: %s", s.name(), *s.value, fmt.Sprintf(format, a...)))
	}
	if _, port, err := net.SplitHostPort(*addr.value); err != nil {
		bad(addr, "listen address: %v", err)
	} else if n, err := strconv.Atoi(port); err != nil || n < 0 || n > 65535 {
		bad(addr, "listen address: the port must be a number from 0 to 65535")
	}
	if err := cfg.LogLevel.UnmarshalText([]byte(*level.value)); err != nil {
		bad(level, "log level: want debug, info, warn or error")
	}
	if n, err := strconv.ParseInt(*maxBody.value, 10, 64); err != nil || n < 1 || n > 1<<30 {
		bad(maxBody, "want a whole number of bytes from 1 to 1073741824 (1 GiB)")
	} else {
		cfg.MaxBodyBytes = n
	}
	if n, err := strconv.Atoi(*maxInFlight.value); err != nil || n < 1 || n > 100000 {
		bad(maxInFlight, "want a whole number of requests from 1 to 100000")
	} else {
		cfg.MaxInFlight = n
	}
	if n, err := strconv.Atoi(*gcPercent.value); err != nil || n < 10 || n > 10000 {
		bad(gcPercent, "want a whole percentage from 10 to 10000")
	} else {
		cfg.GCPercent = n
	}
	if *memLimit.value != "" {
		if n, err := parseBytes(*memLimit.value); err != nil || n < 16<<20 {
			bad(memLimit, "want a size of at least 16MiB: bytes, or a number with KiB, MiB or GiB")
		} else {
			cfg.MemoryLimit = n
		}
	}
	for _, d := range []struct {
		s     setting
		dst   *time.Duration
		allow bool // zero allowed
	}{
		{readHeader, &cfg.ReadHeaderTimeout, false}, {read, &cfg.ReadTimeout, false}, {write, &cfg.WriteTimeout, false},
		{idle, &cfg.IdleTimeout, false}, {compute, &cfg.ComputeTimeout, false}, {grace, &cfg.ShutdownGrace, false},
		{delay, &cfg.ShutdownDelay, true},
	} {
		v, err := time.ParseDuration(*d.s.value)
		switch {
		case err != nil:
			bad(d.s, "want a Go duration such as 15s, 500ms or 2m")
		case v < 0 || (v == 0 && !d.allow):
			bad(d.s, "want a duration above 0")
		default:
			*d.dst = v
		}
	}
	if len(errs) == 0 && cfg.ComputeTimeout >= cfg.WriteTimeout {
		bad(compute, "the compute deadline must be shorter than the write timeout (%s of %s), or a 504 could not be sent", cfg.WriteTimeout, write.name())
	}
	if len(errs) == 0 && cfg.ReadHeaderTimeout > cfg.ReadTimeout {
		bad(readHeader, "the header timeout must not exceed the read timeout (%s of %s)", cfg.ReadTimeout, read.name())
	}
	tokens, err := parseTokens(getenv("STAGEWRIGHT_API_TOKENS"))
	if err != nil {
		errs = append(errs, err) // never echoes a token
	}
	cfg.Tokens = tokens
	if origins, err := parseOrigins(*cors.value); err != nil {
		bad(cors, "%v", err)
	} else {
		cfg.CORSOrigins = origins
	}
	cfg.TLSCertFile, cfg.TLSKeyFile = *cert.value, *key.value
	switch {
	case (cfg.TLSCertFile == "") != (cfg.TLSKeyFile == ""):
		errs = append(errs, fmt.Errorf("%s and %s: give both the certificate and the key file, or neither", cert.name(), key.name()))
	case cfg.TLSCertFile != "":
		for _, s := range []setting{cert, key} {
			if st, err := os.Stat(*s.value); err != nil {
				bad(s, "%v", errors.Unwrap(err))
			} else if !st.Mode().IsRegular() {
				bad(s, "not a regular file")
			}
		}
		if *demo {
			errs = append(errs, errors.New("STAGEWRIGHT_DEMO / --demo: the demo speaks plain HTTP; run it without TLS"))
		}
	}
	cfg.Addr, cfg.Demo, cfg.DemoDir = *addr.value, *demo, *demoDir.value
	if err := errors.Join(errs...); err != nil {
		return cfg, err
	}
	return cfg, nil
}

// parseBytes reads a size as GOMEMLIMIT writes it: a whole number of
// bytes, optionally with the suffix B, KiB, MiB or GiB.
func parseBytes(v string) (int64, error) {
	mult := int64(1)
	for _, u := range []struct {
		suffix string
		mult   int64
	}{{"KiB", 1 << 10}, {"MiB", 1 << 20}, {"GiB", 1 << 30}, {"B", 1}} {
		if n, ok := strings.CutSuffix(v, u.suffix); ok {
			v, mult = n, u.mult
			break
		}
	}
	n, err := strconv.ParseInt(v, 10, 64)
	if err != nil || n < 0 || n > (1<<50)/mult {
		return 0, errors.New("not a size")
	}
	return n * mult, nil
}

// parseTokens splits STAGEWRIGHT_API_TOKENS. Its errors name the token by
// position, never by value. There is no flag: a command line is visible
// to every user of the machine.
func parseTokens(v string) ([]string, error) {
	if strings.TrimSpace(v) == "" {
		return nil, nil
	}
	parts := strings.Split(v, ",")
	var out []string
	for i, p := range parts {
		p = strings.TrimSpace(p)
		switch {
		case p == "":
			return nil, fmt.Errorf("STAGEWRIGHT_API_TOKENS: token %d of %d is empty (a stray comma?)", i+1, len(parts))
		case len(p) < minTokenLength:
			return nil, fmt.Errorf("STAGEWRIGHT_API_TOKENS: token %d of %d is shorter than %d characters", i+1, len(parts), minTokenLength)
		case strings.IndexFunc(p, func(r rune) bool { return r <= ' ' || r > '~' }) >= 0:
			return nil, fmt.Errorf("STAGEWRIGHT_API_TOKENS: token %d of %d has a character other than printable ASCII", i+1, len(parts))
		}
		out = append(out, p)
	}
	return out, nil
}

// parseOrigins splits a comma-separated list of origins, each
// scheme://host[:port] exactly as a browser sends it in Origin.
func parseOrigins(v string) ([]string, error) {
	if strings.TrimSpace(v) == "" {
		return nil, nil
	}
	var out []string
	for _, o := range strings.Split(v, ",") {
		o = strings.TrimSpace(o)
		if o == "*" {
			return nil, errors.New(`"*" is not accepted; name each origin`)
		}
		u, err := url.Parse(o)
		if err != nil || (u.Scheme != "http" && u.Scheme != "https") || u.Host == "" || u.User != nil ||
			(u.Path != "" && u.Path != "/") || u.RawQuery != "" || u.Fragment != "" {
			return nil, fmt.Errorf("origin %q: want scheme://host[:port], e.g. https://plant.example.com", o)
		}
		out = append(out, strings.ToLower(u.Scheme+"://"+u.Host))
	}
	return out, nil
}

// buildVersion returns the stamped version and commit, the commit falling
// back to the VCS revision the go command recorded (with "-dirty" for a
// modified tree).
func buildVersion() (string, string) {
	bi, _ := debug.ReadBuildInfo()
	return stamp(version, commit, bi)
}

// stamp fills the defaults "dev" and "unknown" of v and c from bi (nil:
// no build information).
func stamp(v, c string, bi *debug.BuildInfo) (string, string) {
	if bi == nil {
		return v, c
	}
	if v == "dev" && bi.Main.Version != "" && bi.Main.Version != "(devel)" {
		v = bi.Main.Version
	}
	if c == "unknown" {
		var rev, dirty string
		for _, s := range bi.Settings {
			switch s.Key {
			case "vcs.revision":
				rev = s.Value
			case "vcs.modified":
				if s.Value == "true" {
					dirty = "-dirty"
				}
			}
		}
		if rev != "" {
			c = rev + dirty
		}
	}
	return v, c
}
