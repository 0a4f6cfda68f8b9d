package main

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"io"
	"net"
	"net/http"
	"net/http/httptest"
	"path/filepath"
	"strings"
	"sync"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api"
	"stagewright/openapi"
	"stagewright/service"
)

// envOf is a getenv over a fixed map.
func envOf(m map[string]string) func(string) string {
	return func(k string) string { return m[k] }
}

// syncBuffer is a bytes.Buffer safe for the server goroutine and the test.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

// logLine returns the first JSON log line with msg, waiting up to 10 s.
func logLine(t *testing.T, logs *syncBuffer, msg string) map[string]any {
	t.Helper()
	var found map[string]any
	require.Eventually(t, func() bool {
		sc := bufio.NewScanner(strings.NewReader(logs.String()))
		for sc.Scan() {
			var line map[string]any
			if json.Unmarshal(sc.Bytes(), &line) == nil && line["msg"] == msg {
				found = line
				return true
			}
		}
		return false
	}, 10*time.Second, 10*time.Millisecond, "no %q log line in:\n%s", msg, logs.String())
	return found
}

// startRun runs run() in a goroutine and returns its error channel.
func startRun(ctx context.Context, args []string, stdout, stderr io.Writer) <-chan error {
	errc := make(chan error, 1)
	go func() { errc <- run(ctx, args, envOf(nil), stdout, stderr) }()
	return errc
}

func waitRun(t *testing.T, errc <-chan error) error {
	t.Helper()
	select {
	case err := <-errc:
		return err
	case <-time.After(15 * time.Second):
		t.Fatal("run did not return after its context was cancelled")
		return nil
	}
}

// TestRunServesUntilCancelled starts the server on a free loopback port,
// reads the address it logs, asks it for /healthz, and shuts it down by
// cancelling the context.
func TestRunServesUntilCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	var logs syncBuffer
	errc := startRun(ctx, []string{"--addr", "127.0.0.1:0"}, io.Discard, &logs)

	line := logLine(t, &logs, "serving")
	addr, _ := line["addr"].(string)
	host, port, err := net.SplitHostPort(addr)
	require.NoError(t, err, "logged address %q", addr)
	assert.Equal(t, "127.0.0.1", host)
	assert.NotEqual(t, "0", port, "the log must name the port actually bound")
	assert.Equal(t, "http://"+addr+"/openapi.json", line["openapi"])
	assert.NotEmpty(t, line["model_version"])

	client := &http.Client{Timeout: 5 * time.Second}
	resp, err := client.Get("http://" + addr + "/healthz")
	require.NoError(t, err)
	body, err := io.ReadAll(resp.Body)
	resp.Body.Close()
	require.NoError(t, err)
	assert.Equal(t, http.StatusOK, resp.StatusCode)
	assert.Contains(t, string(body), `"status":"ok"`)

	resp, err = client.Post("http://"+addr+"/v1/stage/size", "application/json", strings.NewReader(`{`))
	require.NoError(t, err)
	resp.Body.Close()
	assert.Equal(t, http.StatusBadRequest, resp.StatusCode)
	assert.Equal(t, "application/problem+json", resp.Header.Get("Content-Type"))

	cancel()
	require.NoError(t, waitRun(t, errc), "a cancelled context is a clean shutdown")
	logLine(t, &logs, "shutting down")
	logLine(t, &logs, "request") // one line per request
	_, err = client.Get("http://" + addr + "/healthz")
	assert.Error(t, err, "the server still answers after shutdown")
}

// TestRunDemo: --demo sizes every demo duty against the running server and
// prints one row per duty.
func TestRunDemo(t *testing.T) {
	dir := filepath.Join("..", "..", "testdata", "stages")
	files, err := filepath.Glob(filepath.Join(dir, "*.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, files)

	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	var out, logs syncBuffer
	errc := startRun(ctx, []string{"--addr", "127.0.0.1:0", "--log-level", "warn", "--demo", "--demo-dir", dir}, &out, &logs)
	require.Eventually(t, func() bool { return strings.Count(out.String(), "\n") >= len(files)+1 }, 20*time.Second, 20*time.Millisecond,
		"demo table incomplete:\n%s\nlogs:\n%s", out.String(), logs.String())
	cancel()
	require.NoError(t, waitRun(t, errc))

	table := out.String()
	assert.Contains(t, table, "verdict")
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".in.json")
		var row string
		for _, l := range strings.Split(table, "\n") {
			if strings.HasPrefix(l, name+" ") {
				row = l
			}
		}
		if assert.NotEmpty(t, row, "no row for %s in:\n%s", name, table) {
			assert.Equal(t, "200", strings.Fields(row)[1], "demo duty %s: %s", name, row)
		}
	}
	assert.NotContains(t, logs.String(), "demo failed")
}

// TestRunRejectsBadConfig: run refuses to start on a bad configuration
// and on an address it cannot listen on, and returns the error.
func TestRunRejectsBadConfig(t *testing.T) {
	busy, err := net.Listen("tcp", "127.0.0.1:0")
	require.NoError(t, err)
	defer busy.Close()
	for _, tc := range []struct {
		name, want string
		args       []string
	}{
		{"bad log level", "log level", []string{"--addr", "127.0.0.1:0", "--log-level", "chatty"}},
		{"address without port", "listen address", []string{"--addr", "127.0.0.1"}},
		{"port out of range", "", []string{"--addr", "127.0.0.1:99999"}},
		{"port in use", "listen on", []string{"--addr", busy.Addr().String()}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			ctx, cancel := context.WithTimeout(context.Background(), 10*time.Second)
			defer cancel()
			err := run(ctx, tc.args, envOf(nil), io.Discard, io.Discard)
			require.Error(t, err)
			assert.Contains(t, err.Error(), tc.want)
		})
	}
}

// writeCounter counts the writes it receives.
type writeCounter struct {
	bytes.Buffer
	writes int
}

func (w *writeCounter) Write(p []byte) (int, error) {
	w.writes++
	return w.Buffer.Write(p)
}

// TestDemoTableClean (issue 13, newcomer's papercuts): the demo table is
// written in one piece (so the server's log lines on stderr cannot fall
// between its rows in a terminal) and its warnings column names each code
// once (it read "water-dew-point,water-dew-point").
func TestDemoTableClean(t *testing.T) {
	h, err := api.NewRouter(service.New(), api.Options{Spec: openapi.Swagger2()})
	require.NoError(t, err)
	srv := httptest.NewServer(h)
	defer srv.Close()
	var out writeCounter
	require.NoError(t, runDemo(context.Background(), srv.URL, filepath.Join("..", "..", "testdata", "stages"), "", &out))
	assert.Equal(t, 1, out.writes, "the table in one write")
	rows := strings.Split(strings.TrimSpace(out.String()), "\n")
	require.Greater(t, len(rows), 5)
	withWarnings := 0
	for _, row := range rows[1:] {
		f := strings.Fields(row)
		if len(f) < 8 {
			continue
		}
		codes := strings.Split(f[len(f)-1], ",")
		withWarnings++
		seen := map[string]bool{}
		for _, c := range codes {
			assert.False(t, seen[c], "code %s repeated in %q", c, row)
			seen[c] = true
		}
	}
	assert.Positive(t, withWarnings)
}
