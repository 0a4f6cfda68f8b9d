package api_test

import (
	"bytes"
	"encoding/json"
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

// sectionMapChart is the demo section's estimated map, shown in the README.
const sectionMapChart = sectionsDir + "/kestrel-instrument-air-section.map.svg"

// TestSectionMapChartCurrent maps the demo section's machine (from its
// golden answer) at 98, 100, 103 and 105 % of the first stage's design
// speed through /v1/machine/map and checks the committed chart is current
// (go test ./api -run TestSectionMapChartCurrent -update rewrites it).
// Every speed line of a three-stage section ends where its last stage
// chokes, well before the first stage would (stage mismatch).
func TestSectionMapChartCurrent(t *testing.T) {
	var golden struct {
		Machine json.RawMessage `json:"machine"`
	}
	b, err := os.ReadFile(filepath.Join(sectionsDir, "kestrel-instrument-air-section.golden.json"))
	require.NoError(t, err)
	require.NoError(t, json.Unmarshal(b, &golden))
	var in struct {
		Gas, Suction json.RawMessage
	}
	require.NoError(t, json.Unmarshal([]byte(sectionDemo(t)), &in))
	body, err := json.Marshal(map[string]any{"machine": golden.Machine, "gas": in.Gas, "suction": in.Suction,
		"speeds": []float64{23600, 24100, 24800, 25300}})
	require.NoError(t, err)
	h := newRouter(t)
	w := postMap(h, string(body), "")
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	var m struct {
		SpeedLines []struct {
			Points []struct {
				PressureRatio float64 `json:"pressure_ratio"`
			} `json:"points"`
		} `json:"speed_lines"`
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &m))
	require.Len(t, m.SpeedLines, 4)
	for _, l := range m.SpeedLines {
		first, last := l.Points[0].PressureRatio, l.Points[len(l.Points)-1].PressureRatio
		assert.Less(t, last, 0.5*first, "the line falls steeply into the last stage's choke")
	}
	w = postMap(h, string(body), "image/svg+xml")
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	svg := w.Body.Bytes()
	if *update {
		require.NoError(t, os.WriteFile(sectionMapChart, svg, 0o644))
	}
	committed, err := os.ReadFile(sectionMapChart)
	require.NoError(t, err, "run go test ./api -run TestSectionMapChartCurrent -update")
	assert.True(t, bytes.Equal(committed, svg), "%s is out of date: run go test ./api -run TestSectionMapChartCurrent -update", sectionMapChart)
}
