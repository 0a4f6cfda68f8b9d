package deploy

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"net"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
	"go.yaml.in/yaml/v3"
)

// serverShutdownTimeout is the graceful shutdown timeout of the server
// (config.ShutdownTimeout in cmd/stagewright/run.go).
const serverShutdownTimeout = 10

// appLabel is the label every object carries and the selectors use.
const appLabel = "app.kubernetes.io/name"

// manifests are the objects that deploy/kustomization.yaml lists.
type manifests struct {
	Kustomization kustomization
	Files         []string // YAML files in the folder besides kustomization.yaml
	ConfigMap     *configMap
	Deployment    *deployment
	Service       *service
	HPA           *hpa
	PDB           *pdb
}

// decodeStrict decodes one YAML document into v, rejecting fields that v
// does not have and a second document.
func decodeStrict(b []byte, v any) error {
	dec := yaml.NewDecoder(bytes.NewReader(b))
	dec.KnownFields(true)
	if err := dec.Decode(v); err != nil {
		return err
	}
	var extra any
	if err := dec.Decode(&extra); !errors.Is(err, io.EOF) {
		return fmt.Errorf("want one YAML document per file")
	}
	return nil
}

// wantKinds maps each kind to its API version.
var wantKinds = map[string]string{
	"ConfigMap": "v1", "Deployment": "apps/v1", "Service": "v1",
	"HorizontalPodAutoscaler": "autoscaling/v2", "PodDisruptionBudget": "policy/v1",
}

func loadManifests(t *testing.T, dir string) *manifests {
	t.Helper()
	m := &manifests{}
	b, err := os.ReadFile(filepath.Join(dir, "kustomization.yaml"))
	require.NoError(t, err)
	require.NoError(t, decodeStrict(b, &m.Kustomization), "kustomization.yaml")
	files, err := filepath.Glob(filepath.Join(dir, "*.y*ml"))
	require.NoError(t, err)
	for _, f := range files {
		if base := filepath.Base(f); base != "kustomization.yaml" {
			m.Files = append(m.Files, base)
		}
	}
	for _, name := range m.Kustomization.Resources {
		b, err := os.ReadFile(filepath.Join(dir, name))
		require.NoError(t, err, "kustomization.yaml lists %s", name)
		var tm typeMeta
		require.NoError(t, yaml.Unmarshal(b, &tm), name)
		want, ok := wantKinds[tm.Kind]
		require.True(t, ok, "%s: unexpected kind %q", name, tm.Kind)
		require.Equal(t, want, tm.APIVersion, "%s: apiVersion of %s", name, tm.Kind)
		var dst any
		switch tm.Kind {
		case "ConfigMap":
			require.Nil(t, m.ConfigMap, "%s: a second ConfigMap", name)
			m.ConfigMap = &configMap{}
			dst = m.ConfigMap
		case "Deployment":
			require.Nil(t, m.Deployment, "%s: a second Deployment", name)
			m.Deployment = &deployment{}
			dst = m.Deployment
		case "Service":
			require.Nil(t, m.Service, "%s: a second Service", name)
			m.Service = &service{}
			dst = m.Service
		case "HorizontalPodAutoscaler":
			require.Nil(t, m.HPA, "%s: a second HorizontalPodAutoscaler", name)
			m.HPA = &hpa{}
			dst = m.HPA
		case "PodDisruptionBudget":
			require.Nil(t, m.PDB, "%s: a second PodDisruptionBudget", name)
			m.PDB = &pdb{}
			dst = m.PDB
		}
		require.NoError(t, decodeStrict(b, dst), "%s: a field the Kubernetes API does not have there (or one k8s_types_test.go lacks)", name)
	}
	return m
}

// cpuCores parses a Kubernetes CPU quantity ("250m", "1", "0.5").
func cpuCores(q string) (float64, bool) {
	if s, ok := strings.CutSuffix(q, "m"); ok {
		n, err := strconv.ParseFloat(s, 64)
		return n / 1000, err == nil && n > 0
	}
	n, err := strconv.ParseFloat(q, 64)
	return n, err == nil && n > 0
}

