package api_test

import (
	"bytes"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"testing"
)

// benchPost measures one POST /v1/stage/size through the router: decoding,
// validation, unit parsing, the service and the JSON answer.
func benchPost(b *testing.B, body []byte, status int) {
	h := plainRouter(b)
	b.ReportAllocs()
	b.SetBytes(int64(len(body)))
	for b.Loop() {
		req := httptest.NewRequest(http.MethodPost, "/v1/stage/size", bytes.NewReader(body))
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		if w.Code != status {
			b.Fatalf("status %d: %s", w.Code, w.Body.String())
		}
	}
}

// BenchmarkPostStage: the instrument-air demo duty (ideal gas, constant cp).
func BenchmarkPostStage(b *testing.B) {
	benchPost(b, []byte(demoDuty), http.StatusOK)
}

// BenchmarkPostStageRealGas: the Peng-Robinson fuel-gas demo duty with
// strings with units.
func BenchmarkPostStageRealGas(b *testing.B) {
	body, err := os.ReadFile(filepath.Join(stagesDir, "kestrel-fuel-gas-booster.in.json"))
	if err != nil {
		b.Fatal(err)
	}
	benchPost(b, body, http.StatusOK)
}

// BenchmarkPostStageProblem: a duty with a misspelt field, answered 400.
func BenchmarkPostStageProblem(b *testing.B) {
	benchPost(b, bytes.Replace([]byte(demoDuty), []byte(`"pressure": 98000`), []byte(`"presure": 98000`), 1), http.StatusBadRequest)
}
