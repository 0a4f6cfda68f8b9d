package api_test

import (
	"encoding/json"
	"net/http"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The kij a cubic model uses are reported (issue 12): the catalogue lists
// the built-in tables with their sources, and a properties answer lists
// every pair of its gas with the value used and where it comes from.
func TestInteractionParametersReported(t *testing.T) {
	h := newRouter(t)
	w := do(h, http.MethodGet, "/v1/gas/components", "")
	require.Equal(t, http.StatusOK, w.Code)
	var cat struct {
		BinaryInteraction []struct {
			Model  string   `json:"model"`
			Pair   []string `json:"pair"`
			Kij    float64  `json:"kij"`
			Source string   `json:"source"`
		} `json:"binary_interaction"`
		HandOver string `json:"heat_capacity_hand_over"`
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &cat))
	found := false
	for _, k := range cat.BinaryInteraction {
		assert.NotEmpty(t, k.Source)
		if k.Model == "peng-robinson" && k.Pair[0] == "nitrogen" && k.Pair[1] == "propane" {
			found = true
			assert.InDelta(t, 0.0852, k.Kij, 1e-12) // Knapp et al. (1982), from memory
		}
	}
	assert.True(t, found, "N2-C3H8 is in the table")
	assert.Contains(t, cat.HandOver, "continuous")

	body := `{"gas": {"model": "peng-robinson", "composition": {"CH4": 0.9, "C3H8": 0.05, "N2": 0.05},
		"binary_interaction": [{"pair": ["CH4", "N2"], "kij": 0.03}]}, "temperature": 300, "pressure": 5000000}`
	w = do(h, http.MethodPost, "/v1/gas/properties", body)
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	var props struct {
		Provenance struct {
			BinaryInteraction []struct {
				Pair   []string `json:"pair"`
				Kij    float64  `json:"kij"`
				Source string   `json:"source"`
			} `json:"binary_interaction"`
		} `json:"provenance"`
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &props))
	got := map[string]float64{}
	src := map[string]string{}
	for _, k := range props.Provenance.BinaryInteraction {
		got[k.Pair[0]+"/"+k.Pair[1]], got[k.Pair[1]+"/"+k.Pair[0]] = k.Kij, k.Kij
		src[k.Pair[0]+"/"+k.Pair[1]], src[k.Pair[1]+"/"+k.Pair[0]] = k.Source, k.Source
	}
	require.Len(t, props.Provenance.BinaryInteraction, 3)
	assert.InDelta(t, 0.03, got["methane/nitrogen"], 1e-12)
	assert.Equal(t, "given in the request", src["methane/nitrogen"])
	assert.InDelta(t, 0.0852, got["propane/nitrogen"], 1e-12)
	assert.InDelta(t, 0, got["methane/propane"], 1e-12)
	assert.Contains(t, src["methane/propane"], "kij = 0")

	// the ideal model has no kij and reports none
	w = do(h, http.MethodPost, "/v1/gas/properties", `{"gas": {"model": "ideal", "composition": {"CH4": 1}}, "temperature": 300, "pressure": 100000}`)
	require.Equal(t, http.StatusOK, w.Code)
	assert.NotContains(t, w.Body.String(), "binary_interaction")
}
