package api

import (
	"errors"
	"log/slog"
	"net/http"
	"runtime"
	"time"

	"github.com/gin-gonic/gin"
	"github.com/prometheus/client_golang/prometheus"

	"stagewright/service"
)

// Services are the use cases the router serves.
type Services interface {
	StageSizer
	SectionSizer
	GasPropertyService
	MachineService
	MachineChecker
}

// Options configure the router. The zero value of every field but Spec
// works: no authentication, a 1 MiB body limit, no compute deadline, no
// concurrency limit, no CORS, always ready, logs discarded, a private
// metrics registry.
type Options struct {
	// Spec is the Swagger 2.0 document that swag generated
	// (openapi/swagger.json); required.
	Spec []byte
	// Log receives one line per request and every server fault; nil
	// discards them.
	Log *slog.Logger
	// Tokens, when not empty, are the bearer tokens of which every /v1
	// request must present one.
	Tokens []string
	// MaxBodyBytes bounds a request body; 0 is DefaultMaxBodyBytes.
	MaxBodyBytes int64
	// ComputeTimeout is the deadline of one /v1 request's computation
	// (504 when it passes); 0 is none.
	ComputeTimeout time.Duration
	// MaxInFlight is the number of /v1 requests served at once; more are
	// answered 503 with Retry-After at once. 0 is no limit.
	MaxInFlight int
	// CORSOrigins are the origins (scheme://host[:port]) allowed to call
	// the API from a browser; empty turns CORS off.
	CORSOrigins []string
	// Version and Commit name the build in GET /version and in the
	// stagewright_build_info metric.
	Version, Commit string
	// Ready reports whether the service takes traffic (GET /readyz); nil
	// is always ready. While it reports false every answer carries
	// Connection: close.
	Ready func() bool
	// Registry receives the metrics served at /metrics; nil is a new
	// private registry.
	Registry *prometheus.Registry
}

// NewRouter returns the HTTP handler of the service. Every request passes,
// in order: request id, log line and metrics, panic recovery, CORS; the
// /v1 routes then bearer authentication, the concurrency limit, the body
// limit and the compute deadline. Unknown routes and methods get a
// problem+json. opts.Spec is converted to OpenAPI 3.0 and validated here,
// and both documents are served.
func NewRouter(svc Services, opts Options) (*gin.Engine, error) {
	if len(opts.Spec) == 0 {
		return nil, errors.New("api: Options.Spec (the Swagger 2.0 document) is required")
	}
	doc3, err := openAPI3(opts.Spec)
	if err != nil {
		return nil, err
	}
	log := opts.Log
	if log == nil {
		log = slog.New(slog.DiscardHandler)
	}
	maxBody := opts.MaxBodyBytes
	if maxBody <= 0 {
		maxBody = DefaultMaxBodyBytes
	}
	ready := opts.Ready
	if ready == nil {
		ready = func() bool { return true }
	}
	m, err := newMetrics(opts.Registry, opts.Version, opts.Commit)
	if err != nil {
		return nil, err
	}

	r := gin.New()
	r.HandleMethodNotAllowed = true
	r.Use(requestID(), closeWhenDraining(ready), observe(log, m), recovery(log))
	if len(opts.CORSOrigins) > 0 {
		r.Use(cors(opts.CORSOrigins))
	}
	r.NoRoute(func(c *gin.Context) {
		writeProblem(c, Problem{Type: problemBase + "not-found", Title: "No such endpoint", Status: http.StatusNotFound,
			Detail: "see GET /openapi.json for the endpoints"})
	})
	r.NoMethod(func(c *gin.Context) {
		writeProblem(c, Problem{Type: problemBase + "method-not-allowed", Title: "Method not allowed", Status: http.StatusMethodNotAllowed,
			Detail: c.Request.Method + " is not served on " + c.Request.URL.Path})
	})
	r.GET("/healthz", health)
	r.HEAD("/healthz", health)
	rd := readiness(ready)
	r.GET("/readyz", rd)
	r.HEAD("/readyz", rd)
	r.GET("/version", versionHandler(opts.Version, opts.Commit))
	r.GET("/metrics", m.handler())
	r.GET("/openapi.json", func(c *gin.Context) { c.Data(http.StatusOK, "application/json", doc3) })
	spec := opts.Spec
	r.GET("/openapi/swagger.json", func(c *gin.Context) { c.Data(http.StatusOK, "application/json", spec) })
	docsRoutes(r)

	v1 := r.Group("/v1")
	if len(opts.Tokens) > 0 {
		v1.Use(bearerAuth(opts.Tokens))
	}
	v1.Use(requireJSON())
	if opts.MaxInFlight > 0 {
		v1.Use(shed(opts.MaxInFlight))
	}
	v1.Use(bodyLimit(log, maxBody))
	if opts.ComputeTimeout > 0 {
		v1.Use(computeDeadline(opts.ComputeTimeout))
	}
	enc, err := newAnswerEncoder()
	if err != nil {
		return nil, err
	}
	dec := newRequestDecoder(StageRequest{}, BatchRequest{}, PropertiesRequest{}, SectionRequest{}, RateRequest{}, RateBatchRequest{}, MapRequest{},
		MachineCheckRequest{}, MachineCheckBatchRequest{})
	st := stageHandler{svc: svc, decoder: dec, enc: enc, log: log}
	v1.POST("/stage/size", st.size)
	v1.POST("/stage/size/batch", st.sizeBatch)
	v1.POST("/stage/size/compact", st.sizeCompact)
	v1.POST("/stage/size/batch/compact", st.sizeBatchCompact)
	gh := gasHandler{svc: svc, decoder: dec, enc: enc, log: log}
	v1.POST("/gas/properties", gh.properties)
	v1.GET("/gas/components", gh.components)
	ch := checkHandler{svc: svc, decoder: dec, log: log}
	v1.POST("/machine/check", ch.check)
	v1.POST("/machine/check/batch", ch.checkBatch)
	v1.POST("/section/size", sectionHandler{svc: svc, decoder: dec, log: log}.size)
	mh := machineHandler{svc: svc, decoder: dec, log: log}
	v1.POST("/machine/rate", mh.rate)
	v1.POST("/machine/rate/batch", mh.rateBatch)
	v1.POST("/machine/map", mh.mapChart)
	return r, nil
}

