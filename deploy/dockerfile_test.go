package deploy

import (
	"bufio"
	"encoding/json"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// This file lints the repository's Dockerfile without a Docker engine. No
// maintained Dockerfile linter installs from the registries this project
// reaches (hadolint is not packaged for Debian bookworm), so the rules are
// written here; the hadolint rule each follows is named where there is one.

// instruction is one Dockerfile instruction after joining continuation
// lines and dropping comments.
type instruction struct {
	Line int    // 1-based line of the instruction's first line
	Cmd  string // upper case: FROM, RUN, COPY, ...
	Args string // the rest, continuation lines joined with a space
}

// stage is one FROM and the instructions after it.
type stage struct {
	Line  int
	Image string // as written after FROM (after flags)
	Name  string // the AS name, lower case, or ""
	Body  []instruction
}

// knownInstructions are the instructions of the Dockerfile reference;
// anything else is a typo.
var knownInstructions = map[string]bool{
	"FROM": true, "RUN": true, "CMD": true, "LABEL": true, "EXPOSE": true, "ENV": true, "ADD": true,
	"COPY": true, "ENTRYPOINT": true, "VOLUME": true, "USER": true, "WORKDIR": true, "ARG": true,
	"ONBUILD": true, "STOPSIGNAL": true, "HEALTHCHECK": true, "SHELL": true, "MAINTAINER": true,
}

// parseDockerfile splits a Dockerfile into instructions: comment lines
// (also inside a continuation) are dropped, a trailing backslash continues
// the instruction. Heredocs are not supported and are reported.
func parseDockerfile(text string, f *findings) []instruction {
	var out []instruction
	var cur *instruction
	sc := bufio.NewScanner(strings.NewReader(text))
	for n := 1; sc.Scan(); n++ {
		line := strings.TrimSpace(sc.Text())
		if line == "" || strings.HasPrefix(line, "#") {
			continue
		}
		cont := strings.HasSuffix(line, `\`)
		line = strings.TrimSpace(strings.TrimSuffix(line, `\`))
		if cur == nil {
			cmd, args, _ := strings.Cut(line, " ")
			cur = &instruction{Line: n, Cmd: strings.ToUpper(cmd), Args: strings.TrimSpace(args)}
		} else {
			cur.Args = strings.TrimSpace(cur.Args + " " + line)
		}
		if !cont {
			f.check(!strings.Contains(cur.Args, "<<"), "line %d: heredocs are not supported by this check", cur.Line)
			f.check(knownInstructions[cur.Cmd], "line %d: unknown instruction %s", cur.Line, cur.Cmd)
			out = append(out, *cur)
			cur = nil
		}
	}
	f.check(cur == nil, "the Dockerfile ends inside a continuation line")
	return out
}

// stagesOf groups instructions by FROM. Only ARG may come before the first.
func stagesOf(ins []instruction, f *findings) []stage {
	var out []stage
	for _, in := range ins {
		if in.Cmd == "FROM" {
			w := strings.Fields(in.Args)
			for len(w) > 0 && strings.HasPrefix(w[0], "--") { // --platform=...
				w = w[1:]
			}
			s := stage{Line: in.Line}
			switch {
			case len(w) == 1:
				s.Image = w[0]
			case len(w) == 3 && strings.EqualFold(w[1], "AS"):
				s.Image, s.Name = w[0], strings.ToLower(w[2])
			default:
				f.addf("line %d: FROM IMAGE [AS NAME], got FROM %s", in.Line, in.Args)
				continue
			}
			out = append(out, s)
			continue
		}
		if len(out) == 0 {
			f.check(in.Cmd == "ARG", "line %d: only ARG may come before the first FROM", in.Line)
			continue
		}
		out[len(out)-1].Body = append(out[len(out)-1].Body, in)
	}
	return out
}

// imageTag returns the tag of an image reference ("" when it has none).
func imageTag(ref string) string {
	ref, _, _ = strings.Cut(ref, "@")
	slash := strings.LastIndex(ref, "/")
	if colon := strings.LastIndex(ref, ":"); colon > slash {
		return ref[colon+1:]
	}
	return ""
}

// imageName returns an image reference without tag and digest.
func imageName(ref string) string {
	ref, _, _ = strings.Cut(ref, "@")
	slash := strings.LastIndex(ref, "/")
	if colon := strings.LastIndex(ref, ":"); colon > slash {
		return ref[:colon]
	}
	return ref
}

// versionParts splits "1.26.8" into [1 26 8]; a missing patch is -1.
func versionParts(v string) ([3]int, bool) {
	p := [3]int{0, 0, -1}
	s := strings.Split(v, ".")
	if len(s) < 2 || len(s) > 3 {
		return p, false
	}
	for i := range s {
		n, err := strconv.Atoi(s[i])
		if err != nil {
			return p, false
		}
		p[i] = n
	}
	return p, true
}

// lastArgs returns the arguments of the last instruction cmd in s.
func lastArgs(s stage, cmd string) (string, bool) {
	for i := len(s.Body) - 1; i >= 0; i-- {
		if s.Body[i].Cmd == cmd {
			return s.Body[i].Args, true
		}
	}
	return "", false
}

// envOf returns the ENV settings of a stage, KEY=VALUE and the legacy
// "ENV KEY VALUE" form.
func envOf(s stage) map[string]string {
	env := map[string]string{}
	for _, in := range s.Body {
		if in.Cmd != "ENV" || in.Args == "" {
			continue
		}
		if !strings.Contains(strings.Fields(in.Args)[0], "=") {
			k, v, _ := strings.Cut(in.Args, " ")
			env[k] = strings.TrimSpace(v)
			continue
		}
		for _, kv := range strings.Fields(in.Args) {
			k, v, _ := strings.Cut(kv, "=")
			env[k] = strings.Trim(v, `"`)
		}
	}
	return env
}

// imageFacts are what the manifests must agree with.
type imageFacts struct {
	UID  int    // numeric uid of the final stage's USER
	Port string // EXPOSE of the final stage
	Addr string // ENV STAGEWRIGHT_ADDR of the final stage
}

// checkDockerfile lints a Dockerfile of this repository; goVersion is the
// go line of go.mod.
func checkDockerfile(text, goVersion string) (findings, imageFacts) {
	var f findings
	var facts imageFacts
	st := stagesOf(parseDockerfile(text, &f), &f)
	if len(st) < 2 {
		f.addf("not multi-stage: want a Go build stage and a small final stage, got %d stage(s)", len(st))
		return f, facts
	}
	final := st[len(st)-1]
	var build *stage
	for i := range st {
		for _, in := range st[i].Body {
			if in.Cmd == "RUN" && strings.Contains(in.Args, "go build") {
				f.check(build == nil, "line %d: a second RUN go build", in.Line)
				build = &st[i]
			}
		}
	}
	if build == nil {
		f.addf("no RUN ... go build")
		return f, facts
	}
	f.check(build.Line != final.Line, "the build runs in the final stage: the image would carry the Go toolchain")
	checkBuildStage(*build, final, goVersion, &f)
	facts = checkFinalStage(final, &f)
	checkHygiene(st, &f)
	return f, facts
}

func checkBuildStage(b, final stage, goVersion string, f *findings) {
	f.check(b.Name != "", "line %d: name the build stage (FROM golang:... AS build) for COPY --from", b.Line)

	// The golang images set GOTOOLCHAIN=local: a Go older than go.mod's go
	// line refuses to build; another minor release is not what CI tests.
	f.check(imageName(b.Image) == "golang", "line %d: build stage image %s, want golang:<go.mod go line>", b.Line, b.Image)
	tag := imageTag(b.Image)
	ver, _, _ := strings.Cut(tag, "-") // 1.26.8-bookworm -> 1.26.8
	got, ok1 := versionParts(ver)
	want, ok2 := versionParts(goVersion)
	switch {
	case !ok1 || !ok2:
		f.addf("line %d: golang:%s: pin the Go version of go.mod's go line %s", b.Line, tag, goVersion)
	case got[0] != want[0] || got[1] != want[1]:
		f.addf("line %d: golang:%s is not go.mod's Go release %s", b.Line, tag, goVersion)
	case got[2] >= 0 && got[2] < want[2]:
		f.addf("line %d: golang:%s is older than go.mod's go line %s", b.Line, tag, goVersion)
	}

	// Order: go.mod and go.sum, go mod download (cached), sources, build.
	pos := map[string]int{}
	var run instruction
	for i, in := range b.Body {
		switch {
		case in.Cmd == "COPY" && strings.Contains(in.Args, "go.mod") && strings.Contains(in.Args, "go.sum"):
			pos["COPY go.mod go.sum"] = i
		case in.Cmd == "RUN" && strings.Contains(in.Args, "go mod download"):
			pos["RUN go mod download"] = i
			f.check(strings.Contains(in.Args, "--mount=type=cache,target=/go/pkg/mod"),
				"line %d: cache the module download (--mount=type=cache,target=/go/pkg/mod)", in.Line)
		case in.Cmd == "COPY" && regexp.MustCompile(`(^|\s)\.\s+\.(/)?$`).MatchString(in.Args):
			pos["COPY . ."] = i
		case in.Cmd == "RUN" && strings.Contains(in.Args, "go build"):
			pos["RUN go build"] = i
			run = in
		}
	}
	order := []string{"COPY go.mod go.sum", "RUN go mod download", "COPY . .", "RUN go build"}
	for i, k := range order {
		p, ok := pos[k]
		if !ok {
			f.addf("build stage lacks %s", k)
			continue
		}
		for _, before := range order[:i] {
			if q, ok := pos[before]; ok && q > p {
				f.addf("build stage: %s must come before %s (layer cache of the modules)", before, k)
			}
		}
	}

	f.check(strings.Contains(run.Args, "CGO_ENABLED=0") || envOf(b)["CGO_ENABLED"] == "0",
		"line %d: build with CGO_ENABLED=0: the final image has no C library", run.Line)
	f.check(strings.Contains(run.Args, "-trimpath"), "line %d: go build -trimpath", run.Line)
	if m := regexp.MustCompile(`-ldflags=["']?([^"']*)["']?`).FindStringSubmatch(run.Args); m == nil {
		f.addf(`line %d: go build -ldflags="-s -w"`, run.Line)
	} else {
		fl := " " + m[1] + " "
		f.check(strings.Contains(fl, " -s ") && strings.Contains(fl, " -w "), `line %d: -ldflags needs -s -w, got %q`, run.Line, m[1])
	}
	f.check(regexp.MustCompile(`\s\./cmd/stagewright(\s|$)`).MatchString(run.Args), "line %d: go build ./cmd/stagewright", run.Line)
	out := regexp.MustCompile(`\s-o\s+(\S+)`).FindStringSubmatch(run.Args)
	if out == nil {
		f.addf("line %d: go build -o PATH, for the final stage to copy", run.Line)
		return
	}
	copied := false
	for _, in := range final.Body {
		copied = copied || (in.Cmd == "COPY" && strings.Contains(in.Args, "--from="+b.Name+" ") && strings.Contains(in.Args, " "+out[1]+" "))
	}
	f.check(copied, "final stage: COPY --from=%s %s ... (the binary built)", b.Name, out[1])
}

func checkFinalStage(s stage, f *findings) imageFacts {
	var facts imageFacts
	name, tag := imageName(s.Image), imageTag(s.Image)
	scratch := s.Image == "scratch"
	distroless := strings.HasPrefix(name, "gcr.io/distroless/static")
	f.check(scratch || distroless, "line %d: final stage gcr.io/distroless/static*:nonroot or scratch, got %s", s.Line, s.Image)
	if distroless {
		f.check(strings.HasPrefix(tag, "nonroot"), "line %d: distroless: use the :nonroot tag, got %q", s.Line, tag)
	}
	if scratch {
		certs := false
		for _, in := range s.Body {
			certs = certs || (in.Cmd == "COPY" && strings.Contains(in.Args, "ca-certificates.crt"))
		}
		f.check(certs, "scratch: COPY the CA certificates (/etc/ssl/certs/ca-certificates.crt)")
	}

	// Non-root, numeric so that Kubernetes' runAsNonRoot can verify it
	// (hadolint DL3002: last USER should not be root).
	if user, ok := lastArgs(s, "USER"); !ok {
		f.addf("final stage: no USER; want a numeric non-root uid")
	} else {
		uid, _, _ := strings.Cut(user, ":")
		n, err := strconv.Atoi(uid)
		switch {
		case err != nil:
			f.addf("final stage: USER %s: give a numeric uid (runAsNonRoot cannot check a name)", user)
		case n == 0:
			f.addf("final stage: USER %s is root", user)
		default:
			facts.UID = n
		}
	}
	for _, in := range s.Body {
		f.check(in.Cmd != "RUN", "line %d: RUN in the final stage: it has no shell; do the work in the build stage", in.Line)
	}
	if ep, ok := lastArgs(s, "ENTRYPOINT"); !ok {
		f.addf("final stage: no ENTRYPOINT")
	} else {
		var argv []string
		f.check(json.Unmarshal([]byte(ep), &argv) == nil && len(argv) > 0,
			"final stage: ENTRYPOINT %s: use the exec (JSON) form, there is no shell", ep)
	}
	facts.Addr = envOf(s)["STAGEWRIGHT_ADDR"]
	f.check(facts.Addr == "0.0.0.0:8080", "final stage: ENV STAGEWRIGHT_ADDR=0.0.0.0:8080 (all interfaces of the container), got %q", facts.Addr)
	if expose, ok := lastArgs(s, "EXPOSE"); ok {
		facts.Port = strings.TrimSuffix(expose, "/tcp")
	}
	f.check(facts.Port == "8080", "final stage: EXPOSE 8080, got %q", facts.Port)
	return facts
}

func checkHygiene(st []stage, f *findings) {
	names := map[string]bool{}
	secret := regexp.MustCompile(`(?i)(password|passwd|secret|token|api_?key|private_?key)`)
	for _, s := range st {
		if s.Image != "scratch" && !names[strings.ToLower(s.Image)] {
			tag := imageTag(s.Image)
			// hadolint DL3006 (tag the image), DL3007 (no latest)
			f.check(tag != "" || strings.Contains(s.Image, "@sha256:"), "line %d: FROM %s: pin a tag or digest", s.Line, s.Image)
			f.check(tag != "latest", "line %d: FROM %s: latest is not reproducible", s.Line, s.Image)
		}
		for _, in := range s.Body {
			switch in.Cmd {
			case "ADD":
				if regexp.MustCompile(`(?i)(https?|ftp|git)://|git@`).MatchString(in.Args) {
					f.addf("line %d: ADD of a URL: an unpinned, unverified download", in.Line)
				} else { // hadolint DL3020
					f.addf("line %d: ADD: use COPY (ADD also unpacks archives)", in.Line)
				}
			case "COPY":
				if m := regexp.MustCompile(`--from=(\S+)`).FindStringSubmatch(in.Args); m != nil {
					f.check(names[strings.ToLower(m[1])], "line %d: COPY --from=%s names no earlier stage", in.Line, m[1])
				}
			case "ENV", "ARG":
				for _, kv := range strings.Fields(in.Args) {
					k, _, _ := strings.Cut(kv, "=")
					f.check(!secret.MatchString(k), "line %d: %s %s: secrets do not belong in an image", in.Line, in.Cmd, k)
				}
			case "RUN":
				f.check(!regexp.MustCompile(`(?i)\b(curl|wget)\s`).MatchString(in.Args),
					"line %d: RUN downloads with curl/wget: unpinned, unverified", in.Line)
			case "MAINTAINER":
				f.addf("line %d: MAINTAINER is deprecated; use LABEL", in.Line)
			}
		}
		if s.Name != "" {
			names[s.Name] = true
		}
	}
}

// goLine returns the version on go.mod's go line, e.g. "1.26.8".
func goLine(t *testing.T) string {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "go.mod"))
	require.NoError(t, err)
	m := regexp.MustCompile(`(?m)^go\s+(\d+\.\d+(?:\.\d+)?)\s*$`).FindSubmatch(b)
	require.NotNil(t, m, "go.mod has no go line")
	return string(m[1])
}

