package api_test

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/openapi/client"
)

const checksDir = "../testdata/checks"

// TestGoldenChecks posts every testdata/checks/NAME.in.json (a machine of
// the invented Kestrel Ridge plant, sized once, and a duty) to
// /v1/machine/check and compares the answer with NAME.golden.json. The
// demo covers each verdict; a wet suction is a 422.
func TestGoldenChecks(t *testing.T) {
	runGoldensAt(t, checksDir, "/v1/machine/check", func(t *testing.T, code int, body []byte) {
		require.Contains(t, []int{http.StatusOK, http.StatusUnprocessableEntity}, code, "%s", body)
	})
}

type machineCheckAnswer struct {
	Verdict string `json:"verdict"`
	Reasons []struct {
		Code    string  `json:"code"`
		Message string  `json:"message"`
		Value   float64 `json:"value"`
		Limit   float64 `json:"limit"`
	} `json:"reasons"`
	OperatingPoint struct {
		Speed float64 `json:"speed"`
		Flow  struct {
			ActualVolume float64 `json:"actual_volume"`
		} `json:"flow"`
		Discharge struct {
			Pressure float64 `json:"pressure"`
		} `json:"discharge"`
		Surge struct {
			Flow        float64 `json:"flow"`
			ControlFlow float64 `json:"control_flow"`
		} `json:"surge"`
		Choke struct {
			Stage int `json:"stage"`
		} `json:"choke"`
		Stages []json.RawMessage `json:"stages"`
	} `json:"operating_point"`
	BaselinePoint struct {
		Speed float64 `json:"speed"`
	} `json:"baseline_point"`
	Recycle *struct {
		Mass float64 `json:"mass"`
	} `json:"recycle"`
	Throttling *struct {
		SuctionPressure float64 `json:"suction_pressure"`
	} `json:"throttling"`
	Margins []struct {
		Code string  `json:"code"`
		B    float64 `json:"before"`
		A    float64 `json:"after"`
	} `json:"margins"`
	SpeedRange struct {
		Minimum           float64 `json:"minimum"`
		MaximumContinuous float64 `json:"maximum_continuous"`
	} `json:"speed_range"`
	Provenance struct {
		Defaults []struct {
			Field string `json:"field"`
		} `json:"defaults_applied"`
	} `json:"provenance"`
}

func postCheck(t *testing.T, h http.Handler, name string) (int, machineCheckAnswer, []byte) {
	t.Helper()
	body, err := os.ReadFile(filepath.Join(checksDir, name+".in.json"))
	require.NoError(t, err)
	w := do(h, http.MethodPost, "/v1/machine/check", string(body))
	var a machineCheckAnswer
	if w.Code == http.StatusOK {
		require.NoError(t, json.Unmarshal(w.Body.Bytes(), &a))
	}
	return w.Code, a, w.Body.Bytes()
}