// health answers the liveness probe: the process serves HTTP.
//
//	@Summary		Liveness
//	@Description	200 while the process serves HTTP (liveness probe); it does not check readiness. Not under authentication.
//	@Tags			operations
//	@Produce	json
//	@Success	200	{object}	Health
//	@ID		health
//	@Router		/healthz [get]
func health(c *gin.Context) {
	c.JSON(http.StatusOK, Health{Status: "ok", ModelVersion: service.ModelVersion})
}

// readiness answers the readiness probe.
//
//	@Summary		Readiness
//	@Description	200 while the service takes traffic; 503 problem+json once shutdown has begun, so that load balancers stop sending requests.
//	@Tags			operations
//	@Produce		json
//	@Success		200	{object}	Health
//	@Failure		503	{object}	Problem	"shutting down"
//	@ID				readiness
//	@Router			/readyz [get]
func readiness(ready func() bool) gin.HandlerFunc {
	return func(c *gin.Context) {
		if !ready() {
			writeProblem(c, Problem{Type: problemBase + "not-ready", Title: "Not ready", Status: http.StatusServiceUnavailable,
				Detail: "the service is shutting down; send requests to another instance"})
			return
		}
		c.JSON(http.StatusOK, Health{Status: "ready", ModelVersion: service.ModelVersion})
	}
}

// VersionInfo names the build that answers.
type VersionInfo struct {
	// Version of the build (a release tag, or "dev").
	Version string `json:"version" example:"1.4.0"`
	// Commit the binary was built from ("unknown" when not recorded).
	Commit string `json:"commit" example:"e04429c1d2f0"`
	// GoVersion of the toolchain that built it.
	GoVersion string `json:"go_version" example:"go1.26.8"`
	// ModelVersion of the physics; results for the same input may change
	// when it does.
	ModelVersion string `json:"model_version" example:"stagewright-physics 0.2.0"`
}

// versionHandler reports the build.
//
//	@Summary		Build and model version
//	@Description	The build (version, commit, Go toolchain) and the physics model version that answer. Not under authentication.
//	@Tags			operations
//	@Produce	json
//	@Success	200	{object}	VersionInfo
//	@ID			version
//	@Router		/version [get]
func versionHandler(version, commit string) gin.HandlerFunc {
	info := VersionInfo{Version: version, Commit: commit, GoVersion: runtime.Version(), ModelVersion: service.ModelVersion}
	return func(c *gin.Context) { c.JSON(http.StatusOK, info) }
}
