package api_test

import (
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const sectionsDir = "../testdata/sections"

// TestGoldenSections posts every testdata/sections/NAME.in.json to
// /v1/section/size and compares the 200 answer with NAME.golden.json.
func TestGoldenSections(t *testing.T) {
	runGoldensAt(t, sectionsDir, "/v1/section/size", func(t *testing.T, code int, body []byte) {
		require.Equal(t, http.StatusOK, code, "a demo section must size: %s", body)
	})
}

// sectionDemo is the Kestrel Ridge instrument-air section of testdata/sections.
func sectionDemo(tb testing.TB) string {
	tb.Helper()
	b, err := os.ReadFile(filepath.Join(sectionsDir, "kestrel-instrument-air-section.in.json"))
	require.NoError(tb, err)
	return string(b)
}

// TestSectionProblems: bad section input is a 400 (shape) or 422
// (physically impossible) naming the field with its JSON pointer.
func TestSectionProblems(t *testing.T) {
	h := newRouter(t)
	demo := sectionDemo(t)
	post := func(body string) *httptest.ResponseRecorder { return do(h, http.MethodPost, "/v1/section/size", body) }
	tests := []struct {
		name    string
		body    string
		status  int
		kind    string
		pointer string
		detail  string
	}{
		{"stage count 0", duty(t, demo, set("stage_count", 0)), 400, "invalid-request", "/stage_count", ""},
		{"stage count absurd", duty(t, demo, set("stage_count", 500)), 400, "invalid-request", "/stage_count", ""},
		{"stage count not a number", duty(t, demo, set("stage_count", "three")), 400, "invalid-request", "/stage_count", ""},
		{"cooler outlet hotter than its inlet", duty(t, demo, del("intercooling.approach"), del("intercooling.coolant_temperature"), set("intercooling.outlet_temperature", "400 degC")),
			422, "unprocessable", "/intercooling/outlet_temperature", "hotter than its inlet"},
		{"cooler outlet colder than the coolant", duty(t, demo, del("intercooling.approach"), set("intercooling.outlet_temperature", "20 degC")),
			422, "unprocessable", "/intercooling/outlet_temperature", "colder than the coolant"},
		{"negative approach", duty(t, demo, set("intercooling.approach", -5)), 422, "unprocessable", "/intercooling/approach", "at least 0"},
		{"after a stage outside the list", duty(t, demo, set("stage_count", 3), set("intercooling.after_stages", []int{1, 3})),
			422, "unprocessable", "/intercooling/after_stages/1", "not followed by another"},
		{"after stage 0", duty(t, demo, set("intercooling.after_stages", []int{0})), 422, "unprocessable", "/intercooling/after_stages/0", "after stage 1"},
		{"unknown arrangement", duty(t, demo, set("arrangement", "tandem")), 400, "invalid-request", "/arrangement", ""},
		{"unknown intercooling field", duty(t, demo, set("intercooling.outlet_temp", 300)), 400, "invalid-request", "/intercooling/outlet_temp", ""},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := requireProblem(t, post(tc.body), tc.status, tc.kind)
			assert.Contains(t, p.pointers(), tc.pointer)
			if tc.detail != "" {
				assert.Contains(t, p.details(), tc.detail)
			}
		})
	}
}

// FuzzPostSection posts arbitrary section bodies: never a 5xx, always
// JSON, a problem+json on every error, no non-finite number on success.
//
//	go test ./api -run '^$' -fuzz FuzzPostSection -fuzztime 60s
func FuzzPostSection(f *testing.F) {
	demo := sectionDemo(f)
	f.Add([]byte(demo))
	for _, s := range []string{``, `{}`, `[]`, `{"stage_count": 0}`,
		`{"gas":{"model":"ideal-constant","cp":1005,"gamma":1.4},"suction":{"pressure":1e5,"temperature":300},"pressure_ratio":4,"flow":{"mass":2},"stage_count":2,"efficiency":{"polytropic":0.8}}`,
		`{"gas":{"model":"ideal-constant","cp":1005,"gamma":1.4},"suction":{"pressure":1e5,"temperature":300},"pressure_ratio":9,"flow":{"mass":2},"arrangement":"inline","intercooling":{"after_stages":[1],"outlet_temperature":310,"pressure_drop":"0.1 bar"}}`,
	} {
		f.Add([]byte(s))
	}
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, body []byte) {
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/section/size", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), stageErrors)
	})
}
