package api_test

import (
	"net/http"
	"testing"

	"github.com/stretchr/testify/require"
)

const sectionsDir = "../testdata/sections"

// TestGoldenSections posts every testdata/sections/NAME.in.json to
// /v1/section/size and compares the 200 answer with NAME.golden.json.
func TestGoldenSections(t *testing.T) {
	runGoldensAt(t, sectionsDir, "/v1/section/size", func(t *testing.T, code int, body []byte) {
		require.Equal(t, http.StatusOK, code, "a demo section must size: %s", body)
	})
}