// The demo checks say what issue 11 asks of each verdict (the physics is
// checked in service/check_test.go; here the answers as a client sees them).
func TestCheckDemoVerdicts(t *testing.T) {
	h := newRouter(t)
	code, own, _ := postCheck(t, h, "kestrel-k4101-own-duty")
	require.Equal(t, http.StatusOK, code)
	assert.Equal(t, "fits", own.Verdict)
	for _, m := range own.Margins {
		assert.InDelta(t, m.B, m.A, 1e-6*max(1, abs(m.B)), m.Code)
	}

	_, more, _ := postCheck(t, h, "kestrel-k4101-more-flow")
	assert.Equal(t, "fits", more.Verdict)
	assert.Greater(t, more.OperatingPoint.Speed, more.BaselinePoint.Speed)

	_, low, _ := postCheck(t, h, "kestrel-k4101-low-flow")
	assert.Equal(t, "fits-with-recycle", low.Verdict)
	require.NotNil(t, low.Recycle)
	assert.InEpsilon(t, low.OperatingPoint.Surge.ControlFlow, low.OperatingPoint.Flow.ActualVolume, 1e-4, "on the control line")

	_, above, _ := postCheck(t, h, "kestrel-k4101-far-above")
	assert.Equal(t, "does-not-fit", above.Verdict)
	require.NotEmpty(t, above.Reasons)
	assert.Equal(t, "choke", above.Reasons[0].Code)

	_, light, _ := postCheck(t, h, "kestrel-k4101-lighter-gas")
	assert.Greater(t, light.OperatingPoint.Speed, light.BaselinePoint.Speed)

	_, cold, _ := postCheck(t, h, "kestrel-k4101-cold-suction")
	assert.Equal(t, "fits-with-throttling", cold.Verdict)
	require.NotNil(t, cold.Throttling)
	assert.InEpsilon(t, cold.SpeedRange.Minimum, cold.OperatingPoint.Speed, 1e-9)

	_, bare, _ := postCheck(t, h, "kestrel-k4101-no-range-no-driver")
	fields := map[string]bool{}
	for _, d := range bare.Provenance.Defaults {
		fields[d.Field] = true
	}
	assert.True(t, fields["machine.speed_range"] && fields["machine.driver.rating"], "%v", fields)

	code, _, body := postCheck(t, h, "kestrel-k4101-wet-suction")
	require.Equal(t, http.StatusUnprocessableEntity, code)
	var p struct {
		Errors []struct{ Pointer string } `json:"errors"`
	}
	require.NoError(t, json.Unmarshal(body, &p))
	require.NotEmpty(t, p.Errors)
	assert.Equal(t, "/duty/suction/temperature", p.Errors[0].Pointer)

	_, sec, _ := postCheck(t, h, "kestrel-air-section-own-duty")
	assert.Equal(t, "fits", sec.Verdict)
	assert.Len(t, sec.OperatingPoint.Stages, 2)
	_, secMore, _ := postCheck(t, h, "kestrel-air-section-more-flow")
	assert.Equal(t, "does-not-fit", secMore.Verdict)
	named := false
	for _, r := range secMore.Reasons {
		named = named || (r.Code == "choke" && strings.Contains(r.Message, "stage "))
	}
	assert.True(t, named, "the stage that chokes first is named: %+v", secMore.Reasons)
}

func abs(v float64) float64 {
	if v < 0 {
		return -v
	}
	return v
}

// A batch with one broken check answers the others, in order; a check of
// the wrong shape rejects the batch with pointers under /checks/N.
func TestCheckBatch(t *testing.T) {
	h := newRouter(t)
	own, err := os.ReadFile(filepath.Join(checksDir, "kestrel-k4101-own-duty.in.json"))
	require.NoError(t, err)
	wet, err := os.ReadFile(filepath.Join(checksDir, "kestrel-k4101-wet-suction.in.json"))
	require.NoError(t, err)
	badUnit := strings.Replace(string(own), `"25 bara"`, `"25 parsecs"`, 1)
	body := `{"checks": [` + string(own) + `,` + string(wet) + `,` + badUnit + `,` + string(own) + `]}`
	w := do(h, http.MethodPost, "/v1/machine/check/batch", body)
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	var out struct {
		Results []struct {
			Index   int `json:"index"`
			Status  int `json:"status"`
			Result  *machineCheckAnswer
			Problem *struct {
				Errors []struct{ Pointer string } `json:"errors"`
			} `json:"problem"`
		} `json:"results"`
		Succeeded, Failed int
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &out))
	require.Len(t, out.Results, 4)
	assert.Equal(t, 2, out.Succeeded)
	assert.Equal(t, 2, out.Failed)
	for i, want := range []int{200, 422, 400, 200} {
		assert.Equal(t, i, out.Results[i].Index)
		assert.Equal(t, want, out.Results[i].Status, "item %d", i)
	}
	assert.Equal(t, "fits", out.Results[0].Result.Verdict)
	assert.Equal(t, "/checks/1/duty/suction/temperature", out.Results[1].Problem.Errors[0].Pointer)
	assert.Equal(t, "/checks/2/duty/suction/pressure", out.Results[2].Problem.Errors[0].Pointer)

	w = do(h, http.MethodPost, "/v1/machine/check/batch", `{"checks": [`+string(own)+`, {"machine": {"stages": []}, "duty": {}, "speed": 3}]}`)
	require.Equal(t, http.StatusBadRequest, w.Code)
	assert.Contains(t, w.Body.String(), `"/checks/1/`)
	w = do(h, http.MethodPost, "/v1/machine/check/batch", `{"checks": []}`)
	require.Equal(t, http.StatusBadRequest, w.Code)
}

