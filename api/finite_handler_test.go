package api_test

import (
	"context"
	"encoding/json"
	"math"
	"net/http"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api"
	"stagewright/service"
)

// TestNonFiniteAnswerIs500: a service result holding NaN or ±Inf (a
// defect of the physics) reaches the handler's finite-number guard, which
// answers a 500 problem without echoing the value and logs the field's
// path; the client never sees NaN, Inf or an empty 200. Without the guard
// encoding/json would fail on the value and gin would answer an empty 200
// (and a faster encoder might write NaN): this test fails either way.
func TestNonFiniteAnswerIs500(t *testing.T) {
	real := service.New()
	tests := []struct {
		name   string
		target string
		body   string
		spoil  func(res *service.StageResult, props *service.PropertiesResult)
		field  string
	}{
		{"NaN gas power", "/v1/stage/size", demoDuty,
			func(r *service.StageResult, _ *service.PropertiesResult) { r.Power.Gas = math.NaN() }, ".Power.Gas"},
		{"+Inf in a limit's value", "/v1/stage/size", demoDuty,
			func(r *service.StageResult, _ *service.PropertiesResult) { r.Assessments[2].Value = math.Inf(1) }, ".Limits[2].Value"},
		{"+Inf standard flow (behind a pointer)", "/v1/stage/size", demoDuty,
			func(r *service.StageResult, _ *service.PropertiesResult) { r.StandardFlows.Normal = math.Inf(1) }, ".StandardVolumeFlow.Normal"},
		{"NaN batch item", "/v1/stage/size/batch", `{"duties":[` + demoDuty + `,` + demoDuty + `]}`,
			func(r *service.StageResult, _ *service.PropertiesResult) {
				r.Warnings = append(r.Warnings, service.Warning{Code: "x", Value: math.NaN()})
			}, ".Warnings"},
		{"NaN compressibility", "/v1/gas/properties", propsBody,
			func(_ *service.StageResult, p *service.PropertiesResult) { p.State.Compressibility = math.NaN() }, ".Compressibility"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			svc := fakeService{Service: real,
				size: func(ctx context.Context, d service.StageDuty) (service.StageResult, error) {
					res, err := real.SizeStage(ctx, d)
					require.NoError(t, err)
					tt.spoil(&res, nil)
					return res, nil
				},
				props: func(ctx context.Context) (service.PropertiesResult, error) {
					res, err := real.GasProperties(ctx, service.GasInput{Model: "peng-robinson", Composition: map[string]float64{"CO2": 1}}, 280, 5e5)
					require.NoError(t, err)
					tt.spoil(nil, &res)
					return res, nil
				}}
			h, logs := newRouterOpts(t, svc, api.Options{})
			w := send(h, request(http.MethodPost, tt.target, tt.body))
			body := w.Body.String()
			assert.NotContains(t, body, "NaN")
			assert.NotContains(t, body, "Inf")
			require.True(t, json.Valid(w.Body.Bytes()), "answer is JSON: %s", body)
			if strings.HasSuffix(tt.target, "/batch") {
				require.Equal(t, http.StatusOK, w.Code, "a batch answers per item")
				var out struct {
					Results []struct{ Status int }
					Failed  int
				}
				require.NoError(t, json.Unmarshal(w.Body.Bytes(), &out))
				require.Len(t, out.Results, 2)
				for _, r := range out.Results {
					assert.Equal(t, http.StatusInternalServerError, r.Status)
				}
				assert.Equal(t, 2, out.Failed)
			} else {
				require.Equal(t, http.StatusInternalServerError, w.Code, body)
				assert.Equal(t, "application/problem+json", w.Header().Get("Content-Type"))
			}
			failed := append(logs.lines(t, "request failed"), logs.lines(t, "batch item failed")...)
			require.NotEmpty(t, failed, "the fault is logged")
			assert.Contains(t, failed[0]["err"], "not finite")
			assert.Contains(t, failed[0]["err"], tt.field, "the log names the field")
		})
	}
}
