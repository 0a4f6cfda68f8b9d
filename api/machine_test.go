package api_test

import (
	"bytes"
	"encoding/json"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const machinesDir = "../testdata/machines"

// mapChartFile is the demo machine's map chart shown in the README.
const mapChartFile = machinesDir + "/kestrel-regen-blower.map.svg"

// machineRoute is the endpoint of a testdata/machines input: NAME.rate.in.json
// goes to /v1/machine/rate, NAME.map.in.json to /v1/machine/map.
func machineRoute(name string) string {
	if strings.HasSuffix(name, ".map") {
		return "/v1/machine/map"
	}
	return "/v1/machine/rate"
}

// TestGoldenMachines posts every testdata/machines/NAME.in.json (demo
// machines of the invented Kestrel Ridge plant, taken from the stage
// goldens' machine objects, and one typed from a datasheet) and compares
// the answer with NAME.golden.json (go test ./api -run Golden -update).
func TestGoldenMachines(t *testing.T) {
	inputs, err := filepath.Glob(filepath.Join(machinesDir, "*.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, inputs)
	h := newRouter(t)
	for _, in := range inputs {
		name := strings.TrimSuffix(filepath.Base(in), ".in.json")
		t.Run(name, func(t *testing.T) {
			body, err := os.ReadFile(in)
			require.NoError(t, err)
			w := do(h, http.MethodPost, machineRoute(name), string(body))
			require.Equal(t, http.StatusOK, w.Code, "a demo machine must rate: %s", w.Body.String())
			goldenPath := filepath.Join(machinesDir, name+".golden.json")
			if *update {
				var pretty bytes.Buffer
				require.NoError(t, json.Indent(&pretty, w.Body.Bytes(), "", "  "))
				pretty.WriteByte('\n')
				require.NoError(t, os.WriteFile(goldenPath, pretty.Bytes(), 0o644))
			}
			golden, err := os.ReadFile(goldenPath)
			require.NoError(t, err, "no golden file: run go test ./api -run Golden -update")
			assertJSONClose(t, golden, w.Body.Bytes())
		})
	}
}

// postMap posts a map request with an Accept header.
func postMap(h http.Handler, body, accept string) *httptest.ResponseRecorder {
	req := httptest.NewRequest(http.MethodPost, "/v1/machine/map", strings.NewReader(body))
	req.Header.Set("Content-Type", "application/json")
	if accept != "" {
		req.Header.Set("Accept", accept)
	}
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	return w
}

// TestMapChartCurrent: the committed chart of the demo machine's map is
// what the service draws now (rewritten with -update); it is an SVG with
// the title, the axis labels with units, the estimate line and a label for
// every speed line.
func TestMapChartCurrent(t *testing.T) {
	body, err := os.ReadFile(filepath.Join(machinesDir, "kestrel-regen-blower.map.in.json"))
	require.NoError(t, err)
	w := postMap(newRouter(t), string(body), "image/svg+xml")
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	assert.Equal(t, "image/svg+xml", w.Header().Get("Content-Type"))
	svg := w.Body.Bytes()
	if *update {
		require.NoError(t, os.WriteFile(mapChartFile, svg, 0o644))
	}
	for _, s := range []string{"<svg", "Estimated performance map", "polytropic head (kJ/kg)", "actual inlet volume flow (m3/s)",
		"surge line (estimate)", "choke (estimate)", "design point", "operating point", "rev/min (100 %)", "rev/min (70 %)", "surge and choke lines are estimates"} {
		assert.Contains(t, string(svg), s)
	}
	committed, err := os.ReadFile(mapChartFile)
	require.NoError(t, err, "run go test ./api -run TestMapChartCurrent -update")
	assert.True(t, bytes.Equal(committed, svg), "%s is out of date: run go test ./api -run TestMapChartCurrent -update", mapChartFile)
}

// TestMapCSV: the CSV answer has a header with units and one row per point.
func TestMapCSV(t *testing.T) {
	body, err := os.ReadFile(filepath.Join(machinesDir, "kestrel-regen-blower.map.in.json"))
	require.NoError(t, err)
	h := newRouter(t)
	w := postMap(h, string(body), "text/csv")
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	assert.Contains(t, w.Header().Get("Content-Type"), "text/csv")
	lines := strings.Split(strings.TrimSpace(w.Body.String()), "\n")
	assert.Equal(t, "speed_rpm,actual_volume_flow_m3_per_s,mass_flow_kg_per_s,polytropic_head_J_per_kg,pressure_ratio,polytropic_efficiency,shaft_power_W", lines[0])
	assert.Len(t, lines, 1+5*25, "5 default speed lines of 25 points")
	j := postMap(h, string(body), "")
	require.Equal(t, http.StatusOK, j.Code)
	assert.Contains(t, j.Header().Get("Content-Type"), "application/json")
}

// TestStageMachineRoundTrip: the machine that /v1/stage/size answers,
// posted back to /v1/machine/rate at the sizing's duty and speed, gives the
// sizing's discharge, head, efficiency and power back (the round
// trip through the API; 1e-6 for the constant-property gas, the solver
// tolerance of 1e-6 for the real gases).
func TestStageMachineRoundTrip(t *testing.T) {
	inputs, err := filepath.Glob(filepath.Join(stagesDir, "*.in.json"))
	require.NoError(t, err)
	h := newRouter(t)
	for _, in := range inputs {
		name := strings.TrimSuffix(filepath.Base(in), ".in.json")
		t.Run(name, func(t *testing.T) {
			body, err := os.ReadFile(in)
			require.NoError(t, err)
			w := postStage(h, string(body))
			require.Equal(t, http.StatusOK, w.Code)
			var duty, sized map[string]any
			require.NoError(t, json.Unmarshal(body, &duty))
			require.NoError(t, json.Unmarshal(w.Body.Bytes(), &sized))
			req := map[string]any{"machine": sized["machine"], "gas": duty["gas"], "suction": duty["suction"],
				"flow": map[string]any{"mass": sized["mass_flow"]}, "speed": sized["speed"]}
			rb, err := json.Marshal(req)
			require.NoError(t, err)
			r := do(h, http.MethodPost, "/v1/machine/rate", string(rb))
			require.Equal(t, http.StatusOK, r.Code, r.Body.String())
			var rated map[string]any
			require.NoError(t, json.Unmarshal(r.Body.Bytes(), &rated))
			get := func(m map[string]any, path ...string) float64 {
				var v any = m
				for _, p := range path {
					v = v.(map[string]any)[p]
				}
				return v.(float64)
			}
			for _, p := range [][]string{{"discharge", "pressure"}, {"discharge", "temperature"}, {"head", "polytropic"}, {"head", "isentropic"},
				{"efficiency", "polytropic"}, {"efficiency", "isentropic"}, {"power", "shaft"}, {"power", "gas"}} {
				assert.InEpsilon(t, get(sized, p...), get(rated, p...), 1e-6, "%v", p)
			}
		})
	}
}

// TestMachineProblems: bad machines and operating points are clear
// problems with pointers (the bad-input proof): never a 500.
func TestMachineProblems(t *testing.T) {
	body, err := os.ReadFile(filepath.Join(machinesDir, "kestrel-instrument-air-design.rate.in.json"))
	require.NoError(t, err)
	h := newRouter(t)
	cases := []struct {
		name    string
		e       medit
		status  int
		pointer string
		detail  string
	}{
		{"missing tip diameter", mdel("machine.stages.0.tip_diameter"), 400, "/machine/stages/0/tip_diameter", ""},
		{"missing design", mdel("machine.stages.0.design"), 400, "/machine/stages/0/design", ""},
		{"empty stage list", mset("machine.stages", []any{}), 400, "/machine/stages", ""},
		{"exit width wider than the tip diameter", mset("machine.stages.0.exit_width", 1.0), 422, "/machine/stages/0/exit_width", "tip diameter"},
		{"negative tip diameter", mset("machine.stages.0.tip_diameter", -0.3), 422, "/machine/stages/0/tip_diameter", ""},
		{"flow past choke", mset("flow", map[string]any{"mass": 30}), 422, "/flow", "choke flow of"},
		{"absurd speed", mset("speed", 9e6), 422, "/speed", ""},
		{"speed and discharge pressure", mset("discharge_pressure", 3e5), 400, "", ""},
		{"bad unit", mset("machine.stages.0.tip_diameter", "31 furlongs"), 400, "/machine/stages/0/tip_diameter", ""},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			w := do(h, http.MethodPost, "/v1/machine/rate", mutate(t, string(body), tc.e))
			require.Equal(t, tc.status, w.Code, w.Body.String())
			var p struct {
				Detail string
				Errors []struct{ Pointer, Detail string }
			}
			require.NoError(t, json.Unmarshal(w.Body.Bytes(), &p))
			if tc.pointer != "" {
				require.NotEmpty(t, p.Errors, w.Body.String())
				assert.Equal(t, tc.pointer, p.Errors[0].Pointer, w.Body.String())
			}
			if tc.detail != "" {
				assert.Contains(t, w.Body.String(), tc.detail)
			}
		})
	}
}

// TestRateBatch: ordered results, a per-item problem with its pointer
// relative to the item, and a wrongly shaped item rejecting the batch
// with a /ratings/N pointer.
func TestRateBatch(t *testing.T) {
	body, err := os.ReadFile(filepath.Join(machinesDir, "kestrel-instrument-air-design.rate.in.json"))
	require.NoError(t, err)
	good := string(body)
	choked := mutate(t, good, mset("flow", map[string]any{"mass": 30}))
	h := newRouter(t)
	w := do(h, http.MethodPost, "/v1/machine/rate/batch", `{"ratings": [`+good+`,`+choked+`,`+good+`]}`)
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	var out struct {
		Results []struct {
			Index, Status int
			Problem       *struct{ Errors []struct{ Pointer string } }
		}
		Succeeded, Failed int
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &out))
	require.Len(t, out.Results, 3)
	assert.Equal(t, 2, out.Succeeded)
	assert.Equal(t, 1, out.Failed)
	for i, r := range out.Results {
		assert.Equal(t, i, r.Index)
	}
	assert.Equal(t, 422, out.Results[1].Status)
	require.NotNil(t, out.Results[1].Problem)
	assert.Equal(t, "/flow", out.Results[1].Problem.Errors[0].Pointer)
	bad := mutate(t, good, mdel("machine.stages.0.exit_width"))
	w = do(h, http.MethodPost, "/v1/machine/rate/batch", `{"ratings": [`+good+`,`+bad+`]}`)
	require.Equal(t, http.StatusBadRequest, w.Code)
	assert.Contains(t, w.Body.String(), "/ratings/1/machine/stages/0/exit_width")
	w = do(h, http.MethodPost, "/v1/machine/rate/batch", `{"ratings": []}`)
	require.Equal(t, http.StatusBadRequest, w.Code)
}

