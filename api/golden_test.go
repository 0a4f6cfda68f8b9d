package api_test

import (
	"bytes"
	"encoding/json"
	"flag"
	"math"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// update rewrites the golden files from the current service:
//
//	go test ./api -run Golden -update
//
// then read the diff (git diff testdata/) before committing it.
var update = flag.Bool("update", false, "rewrite testdata/stages/*.golden.json and testdata/problems/*.golden.json")

const (
	stagesDir   = "../testdata/stages"
	problemsDir = "../testdata/problems"
)

// goldenTolerance is the relative difference, and goldenFloor the absolute
// one (for differences of nearly equal numbers such as
// polytropic_methods.difference), up to which two numbers of a response
// count as equal. Iterative solvers and fused multiply-adds (arm64, ppc64,
// s390x) move the last digits; any change of the physics or of a default
// moves them far more.
const (
	goldenTolerance = 1e-9
	goldenFloor     = 1e-12
)

// TestGoldenStages posts every testdata/stages/NAME.in.json and compares
// the 200 answer with NAME.golden.json.
func TestGoldenStages(t *testing.T) {
	runGoldens(t, stagesDir, func(t *testing.T, code int, _ []byte) {
		require.Equal(t, http.StatusOK, code, "a demo duty must size")
	})
}

// TestGoldenProblems posts every testdata/problems/NAME.in.json (faulty
// duties) and compares the problem answer with NAME.golden.json; the
// golden's "status" is the expected HTTP status.
func TestGoldenProblems(t *testing.T) {
	runGoldens(t, problemsDir, func(t *testing.T, code int, body []byte) {
		require.GreaterOrEqual(t, code, 400)
		require.Less(t, code, 500, "a faulty duty is a client error")
	})
}

func runGoldens(t *testing.T, dir string, check func(t *testing.T, code int, body []byte)) {
	runGoldensAt(t, dir, "/v1/stage/size", check)
}

// runGoldensAt is runGoldens for the route target.
func runGoldensAt(t *testing.T, dir, target string, check func(t *testing.T, code int, body []byte)) {
	inputs, err := filepath.Glob(filepath.Join(dir, "*.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, inputs, "no golden inputs in %s", dir)
	h := newRouter(t)
	for _, in := range inputs {
		name := strings.TrimSuffix(filepath.Base(in), ".in.json")
		t.Run(name, func(t *testing.T) {
			body, err := os.ReadFile(in)
			require.NoError(t, err)
			w := do(h, http.MethodPost, target, string(body))
			check(t, w.Code, w.Body.Bytes())
			got := withoutRequestID(t, w)
			goldenPath := filepath.Join(dir, name+".golden.json")
			if *update {
				var pretty bytes.Buffer
				require.NoError(t, json.Indent(&pretty, got, "", "  "))
				pretty.WriteByte('\n')
				require.NoError(t, os.WriteFile(goldenPath, pretty.Bytes(), 0o644))
			}
			golden, err := os.ReadFile(goldenPath)
			require.NoError(t, err, "no golden file: run go test ./api -run Golden -update")
			if w.Code != http.StatusOK {
				var want struct{ Status int }
				require.NoError(t, json.Unmarshal(golden, &want))
				assert.Equal(t, want.Status, w.Code, "golden status")
			}
			assertJSONClose(t, golden, got)
		})
	}
}

// withoutRequestID returns the body of w without the request_id of a
// problem (a fresh random id per request, so not part of a golden), after
// checking that it is the one in the X-Request-ID header.
func withoutRequestID(t *testing.T, w *httptest.ResponseRecorder) []byte {
	t.Helper()
	if w.Code == http.StatusOK {
		return w.Body.Bytes()
	}
	var m map[string]any
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &m), "answer is not JSON: %s", w.Body.String())
	assert.Equal(t, w.Header().Get("X-Request-ID"), m["request_id"], "the problem quotes the request id of the response header")
	delete(m, "request_id")
	out, err := json.Marshal(m)
	require.NoError(t, err)
	return out
}

// assertJSONClose compares want and got with assert.JSONEq after numbers
// of got within goldenTolerance of want's have been replaced by want's, so
// that the diff it prints shows only real differences.
func assertJSONClose(t *testing.T, want, got []byte) {
	t.Helper()
	var w, g any
	require.NoError(t, json.Unmarshal(want, &w), "golden is not JSON")
	require.NoError(t, json.Unmarshal(got, &g), "answer is not JSON: %s", got)
	aligned, err := json.Marshal(align(w, g))
	require.NoError(t, err)
	assert.JSONEq(t, string(want), string(aligned))
}

func align(want, got any) any {
	switch g := got.(type) {
	case float64:
		if w, ok := want.(float64); ok && close(w, g) {
			return w
		}
	case map[string]any:
		if w, ok := want.(map[string]any); ok {
			out := make(map[string]any, len(g))
			for k, v := range g {
				out[k] = align(w[k], v)
			}
			return out
		}
	case []any:
		if w, ok := want.([]any); ok && len(w) == len(g) {
			out := make([]any, len(g))
			for i := range g {
				out[i] = align(w[i], g[i])
			}
			return out
		}
	}
	return got
}

func close(a, b float64) bool {
	return math.Abs(a-b) <= goldenTolerance*math.Max(math.Abs(a), math.Abs(b))+goldenFloor
}
