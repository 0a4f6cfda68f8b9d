package deploy

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/moby/buildkit/client/llb"
	"github.com/moby/buildkit/client/llb/sourceresolver"
	"github.com/moby/buildkit/frontend/dockerfile/dockerfile2llb"
	"github.com/moby/buildkit/frontend/dockerfile/instructions"
	"github.com/moby/buildkit/frontend/dockerfile/parser"
	digest "github.com/opencontainers/go-digest"
	"github.com/stretchr/testify/require"
)

// The Dockerfile is checked in two layers, without a Docker engine:
//
//  1. BuildKit's own Dockerfile checks (github.com/moby/buildkit, the
//     rules `docker build --check` runs: FromAsCasing, JSONArgsRecommended,
//     SecretsUsedInArgOrEnv, LegacyKeyValueFormat, UndefinedVar,
//     WorkdirRelativePath, ...), run through BuildKit's Dockerfile frontend
//     as a build would, with its parser, so a syntax error or an unknown
//     instruction fails too.
//  2. This project's rules on the parsed instructions: what the image must
//     be (static Go build at go.mod's Go, version stamped, distroless
//     nonroot, the port and address the manifests use).

// offlineResolver answers BuildKit's base-image look-ups without a
// registry (none is reachable here): a linux/amd64 image with PATH set.
// The checks that need the real image config (its platform list, its
// environment) therefore see this stand-in, not the real base images.
type offlineResolver struct{}

func (offlineResolver) ResolveImageConfig(_ context.Context, ref string, _ sourceresolver.Opt) (string, digest.Digest, []byte, error) {
	cfg := `{"architecture":"amd64","os":"linux","config":{"Env":["PATH=/usr/local/sbin:/usr/local/bin:/usr/sbin:/usr/bin:/sbin:/bin"]}}`
	return ref, digest.FromString(ref), []byte(cfg), nil
}

// buildkitLint runs BuildKit's Dockerfile checks over every stage.
func buildkitLint(dt []byte) findings {
	var f findings
	opt := dockerfile2llb.ConvertOpt{
		MetaResolver: offlineResolver{},
		AllStages:    true,
		SourceMap:    llb.NewSourceMap(nil, "Dockerfile", "Dockerfile", dt),
		Warn: func(rule, _, url, msg string, loc []parser.Range) {
			line := 0
			if len(loc) > 0 {
				line = loc[0].Start.Line
			}
			f.addf("line %d: %s: %s (%s)", line, rule, msg, url)
		},
	}
	if _, err := dockerfile2llb.Dockerfile2LLB(context.Background(), dt, opt); err != nil {
		f.addf("BuildKit: %v", err)
	}
	return f
}

