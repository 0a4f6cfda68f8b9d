package main

import (
	"bufio"
	"context"
	"errors"
	"io"
	"net"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestUnreadableRequestsAreTheDocumentedException (issue 13 item 11): a
// request Go's HTTP server cannot read never reaches the service, so it
// cannot get a problem+json answer. The README names this the one
// exception to "every error is RFC 9457": a plain-text 400 (or 431) or a
// closed connection, not in the request log. This test drives the real
// server through each case and holds the README to what it does.
func TestUnreadableRequestsAreTheDocumentedException(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	var logs syncBuffer
	errc := startRunEnv(ctx, nil, map[string]string{
		"STAGEWRIGHT_ADDR": "127.0.0.1:0", "STAGEWRIGHT_READ_HEADER_TIMEOUT": "300ms",
	}, io.Discard, &logs)
	addr := servingAddr(t, &logs)

	send := func(raw string, wait time.Duration) (status int, contentType string, closed bool) {
		c, err := net.Dial("tcp", addr)
		require.NoError(t, err)
		defer c.Close()
		_, err = io.WriteString(c, raw)
		require.NoError(t, err)
		require.NoError(t, c.SetReadDeadline(time.Now().Add(wait)))
		resp, err := http.ReadResponse(bufio.NewReader(c), nil)
		if err != nil {
			var ne net.Error
			require.False(t, errors.As(err, &ne) && ne.Timeout(), "the server neither answered nor closed: %v", err)
			return 0, "", true
		}
		resp.Body.Close()
		return resp.StatusCode, resp.Header.Get("Content-Type"), false
	}

	// A malformed request line: Go's own plain-text 400.
	status, ct, _ := send("NOT A REQUEST\r\n\r\n", 2*time.Second)
	assert.Equal(t, http.StatusBadRequest, status)
	assert.True(t, strings.HasPrefix(ct, "text/plain"), "Content-Type %q", ct)

	// Headers over the 64 KiB limit: Go's 431.
	status, ct, _ = send("GET /healthz HTTP/1.1\r\nHost: x\r\nX-Big: "+strings.Repeat("a", 1<<17)+"\r\n\r\n", 2*time.Second)
	assert.Equal(t, http.StatusRequestHeaderFieldsTooLarge, status)
	assert.True(t, strings.HasPrefix(ct, "text/plain"), "Content-Type %q", ct)

	// Headers not complete within the header-read timeout: no problem+json.
	status, ct, closed := send("POST /v1/stage/size HTTP/1.1\r\nHost: x\r\n", 3*time.Second)
	t.Logf("header-read timeout: status %d, Content-Type %q, closed %v", status, ct, closed)
	if !closed {
		assert.Equal(t, http.StatusBadRequest, status)
		assert.NotEqual(t, "application/problem+json", ct)
	}

	cancel()
	require.NoError(t, waitRun(t, errc))
	assert.NotContains(t, logs.String(), `"msg":"request"`, "none of these reached the service's request log")

	readme, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	require.NoError(t, err)
	for _, want := range []string{"One exception to problem+json", "plain-text 400 (or 431)", "STAGEWRIGHT_READ_HEADER_TIMEOUT", "not in the request log"} {
		assert.Contains(t, string(readme), want, "the README must document the exception as the server behaves")
	}
}