var (
	memQuantity = regexp.MustCompile(`^(\d+(?:\.\d+)?)(Ki|Mi|Gi|Ti|k|M|G|T)?$`)
	goMemLimit  = regexp.MustCompile(`^(\d+)(B|KiB|MiB|GiB|TiB)?$`)
	memFactor   = map[string]float64{"": 1, "B": 1, "k": 1e3, "M": 1e6, "G": 1e9, "T": 1e12,
		"Ki": 1 << 10, "Mi": 1 << 20, "Gi": 1 << 30, "Ti": 1 << 40, "KiB": 1 << 10, "MiB": 1 << 20, "GiB": 1 << 30, "TiB": 1 << 40}
)

// bytesOf parses a Kubernetes memory quantity ("64Mi") or, with re =
// goMemLimit, a GOMEMLIMIT value ("230MiB").
func bytesOf(re *regexp.Regexp, q string) (float64, bool) {
	m := re.FindStringSubmatch(q)
	if m == nil {
		return 0, false
	}
	n, err := strconv.ParseFloat(m[1], 64)
	return n * memFactor[m[2]], err == nil && n > 0
}

// selects reports whether a non-empty selector selects pods with labels.
func selects(sel, labels map[string]string) bool {
	if len(sel) == 0 {
		return false
	}
	for k, v := range sel {
		if labels[k] != v {
			return false
		}
	}
	return true
}

func isFalse(b *bool) bool { return b != nil && !*b }
func isTrue(b *bool) bool  { return b != nil && *b }

// intValue reads an int-or-string field that must be an int here.
func intValue(v any) (int, bool) {
	n, ok := v.(int)
	return n, ok
}

// codeFacts are what the manifests must agree with in the Go sources.
type codeFacts struct {
	EnvVars    map[string]bool // STAGEWRIGHT_* names cmd/stagewright reads
	HealthPath string          // the route of the probes, if the router has it
}

func loadCodeFacts(t *testing.T) codeFacts {
	t.Helper()
	c := codeFacts{EnvVars: map[string]bool{}}
	srcs, err := filepath.Glob(filepath.Join("..", "cmd", "stagewright", "*.go"))
	require.NoError(t, err)
	for _, f := range srcs {
		b, err := os.ReadFile(f)
		require.NoError(t, err)
		for _, m := range regexp.MustCompile(`"(STAGEWRIGHT_[A-Z0-9_]+)"`).FindAllSubmatch(b, -1) {
			c.EnvVars[string(m[1])] = true
		}
	}
	require.NotEmpty(t, c.EnvVars, "found no STAGEWRIGHT_* variables in cmd/stagewright")
	srcs, err = filepath.Glob(filepath.Join("..", "api", "*.go"))
	require.NoError(t, err)
	for _, f := range srcs {
		b, err := os.ReadFile(f)
		require.NoError(t, err)
		if bytes.Contains(b, []byte(`GET("/healthz"`)) {
			c.HealthPath = "/healthz"
		}
	}
	return c
}

