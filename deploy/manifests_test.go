package deploy

import (
	"bytes"
	"encoding/json"
	"fmt"
	"net"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"sort"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	appsv1 "k8s.io/api/apps/v1"
	autoscalingv2 "k8s.io/api/autoscaling/v2"
	corev1 "k8s.io/api/core/v1"
	networkingv1 "k8s.io/api/networking/v1"
	policyv1 "k8s.io/api/policy/v1"
	"k8s.io/apimachinery/pkg/api/resource"
	metav1 "k8s.io/apimachinery/pkg/apis/meta/v1"
	"k8s.io/apimachinery/pkg/labels"
	"k8s.io/apimachinery/pkg/util/intstr"
	"sigs.k8s.io/yaml"
)

// appLabel is the label every object carries and the selectors use.
const appLabel = "app.kubernetes.io/name"

// tokenSecret is the Secret (not committed) that holds the API tokens.
const tokenSecret = "stagewright-api-tokens"

// kustomization is the part of kustomization.yaml used here. It is not a
// Kubernetes API object; kustomize build in .ci/run checks it in full,
// and the strict decoding here refuses fields this struct lacks.
type kustomization struct {
	APIVersion string   `json:"apiVersion"`
	Kind       string   `json:"kind"`
	Resources  []string `json:"resources"`
	Images     []struct {
		Name    string `json:"name"`
		NewName string `json:"newName,omitempty"`
		NewTag  string `json:"newTag,omitempty"`
		Digest  string `json:"digest,omitempty"`
	} `json:"images"`
}

// manifests are the objects that deploy/kustomization.yaml lists, and the
// Secret template beside them.
type manifests struct {
	Kustomization kustomization
	Files         []string // *.yaml besides kustomization.yaml and *.example.yaml
	ConfigMap     *corev1.ConfigMap
	Deployment    *appsv1.Deployment
	Service       *corev1.Service
	HPA           *autoscalingv2.HorizontalPodAutoscaler
	PDB           *policyv1.PodDisruptionBudget
	NetworkPolicy *networkingv1.NetworkPolicy
	SecretExample *corev1.Secret // secret.example.yaml, not applied
}

// setOnce stores obj in *dst, refusing a second object of the kind.
func setOnce[T any](dst **T, obj *T, file string) error {
	if *dst != nil {
		return fmt.Errorf("%s: a second %T", file, obj)
	}
	*dst = obj
	return nil
}

func loadManifests(t *testing.T, dir string) *manifests {
	t.Helper()
	m := &manifests{}
	b, err := os.ReadFile(filepath.Join(dir, "kustomization.yaml"))
	require.NoError(t, err)
	j, err := yaml.YAMLToJSONStrict(b)
	require.NoError(t, err)
	dec := json.NewDecoder(bytes.NewReader(j))
	dec.DisallowUnknownFields()
	require.NoError(t, dec.Decode(&m.Kustomization), "kustomization.yaml")

	files, err := filepath.Glob(filepath.Join(dir, "*.yaml"))
	require.NoError(t, err)
	for _, f := range files {
		if base := filepath.Base(f); base != "kustomization.yaml" && !strings.HasSuffix(base, ".example.yaml") {
			m.Files = append(m.Files, base)
		}
	}
	for _, name := range m.Kustomization.Resources {
		b, err := os.ReadFile(filepath.Join(dir, name))
		require.NoError(t, err, "kustomization.yaml lists %s", name)
		objs, err := decodeObjects(b)
		require.NoError(t, err, "%s: strict decoding into the k8s.io/api types", name)
		for _, o := range objs {
			switch o := o.(type) {
			case *corev1.ConfigMap:
				err = setOnce(&m.ConfigMap, o, name)
			case *appsv1.Deployment:
				err = setOnce(&m.Deployment, o, name)
			case *corev1.Service:
				err = setOnce(&m.Service, o, name)
			case *autoscalingv2.HorizontalPodAutoscaler:
				err = setOnce(&m.HPA, o, name)
			case *policyv1.PodDisruptionBudget:
				err = setOnce(&m.PDB, o, name)
			case *networkingv1.NetworkPolicy:
				err = setOnce(&m.NetworkPolicy, o, name)
			case *corev1.Secret:
				err = fmt.Errorf("%s: a Secret in the kustomization would commit its value; see secret.example.yaml", name)
			default:
				err = fmt.Errorf("%s: %T is not expected in the kustomization", name, o)
			}
			require.NoError(t, err)
		}
	}
	b, err = os.ReadFile(filepath.Join(dir, "secret.example.yaml"))
	require.NoError(t, err)
	objs, err := decodeObjects(b)
	require.NoError(t, err, "secret.example.yaml")
	require.Len(t, objs, 1, "secret.example.yaml: one Secret")
	s, ok := objs[0].(*corev1.Secret)
	require.True(t, ok, "secret.example.yaml: a Secret, got %T", objs[0])
	m.SecretExample = s
	return m
}

