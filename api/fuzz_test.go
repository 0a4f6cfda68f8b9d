package api_test

import (
	"encoding/json"
	"math"
	"net/http"
	"os"
	"path/filepath"
	"testing"
)

// FuzzPostStage posts arbitrary bodies: the answer is never a 5xx, is
// always valid JSON, a problem+json whose status matches on every error,
// and free of non-finite numbers on success.
//
//	go test ./api -run '^$' -fuzz FuzzPostStage -fuzztime 60s
func FuzzPostStage(f *testing.F) {
	for _, dir := range []string{stagesDir, problemsDir} {
		files, err := filepath.Glob(filepath.Join(dir, "*.in.json"))
		if err != nil {
			f.Fatal(err)
		}
		for _, name := range files {
			b, err := os.ReadFile(name)
			if err != nil {
				f.Fatal(err)
			}
			f.Add(b)
		}
	}
	for _, s := range []string{demoDuty, ``, `null`, `{}`, `[]`, `"x"`, `{"speed": "1e400 rpm"}`, `{"gas": {"composition": {"CH4": 1e308}}}`} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := postStage(h, string(body))
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes())
	})
}

// FuzzStageNumbers puts arbitrary finite numbers into the demo duty's
// physical inputs, to reach the physics with values no table lists.
//
//	go test ./api -run '^$' -fuzz FuzzStageNumbers -fuzztime 60s
func FuzzStageNumbers(f *testing.F) {
	// the demo duty's own values, then edges of the allowed ranges
	f.Add(98000.0, 305.15, 2.4, 2.8, 24000.0, 0.84, 35.0, 0.88, 1.03, 0.35, 140.0, 95.0, 1006.0, 1.4)
	f.Add(1.0, 1.0, 1.0000001, 1e-9, 1.0, 1e-9, 0.0, 1e-9, 1.0, 0.0, 1e-3, 1e-3, 1.0, 1.0000001)
	f.Add(1e8, 3000.0, 100.0, 1e6, 1e6, 1.0, 75.0, 1.0, 2.0, 0.9499, 1e4, 1e4, 1e5, 5.0/3)
	h := plainRouter(f)
	f.Fuzz(func(t *testing.T, p1, t1, pr, mdot, speed, eta, beta, slip, pif, hub, cm1, cr2, cp, gamma float64) {
		for _, v := range []float64{p1, t1, pr, mdot, speed, eta, beta, slip, pif, hub, cm1, cr2, cp, gamma} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return // JSON has no NaN or Inf
			}
		}
		body := duty(t, demoDuty,
			set("suction.pressure", p1), set("suction.temperature", t1), set("pressure_ratio", pr),
			set("flow.mass", mdot), set("speed", speed), set("efficiency.polytropic", eta),
			set("impeller.blade_exit_angle", beta), set("impeller.slip_factor", slip),
			set("impeller.power_input_factor", pif), set("impeller.inlet.hub_ratio", hub),
			set("impeller.inlet.meridional_velocity", cm1), set("impeller.exit_meridional_velocity", cr2),
			set("gas.cp", cp), set("gas.gamma", gamma))
		w := postStage(h, body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes())
		if w.Code == http.StatusBadRequest {
			t.Fatalf("a duty of the right shape is never a 400: %s\nbody: %s", w.Body.String(), body)
		}
	})
}

// checkAnswer is the contract every answer of POST /v1/stage/size keeps.
func checkAnswer(t *testing.T, code int, contentType string, body []byte) {
	t.Helper()
	if code >= 500 {
		t.Fatalf("status %d: %s", code, body)
	}
	if !json.Valid(body) {
		t.Fatalf("status %d with a body that is not JSON: %q", code, body)
	}
	if code == http.StatusOK {
		if contentType != "application/json; charset=utf-8" {
			t.Fatalf("200 with Content-Type %q", contentType)
		}
		requireFiniteJSON(t, body)
		return
	}
	if contentType != "application/problem+json" {
		t.Fatalf("status %d with Content-Type %q", code, contentType)
	}
	var p problem
	if err := json.Unmarshal(body, &p); err != nil {
		t.Fatalf("problem does not decode: %v: %s", err, body)
	}
	if p.Status != code || p.Type == "" || p.Title == "" {
		t.Fatalf("status %d with problem %+v", code, p)
	}
	if code != http.StatusBadRequest && code != http.StatusUnprocessableEntity {
		t.Fatalf("unexpected status %d: %s", code, body)
	}
}
