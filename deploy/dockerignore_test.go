package deploy

import (
	"bufio"
	"os"
	"os/exec"
	"path"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// dockerignorePatterns reads .dockerignore: one pattern a line, # comments,
// leading "/" and "./" dropped, "!" re-includes.
func dockerignorePatterns(text string) []string {
	var out []string
	sc := bufio.NewScanner(strings.NewReader(text))
	for sc.Scan() {
		p := strings.TrimSpace(sc.Text())
		if p == "" || strings.HasPrefix(p, "#") {
			continue
		}
		neg := strings.HasPrefix(p, "!")
		p = strings.TrimPrefix(p, "!")
		p = strings.TrimPrefix(path.Clean("/"+p), "/")
		if neg {
			p = "!" + p
		}
		out = append(out, p)
	}
	return out
}

// globSegments matches path segments against pattern segments; "**"
// matches any number of segments, other segments as path.Match.
func globSegments(ps, xs []string) bool {
	if len(ps) == 0 {
		return len(xs) == 0
	}
	if ps[0] == "**" {
		return globSegments(ps[1:], xs) || (len(xs) > 0 && globSegments(ps, xs[1:]))
	}
	if len(xs) == 0 {
		return false
	}
	ok, err := path.Match(ps[0], xs[0])
	return err == nil && ok && globSegments(ps[1:], xs[1:])
}

// dockerignored reports whether the build context leaves out the
// slash-separated relative path p: the last pattern that matches p or one
// of its parent folders decides (the rules of Docker's .dockerignore).
func dockerignored(patterns []string, p string) bool {
	xs := strings.Split(p, "/")
	out := false
	for _, pat := range patterns {
		neg := strings.HasPrefix(pat, "!")
		ps := strings.Split(strings.TrimPrefix(pat, "!"), "/")
		for i := 1; i <= len(xs); i++ {
			if globSegments(ps, xs[:i]) {
				out = !neg
				break
			}
		}
	}
	return out
}

func TestDockerignoreMatcher(t *testing.T) {
	pats := dockerignorePatterns("# c\n.git\n/deploy\n**/testdata\n**/*_test.go\n*.md\n!README.md\n./x/../y\n")
	require.Equal(t, []string{".git", "deploy", "**/testdata", "**/*_test.go", "*.md", "!README.md", "y"}, pats)
	for p, want := range map[string]bool{
		".git/HEAD": true, "deploy/hpa.yaml": true, "deploy": true, "testdata/stages/a.json": true,
		"api/testdata/x": true, "api/x_test.go": true, "x_test.go": true, "NOTES.md": true, "README.md": false,
		"api/README.md": false, "api/router.go": false, "go.mod": false, "y/z": true, "cmd/stagewright/main.go": false,
	} {
		assert.Equal(t, want, dockerignored(pats, p), p)
	}
}

// TestDockerignore checks that the build context keeps go.mod, go.sum and
// every Go and embedded file of the packages ./cmd/stagewright needs, and
// leaves out .git.
func TestDockerignore(t *testing.T) {
	b, err := os.ReadFile(filepath.Join("..", ".dockerignore"))
	require.NoError(t, err)
	pats := dockerignorePatterns(string(b))
	assert.True(t, dockerignored(pats, ".git/config"), ".dockerignore: leave .git out of the build context")

	root, err := filepath.Abs("..")
	require.NoError(t, err)
	goCmd, err := exec.LookPath("go")
	require.NoError(t, err, "the go command is needed to list the packages of ./cmd/stagewright")
	cmd := exec.Command(goCmd, "list", "-deps", "-f",
		`{{if .Module}}{{if .Module.Main}}{{.Dir}}|{{join .GoFiles ","}}|{{join .EmbedFiles ","}}{{end}}{{end}}`, "./cmd/stagewright")
	cmd.Dir = root
	out, err := cmd.Output()
	require.NoError(t, err, "go list: %s", out)
	need := []string{"go.mod", "go.sum"}
	for _, line := range strings.Split(strings.TrimSpace(string(out)), "\n") {
		parts := strings.Split(line, "|")
		require.Len(t, parts, 3, line)
		rel, err := filepath.Rel(root, parts[0])
		require.NoError(t, err)
		for _, list := range parts[1:] {
			for _, name := range strings.Split(list, ",") {
				if name != "" {
					need = append(need, filepath.ToSlash(filepath.Join(rel, name)))
				}
			}
		}
	}
	require.Greater(t, len(need), 3, "go list found no files")
	for _, p := range need {
		assert.False(t, dockerignored(pats, p), ".dockerignore leaves out %s, which the image build needs", p)
	}
}
