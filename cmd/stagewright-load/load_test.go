package main

import (
	"bytes"
	"context"
	"encoding/json"
	"io"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"sync/atomic"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestLoopbackURL(t *testing.T) {
	for _, ok := range []string{"http://127.0.0.1:8080", "http://127.0.0.1:18181/", "http://127.3.4.5:1", "http://[::1]:8080"} {
		u, err := loopbackURL(ok)
		require.NoError(t, err, ok)
		assert.Empty(t, u.Path)
	}
	for _, bad := range []string{
		"http://localhost:8080", // a name: what it resolves to is not checked
		"http://10.0.0.1:8080", "http://192.168.1.10", "http://172.16.0.1", "http://8.8.8.8", "http://example.com",
		"http://0.0.0.0:8080", "https://127.0.0.1:8080", "127.0.0.1:8080", "http://127.0.0.1:8080/v1/stage/size",
		"http://u:p@127.0.0.1:8080", "http://127.0.0.1.example.com", "http://[::ffff:10.0.0.1]:80", "",
	} {
		_, err := loopbackURL(bad)
		assert.Error(t, err, bad)
	}
}

func TestLoopbackDialerRefuses(t *testing.T) {
	dial := loopbackDialer()
	for _, addr := range []string{"10.0.0.1:80", "example.com:80", "localhost:80"} {
		_, err := dial(context.Background(), "tcp", addr)
		require.ErrorContains(t, err, "refused", addr)
	}
}

func TestPercentile(t *testing.T) {
	// Nearest-rank definition (common practice): for 1..100 ms, p50 = 50,
	// p95 = 95, p99 = 99; for one value every percentile is that value.
	var d []time.Duration
	for i := 1; i <= 100; i++ {
		d = append(d, time.Duration(i)*time.Millisecond)
	}
	assert.Equal(t, 50*time.Millisecond, percentile(d, 50))
	assert.Equal(t, 95*time.Millisecond, percentile(d, 95))
	assert.Equal(t, 99*time.Millisecond, percentile(d, 99))
	assert.Equal(t, 100*time.Millisecond, percentile(d, 100))
	one := []time.Duration{7}
	assert.Equal(t, time.Duration(7), percentile(one, 1))
	assert.Equal(t, time.Duration(7), percentile(one, 99))
	assert.Equal(t, time.Duration(0), percentile(nil, 50))
}

func TestParseOptionsBounds(t *testing.T) {
	duty := filepath.Join(t.TempDir(), "d.in.json")
	require.NoError(t, os.WriteFile(duty, []byte(`{}`), 0o600))
	for _, args := range [][]string{
		{"-n", "0"}, {"-n", "1000001"}, {"-c", "0"}, {"-c", "257"}, {"-duration", "0s"}, {"-duration", "11m"},
		{"-timeout", "0s"}, {"-url", "http://10.1.2.3:8080"}, {"extra"}, {"-duty", filepath.Join(t.TempDir(), "none")},
	} {
		_, err := parseOptions(append([]string{"-duty", duty}, args...), io.Discard)
		assert.Error(t, err, "%v", args)
	}
	o, err := parseOptions([]string{"-duty", duty, "-n", "10", "-c", "2"}, io.Discard)
	require.NoError(t, err)
	assert.Equal(t, []string{duty}, o.Duties)
	o, err = parseOptions([]string{"-duty", filepath.Join("..", "..", "testdata", "stages")}, io.Discard)
	require.NoError(t, err)
	assert.NotEmpty(t, o.Duties)
}

// TestRunAgainstLocalServer runs a bounded load against an httptest server
// on 127.0.0.1 that fails every tenth request.
func TestRunAgainstLocalServer(t *testing.T) {
	var n atomic.Int64
	srv := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if r.Method != http.MethodPost || r.URL.Path != "/v1/stage/size" || r.Header.Get("Content-Type") != "application/json" {
			http.Error(w, "bad request line", http.StatusBadRequest)
			return
		}
		body, _ := io.ReadAll(r.Body)
		if !json.Valid(body) {
			http.Error(w, "bad body", http.StatusBadRequest)
			return
		}
		if n.Add(1)%10 == 0 {
			http.Error(w, "no", http.StatusUnprocessableEntity)
			return
		}
		w.Header().Set("Content-Type", "application/json")
		_, _ = w.Write([]byte(`{"verdict":"ok"}`))
	}))
	defer srv.Close()
	dir := t.TempDir()
	for _, name := range []string{"a.in.json", "b.in.json"} {
		require.NoError(t, os.WriteFile(filepath.Join(dir, name), []byte(`{"x":1}`), 0o600))
	}
	var out bytes.Buffer
	err := run(context.Background(), []string{"-url", srv.URL, "-n", "200", "-c", "4", "-duty", dir, "-json"}, &out, io.Discard)
	require.ErrorContains(t, err, "20 of 200 requests failed")
	var rep Report
	require.NoError(t, json.Unmarshal(out.Bytes(), &rep))
	assert.Equal(t, 200, rep.Completed)
	assert.Equal(t, 180, rep.OK)
	assert.Equal(t, 20, rep.Errors)
	assert.Equal(t, map[string]int{"200": 180, "422": 20}, rep.StatusCounts)
	assert.Positive(t, rep.Throughput)
	assert.LessOrEqual(t, rep.LatencyMs.Min, rep.LatencyMs.P50)
	assert.LessOrEqual(t, rep.LatencyMs.P50, rep.LatencyMs.P95)
	assert.LessOrEqual(t, rep.LatencyMs.P95, rep.LatencyMs.P99)
	assert.LessOrEqual(t, rep.LatencyMs.P99, rep.LatencyMs.Max)
	assert.False(t, rep.StoppedByCap)

	out.Reset()
	n.Store(0)
	err = run(context.Background(), []string{"-url", srv.URL, "-n", "9", "-c", "3", "-duty", dir}, &out, io.Discard)
	require.NoError(t, err)
	assert.Contains(t, out.String(), "ok / errors   9 / 0")
}

// TestDurationCap stops a run that would take far longer than its cap.
func TestDurationCap(t *testing.T) {
	srv := httptest.NewServer(http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		select {
		case <-time.After(20 * time.Millisecond):
		case <-r.Context().Done():
		}
		w.WriteHeader(http.StatusOK)
	}))
	defer srv.Close()
	duty := filepath.Join(t.TempDir(), "d.in.json")
	require.NoError(t, os.WriteFile(duty, []byte(`{}`), 0o600))
	var out bytes.Buffer
	start := time.Now()
	err := run(context.Background(), []string{"-url", srv.URL, "-n", "100000", "-c", "2", "-duration", "200ms", "-duty", duty, "-json"}, &out, io.Discard)
	require.Error(t, err)
	assert.Less(t, time.Since(start), 5*time.Second, "the cap must stop the run")
	var rep Report
	require.NoError(t, json.Unmarshal(out.Bytes(), &rep))
	assert.True(t, rep.StoppedByCap)
	assert.Less(t, rep.Completed, 100000)
	assert.Zero(t, rep.Errors, "requests cut off by the cap are not counted as errors")
	assert.True(t, strings.Contains(err.Error(), "did not run"))
}
