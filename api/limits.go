package api

import (
	"context"
	"log/slog"
	"net/http"
	"time"

	"github.com/gin-gonic/gin"
)

// DefaultMaxBodyBytes bounds a request body when Options.MaxBodyBytes is
// 0 (1 MiB: a batch of a few hundred duties).
const DefaultMaxBodyBytes = 1 << 20

// retryAfterSeconds is what a shed request is told to wait.
const retryAfterSeconds = "1"

// bodyLimit refuses a body over limit bytes with 413: at once when the
// declared Content-Length is larger, and otherwise (chunked or understated
// bodies) as soon as the decoder has read one byte past the limit, through
// http.MaxBytesReader, which also closes the connection after the response.
func bodyLimit(log *slog.Logger, limit int64) gin.HandlerFunc {
	return func(c *gin.Context) {
		if c.Request.ContentLength > limit {
			fail(c, log, &http.MaxBytesError{Limit: limit})
			return
		}
		c.Request.Body = http.MaxBytesReader(c.Writer, c.Request.Body, limit)
		c.Next()
	}
}

// shed admits at most n requests at a time and answers the others at once
// with 503 and Retry-After, rather than queueing them.
func shed(n int) gin.HandlerFunc {
	slots := make(chan struct{}, n)
	return func(c *gin.Context) {
		select {
		case slots <- struct{}{}:
		default:
			c.Header("Retry-After", retryAfterSeconds)
			writeProblem(c, Problem{Type: problemBase + "overloaded", Title: "Service overloaded", Status: http.StatusServiceUnavailable,
				Detail: "the service is at its limit of concurrent requests; retry after " + retryAfterSeconds + " s"})
			return
		}
		defer func() { <-slots }()
		c.Next()
	}
}

// computeDeadline gives the rest of the chain a context that ends after d;
// the service stops at its next check and the handler answers 504.
func computeDeadline(d time.Duration) gin.HandlerFunc {
	return func(c *gin.Context) {
		ctx, cancel := context.WithTimeout(c.Request.Context(), d)
		defer cancel()
		c.Request = c.Request.WithContext(ctx)
		c.Next()
	}
}
