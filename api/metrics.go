package api

import (
	"errors"
	"fmt"
	"net/http"
	"runtime"
	"strings"

	"github.com/gin-gonic/gin"
	"github.com/prometheus/client_golang/prometheus"
	"github.com/prometheus/client_golang/prometheus/collectors"
	"github.com/prometheus/client_golang/prometheus/promhttp"

	"stagewright/service"
)

// unmatchedRoute is the route label of requests that matched no route, so
// that the label takes only as many values as there are routes.
const unmatchedRoute = "unmatched"

// metrics are the service's Prometheus series, registered on one private
// registry (never the global default one).
type metrics struct {
	reg      *prometheus.Registry
	requests *prometheus.CounterVec
	latency  *prometheus.HistogramVec
	inFlight prometheus.Gauge
	problems *prometheus.CounterVec
}

// newMetrics registers the request series, the build information and the Go
// runtime and process collectors on reg (a new registry when reg is nil).
// A registry may hold the Go and process collectors already, not the
// request series: each router needs its own.
func newMetrics(reg *prometheus.Registry, version, commit string) (*metrics, error) {
	if reg == nil {
		reg = prometheus.NewRegistry()
	}
	labels := []string{"route", "method", "status"}
	m := &metrics{
		reg: reg,
		requests: prometheus.NewCounterVec(prometheus.CounterOpts{
			Namespace: "stagewright", Subsystem: "http", Name: "requests_total",
			Help: "HTTP requests served, by route template, method and status code.",
		}, labels),
		latency: prometheus.NewHistogramVec(prometheus.HistogramOpts{
			Namespace: "stagewright", Subsystem: "http", Name: "request_duration_seconds",
			Help: "Time from the first middleware to the end of the handler, by route template, method and status code.",
			// From a cheap probe (~50 us) to a batch near the compute deadline.
			Buckets: []float64{0.0001, 0.00025, 0.0005, 0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30},
		}, labels),
		inFlight: prometheus.NewGauge(prometheus.GaugeOpts{
			Namespace: "stagewright", Subsystem: "http", Name: "requests_in_flight",
			Help: "HTTP requests being served now.",
		}),
		problems: prometheus.NewCounterVec(prometheus.CounterOpts{
			Namespace: "stagewright", Subsystem: "http", Name: "problems_total",
			Help: "RFC 9457 problem responses, by problem type (the last segment of the type URI, or about:blank).",
		}, []string{"type"}),
	}
	build := prometheus.NewGauge(prometheus.GaugeOpts{
		Namespace: "stagewright", Name: "build_info",
		Help: "Always 1; the labels name the build and the physics model version.",
		ConstLabels: prometheus.Labels{"version": version, "commit": commit, "go_version": runtime.Version(),
			"model_version": service.ModelVersion},
	})
	build.Set(1)
	for _, c := range []prometheus.Collector{m.requests, m.latency, m.inFlight, m.problems, build} {
		if err := reg.Register(c); err != nil {
			return nil, fmt.Errorf("api: metrics: %w (one registry per router)", err)
		}
	}
	for _, c := range []prometheus.Collector{collectors.NewGoCollector(), collectors.NewProcessCollector(collectors.ProcessCollectorOpts{})} {
		if err := reg.Register(c); err != nil {
			var are prometheus.AlreadyRegisteredError
			if !errors.As(err, &are) { // a registry given with its own Go and process collectors is fine
				return nil, err
			}
		}
	}
	return m, nil
}

// handler serves the registry in the Prometheus text exposition format.
//
//	@Summary		Prometheus metrics
//	@Description	Request counts and latency by route, method and status, requests in flight, problem responses by type, build information, Go runtime and process metrics, in the Prometheus text exposition format. Not under authentication.
//	@Tags			operations
//	@Produce		plain
//	@Success		200	{string}	string	"Prometheus text exposition format"
//	@ID				metrics
//	@Router			/metrics [get]
func (m *metrics) handler() gin.HandlerFunc {
	h := promhttp.HandlerFor(m.reg, promhttp.HandlerOpts{Registry: m.reg})
	return gin.WrapH(h)
}

// methodLabel bounds the method label: a method not of RFC 9110 is "OTHER".
func methodLabel(m string) string {
	switch m {
	case http.MethodGet, http.MethodHead, http.MethodPost, http.MethodPut, http.MethodPatch, http.MethodDelete,
		http.MethodOptions, http.MethodConnect, http.MethodTrace:
		return m
	}
	return "OTHER"
}

func routeLabel(c *gin.Context) string {
	if r := c.FullPath(); r != "" {
		return r
	}
	return unmatchedRoute
}

// problemKind is the short name of a problem type URI: "compute-timeout"
// for problemBase+"compute-timeout", the URI itself otherwise.
func problemKind(typ string) string {
	return strings.TrimPrefix(typ, problemBase)
}
