package api

import (
	"crypto/sha256"
	"crypto/subtle"
	"net/http"
	"strings"

	"github.com/gin-gonic/gin"
)

// bearerAuth lets a request through only with "Authorization: Bearer T"
// for one of tokens (RFC 6750 §2.1). The presented token and every
// configured one are compared as SHA-256 digests with
// subtle.ConstantTimeCompare, over all tokens without an early exit, so
// that neither the time taken nor the position of a match tells anything
// about a token, its length included. Tokens are never logged.
func bearerAuth(tokens []string) gin.HandlerFunc {
	sums := make([][sha256.Size]byte, len(tokens))
	for i, t := range tokens {
		sums[i] = sha256.Sum256([]byte(t))
	}
	return func(c *gin.Context) {
		scheme, token, ok := strings.Cut(c.GetHeader("Authorization"), " ")
		token = strings.TrimSpace(token)
		if !ok || !strings.EqualFold(scheme, "Bearer") || token == "" {
			// RFC 6750 §3.1: no error code when the request has no credentials.
			c.Header("WWW-Authenticate", `Bearer realm="stagewright"`)
			writeProblem(c, Problem{Type: problemBase + "unauthorized", Title: "Authentication required", Status: http.StatusUnauthorized,
				Detail: "send the header Authorization: Bearer <token> with a token issued for this service"})
			return
		}
		sum := sha256.Sum256([]byte(token))
		match := 0
		for i := range sums {
			match |= subtle.ConstantTimeCompare(sum[:], sums[i][:])
		}
		if match != 1 {
			c.Header("WWW-Authenticate", `Bearer realm="stagewright", error="invalid_token"`)
			writeProblem(c, Problem{Type: problemBase + "unauthorized", Title: "Authentication required", Status: http.StatusUnauthorized,
				Detail: "the bearer token is not valid for this service"})
			return
		}
		c.Next()
	}
}
