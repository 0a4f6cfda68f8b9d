package api_test

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"flag"
	"fmt"
	"io"
	"log/slog"
	"mime"
	"net/http"
	"net/http/httptest"
	"os"
	"strconv"
	"strings"
	"testing"

	"github.com/getkin/kin-openapi/openapi3"
	"github.com/getkin/kin-openapi/openapi3filter"
	"github.com/getkin/kin-openapi/routers"
	"github.com/getkin/kin-openapi/routers/legacy"
	"github.com/stretchr/testify/require"

	"stagewright/api"
	"stagewright/openapi"
	"stagewright/service"
)

// buildRouter is the one place the api tests construct the production
// router (when NewRouter's signature changes, change this call only).
func buildRouter(spec []byte) (http.Handler, error) {
	return api.NewRouter(service.New(), api.Options{Spec: spec, Log: slog.New(slog.DiscardHandler)})
}

// plainRouter is the production router over the real service without the
// contract check (benchmarks, and fuzz targets that check explicitly).
func plainRouter(tb testing.TB) http.Handler {
	tb.Helper()
	h, err := buildRouter(openapi.Swagger2())
	require.NoError(tb, err)
	return h
}

// problemSchema is the component name swag gives api.Problem.
const problemSchema = "api.Problem"

// contract is the OpenAPI 3 document the router serves at /openapi.json,
// loaded back and ready to validate exchanges with kin-openapi's
// openapi3filter.
type contract struct {
	doc    *openapi3.T
	router routers.Router
}

// servedContract fetches /openapi.json from h (the document exactly as
// clients see it) and prepares it for validation.
func servedContract(tb testing.TB, h http.Handler) *contract {
	tb.Helper()
	req := httptest.NewRequest(http.MethodGet, "/openapi.json", nil)
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	require.Equal(tb, http.StatusOK, w.Code, "GET /openapi.json: %s", w.Body.String())
	doc, err := openapi3.NewLoader().LoadFromData(w.Body.Bytes())
	require.NoError(tb, err)
	require.NoError(tb, doc.Validate(context.Background()))
	router, err := legacy.NewRouter(doc)
	require.NoError(tb, err)
	require.NotNil(tb, doc.Components.Schemas[problemSchema], "the document has no %s schema", problemSchema)
	return &contract{doc: doc, router: router}
}

// undescribed are the paths that serve the description itself.
var undescribed = map[string]bool{"/openapi.json": true, "/openapi/swagger.json": true}

// check validates one exchange against the document:
//   - a request to a documented operation is validated (openapi3filter.ValidateRequest);
//     the document may be looser than the server (cross-field rules, physics), but
//     never stricter: a request the document refuses must not be answered 2xx;
//   - the response must have a documented status, the documented content type
//     and a body valid against the documented schema (ValidateResponse);
//   - a request to no documented operation (404, 405) must be answered with
//     a problem+json valid against the Problem schema.
func (k *contract) check(req *http.Request, reqBody []byte, status int, header http.Header, body []byte) error {
	ctx := context.Background()
	method := req.Method
	probe := req.Clone(ctx)
	if method == http.MethodHead { // HEAD is GET without a body (RFC 9110 §9.3.2)
		probe.Method = http.MethodGet
	}
	probe.Body = io.NopCloser(bytes.NewReader(reqBody))
	if undescribed[req.URL.Path] || (strings.HasPrefix(req.URL.Path, "/docs/") && req.URL.Path != "/docs/index.html") { // the reference's files
		return nil
	}
	route, params, err := k.router.FindRoute(probe)
	if err != nil {
		if status != http.StatusNotFound && status != http.StatusMethodNotAllowed {
			return fmt.Errorf("%s %s is not in the document but was answered %d", method, req.URL.Path, status)
		}
		return k.checkProblem(status, header, body)
	}
	in := &openapi3filter.RequestValidationInput{
		Request:    probe,
		PathParams: params,
		Route:      route,
		// The bearer token is the server's own check (and only when it is
		// configured with tokens; TestGeneratedClientSendsTheToken and
		// TestBearerAuth cover it): the contract leaves it to the server.
		Options: &openapi3filter.Options{MultiError: true, AuthenticationFunc: openapi3filter.NoopAuthenticationFunc},
	}
	if reqErr := openapi3filter.ValidateRequest(ctx, in); reqErr != nil && status < 400 {
		if err := refusedDutiesFailed(route.Path, reqErr, body); err != nil {
			return fmt.Errorf("the document refuses the request, the server answered %d: %w: %w", status, err, reqErr)
		}
	}
	out := &openapi3filter.ResponseValidationInput{
		RequestValidationInput: in,
		Status:                 status,
		Header:                 header,
		Body:                   io.NopCloser(bytes.NewReader(body)),
		Options: &openapi3filter.Options{
			IncludeResponseStatus: true,
			MultiError:            true,
			// kin-openapi has no decoder for a chart; its body is checked
			// by TestMapChartCurrent (and in a browser by .ci/run).
			ExcludeResponseBody: method == http.MethodHead || header.Get("Content-Type") == "image/svg+xml",
		},
	}
	if err := openapi3filter.ValidateResponse(ctx, out); err != nil {
		return fmt.Errorf("response %d does not match the document: %w", status, err)
	}
	if status >= 400 {
		return k.checkProblem(status, header, body)
	}
	return nil
}

