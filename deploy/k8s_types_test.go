package deploy

// The subset of the Kubernetes API objects that the manifests in this
// folder use, with the API's field names. The manifests are decoded with
// unknown fields rejected, so a misspelt or misplaced field fails the test
// (kubeconform, which would check them against the API's schemas, needs
// to download those schemas and cannot run here). A field added to a
// manifest must be added here, spelt as in the Kubernetes API reference.

type typeMeta struct {
	APIVersion string `yaml:"apiVersion"`
	Kind       string `yaml:"kind"`
}

type objectMeta struct {
	Name        string            `yaml:"name"`
	Namespace   string            `yaml:"namespace"`
	Labels      map[string]string `yaml:"labels"`
	Annotations map[string]string `yaml:"annotations"`
}

type labelSelector struct {
	MatchLabels map[string]string `yaml:"matchLabels"`
}

type configMap struct {
	typeMeta `yaml:",inline"`
	Metadata objectMeta        `yaml:"metadata"`
	Data     map[string]string `yaml:"data"`
}

type deployment struct {
	typeMeta `yaml:",inline"`
	Metadata objectMeta `yaml:"metadata"`
	Spec     struct {
		Replicas             *int          `yaml:"replicas"`
		RevisionHistoryLimit *int          `yaml:"revisionHistoryLimit"`
		Selector             labelSelector `yaml:"selector"`
		Strategy             struct {
			Type          string `yaml:"type"`
			RollingUpdate *struct {
				MaxSurge       any `yaml:"maxSurge"`
				MaxUnavailable any `yaml:"maxUnavailable"`
			} `yaml:"rollingUpdate"`
		} `yaml:"strategy"`
		Template struct {
			Metadata objectMeta `yaml:"metadata"`
			Spec     podSpec    `yaml:"spec"`
		} `yaml:"template"`
	} `yaml:"spec"`
}

type podSpec struct {
	AutomountServiceAccountToken  *bool                      `yaml:"automountServiceAccountToken"`
	EnableServiceLinks            *bool                      `yaml:"enableServiceLinks"`
	TerminationGracePeriodSeconds *int                       `yaml:"terminationGracePeriodSeconds"`
	SecurityContext               podSecurityContext         `yaml:"securityContext"`
	TopologySpreadConstraints     []topologySpreadConstraint `yaml:"topologySpreadConstraints"`
	Containers                    []container                `yaml:"containers"`
}

type seccompProfile struct {
	Type string `yaml:"type"`
}

type podSecurityContext struct {
	RunAsNonRoot   *bool           `yaml:"runAsNonRoot"`
	RunAsUser      *int            `yaml:"runAsUser"`
	RunAsGroup     *int            `yaml:"runAsGroup"`
	FSGroup        *int            `yaml:"fsGroup"`
	SeccompProfile *seccompProfile `yaml:"seccompProfile"`
}

type topologySpreadConstraint struct {
	MaxSkew           int           `yaml:"maxSkew"`
	TopologyKey       string        `yaml:"topologyKey"`
	WhenUnsatisfiable string        `yaml:"whenUnsatisfiable"`
	LabelSelector     labelSelector `yaml:"labelSelector"`
	MatchLabelKeys    []string      `yaml:"matchLabelKeys"`
}

