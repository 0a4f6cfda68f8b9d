package api_test

import (
	"encoding/json"
	"net/http"
	"net/http/httptest"
	"os"
	"strings"
	"testing"

	"github.com/gin-gonic/gin"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// demoDuty is the instrument-air duty of the invented demo scenario (the
// same numbers as testdata/stages/kestrel-instrument-air.in.json, kept here
// so that the handler tests do not move when a golden input is edited).
const demoDuty = `{
  "gas": {"model": "ideal-constant", "cp": 1006, "gamma": 1.4, "service": "air"},
  "suction": {"pressure": 98000, "temperature": 305.15},
  "pressure_ratio": 2.4,
  "flow": {"mass": 2.8},
  "speed": 24000,
  "efficiency": {"polytropic": 0.84},
  "mechanical_efficiency": 0.97,
  "impeller": {
    "blade_exit_angle": 35,
    "slip_factor": 0.88,
    "power_input_factor": 1.03,
    "construction": "open-aluminium",
    "inlet": {"type": "axial-eye", "hub_ratio": 0.35, "meridional_velocity": 140},
    "exit_meridional_velocity": 95
  },
  "diffuser": {"type": "vaned"}
}`

// problemBase prefixes the problem type URIs the service answers with.
const problemBase = "https://stagewright.invalid/problems/"

// titles are the problem titles of each problem kind (part of the API
// contract: clients may switch on type and show title).
var titles = map[string]string{
	"invalid-request":        "Request failed validation",
	"malformed-body":         "Body is not valid JSON",
	"unprocessable":          "Input outside what the model covers",
	"not-found":              "No such endpoint",
	"method-not-allowed":     "Method not allowed",
	"unauthorized":           "Authentication required",
	"body-too-large":         "Request body too large",
	"overloaded":             "Service overloaded",
	"compute-timeout":        "Computation timed out",
	"cancelled":              "Request cancelled",
	"not-ready":              "Not ready",
	"unsupported-media-type": "Unsupported media type",
	"request-timeout":        "Request body timed out",
}

func TestMain(m *testing.M) {
	gin.SetMode(gin.TestMode) // silence gin's route listing; production mode is set by cmd
	os.Exit(m.Run())
}

// newRouter is the production router over the real service, logging
// nowhere, with every exchange validated against the OpenAPI 3 document it
// serves (contract_test.go): a response off the contract fails tb.
func newRouter(tb testing.TB) http.Handler {
	tb.Helper()
	h := plainRouter(tb)
	return checked{h: h, k: servedContract(tb, h), tb: tb}
}

// do serves one request through h.
func do(h http.Handler, method, target, body string) *httptest.ResponseRecorder {
	req := httptest.NewRequest(method, target, strings.NewReader(body))
	if body != "" {
		req.Header.Set("Content-Type", "application/json")
	}
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	return w
}

// postStage posts body to POST /v1/stage/size.
func postStage(h http.Handler, body string) *httptest.ResponseRecorder {
	return do(h, http.MethodPost, "/v1/stage/size", body)
}

// edit changes a duty decoded as a generic JSON object.
type edit func(tb testing.TB, m map[string]any)

// set sets the value at a dotted path ("impeller.inlet.type"), creating
// objects on the way.
func set(path string, v any) edit {
	return func(tb testing.TB, m map[string]any) {
		parent, key := walk(tb, m, path, true)
		parent[key] = v
	}
}

// del removes the value at a dotted path.
func del(path string) edit {
	return func(tb testing.TB, m map[string]any) {
		parent, key := walk(tb, m, path, false)
		require.Contains(tb, parent, key, "del %s: no such field in the base duty", path)
		delete(parent, key)
	}
}

// rename moves the value at a dotted path to a new last key.
func rename(path, newKey string) edit {
	return func(tb testing.TB, m map[string]any) {
		parent, key := walk(tb, m, path, false)
		require.Contains(tb, parent, key, "rename %s: no such field in the base duty", path)
		parent[newKey] = parent[key]
		delete(parent, key)
	}
}

func walk(tb testing.TB, m map[string]any, path string, create bool) (map[string]any, string) {
	tb.Helper()
	parts := strings.Split(path, ".")
	for _, p := range parts[:len(parts)-1] {
		next, ok := m[p].(map[string]any)
		if !ok {
			require.True(tb, create, "%s: %s is not an object in the base duty", path, p)
			next = map[string]any{}
			m[p] = next
		}
		m = next
	}
	return m, parts[len(parts)-1]
}

// duty returns base with the edits applied, as JSON text.
func duty(tb testing.TB, base string, edits ...edit) string {
	tb.Helper()
	var m map[string]any
	require.NoError(tb, json.Unmarshal([]byte(base), &m))
	for _, e := range edits {
		e(tb, m)
	}
	b, err := json.Marshal(m)
	require.NoError(tb, err)
	return string(b)
}

// problem is an RFC 9457 problem as a client reads it.
type problem struct {
	Type      string `json:"type"`
	Title     string `json:"title"`
	Status    int    `json:"status"`
	Detail    string `json:"detail"`
	Instance  string `json:"instance"`
	RequestID string `json:"request_id"`
	Errors    []struct {
		Pointer string `json:"pointer"`
		Detail  string `json:"detail"`
	} `json:"errors"`
}

func (p problem) pointers() []string {
	var out []string
	for _, e := range p.Errors {
		out = append(out, e.Pointer)
	}
	return out
}

// details joins the problem detail and every field detail, for substring checks.
func (p problem) details() string {
	parts := []string{p.Detail}
	for _, e := range p.Errors {
		parts = append(parts, e.Detail)
	}
	return strings.Join(parts, " | ")
}

// requireProblem checks that w is an RFC 9457 problem of the given status
// and kind (RFC 9457 §3: type, title, status; §3.1.2: status equals the
// HTTP status; Content-Type application/problem+json per §3) and returns it.
func requireProblem(tb testing.TB, w *httptest.ResponseRecorder, status int, kind string) problem {
	tb.Helper()
	require.Equal(tb, status, w.Code, "body: %s", w.Body.String())
	assert.Equal(tb, "application/problem+json", w.Header().Get("Content-Type"))
	var p problem
	require.NoError(tb, json.Unmarshal(w.Body.Bytes(), &p), "body: %s", w.Body.String())
	assert.Equal(tb, problemBase+kind, p.Type)
	assert.Equal(tb, titles[kind], p.Title)
	assert.Equal(tb, status, p.Status, "problem status must equal the HTTP status (RFC 9457 §3.1.2)")
	assert.NotEmpty(tb, p.Instance)
	for _, e := range p.Errors {
		assert.NotEmpty(tb, e.Detail, "pointer %s has no detail", e.Pointer)
	}
	return p
}

// newRouterWith builds the router over a given Swagger 2.0 document.
func newRouterWith(spec []byte) (http.Handler, error) {
	return buildRouter(spec)
}
