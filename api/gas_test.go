package api_test

import (
	"encoding/json"
	"net/http"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestBinaryInteractionProblems: every wrong kij override is a client error
// pointing into gas.binary_interaction, never a 500.
func TestBinaryInteractionProblems(t *testing.T) {
	h := newRouter(t)
	cases := []struct {
		name, gas string
		status    int
		pointer   string
	}{
		{"pair of one", `{"model":"peng-robinson","composition":{"CH4":1},"binary_interaction":[{"pair":["CH4"],"kij":0.1}]}`, 400, "/gas/binary_interaction/0/pair"},
		{"unknown component", `{"model":"peng-robinson","composition":{"CH4":0.5,"CO2":0.5},"binary_interaction":[{"pair":["CH4","xenonite"],"kij":0.1}]}`, 400, "/gas/binary_interaction/0/pair"},
		{"kij out of range", `{"model":"peng-robinson","composition":{"CH4":0.5,"CO2":0.5},"binary_interaction":[{"pair":["CH4","CO2"],"kij":5}]}`, 422, "/gas/binary_interaction/0"},
		{"kij for the ideal model", `{"model":"ideal","composition":{"CH4":0.5,"CO2":0.5},"binary_interaction":[{"pair":["CH4","CO2"],"kij":0.1}]}`, 422, "/gas/binary_interaction"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			rec := do(h, http.MethodPost, "/v1/gas/properties", `{"gas":`+tc.gas+`,"temperature":300,"pressure":1e5}`)
			require.Equal(t, tc.status, rec.Code, rec.Body.String())
			assert.Equal(t, "application/problem+json", rec.Header().Get("Content-Type"))
			var p struct {
				Errors []struct {
					Pointer string `json:"pointer"`
				} `json:"errors"`
			}
			require.NoError(t, json.Unmarshal(rec.Body.Bytes(), &p))
			require.NotEmpty(t, p.Errors)
			assert.Equal(t, tc.pointer, p.Errors[0].Pointer)
		})
	}
	// a valid override is accepted (CH4/CO2 kij in the range of published PR values, from memory)
	rec := do(h, http.MethodPost, "/v1/gas/properties",
		`{"gas":{"model":"peng-robinson","composition":{"CH4":0.5,"CO2":0.5},"binary_interaction":[{"pair":["CH4","CO2"],"kij":0.1}]},"temperature":300,"pressure":1e5}`)
	require.Equal(t, http.StatusOK, rec.Code, rec.Body.String())
}
