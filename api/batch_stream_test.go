package api_test

import (
	"bufio"
	"bytes"
	"context"
	"encoding/json"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api"
	"stagewright/service"
)

// demoBatch is every demo duty, then one the physics refuses (422).
func demoBatch(t *testing.T) (body string, n int) {
	files, err := filepath.Glob(filepath.Join(stagesDir, "*.in.json"))
	require.NoError(t, err)
	var duties []string
	for _, f := range files {
		b, err := os.ReadFile(f)
		require.NoError(t, err)
		duties = append(duties, string(b))
	}
	duties = append(duties, duty(t, demoDuty, set("efficiency.polytropic", 1.2)))
	return `{"duties":[` + strings.Join(duties, ",") + `]}`, len(duties)
}

// TestBatchStreamBytes: the streamed batch answer (items encoded by the
// workers, written in order) is byte for byte what encoding/json makes of
// the whole BatchResponse, and each item is what the single endpoint
// answers for its duty.
func TestBatchStreamBytes(t *testing.T) {
	h := newRouter(t)
	body, n := demoBatch(t)
	w := do(h, http.MethodPost, "/v1/stage/size/batch", body)
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	assert.Equal(t, "application/json; charset=utf-8", w.Header().Get("Content-Type"))
	var out api.BatchResponse
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &out))
	require.Len(t, out.Results, n)
	assert.Equal(t, n-1, out.Succeeded)
	assert.Equal(t, 1, out.Failed)
	want, err := json.Marshal(out)
	require.NoError(t, err)
	require.Equal(t, string(want), w.Body.String())
}

// TestBatchNDJSON: with Accept: application/x-ndjson the batch answers one
// item per line, in request order, each line byte for byte the item of
// the JSON answer.
func TestBatchNDJSON(t *testing.T) {
	h := plainRouter(t) // the contract describes the JSON document only
	body, n := demoBatch(t)
	asJSON := do(h, http.MethodPost, "/v1/stage/size/batch", body)
	require.Equal(t, http.StatusOK, asJSON.Code)
	var doc struct{ Results []json.RawMessage }
	require.NoError(t, json.Unmarshal(asJSON.Body.Bytes(), &doc))

	for _, accept := range []string{"application/x-ndjson", "application/json;q=0.5, application/x-ndjson"} {
		w := send(h, request(http.MethodPost, "/v1/stage/size/batch", body, "Accept", accept))
		require.Equal(t, http.StatusOK, w.Code, w.Body.String())
		assert.Equal(t, "application/x-ndjson", w.Header().Get("Content-Type"))
		sc := bufio.NewScanner(bytes.NewReader(w.Body.Bytes()))
		sc.Buffer(nil, 1<<20)
		var lines []string
		for sc.Scan() {
			lines = append(lines, sc.Text())
		}
		require.Len(t, lines, n)
		for i, l := range lines {
			assert.Equal(t, string(doc.Results[i]), l, "line %d", i)
		}
		assert.True(t, strings.HasSuffix(w.Body.String(), "}\n"))
	}
}

// TestBatchDeadlineMidStream: once the answer has begun (the first duty
// sized), duties not sized by the compute deadline get a 504
// compute-timeout item each; the document stays whole and its counts
// true. Before the first item, the whole batch is a 504 (TestComputeDeadline).
func TestBatchDeadlineMidStream(t *testing.T) {
	real := service.New()
	svc := fakeService{Service: real, size: func(ctx context.Context, d service.StageDuty) (service.StageResult, error) {
		if *d.MassFlow == 2.8 { // the first duty only
			return real.SizeStage(ctx, d)
		}
		return waitDone(ctx, d)
	}}
	h, logs := newRouterOpts(t, svc, api.Options{ComputeTimeout: 30 * time.Millisecond})
	other := duty(t, demoDuty, set("flow.mass", 3.1))
	const n = 20
	body := `{"duties":[` + demoDuty + strings.Repeat(","+other, n-1) + `]}`
	w := send(h, request(http.MethodPost, "/v1/stage/size/batch", body))
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	var out api.BatchResponse
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &out))
	require.Len(t, out.Results, n)
	assert.Equal(t, http.StatusOK, out.Results[0].Status)
	for _, r := range out.Results[1:] {
		require.Equal(t, http.StatusGatewayTimeout, r.Status)
		assert.Contains(t, r.Problem.Type, "compute-timeout")
	}
	assert.Equal(t, 1, out.Succeeded)
	assert.Equal(t, n-1, out.Failed)
	assert.Empty(t, logs.lines(t, "request failed"), "a timeout is not a server fault")
}
