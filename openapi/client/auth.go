package client

import (
	"context"
	"net/http"
)

// WithBearerToken makes the client send token as `Authorization: Bearer
// TOKEN` (the document's bearerAuth scheme, RFC 6750 §2.1) on every
// request; the service needs it on the /v1 operations when it is
// configured with API tokens. Written by hand: oapi-codegen leaves the
// credentials to a request editor.
func WithBearerToken(token string) ClientOption {
	return WithRequestEditorFn(func(_ context.Context, req *http.Request) error {
		req.Header.Set("Authorization", "Bearer "+token)
		return nil
	})
}
