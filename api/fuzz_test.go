package api_test

import (
	"bytes"
	"encoding/json"
	"math"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"slices"
	"testing"
)

// FuzzPostStage posts arbitrary bodies: the answer is never a 5xx, is
// always valid JSON, a problem+json whose status matches on every error,
// and free of non-finite numbers on success.
//
//	go test ./api -run '^$' -fuzz FuzzPostStage -fuzztime 60s
func FuzzPostStage(f *testing.F) {
	for _, b := range seedDuties(f) {
		f.Add(b)
	}
	for _, s := range []string{demoDuty, ``, `null`, `{}`, `[]`, `"x"`, `{"speed": "1e400 rpm"}`, `{"gas": {"composition": {"CH4": 1e308}}}`,
		duty(f, demoDuty, set("gas", map[string]any{"model": "gerg-2008", "composition": map[string]any{"CO2": 0.9, "N2": 0.1}}))} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/stage/size", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), stageErrors)
	})
}

// FuzzPostBatch posts arbitrary batch bodies (seeded with the demo and
// problem duties, alone and in pairs): the stage contract, per item too.
//
//	go test ./api -run '^$' -fuzz FuzzPostBatch -fuzztime 60s
func FuzzPostBatch(f *testing.F) {
	duties := seedDuties(f)
	for i, b := range duties {
		f.Add([]byte(`{"duties":[` + string(b) + `]}`))
		f.Add([]byte(`{"duties":[` + string(b) + `,` + string(duties[(i+1)%len(duties)]) + `]}`))
	}
	for _, s := range []string{`{"duties":[]}`, `{"duties":null}`, `{"duties":[null]}`, `{"duties":{}}`, `{}`, `[]`, ``} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/stage/size/batch", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), []int{http.StatusBadRequest, http.StatusRequestEntityTooLarge})
		if w.Code != http.StatusOK {
			return
		}
		var out struct {
			Results []struct {
				Index, Status int
				Result        json.RawMessage
				Problem       *problem
			}
			Succeeded, Failed int
		}
		if err := json.Unmarshal(w.Body.Bytes(), &out); err != nil {
			t.Fatalf("batch answer: %v", err)
		}
		ok := 0
		for i, r := range out.Results {
			switch {
			case r.Index != i:
				t.Fatalf("result %d has index %d", i, r.Index)
			case r.Status == http.StatusOK && r.Result != nil && r.Problem == nil:
				ok++
			// a unit string that does not parse is found after decoding: its duty gets a 400 item
			case (r.Status == http.StatusUnprocessableEntity || r.Status == http.StatusBadRequest) &&
				r.Problem != nil && r.Problem.Status == r.Status && r.Result == nil:
			default:
				t.Fatalf("result %d: status %d, problem %+v", i, r.Status, r.Problem)
			}
		}
		if out.Succeeded != ok || out.Failed != len(out.Results)-ok {
			t.Fatalf("counts %d/%d, items %d ok of %d", out.Succeeded, out.Failed, ok, len(out.Results))
		}
	})
}

// FuzzGasProperties posts arbitrary property requests, seeded with the gas
// and suction state of every demo and problem duty.
//
//	go test ./api -run '^$' -fuzz FuzzGasProperties -fuzztime 60s
func FuzzGasProperties(f *testing.F) {
	for _, b := range seedDuties(f) {
		var d struct {
			Gas     json.RawMessage `json:"gas"`
			Suction struct {
				Temperature json.RawMessage `json:"temperature"`
				Pressure    json.RawMessage `json:"pressure"`
			} `json:"suction"`
		}
		if json.Unmarshal(b, &d) != nil || d.Gas == nil || d.Suction.Temperature == nil || d.Suction.Pressure == nil {
			continue
		}
		f.Add([]byte(`{"gas":` + string(d.Gas) + `,"temperature":` + string(d.Suction.Temperature) + `,"pressure":` + string(d.Suction.Pressure) + `}`))
	}
	for _, s := range []string{
		`{"gas":{"model":"peng-robinson","composition":{"CH4":0.9,"C2H6":0.1}},"temperature":"-160 degC","pressure":"1 bara"}`,
		`{"gas":{"model":"srk","composition":{"CO2":1}},"temperature":304.1,"pressure":7.38e6}`,
		`{"gas":{"model":"gerg-2008","composition":{"CO2":1}},"temperature":304.1,"pressure":7.38e6}`,
		`{"gas":{"model":"gerg-2008","composition":{"CH4":0.8,"H2":0.2,"nC10":0.001}},"temperature":"-100 degC","pressure":"69 MPa"}`,
		`{"gas":{"model":"ideal","composition":{"H2O":1}},"temperature":300,"pressure":"0 barg","ambient":"1 bara"}`,
		`{"gas":{"model":"ideal-constant","cp":1006,"gamma":1.4},"temperature":1e-300,"pressure":1e300}`,
		`{}`, `null`, ``,
	} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/gas/properties", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), stageErrors)
	})
}