// selects reports whether a non-empty label selector selects pods with
// the given labels (matchLabels and matchExpressions, as the API server
// evaluates them).
func selects(sel *metav1.LabelSelector, podLabels map[string]string) bool {
	if sel == nil || (len(sel.MatchLabels) == 0 && len(sel.MatchExpressions) == 0) {
		return false
	}
	s, err := metav1.LabelSelectorAsSelector(sel)
	return err == nil && s.Matches(labels.Set(podLabels))
}

// selectsMap is selects for the map selector of a Service.
func selectsMap(sel, podLabels map[string]string) bool {
	return len(sel) > 0 && labels.SelectorFromSet(sel).Matches(labels.Set(podLabels))
}

func isFalse(b *bool) bool { return b != nil && !*b }
func isTrue(b *bool) bool  { return b != nil && *b }

// portIs reports whether an int-or-string port names the container port
// (by name or number).
func portIs(p intstr.IntOrString, name string, number int32) bool {
	if p.Type == intstr.String {
		return p.StrVal == name
	}
	return p.IntVal == number
}

// goMemLimit parses a GOMEMLIMIT value ("230MiB"); Go's suffixes differ
// from Kubernetes quantities.
func goMemLimit(s string) (int64, bool) {
	m := regexp.MustCompile(`^(\d+)(B|KiB|MiB|GiB|TiB)?$`).FindStringSubmatch(s)
	if m == nil {
		return 0, false
	}
	n, err := strconv.ParseInt(m[1], 10, 64)
	f := map[string]int64{"": 1, "B": 1, "KiB": 1 << 10, "MiB": 1 << 20, "GiB": 1 << 30, "TiB": 1 << 40}[m[2]]
	return n * f, err == nil && n > 0
}

// envNames lists the STAGEWRIGHT_* names the pod sets: the ConfigMap's
// keys (read through envFrom) and the container's env.
func envNames(cm *corev1.ConfigMap, c corev1.Container) []string {
	var out []string
	for k := range cm.Data {
		out = append(out, k)
	}
	for _, e := range c.Env {
		out = append(out, e.Name)
	}
	sort.Strings(out)
	return slices.DeleteFunc(out, func(s string) bool { return !strings.HasPrefix(s, "STAGEWRIGHT_") })
}

