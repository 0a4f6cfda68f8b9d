package api_test

import (
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"os"
	"strings"
	"testing"

	"stagewright/api"
	"stagewright/openapi"
	"stagewright/service"
)

func TestScratch(t *testing.T) {
	r, err := api.NewRouter(service.New(), slog.New(slog.NewTextHandler(io.Discard, nil)), openapi.Swagger2())
	if err != nil {
		t.Fatal(err)
	}
	b, _ := os.ReadFile(os.Getenv("SCRATCH"))
	for _, body := range strings.Split(string(b), "\n===\n") {
		req := httptest.NewRequest(http.MethodPost, "/v1/stage/size", strings.NewReader(body))
		w := httptest.NewRecorder()
		r.ServeHTTP(w, req)
		fmt.Printf("--- %d %s\n%s\n", w.Code, w.Header().Get("Content-Type"), w.Body.String())
	}
}
