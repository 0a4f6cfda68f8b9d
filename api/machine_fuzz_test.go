package api_test

import (
	"math"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// machineErrors are the statuses a machine request may answer besides 200.
var machineErrors = []int{http.StatusBadRequest, http.StatusUnprocessableEntity, http.StatusRequestEntityTooLarge}

// seedMachines returns the testdata/machines inputs of one route.
func seedMachines(tb testing.TB, suffix string) [][]byte {
	tb.Helper()
	files, err := filepath.Glob(filepath.Join(machinesDir, "*"+suffix+".in.json"))
	if err != nil || len(files) == 0 {
		tb.Fatalf("no %s seeds: %v", suffix, err)
	}
	var out [][]byte
	for _, f := range files {
		b, err := os.ReadFile(f)
		if err != nil {
			tb.Fatal(err)
		}
		out = append(out, b)
	}
	return out
}

// FuzzPostMachineRate posts arbitrary rate bodies (seeded with the demo
// machines): never a 5xx, always JSON without NaN or Inf, problem+json
// with a matching status for errors, and the contract of the document.
//
//	go test ./api -run '^$' -fuzz FuzzPostMachineRate -fuzztime 60s
func FuzzPostMachineRate(f *testing.F) {
	for _, b := range seedMachines(f, ".rate") {
		f.Add(b)
	}
	for _, s := range []string{``, `{}`, `{"machine":{"stages":[]}}`, `{"machine":{"stages":[{}]},"speed":1}`} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/machine/rate", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), machineErrors)
	})
}

// FuzzMachineNumbers puts arbitrary finite numbers into the demo machine's
// dimensions and operating point, to reach the off-design physics with
// values no table lists: a machine of the right shape is never a 400.
//
//	go test ./api -run '^$' -fuzz FuzzMachineNumbers -fuzztime 60s
func FuzzMachineNumbers(f *testing.F) {
	base, err := os.ReadFile(filepath.Join(machinesDir, "kestrel-datasheet-blower.rate.in.json"))
	if err != nil {
		f.Fatal(err)
	}
	f.Add(0.62, 0.038, 45.0, 0.86, 0.33, 0.11, 7400.0, 4.4, 0.82, 4.167, 7200.0, 99000.0, 308.15)
	f.Add(0.62, 0.7, 45.0, 0.86, 0.33, 0.11, 7400.0, 4.4, 0.82, 40.0, 7200.0, 99000.0, 308.15)
	f.Add(1e-3, 1e-3, 0.0, 1e-3, 1e-4, 0.0, 1.0, 1e-6, 1e-3, 1e-6, 1.0, 1.0, 1.0)
	f.Add(4.0, 0.5, 75.0, 1.0, 3.0, 2.9, 1e6, 1e4, 1.0, 1e6, 2e6, 1e8, 3000.0)
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, d2, b2, beta, slip, eyeTip, eyeHub, nd, qd, eta, q, n, p1, t1 float64) {
		for _, v := range []float64{d2, b2, beta, slip, eyeTip, eyeHub, nd, qd, eta, q, n, p1, t1} {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return
			}
		}
		body := mutate(t, string(base),
			mset("machine.stages.0.tip_diameter", d2), mset("machine.stages.0.exit_width", b2),
			mset("machine.stages.0.blade_exit_angle", beta), mset("machine.stages.0.slip_factor", slip),
			mset("machine.stages.0.inlet.eye_tip_diameter", eyeTip), mset("machine.stages.0.inlet.eye_hub_diameter", eyeHub),
			mset("machine.stages.0.design.speed", nd), mset("machine.stages.0.design.volume_flow", qd),
			mset("machine.stages.0.design.polytropic_efficiency", eta),
			mset("flow", map[string]any{"actual_volume": q}), mset("speed", n),
			mset("suction", map[string]any{"pressure": p1, "temperature": t1}))
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/machine/rate", []byte(body))
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), machineErrors)
		if w.Code == http.StatusBadRequest && !strings.Contains(w.Body.String(), "invalid-request") {
			t.Fatalf("a machine of the right shape is a 400 only for a schema range: %s", w.Body.String())
		}
	})
}

// FuzzPostMachineMap posts arbitrary map bodies (seeded with the demo
// maps, JSON answers): the same contract as the rating.
//
//	go test ./api -run '^$' -fuzz FuzzPostMachineMap -fuzztime 60s
func FuzzPostMachineMap(f *testing.F) {
	for _, b := range seedMachines(f, ".map") {
		f.Add(b)
	}
	for _, s := range []string{``, `{}`, `{"speeds":[1e308]}`, `{"points":2}`} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/machine/map", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), machineErrors)
	})
}

// FuzzPostMachineRateBatch posts arbitrary rate batches: ordered items,
// the rate contract per item.
//
//	go test ./api -run '^$' -fuzz FuzzPostMachineRateBatch -fuzztime 60s
func FuzzPostMachineRateBatch(f *testing.F) {
	seeds := seedMachines(f, ".rate")
	for i, b := range seeds {
		f.Add([]byte(`{"ratings":[` + string(b) + `,` + string(seeds[(i+1)%len(seeds)]) + `]}`))
	}
	for _, s := range []string{`{"ratings":[]}`, `{"ratings":null}`, `{"ratings":[null]}`, `{}`} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/machine/rate/batch", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), []int{http.StatusBadRequest, http.StatusRequestEntityTooLarge})
	})
}