// checkManifests checks the objects against each other, the image and
// the server's code: what strict decoding cannot see.
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
	for kind, present := range map[string]bool{"ConfigMap": m.ConfigMap != nil, "Deployment": m.Deployment != nil,
		"Service": m.Service != nil, "HorizontalPodAutoscaler": m.HPA != nil, "PodDisruptionBudget": m.PDB != nil,
		"NetworkPolicy": m.NetworkPolicy != nil} {
		f.check(present, "no %s", kind)
	}
	if len(f) > 0 {
		return f
	}
	d, cm, svc, h, p, np := m.Deployment, m.ConfigMap, m.Service, m.HPA, m.PDB, m.NetworkPolicy
	for _, o := range []struct {
		kind string
		meta metav1.ObjectMeta
	}{{"ConfigMap", cm.ObjectMeta}, {"Deployment", d.ObjectMeta}, {"Service", svc.ObjectMeta},
		{"HorizontalPodAutoscaler", h.ObjectMeta}, {"PodDisruptionBudget", p.ObjectMeta}, {"NetworkPolicy", np.ObjectMeta}} {
		f.check(o.meta.Name != "", "%s: metadata.name", o.kind)
		f.check(o.meta.Namespace == "", "%s: no namespace in the file; kubectl -n or kustomize sets it", o.kind)
		f.check(o.meta.Labels[appLabel] != "", "%s: label %s", o.kind, appLabel)
	}

	// Deployment and pod.
	ds := d.Spec
	pod := ds.Template.Spec
	podLabels := ds.Template.Labels
	f.check(ds.Replicas != nil && *ds.Replicas >= 2, "Deployment: replicas >= 2, so one pod serves while another restarts")
	f.check(selects(ds.Selector, podLabels), "Deployment: selector must select the pod template's labels")
	f.check(isFalse(pod.AutomountServiceAccountToken), "pod: automountServiceAccountToken: false (the service calls no Kubernetes API)")
	f.check(isFalse(pod.EnableServiceLinks), "pod: enableServiceLinks: false (service links would inject STAGEWRIGHT_* variables)")
	psc := pod.SecurityContext
	if psc == nil {
		psc = &corev1.PodSecurityContext{}
	}
	f.check(isTrue(psc.RunAsNonRoot), "pod: securityContext.runAsNonRoot: true")
	f.check(psc.RunAsUser != nil && *psc.RunAsUser != 0 && *psc.RunAsUser == img.UID,
		"pod: securityContext.runAsUser must be the image's USER %d", img.UID)
	f.check(psc.SeccompProfile != nil && psc.SeccompProfile.Type == corev1.SeccompProfileTypeRuntimeDefault, "pod: seccompProfile RuntimeDefault")
	keys := map[string]bool{}
	for _, tsc := range pod.TopologySpreadConstraints {
		keys[tsc.TopologyKey] = true
		f.check(selects(tsc.LabelSelector, podLabels), "topologySpreadConstraints %s: labelSelector must select the pods", tsc.TopologyKey)
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
	const portName = "http"
	var port int32
	for _, cp := range c.Ports {
		if cp.Name == portName {
			port = cp.ContainerPort
		}
	}
	f.check(port > 0 && strconv.Itoa(int(port)) == img.Port, "container: port named http = the image's EXPOSE %s, got %d", img.Port, port)
	host, cmPort, err := net.SplitHostPort(cm.Data["STAGEWRIGHT_ADDR"])
	f.check(err == nil && (host == "0.0.0.0" || host == "" || host == "::") && cmPort == strconv.Itoa(int(port)),
		"ConfigMap: STAGEWRIGHT_ADDR must listen on all interfaces at the container port %d, got %q", port, cm.Data["STAGEWRIGHT_ADDR"])

	// Settings: every STAGEWRIGHT_* name the pod sets is one the server
	// reads (a misspelt name would be ignored silently).
	for _, name := range envNames(cm, c) {
		f.check(code.EnvVars[name], "%s is set for the pod but cmd/stagewright does not read it", name)
	}
	f.check(cm.Data["STAGEWRIGHT_DEMO"] == "" || cm.Data["STAGEWRIGHT_DEMO"] == "false", "ConfigMap: STAGEWRIGHT_DEMO must be false: the image has no testdata")
	fromCM := false
	for _, ef := range c.EnvFrom {
		fromCM = fromCM || (ef.ConfigMapRef != nil && ef.ConfigMapRef.Name == cm.Name)
	}
	f.check(fromCM, "container: envFrom configMapRef %s", cm.Name)

	// The API tokens: from the Secret only, never a literal.
	_, inCM := cm.Data["STAGEWRIGHT_API_TOKENS"]
	f.check(!inCM, "ConfigMap: STAGEWRIGHT_API_TOKENS must come from a Secret, not the ConfigMap")
	var ref *corev1.SecretKeySelector
	for _, e := range c.Env {
		if e.Name == "STAGEWRIGHT_API_TOKENS" {
			f.check(e.Value == "", "container: STAGEWRIGHT_API_TOKENS has a literal value; use secretKeyRef")
			if e.ValueFrom != nil {
				ref = e.ValueFrom.SecretKeyRef
			}
		}
	}
	if ref == nil {
		f.addf("container: STAGEWRIGHT_API_TOKENS valueFrom.secretKeyRef (Secret %s)", tokenSecret)
	} else {
		f.check(ref.Name == tokenSecret && ref.Key != "", "container: STAGEWRIGHT_API_TOKENS from Secret %s, got %q key %q", tokenSecret, ref.Name, ref.Key)
		f.check(isTrue(ref.Optional), "container: STAGEWRIGHT_API_TOKENS secretKeyRef optional: true, so the pods start without the Secret")
		s := m.SecretExample
		f.check(s.Name == ref.Name, "secret.example.yaml: name %q, but the Deployment reads Secret %q", s.Name, ref.Name)
		v, ok := s.StringData[ref.Key]
		f.check(ok && len(s.Data) == 0, "secret.example.yaml: stringData.%s (the key the Deployment reads), and no data", ref.Key)
		f.check(strings.HasPrefix(v, "REPLACE-ME"), "secret.example.yaml: stringData.%s must be an obvious placeholder (REPLACE-ME...), not a token", ref.Key)
	}

	// Resources: requests for the scheduler and the HPA, limits to protect
	// the node; GOMEMLIMIT below the memory limit.
	for _, r := range []corev1.ResourceName{corev1.ResourceCPU, corev1.ResourceMemory} {
		rq, ok1 := c.Resources.Requests[r]
		lm, ok2 := c.Resources.Limits[r]
		f.check(ok1 && ok2 && rq.Sign() > 0 && rq.Cmp(lm) <= 0, "container: resources %s request and limit, 0 < request <= limit (got %v, %v)", r, rq.String(), lm.String())
	}
	memLim := c.Resources.Limits[corev1.ResourceMemory]
	for _, e := range c.Env {
		if e.Name == "GOMEMLIMIT" {
			gml, ok := goMemLimit(e.Value)
			f.check(ok && gml < memLim.Value() && gml >= memLim.Value()/2, "container: GOMEMLIMIT %q: between half and all of the memory limit %s", e.Value, memLim.String())
		}
	}

	// Probes on the server's routes, by the named port.
	for _, pr := range []struct {
		name, path string
		p          *corev1.Probe
	}{{"readinessProbe", "/readyz", c.ReadinessProbe}, {"livenessProbe", "/healthz", c.LivenessProbe}} {
		if pr.p == nil || pr.p.HTTPGet == nil {
			f.addf("container: %s httpGet", pr.name)
			continue
		}
		g := pr.p.HTTPGet
		f.check(g.Path == pr.path, "container: %s path %s, got %q", pr.name, pr.path, g.Path)
		f.check(code.Paths[g.Path], "container: %s path %s: the server (api/, cmd/stagewright) names no such route", pr.name, g.Path)
		f.check(portIs(g.Port, portName, port), "container: %s port http", pr.name)
		f.check(pr.p.PeriodSeconds > 0 && pr.p.TimeoutSeconds > 0 && pr.p.TimeoutSeconds < pr.p.PeriodSeconds,
			"container: %s: periodSeconds and timeoutSeconds set, timeout < period", pr.name)
	}

	// Metrics: scrape annotations on the pods point at the served route.
	an := ds.Template.Annotations
	f.check(an["prometheus.io/scrape"] == "true", "pod: annotation prometheus.io/scrape: \"true\"")
	f.check(an["prometheus.io/port"] == strconv.Itoa(int(port)), "pod: annotation prometheus.io/port must be the container port %d, got %q", port, an["prometheus.io/port"])
	f.check(an["prometheus.io/path"] == "/metrics", "pod: annotation prometheus.io/path /metrics, got %q", an["prometheus.io/path"])
	f.check(code.Paths[an["prometheus.io/path"]], "pod: annotation prometheus.io/path %s: the server names no such route", an["prometheus.io/path"])

	// Container hardening.
	sc := c.SecurityContext
	if sc == nil {
		sc = &corev1.SecurityContext{}
	}
	f.check(isFalse(sc.AllowPrivilegeEscalation), "container: allowPrivilegeEscalation: false")
	f.check(!isTrue(sc.Privileged), "container: privileged")
	f.check(isTrue(sc.ReadOnlyRootFilesystem), "container: readOnlyRootFilesystem: true")
	f.check(!isFalse(sc.RunAsNonRoot), "container: runAsNonRoot must not be false")
	f.check(sc.RunAsUser == nil || *sc.RunAsUser != 0, "container: runAsUser 0")
	f.check(sc.Capabilities != nil && slices.Contains(sc.Capabilities.Drop, "ALL") && len(sc.Capabilities.Add) == 0,
		"container: capabilities drop [ALL], add none")
	f.check(sc.SeccompProfile == nil || sc.SeccompProfile.Type == corev1.SeccompProfileTypeRuntimeDefault, "container: seccompProfile RuntimeDefault")

	// A read-only root needs a writable /tmp.
	if isTrue(sc.ReadOnlyRootFilesystem) {
		tmp := false
		for _, vm := range c.VolumeMounts {
			if vm.MountPath != "/tmp" || vm.ReadOnly {
				continue
			}
			for _, v := range pod.Volumes {
				tmp = tmp || (v.Name == vm.Name && v.EmptyDir != nil)
			}
		}
		f.check(tmp, "container: readOnlyRootFilesystem needs a writable emptyDir mounted at /tmp")
	}

	// Graceful stop: the preStop pause plus the server's shutdown grace fit
	// in the termination grace period.
	var pause int64
	if c.Lifecycle != nil && c.Lifecycle.PreStop != nil && c.Lifecycle.PreStop.Sleep != nil {
		pause = c.Lifecycle.PreStop.Sleep.Seconds
	}
	grace, err := time.ParseDuration(cm.Data["STAGEWRIGHT_SHUTDOWN_GRACE"])
	if err != nil || grace <= 0 {
		f.addf("ConfigMap: STAGEWRIGHT_SHUTDOWN_GRACE must be set to a positive Go duration, got %q", cm.Data["STAGEWRIGHT_SHUTDOWN_GRACE"])
	} else {
		delay, _ := time.ParseDuration(cm.Data["STAGEWRIGHT_SHUTDOWN_DELAY"]) // unset: 0
		need := time.Duration(pause)*time.Second + delay + grace
		f.check(pod.TerminationGracePeriodSeconds != nil && time.Duration(*pod.TerminationGracePeriodSeconds)*time.Second > need,
			"pod: terminationGracePeriodSeconds must exceed the preStop pause %d s plus STAGEWRIGHT_SHUTDOWN_DELAY %s plus STAGEWRIGHT_SHUTDOWN_GRACE %s", pause, delay, grace)
	}
	// A calculation must end before the write deadline cuts the answer.
	ct, err1 := time.ParseDuration(cm.Data["STAGEWRIGHT_COMPUTE_TIMEOUT"])
	wt, err2 := time.ParseDuration(cm.Data["STAGEWRIGHT_WRITE_TIMEOUT"])
	if err1 == nil && err2 == nil {
		f.check(ct > 0 && ct < wt, "ConfigMap: STAGEWRIGHT_COMPUTE_TIMEOUT %s must be below STAGEWRIGHT_WRITE_TIMEOUT %s", ct, wt)
	}

	// Service.
	ss := svc.Spec
	f.check(ss.Type == corev1.ServiceTypeClusterIP, "Service: type ClusterIP, got %q", ss.Type)
	f.check(selectsMap(ss.Selector, podLabels), "Service: selector must select the Deployment's pods")
	f.check(len(ss.Ports) == 1 && portIs(ss.Ports[0].TargetPort, portName, port), "Service: one port with targetPort http")

	// HorizontalPodAutoscaler.
	hs := h.Spec
	f.check(hs.ScaleTargetRef.APIVersion == "apps/v1" && hs.ScaleTargetRef.Kind == "Deployment" && hs.ScaleTargetRef.Name == d.Name,
		"HorizontalPodAutoscaler: scaleTargetRef apps/v1 Deployment %s", d.Name)
	minR := int32(1)
	if hs.MinReplicas != nil {
		minR = *hs.MinReplicas
	}
	f.check(minR >= 2, "HorizontalPodAutoscaler: minReplicas >= 2, so one pod serves while another is disrupted")
	f.check(hs.MaxReplicas > minR, "HorizontalPodAutoscaler: maxReplicas > minReplicas")
	cpuMetric := false
	for _, mt := range hs.Metrics {
		if mt.Type == autoscalingv2.ResourceMetricSourceType && mt.Resource != nil && mt.Resource.Name == corev1.ResourceCPU &&
			mt.Resource.Target.Type == autoscalingv2.UtilizationMetricType {
			u := mt.Resource.Target.AverageUtilization
			cpuMetric = u != nil && *u > 0 && *u <= 100
		}
	}
	f.check(cpuMetric, "HorizontalPodAutoscaler: a Resource cpu metric with Utilization 1..100 %%")
	_, hasCPU := c.Resources.Requests[corev1.ResourceCPU]
	f.check(hasCPU, "HorizontalPodAutoscaler: CPU utilisation needs a CPU request on the container")

	// PodDisruptionBudget: selects the pods and allows one eviction at the
	// smallest scale.
	ps := p.Spec
	f.check(selects(ps.Selector, podLabels), "PodDisruptionBudget: selector must select the Deployment's pods")
	f.check((ps.MinAvailable == nil) != (ps.MaxUnavailable == nil), "PodDisruptionBudget: exactly one of minAvailable and maxUnavailable")
	if ps.MaxUnavailable != nil {
		n, err := intstr.GetScaledValueFromIntOrPercent(ps.MaxUnavailable, int(minR), true)
		f.check(err == nil && n >= 1, "PodDisruptionBudget: maxUnavailable >= 1 at minReplicas, else no node can be drained")
	}
	if ps.MinAvailable != nil {
		n, err := intstr.GetScaledValueFromIntOrPercent(ps.MinAvailable, int(minR), true)
		f.check(err == nil && n >= 1 && n < int(minR), "PodDisruptionBudget: 1 <= minAvailable < minReplicas %d", minR)
	}

	checkNetworkPolicy(np, podLabels, portName, port, &f)
	return f
}

