package deploy

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
	appsv1 "k8s.io/api/apps/v1"
	autoscalingv2 "k8s.io/api/autoscaling/v2"
	corev1 "k8s.io/api/core/v1"
	networkingv1 "k8s.io/api/networking/v1"
	policyv1 "k8s.io/api/policy/v1"
	metav1 "k8s.io/apimachinery/pkg/apis/meta/v1"
	utilyaml "k8s.io/apimachinery/pkg/util/yaml"
	kjson "sigs.k8s.io/json"
	"sigs.k8s.io/yaml"
)

// The manifests are decoded into the real Kubernetes API types
// (k8s.io/api), so the schema is the one the API server has: a field that
// does not exist at that place (a typo, a wrong indentation, a field of a
// newer or older API version) fails here, as kubectl's strict field
// validation would fail it.

// kindTypes maps "apiVersion kind" to a new object of its Go type. Any
// other kind in a manifest is an error.
var kindTypes = map[string]func() any{
	"apps/v1 Deployment":                     func() any { return &appsv1.Deployment{} },
	"v1 Service":                             func() any { return &corev1.Service{} },
	"v1 ConfigMap":                           func() any { return &corev1.ConfigMap{} },
	"v1 Secret":                              func() any { return &corev1.Secret{} },
	"autoscaling/v2 HorizontalPodAutoscaler": func() any { return &autoscalingv2.HorizontalPodAutoscaler{} },
	"policy/v1 PodDisruptionBudget":          func() any { return &policyv1.PodDisruptionBudget{} },
	"networking.k8s.io/v1 NetworkPolicy":     func() any { return &networkingv1.NetworkPolicy{} },
}

// decodeObjects decodes every YAML document of a manifest file into its
// k8s.io/api type. Each document goes YAML -> JSON (sigs.k8s.io/yaml,
// duplicate keys refused) -> a json.Decoder with DisallowUnknownFields.
// encoding/json matches field names without regard to case, the API
// server does not, so each document is decoded a second time with
// sigs.k8s.io/json's case-sensitive strict decoder (the one the API
// server's strict field validation uses). Empty documents are skipped.
func decodeObjects(b []byte) ([]any, error) {
	r := utilyaml.NewYAMLReader(bufio.NewReader(bytes.NewReader(b)))
	var out []any
	for n := 1; ; n++ {
		doc, err := r.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return nil, fmt.Errorf("document %d: %w", n, err)
		}
		obj, err := decodeObject(doc)
		if err != nil {
			return nil, fmt.Errorf("document %d: %w", n, err)
		}
		if obj != nil {
			out = append(out, obj)
		}
	}
	return out, nil
}

// decodeObject decodes one YAML document; nil, nil for an empty one.
func decodeObject(doc []byte) (any, error) {
	j, err := yaml.YAMLToJSONStrict(doc)
	if err != nil {
		return nil, err
	}
	if t := bytes.TrimSpace(j); len(t) == 0 || string(t) == "null" {
		return nil, nil
	}
	var tm metav1.TypeMeta
	if err := json.Unmarshal(j, &tm); err != nil {
		return nil, fmt.Errorf("not an object: %w", err)
	}
	mk, ok := kindTypes[tm.APIVersion+" "+tm.Kind]
	if !ok {
		return nil, fmt.Errorf("apiVersion %q kind %q: not a kind these manifests may hold", tm.APIVersion, tm.Kind)
	}
	obj := mk()
	dec := json.NewDecoder(bytes.NewReader(j))
	dec.DisallowUnknownFields()
	if err := dec.Decode(obj); err != nil {
		return nil, fmt.Errorf("%s: %w", tm.Kind, err)
	}
	strict, err := kjson.UnmarshalStrict(j, mk(), kjson.DisallowDuplicateFields, kjson.DisallowUnknownFields)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", tm.Kind, err)
	}
	if len(strict) > 0 {
		return nil, fmt.Errorf("%s: %w", tm.Kind, errors.Join(strict...))
	}
	return obj, nil
}

// TestStrictDecoding shows that what kubectl would refuse fails here.
func TestStrictDecoding(t *testing.T) {
	cases := []struct{ name, doc, want string }{
		{"misspelt field", "apiVersion: apps/v1\nkind: Deployment\nspec:\n  template:\n    spec:\n      containers:\n        - name: x\n          readinesProbe: {}\n", `unknown field "readinesProbe"`},
		{"field at the wrong level", "apiVersion: apps/v1\nkind: Deployment\nspec:\n  template:\n    spec:\n      containers:\n        - name: x\n      readinessProbe: {}\n", `unknown field "readinessProbe"`},
		{"wrong case", "apiVersion: v1\nkind: Service\nspec:\n  Type: ClusterIP\n", `unknown field "spec.Type"`},
		{"duplicate key", "apiVersion: v1\nkind: ConfigMap\ndata:\n  A: x\n  A: y\n", `"A" already set`},
		{"wrong type", "apiVersion: v1\nkind: Service\nspec:\n  ports: 80\n", "cannot unmarshal"},
		{"field of another kind", "apiVersion: v1\nkind: ConfigMap\nspec: {}\n", `unknown field "spec"`},
		{"unknown kind", "apiVersion: v1\nkind: Pod\n", `kind "Pod"`},
		{"old API version", "apiVersion: autoscaling/v1\nkind: HorizontalPodAutoscaler\n", `"autoscaling/v1"`},
		{"CRD", "apiVersion: monitoring.coreos.com/v1\nkind: ServiceMonitor\n", "ServiceMonitor"},
		{"bad quantity", "apiVersion: apps/v1\nkind: Deployment\nspec:\n  template:\n    spec:\n      containers:\n        - name: x\n          resources:\n            limits:\n              cpu: one\n", "quantities must match"},
		{"second document bad", "apiVersion: v1\nkind: ConfigMap\n---\napiVersion: v1\nkind: Service\nspec:\n  selectorr: {}\n", "document 2"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, err := decodeObjects([]byte(tc.doc))
			require.ErrorContains(t, err, tc.want)
		})
	}

	objs, err := decodeObjects([]byte("# comment only\n---\napiVersion: v1\nkind: ConfigMap\nmetadata:\n  name: a\n---\n---\napiVersion: policy/v1\nkind: PodDisruptionBudget\nspec:\n  maxUnavailable: 1\n"))
	require.NoError(t, err)
	require.Len(t, objs, 2)
	require.Equal(t, "a", objs[0].(*corev1.ConfigMap).Name)
	require.Equal(t, 1, objs[1].(*policyv1.PodDisruptionBudget).Spec.MaxUnavailable.IntValue())
	require.True(t, strings.HasPrefix(fmt.Sprintf("%T", objs[1]), "*v1."))
}
