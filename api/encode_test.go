package api

import (
	"encoding/json"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestAppendJSONIsEncodingJSON: the answer encoder writes encoding/json's
// bytes for what answers hold beyond the demo goldens: HTML characters,
// U+2028/U+2029, invalid UTF-8, control characters, and floats at the
// edges of the 'f' and 'e' forms (encoding/json: 'e' below 1e-6 and from
// 1e21, exponent without a leading zero), negative zero, subnormals, the
// largest float.
func TestAppendJSONIsEncodingJSON(t *testing.T) {
	lim := 1e-7
	n := 17
	values := []any{
		StageResponse{Verdict: "a<b & c>d", Cautions: []string{"\u2028 line \u2029 sep", "bad \xff utf-8", "tab\t\"quote\" \\ \x01"},
			Limits:   []LimitOut{{Rule: "r", Value: 1e21, Warning: 1e-6, Limit: &lim, Margin: math.Copysign(0, -1)}},
			Geometry: GeometryOut{BladeCount: &n}},
		[]float64{0, 1, -1, 0.1, 1.0 / 3, 1e20, 1e21, 123456789012345680000, 1e-6, 9.99999e-7, 5e-324, math.MaxFloat64,
			-math.SmallestNonzeroFloat64, 2.5e-8, 101325, 0.000123, 1.5e300},
		BatchItem{Index: 3, Status: 422, Problem: &Problem{Type: "about:blank", Title: "x", Status: 422, Detail: "<script>"}},
	}
	for _, v := range values {
		want, err := json.Marshal(v)
		require.NoError(t, err)
		enc, err := newAnswerEncoder()
		require.NoError(t, err)
		got, err := enc.encode(v)
		require.NoError(t, err)
		assert.Equal(t, string(want), string(*got))
	}
}