// FuzzPostCheck drives /v1/machine/check with the plant-air section of the
// demo and arbitrary numbers for the duty (flow, suction state, discharge
// pressure) and the machine's frame (surge control margin, speed range,
// driver rating): never a 5xx, always JSON without NaN or Inf, a
// problem+json on every error, the contract on every exchange.
//
//	go test ./api -run '^$' -fuzz '^FuzzPostCheck$' -fuzztime 60s
func FuzzPostCheck(f *testing.F) {
	raw, err := os.ReadFile(filepath.Join(checksDir, "kestrel-air-section-own-duty.in.json"))
	if err != nil {
		f.Fatal(err)
	}
	var req map[string]any
	if err := json.Unmarshal(raw, &req); err != nil {
		f.Fatal(err)
	}
	f.Add(4.0, 1e5, 300.0, 3e5, 0.1, 10000.0, 16000.0, 8e5)
	f.Add(10.0, 1e5, 300.0, 3e5, 0.1, 10000.0, 16000.0, 8e5)
	f.Add(1.0, 1e5, 300.0, 3e5, 0.1, 10000.0, 16000.0, 8e5)
	f.Add(4.0, 1.2e5, 250.0, 1.5e5, 0.0, 14000.0, 14001.0, 1.0)
	f.Add(4.0, 1e5, 300.0, 3e7, 0.5, 1.0, 1e9, 1e12)
	f.Add(-1.0, 0.0, -5.0, math.NaN(), -1.0, 0.0, -1.0, 0.0)
	h := plainRouter(f)
	k := servedContract(f, h)
	f.Fuzz(func(t *testing.T, mass, p1, t1, p2, margin, nmin, nmax, rating float64) {
		num := func(v float64) any {
			if math.IsNaN(v) || math.IsInf(v, 0) {
				return "nan" // a string that is no quantity: a 400
			}
			return v
		}
		m := req["machine"].(map[string]any)
		m["surge_control"] = map[string]any{"margin": num(margin)}
		m["speed_range"] = map[string]any{"minimum": num(nmin), "maximum_continuous": num(nmax)}
		m["driver"] = map[string]any{"rating": num(rating)}
		d := req["duty"].(map[string]any)
		d["flow"] = map[string]any{"mass": num(mass)}
		d["suction"] = map[string]any{"pressure": num(p1), "temperature": num(t1)}
		d["discharge_pressure"] = num(p2)
		body, err := json.Marshal(req)
		if err != nil {
			t.Skip()
		}
		w := fuzzExchange(t, h, k, http.MethodPost, "/v1/machine/check", body)
		checkAnswer(t, w.Code, w.Header().Get("Content-Type"), w.Body.Bytes(), stageErrors)
	})
}

// BenchmarkPostCheck: one POST /v1/machine/check of K-4101 (one stage,
// Peng-Robinson) at 5 % more flow, through the router.
func BenchmarkPostCheck(b *testing.B) {
	body, err := os.ReadFile(filepath.Join(checksDir, "kestrel-k4101-more-flow.in.json"))
	if err != nil {
		b.Fatal(err)
	}
	benchRequest(b, http.MethodPost, "/v1/machine/check", body, http.StatusOK)
}