// repoDockerfile checks the repository's Dockerfile and returns its facts.
func repoDockerfile(t *testing.T) imageFacts {
	t.Helper()
	b, err := os.ReadFile(filepath.Join("..", "Dockerfile"))
	require.NoError(t, err)
	f, facts := checkDockerfile(string(b), goLine(t))
	reportNone(t, "Dockerfile", f)
	return facts
}

func TestDockerfile(t *testing.T) {
	repoDockerfile(t)
}

// goodDockerfile passes every check; the cases below break it one way each.
const goodDockerfile = `# syntax=docker/dockerfile:1
FROM golang:1.26.8 AS build
WORKDIR /src
COPY go.mod go.sum ./
RUN --mount=type=cache,target=/go/pkg/mod \
    go mod download
COPY . .
RUN CGO_ENABLED=0 go build -trimpath -ldflags="-s -w" -o /out/stagewright ./cmd/stagewright
FROM gcr.io/distroless/static-debian12:nonroot
COPY --from=build /out/stagewright /stagewright
ENV STAGEWRIGHT_ADDR=0.0.0.0:8080
EXPOSE 8080
USER 65532:65532
ENTRYPOINT ["/stagewright"]
`

func TestDockerfileChecksCatch(t *testing.T) {
	f, facts := checkDockerfile(goodDockerfile, "1.26.8")
	reportNone(t, "goodDockerfile", f)
	require.Equal(t, imageFacts{UID: 65532, Port: "8080", Addr: "0.0.0.0:8080"}, facts)

	cases := []struct{ name, old, new, want string }{
		{"single stage", "FROM gcr.io/distroless/static-debian12:nonroot\n", "", "not multi-stage"},
		{"cgo on", "CGO_ENABLED=0 go build", "go build", "CGO_ENABLED=0"},
		{"no trimpath", " -trimpath", "", "-trimpath"},
		{"debug info kept", `-ldflags="-s -w"`, `-ldflags="-s"`, "-s -w"},
		{"old go", "golang:1.26.8", "golang:1.26.2", "older than go.mod"},
		{"other minor", "golang:1.26.8", "golang:1.25", "not go.mod's Go release"},
		{"untagged builder", "golang:1.26.8", "golang", "pin the Go version"},
		{"download after sources", "COPY go.mod go.sum ./\nRUN --mount=type=cache,target=/go/pkg/mod \\\n    go mod download\nCOPY . .\n",
			"COPY go.mod go.sum ./\nCOPY . .\nRUN --mount=type=cache,target=/go/pkg/mod go mod download\n", "must come before"},
		{"download uncached", "--mount=type=cache,target=/go/pkg/mod \\\n", "", "cache the module download"},
		{"root user", "USER 65532:65532", "USER root", "numeric uid"},
		{"uid 0", "USER 65532:65532", "USER 0", "is root"},
		{"no user", "USER 65532:65532\n", "", "no USER"},
		{"shell form", `ENTRYPOINT ["/stagewright"]`, "ENTRYPOINT /stagewright", "exec (JSON) form"},
		{"full base", "gcr.io/distroless/static-debian12:nonroot", "debian:bookworm-slim", "distroless/static"},
		{"root distroless", "static-debian12:nonroot", "static-debian12:latest", "nonroot"},
		{"scratch without certs", "gcr.io/distroless/static-debian12:nonroot", "scratch", "CA certificates"},
		{"ADD of URL", "WORKDIR /src\n", "WORKDIR /src\nADD https://example.invalid/x.tgz /x\n", "ADD of a URL"},
		{"ADD of file", "WORKDIR /src\n", "WORKDIR /src\nADD x.tgz /x\n", "use COPY"},
		{"curl", "WORKDIR /src\n", "WORKDIR /src\nRUN curl -fsSL https://example.invalid/x | sh\n", "curl/wget"},
		{"shell in final", "EXPOSE 8080\n", "EXPOSE 8080\nRUN echo hi\n", "RUN in the final stage"},
		{"loopback addr", "STAGEWRIGHT_ADDR=0.0.0.0:8080", "STAGEWRIGHT_ADDR=127.0.0.1:8080", "STAGEWRIGHT_ADDR"},
		{"other port", "EXPOSE 8080", "EXPOSE 80", "EXPOSE 8080"},
		{"wrong stage", "--from=build", "--from=builder", "no earlier stage"},
		{"secret", "WORKDIR /src\n", "WORKDIR /src\nARG GITHUB_TOKEN\n", "secrets"},
		{"typo", "WORKDIR /src", "WRKDIR /src", "unknown instruction"},
		{"wrong target", "./cmd/stagewright\n", "./cmd/other\n", "./cmd/stagewright"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			require.Contains(t, goodDockerfile, tc.old, "case does not apply")
			f, _ := checkDockerfile(strings.Replace(goodDockerfile, tc.old, tc.new, 1), "1.26.8")
			requireFinding(t, f, tc.want)
		})
	}
}

func TestDockerfileParser(t *testing.T) {
	var f findings
	ins := parseDockerfile("# syntax=docker/dockerfile:1\nARG V=1\nFROM golang:1.26.8 AS Build\n# c\nRUN a \\\n  # inside\n  b\nfrom scratch\nUSER 1:1\n", &f)
	require.Empty(t, f)
	require.Len(t, ins, 5)
	require.Equal(t, instruction{Line: 5, Cmd: "RUN", Args: "a b"}, ins[2])
	st := stagesOf(ins, &f)
	require.Empty(t, f)
	require.Len(t, st, 2)
	require.Equal(t, "build", st[0].Name)
	require.Equal(t, "scratch", st[1].Image)
	require.Equal(t, "1.26.8", imageTag("golang:1.26.8"))
	require.Equal(t, "nonroot", imageTag("gcr.io/distroless/static-debian12:nonroot"))
	require.Equal(t, "", imageTag("localhost:5000/x"))
	require.Equal(t, "localhost:5000/x", imageName("localhost:5000/x@sha256:00"))
}