type container struct {
	Name            string `yaml:"name"`
	Image           string `yaml:"image"`
	ImagePullPolicy string `yaml:"imagePullPolicy"`
	Ports           []struct {
		Name          string `yaml:"name"`
		ContainerPort int    `yaml:"containerPort"`
		Protocol      string `yaml:"protocol"`
	} `yaml:"ports"`
	EnvFrom []struct {
		ConfigMapRef *struct {
			Name string `yaml:"name"`
		} `yaml:"configMapRef"`
	} `yaml:"envFrom"`
	Env []struct {
		Name  string `yaml:"name"`
		Value string `yaml:"value"`
	} `yaml:"env"`
	Resources struct {
		Requests map[string]string `yaml:"requests"`
		Limits   map[string]string `yaml:"limits"`
	} `yaml:"resources"`
	ReadinessProbe *probe `yaml:"readinessProbe"`
	LivenessProbe  *probe `yaml:"livenessProbe"`
	StartupProbe   *probe `yaml:"startupProbe"`
	Lifecycle      *struct {
		PreStop *struct {
			Sleep *struct {
				Seconds int `yaml:"seconds"`
			} `yaml:"sleep"`
		} `yaml:"preStop"`
	} `yaml:"lifecycle"`
	SecurityContext struct {
		AllowPrivilegeEscalation *bool           `yaml:"allowPrivilegeEscalation"`
		Privileged               *bool           `yaml:"privileged"`
		ReadOnlyRootFilesystem   *bool           `yaml:"readOnlyRootFilesystem"`
		RunAsNonRoot             *bool           `yaml:"runAsNonRoot"`
		RunAsUser                *int            `yaml:"runAsUser"`
		SeccompProfile           *seccompProfile `yaml:"seccompProfile"`
		Capabilities             *struct {
			Drop []string `yaml:"drop"`
			Add  []string `yaml:"add"`
		} `yaml:"capabilities"`
	} `yaml:"securityContext"`
}

type probe struct {
	HTTPGet *struct {
		Path string `yaml:"path"`
		Port any    `yaml:"port"`
	} `yaml:"httpGet"`
	InitialDelaySeconds int `yaml:"initialDelaySeconds"`
	PeriodSeconds       int `yaml:"periodSeconds"`
	TimeoutSeconds      int `yaml:"timeoutSeconds"`
	FailureThreshold    int `yaml:"failureThreshold"`
	SuccessThreshold    int `yaml:"successThreshold"`
}

type service struct {
	typeMeta `yaml:",inline"`
	Metadata objectMeta `yaml:"metadata"`
	Spec     struct {
		Type     string            `yaml:"type"`
		Selector map[string]string `yaml:"selector"`
		Ports    []struct {
			Name       string `yaml:"name"`
			Port       int    `yaml:"port"`
			TargetPort any    `yaml:"targetPort"`
			Protocol   string `yaml:"protocol"`
		} `yaml:"ports"`
	} `yaml:"spec"`
}

type hpa struct {
	typeMeta `yaml:",inline"`
	Metadata objectMeta `yaml:"metadata"`
	Spec     struct {
		ScaleTargetRef struct {
			APIVersion string `yaml:"apiVersion"`
			Kind       string `yaml:"kind"`
			Name       string `yaml:"name"`
		} `yaml:"scaleTargetRef"`
		MinReplicas *int `yaml:"minReplicas"`
		MaxReplicas int  `yaml:"maxReplicas"`
		Metrics     []struct {
			Type     string `yaml:"type"`
			Resource *struct {
				Name   string `yaml:"name"`
				Target struct {
					Type               string `yaml:"type"`
					AverageUtilization *int   `yaml:"averageUtilization"`
				} `yaml:"target"`
			} `yaml:"resource"`
		} `yaml:"metrics"`
		Behavior *struct {
			ScaleUp   *scalingRules `yaml:"scaleUp"`
			ScaleDown *scalingRules `yaml:"scaleDown"`
		} `yaml:"behavior"`
	} `yaml:"spec"`
}

type scalingRules struct {
	StabilizationWindowSeconds *int `yaml:"stabilizationWindowSeconds"`
	Policies                   []struct {
		Type          string `yaml:"type"`
		Value         int    `yaml:"value"`
		PeriodSeconds int    `yaml:"periodSeconds"`
	} `yaml:"policies"`
}

type pdb struct {
	typeMeta `yaml:",inline"`
	Metadata objectMeta `yaml:"metadata"`
	Spec     struct {
		MinAvailable               any           `yaml:"minAvailable"`
		MaxUnavailable             any           `yaml:"maxUnavailable"`
		UnhealthyPodEvictionPolicy string        `yaml:"unhealthyPodEvictionPolicy"`
		Selector                   labelSelector `yaml:"selector"`
	} `yaml:"spec"`
}

type kustomization struct {
	typeMeta  `yaml:",inline"`
	Resources []string `yaml:"resources"`
	Images    []struct {
		Name    string `yaml:"name"`
		NewName string `yaml:"newName"`
		NewTag  string `yaml:"newTag"`
		Digest  string `yaml:"digest"`
	} `yaml:"images"`
}
