package api_test

import (
	"encoding/json"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Findings of a hostile-input run against the machine routes (every
// number of every demo machine request set to 0, -1, 1e-300, 1e300, 1e9,
// strings, nulls and the like: 8400 requests). Before the fixes a design
// suction of 1e9 Pa kept a rating computing for minutes, past the compute
// deadline; a driver rating or mechanical efficiency of 1e-300 gave a 500;
// the design suction's errors pointed at a field the request does not
// have (design/suction_pressure); and a default map speed line that failed
// pointed at /speeds/0 when the caller had sent no speeds.

// machineRequest reads a demo request and applies edit to it.
func machineRequest(t *testing.T, file string, edit func(m map[string]any)) string {
	t.Helper()
	raw, err := os.ReadFile(filepath.Join("..", "testdata", file))
	require.NoError(t, err)
	var m map[string]any
	require.NoError(t, json.Unmarshal(raw, &m))
	edit(m)
	out, err := json.Marshal(m)
	require.NoError(t, err)
	return string(out)
}

func obj(v any, keys ...string) map[string]any {
	m := v.(map[string]any)
	for _, k := range keys {
		m = m[k].(map[string]any)
	}
	return m
}

func firstStageDesign(m map[string]any) map[string]any {
	return obj(obj(m, "machine")["stages"].([]any)[0], "design")
}

// pointerResolves reports whether every part of the JSON pointer but the
// last names a member of body: the field named exists, or its parent does.
func pointerResolves(t *testing.T, body, pointer string) bool {
	t.Helper()
	var v any
	require.NoError(t, json.Unmarshal([]byte(body), &v))
	parts := strings.Split(strings.TrimPrefix(pointer, "/"), "/")
	for _, p := range parts[:len(parts)-1] {
		switch x := v.(type) {
		case map[string]any:
			if v = x[p]; v == nil {
				return false
			}
		case []any:
			i := 0
			for _, c := range p {
				i = 10*i + int(c-'0')
			}
			if i >= len(x) {
				return false
			}
			v = x[i]
		default:
			return false
		}
	}
	return true
}

func TestMachineHostileInputs(t *testing.T) {
	h := newRouter(t)
	const rate = "machines/kestrel-fuel-gas-booster-turndown.rate.in.json"
	cases := []struct {
		name, route, file string
		edit              func(m map[string]any)
		pointer           string
	}{
		{"design suction far past any model", "/v1/machine/rate", rate,
			func(m map[string]any) { obj(firstStageDesign(m), "suction")["pressure"] = 1e9 },
			"/machine/stages/0/design/suction/pressure"},
		{"design suction temperature below the models", "/v1/machine/rate", rate,
			func(m map[string]any) { obj(firstStageDesign(m), "suction")["temperature"] = 5 },
			"/machine/stages/0/design/suction/temperature"},
		{"design discharge below design suction", "/v1/machine/rate", rate,
			func(m map[string]any) { obj(firstStageDesign(m), "suction")["pressure"] = 5e6 },
			"/machine/stages/0/design/discharge_pressure"},
		{"operating suction far past any model", "/v1/machine/rate", rate,
			func(m map[string]any) { obj(m, "suction")["pressure"] = 1e9 },
			"/suction/pressure"},
		{"mechanical efficiency of 1e-300", "/v1/machine/rate", rate,
			func(m map[string]any) { obj(m, "machine")["mechanical_efficiency"] = 1e-300 },
			"/machine/mechanical_efficiency"},
		{"mechanical efficiency of 1e-300 in a check", "/v1/machine/check", "checks/kestrel-k4101-own-duty.in.json",
			func(m map[string]any) { obj(m, "machine")["mechanical_efficiency"] = 1e-300 },
			"/machine/mechanical_efficiency"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			body := machineRequest(t, c.file, c.edit)
			start := time.Now()
			w := do(h, http.MethodPost, c.route, body)
			p := requireProblem(t, w, http.StatusUnprocessableEntity, "unprocessable")
			require.NotEmpty(t, p.Errors)
			assert.Equal(t, c.pointer, p.Errors[0].Pointer, "detail: %s", p.Errors[0].Detail)
			assert.True(t, pointerResolves(t, body, p.Errors[0].Pointer), "pointer %s names no member of the request", p.Errors[0].Pointer)
			assert.Less(t, time.Since(start), 5*time.Second, "an input outside the models must be refused at once")
		})
	}

	// A driver rating of 1e-300 W is a (hopeless) rating, not a 500: the
	// machine does not fit and the margin stays finite.
	for _, c := range []struct{ route, file string }{
		{"/v1/machine/rate", rate},
		{"/v1/machine/check", "checks/kestrel-k4101-own-duty.in.json"},
	} {
		t.Run("driver rating of 1e-300 W "+c.route, func(t *testing.T) {
			body := machineRequest(t, c.file, func(m map[string]any) {
				mach := obj(m, "machine")
				if mach["driver"] == nil {
					mach["driver"] = map[string]any{}
				}
				obj(mach, "driver")["rating"] = 1e-300
			})
			w := do(h, http.MethodPost, c.route, body)
			require.Equal(t, http.StatusOK, w.Code, "body: %s", w.Body.String())
			assert.Contains(t, w.Body.String(), "driver-margin")
		})
	}
}

// TestMapDefaultSpeedErrorNamesSpeeds: a regeneration blower whose
// datasheet design flow is typed as twice its own (5 m3/s) cannot be
// mapped at the default 70 % line; the caller sent no speeds, so the
// problem points at /speeds and says which default line failed, not at
// /speeds/0, which the request does not have.
func TestMapDefaultSpeedErrorNamesSpeeds(t *testing.T) {
	body := machineRequest(t, "machines/kestrel-regen-blower.map.in.json", func(m map[string]any) {
		d := firstStageDesign(m)
		d["volume_flow"] = 2 * d["volume_flow"].(float64)
		delete(m, "speeds")
	})
	w := postMap(newRouter(t), body, "")
	p := requireProblem(t, w, http.StatusUnprocessableEntity, "unprocessable")
	require.NotEmpty(t, p.Errors)
	assert.Equal(t, "/speeds", p.Errors[0].Pointer)
	assert.Contains(t, p.Errors[0].Detail, "default speed line at 70 %")
}

// TestMachineDesignNearTangential: a design volume flow typed far too
// small for the impeller (0.1 m3/s for the regeneration blower) puts the
// design exit flow almost tangential; the surge criterion has no meaning
// there, and the machine is refused on its design volume flow instead of
// failing later with a negative surge flow.
func TestMachineDesignNearTangential(t *testing.T) {
	body := machineRequest(t, "machines/kestrel-regen-blower.map.in.json", func(m map[string]any) {
		firstStageDesign(m)["volume_flow"] = 0.1
	})
	w := postMap(newRouter(t), body, "")
	p := requireProblem(t, w, http.StatusUnprocessableEntity, "unprocessable")
	require.NotEmpty(t, p.Errors)
	assert.Equal(t, "/machine/stages/0/design/volume_flow", p.Errors[0].Pointer, "detail: %s", p.Errors[0].Detail)
	assert.Contains(t, p.Errors[0].Detail, "from radial")
}
