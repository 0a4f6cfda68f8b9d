package deploy

import (
	"go/ast"
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// serverEnv are the STAGEWRIGHT_* variables the server's configuration
// reads (the contract of issue 5). The manifests and deploy/README.md use
// them; TestServerConfigNames checks that cmd/stagewright still has each.
var serverEnv = []string{
	"STAGEWRIGHT_ADDR",
	"STAGEWRIGHT_SHUTDOWN_DELAY",
	"STAGEWRIGHT_LOG_LEVEL",
	"STAGEWRIGHT_DEMO",
	"STAGEWRIGHT_DEMO_DIR",
	"STAGEWRIGHT_API_TOKENS",
	"STAGEWRIGHT_MAX_BODY_BYTES",
	"STAGEWRIGHT_READ_HEADER_TIMEOUT",
	"STAGEWRIGHT_READ_TIMEOUT",
	"STAGEWRIGHT_WRITE_TIMEOUT",
	"STAGEWRIGHT_IDLE_TIMEOUT",
	"STAGEWRIGHT_COMPUTE_TIMEOUT",
	"STAGEWRIGHT_MAX_IN_FLIGHT",
	"STAGEWRIGHT_SHUTDOWN_GRACE",
	"STAGEWRIGHT_TLS_CERT_FILE",
	"STAGEWRIGHT_TLS_KEY_FILE",
	"STAGEWRIGHT_CORS_ORIGINS",
	"STAGEWRIGHT_GC_PERCENT",
	"STAGEWRIGHT_MEMORY_LIMIT",
}

// servedPaths are the routes the manifests and the image point at.
var servedPaths = []string{"/healthz", "/readyz", "/metrics", "/version", "/openapi.json"}

// codeFacts are what the manifests and the Dockerfile must agree with in
// the server's Go sources (read as files: the deploy module does not
// import the service).
type codeFacts struct {
	EnvVars  map[string]bool // quoted "STAGEWRIGHT_*" names in cmd/stagewright
	Paths    map[string]bool // quoted route paths in api/ and cmd/stagewright
	MainVars map[string]bool // package-level string variables of package main (for -ldflags -X)
}

var (
	envName   = regexp.MustCompile(`"(STAGEWRIGHT_[A-Z0-9_]+)"`)
	routePath = regexp.MustCompile(`"(?:(?:GET|HEAD) )?(/[a-z][a-z0-9._/-]*)"`)
)

// sources returns the non-test Go files of a folder of the main module.
func sources(t *testing.T, dir string) []string {
	t.Helper()
	all, err := filepath.Glob(filepath.Join("..", dir, "*.go"))
	require.NoError(t, err)
	var out []string
	for _, f := range all {
		if !strings.HasSuffix(f, "_test.go") {
			out = append(out, f)
		}
	}
	require.NotEmpty(t, out, "no Go files in %s", dir)
	return out
}

func loadCodeFacts(t *testing.T) codeFacts {
	t.Helper()
	c := codeFacts{EnvVars: map[string]bool{}, Paths: map[string]bool{}, MainVars: map[string]bool{}}
	cmd := sources(t, filepath.Join("cmd", "stagewright"))
	fset := token.NewFileSet()
	for _, f := range cmd {
		b, err := os.ReadFile(f)
		require.NoError(t, err)
		for _, m := range envName.FindAllSubmatch(b, -1) {
			c.EnvVars[string(m[1])] = true
		}
		file, err := parser.ParseFile(fset, f, b, parser.SkipObjectResolution)
		require.NoError(t, err)
		for _, d := range file.Decls {
			gd, ok := d.(*ast.GenDecl)
			if !ok || gd.Tok != token.VAR {
				continue
			}
			for _, s := range gd.Specs {
				vs := s.(*ast.ValueSpec)
				typ, _ := vs.Type.(*ast.Ident)
				for i, n := range vs.Names {
					lit := i < len(vs.Values) && isStringLit(vs.Values[i])
					if (typ != nil && typ.Name == "string") || (vs.Type == nil && lit) {
						c.MainVars[n.Name] = true
					}
				}
			}
		}
	}
	require.NotEmpty(t, c.EnvVars, "found no STAGEWRIGHT_* variables in cmd/stagewright")
	for _, f := range append(sources(t, "api"), cmd...) {
		b, err := os.ReadFile(f)
		require.NoError(t, err)
		for _, m := range routePath.FindAllSubmatch(b, -1) {
			c.Paths[string(m[1])] = true
		}
	}
	return c
}

func isStringLit(e ast.Expr) bool {
	bl, ok := e.(*ast.BasicLit)
	return ok && bl.Kind == token.STRING
}

// TestServerConfigNames checks the contract between the server and what
// deploy/ relies on: every variable of serverEnv is read by
// cmd/stagewright, every route is served, and the -ldflags -X targets of
// the Dockerfile exist (the linker ignores -X of a missing variable).
// The settings table of deploy/README.md (rows "| `STAGEWRIGHT_...`")
// documents exactly the variables the server reads.
func TestServerConfigNames(t *testing.T) {
	code := loadCodeFacts(t)
	var missing []string
	for _, name := range serverEnv {
		if !code.EnvVars[name] {
			missing = append(missing, name)
		}
	}
	assert.Empty(t, missing, "cmd/stagewright reads none of these variables (quoted names in its non-test sources)")
	for _, p := range servedPaths {
		assert.True(t, code.Paths[p], "api/ and cmd/stagewright name no route %s", p)
	}
	for _, v := range []string{"version", "commit"} {
		assert.True(t, code.MainVars[v], "cmd/stagewright has no package-level string variable %s for -ldflags -X main.%s", v, v)
	}

	b, err := os.ReadFile("README.md")
	require.NoError(t, err)
	var documented []string
	for _, m := range regexp.MustCompile("(?m)^\\| `(STAGEWRIGHT_[A-Z0-9_]+)`").FindAllSubmatch(b, -1) {
		documented = append(documented, string(m[1]))
	}
	for name := range code.EnvVars {
		assert.Contains(t, documented, name, "deploy/README.md does not document %s, which cmd/stagewright reads", name)
	}
	for _, name := range documented {
		assert.True(t, code.EnvVars[name], "deploy/README.md documents %s, which cmd/stagewright does not read", name)
	}
}

func TestRoutePattern(t *testing.T) {
	src := `r.GET("/healthz", h); mux.Handle("GET /readyz", x); s := "/openapi.json"; _ = "GET /v1/stage/size"; _ = "no/path"`
	var got []string
	for _, m := range routePath.FindAllStringSubmatch(src, -1) {
		got = append(got, m[1])
	}
	require.Equal(t, []string{"/healthz", "/readyz", "/openapi.json", "/v1/stage/size"}, got)
}
