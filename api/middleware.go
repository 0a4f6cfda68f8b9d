package api

import (
	"crypto/rand"
	"encoding/hex"
	"fmt"
	"log/slog"
	"mime"
	"net/http"
	"runtime/debug"
	"strconv"
	"strings"
	"time"

	"github.com/gin-gonic/gin"
)

// Keys of the values the middleware keeps on the gin context.
const (
	requestIDKey   = "stagewright.request_id"
	problemTypeKey = "stagewright.problem_type"
)

// RequestIDHeader carries the request id in both directions.
const RequestIDHeader = "X-Request-ID"

// maxRequestID bounds an accepted X-Request-ID (a UUID is 36 characters).
const maxRequestID = 128

// requestID takes the caller's X-Request-ID when it is sane (1 to 128
// characters of letters, digits and -_.:), or makes a random one, and
// returns it in the response header.
func requestID() gin.HandlerFunc {
	return func(c *gin.Context) {
		id := c.GetHeader(RequestIDHeader)
		if !saneRequestID(id) {
			id = newRequestID()
		}
		c.Set(requestIDKey, id)
		c.Header(RequestIDHeader, id)
		c.Next()
	}
}

func saneRequestID(id string) bool {
	if id == "" || len(id) > maxRequestID {
		return false
	}
	for i := range len(id) {
		switch b := id[i]; {
		case b >= 'a' && b <= 'z', b >= 'A' && b <= 'Z', b >= '0' && b <= '9', b == '-', b == '_', b == '.', b == ':':
		default:
			return false
		}
	}
	return true
}

// newRequestID is 16 random bytes in hex.
func newRequestID() string {
	var b [16]byte
	_, _ = rand.Read(b[:]) // crypto/rand.Read never fails (Go 1.24+)
	return hex.EncodeToString(b[:])
}

// observe logs one JSON line per request and records its metrics. It logs
// the route template, never the raw path's values, the body or any header.
func observe(log *slog.Logger, m *metrics) gin.HandlerFunc {
	return func(c *gin.Context) {
		start := time.Now()
		m.inFlight.Inc()
		defer m.inFlight.Dec()
		c.Next()
		elapsed := time.Since(start)
		status := c.Writer.Status()
		route, method := routeLabel(c), methodLabel(c.Request.Method)
		code := strconv.Itoa(status)
		m.requests.WithLabelValues(route, method, code).Inc()
		m.latency.WithLabelValues(route, method, code).Observe(elapsed.Seconds())
		attrs := []slog.Attr{
			slog.String("method", method), slog.String("route", route), slog.Int("status", status),
			slog.Float64("duration_ms", float64(elapsed.Microseconds())/1e3), slog.Int("bytes", max(c.Writer.Size(), 0)),
			slog.String("request_id", c.GetString(requestIDKey)),
		}
		if typ := c.GetString(problemTypeKey); typ != "" {
			kind := problemKind(typ)
			m.problems.WithLabelValues(kind).Inc()
			attrs = append(attrs, slog.String("problem", kind))
		}
		level := slog.LevelInfo // 503 (shed, not ready) and 504 are expected under load or shutdown
		switch {
		case status == http.StatusInternalServerError:
			level = slog.LevelError
		case status > http.StatusInternalServerError:
			level = slog.LevelWarn
		}
		log.LogAttrs(c.Request.Context(), level, "request", attrs...)
	}
}

// recovery turns a panic into a 500 problem that names nothing of the
// fault, and logs the panic with the request id and the stack.
// http.ErrAbortHandler is passed on: it asks net/http to drop the
// connection.
func recovery(log *slog.Logger) gin.HandlerFunc {
	return func(c *gin.Context) {
		defer func() {
			rec := recover()
			if rec == nil {
				return
			}
			if rec == http.ErrAbortHandler { //nolint:errorlint // the sentinel is compared by identity, as net/http does
				panic(rec)
			}
			log.Error("panic", "request_id", c.GetString(requestIDKey), "route", routeLabel(c),
				"panic", fmt.Sprint(rec), "stack", string(debug.Stack()))
			if c.Writer.Written() {
				c.Abort() // the status line is gone; the client sees a cut response
				return
			}
			writeProblem(c, Problem{Type: "about:blank", Title: "Internal Server Error", Status: http.StatusInternalServerError})
		}()
		c.Next()
	}
}

