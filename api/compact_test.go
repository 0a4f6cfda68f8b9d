package api_test

import (
	"encoding/json"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// fullMinusProse is the full answer without what the compact view leaves
// out: the limit table's quantity, unit and basis, the warnings' message,
// unit and basis, the provenance's methods, defaults and kij table, the cautions.
func fullMinusProse(t *testing.T, full []byte) map[string]any {
	var m map[string]any
	require.NoError(t, json.Unmarshal(full, &m))
	delete(m, "cautions")
	delete(m, "machine")
	prov := m["provenance"].(map[string]any)
	delete(prov, "methods")
	delete(prov, "defaults_applied")
	delete(prov, "binary_interaction")
	for _, l := range m["limits"].([]any) {
		for _, k := range []string{"quantity", "unit", "basis"} {
			delete(l.(map[string]any), k)
		}
	}
	for _, w := range m["warnings"].([]any) {
		for _, k := range []string{"message", "unit", "basis"} {
			delete(w.(map[string]any), k)
		}
	}
	return m
}

// TestCompactView: for every demo duty the compact answer (checked
// against its schema by the contract check) is exactly the full answer
// without the prose, and under 60 % of its size (about half); a faulty duty gets the
// same problem as on the full route.
func TestCompactView(t *testing.T) {
	h := newRouter(t)
	files, err := filepath.Glob(filepath.Join(stagesDir, "*.in.json"))
	require.NoError(t, err)
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			body, err := os.ReadFile(f)
			require.NoError(t, err)
			full := do(h, http.MethodPost, "/v1/stage/size", string(body))
			require.Equal(t, http.StatusOK, full.Code)
			compact := do(h, http.MethodPost, "/v1/stage/size/compact", string(body))
			require.Equal(t, http.StatusOK, compact.Code, compact.Body.String())
			assert.Equal(t, "application/json; charset=utf-8", compact.Header().Get("Content-Type"))
			want, err := json.Marshal(fullMinusProse(t, full.Body.Bytes()))
			require.NoError(t, err)
			assert.JSONEq(t, string(want), compact.Body.String())
			assert.Less(t, compact.Body.Len(), full.Body.Len()*6/10, "compact %d bytes, full %d", compact.Body.Len(), full.Body.Len())
			assert.NotContains(t, compact.Body.String(), "manufacturer", "no cautions text")
		})
	}
	impossible := duty(t, demoDuty, set("efficiency.polytropic", 1.2))
	full := do(h, http.MethodPost, "/v1/stage/size", impossible)
	compact := do(h, http.MethodPost, "/v1/stage/size/compact", impossible)
	require.Equal(t, http.StatusUnprocessableEntity, compact.Code)
	assert.Equal(t, full.Header().Get("Content-Type"), compact.Header().Get("Content-Type"))
}

// TestCompactBatch: the compact batch answers, item by item, what the
// compact single route answers (JSON document and NDJSON).
func TestCompactBatch(t *testing.T) {
	h := newRouter(t)
	impossible := duty(t, demoDuty, set("efficiency.polytropic", 1.2))
	body := `{"duties":[` + demoDuty + `,` + impossible + `]}`
	w := do(h, http.MethodPost, "/v1/stage/size/batch/compact", body)
	require.Equal(t, http.StatusOK, w.Code, w.Body.String())
	var out struct {
		Results []struct {
			Index   int
			Status  int
			Result  json.RawMessage
			Problem json.RawMessage
		}
		Succeeded, Failed int
	}
	require.NoError(t, json.Unmarshal(w.Body.Bytes(), &out))
	require.Len(t, out.Results, 2)
	assert.Equal(t, 1, out.Succeeded)
	assert.Equal(t, 1, out.Failed)
	single := do(h, http.MethodPost, "/v1/stage/size/compact", demoDuty)
	assert.Equal(t, single.Body.String(), string(out.Results[0].Result), "the same bytes as the single compact answer")
	assert.Equal(t, http.StatusUnprocessableEntity, out.Results[1].Status)
	assert.NotEmpty(t, out.Results[1].Problem)

	nd := send(plainRouter(t), request(http.MethodPost, "/v1/stage/size/batch/compact", body, "Accept", "application/x-ndjson"))
	require.Equal(t, http.StatusOK, nd.Code)
	lines := strings.Split(strings.TrimSuffix(nd.Body.String(), "\n"), "\n")
	require.Len(t, lines, 2)
	assert.Contains(t, lines[0], single.Body.String())
}
