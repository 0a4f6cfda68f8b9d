package api_test

import (
	"encoding/json"
	"net/http"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/openapi"
	"stagewright/service"
)

// TestStageProblems posts one faulty duty per error class and checks the
// status, problem type and title, and the JSON pointer (RFC 6901) of every
// offending field. 400 is a body of the wrong shape; 422 a well-formed duty
// that is physically impossible or outside what the model covers.
func TestStageProblems(t *testing.T) {
	h := newRouter(t)
	tests := []struct {
		name     string
		body     string
		status   int
		kind     string
		pointers []string // exactly these pointers, any order; nil: no field errors
		prefix   string   // instead of pointers: every pointer starts with prefix (at least one)
		detail   string   // a substring of the problem or field details
	}{
		// The body is not JSON.
		{name: "malformed JSON", body: `{"gas": {"model": "ideal-constant",`, status: 400, kind: "malformed-body", detail: "unexpected EOF"},
		{name: "not JSON at all", body: `size me a stage`, status: 400, kind: "malformed-body", detail: "invalid character"},
		{name: "empty body", body: ``, status: 400, kind: "malformed-body", detail: "empty"},
		{name: "blank body", body: " \n\t ", status: 400, kind: "malformed-body", detail: "empty"},
		{name: "trailing data", body: demoDuty + ` {"speed": 1}`, status: 400, kind: "malformed-body", detail: "after the JSON object"},
		{name: "trailing garbage", body: demoDuty + `x`, status: 400, kind: "malformed-body", detail: "after the JSON object"},
		{name: "number overflowing float64 in a quantity", body: strings.Replace(demoDuty, `"speed": 24000`, `"speed": 1e999`, 1), status: 400, kind: "invalid-request", pointers: []string{"/speed"}, detail: "1e999"},

		// The body is JSON of the wrong shape.
		{name: "array body", body: `[]`, status: 400, kind: "invalid-request", pointers: []string{""}, detail: "must be a JSON object"},
		{name: "unknown field typo", body: duty(t, demoDuty, rename("suction.pressure", "presure")),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/presure"}, detail: `did you mean "pressure"?`},
		{name: "unknown top-level field", body: duty(t, demoDuty, set("pressure_ration", 2.4)),
			status: 400, kind: "invalid-request", pointers: []string{"/pressure_ration"}, detail: `did you mean "pressure_ratio"?`},
		{name: "unknown nested object", body: duty(t, demoDuty, set("gas.extra", map[string]any{"a": 1})),
			status: 400, kind: "invalid-request", pointers: []string{"/gas/extra"}, detail: `unknown field "extra"`},
		{name: "two unknown fields", body: duty(t, demoDuty, rename("suction.pressure", "presure"), rename("impeller.slip_factor", "slip")),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/presure", "/impeller/slip"}, detail: "unknown field"},
		// RFC 6901 §3: "~" is written "~0" and "/" is written "~1" in a pointer.
		{name: "unknown key with a slash", body: duty(t, demoDuty, set("suction.a/b", 1)),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/a~1b"}, detail: `unknown field "a/b"`},
		{name: "unknown key with a tilde", body: duty(t, demoDuty, set("m~n", 1)),
			status: 400, kind: "invalid-request", pointers: []string{"/m~0n"}, detail: `unknown field "m~n"`},
		// encoding/json matches keys case-insensitively; the API must not.
		{name: "miscased nested field", body: duty(t, demoDuty, rename("suction.pressure", "Pressure")),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/Pressure"}, detail: `did you mean "pressure"?`},
		{name: "miscased top-level field", body: duty(t, demoDuty, rename("speed", "Speed")),
			status: 400, kind: "invalid-request", pointers: []string{"/Speed"}, detail: `did you mean "speed"?`},
		{name: "string where a number is required", body: duty(t, demoDuty, set("pressure_ratio", "abc")),
			status: 400, kind: "invalid-request", pointers: []string{"/pressure_ratio"}, detail: "must be a JSON number"},
		{name: "nested string where a number is required", body: duty(t, demoDuty, set("gas.cp", "abc")),
			status: 400, kind: "invalid-request", pointers: []string{"/gas/cp"}, detail: "must be a JSON number"},
		{name: "boolean for a quantity", body: duty(t, demoDuty, set("speed", true)),
			status: 400, kind: "invalid-request", pointers: []string{"/speed"}, detail: "a string with a unit"},
		{name: "object for a quantity", body: duty(t, demoDuty, set("suction.temperature", map[string]any{"value": 300})),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/temperature"}, detail: "a string with a unit"},
		{name: "bad unit string", body: duty(t, demoDuty, set("suction.pressure", "14.7 psai")),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/pressure"}, detail: `"psai"`},
		{name: "unit of the wrong dimension", body: duty(t, demoDuty, set("suction.temperature", "3 bar")),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/temperature"}, detail: "pressure unit"},
		{name: "unit string without a number", body: duty(t, demoDuty, set("speed", "NaN rpm")),
			status: 400, kind: "invalid-request", pointers: []string{"/speed"}, detail: "does not start with a number"},
		{name: "unit string overflowing", body: duty(t, demoDuty, set("speed", "1e400 rpm")),
			status: 400, kind: "invalid-request", pointers: []string{"/speed"}, detail: "out of range"},
		{name: "temperature below absolute zero", body: duty(t, demoDuty, set("suction.temperature", "-300 degC")),
			status: 400, kind: "invalid-request", pointers: []string{"/suction/temperature"}, detail: "below absolute zero"},
		{name: "missing flow", body: duty(t, demoDuty, del("flow")),
			status: 400, kind: "invalid-request", pointers: []string{"/flow"}, detail: "required"},
		{name: "speed and tip diameter", body: duty(t, demoDuty, set("tip_diameter", "300 mm")),
			status: 400, kind: "invalid-request", pointers: []string{"/speed"}, detail: "at most one of speed, tip_diameter and speed_target"},
		{name: "two speed targets", body: duty(t, demoDuty, del("speed"), set("speed_target", map[string]any{"specific_speed": 0.7, "flow_coefficient": 0.08})),
			status: 400, kind: "invalid-request", pointers: []string{"/speed_target"}, detail: "exactly one"},
		{name: "speed step with a given speed", body: duty(t, demoDuty, set("speed_step", 50)),
			status: 400, kind: "invalid-request", pointers: []string{"/speed_step"}, detail: "chosen speed"},
		{name: "tip diameter of the wrong dimension", body: duty(t, demoDuty, del("speed"), set("tip_diameter", "300 kPa")),
			status: 400, kind: "invalid-request", pointers: []string{"/tip_diameter"}, detail: "but this is a length"},
		{name: "override of an unknown rule", body: duty(t, demoDuty, set("limit_overrides", map[string]any{"tip-sped": map[string]any{"warning": 300}})),
			status: 400, kind: "invalid-request", pointers: []string{"/limit_overrides/tip-sped"}, detail: "tip-speed"},
		{name: "override without its warning level", body: duty(t, demoDuty, set("limit_overrides", map[string]any{"tip-speed": map[string]any{"limit": 300}})),
			status: 400, kind: "invalid-request", pointers: []string{"/limit_overrides/tip-speed/warning"}, detail: "required"},
		{name: "eye tip diameter on a radial inlet", body: duty(t, demoDuty, set("impeller.inlet.type", "radial"), del("impeller.inlet.hub_ratio"),
			set("impeller.inlet.diameter_ratio", 0.5), set("impeller.inlet.eye_tip_diameter", 0.2)),
			status: 400, kind: "invalid-request", pointers: []string{"/impeller/inlet/eye_tip_diameter"}},
		{name: "driver margin and rating", body: duty(t, demoDuty, set("driver", map[string]any{"margin": 1.1, "rating": "400 kW"})),
			status: 400, kind: "invalid-request", pointers: []string{"/driver/rating"}, detail: "not both"},
		{name: "null body", body: `null`, status: 400, kind: "invalid-request", prefix: "/", detail: "required"},
		{name: "empty object", body: `{}`, status: 400, kind: "invalid-request", prefix: "/", detail: "required"},
		{name: "both discharge pressure and pressure ratio", body: duty(t, demoDuty, set("discharge_pressure", 235200)),
			status: 400, kind: "invalid-request", pointers: []string{"/discharge_pressure", "/pressure_ratio"}, detail: "only one"},
		{name: "neither discharge pressure nor pressure ratio", body: duty(t, demoDuty, del("pressure_ratio")),
			status: 400, kind: "invalid-request", pointers: []string{"/discharge_pressure", "/pressure_ratio"}, detail: "give"},
		{name: "both efficiencies", body: duty(t, demoDuty, set("efficiency.isentropic", 0.8)),
			status: 400, kind: "invalid-request", pointers: []string{"/efficiency/isentropic", "/efficiency/polytropic"}, detail: "only one"},
		{name: "flow with both mass and actual volume", body: duty(t, demoDuty, set("flow.actual_volume", 2.5)),
			status: 400, kind: "invalid-request", prefix: "/flow", detail: "one of"},
		{name: "radial inlet without diameter ratio", body: duty(t, demoDuty, set("impeller.inlet.type", "radial"), del("impeller.inlet.hub_ratio")),
			status: 400, kind: "invalid-request", pointers: []string{"/impeller/inlet/diameter_ratio"}},
		{name: "radial inlet with a hub ratio", body: duty(t, demoDuty, set("impeller.inlet.type", "radial"), set("impeller.inlet.diameter_ratio", 0.5)),
			status: 400, kind: "invalid-request", pointers: []string{"/impeller/inlet/hub_ratio"}},
		{name: "unknown gas model", body: duty(t, demoDuty, set("gas.model", "ideal-variable")),
			status: 400, kind: "invalid-request", pointers: []string{"/gas/model"}, detail: "ideal-constant"},
		{name: "unknown inlet type", body: duty(t, demoDuty, set("impeller.inlet.type", "sideways"), del("impeller.inlet.hub_ratio")),
			status: 400, kind: "invalid-request", pointers: []string{"/impeller/inlet/type"}, detail: "axial-eye"},
		{name: "unknown construction", body: duty(t, demoDuty, set("impeller.construction", "closed-titanium")),
			status: 400, kind: "invalid-request", pointers: []string{"/impeller/construction"}, detail: "open-titanium"},
		{name: "unknown diffuser", body: duty(t, demoDuty, set("diffuser.type", "vaneles")),
			status: 400, kind: "invalid-request", pointers: []string{"/diffuser/type"}, detail: "vaneless"},
		{name: "unknown polytropic method", body: duty(t, demoDuty, set("options.polytropic_method", "exact")),
			status: 400, kind: "invalid-request", pointers: []string{"/options/polytropic_method"}, detail: "schultz"},
		{name: "ideal-constant without cp", body: duty(t, demoDuty, del("gas.cp")),
			status: 400, kind: "invalid-request", pointers: []string{"/gas/cp"}, detail: "cp"},
		{name: "unknown component", body: duty(t, demoDuty, set("gas", map[string]any{"model": "ideal", "composition": map[string]any{"unobtainium": 1}})),
			status: 400, kind: "invalid-request", prefix: "/gas/composition", detail: "unobtainium"},

		// Well-formed but physically impossible: 422 with the reason.
		{name: "discharge below suction", body: duty(t, demoDuty, del("pressure_ratio"), set("discharge_pressure", 90000)),
			status: 422, kind: "unprocessable", pointers: []string{"/discharge_pressure"}, detail: "must exceed suction pressure"},
		// 0.5 barg = 151 325 Pa absolute with the standard atmosphere (ISO 2533: 101 325 Pa), below 2 bara.
		{name: "discharge below suction in units", body: duty(t, demoDuty, del("pressure_ratio"), set("suction.pressure", "2 bara"), set("discharge_pressure", "0.5 barg")),
			status: 422, kind: "unprocessable", pointers: []string{"/discharge_pressure"}, detail: "must exceed suction pressure"},
		{name: "pressure ratio below 1", body: duty(t, demoDuty, set("pressure_ratio", 0.9)),
			status: 422, kind: "unprocessable", pointers: []string{"/pressure_ratio"}, detail: "above 1"},
		{name: "suction pressure not positive", body: duty(t, demoDuty, set("suction.pressure", -5)),
			status: 422, kind: "unprocessable", pointers: []string{"/suction/pressure"}, detail: "above 0 Pa"},
		{name: "efficiency 0", body: duty(t, demoDuty, set("efficiency.polytropic", 0)),
			status: 422, kind: "unprocessable", pointers: []string{"/efficiency/polytropic"}, detail: "[0.3, 1]"},
		{name: "efficiency 1.2", body: duty(t, demoDuty, set("efficiency.polytropic", 1.2)),
			status: 422, kind: "unprocessable", pointers: []string{"/efficiency/polytropic"}, detail: "[0.3, 1]"},
		{name: "isentropic efficiency 1.2", body: duty(t, demoDuty, del("efficiency.polytropic"), set("efficiency.isentropic", 1.2)),
			status: 422, kind: "unprocessable", pointers: []string{"/efficiency/isentropic"}, detail: "[0.3, 1]"},
		{name: "slip factor 0", body: duty(t, demoDuty, set("impeller.slip_factor", 0)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/slip_factor"}, detail: "slip factor"},
		{name: "slip factor 1.5", body: duty(t, demoDuty, set("impeller.slip_factor", 1.5)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/slip_factor"}, detail: "slip factor"},
		{name: "mechanical efficiency 1.5", body: duty(t, demoDuty, set("mechanical_efficiency", 1.5)),
			status: 422, kind: "unprocessable", pointers: []string{"/mechanical_efficiency"}, detail: "[0.8, 1]"},
		// issue 13 item 6: absurd mechanical losses or efficiency (were a 200 with no warning)
		{name: "mechanical efficiency 1e-9", body: duty(t, demoDuty, set("mechanical_efficiency", 1e-9)),
			status: 422, kind: "unprocessable", pointers: []string{"/mechanical_efficiency"}, detail: "out of range"},
		{name: "mechanical losses 1e12 W", body: duty(t, demoDuty, del("mechanical_efficiency"), set("mechanical_losses", 1e12)),
			status: 422, kind: "unprocessable", pointers: []string{"/mechanical_losses"}, detail: "out of range"},
		// issue 13 item 7: gamma 1 is outside the schema (exclusive minimum), 1.6667 (5/3 to four decimals) is accepted
		{name: "gamma 1", body: duty(t, demoDuty, set("gas.gamma", 1)),
			status: 422, kind: "unprocessable", pointers: []string{"/gas/gamma"}, detail: "gamma"},
		{name: "override in the wrong order", body: duty(t, demoDuty, set("limit_overrides", map[string]any{"tip-speed": map[string]any{"warning": 400, "limit": 350}})),
			status: 422, kind: "unprocessable", pointers: []string{"/limit_overrides/tip-speed"}, detail: "must not be below the warning level"},
		{name: "tip diameter too small for the head", body: duty(t, demoDuty, del("speed"), set("tip_diameter", "40 mm")),
			status: 422, kind: "unprocessable", pointers: []string{"/tip_diameter"}},
		{name: "prewhirl of 80 deg", body: duty(t, demoDuty, set("impeller.inlet.prewhirl_angle", 80)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/inlet/prewhirl_angle"}, detail: "between -30 and 60"},
		{name: "exit blockage 0.7", body: duty(t, demoDuty, set("impeller.exit_blockage", 0.7)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/exit_blockage"}, detail: "below 0.5"},
		{name: "power input factor below 1", body: duty(t, demoDuty, set("impeller.power_input_factor", 0.9)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/power_input_factor"}, detail: "at least 1"},
		{name: "blade exit angle 80 deg", body: duty(t, demoDuty, set("impeller.blade_exit_angle", 80)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/blade_exit_angle"}, detail: "75"},
		{name: "negative mass flow", body: duty(t, demoDuty, set("flow.mass", -1)),
			status: 422, kind: "unprocessable", pointers: []string{"/flow/mass"}, detail: "positive"},
		// 383 m/s of tip speed at 200 rev/min needs D2 = 60·U2/(π·N) ≈ 36.5 m (definition of tip speed).
		{name: "speed too low for any stage of at most 4 m", body: duty(t, demoDuty, set("speed", 200)),
			status: 422, kind: "unprocessable", pointers: []string{"/speed"}, detail: "too low"},
		{name: "speed too low in units", body: duty(t, demoDuty, set("speed", "200 rpm")),
			status: 422, kind: "unprocessable", pointers: []string{"/speed"}, detail: "too low"},
		// At 200 000 rev/min D2 ≈ 0.037 m, smaller than the 0.17 m eye the flow needs at 140 m/s.
		{name: "speed so high the eye exceeds the tip", body: duty(t, demoDuty, set("speed", 200000)),
			status: 422, kind: "unprocessable", pointers: []string{"/speed"}, detail: "too high"},
		{name: "speed zero", body: duty(t, demoDuty, set("speed", 0)),
			status: 422, kind: "unprocessable", pointers: []string{"/speed"}, detail: "positive"},
		// T1 = T01 − c²/(2 cp) = 305.15 − 900²/2012 < 0 K (definition of total temperature).
		{name: "inlet velocity so high the static temperature falls below zero", body: duty(t, demoDuty, set("impeller.inlet.meridional_velocity", 900)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/inlet/meridional_velocity"}, detail: "static temperature"},
		{name: "exit velocity so high the exit static temperature leaves the model", body: duty(t, demoDuty, set("impeller.exit_meridional_velocity", 2000)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/exit_meridional_velocity"}, detail: "static temperature"},
		// 1 < γ ≤ 5/3 for any ideal gas (monatomic limit; kinetic theory).
		{name: "gamma 2", body: duty(t, demoDuty, set("gas.gamma", 2.0)),
			status: 422, kind: "unprocessable", pointers: []string{"/gas/gamma"}, detail: "gamma"},
		{name: "gamma 1", body: duty(t, demoDuty, set("gas.gamma", 1.0)),
			status: 422, kind: "unprocessable", pointers: []string{"/gas/gamma"}, detail: "gamma"},
		{name: "cp negative", body: duty(t, demoDuty, set("gas.cp", -5)),
			status: 422, kind: "unprocessable", pointers: []string{"/gas/cp"}, detail: "cp"},
		{name: "hub ratio 0.97", body: duty(t, demoDuty, set("impeller.inlet.hub_ratio", 0.97)),
			status: 422, kind: "unprocessable", pointers: []string{"/impeller/inlet/hub_ratio"}, detail: "0.95"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			w := postStage(h, tc.body)
			p := requireProblem(t, w, tc.status, tc.kind)
			assert.Equal(t, "/v1/stage/size", p.Instance)
			switch {
			case tc.prefix != "":
				require.NotEmpty(t, p.Errors)
				for _, ptr := range p.pointers() {
					assert.True(t, strings.HasPrefix(ptr, tc.prefix), "pointer %q outside %s", ptr, tc.prefix)
				}
			case tc.pointers == nil:
				assert.Empty(t, p.Errors)
			default:
				assert.ElementsMatch(t, tc.pointers, p.pointers(), "details: %s", p.details())
			}
			if tc.detail != "" {
				assert.Contains(t, p.details(), tc.detail)
			}
			assert.NotEmpty(t, p.Detail)
		})
	}
}

// TestStageBodyTooLarge: a body above the 1 MiB bound is refused with
// 413 Content Too Large (RFC 9110 §15.5.14).
func TestStageBodyTooLarge(t *testing.T) {
	h := newRouter(t)
	w := postStage(h, `{"gas": "`+strings.Repeat("a", 2<<20)+`"}`)
	require.Equal(t, http.StatusRequestEntityTooLarge, w.Code)
	assert.Equal(t, "application/problem+json", w.Header().Get("Content-Type"))
	var p problem
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &p))
	assert.Equal(t, w.Code, p.Status)
	assert.Contains(t, p.Detail, "1048576 bytes")
}

func TestRoutingProblems(t *testing.T) {
	h := newRouter(t)
	tests := []struct {
		name, method, target string
		status               int
		kind, allow          string
	}{
		{"unknown path", http.MethodGet, "/v1/nope", 404, "not-found", ""},
		{"unknown version", http.MethodPost, "/v2/stage/size", 404, "not-found", ""},
		{"root", http.MethodGet, "/", 404, "not-found", ""},
		// RFC 9110 §15.5.6: a 405 carries Allow with the methods served.
		{"GET on the sizing endpoint", http.MethodGet, "/v1/stage/size", 405, "method-not-allowed", "POST"},
		{"PUT on the sizing endpoint", http.MethodPut, "/v1/stage/size", 405, "method-not-allowed", "POST"},
		{"DELETE on healthz", http.MethodDelete, "/healthz", 405, "method-not-allowed", "GET, HEAD"},
		{"POST on the OpenAPI document", http.MethodPost, "/openapi.json", 405, "method-not-allowed", "GET"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			w := do(h, tc.method, tc.target, "")
			p := requireProblem(t, w, tc.status, tc.kind)
			assert.Equal(t, tc.target, p.Instance)
			if tc.allow != "" {
				assert.Equal(t, tc.allow, w.Header().Get("Allow"))
				assert.Contains(t, p.Detail, tc.method)
			}
		})
	}
}

func TestHealthz(t *testing.T) {
	w := do(newRouter(t), http.MethodGet, "/healthz", "")
	require.Equal(t, http.StatusOK, w.Code)
	assert.Contains(t, w.Header().Get("Content-Type"), "application/json")
	assert.JSONEq(t, `{"status": "ok", "model_version": "`+service.ModelVersion+`"}`, w.Body.String())
}

func TestServedDocuments(t *testing.T) {
	h := newRouter(t)

	w := do(h, http.MethodGet, "/openapi/swagger.json", "")
	require.Equal(t, http.StatusOK, w.Code)
	assert.Contains(t, w.Header().Get("Content-Type"), "application/json")
	assert.JSONEq(t, string(openapi.Swagger2()), w.Body.String(), "the Swagger 2.0 document is served as generated")

	w = do(h, http.MethodGet, "/openapi.json", "")
	require.Equal(t, http.StatusOK, w.Code)
	assert.Contains(t, w.Header().Get("Content-Type"), "application/json")
	var doc struct {
		OpenAPI string         `json:"openapi"`
		Paths   map[string]any `json:"paths"`
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &doc))
	assert.True(t, strings.HasPrefix(doc.OpenAPI, "3.0"), "openapi version %q", doc.OpenAPI)
	assert.Contains(t, doc.Paths, "/v1/stage/size")
	assert.Contains(t, doc.Paths, "/healthz")
}

// TestNewRouterRejectsBadSpec: the router refuses to start on a document
// that is not Swagger 2.0 JSON rather than serve a broken description.
func TestNewRouterRejectsBadSpec(t *testing.T) {
	for _, spec := range []string{``, `not json`, `[]`} {
		_, err := newRouterWith([]byte(spec))
		assert.Error(t, err, "spec %q", spec)
	}
}