// cors answers cross-origin requests from the configured origins (exact
// match of the Origin header), and preflight requests from them. Every
// response says Vary: Origin, since its headers depend on it. Requests from
// other origins get no CORS headers, which a browser treats as refused.
func cors(origins []string) gin.HandlerFunc {
	allowed := make(map[string]bool, len(origins))
	for _, o := range origins {
		allowed[o] = true
	}
	return func(c *gin.Context) {
		h := c.Writer.Header()
		h.Add("Vary", "Origin")
		origin := c.GetHeader("Origin")
		if origin == "" || !allowed[origin] {
			c.Next()
			return
		}
		h.Set("Access-Control-Allow-Origin", origin)
		h.Set("Access-Control-Expose-Headers", RequestIDHeader+", Retry-After, WWW-Authenticate")
		if c.Request.Method == http.MethodOptions && c.GetHeader("Access-Control-Request-Method") != "" {
			h.Add("Vary", "Access-Control-Request-Method")
			h.Add("Vary", "Access-Control-Request-Headers")
			h.Set("Access-Control-Allow-Methods", "GET, HEAD, POST")
			h.Set("Access-Control-Allow-Headers", "Authorization, Content-Type, "+RequestIDHeader)
			h.Set("Access-Control-Max-Age", "600")
			c.AbortWithStatus(http.StatusNoContent)
			return
		}
		c.Next()
	}
}

// requireJSON answers 415 to a request with a body whose Content-Type is
// not JSON: application/json or any application/*+json type (RFC 6839
// §3.1), parameters such as charset allowed. A POST without a body and
// without a Content-Type passes, to be answered "the request body is
// empty". It applies to every route of the group it is used on that takes
// a body (POST, PUT, PATCH).
func requireJSON() gin.HandlerFunc {
	return func(c *gin.Context) {
		switch c.Request.Method {
		case http.MethodPost, http.MethodPut, http.MethodPatch:
		default:
			c.Next()
			return
		}
		ct := c.GetHeader("Content-Type")
		if ct == "" && c.Request.ContentLength == 0 {
			c.Next()
			return
		}
		if !jsonMediaType(ct) {
			c.Header("Accept-Post", "application/json")
			shown := "none"
			if ct != "" {
				shown = strconv.Quote(clip(ct))
			}
			writeProblem(c, Problem{Type: problemBase + "unsupported-media-type", Title: "Unsupported media type",
				Status: http.StatusUnsupportedMediaType,
				Detail: "send the body as JSON with Content-Type: application/json (Content-Type was " + shown + ")"})
			return
		}
		c.Next()
	}
}

// jsonMediaType reports whether a Content-Type names JSON.
func jsonMediaType(ct string) bool {
	mt, _, err := mime.ParseMediaType(ct)
	if err != nil {
		return false
	}
	return mt == "application/json" || (strings.HasPrefix(mt, "application/") && strings.HasSuffix(mt, "+json"))
}

// closeWhenDraining answers every request with Connection: close once
// ready reports false (shutdown has begun): the client then opens its next
// connection, which a load balancer sends to another replica, instead of
// reusing this one until the listener closes and a request sent on it as
// it closes is lost. Idle connections are left open until
// http.Server.Shutdown: closing them now would race with requests being
// sent on them.
func closeWhenDraining(ready func() bool) gin.HandlerFunc {
	return func(c *gin.Context) {
		if !ready() {
			c.Header("Connection", "close")
		}
		c.Next()
	}
}