// seedDuties are the demo duties and the problem duties of testdata.
func seedDuties(tb testing.TB) [][]byte {
	var out [][]byte
	for _, dir := range []string{stagesDir, problemsDir} {
		files, err := filepath.Glob(filepath.Join(dir, "*.in.json"))
		if err != nil {
			tb.Fatal(err)
		}
		for _, name := range files {
			b, err := os.ReadFile(name)
			if err != nil {
				tb.Fatal(err)
			}
			out = append(out, b)
		}
	}
	if len(out) == 0 {
		tb.Fatal("no seed duties in testdata")
	}
	return out
}

// fuzzExchange serves one request and validates it against the served
// OpenAPI 3 document (contract_test.go).
func fuzzExchange(t *testing.T, h http.Handler, k *contract, method, target string, body []byte) *httptest.ResponseRecorder {
	t.Helper()
	req := httptest.NewRequest(method, target, bytes.NewReader(body))
	req.Header.Set("Content-Type", "application/json")
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	if err := k.check(req, body, w.Code, w.Header(), w.Body.Bytes()); err != nil {
		t.Fatalf("contract: %v\nrequest: %q\nresponse: %s", err, body, w.Body.String())
	}
	return w
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
	k := servedContract(f, h)
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
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/stage/size", []byte(body))
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), stageErrors)
		if w.Code == http.StatusBadRequest {
			t.Fatalf("a duty of the right shape is never a 400: %s\nbody: %s", w.Body.String(), body)
		}
	})
}

// FuzzStageChoices sends duties that leave the speed, the efficiency and
// the impeller to the service (the joint iteration of service/size.go),
// with arbitrary finite suction states, ratios, flows and, by mode, a speed
// target, a tip diameter, a speed step, a backsweep or a prewhirl angle.
//
//	go test ./api -run '^$' -fuzz FuzzStageChoices -fuzztime 60s
func FuzzStageChoices(f *testing.F) {
	f.Add(1e5, 300.0, 2.5, 3.0, 0, 0.0, 0.0, 0.0)      // everything chosen
	f.Add(21e5, 318.15, 1.17, 3.9, 1, 0.7, 50.0, 40.0) // specific speed, step
	f.Add(7.5e5, 298.15, 1.6, 4.0, 2, 0.09, 0.0, 10.0) // flow coefficient, prewhirl
	f.Add(7.5e5, 298.15, 1.6, 4.0, 3, 0.31, 0.0, 45.0) // tip diameter
	f.Add(1e5, 300.0, 4.0, 0.05, 0, 0.0, 0.0, 70.0)    // a tiny flow, far backswept
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, p1, t1, pr, mdot float64, mode int, target, step, angle float64) {
		for _, v := range []float64{p1, t1, pr, mdot, target, step, angle} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return // JSON has no NaN or Inf
			}
		}
		req := map[string]any{
			"gas":            map[string]any{"model": "ideal-constant", "cp": 1005, "gamma": 1.4},
			"suction":        map[string]any{"pressure": p1, "temperature": t1},
			"pressure_ratio": pr,
			"flow":           map[string]any{"mass": mdot},
		}
		switch ((mode % 5) + 5) % 5 {
		case 1:
			req["speed_target"] = map[string]any{"specific_speed": target}
			req["speed_step"] = step
		case 2:
			req["speed_target"] = map[string]any{"flow_coefficient": target}
			req["impeller"] = map[string]any{"inlet": map[string]any{"prewhirl_angle": angle}}
		case 3:
			req["tip_diameter"] = target
			req["impeller"] = map[string]any{"blade_exit_angle": angle}
		case 4:
			req["impeller"] = map[string]any{"blade_exit_angle": angle, "slip_model": "stanitz", "blade_count": 5 + int(math.Abs(step))%40}
		}
		body, err := json.Marshal(req)
		if err != nil {
			t.Fatal(err)
		}
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/stage/size", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), stageErrors)
	})
}

// stageErrors are the error statuses a single duty or state may get.
var stageErrors = []int{http.StatusBadRequest, http.StatusRequestEntityTooLarge, http.StatusUnprocessableEntity}

// checkAnswer is the contract every answer keeps: never a 5xx, always a
// JSON body free of non-finite numbers, problem+json with a matching status
// for every error, and only the error statuses in allowed.
func checkAnswer(t *testing.T, code int, contentType string, body []byte, allowed []int) {
	t.Helper()
	if code >= 500 {
		t.Fatalf("status %d: %s", code, body)
	}
	if !json.Valid(body) {
		t.Fatalf("status %d with a body that is not JSON: %q", code, body)
	}
	requireFiniteJSON(t, body)
	if code == http.StatusOK {
		if contentType != "application/json; charset=utf-8" {
			t.Fatalf("200 with Content-Type %q", contentType)
		}
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
	if !slices.Contains(allowed, code) {
		t.Fatalf("unexpected status %d: %s", code, body)
	}
}
