package api

import (
	"log/slog"
	"net/http"

	"github.com/gin-gonic/gin"

	"stagewright/service"
)

// Services are the use cases the router serves.
type Services interface {
	StageSizer
	GasPropertyService
}

// NewRouter returns the HTTP handler of the service: routes, recovery,
// request logging and problem+json for unknown routes and methods. spec is
// the Swagger 2.0 document that swag generated (openapi/swagger.json); it is
// converted to OpenAPI 3.0 and validated here, and both are served.
func NewRouter(svc Services, log *slog.Logger, spec []byte) (*gin.Engine, error) {
	doc3, err := openAPI3(spec)
	if err != nil {
		return nil, err
	}
	r := gin.New()
	r.HandleMethodNotAllowed = true
	r.Use(recovery(log), requestLog(log))
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
	r.GET("/openapi.json", func(c *gin.Context) { c.Data(http.StatusOK, "application/json", doc3) })
	r.GET("/openapi/swagger.json", func(c *gin.Context) { c.Data(http.StatusOK, "application/json", spec) })
	st := stageHandler{svc: svc, validate: newValidator(), log: log}
	r.POST("/v1/stage/size", st.size)
	r.POST("/v1/stage/size/batch", st.sizeBatch)
	gh := gasHandler{svc: svc, validate: st.validate, log: log}
	r.POST("/v1/gas/properties", gh.properties)
	r.GET("/v1/gas/components", gh.components)
	return r, nil
}

// health answers liveness and readiness probes.
//
//	@Summary	Liveness and readiness
//	@Tags		operations
//	@Produce	json
//	@Success	200	{object}	Health
//	@ID		health
//	@Router		/healthz [get]
func health(c *gin.Context) {
	c.JSON(http.StatusOK, Health{Status: "ok", ModelVersion: service.ModelVersion})
}

// recovery turns a panic into a logged 500 problem.
func recovery(log *slog.Logger) gin.HandlerFunc {
	return func(c *gin.Context) {
		defer func() {
			if rec := recover(); rec != nil {
				log.Error("panic", "path", c.Request.URL.Path, "panic", rec)
				writeProblem(c, Problem{Type: "about:blank", Title: "Internal Server Error", Status: http.StatusInternalServerError})
			}
		}()
		c.Next()
	}
}

// requestLog logs one line per request.
func requestLog(log *slog.Logger) gin.HandlerFunc {
	return func(c *gin.Context) {
		c.Next()
		log.Info("request", "method", c.Request.Method, "path", c.Request.URL.Path, "status", c.Writer.Status())
	}
}
