package api

import (
	"bytes"
	"context"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/service"
)

// checksDir holds the duty-change demo of the invented Kestrel Ridge plant:
// two installed machines, each sized once, and the checks asked of them.
const checksDir = "../testdata/checks"

// demoMachines sizes the demo assets once, as an asset system would have:
// K-4101, the fuel-gas booster, from kestrel-k4101.size.json (a
// /v1/stage/size request) by the service behind that route; the plant-air
// section (two in-line stages with an intercooler, constant-property air
// 1 bar, 300 K to 3 bar, 4 kg/s, cooled to 305 K with 0.1 bar drop) by
// SizeSection. Invented data: the demo, not check values.
func demoMachines(t *testing.T) map[string]MachineSpec {
	t.Helper()
	raw, err := os.ReadFile(filepath.Join(checksDir, "kestrel-k4101.size.json"))
	require.NoError(t, err)
	var req StageRequest
	require.NoError(t, json.Unmarshal(raw, &req))
	d, err := dutyOf(req)
	require.NoError(t, err)
	svc := service.New()
	res, err := svc.SizeStage(context.Background(), d)
	require.NoError(t, err)
	k4101 := machineSpecOf(res.Machine)
	k4101.Name = "K-4101"

	cp, gamma, n, out := 1005.0, 1.4, 2, 305.0
	air := service.GasInput{Model: "ideal-constant", Cp: &cp, Gamma: &gamma, Service: "air"}
	p2, mdot := 3e5, 4.0
	sec, err := svc.SizeSection(context.Background(), service.SectionDuty{
		StageDuty:  service.StageDuty{Gas: air, SuctionPressure: 1e5, SuctionTemperature: 300, DischargePressure: &p2, MassFlow: &mdot},
		StageCount: &n, Arrangement: "inline",
		Intercooling: &service.Intercooling{OutletTemperature: &out, PressureDrop: 0.1e5}})
	require.NoError(t, err)
	section := machineSpecOf(sec.Machine)
	section.Name = "K-2201"
	return map[string]MachineSpec{"kestrel-k4101-": k4101, "kestrel-air-section-": section}
}

// TestCheckDemoMachinesAreTheSizings: every demo check carries the machine
// its sizing answers (the asset system's stored copy is the design
// answer, unchanged), except that kestrel-k4101-no-range-no-driver leaves
// out the speed range and driver. STAGEWRIGHT_WRITE_CHECKS=1 rewrites the
// machines of the inputs (then run go test ./api -run Golden -update).
func TestCheckDemoMachinesAreTheSizings(t *testing.T) {
	machines := demoMachines(t)
	inputs, err := filepath.Glob(filepath.Join(checksDir, "*.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, inputs)
	for _, in := range inputs {
		name := strings.TrimSuffix(filepath.Base(in), ".in.json")
		var m MachineSpec
		ok := false
		for prefix, mm := range machines {
			if strings.HasPrefix(name, prefix) {
				m, ok = mm, true
			}
		}
		if !ok {
			continue
		}
		if name == "kestrel-k4101-no-range-no-driver" {
			m.SpeedRange, m.Driver = nil, nil
		}
		raw, err := os.ReadFile(in)
		require.NoError(t, err)
		var doc struct {
			Machine  json.RawMessage  `json:"machine"`
			Duty     json.RawMessage  `json:"duty"`
			Baseline *json.RawMessage `json:"baseline,omitempty"`
		}
		require.NoError(t, json.Unmarshal(raw, &doc))
		want, err := json.Marshal(m)
		require.NoError(t, err)
		if os.Getenv("STAGEWRIGHT_WRITE_CHECKS") == "1" {
			doc.Machine = want
			b, err := json.Marshal(doc)
			require.NoError(t, err)
			var pretty bytes.Buffer
			require.NoError(t, json.Indent(&pretty, b, "", "  "))
			pretty.WriteByte('\n')
			require.NoError(t, os.WriteFile(in, pretty.Bytes(), 0o644))
			continue
		}
		var w, g any
		require.NoError(t, json.Unmarshal(want, &w))
		require.NoError(t, json.Unmarshal(doc.Machine, &g))
		assert.True(t, closeJSON(w, g), "%s: the stored machine is not the sizing's answer; STAGEWRIGHT_WRITE_CHECKS=1 go test ./api -run TestCheckDemoMachines", name)
	}
}

// closeJSON compares decoded JSON with numbers to 1e-9 relative.
func closeJSON(a, b any) bool {
	switch x := a.(type) {
	case float64:
		y, ok := b.(float64)
		d := x - y
		if d < 0 {
			d = -d
		}
		s := x
		if s < 0 {
			s = -s
		}
		return ok && d <= 1e-9*s+1e-12
	case map[string]any:
		y, ok := b.(map[string]any)
		if !ok || len(x) != len(y) {
			return false
		}
		for k, v := range x {
			if !closeJSON(v, y[k]) {
				return false
			}
		}
		return true
	case []any:
		y, ok := b.([]any)
		if !ok || len(x) != len(y) {
			return false
		}
		for i := range x {
			if !closeJSON(x[i], y[i]) {
				return false
			}
		}
		return true
	}
	ab, _ := json.Marshal(a)
	bb, _ := json.Marshal(b)
	return bytes.Equal(ab, bb)
}
