package api_test

import (
	"net/http"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"stagewright/api"
	"stagewright/openapi"
	"stagewright/service"
)

// TestDocsPage (issue 13, the contract's page): GET /docs leads to Swagger
// UI served from the gin-swagger module, reading the served /openapi.json
// (same origin), open without a token when the service has tokens; files
// that are not the reference's are a 404 problem. .ci/run loads the page
// in chromium and checks that it lists the operations.
func TestDocsPage(t *testing.T) {
	h, err := api.NewRouter(service.New(), api.Options{Spec: openapi.Swagger2(), Tokens: []string{"kestrel-ridge-test-token"}})
	require.NoError(t, err)

	w := do(h, http.MethodGet, "/docs", "")
	assert.Equal(t, http.StatusMovedPermanently, w.Code)
	assert.Equal(t, "/docs/index.html", w.Header().Get("Location"))
	w = do(h, http.MethodGet, "/docs/", "")
	assert.Equal(t, http.StatusMovedPermanently, w.Code)

	w = do(h, http.MethodGet, "/docs/index.html", "")
	require.Equal(t, http.StatusOK, w.Code)
	assert.Contains(t, w.Header().Get("Content-Type"), "text/html")
	assert.Contains(t, w.Body.String(), "swagger-ui-bundle.js")
	assert.Contains(t, w.Body.String(), "stagewright API reference")

	w = do(h, http.MethodGet, "/docs/swagger-initializer.js", "")
	require.Equal(t, http.StatusOK, w.Code)
	assert.Contains(t, w.Body.String(), `url: "/openapi.json"`, "the page reads the served document")
	assert.Contains(t, w.Body.String(), "validatorUrl: null", "no call to an outside validator")

	for _, f := range []string{"swagger-ui-bundle.js", "swagger-ui-standalone-preset.js", "swagger-ui.css", "index.css"} {
		w = do(h, http.MethodGet, "/docs/"+f, "")
		assert.Equal(t, http.StatusOK, w.Code, f)
		assert.Greater(t, w.Body.Len(), 100, f)
	}
	w = do(h, http.MethodGet, "/openapi.json", "")
	assert.Equal(t, http.StatusOK, w.Code, "the document is open too")

	for _, f := range []string{"/docs/doc.json", "/docs/../go.mod", "/docs/nothing.js"} {
		requireProblem(t, do(h, http.MethodGet, f, ""), http.StatusNotFound, "not-found")
	}
}