// refusedDutiesFailed: a batch is answered 200 with one item per duty, so
// a duty the document refuses (a value out of its documented range) must
// come back as a failed item; any other accepted refused request is an error.
func refusedDutiesFailed(path string, reqErr error, body []byte) error {
	items := map[string]string{"/v1/stage/size/batch": "duties", "/v1/stage/size/batch/compact": "duties", "/v1/machine/rate/batch": "ratings"}[path]
	if items == "" {
		return errors.New("accepted")
	}
	var out struct {
		Results []struct {
			Status int `json:"status"`
		} `json:"results"`
	}
	if err := json.Unmarshal(body, &out); err != nil {
		return err
	}
	var pointers [][]string
	collectPointers(reqErr, &pointers)
	if len(pointers) == 0 {
		return errors.New("the refusal names no duty")
	}
	for _, p := range pointers {
		if len(p) < 2 || p[0] != items {
			return fmt.Errorf("refused at /%s, outside the %s", strings.Join(p, "/"), items)
		}
		i, err := strconv.Atoi(p[1])
		if err != nil || i < 0 || i >= len(out.Results) {
			return fmt.Errorf("refused at /%s, no such result", strings.Join(p, "/"))
		}
		if out.Results[i].Status == http.StatusOK {
			return fmt.Errorf("item %d of %s is refused by the document but sized or rated", i, items)
		}
	}
	return nil
}

// collectPointers gathers the JSON pointers of every schema error in err.
func collectPointers(err error, out *[][]string) {
	var se *openapi3.SchemaError
	switch e := err.(type) {
	case openapi3.MultiError:
		for _, x := range e {
			collectPointers(x, out)
		}
	case *openapi3filter.RequestError:
		collectPointers(e.Err, out)
	default:
		if errors.As(err, &se) {
			*out = append(*out, se.JSONPointer())
		}
	}
}

// checkProblem validates an error answer against the Problem schema with
// the problem+json media type (RFC 9457 §3), whatever the route.
func (k *contract) checkProblem(status int, header http.Header, body []byte) error {
	mt, _, err := mime.ParseMediaType(header.Get("Content-Type"))
	if err != nil || mt != "application/problem+json" {
		return fmt.Errorf("status %d with Content-Type %q, want application/problem+json", status, header.Get("Content-Type"))
	}
	var v any
	if err := json.Unmarshal(body, &v); err != nil {
		return fmt.Errorf("status %d: problem body is not JSON: %w", status, err)
	}
	if err := k.doc.Components.Schemas[problemSchema].Value.VisitJSON(v, openapi3.MultiErrors()); err != nil {
		return fmt.Errorf("status %d: body does not match %s: %w", status, problemSchema, err)
	}
	if m, ok := v.(map[string]any); !ok || m["status"] != float64(status) {
		return fmt.Errorf("problem status %v differs from the HTTP status %d (RFC 9457 §3.1.2)", v, status)
	}
	return nil
}

// checked wraps the router so that every exchange of every handler test is
// validated against the served document; a mismatch fails tb.
type checked struct {
	h  http.Handler
	k  *contract
	tb testing.TB
}