// checkNetworkPolicy: the policy applies to these pods only, admits
// traffic only to the container port and only from named peers, and lets
// out DNS only.
func checkNetworkPolicy(np *networkingv1.NetworkPolicy, podLabels map[string]string, portName string, port int32, f *findings) {
	s := np.Spec
	f.check(selects(&s.PodSelector, podLabels), "NetworkPolicy: podSelector must select the Deployment's pods (and not every pod of the namespace)")
	f.check(slices.Contains(s.PolicyTypes, networkingv1.PolicyTypeIngress) && slices.Contains(s.PolicyTypes, networkingv1.PolicyTypeEgress),
		"NetworkPolicy: policyTypes Ingress and Egress")
	f.check(len(s.Ingress) > 0, "NetworkPolicy: no ingress rule: nothing could reach the service")
	otherNamespace := false
	for i, r := range s.Ingress {
		f.check(len(r.From) > 0, "NetworkPolicy: ingress rule %d has no from: it admits every source", i)
		f.check(len(r.Ports) > 0, "NetworkPolicy: ingress rule %d has no ports: it admits every port", i)
		for _, pp := range r.Ports {
			f.check(pp.Port != nil && portIs(*pp.Port, portName, port) && pp.EndPort == nil &&
				(pp.Protocol == nil || *pp.Protocol == corev1.ProtocolTCP),
				"NetworkPolicy: ingress rule %d: only TCP to the container port http (%d)", i, port)
		}
		for _, peer := range r.From {
			f.check(peer.IPBlock == nil, "NetworkPolicy: ingress rule %d: no ipBlock; name the namespaces and pods", i)
			if peer.NamespaceSelector != nil {
				f.check(len(peer.NamespaceSelector.MatchLabels)+len(peer.NamespaceSelector.MatchExpressions) > 0,
					"NetworkPolicy: ingress rule %d: an empty namespaceSelector admits every namespace", i)
				otherNamespace = true
			}
		}
	}
	f.check(otherNamespace, "NetworkPolicy: no ingress from another namespace (the ingress controller, the monitoring namespace)")
	for i, r := range s.Egress {
		f.check(len(r.To) > 0, "NetworkPolicy: egress rule %d has no to: it lets out to everywhere", i)
		f.check(len(r.Ports) > 0, "NetworkPolicy: egress rule %d has no ports", i)
		for _, pp := range r.Ports {
			f.check(pp.Port != nil && pp.Port.Type == intstr.Int && pp.Port.IntVal == 53 && pp.EndPort == nil,
				"NetworkPolicy: egress rule %d: DNS (port 53) only; the service calls nothing", i)
		}
	}
}

