package api_test

import (
	"bytes"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// benchRequest measures one request through the production router (no
// contract check): decoding, validation, unit parsing, the service and the
// JSON answer; b.ReportAllocs gives the allocations per request.
func benchRequest(b *testing.B, method, target string, body []byte, status int) {
	h := plainRouter(b)
	b.ReportAllocs()
	b.SetBytes(int64(len(body)))
	start := cpuTime()
	defer reportCPU(b, start)
	for b.Loop() {
		req := httptest.NewRequest(method, target, bytes.NewReader(body))
		if body != nil {
			req.Header.Set("Content-Type", "application/json")
		}
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		if w.Code != status {
			b.Fatalf("status %d: %s", w.Code, w.Body.String())
		}
	}
}

// cpuTime is the CPU time the process has used (user + system). On a
// machine shared with other work a benchmark's wall time per op mostly
// measures the wait for a core; its CPU time per op does not (with
// GOMAXPROCS workers, as in a batch, it adds their CPU time up).
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// reportCPU adds the metric cpu-ns/op: the process's CPU time since start
// (garbage collection included) per iteration.
func reportCPU(b *testing.B, start time.Duration) {
	if b.N > 0 {
		b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
	}
}

// benchPost measures one POST /v1/stage/size.
func benchPost(b *testing.B, body []byte, status int) {
	benchRequest(b, http.MethodPost, "/v1/stage/size", body, status)
}

func readDuty(b *testing.B, name string) []byte {
	body, err := os.ReadFile(filepath.Join(stagesDir, name))
	if err != nil {
		b.Fatal(err)
	}
	return body
}

// BenchmarkPostStage: the instrument-air demo duty (ideal gas, constant cp).
func BenchmarkPostStage(b *testing.B) {
	benchPost(b, []byte(demoDuty), http.StatusOK)
}

// BenchmarkPostStageRealGas: the Peng-Robinson fuel-gas demo duty with
// strings with units.
func BenchmarkPostStageRealGas(b *testing.B) {
	benchPost(b, readDuty(b, "kestrel-fuel-gas-booster.in.json"), http.StatusOK)
}

// BenchmarkPostStageProblem: a duty with a misspelt field, answered 400.
func BenchmarkPostStageProblem(b *testing.B) {
	benchPost(b, bytes.Replace([]byte(demoDuty), []byte(`"pressure": 98000`), []byte(`"presure": 98000`), 1), http.StatusBadRequest)
}

// BenchmarkPostStageUnprocessable: a well-formed duty the physics refuses
// (polytropic efficiency 1.2), answered 422.
func BenchmarkPostStageUnprocessable(b *testing.B) {
	benchPost(b, bytes.Replace([]byte(demoDuty), []byte(`"polytropic": 0.84`), []byte(`"polytropic": 1.2`), 1), http.StatusUnprocessableEntity)
}

// BenchmarkPostBatch: the five demo duties twice in one batch (10 duties;
// ns/op is per batch).
func BenchmarkPostBatch(b *testing.B) {
	files, err := filepath.Glob(filepath.Join(stagesDir, "*.in.json"))
	if err != nil || len(files) == 0 {
		b.Fatal("no demo duties", err)
	}
	var duties []string
	for range 2 {
		for _, f := range files {
			duties = append(duties, string(readDuty(b, filepath.Base(f))))
		}
	}
	benchRequest(b, http.MethodPost, "/v1/stage/size/batch", []byte(`{"duties":[`+strings.Join(duties, ",")+`]}`), http.StatusOK)
}

// BenchmarkGasProperties: a natural gas under Peng-Robinson at one state.
func BenchmarkGasProperties(b *testing.B) {
	body := `{"gas":{"model":"peng-robinson","composition":{"CH4":0.9,"C2H6":0.06,"C3H8":0.02,"N2":0.01,"CO2":0.01}},"temperature":"35 degC","pressure":"50 bara"}`
	benchRequest(b, http.MethodPost, "/v1/gas/properties", []byte(body), http.StatusOK)
}

// BenchmarkGasComponents: the catalogue (GET, no body).
func BenchmarkGasComponents(b *testing.B) {
	benchRequest(b, http.MethodGet, "/v1/gas/components", nil, http.StatusOK)
}

// BenchmarkHealthz: the trivial endpoint, the floor of the HTTP path.
func BenchmarkHealthz(b *testing.B) {
	benchRequest(b, http.MethodGet, "/healthz", nil, http.StatusOK)
}

// BenchmarkPostBatch500: the load script's batch, 500 copies of the
// ideal-gas demo duty (ns/op is per batch; divide by 500 for a duty).
func BenchmarkPostBatch500(b *testing.B) {
	body := []byte(`{"duties":[` + strings.TrimSuffix(strings.Repeat(demoDuty+",", 500), ",") + `]}`)
	benchRequest(b, http.MethodPost, "/v1/stage/size/batch", body, http.StatusOK)
}