func (c checked) ServeHTTP(w http.ResponseWriter, r *http.Request) {
	var reqBody []byte
	if r.Body != nil {
		var err error
		if reqBody, err = io.ReadAll(r.Body); err != nil {
			c.tb.Errorf("contract: read request body: %v", err)
		}
		r.Body = io.NopCloser(bytes.NewReader(reqBody))
	}
	rec := httptest.NewRecorder()
	c.h.ServeHTTP(rec, r)
	if err := c.k.check(r, reqBody, rec.Code, rec.Header(), rec.Body.Bytes()); err != nil {
		c.tb.Errorf("contract: %s %s (request %s): %v\nresponse: %s", r.Method, r.URL.Path, excerpt(reqBody), err, excerpt(rec.Body.Bytes()))
	}
	for key, vs := range rec.Header() {
		w.Header()[key] = vs
	}
	w.WriteHeader(rec.Code)
	_, _ = w.Write(rec.Body.Bytes())
}

func excerpt(b []byte) string {
	const n = 300
	if len(b) > n {
		return string(b[:n]) + "..."
	}
	return string(b)
}

// fakeServer answers every request with a fixed status, content type and body.
func fakeServer(status int, contentType, body string) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, _ *http.Request) {
		w.Header().Set("Content-Type", contentType)
		w.WriteHeader(status)
		_, _ = io.WriteString(w, body)
	})
}

// exchange runs one request through h and returns what check sees.
func exchange(k *contract, h http.Handler, method, target, body string) error {
	req := httptest.NewRequest(method, target, strings.NewReader(body))
	if body != "" {
		req.Header.Set("Content-Type", "application/json")
	}
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	return k.check(req, []byte(body), w.Code, w.Header(), w.Body.Bytes())
}

// TestContractCatchesWrongAnswers proves the check can fail: hand-made
// answers that break the document are refused, the real ones pass.
func TestContractCatchesWrongAnswers(t *testing.T) {
	real := plainRouter(t)
	k := servedContract(t, real)
	good := postStage(real, demoDuty)
	require.Equal(t, http.StatusOK, good.Code, good.Body.String())
	edited := func(edit func(m map[string]any)) string {
		var m map[string]any
		require.NoError(t, json.Unmarshal(good.Body.Bytes(), &m))
		edit(m)
		b, err := json.Marshal(m)
		require.NoError(t, err)
		return string(b)
	}
	const js = "application/json; charset=utf-8"
	const pj = "application/problem+json"
	validProblem := `{"type":"https://stagewright.invalid/problems/invalid-request","title":"Request failed validation","status":400,"instance":"/v1/stage/size"}`

	// the real answer and a real problem pass
	require.NoError(t, exchange(k, real, http.MethodPost, "/v1/stage/size", demoDuty))
	require.NoError(t, exchange(k, real, http.MethodPost, "/v1/stage/size", `{}`))
	require.NoError(t, exchange(k, fakeServer(200, js, good.Body.String()), http.MethodPost, "/v1/stage/size", demoDuty))
	require.NoError(t, exchange(k, fakeServer(400, pj, validProblem), http.MethodPost, "/v1/stage/size", `{}`))

	wrong := []struct {
		name, method, target, reqBody string
		srv                           http.Handler
		want                          string // a substring of the error
	}{
		{"required field missing", http.MethodPost, "/v1/stage/size", demoDuty,
			fakeServer(200, js, edited(func(m map[string]any) { delete(m["geometry"].(map[string]any), "tip_diameter") })), "tip_diameter"},
		{"top-level required field missing", http.MethodPost, "/v1/stage/size", demoDuty,
			fakeServer(200, js, edited(func(m map[string]any) { delete(m, "verdict") })), "verdict"},
		{"value outside its enum", http.MethodPost, "/v1/stage/size", demoDuty,
			fakeServer(200, js, edited(func(m map[string]any) { m["verdict"] = "fine" })), "verdict"},
		{"number as text", http.MethodPost, "/v1/stage/size", demoDuty,
			fakeServer(200, js, edited(func(m map[string]any) { m["speed"] = "fast" })), "speed"},
		{"object where a number is", http.MethodPost, "/v1/stage/size", demoDuty,
			fakeServer(200, js, edited(func(m map[string]any) { m["power"].(map[string]any)["shaft"] = map[string]any{} })), "shaft"},
		{"not JSON", http.MethodPost, "/v1/stage/size", demoDuty, fakeServer(200, js, `{"tip_diameter":`), "response"},
		{"undocumented status", http.MethodPost, "/v1/stage/size", demoDuty, fakeServer(http.StatusTeapot, pj, validProblem), "418"},
		{"problem as plain JSON", http.MethodPost, "/v1/stage/size", `{}`, fakeServer(400, js, validProblem), "Content-Type"},
		{"problem without title", http.MethodPost, "/v1/stage/size", `{}`,
			fakeServer(400, pj, `{"type":"about:blank","status":400}`), "title"},
		{"problem status differs from the HTTP status", http.MethodPost, "/v1/stage/size", `{}`,
			fakeServer(422, pj, validProblem), "RFC 9457"},
		{"field error without pointer", http.MethodPost, "/v1/stage/size", `{}`,
			fakeServer(400, pj, `{"type":"about:blank","title":"x","status":400,"errors":[{"detail":"d"}]}`), "pointer"},
		{"404 problem of the wrong shape", http.MethodGet, "/nowhere", "",
			fakeServer(404, pj, `{"title":"x","status":"404"}`), "status"},
		{"an unknown route answered 200", http.MethodGet, "/nowhere", "", fakeServer(200, js, `{}`), "not in the document"},
		{"a request the document refuses answered 200", http.MethodPost, "/v1/stage/size", `{"speed":"x"}`,
			fakeServer(200, js, good.Body.String()), "refuses the request"},
		{"a duty the document refuses sized in a batch", http.MethodPost, "/v1/stage/size/batch",
			`{"duties":[` + duty(t, demoDuty, set("efficiency.polytropic", 1.2)) + `]}`,
			fakeServer(200, js, `{"results":[{"index":0,"status":200,"result":`+good.Body.String()+`}],"succeeded":1,"failed":0}`), "sized"},
		{"components without the catalogue", http.MethodGet, "/v1/gas/components", "", fakeServer(200, js, `{"components":"none"}`), "components"},
	}
	for _, tc := range wrong {
		t.Run(tc.name, func(t *testing.T) {
			err := exchange(k, tc.srv, tc.method, tc.target, tc.reqBody)
			require.Error(t, err)
			require.Contains(t, err.Error(), tc.want)
		})
	}
}