// imageFacts are what the manifests must agree with.
type imageFacts struct {
	UID  int64  // numeric uid of the final stage's USER
	Port string // EXPOSE of the final stage
	Addr string // ENV STAGEWRIGHT_ADDR of the final stage
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

func line(c instructions.Command) int {
	if l := c.Location(); len(l) > 0 {
		return l[0].Start.Line
	}
	return 0
}

// runText is a RUN's command line as written (flags dropped).
func runText(r *instructions.RunCommand) string { return strings.Join(r.CmdLine, " ") }

// stageArgs are the ARG names a stage declares.
func stageArgs(s instructions.Stage) map[string]bool {
	out := map[string]bool{}
	for _, c := range s.Commands {
		if a, ok := c.(*instructions.ArgCommand); ok {
			for _, kv := range a.Args {
				out[kv.Key] = true
			}
		}
	}
	return out
}

// checkDockerfile checks a Dockerfile of this repository; goVersion is
// the go line of go.mod.
func checkDockerfile(text, goVersion string) (findings, imageFacts) {
	f := buildkitLint([]byte(text))
	var facts imageFacts
	ast, err := parser.Parse(bytes.NewReader([]byte(text)))
	if err != nil {
		f.addf("parse: %v", err)
		return f, facts
	}
	st, _, err := instructions.Parse(ast.AST, nil)
	if err != nil {
		f.addf("parse: %v", err)
		return f, facts
	}
	if len(st) < 2 {
		f.addf("not multi-stage: want a Go build stage and a small final stage, got %d stage(s)", len(st))
		return f, facts
	}
	final := st[len(st)-1]
	build := -1
	for i := range st {
		for _, c := range st[i].Commands {
			if r, ok := c.(*instructions.RunCommand); ok && strings.Contains(runText(r), "go build") {
				f.check(build < 0, "line %d: a second RUN go build", line(r))
				build = i
			}
		}
	}
	if build < 0 {
		f.addf("no RUN ... go build")
		return f, facts
	}
	f.check(build != len(st)-1, "the build runs in the final stage: the image would carry the Go toolchain")
	checkBuildStage(st[build], final, goVersion, &f)
	facts = checkFinalStage(final, &f)
	checkHygiene(st, &f)
	return f, facts
}

func checkBuildStage(b, final instructions.Stage, goVersion string, f *findings) {
	f.check(b.Name != "", "build stage: name it (FROM golang:... AS build) for COPY --from")

	// The golang images set GOTOOLCHAIN=local: a Go older than go.mod's go
	// line refuses to build; another minor release is not what CI tests.
	f.check(imageName(b.BaseName) == "golang", "build stage image %s, want golang:<go.mod go line>", b.BaseName)
	tag := imageTag(b.BaseName)
	ver, _, _ := strings.Cut(tag, "-") // 1.26.8-bookworm -> 1.26.8
	got, ok1 := versionParts(ver)
	want, ok2 := versionParts(goVersion)
	switch {
	case !ok1 || !ok2:
		f.addf("golang:%s: pin the Go version of go.mod's go line %s", tag, goVersion)
	case got[0] != want[0] || got[1] != want[1]:
		f.addf("golang:%s is not go.mod's Go release %s", tag, goVersion)
	case got[2] >= 0 && got[2] < want[2]:
		f.addf("golang:%s is older than go.mod's go line %s", tag, goVersion)
	}

	// Order: go.mod and go.sum, go mod download (cached), sources, build.
	pos := map[string]int{}
	var run *instructions.RunCommand
	for i, c := range b.Commands {
		switch c := c.(type) {
		case *instructions.CopyCommand:
			src := strings.Join(c.SourcePaths, " ")
			if strings.Contains(src, "go.mod") && strings.Contains(src, "go.sum") {
				pos["COPY go.mod go.sum"] = i
			}
			if len(c.SourcePaths) == 1 && c.SourcePaths[0] == "." && c.From == "" {
				pos["COPY . ."] = i
			}
		case *instructions.RunCommand:
			switch {
			case strings.Contains(runText(c), "go mod download"):
				pos["RUN go mod download"] = i
				f.check(strings.Contains(c.String(), "--mount=type=cache,target=/go/pkg/mod"),
					"line %d: cache the module download (--mount=type=cache,target=/go/pkg/mod)", line(c))
			case strings.Contains(runText(c), "go build"):
				pos["RUN go build"] = i
				run = c
			}
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

	cmd := runText(run)
	cgoOff := strings.Contains(cmd, "CGO_ENABLED=0")
	for _, c := range b.Commands {
		if e, ok := c.(*instructions.EnvCommand); ok {
			for _, kv := range e.Env {
				cgoOff = cgoOff || (kv.Key == "CGO_ENABLED" && kv.Value == "0")
			}
		}
	}
	f.check(cgoOff, "line %d: build with CGO_ENABLED=0: the final image has no C library", line(run))
	f.check(strings.Contains(cmd, "-trimpath"), "line %d: go build -trimpath", line(run))
	m := regexp.MustCompile(`-ldflags[= ]["']([^"']*)["']`).FindStringSubmatch(cmd)
	if m == nil {
		f.addf(`line %d: go build -ldflags="-s -w -X main.version=${VERSION} -X main.commit=${COMMIT}"`, line(run))
	} else {
		fl := strings.Fields(m[1])
		has := func(w string) bool { return strings.Contains(" "+strings.Join(fl, " ")+" ", " "+w+" ") }
		f.check(has("-s") && has("-w"), "line %d: -ldflags needs -s -w, got %q", line(run), m[1])
		// The version the image reports (GET /version) comes from the
		// build arguments.
		args := stageArgs(b)
		for _, x := range []struct{ v, arg string }{{"main.version", "VERSION"}, {"main.commit", "COMMIT"}} {
			stamped := has("-X "+x.v+"=${"+x.arg+"}") || has("-X "+x.v+"=$"+x.arg)
			f.check(stamped, "line %d: -ldflags needs -X %s=${%s}, got %q", line(run), x.v, x.arg, m[1])
			f.check(args[x.arg], "build stage: ARG %s (the ldflags use it; ARGs are per stage)", x.arg)
		}
	}
	f.check(regexp.MustCompile(`\s\./cmd/stagewright(\s|$)`).MatchString(cmd), "line %d: go build ./cmd/stagewright", line(run))
	out := regexp.MustCompile(`\s-o\s+(\S+)`).FindStringSubmatch(cmd)
	if out == nil {
		f.addf("line %d: go build -o PATH, for the final stage to copy", line(run))
		return
	}
	copied := false
	for _, c := range final.Commands {
		if cp, ok := c.(*instructions.CopyCommand); ok && strings.EqualFold(cp.From, b.Name) {
			for _, s := range cp.SourcePaths {
				copied = copied || s == out[1]
			}
		}
	}
	f.check(copied, "final stage: COPY --from=%s %s ... (the binary built)", b.Name, out[1])
}

func checkFinalStage(s instructions.Stage, f *findings) imageFacts {
	var facts imageFacts
	name, tag := imageName(s.BaseName), imageTag(s.BaseName)
	scratch := s.BaseName == "scratch"
	distroless := strings.HasPrefix(name, "gcr.io/distroless/static")
	f.check(scratch || distroless, "final stage gcr.io/distroless/static*:nonroot or scratch, got %s", s.BaseName)
	if distroless {
		f.check(strings.HasPrefix(tag, "nonroot"), "distroless: use the :nonroot tag, got %q", tag)
	}
	var user string
	var hasUser, hasEntrypoint, certs bool
	env, lbl := map[string]string{}, map[string]string{}
	for _, c := range s.Commands {
		switch c := c.(type) {
		case *instructions.UserCommand:
			user, hasUser = c.User, true
		case *instructions.RunCommand:
			f.addf("line %d: RUN in the final stage: it has no shell; do the work in the build stage", line(c))
		case *instructions.EntrypointCommand:
			hasEntrypoint = true
		case *instructions.EnvCommand:
			for _, kv := range c.Env {
				env[kv.Key] = kv.Value
			}
		case *instructions.LabelCommand:
			for _, kv := range c.Labels {
				lbl[kv.Key] = strings.Trim(kv.Value, `"`)
			}
		case *instructions.ExposeCommand:
			if len(c.Ports) > 0 {
				facts.Port = strings.TrimSuffix(c.Ports[0], "/tcp")
			}
		case *instructions.CopyCommand:
			certs = certs || strings.Contains(strings.Join(c.SourcePaths, " "), "ca-certificates.crt")
		}
	}
	if scratch {
		f.check(certs, "scratch: COPY the CA certificates (/etc/ssl/certs/ca-certificates.crt)")
	}

	// Non-root, numeric so that Kubernetes' runAsNonRoot can verify it.
	if !hasUser {
		f.addf("final stage: no USER; want a numeric non-root uid")
	} else {
		uid, _, _ := strings.Cut(user, ":")
		n, err := strconv.ParseInt(uid, 10, 64)
		switch {
		case err != nil:
			f.addf("final stage: USER %s: give a numeric uid (runAsNonRoot cannot check a name)", user)
		case n == 0:
			f.addf("final stage: USER %s is root", user)
		default:
			facts.UID = n
		}
	}
	f.check(hasEntrypoint, "final stage: no ENTRYPOINT")
	facts.Addr = env["STAGEWRIGHT_ADDR"]
	f.check(facts.Addr == "0.0.0.0:8080", "final stage: ENV STAGEWRIGHT_ADDR=0.0.0.0:8080 (all interfaces of the container), got %q", facts.Addr)
	f.check(facts.Port == "8080", "final stage: EXPOSE 8080, got %q", facts.Port)

	// OCI image annotations (image-spec annotations.md), the version ones
	// from the same build arguments as the binary's.
	args := stageArgs(s)
	for _, k := range []string{"org.opencontainers.image.title", "org.opencontainers.image.description"} {
		f.check(lbl[k] != "", "final stage: LABEL %s", k)
	}
	for _, x := range []struct{ key, arg string }{{"org.opencontainers.image.version", "VERSION"}, {"org.opencontainers.image.revision", "COMMIT"}} {
		v := lbl[x.key]
		f.check(v == "${"+x.arg+"}" || v == "$"+x.arg, "final stage: LABEL %s=${%s}, got %q", x.key, x.arg, v)
		f.check(args[x.arg], "final stage: ARG %s (the LABEL uses it; ARGs are per stage)", x.arg)
	}
	return facts
}

// checkHygiene holds the rules BuildKit does not have.
func checkHygiene(st []instructions.Stage, f *findings) {
	names := map[string]bool{}
	for _, s := range st {
		if s.BaseName != "scratch" && !names[strings.ToLower(s.BaseName)] {
			tag := imageTag(s.BaseName)
			f.check(tag != "" || strings.Contains(s.BaseName, "@sha256:"), "FROM %s: pin a tag or digest", s.BaseName)
			f.check(tag != "latest", "FROM %s: latest is not reproducible", s.BaseName)
		}
		for _, c := range s.Commands {
			switch c := c.(type) {
			case *instructions.AddCommand:
				f.addf("line %d: ADD: use COPY (ADD also downloads URLs and unpacks archives)", line(c))
			case *instructions.CopyCommand:
				// BuildKit would take an unknown name for an image to pull.
				f.check(c.From == "" || names[strings.ToLower(c.From)], "line %d: COPY --from=%s names no earlier stage", line(c), c.From)
			case *instructions.RunCommand:
				f.check(!regexp.MustCompile(`(?i)\b(curl|wget)\s`).MatchString(runText(c)),
					"line %d: RUN downloads with curl/wget: unpinned, unverified", line(c))
			}
		}
		if s.Name != "" {
			names[strings.ToLower(s.Name)] = true
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
ARG VERSION=dev
ARG COMMIT=unknown
WORKDIR /src
COPY go.mod go.sum ./
RUN --mount=type=cache,target=/go/pkg/mod \
    go mod download
COPY . .
RUN CGO_ENABLED=0 go build -trimpath \
    -ldflags="-s -w -X main.version=${VERSION} -X main.commit=${COMMIT}" \
    -o /out/stagewright ./cmd/stagewright

FROM gcr.io/distroless/static-debian12:nonroot
ARG VERSION=dev
ARG COMMIT=unknown
LABEL org.opencontainers.image.title="stagewright" \
      org.opencontainers.image.description="stage sizing" \
      org.opencontainers.image.version="${VERSION}" \
      org.opencontainers.image.revision="${COMMIT}"
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
		// BuildKit's rules.
		{"as casing", "AS build", "as build", "FromAsCasing"},
		{"shell-form entrypoint", `ENTRYPOINT ["/stagewright"]`, "ENTRYPOINT /stagewright", "JSONArgsRecommended"},
		{"legacy env", "ENV STAGEWRIGHT_ADDR=0.0.0.0:8080", "ENV STAGEWRIGHT_ADDR 0.0.0.0:8080", "LegacyKeyValueFormat"},
		{"secret arg", "WORKDIR /src\n", "WORKDIR /src\nARG GITHUB_TOKEN\n", "SecretsUsedInArgOrEnv"},
		{"relative workdir", "WORKDIR /src", "WORKDIR src", "WorkdirRelativePath"},
		{"maintainer", "WORKDIR /src\n", "WORKDIR /src\nMAINTAINER someone\n", "MaintainerDeprecated"},
		{"undefined variable", `org.opencontainers.image.title="stagewright"`, `org.opencontainers.image.title="${NAME}"`, "UndefinedVar"},
		{"duplicate stage", "FROM gcr.io/distroless/static-debian12:nonroot\n", "FROM gcr.io/distroless/static-debian12:nonroot AS build\n", "DuplicateStageName"},
		{"unknown instruction", "WORKDIR /src", "WRKDIR /src", "unknown instruction"},
		{"expose protocol case", "EXPOSE 8080", "EXPOSE 8080/TCP", "ExposeProtoCasing"},
		// This project's rules.
		{"single stage", "FROM gcr.io/distroless/static-debian12:nonroot\n", "", "not multi-stage"},
		{"cgo on", "CGO_ENABLED=0 go build", "go build", "CGO_ENABLED=0"},
		{"no trimpath", " -trimpath", "", "-trimpath"},
		{"debug info kept", `-s -w -X`, `-s -X`, "-s -w"},
		{"version not stamped", " -X main.version=${VERSION}", "", "-X main.version"},
		{"commit from nowhere", "-X main.commit=${COMMIT}", "-X main.commit=abc", "-X main.commit"},
		{"no build ARG", "AS build\nARG VERSION=dev\n", "AS build\n", "build stage: ARG VERSION"},
		{"no final ARG", "nonroot\nARG VERSION=dev\n", "nonroot\n", "final stage: ARG VERSION"},
		{"no version label", `      org.opencontainers.image.version="${VERSION}" \` + "\n", "", "org.opencontainers.image.version"},
		{"no title label", `org.opencontainers.image.title="stagewright" \` + "\n      ", "", "org.opencontainers.image.title"},
		{"old go", "golang:1.26.8", "golang:1.26.2", "older than go.mod"},
		{"other minor", "golang:1.26.8", "golang:1.25", "not go.mod's Go release"},
		{"untagged builder", "golang:1.26.8", "golang", "pin the Go version"},
		{"download after sources", "COPY go.mod go.sum ./\nRUN --mount=type=cache,target=/go/pkg/mod \\\n    go mod download\nCOPY . .\n",
			"COPY go.mod go.sum ./\nCOPY . .\nRUN --mount=type=cache,target=/go/pkg/mod go mod download\n", "must come before"},
		{"download uncached", "--mount=type=cache,target=/go/pkg/mod \\\n", "", "cache the module download"},
		{"root user", "USER 65532:65532", "USER root", "numeric uid"},
		{"uid 0", "USER 65532:65532", "USER 0", "is root"},
		{"no user", "USER 65532:65532\n", "", "no USER"},
		{"full base", "gcr.io/distroless/static-debian12:nonroot", "debian:bookworm-slim", "distroless/static"},
		{"root distroless", "static-debian12:nonroot", "static-debian12:debug", "nonroot"},
		{"latest", "static-debian12:nonroot", "static-debian12:latest", "latest is not reproducible"},
		{"scratch without certs", "gcr.io/distroless/static-debian12:nonroot", "scratch", "CA certificates"},
		{"ADD", "WORKDIR /src\n", "WORKDIR /src\nADD https://example.invalid/x.tgz /x\n", "ADD: use COPY"},
		{"curl", "WORKDIR /src\n", "WORKDIR /src\nRUN curl -fsSL https://example.invalid/x -o /x\n", "curl/wget"},
		{"shell in final", "EXPOSE 8080\n", "EXPOSE 8080\nRUN echo hi\n", "RUN in the final stage"},
		{"loopback addr", "STAGEWRIGHT_ADDR=0.0.0.0:8080", "STAGEWRIGHT_ADDR=127.0.0.1:8080", "STAGEWRIGHT_ADDR"},
		{"other port", "EXPOSE 8080", "EXPOSE 80", "EXPOSE 8080"},
		{"wrong stage", "--from=build", "--from=builder", "no earlier stage"},
		{"wrong target", "./cmd/stagewright\n", "./cmd/other\n", "./cmd/stagewright"},
		{"binary not copied", "COPY --from=build /out/stagewright /stagewright", "COPY --from=build /out/other /stagewright", "the binary built"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			require.Contains(t, goodDockerfile, tc.old, "case does not apply")
			f, _ := checkDockerfile(strings.Replace(goodDockerfile, tc.old, tc.new, 1), "1.26.8")
			requireFinding(t, f, tc.want)
		})
	}
}

func TestImageRef(t *testing.T) {
	require.Equal(t, "1.26.8", imageTag("golang:1.26.8"))
	require.Equal(t, "nonroot", imageTag("gcr.io/distroless/static-debian12:nonroot"))
	require.Equal(t, "", imageTag("localhost:5000/x"))
	require.Equal(t, "localhost:5000/x", imageName("localhost:5000/x@sha256:00"))
	require.Equal(t, "stagewright", imageName("stagewright"))
}