// medit changes a request decoded as generic JSON; paths are dotted with
// array indexes ("machine.stages.0.tip_diameter").
type medit func(tb testing.TB, m map[string]any)

func mwalk(tb testing.TB, m map[string]any, path string) (any, string) {
	tb.Helper()
	parts := strings.Split(path, ".")
	var cur any = m
	for _, p := range parts[:len(parts)-1] {
		switch c := cur.(type) {
		case map[string]any:
			cur = c[p]
		case []any:
			i, err := strconv.Atoi(p)
			require.NoError(tb, err, path)
			cur = c[i]
		default:
			tb.Fatalf("%s: %s is not an object or array", path, p)
		}
	}
	return cur, parts[len(parts)-1]
}

func mset(path string, v any) medit {
	return func(tb testing.TB, m map[string]any) {
		parent, key := mwalk(tb, m, path)
		parent.(map[string]any)[key] = v
	}
}

func mdel(path string) medit {
	return func(tb testing.TB, m map[string]any) {
		parent, key := mwalk(tb, m, path)
		pm := parent.(map[string]any)
		require.Contains(tb, pm, key, path)
		delete(pm, key)
	}
}

// mutate returns base with the edits applied, as JSON text.
func mutate(tb testing.TB, base string, edits ...medit) string {
	tb.Helper()
	var m map[string]any
	require.NoError(tb, json.Unmarshal([]byte(base), &m))
	for _, e := range edits {
		e(tb, m)
	}
	b, err := json.Marshal(m)
	require.NoError(tb, err)
	return string(b)
}