// checkManifests checks the objects against each other, the image and
// the code.
func checkManifests(m *manifests, img imageFacts, code codeFacts) findings {
	var f findings
	k := m.Kustomization
	f.check(k.APIVersion == "kustomize.config.k8s.io/v1beta1" && k.Kind == "Kustomization",
		"kustomization.yaml: apiVersion kustomize.config.k8s.io/v1beta1, kind Kustomization")
	listed := slices.Clone(k.Resources)
	sort.Strings(listed)
	files := slices.Clone(m.Files)
	sort.Strings(files)
	f.check(slices.Equal(listed, files), "kustomization.yaml resources %v, but the folder has %v", listed, files)
	for kind := range wantKinds {
		present := map[string]bool{"ConfigMap": m.ConfigMap != nil, "Deployment": m.Deployment != nil,
			"Service": m.Service != nil, "HorizontalPodAutoscaler": m.HPA != nil, "PodDisruptionBudget": m.PDB != nil}[kind]
		f.check(present, "no %s", kind)
	}
	if len(f) > 0 {
		return f
	}
	d, cm, svc, h, p := m.Deployment, m.ConfigMap, m.Service, m.HPA, m.PDB
	for _, o := range []struct {
		kind string
		meta objectMeta
	}{{"ConfigMap", cm.Metadata}, {"Deployment", d.Metadata}, {"Service", svc.Metadata}, {"HorizontalPodAutoscaler", h.Metadata}, {"PodDisruptionBudget", p.Metadata}} {
		f.check(o.meta.Name != "", "%s: metadata.name", o.kind)
		f.check(o.meta.Namespace == "", "%s: no namespace in the file; kubectl -n or kustomize sets it", o.kind)
		f.check(o.meta.Labels[appLabel] != "", "%s: label %s", o.kind, appLabel)
	}

	// Deployment and pod.
	ds := d.Spec
	pod := ds.Template.Spec
	podLabels := ds.Template.Metadata.Labels
	f.check(ds.Replicas != nil && *ds.Replicas == 2, "Deployment: replicas 2")
	f.check(selects(ds.Selector.MatchLabels, podLabels), "Deployment: selector.matchLabels must select the pod template's labels")
	f.check(isFalse(pod.AutomountServiceAccountToken), "pod: automountServiceAccountToken: false (the service calls no Kubernetes API)")
	f.check(isFalse(pod.EnableServiceLinks), "pod: enableServiceLinks: false (service links would inject STAGEWRIGHT_* variables)")
	psc := pod.SecurityContext
	f.check(isTrue(psc.RunAsNonRoot), "pod: securityContext.runAsNonRoot: true")
	f.check(psc.RunAsUser != nil && *psc.RunAsUser != 0 && *psc.RunAsUser == img.UID,
		"pod: securityContext.runAsUser must be the image's USER %d", img.UID)
	f.check(psc.SeccompProfile != nil && psc.SeccompProfile.Type == "RuntimeDefault", "pod: seccompProfile RuntimeDefault")
	keys := map[string]bool{}
	for _, tsc := range pod.TopologySpreadConstraints {
		keys[tsc.TopologyKey] = true
		f.check(tsc.MaxSkew >= 1, "topologySpreadConstraints %s: maxSkew >= 1", tsc.TopologyKey)
		f.check(tsc.WhenUnsatisfiable == "ScheduleAnyway" || tsc.WhenUnsatisfiable == "DoNotSchedule",
			"topologySpreadConstraints %s: whenUnsatisfiable ScheduleAnyway or DoNotSchedule", tsc.TopologyKey)
		f.check(selects(tsc.LabelSelector.MatchLabels, podLabels), "topologySpreadConstraints %s: labelSelector must select the pods", tsc.TopologyKey)
	}
	f.check(keys["kubernetes.io/hostname"] && keys["topology.kubernetes.io/zone"],
		"topologySpreadConstraints: spread over kubernetes.io/hostname and topology.kubernetes.io/zone")
	if len(pod.Containers) != 1 {
		f.addf("pod: want one container, got %d", len(pod.Containers))
		return f
	}
	c := pod.Containers[0]

	// Image: the kustomization sets registry and tag.
	f.check(imageTag(c.Image) != "latest", "container: image tag latest")
	var imageSet bool
	for _, im := range k.Images {
		if im.Name == imageName(c.Image) {
			imageSet = true
			f.check(im.NewTag != "" || im.Digest != "", "kustomization images %s: newTag or digest", im.Name)
			f.check(im.NewTag != "latest", "kustomization images %s: latest is not reproducible", im.Name)
		}
	}
	f.check(imageSet, "kustomization.yaml: images: entry for %s", imageName(c.Image))

	// Port: Dockerfile EXPOSE = containerPort = ConfigMap STAGEWRIGHT_ADDR.
	port := 0
	for _, cp := range c.Ports {
		if cp.Name == "http" {
			port = cp.ContainerPort
		}
	}
	f.check(port > 0 && strconv.Itoa(port) == img.Port, "container: port named http = the image's EXPOSE %s, got %d", img.Port, port)
	host, cmPort, err := net.SplitHostPort(cm.Data["STAGEWRIGHT_ADDR"])
	f.check(err == nil && (host == "0.0.0.0" || host == "" || host == "::") && cmPort == strconv.Itoa(port),
		"ConfigMap: STAGEWRIGHT_ADDR must listen on all interfaces at the container port %d, got %q", port, cm.Data["STAGEWRIGHT_ADDR"])
	for key, v := range cm.Data {
		f.check(code.EnvVars[key], "ConfigMap: %s is not read by cmd/stagewright", key)
		if key == "STAGEWRIGHT_DEMO" {
			f.check(v == "false", "ConfigMap: STAGEWRIGHT_DEMO must be false: the image has no testdata")
		}
	}
	fromCM := false
	for _, ef := range c.EnvFrom {
		fromCM = fromCM || (ef.ConfigMapRef != nil && ef.ConfigMapRef.Name == cm.Metadata.Name)
	}
	f.check(fromCM, "container: envFrom configMapRef %s", cm.Metadata.Name)

	// Resources: requests for the scheduler and the HPA, limits to protect
	// the node; GOMEMLIMIT below the memory limit.
	rq, lm := c.Resources.Requests, c.Resources.Limits
	cpuReq, ok1 := cpuCores(rq["cpu"])
	cpuLim, ok2 := cpuCores(lm["cpu"])
	f.check(ok1 && ok2 && cpuReq <= cpuLim, "container: resources cpu request and limit, request <= limit (got %q, %q)", rq["cpu"], lm["cpu"])
	memReq, ok3 := bytesOf(memQuantity, rq["memory"])
	memLim, ok4 := bytesOf(memQuantity, lm["memory"])
	f.check(ok3 && ok4 && memReq <= memLim, "container: resources memory request and limit, request <= limit (got %q, %q)", rq["memory"], lm["memory"])
	for _, e := range c.Env {
		if e.Name == "GOMEMLIMIT" {
			gml, ok := bytesOf(goMemLimit, e.Value)
			f.check(ok && gml < memLim && gml >= memLim/2, "container: GOMEMLIMIT %q: between half and all of the memory limit %s", e.Value, lm["memory"])
		}
	}

	// Probes on the health route, by the named port.
	for _, pr := range []struct {
		name string
		p    *probe
	}{{"readinessProbe", c.ReadinessProbe}, {"livenessProbe", c.LivenessProbe}} {
		if pr.p == nil || pr.p.HTTPGet == nil {
			f.addf("container: %s httpGet", pr.name)
			continue
		}
		f.check(pr.p.HTTPGet.Path == "/healthz", "container: %s path /healthz, got %q", pr.name, pr.p.HTTPGet.Path)
		f.check(code.HealthPath == pr.p.HTTPGet.Path, "container: %s path %s: the router (api/) serves no such GET route", pr.name, pr.p.HTTPGet.Path)
		f.check(pr.p.HTTPGet.Port == "http" || pr.p.HTTPGet.Port == port, "container: %s port http", pr.name)
		f.check(pr.p.PeriodSeconds > 0 && pr.p.TimeoutSeconds > 0 && pr.p.TimeoutSeconds < pr.p.PeriodSeconds,
			"container: %s: periodSeconds and timeoutSeconds set, timeout < period", pr.name)
	}

	// Container hardening.
	sc := c.SecurityContext
	f.check(isFalse(sc.AllowPrivilegeEscalation), "container: allowPrivilegeEscalation: false")
	f.check(!isTrue(sc.Privileged), "container: privileged")
	f.check(isTrue(sc.ReadOnlyRootFilesystem), "container: readOnlyRootFilesystem: true")
	f.check(!isFalse(sc.RunAsNonRoot), "container: runAsNonRoot must not be false")
	f.check(sc.RunAsUser == nil || *sc.RunAsUser != 0, "container: runAsUser 0")
	f.check(sc.Capabilities != nil && slices.Contains(sc.Capabilities.Drop, "ALL") && len(sc.Capabilities.Add) == 0,
		"container: capabilities drop [ALL], add none")
	f.check(sc.SeccompProfile == nil || sc.SeccompProfile.Type == "RuntimeDefault", "container: seccompProfile RuntimeDefault")

	// Graceful stop: preStop pause plus the server's shutdown fit in the
	// grace period.
	pause := 0
	if c.Lifecycle != nil && c.Lifecycle.PreStop != nil && c.Lifecycle.PreStop.Sleep != nil {
		pause = c.Lifecycle.PreStop.Sleep.Seconds
	}
	f.check(pod.TerminationGracePeriodSeconds != nil && *pod.TerminationGracePeriodSeconds > pause+serverShutdownTimeout,
		"pod: terminationGracePeriodSeconds must exceed the preStop pause %d s plus the shutdown timeout %d s", pause, serverShutdownTimeout)

	// Service.
	ss := svc.Spec
	f.check(ss.Type == "ClusterIP", "Service: type ClusterIP, got %q", ss.Type)
	f.check(selects(ss.Selector, podLabels), "Service: selector must select the Deployment's pods")
	f.check(len(ss.Ports) == 1 && (ss.Ports[0].TargetPort == "http" || ss.Ports[0].TargetPort == port),
		"Service: one port with targetPort http")

	// HorizontalPodAutoscaler.
	hs := h.Spec
	f.check(hs.ScaleTargetRef.APIVersion == "apps/v1" && hs.ScaleTargetRef.Kind == "Deployment" && hs.ScaleTargetRef.Name == d.Metadata.Name,
		"HorizontalPodAutoscaler: scaleTargetRef apps/v1 Deployment %s", d.Metadata.Name)
	minR := 1
	if hs.MinReplicas != nil {
		minR = *hs.MinReplicas
	}
	f.check(minR >= 2, "HorizontalPodAutoscaler: minReplicas >= 2, so one pod serves while another is disrupted")
	f.check(hs.MaxReplicas > minR, "HorizontalPodAutoscaler: maxReplicas > minReplicas")
	cpuMetric := false
	for _, mt := range hs.Metrics {
		if mt.Type == "Resource" && mt.Resource != nil && mt.Resource.Name == "cpu" && mt.Resource.Target.Type == "Utilization" {
			u := mt.Resource.Target.AverageUtilization
			cpuMetric = u != nil && *u > 0 && *u <= 100
		}
	}
	f.check(cpuMetric, "HorizontalPodAutoscaler: a Resource cpu metric with Utilization 1..100 %%")

	// PodDisruptionBudget: selects the pods and allows one eviction at the
	// smallest scale.
	ps := p.Spec
	f.check(selects(ps.Selector.MatchLabels, podLabels), "PodDisruptionBudget: selector must select the Deployment's pods")
	f.check((ps.MinAvailable == nil) != (ps.MaxUnavailable == nil), "PodDisruptionBudget: exactly one of minAvailable and maxUnavailable")
	if n, ok := intValue(ps.MaxUnavailable); ps.MaxUnavailable != nil {
		f.check(ok && n >= 1, "PodDisruptionBudget: maxUnavailable >= 1, else no node can be drained")
	}
	if n, ok := intValue(ps.MinAvailable); ps.MinAvailable != nil {
		f.check(ok && n >= 1 && n < minR, "PodDisruptionBudget: 1 <= minAvailable < minReplicas %d", minR)
	}
	return f
}

