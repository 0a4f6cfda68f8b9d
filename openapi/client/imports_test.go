package client

import (
	"go/parser"
	"go/token"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// TestImportsOnlyStdAndRuntime: the generated client stays what an
// integrator would vendor: the standard library and the oapi-codegen
// runtime, nothing of the service.
func TestImportsOnlyStdAndRuntime(t *testing.T) {
	files, err := filepath.Glob("*.go")
	if err != nil {
		t.Fatal(err)
	}
	n := 0
	for _, name := range files {
		if strings.HasSuffix(name, "_test.go") {
			continue
		}
		f, err := parser.ParseFile(token.NewFileSet(), name, nil, parser.ImportsOnly)
		if err != nil {
			t.Fatal(err)
		}
		for _, imp := range f.Imports {
			path, _ := strconv.Unquote(imp.Path.Value)
			first, _, _ := strings.Cut(path, "/")
			if strings.Contains(first, ".") && !strings.HasPrefix(path, "github.com/oapi-codegen/runtime") {
				t.Errorf("%s imports %s", name, path)
			}
			if first == "stagewright" {
				t.Errorf("%s imports the service's own package %s", name, path)
			}
			n++
		}
	}
	if n == 0 {
		t.Fatal("no imports found: is client.gen.go missing?")
	}
}