// BenchmarkPostCheckBatch200: one POST /v1/machine/check/batch of 200
// K-4101 checks (its demo duties in turn: own, more, low, lighter gas,
// cold suction, far above), parallel over the cores.
func BenchmarkPostCheckBatch200(b *testing.B) {
	var items []string
	for _, n := range []string{"own-duty", "more-flow", "low-flow", "lighter-gas", "cold-suction", "far-above"} {
		body, err := os.ReadFile(filepath.Join(checksDir, "kestrel-k4101-"+n+".in.json"))
		if err != nil {
			b.Fatal(err)
		}
		items = append(items, string(body))
	}
	var all []string
	for i := range 200 {
		all = append(all, items[i%len(items)])
	}
	benchRequest(b, http.MethodPost, "/v1/machine/check/batch", []byte(`{"checks": [`+strings.Join(all, ",")+`]}`), http.StatusOK)
}

// TestCheckDemoMachineFromStageSize: the asset system's stored K-4101 is
// the machine /v1/stage/size answers for kestrel-k4101.size.json (sized
// once; the stored copy adds only its tag name).
func TestCheckDemoMachineFromStageSize(t *testing.T) {
	h := newRouter(t)
	size, err := os.ReadFile(filepath.Join(checksDir, "kestrel-k4101.size.json"))
	require.NoError(t, err)
	w := do(h, http.MethodPost, "/v1/stage/size", string(size))
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	var sized struct {
		Machine map[string]any `json:"machine"`
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &sized))
	require.NotNil(t, sized.Machine)
	in, err := os.ReadFile(filepath.Join(checksDir, "kestrel-k4101-own-duty.in.json"))
	require.NoError(t, err)
	var stored struct {
		Machine map[string]any `json:"machine"`
	}
	require.NoError(t, json.Unmarshal(in, &stored))
	assert.Equal(t, "K-4101", stored.Machine["name"])
	delete(stored.Machine, "name")
	delete(sized.Machine, "name")
	want, err := json.Marshal(sized.Machine)
	require.NoError(t, err)
	got, err := json.Marshal(stored.Machine)
	require.NoError(t, err)
	assertJSONClose(t, want, got)
}

// TestGeneratedClientChecksTheDemo: each 200 demo check is read into the
// generated request type, sent with the typed call, and answers as the
// raw bytes do; the verdict is one of the four.
func TestGeneratedClientChecksTheDemo(t *testing.T) {
	c := liveClient(t)
	ctx := context.Background()
	for _, name := range []string{"kestrel-k4101-more-flow", "kestrel-air-section-own-duty", "kestrel-air-section-more-flow"} {
		t.Run(name, func(t *testing.T) {
			raw, err := os.ReadFile(filepath.Join(checksDir, name+".in.json"))
			require.NoError(t, err)
			var req client.ApiMachineCheckRequest
			require.NoError(t, json.Unmarshal(raw, &req))
			typed, err := c.CheckMachineWithResponse(ctx, req)
			require.NoError(t, err)
			require.Equal(t, http.StatusOK, typed.StatusCode(), string(typed.Body))
			require.NotNil(t, typed.JSON200)
			assert.True(t, typed.JSON200.Verdict.Valid(), "verdict %q", typed.JSON200.Verdict)
			bare, err := c.CheckMachineWithBodyWithResponse(ctx, "application/json", bytes.NewReader(raw))
			require.NoError(t, err)
			require.Equal(t, http.StatusOK, bare.StatusCode())
			var a, b map[string]any
			require.NoError(t, json.Unmarshal(bare.Body, &a))
			require.NoError(t, json.Unmarshal(typed.Body, &b))
			// The input hash covers the request as sent; everything else must agree.
			delete(a["provenance"].(map[string]any), "input_hash")
			delete(b["provenance"].(map[string]any), "input_hash")
			ja, _ := json.Marshal(a)
			jb, _ := json.Marshal(b)
			assertJSONClose(t, ja, jb)
		})
	}
}