func TestManifests(t *testing.T) {
	img := repoDockerfile(t)
	m := loadManifests(t, ".")
	reportNone(t, "deploy/", checkManifests(m, img, loadCodeFacts(t)))
}

// TestManifestChecksCatch breaks the real manifests one way each and wants
// the check to say so.
func TestManifestChecksCatch(t *testing.T) {
	img := imageFacts{UID: 65532, Port: "8080", Addr: "0.0.0.0:8080"}
	code := loadCodeFacts(t)
	f := false
	cases := []struct {
		name   string
		mutate func(m *manifests)
		want   string
	}{
		{"one replica", func(m *manifests) { n := 1; m.Deployment.Spec.Replicas = &n }, "replicas 2"},
		{"root allowed", func(m *manifests) { m.Deployment.Spec.Template.Spec.SecurityContext.RunAsNonRoot = &f }, "runAsNonRoot: true"},
		{"other uid", func(m *manifests) { n := 1000; m.Deployment.Spec.Template.Spec.SecurityContext.RunAsUser = &n }, "image's USER"},
		{"no seccomp", func(m *manifests) { m.Deployment.Spec.Template.Spec.SecurityContext.SeccompProfile = nil }, "seccompProfile"},
		{"writable root", func(m *manifests) {
			m.Deployment.Spec.Template.Spec.Containers[0].SecurityContext.ReadOnlyRootFilesystem = &f
		}, "readOnlyRootFilesystem"},
		{"capabilities kept", func(m *manifests) {
			m.Deployment.Spec.Template.Spec.Containers[0].SecurityContext.Capabilities.Drop = []string{"NET_RAW"}
		}, "drop [ALL]"},
		{"no readiness", func(m *manifests) { m.Deployment.Spec.Template.Spec.Containers[0].ReadinessProbe = nil }, "readinessProbe httpGet"},
		{"wrong liveness path", func(m *manifests) {
			m.Deployment.Spec.Template.Spec.Containers[0].LivenessProbe.HTTPGet.Path = "/health"
		}, "path /healthz"},
		{"no cpu limit", func(m *manifests) { delete(m.Deployment.Spec.Template.Spec.Containers[0].Resources.Limits, "cpu") }, "cpu request and limit"},
		{"request over limit", func(m *manifests) { m.Deployment.Spec.Template.Spec.Containers[0].Resources.Requests["memory"] = "1Gi" }, "memory request and limit"},
		{"service links", func(m *manifests) { m.Deployment.Spec.Template.Spec.EnableServiceLinks = nil }, "enableServiceLinks"},
		{"no spread", func(m *manifests) { m.Deployment.Spec.Template.Spec.TopologySpreadConstraints = nil }, "topologySpreadConstraints"},
		{"short grace", func(m *manifests) { n := 10; m.Deployment.Spec.Template.Spec.TerminationGracePeriodSeconds = &n }, "terminationGracePeriodSeconds"},
		{"loopback in pod", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_ADDR"] = "127.0.0.1:8080" }, "STAGEWRIGHT_ADDR"},
		{"unknown setting", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_PORTT"] = "1" }, "not read by cmd/stagewright"},
		{"demo on", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_DEMO"] = "true" }, "STAGEWRIGHT_DEMO"},
		{"node port", func(m *manifests) { m.Service.Spec.Type = "NodePort" }, "ClusterIP"},
		{"service misses pods", func(m *manifests) { m.Service.Spec.Selector = map[string]string{appLabel: "other"} }, "Service: selector"},
		{"hpa target", func(m *manifests) { m.HPA.Spec.ScaleTargetRef.Name = "other" }, "scaleTargetRef"},
		{"hpa memory", func(m *manifests) { m.HPA.Spec.Metrics[0].Resource.Name = "memory" }, "cpu metric"},
		{"hpa one", func(m *manifests) { n := 1; m.HPA.Spec.MinReplicas = &n }, "minReplicas >= 2"},
		{"pdb blocks drains", func(m *manifests) { m.PDB.Spec.MaxUnavailable = 0 }, "maxUnavailable >= 1"},
		{"pdb both", func(m *manifests) { m.PDB.Spec.MinAvailable = 1 }, "exactly one"},
		{"unlisted file", func(m *manifests) { m.Files = append(m.Files, "extra.yaml") }, "resources"},
		{"no image pin", func(m *manifests) { m.Kustomization.Images = nil }, "images: entry"},
		{"namespace", func(m *manifests) { m.Service.Metadata.Namespace = "prod" }, "no namespace"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			m := loadManifests(t, ".")
			tc.mutate(m)
			requireFinding(t, checkManifests(m, img, code), tc.want)
		})
	}
}

// TestStrictDecoding shows that a misspelt or misplaced field fails.
func TestStrictDecoding(t *testing.T) {
	var d deployment
	err := decodeStrict([]byte("apiVersion: apps/v1\nkind: Deployment\nspec:\n  template:\n    spec:\n      containers:\n        - name: x\n          readinesProbe: {}\n"), &d)
	require.ErrorContains(t, err, "readinesProbe")
	err = decodeStrict([]byte("apiVersion: v1\nkind: Service\nspec:\n  type: ClusterIP\n---\napiVersion: v1\nkind: Service\n"), &service{})
	require.ErrorContains(t, err, "one YAML document")
}

func TestQuantities(t *testing.T) {
	for q, want := range map[string]float64{"250m": 0.25, "1": 1, "0.5": 0.5, "2000m": 2} {
		got, ok := cpuCores(q)
		require.True(t, ok, q)
		require.InDelta(t, want, got, 1e-12, q)
	}
	for _, bad := range []string{"", "x", "-1", "0"} {
		_, ok := cpuCores(bad)
		require.False(t, ok, bad)
	}
	for q, want := range map[string]float64{"64Mi": 64 << 20, "1Gi": 1 << 30, "128M": 128e6, "1000": 1000} {
		got, ok := bytesOf(memQuantity, q)
		require.True(t, ok, q)
		require.InDelta(t, want, got, 1e-6, q)
	}
	got, ok := bytesOf(goMemLimit, "230MiB")
	require.True(t, ok)
	require.InDelta(t, 230<<20, got, 1e-6)
	_, ok = bytesOf(goMemLimit, "230Mi") // Go wants MiB
	require.False(t, ok)
}
