package main

import (
	"io"
	"log/slog"
	"os"
	"path/filepath"
	"runtime/debug"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// with returns the default configuration changed by f.
func with(f func(c *config)) config {
	c := defaultConfig()
	f(&c)
	return c
}

func TestLoadConfig(t *testing.T) {
	dir := t.TempDir()
	certFile, keyFile := filepath.Join(dir, "cert.pem"), filepath.Join(dir, "key.pem")
	require.NoError(t, os.WriteFile(certFile, []byte("x"), 0o600))
	require.NoError(t, os.WriteFile(keyFile, []byte("x"), 0o600))
	tokenA, tokenB := strings.Repeat("a", 16), "tok-"+strings.Repeat("b", 28)
	tests := []struct {
		name    string
		args    []string
		env     map[string]string
		want    config
		wantErr []string // every substring in the error
	}{
		{name: "defaults", want: defaultConfig()},
		{name: "from env", env: map[string]string{"STAGEWRIGHT_ADDR": "127.0.0.1:9000", "STAGEWRIGHT_LOG_LEVEL": "debug", "STAGEWRIGHT_DEMO": "true", "STAGEWRIGHT_DEMO_DIR": "/d"},
			want: with(func(c *config) { c.Addr, c.LogLevel, c.Demo, c.DemoDir = "127.0.0.1:9000", slog.LevelDebug, true, "/d" })},
		{name: "flags win over env", args: []string{"--addr", "127.0.0.1:9100", "--log-level", "warn", "--demo=false", "--demo-dir", "/f"},
			env:  map[string]string{"STAGEWRIGHT_ADDR": "127.0.0.1:9000", "STAGEWRIGHT_LOG_LEVEL": "debug", "STAGEWRIGHT_DEMO": "true", "STAGEWRIGHT_DEMO_DIR": "/d"},
			want: with(func(c *config) { c.Addr, c.LogLevel, c.DemoDir = "127.0.0.1:9100", slog.LevelWarn, "/f" })},
		{name: "single-dash flag", args: []string{"-log-level=error"}, want: with(func(c *config) { c.LogLevel = slog.LevelError })},
		{name: "every service setting from env", env: map[string]string{
			"STAGEWRIGHT_API_TOKENS": " " + tokenA + " , " + tokenB + " ", "STAGEWRIGHT_MAX_BODY_BYTES": "4096",
			"STAGEWRIGHT_MAX_IN_FLIGHT": "8", "STAGEWRIGHT_CORS_ORIGINS": "https://ops.kestrel.example, http://localhost:3000",
			"STAGEWRIGHT_READ_HEADER_TIMEOUT": "2s", "STAGEWRIGHT_READ_TIMEOUT": "3s", "STAGEWRIGHT_WRITE_TIMEOUT": "4s",
			"STAGEWRIGHT_IDLE_TIMEOUT": "1m", "STAGEWRIGHT_COMPUTE_TIMEOUT": "1500ms", "STAGEWRIGHT_SHUTDOWN_GRACE": "25s",
			"STAGEWRIGHT_SHUTDOWN_DELAY": "5s", "STAGEWRIGHT_TLS_CERT_FILE": certFile, "STAGEWRIGHT_TLS_KEY_FILE": keyFile},
			want: with(func(c *config) {
				c.Tokens, c.MaxBodyBytes, c.MaxInFlight = []string{tokenA, tokenB}, 4096, 8
				c.CORSOrigins = []string{"https://ops.kestrel.example", "http://localhost:3000"}
				c.ReadHeaderTimeout, c.ReadTimeout, c.WriteTimeout, c.IdleTimeout = 2*time.Second, 3*time.Second, 4*time.Second, time.Minute
				c.ComputeTimeout, c.ShutdownGrace, c.ShutdownDelay = 1500*time.Millisecond, 25*time.Second, 5*time.Second
				c.TLSCertFile, c.TLSKeyFile = certFile, keyFile
			})},
		{name: "every service setting from flags, over env",
			args: []string{"--max-body-bytes=100", "--max-in-flight=2", "--cors-origins=https://a.example", "--read-header-timeout=1s",
				"--read-timeout=2s", "--write-timeout=3s", "--idle-timeout=4s", "--compute-timeout=2500ms", "--shutdown-grace=5s",
				"--shutdown-delay=0s", "--tls-cert-file", certFile, "--tls-key-file", keyFile},
			env: map[string]string{"STAGEWRIGHT_MAX_BODY_BYTES": "x", "STAGEWRIGHT_MAX_IN_FLIGHT": "x", "STAGEWRIGHT_CORS_ORIGINS": "*",
				"STAGEWRIGHT_READ_TIMEOUT": "x", "STAGEWRIGHT_COMPUTE_TIMEOUT": "x", "STAGEWRIGHT_TLS_CERT_FILE": "/nonexistent"},
			want: with(func(c *config) {
				c.MaxBodyBytes, c.MaxInFlight, c.CORSOrigins = 100, 2, []string{"https://a.example"}
				c.ReadHeaderTimeout, c.ReadTimeout, c.WriteTimeout, c.IdleTimeout = time.Second, 2*time.Second, 3*time.Second, 4*time.Second
				c.ComputeTimeout, c.ShutdownGrace = 2500*time.Millisecond, 5*time.Second
				c.TLSCertFile, c.TLSKeyFile = certFile, keyFile
			})},
		{name: "garbage collection from env", env: map[string]string{"STAGEWRIGHT_GC_PERCENT": "150", "STAGEWRIGHT_MEMORY_LIMIT": "230MiB"},
			want: with(func(c *config) { c.GCPercent, c.MemoryLimit = 150, 230<<20 })},
		{name: "garbage collection from flags, over env", args: []string{"--gc-percent=800", "--memory-limit=1GiB"},
			env:  map[string]string{"STAGEWRIGHT_GC_PERCENT": "x", "STAGEWRIGHT_MEMORY_LIMIT": "x"},
			want: with(func(c *config) { c.GCPercent, c.MemoryLimit = 800, 1<<30 })},
		{name: "memory limit in bytes", env: map[string]string{"STAGEWRIGHT_MEMORY_LIMIT": "67108864"},
			want: with(func(c *config) { c.MemoryLimit = 64 << 20 })},
		{name: "gc percent too low", env: map[string]string{"STAGEWRIGHT_GC_PERCENT": "5"}, wantErr: []string{"STAGEWRIGHT_GC_PERCENT", "10 to 10000"}},
		{name: "gc percent off is not a number", args: []string{"--gc-percent=off"}, wantErr: []string{"--gc-percent", "percentage"}},
		{name: "memory limit too small", env: map[string]string{"STAGEWRIGHT_MEMORY_LIMIT": "1MiB"}, wantErr: []string{"STAGEWRIGHT_MEMORY_LIMIT", "16MiB"}},
		{name: "memory limit unit unknown", env: map[string]string{"STAGEWRIGHT_MEMORY_LIMIT": "2GB"}, wantErr: []string{"STAGEWRIGHT_MEMORY_LIMIT"}},
		{name: "origin case folded", env: map[string]string{"STAGEWRIGHT_CORS_ORIGINS": "HTTPS://Ops.Example:8443/"},
			want: with(func(c *config) { c.CORSOrigins = []string{"https://ops.example:8443"} })},

		{name: "address without port from flag", args: []string{"--addr", "127.0.0.1"}, wantErr: []string{"--addr", "listen address"}},
		{name: "address without port from env", env: map[string]string{"STAGEWRIGHT_ADDR": "localhost"}, wantErr: []string{"STAGEWRIGHT_ADDR", "listen address"}},
		{name: "bad flag address wins over a good env address", args: []string{"--addr", "nonsense"}, env: map[string]string{"STAGEWRIGHT_ADDR": "127.0.0.1:9000"}, wantErr: []string{"listen address"}},
		{name: "port out of range", args: []string{"--addr", "127.0.0.1:99999"}, wantErr: []string{"port must be a number"}},
		{name: "port not a number", env: map[string]string{"STAGEWRIGHT_ADDR": "127.0.0.1:http"}, wantErr: []string{"port must be a number"}},
		{name: "bad log level from flag", args: []string{"--log-level", "verbose"}, wantErr: []string{"--log-level", "log level"}},
		{name: "bad log level from env", env: map[string]string{"STAGEWRIGHT_LOG_LEVEL": "loud"}, wantErr: []string{"STAGEWRIGHT_LOG_LEVEL", "log level"}},
		{name: "bad demo switch from env", env: map[string]string{"STAGEWRIGHT_DEMO": "maybe"}, wantErr: []string{"STAGEWRIGHT_DEMO"}},
		{name: "unknown flag", args: []string{"--port", "80"}, wantErr: []string{"flag provided but not defined"}},
		{name: "stray argument", args: []string{"serve"}, wantErr: []string{"unexpected arguments"}},

		{name: "body limit not a number", env: map[string]string{"STAGEWRIGHT_MAX_BODY_BYTES": "1MiB"}, wantErr: []string{"STAGEWRIGHT_MAX_BODY_BYTES", "whole number of bytes"}},
		{name: "body limit zero", env: map[string]string{"STAGEWRIGHT_MAX_BODY_BYTES": "0"}, wantErr: []string{"STAGEWRIGHT_MAX_BODY_BYTES"}},
		{name: "body limit negative", env: map[string]string{"STAGEWRIGHT_MAX_BODY_BYTES": "-1"}, wantErr: []string{"STAGEWRIGHT_MAX_BODY_BYTES"}},
		{name: "body limit above 1 GiB", env: map[string]string{"STAGEWRIGHT_MAX_BODY_BYTES": "1073741825"}, wantErr: []string{"STAGEWRIGHT_MAX_BODY_BYTES"}},
		{name: "body limit from flag", args: []string{"--max-body-bytes", "big"}, wantErr: []string{"--max-body-bytes"}},
		{name: "in-flight zero", env: map[string]string{"STAGEWRIGHT_MAX_IN_FLIGHT": "0"}, wantErr: []string{"STAGEWRIGHT_MAX_IN_FLIGHT", "from 1 to 100000"}},
		{name: "in-flight not a number", env: map[string]string{"STAGEWRIGHT_MAX_IN_FLIGHT": "many"}, wantErr: []string{"STAGEWRIGHT_MAX_IN_FLIGHT"}},
		{name: "read-header timeout not a duration", env: map[string]string{"STAGEWRIGHT_READ_HEADER_TIMEOUT": "5"}, wantErr: []string{"STAGEWRIGHT_READ_HEADER_TIMEOUT", "Go duration"}},
		{name: "read timeout zero", env: map[string]string{"STAGEWRIGHT_READ_TIMEOUT": "0s"}, wantErr: []string{"STAGEWRIGHT_READ_TIMEOUT", "above 0"}},
		{name: "write timeout negative", env: map[string]string{"STAGEWRIGHT_WRITE_TIMEOUT": "-3s"}, wantErr: []string{"STAGEWRIGHT_WRITE_TIMEOUT", "above 0"}},
		{name: "idle timeout garbage", env: map[string]string{"STAGEWRIGHT_IDLE_TIMEOUT": "forever"}, wantErr: []string{"STAGEWRIGHT_IDLE_TIMEOUT"}},
		{name: "compute timeout garbage", env: map[string]string{"STAGEWRIGHT_COMPUTE_TIMEOUT": "soon"}, wantErr: []string{"STAGEWRIGHT_COMPUTE_TIMEOUT"}},
		{name: "compute timeout not below write timeout", env: map[string]string{"STAGEWRIGHT_COMPUTE_TIMEOUT": "30s"},
			wantErr: []string{"STAGEWRIGHT_COMPUTE_TIMEOUT", "shorter than the write timeout", "STAGEWRIGHT_WRITE_TIMEOUT"}},
		{name: "header timeout above read timeout", env: map[string]string{"STAGEWRIGHT_READ_HEADER_TIMEOUT": "20s"},
			wantErr: []string{"STAGEWRIGHT_READ_HEADER_TIMEOUT", "STAGEWRIGHT_READ_TIMEOUT"}},
		{name: "shutdown grace zero", env: map[string]string{"STAGEWRIGHT_SHUTDOWN_GRACE": "0"}, wantErr: []string{"STAGEWRIGHT_SHUTDOWN_GRACE"}},
		{name: "shutdown delay negative", env: map[string]string{"STAGEWRIGHT_SHUTDOWN_DELAY": "-1s"}, wantErr: []string{"STAGEWRIGHT_SHUTDOWN_DELAY"}},
		{name: "two bad variables are both named", env: map[string]string{"STAGEWRIGHT_READ_TIMEOUT": "x", "STAGEWRIGHT_MAX_IN_FLIGHT": "-2"},
			wantErr: []string{"STAGEWRIGHT_READ_TIMEOUT", "STAGEWRIGHT_MAX_IN_FLIGHT"}},
		{name: "token too short", env: map[string]string{"STAGEWRIGHT_API_TOKENS": tokenA + ",short"}, wantErr: []string{"STAGEWRIGHT_API_TOKENS", "token 2 of 2", "shorter than 16"}},
		{name: "empty token", env: map[string]string{"STAGEWRIGHT_API_TOKENS": tokenA + ",,"}, wantErr: []string{"STAGEWRIGHT_API_TOKENS", "token 2 of 3 is empty"}},
		{name: "token with a control character", env: map[string]string{"STAGEWRIGHT_API_TOKENS": tokenA + "\x01"}, wantErr: []string{"STAGEWRIGHT_API_TOKENS", "printable ASCII"}},
		{name: "token with a space inside", env: map[string]string{"STAGEWRIGHT_API_TOKENS": "abcdefgh ijklmnopq"}, wantErr: []string{"STAGEWRIGHT_API_TOKENS", "printable ASCII"}},
		{name: "wildcard origin", env: map[string]string{"STAGEWRIGHT_CORS_ORIGINS": "*"}, wantErr: []string{"STAGEWRIGHT_CORS_ORIGINS", "name each origin"}},
		{name: "origin with a path", env: map[string]string{"STAGEWRIGHT_CORS_ORIGINS": "https://a.example/app"}, wantErr: []string{"STAGEWRIGHT_CORS_ORIGINS", "scheme://host"}},
		{name: "origin without scheme", env: map[string]string{"STAGEWRIGHT_CORS_ORIGINS": "a.example"}, wantErr: []string{"STAGEWRIGHT_CORS_ORIGINS"}},
		{name: "origin of another scheme", args: []string{"--cors-origins", "ftp://a.example"}, wantErr: []string{"--cors-origins"}},
		{name: "certificate without key", env: map[string]string{"STAGEWRIGHT_TLS_CERT_FILE": certFile}, wantErr: []string{"STAGEWRIGHT_TLS_CERT_FILE", "STAGEWRIGHT_TLS_KEY_FILE", "both"}},
		{name: "key without certificate", args: []string{"--tls-key-file", keyFile}, wantErr: []string{"--tls-key-file", "both"}},
		{name: "certificate file missing", env: map[string]string{"STAGEWRIGHT_TLS_CERT_FILE": filepath.Join(dir, "none.pem"), "STAGEWRIGHT_TLS_KEY_FILE": keyFile},
			wantErr: []string{"STAGEWRIGHT_TLS_CERT_FILE", "no such file"}},
		{name: "key is a folder", env: map[string]string{"STAGEWRIGHT_TLS_CERT_FILE": certFile, "STAGEWRIGHT_TLS_KEY_FILE": dir},
			wantErr: []string{"STAGEWRIGHT_TLS_KEY_FILE", "not a regular file"}},
		{name: "demo with TLS", args: []string{"--demo"}, env: map[string]string{"STAGEWRIGHT_TLS_CERT_FILE": certFile, "STAGEWRIGHT_TLS_KEY_FILE": keyFile},
			wantErr: []string{"STAGEWRIGHT_DEMO", "without TLS"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got, err := loadConfig(tc.args, envOf(tc.env), io.Discard)
			if len(tc.wantErr) > 0 {
				require.Error(t, err)
				for _, w := range tc.wantErr {
					assert.Contains(t, err.Error(), w)
				}
				return
			}
			require.NoError(t, err)
			assert.Equal(t, tc.want, got)
		})
	}
}

// TestLoadConfigNeverEchoesTokens: a token refused for its length or
// content is named by position only.
func TestLoadConfigNeverEchoesTokens(t *testing.T) {
	for _, secret := range []string{"sh0rt-s3cret", "long-enough-secret\x7f"} {
		_, err := loadConfig(nil, envOf(map[string]string{"STAGEWRIGHT_API_TOKENS": secret}), io.Discard)
		require.Error(t, err)
		assert.NotContains(t, err.Error(), strings.TrimRight(secret, "\x7f"))
	}
}

// TestBuildVersion: ldflags values win; without them the commit is the
// recorded VCS revision or "unknown" (test binaries record none).
func TestBuildVersion(t *testing.T) {
	v, c := buildVersion()
	assert.Equal(t, "dev", v)
	assert.NotEmpty(t, c)
	oldV, oldC := version, commit
	t.Cleanup(func() { version, commit = oldV, oldC })
	version, commit = "1.2.3", "abc123"
	v, c = buildVersion()
	assert.Equal(t, "1.2.3", v)
	assert.Equal(t, "abc123", c)
}

// TestStamp: without -ldflags the commit is the recorded VCS revision,
// marked -dirty for a modified tree, and the version the module's, unless
// it is the "(devel)" of a local build; stamped values are kept.
func TestStamp(t *testing.T) {
	info := func(mainVersion string, settings ...string) *debug.BuildInfo {
		bi := &debug.BuildInfo{Main: debug.Module{Path: "stagewright", Version: mainVersion}}
		for i := 0; i+1 < len(settings); i += 2 {
			bi.Settings = append(bi.Settings, debug.BuildSetting{Key: settings[i], Value: settings[i+1]})
		}
		return bi
	}
	tests := []struct {
		name         string
		v, c         string
		bi           *debug.BuildInfo
		wantV, wantC string
	}{
		{"no build information", "dev", "unknown", nil, "dev", "unknown"},
		{"local build without VCS", "dev", "unknown", info("(devel)"), "dev", "unknown"},
		{"clean tree", "dev", "unknown", info("(devel)", "vcs.revision", "954da3b5", "vcs.modified", "false"), "dev", "954da3b5"},
		{"modified tree", "dev", "unknown", info("(devel)", "vcs.revision", "954da3b5", "vcs.modified", "true"), "dev", "954da3b5-dirty"},
		{"go install of a tagged module", "dev", "unknown", info("v1.4.0"), "v1.4.0", "unknown"},
		{"ldflags win", "1.4.0", "abc", info("v9.9.9", "vcs.revision", "954da3b5"), "1.4.0", "abc"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			v, c := stamp(tc.v, tc.c, tc.bi)
			assert.Equal(t, tc.wantV, v)
			assert.Equal(t, tc.wantC, c)
		})
	}
}