func TestManifests(t *testing.T) {
	img := repoDockerfile(t)
	m := loadManifests(t, ".")
	reportNone(t, "deploy/", checkManifests(m, img, loadCodeFacts(t)))
}

// TestManifestChecksCatch breaks the real manifests one way each and wants
// the check to say so. The code facts are those the server must have
// (TestServerConfigNames checks that it does), so that these tests of the
// checks do not depend on the state of cmd/stagewright.
func TestManifestChecksCatch(t *testing.T) {
	img := imageFacts{UID: 65532, Port: "8080", Addr: "0.0.0.0:8080"}
	code := codeFacts{EnvVars: map[string]bool{}, Paths: map[string]bool{}}
	for _, n := range serverEnv {
		code.EnvVars[n] = true
	}
	for _, p := range servedPaths {
		code.Paths[p] = true
	}
	reportNone(t, "deploy/ with the server's contract", checkManifests(loadManifests(t, "."), img, code))

	f := false
	one := int32(1)
	ctr := func(m *manifests) *corev1.Container { return &m.Deployment.Spec.Template.Spec.Containers[0] }
	env := func(m *manifests, name string) *corev1.EnvVar {
		for i := range ctr(m).Env {
			if ctr(m).Env[i].Name == name {
				return &ctr(m).Env[i]
			}
		}
		t.Fatalf("no env %s", name)
		return nil
	}
	cases := []struct {
		name   string
		mutate func(m *manifests)
		want   string
	}{
		{"one replica", func(m *manifests) { m.Deployment.Spec.Replicas = &one }, "replicas >= 2"},
		{"selector misses pods", func(m *manifests) { m.Deployment.Spec.Selector.MatchLabels[appLabel] = "other" }, "Deployment: selector"},
		{"selector expression misses pods", func(m *manifests) {
			m.Deployment.Spec.Selector.MatchExpressions = []metav1.LabelSelectorRequirement{{Key: appLabel, Operator: metav1.LabelSelectorOpNotIn, Values: []string{"stagewright"}}}
		}, "Deployment: selector"},
		{"root allowed", func(m *manifests) { m.Deployment.Spec.Template.Spec.SecurityContext.RunAsNonRoot = &f }, "runAsNonRoot: true"},
		{"other uid", func(m *manifests) { n := int64(1000); m.Deployment.Spec.Template.Spec.SecurityContext.RunAsUser = &n }, "image's USER"},
		{"no seccomp", func(m *manifests) { m.Deployment.Spec.Template.Spec.SecurityContext.SeccompProfile = nil }, "seccompProfile"},
		{"writable root", func(m *manifests) { ctr(m).SecurityContext.ReadOnlyRootFilesystem = &f }, "readOnlyRootFilesystem"},
		{"escalation", func(m *manifests) { ctr(m).SecurityContext.AllowPrivilegeEscalation = nil }, "allowPrivilegeEscalation"},
		{"capabilities kept", func(m *manifests) { ctr(m).SecurityContext.Capabilities.Drop = []corev1.Capability{"NET_RAW"} }, "drop [ALL]"},
		{"no tmp", func(m *manifests) { ctr(m).VolumeMounts = nil }, "emptyDir mounted at /tmp"},
		{"tmp not emptyDir", func(m *manifests) {
			m.Deployment.Spec.Template.Spec.Volumes[0].VolumeSource = corev1.VolumeSource{ConfigMap: &corev1.ConfigMapVolumeSource{}}
		}, "emptyDir mounted at /tmp"},
		{"no readiness", func(m *manifests) { ctr(m).ReadinessProbe = nil }, "readinessProbe httpGet"},
		{"readiness on healthz", func(m *manifests) { ctr(m).ReadinessProbe.HTTPGet.Path = "/healthz" }, "readinessProbe path /readyz"},
		{"wrong liveness path", func(m *manifests) { ctr(m).LivenessProbe.HTTPGet.Path = "/health" }, "path /healthz"},
		{"probe on other port", func(m *manifests) { ctr(m).LivenessProbe.HTTPGet.Port = intstr.FromString("metrics") }, "livenessProbe port http"},
		{"probe on other number", func(m *manifests) { ctr(m).ReadinessProbe.HTTPGet.Port = intstr.FromInt32(9090) }, "readinessProbe port http"},
		{"route not served", func(m *manifests) { ctr(m).LivenessProbe.HTTPGet.Path = "/live" }, "names no such route"},
		{"no cpu limit", func(m *manifests) { delete(ctr(m).Resources.Limits, corev1.ResourceCPU) }, "cpu request and limit"},
		{"no memory request", func(m *manifests) { delete(ctr(m).Resources.Requests, corev1.ResourceMemory) }, "memory request and limit"},
		{"request over limit", func(m *manifests) { ctr(m).Resources.Requests[corev1.ResourceMemory] = resource.MustParse("1Gi") }, "memory request and limit"},
		{"GOMEMLIMIT over limit", func(m *manifests) { env(m, "GOMEMLIMIT").Value = "300MiB" }, "GOMEMLIMIT"},
		{"service links", func(m *manifests) { m.Deployment.Spec.Template.Spec.EnableServiceLinks = nil }, "enableServiceLinks"},
		{"no spread", func(m *manifests) { m.Deployment.Spec.Template.Spec.TopologySpreadConstraints = nil }, "topologySpreadConstraints"},
		{"short grace", func(m *manifests) { n := int64(25); m.Deployment.Spec.Template.Spec.TerminationGracePeriodSeconds = &n }, "terminationGracePeriodSeconds"},
		{"long shutdown", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_SHUTDOWN_GRACE"] = "30s" }, "terminationGracePeriodSeconds"},
		{"long shutdown delay", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_SHUTDOWN_DELAY"] = "10s" }, "terminationGracePeriodSeconds"},
		{"no shutdown grace", func(m *manifests) { delete(m.ConfigMap.Data, "STAGEWRIGHT_SHUTDOWN_GRACE") }, "STAGEWRIGHT_SHUTDOWN_GRACE must be set"},
		{"compute past write", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_COMPUTE_TIMEOUT"] = "1m" }, "STAGEWRIGHT_COMPUTE_TIMEOUT"},
		{"loopback in pod", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_ADDR"] = "127.0.0.1:8080" }, "STAGEWRIGHT_ADDR"},
		{"unknown setting", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_MAX_INFLIGHT"] = "1" }, "STAGEWRIGHT_MAX_INFLIGHT is set for the pod but cmd/stagewright does not read it"},
		{"unknown env", func(m *manifests) {
			ctr(m).Env = append(ctr(m).Env, corev1.EnvVar{Name: "STAGEWRIGHT_TOKENS", Value: "x"})
		}, "STAGEWRIGHT_TOKENS is set"},
		{"demo on", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_DEMO"] = "true" }, "STAGEWRIGHT_DEMO"},
		{"token in ConfigMap", func(m *manifests) { m.ConfigMap.Data["STAGEWRIGHT_API_TOKENS"] = "abc" }, "not the ConfigMap"},
		{"literal token", func(m *manifests) { e := env(m, "STAGEWRIGHT_API_TOKENS"); e.ValueFrom, e.Value = nil, "abc" }, "literal value"},
		{"token from ConfigMap ref", func(m *manifests) {
			env(m, "STAGEWRIGHT_API_TOKENS").ValueFrom = &corev1.EnvVarSource{ConfigMapKeyRef: &corev1.ConfigMapKeySelector{Key: "t"}}
		}, "valueFrom.secretKeyRef"},
		{"other secret", func(m *manifests) { env(m, "STAGEWRIGHT_API_TOKENS").ValueFrom.SecretKeyRef.Name = "tokens" }, "from Secret stagewright-api-tokens"},
		{"secret required", func(m *manifests) { env(m, "STAGEWRIGHT_API_TOKENS").ValueFrom.SecretKeyRef.Optional = nil }, "optional: true"},
		{"example key differs", func(m *manifests) { env(m, "STAGEWRIGHT_API_TOKENS").ValueFrom.SecretKeyRef.Key = "token" }, "stringData.token"},
		{"example with a value", func(m *manifests) { m.SecretExample.StringData["tokens"] = "8f14e45fceea167a5a36dedd4bea2543" }, "placeholder"},
		{"no scrape", func(m *manifests) { delete(m.Deployment.Spec.Template.Annotations, "prometheus.io/scrape") }, "prometheus.io/scrape"},
		{"scrape port", func(m *manifests) { m.Deployment.Spec.Template.Annotations["prometheus.io/port"] = "9090" }, "prometheus.io/port"},
		{"scrape path", func(m *manifests) { m.Deployment.Spec.Template.Annotations["prometheus.io/path"] = "/stats" }, "prometheus.io/path"},
		{"node port", func(m *manifests) { m.Service.Spec.Type = corev1.ServiceTypeNodePort }, "ClusterIP"},
		{"service misses pods", func(m *manifests) { m.Service.Spec.Selector = map[string]string{appLabel: "other"} }, "Service: selector"},
		{"service selects all", func(m *manifests) { m.Service.Spec.Selector = nil }, "Service: selector"},
		{"service target", func(m *manifests) { m.Service.Spec.Ports[0].TargetPort = intstr.FromInt32(80) }, "targetPort http"},
		{"hpa target", func(m *manifests) { m.HPA.Spec.ScaleTargetRef.Name = "other" }, "scaleTargetRef"},
		{"hpa kind", func(m *manifests) { m.HPA.Spec.ScaleTargetRef.Kind = "StatefulSet" }, "scaleTargetRef"},
		{"hpa memory", func(m *manifests) { m.HPA.Spec.Metrics[0].Resource.Name = corev1.ResourceMemory }, "cpu metric"},
		{"hpa one", func(m *manifests) { m.HPA.Spec.MinReplicas = &one }, "minReplicas >= 2"},
		{"pdb blocks drains", func(m *manifests) { z := intstr.FromInt32(0); m.PDB.Spec.MaxUnavailable = &z }, "maxUnavailable >= 1"},
		{"pdb percent rounds up to one pod", func(m *manifests) { z := intstr.FromString("10%"); m.PDB.Spec.MaxUnavailable = &z }, ""},
		{"pdb both", func(m *manifests) { o := intstr.FromInt32(1); m.PDB.Spec.MinAvailable = &o }, "exactly one"},
		{"pdb misses pods", func(m *manifests) { m.PDB.Spec.Selector.MatchLabels[appLabel] = "other" }, "PodDisruptionBudget: selector"},
		{"netpol all pods", func(m *manifests) { m.NetworkPolicy.Spec.PodSelector = metav1.LabelSelector{} }, "NetworkPolicy: podSelector"},
		{"netpol no egress type", func(m *manifests) {
			m.NetworkPolicy.Spec.PolicyTypes = []networkingv1.PolicyType{networkingv1.PolicyTypeIngress}
		}, "policyTypes"},
		{"netpol from anywhere", func(m *manifests) { m.NetworkPolicy.Spec.Ingress[0].From = nil }, "admits every source"},
		{"netpol any port", func(m *manifests) { m.NetworkPolicy.Spec.Ingress[1].Ports = nil }, "admits every port"},
		{"netpol other port", func(m *manifests) { p := intstr.FromInt32(9090); m.NetworkPolicy.Spec.Ingress[1].Ports[0].Port = &p }, "only TCP to the container port"},
		{"netpol ipBlock", func(m *manifests) {
			m.NetworkPolicy.Spec.Ingress[0].From = append(m.NetworkPolicy.Spec.Ingress[0].From, networkingv1.NetworkPolicyPeer{IPBlock: &networkingv1.IPBlock{CIDR: "0.0.0.0/0"}})
		}, "no ipBlock"},
		{"netpol every namespace", func(m *manifests) {
			m.NetworkPolicy.Spec.Ingress[1].From[0].NamespaceSelector = &metav1.LabelSelector{}
		}, "every namespace"},
		{"netpol same namespace only", func(m *manifests) {
			m.NetworkPolicy.Spec.Ingress = m.NetworkPolicy.Spec.Ingress[:1]
			m.NetworkPolicy.Spec.Ingress[0].From = m.NetworkPolicy.Spec.Ingress[0].From[:1]
		}, "another namespace"},
		{"netpol egress anywhere", func(m *manifests) { m.NetworkPolicy.Spec.Egress[0].To = nil }, "lets out to everywhere"},
		{"netpol egress https", func(m *manifests) { p := intstr.FromInt32(443); m.NetworkPolicy.Spec.Egress[0].Ports[0].Port = &p }, "DNS (port 53) only"},
		{"unlisted file", func(m *manifests) { m.Files = append(m.Files, "extra.yaml") }, "resources"},
		{"no network policy", func(m *manifests) { m.NetworkPolicy = nil }, "no NetworkPolicy"},
		{"no image pin", func(m *manifests) { m.Kustomization.Images = nil }, "images: entry"},
		{"namespace", func(m *manifests) { m.Service.Namespace = "prod" }, "no namespace"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			m := loadManifests(t, ".")
			tc.mutate(m)
			fs := checkManifests(m, img, code)
			if tc.want == "" {
				reportNone(t, tc.name+" (allowed)", fs)
				return
			}
			requireFinding(t, fs, tc.want)
		})
	}
}

func TestGoMemLimit(t *testing.T) {
	n, ok := goMemLimit("230MiB")
	require.True(t, ok)
	require.Equal(t, int64(230<<20), n)
	n, ok = goMemLimit("1000")
	require.True(t, ok)
	require.Equal(t, int64(1000), n)
	for _, bad := range []string{"230Mi", "", "0", "-1MiB", "1.5GiB"} { // Go wants MiB, integers
		_, ok = goMemLimit(bad)
		require.False(t, ok, bad)
	}
}

// TestLocalRunMatchesConfigMap: the shell block of deploy/README.md's
// "Run locally what the pods run" exports the ConfigMap's values (the
// address on loopback, same port), the Deployment's GOMEMLIMIT, and
// nothing else but the Secret's STAGEWRIGHT_API_TOKENS.
func TestLocalRunMatchesConfigMap(t *testing.T) {
	b, err := os.ReadFile("README.md")
	require.NoError(t, err)
	_, sec, ok := strings.Cut(string(b), "## Run locally what the pods run")
	require.True(t, ok, "README.md: no section \"Run locally what the pods run\"")
	_, block, ok := strings.Cut(sec, "```sh\n")
	require.True(t, ok, "README.md: no sh block in the local-run section")
	block, _, _ = strings.Cut(block, "```")
	exports := map[string]string{}
	for _, m := range regexp.MustCompile(`(?m)^export ([A-Z0-9_]+)=(\S*)`).FindAllStringSubmatch(block, -1) {
		exports[m[1]] = m[2]
	}
	m := loadManifests(t, ".")
	for k, v := range m.ConfigMap.Data {
		got, ok := exports[k]
		require.True(t, ok, "README local run: no export of %s", k)
		if k == "STAGEWRIGHT_ADDR" {
			_, port, _ := net.SplitHostPort(v)
			require.Equal(t, net.JoinHostPort("127.0.0.1", port), got, "README local run: %s on loopback at the pod's port", k)
			continue
		}
		require.Equal(t, v, got, "README local run: %s", k)
	}
	for _, e := range m.Deployment.Spec.Template.Spec.Containers[0].Env {
		if e.Value != "" {
			require.Equal(t, e.Value, exports[e.Name], "README local run: %s as in the Deployment", e.Name)
		}
	}
	for k := range exports {
		_, inCM := m.ConfigMap.Data[k]
		require.True(t, inCM || k == "GOMEMLIMIT" || k == "STAGEWRIGHT_API_TOKENS", "README local run: %s is not in the ConfigMap", k)
	}
}