// writeOpenAPI3 rewrites openapi/openapi3.json from the served document.
var writeOpenAPI3 = flag.Bool("write-openapi3", false, "rewrite openapi/openapi3.json from the served OpenAPI 3 document")

// openAPI3File is the committed copy of the served OpenAPI 3 document, the
// input of the generated client (openapi/client).
const openAPI3File = "../openapi/openapi3.json"

// TestOpenAPI3FileCurrent: the committed openapi/openapi3.json is exactly
// what GET /openapi.json serves. Regenerate with
//
//	go test ./api -run TestOpenAPI3FileCurrent -write-openapi3
func TestOpenAPI3FileCurrent(t *testing.T) {
	w := do(plainRouter(t), http.MethodGet, "/openapi.json", "")
	require.Equal(t, http.StatusOK, w.Code)
	served := append(w.Body.Bytes(), '\n')
	if *writeOpenAPI3 {
		require.NoError(t, os.WriteFile(openAPI3File, served, 0o644))
	}
	committed, err := os.ReadFile(openAPI3File)
	require.NoError(t, err)
	if !bytes.Equal(served, committed) {
		t.Fatal("openapi/openapi3.json differs from the served document; regenerate: " +
			"go test ./api -run TestOpenAPI3FileCurrent -write-openapi3 && go generate ./openapi/client")
	}
}

// TestContractSeesEveryRoute: the wrapper used by newRouter validates the
// operations of the document, so a route added without annotations fails.
func TestContractSeesEveryRoute(t *testing.T) {
	k := servedContract(t, plainRouter(t))
	var ops []string
	for path, item := range k.doc.Paths.Map() {
		for method := range item.Operations() {
			ops = append(ops, method+" "+path)
		}
	}
	require.ElementsMatch(t, []string{
		"GET /healthz", "GET /readyz", "GET /version", "GET /metrics", "POST /v1/stage/size", "POST /v1/stage/size/batch",
		"POST /v1/stage/size/compact", "POST /v1/stage/size/batch/compact", "POST /v1/gas/properties", "GET /v1/gas/components", "GET /docs/index.html",
		"POST /v1/machine/rate", "POST /v1/machine/rate/batch", "POST /v1/machine/map",
		"POST /v1/section/size",
		"POST /v1/machine/check", "POST /v1/machine/check/batch",
	}, ops)
	err := exchange(k, fakeServer(200, "text/plain", "ok"), http.MethodGet, "/healthz", "")
	require.ErrorContains(t, err, "response 200")
}
