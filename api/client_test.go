package api_test

import (
	"bytes"
	"context"
	"encoding/json"
	"math"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api"
	"stagewright/openapi"
	"stagewright/openapi/client"
	"stagewright/service"
)

// liveClient starts the real router over the real service on a loopback
// port (httptest.NewServer listens on 127.0.0.1) and returns the client
// that oapi-codegen generated from the served document.
func liveClient(t *testing.T) *client.ClientWithResponses {
	t.Helper()
	srv := httptest.NewServer(plainRouter(t))
	t.Cleanup(srv.Close)
	require.True(t, strings.HasPrefix(srv.URL, "http://127.0.0.1:"), srv.URL)
	c, err := client.NewClientWithResponses(srv.URL, client.WithHTTPClient(srv.Client()))
	require.NoError(t, err)
	return c
}

func finitePositive(t *testing.T, name string, v float64) {
	t.Helper()
	assert.False(t, math.IsNaN(v) || math.IsInf(v, 0), "%s = %v", name, v)
	assert.Greater(t, v, 0.0, name)
}

// TestGeneratedClientSizesTheDemoDuties: each demo duty is read into the
// generated request type (numbers and strings with units go through the
// generated number|string unions), sent with the typed call, and the typed
// answer agrees with the answer to the raw bytes.
func TestGeneratedClientSizesTheDemoDuties(t *testing.T) {
	c := liveClient(t)
	ctx := context.Background()
	files, err := filepath.Glob(filepath.Join(stagesDir, "*.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, files)
	for _, name := range files {
		t.Run(filepath.Base(name), func(t *testing.T) {
			raw, err := os.ReadFile(name)
			require.NoError(t, err)
			var req client.ApiStageRequest
			require.NoError(t, json.Unmarshal(raw, &req))

			typed, err := c.SizeStageWithResponse(ctx, req)
			require.NoError(t, err)
			require.Equal(t, http.StatusOK, typed.StatusCode(), string(typed.Body))
			require.NotNil(t, typed.JSON200)
			out := typed.JSON200
			// Speed comes back as given, in rev/min: compare with the duty's own
			// value when it is a number (a duty may leave the speed to the service).
			if req.Speed != nil {
				if n, err := req.Speed.AsApiStageRequestSpeed0(); err == nil {
					assert.InDelta(t, n, out.Speed, 1e-9*n)
				}
			}
			finitePositive(t, "speed", out.Speed)
			finitePositive(t, "geometry.tip_diameter", out.Geometry.TipDiameter)
			finitePositive(t, "power.shaft", out.Power.Shaft)
			// D2 = 60 U2 / (π N) (definition of tip speed): a stage of this service is
			// between a few centimetres and the 4 m the service accepts.
			assert.Less(t, out.Geometry.TipDiameter, 4.0)
			assert.True(t, out.Verdict.Valid(), "verdict %q", out.Verdict)
			assert.NotEmpty(t, out.Cautions)

			bare, err := c.SizeStageWithBodyWithResponse(ctx, "application/json", bytes.NewReader(raw))
			require.NoError(t, err)
			require.Equal(t, http.StatusOK, bare.StatusCode())
			assert.JSONEq(t, string(bare.Body), string(typed.Body), "the typed request lost or changed a field of %s", name)
		})
	}
}

// TestGeneratedClientReadsProblems: the error duties of testdata/problems
// parse into the generated Problem type under the status they carry.
func TestGeneratedClientReadsProblems(t *testing.T) {
	c := liveClient(t)
	ctx := context.Background()
	files, err := filepath.Glob(filepath.Join(problemsDir, "*.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, files)
	seen := map[int]bool{}
	for _, name := range files {
		t.Run(filepath.Base(name), func(t *testing.T) {
			raw, err := os.ReadFile(name)
			require.NoError(t, err)
			res, err := c.SizeStageWithBodyWithResponse(ctx, "application/json", bytes.NewReader(raw))
			require.NoError(t, err)
			var p *client.ApiProblem
			switch res.StatusCode() {
			case http.StatusBadRequest:
				p = res.ApplicationproblemJSON400
			case http.StatusUnprocessableEntity:
				p = res.ApplicationproblemJSON422
			default:
				t.Fatalf("status %d: %s", res.StatusCode(), res.Body)
			}
			require.NotNil(t, p, "problem not parsed: %s", res.Body)
			seen[res.StatusCode()] = true
			assert.Equal(t, res.StatusCode(), p.Status)
			assert.True(t, strings.HasPrefix(p.Type, problemBase), p.Type)
			assert.NotEmpty(t, p.Title)
			assert.Nil(t, res.JSON200)
		})
	}
	assert.True(t, seen[400] && seen[422], "the problem duties cover 400 and 422: %v", seen)

	// a typed request the server refuses as impossible: polytropic efficiency above 1
	var req client.ApiStageRequest
	require.NoError(t, json.Unmarshal([]byte(demoDuty), &req))
	eta := 1.2
	req.Efficiency.Polytropic = &eta
	res, err := c.SizeStageWithResponse(ctx, req)
	require.NoError(t, err)
	require.Equal(t, http.StatusUnprocessableEntity, res.StatusCode(), string(res.Body))
	require.NotNil(t, res.ApplicationproblemJSON422)
	require.NotNil(t, res.ApplicationproblemJSON422.Errors)
	assert.Equal(t, "/efficiency/polytropic", (*res.ApplicationproblemJSON422.Errors)[0].Pointer)
}

// TestGeneratedClientOtherOperations: batch, gas properties, the catalogue
// and the health probe through the generated client.
func TestGeneratedClientOtherOperations(t *testing.T) {
	c := liveClient(t)
	ctx := context.Background()

	var good, bad client.ApiStageRequest
	require.NoError(t, json.Unmarshal([]byte(demoDuty), &good))
	require.NoError(t, json.Unmarshal([]byte(demoDuty), &bad))
	slip := 1.5 // a slip factor above 1 is impossible (definition: 1 − slip velocity / tip speed)
	bad.Impeller.SlipFactor = &slip
	batch, err := c.SizeStageBatchWithResponse(ctx, client.ApiBatchRequest{Duties: []client.ApiStageRequest{good, bad}})
	require.NoError(t, err)
	require.Equal(t, http.StatusOK, batch.StatusCode(), string(batch.Body))
	require.NotNil(t, batch.JSON200)
	require.Len(t, batch.JSON200.Results, 2)
	assert.Equal(t, 1, batch.JSON200.Succeeded)
	assert.Equal(t, 1, batch.JSON200.Failed)
	require.NotNil(t, batch.JSON200.Results[0].Result)
	finitePositive(t, "results[0].geometry.tip_diameter", batch.JSON200.Results[0].Result.Geometry.TipDiameter)
	assert.Equal(t, http.StatusUnprocessableEntity, batch.JSON200.Results[1].Status)
	require.NotNil(t, batch.JSON200.Results[1].Problem)

	// dry air at 300 K and 1 bar: Z within 0.001 of 1 and ρ = pM/(ZRT) ≈ 1.16 kg/m3
	// (ideal-gas law with M = 28.96 g/mol; from memory).
	var props client.ApiPropertiesRequest
	require.NoError(t, json.Unmarshal([]byte(`{"gas":{"model":"peng-robinson","composition":{"air":1}},"temperature":"26.85 degC","pressure":"1 bara"}`), &props))
	pr, err := c.GasPropertiesWithResponse(ctx, props)
	require.NoError(t, err)
	require.Equal(t, http.StatusOK, pr.StatusCode(), string(pr.Body))
	require.NotNil(t, pr.JSON200)
	assert.InDelta(t, 1.0, pr.JSON200.Compressibility, 1e-3)
	assert.InDelta(t, 1.16, pr.JSON200.Density, 0.01)
	assert.InDelta(t, 300.0, pr.JSON200.Temperature, 1e-9)

	props.Temperature = client.ApiPropertiesRequest_Temperature{}
	require.NoError(t, props.Temperature.FromApiPropertiesRequestTemperature1("-300 degC"))
	pr, err = c.GasPropertiesWithResponse(ctx, props)
	require.NoError(t, err)
	require.Equal(t, http.StatusBadRequest, pr.StatusCode(), string(pr.Body))
	require.NotNil(t, pr.ApplicationproblemJSON400)
	require.NotNil(t, pr.ApplicationproblemJSON400.Errors)
	assert.Equal(t, "/temperature", (*pr.ApplicationproblemJSON400.Errors)[0].Pointer)

	comps, err := c.GasComponentsWithResponse(ctx)
	require.NoError(t, err)
	require.Equal(t, http.StatusOK, comps.StatusCode())
	require.NotNil(t, comps.JSON200)
	require.NotEmpty(t, comps.JSON200.Components)
	ids := map[string]client.ApiComponentOut{}
	for _, co := range comps.JSON200.Components {
		ids[co.Id] = co
	}
	require.Contains(t, ids, "methane")
	// methane: M = 16.04 g/mol, Tc = 190.6 K (NIST Chemistry WebBook; from memory)
	assert.InDelta(t, 0.01604, ids["methane"].MolarMass, 1e-4)
	assert.InDelta(t, 190.6, ids["methane"].CriticalTemperature, 0.5)
	assert.NotEmpty(t, comps.JSON200.Mixtures)

	h, err := c.HealthWithResponse(ctx)
	require.NoError(t, err)
	require.Equal(t, http.StatusOK, h.StatusCode())
	require.NotNil(t, h.JSON200)
	assert.Equal(t, "ok", h.JSON200.Status)
	assert.NotEmpty(t, h.JSON200.ModelVersion)
}

// TestGeneratedClientRatesTheDemoMachines: each demo machine rating is
// read into the generated request type, sent with the typed call, and the
// typed answer agrees with the answer to the raw bytes; a map comes back
// typed too.
func TestGeneratedClientRatesTheDemoMachines(t *testing.T) {
	c := liveClient(t)
	ctx := context.Background()
	files, err := filepath.Glob(filepath.Join(machinesDir, "*.rate.in.json"))
	require.NoError(t, err)
	require.NotEmpty(t, files)
	for _, name := range files {
		t.Run(filepath.Base(name), func(t *testing.T) {
			raw, err := os.ReadFile(name)
			require.NoError(t, err)
			var req client.ApiRateRequest
			require.NoError(t, json.Unmarshal(raw, &req))
			typed, err := c.RateMachineWithResponse(ctx, req)
			require.NoError(t, err)
			require.Equal(t, http.StatusOK, typed.StatusCode(), string(typed.Body))
			require.NotNil(t, typed.JSON200)
			out := typed.JSON200
			finitePositive(t, "speed", out.Speed)
			finitePositive(t, "discharge.pressure", out.Discharge.Pressure)
			finitePositive(t, "operating_point.surge_flow", out.OperatingPoint.SurgeFlow)
			assert.Less(t, out.OperatingPoint.SurgeFlow, out.OperatingPoint.ChokeFlow)
			bare, err := c.RateMachineWithBodyWithResponse(ctx, "application/json", bytes.NewReader(raw))
			require.NoError(t, err)
			require.Equal(t, http.StatusOK, bare.StatusCode())
			assert.JSONEq(t, string(bare.Body), string(typed.Body), "the typed request lost or changed a field of %s", name)
		})
	}
	raw, err := os.ReadFile(filepath.Join(machinesDir, "kestrel-regen-blower.map.in.json"))
	require.NoError(t, err)
	var mreq client.ApiMapRequest
	require.NoError(t, json.Unmarshal(raw, &mreq))
	m, err := c.MapMachineWithResponse(ctx, mreq)
	require.NoError(t, err)
	require.Equal(t, http.StatusOK, m.StatusCode(), string(m.Body))
	require.NotNil(t, m.JSON200)
	assert.Len(t, m.JSON200.SpeedLines, 5)
	assert.Len(t, m.JSON200.SurgeLine, 5)
}

// TestGeneratedClientSendsTheToken (issue 13, the contract): against a
// service configured with a token, the generated client with
// client.WithBearerToken is served on the /v1 operations the document
// marks with bearerAuth, and without it is refused 401; the open
// operations need no token.
func TestGeneratedClientSendsTheToken(t *testing.T) {
	const token = "kestrel-ridge-test-token"
	h, err := api.NewRouter(service.New(), api.Options{Spec: openapi.Swagger2(), Tokens: []string{token}})
	require.NoError(t, err)
	srv := httptest.NewServer(h)
	t.Cleanup(srv.Close)
	ctx := context.Background()

	with, err := client.NewClientWithResponses(srv.URL, client.WithHTTPClient(srv.Client()), client.WithBearerToken(token))
	require.NoError(t, err)
	comps, err := with.GasComponentsWithResponse(ctx)
	require.NoError(t, err)
	assert.Equal(t, http.StatusOK, comps.StatusCode(), string(comps.Body))

	without, err := client.NewClientWithResponses(srv.URL, client.WithHTTPClient(srv.Client()))
	require.NoError(t, err)
	comps, err = without.GasComponentsWithResponse(ctx)
	require.NoError(t, err)
	assert.Equal(t, http.StatusUnauthorized, comps.StatusCode())
	v, err := without.VersionWithResponse(ctx)
	require.NoError(t, err)
	assert.Equal(t, http.StatusOK, v.StatusCode(), "GET /version is open")
}
