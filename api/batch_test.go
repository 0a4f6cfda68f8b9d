package api_test

import (
	"encoding/json"
	"net/http"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestBatchSizesEachDutyAndKeepsOrder(t *testing.T) {
	h := newRouter(t)
	good := demoDuty
	impossible := duty(t, demoDuty, set("efficiency.polytropic", 1.2)) // 422 on its own
	body := `{"duties": [` + good + `,` + impossible + `,` + good + `]}`
	rec := do(h, http.MethodPost, "/v1/stage/size/batch", body)
	require.Equal(t, http.StatusOK, rec.Code, rec.Body.String())
	var out struct {
		Results []struct {
			Index   int             `json:"index"`
			Status  int             `json:"status"`
			Result  json.RawMessage `json:"result"`
			Problem *struct {
				Status int `json:"status"`
				Errors []struct {
					Pointer string `json:"pointer"`
				} `json:"errors"`
			} `json:"problem"`
		} `json:"results"`
		Succeeded, Failed int
	}
	require.NoError(t, json.Unmarshal(rec.Body.Bytes(), &out))
	require.Len(t, out.Results, 3)
	assert.Equal(t, 2, out.Succeeded)
	assert.Equal(t, 1, out.Failed)
	for i, r := range out.Results {
		assert.Equal(t, i, r.Index)
	}
	assert.Equal(t, http.StatusOK, out.Results[0].Status)
	assert.Equal(t, http.StatusUnprocessableEntity, out.Results[1].Status)
	require.NotNil(t, out.Results[1].Problem)
	assert.Equal(t, "/efficiency/polytropic", out.Results[1].Problem.Errors[0].Pointer)
	// a batch item answers exactly what the single endpoint answers
	single := postStage(h, good)
	assert.JSONEq(t, single.Body.String(), string(out.Results[0].Result))
	assert.JSONEq(t, string(out.Results[0].Result), string(out.Results[2].Result))
}

func TestBatchShapeErrorsPointIntoTheDuty(t *testing.T) {
	h := newRouter(t)
	typo := duty(t, demoDuty, rename("suction.pressure", "presure"))
	rec := do(h, http.MethodPost, "/v1/stage/size/batch", `{"duties": [`+demoDuty+`,`+typo+`]}`)
	require.Equal(t, http.StatusBadRequest, rec.Code)
	assert.Contains(t, rec.Body.String(), `"/duties/1/suction/presure"`)

	missing := duty(t, demoDuty, del("flow"))
	rec = do(h, http.MethodPost, "/v1/stage/size/batch", `{"duties": [`+missing+`]}`)
	require.Equal(t, http.StatusBadRequest, rec.Code)
	assert.Contains(t, rec.Body.String(), `"/duties/0/flow"`)

	rec = do(h, http.MethodPost, "/v1/stage/size/batch", `{"duties": []}`)
	require.Equal(t, http.StatusBadRequest, rec.Code)
	assert.Contains(t, rec.Body.String(), `"/duties"`)

	many := strings.Repeat(demoDuty+",", 500) + demoDuty
	rec = do(h, http.MethodPost, "/v1/stage/size/batch", `{"duties": [`+many+`]}`)
	require.Equal(t, http.StatusBadRequest, rec.Code, "501 duties exceed the batch limit")
	assert.Equal(t, "application/problem+json", rec.Header().Get("Content-Type"))
}

// TestEyeHubReportedForEveryAxialEye: an axial eye without a hub reports
// eye_hub_diameter 0, a radial inlet leaves it out (schema of GeometryOut).
func TestEyeHubReportedForEveryAxialEye(t *testing.T) {
	h := newRouter(t)
	var out struct {
		Geometry map[string]any `json:"geometry"`
	}
	rec := postStage(h, duty(t, demoDuty, set("impeller.inlet.hub_ratio", 0)))
	require.Equal(t, http.StatusOK, rec.Code, rec.Body.String())
	require.NoError(t, json.Unmarshal(rec.Body.Bytes(), &out))
	assert.Equal(t, 0.0, out.Geometry["eye_hub_diameter"])
	radial := duty(t, demoDuty, del("impeller.inlet.hub_ratio"), set("impeller.inlet.type", "radial"), set("impeller.inlet.diameter_ratio", 0.45))
	rec = postStage(h, radial)
	require.Equal(t, http.StatusOK, rec.Code, rec.Body.String())
	out.Geometry = nil
	require.NoError(t, json.Unmarshal(rec.Body.Bytes(), &out))
	_, has := out.Geometry["eye_hub_diameter"]
	assert.False(t, has)
}
