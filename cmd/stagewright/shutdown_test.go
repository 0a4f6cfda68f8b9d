package main

import (
	"bytes"
	"context"
	"crypto/ecdsa"
	"crypto/elliptic"
	"crypto/rand"
	"crypto/tls"
	"crypto/x509"
	"crypto/x509/pkix"
	"encoding/json"
	"encoding/pem"
	"fmt"
	"io"
	"math/big"
	"net"
	"net/http"
	"os"
	"os/signal"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// startRunEnv runs run() with env in a goroutine and returns its error
// channel.
func startRunEnv(ctx context.Context, args []string, env map[string]string, stdout, stderr io.Writer) <-chan error {
	errc := make(chan error, 1)
	go func() { errc <- run(ctx, args, envOf(env), stdout, stderr) }()
	return errc
}

// servingAddr waits for the "serving" log line and returns its address.
func servingAddr(t *testing.T, logs *syncBuffer) string {
	t.Helper()
	addr, _ := logLine(t, logs, "serving")["addr"].(string)
	require.NotEmpty(t, addr)
	return addr
}

// realGasBatch is a batch of n duties drawn in turn from the real-gas
// (Peng-Robinson, SRK, ideal mixture) demo duties of testdata/stages.
func realGasBatch(t *testing.T, n int) []byte {
	t.Helper()
	files, err := filepath.Glob(filepath.Join("..", "..", "testdata", "stages", "*.in.json"))
	require.NoError(t, err)
	var duties []json.RawMessage
	for _, f := range files {
		b, err := os.ReadFile(f)
		require.NoError(t, err)
		if !bytes.Contains(b, []byte(`"ideal-constant"`)) {
			duties = append(duties, b)
		}
	}
	require.NotEmpty(t, duties, "no real-gas demo duties")
	batch := struct {
		Duties []json.RawMessage `json:"duties"`
	}{}
	for i := range n {
		batch.Duties = append(batch.Duties, duties[i%len(duties)])
	}
	b, err := json.Marshal(batch)
	require.NoError(t, err)
	return b
}

// inFlight reads the in-flight gauge from /metrics (the scrape counts
// itself).
func inFlight(client *http.Client, base string) int {
	resp, err := client.Get(base + "/metrics")
	if err != nil {
		return -1
	}
	defer resp.Body.Close()
	b, _ := io.ReadAll(resp.Body)
	for _, l := range strings.Split(string(b), "\n") {
		var n int
		if _, err := fmt.Sscanf(l, "stagewright_http_requests_in_flight %d", &n); err == nil {
			return n
		}
	}
	return -1
}

// TestGracefulShutdown starts the real server, puts several batch
// requests of real-gas duties in flight (their bodies half sent, so that
// they are surely in flight), sends SIGTERM, and checks that /readyz turns
// 503 while the server drains, that new connections are refused once the
// listener closes, that every in-flight request then completes with 200
// and all its duties sized, and that run returns nil (exit status 0).
func TestGracefulShutdown(t *testing.T) {
	ctx, stop := signal.NotifyContext(context.Background(), syscall.SIGTERM) // as main does
	defer stop()
	var logs syncBuffer
	errc := startRunEnv(ctx, nil, map[string]string{
		"STAGEWRIGHT_ADDR": "127.0.0.1:0", "STAGEWRIGHT_SHUTDOWN_DELAY": "3s", "STAGEWRIGHT_SHUTDOWN_GRACE": "60s",
		"STAGEWRIGHT_READ_TIMEOUT": "60s", "STAGEWRIGHT_WRITE_TIMEOUT": "90s", "STAGEWRIGHT_COMPUTE_TIMEOUT": "80s",
	}, io.Discard, &logs)
	base := "http://" + servingAddr(t, &logs)
	probe := &http.Client{Timeout: 5 * time.Second, Transport: &http.Transport{DisableKeepAlives: true}}

	const clients, duties = 4, 120
	body := realGasBatch(t, duties)
	half := len(body) / 2
	type result struct {
		status int
		out    struct{ Succeeded, Failed int }
		err    error
	}
	results := make(chan result, clients)
	writers := make([]*io.PipeWriter, clients)
	for i := range clients {
		pr, pw := io.Pipe()
		writers[i] = pw
		req, err := http.NewRequest(http.MethodPost, base+"/v1/stage/size/batch", pr)
		require.NoError(t, err)
		req.ContentLength = int64(len(body))
		req.Header.Set("Content-Type", "application/json")
		client := &http.Client{Timeout: 60 * time.Second, Transport: &http.Transport{DisableKeepAlives: true}}
		go func() {
			var r result
			resp, err := client.Do(req)
			if err != nil {
				r.err = err
				results <- r
				return
			}
			defer resp.Body.Close()
			r.status = resp.StatusCode
			r.err = json.NewDecoder(resp.Body).Decode(&r.out)
			results <- r
		}()
		go func() { _, _ = pw.Write(body[:half]) }()
	}
	require.Eventually(t, func() bool { return inFlight(probe, base) >= clients+1 }, 10*time.Second, 5*time.Millisecond,
		"the batch requests never came in flight")

	require.NoError(t, syscall.Kill(os.Getpid(), syscall.SIGTERM))
	require.Eventually(t, func() bool {
		resp, err := probe.Get(base + "/readyz")
		if err != nil {
			return false
		}
		resp.Body.Close()
		return resp.StatusCode == http.StatusServiceUnavailable
	}, 2*time.Second, 5*time.Millisecond, "/readyz did not turn 503 on SIGTERM")
	resp, err := probe.Get(base + "/healthz")
	if assert.NoError(t, err, "still serving while draining") {
		resp.Body.Close()
		assert.Equal(t, http.StatusOK, resp.StatusCode, "liveness stays on while draining")
	}
	require.Eventually(t, func() bool {
		_, err := probe.Get(base + "/healthz")
		return err != nil
	}, 15*time.Second, 10*time.Millisecond, "the listener did not close after the shutdown delay")

	// Shutdown has begun and is waiting for the requests in flight: send
	// the rest of their bodies.
	for _, pw := range writers {
		_, err := pw.Write(body[half:])
		require.NoError(t, err)
		require.NoError(t, pw.Close())
	}
	for range clients {
		r := <-results
		require.NoError(t, r.err, "an in-flight request was broken by the shutdown")
		assert.Equal(t, http.StatusOK, r.status)
		assert.Equal(t, duties, r.out.Succeeded, "every duty of the batch sized")
		assert.Zero(t, r.out.Failed)
	}
	require.NoError(t, waitRun(t, errc), "a graceful shutdown returns nil")
	logLine(t, &logs, "shutting down")
	logLine(t, &logs, "stopped")
}

// TestShutdownGraceExceeded: a request still running when the grace
// period ends is cut, and run says so with an error (exit status 1).
func TestShutdownGraceExceeded(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	var logs syncBuffer
	errc := startRunEnv(ctx, nil, map[string]string{"STAGEWRIGHT_ADDR": "127.0.0.1:0", "STAGEWRIGHT_SHUTDOWN_GRACE": "100ms"}, io.Discard, &logs)
	base := "http://" + servingAddr(t, &logs)
	pr, pw := io.Pipe()
	defer pw.Close()
	req, err := http.NewRequest(http.MethodPost, base+"/v1/stage/size", pr)
	require.NoError(t, err)
	req.ContentLength = 1000
	req.Header.Set("Content-Type", "application/json")
	done := make(chan error, 1)
	go func() {
		resp, err := http.DefaultClient.Do(req)
		if err == nil {
			resp.Body.Close()
		}
		done <- err
	}()
	go func() { _, _ = pw.Write([]byte(`{"gas": `)) }()
	probe := &http.Client{Timeout: 5 * time.Second}
	require.Eventually(t, func() bool { return inFlight(probe, base) >= 2 }, 10*time.Second, 5*time.Millisecond)
	cancel()
	err = waitRun(t, errc)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "grace period of 100ms")
	pw.CloseWithError(io.ErrClosedPipe) // lets the client's write loop notice the cut connection
	assert.Error(t, <-done, "the held request was cut")
}

// selfSigned writes a self-signed certificate for 127.0.0.1 and its key.
func selfSigned(t *testing.T) (certFile, keyFile string, pool *x509.CertPool) {
	t.Helper()
	key, err := ecdsa.GenerateKey(elliptic.P256(), rand.Reader)
	require.NoError(t, err)
	tmpl := &x509.Certificate{SerialNumber: big.NewInt(1), Subject: pkix.Name{CommonName: "stagewright test"},
		NotBefore: time.Now().Add(-time.Hour), NotAfter: time.Now().Add(time.Hour),
		IPAddresses: []net.IP{net.IPv4(127, 0, 0, 1)}, KeyUsage: x509.KeyUsageDigitalSignature,
		ExtKeyUsage: []x509.ExtKeyUsage{x509.ExtKeyUsageServerAuth}}
	der, err := x509.CreateCertificate(rand.Reader, tmpl, tmpl, &key.PublicKey, key)
	require.NoError(t, err)
	cert, err := x509.ParseCertificate(der)
	require.NoError(t, err)
	pool = x509.NewCertPool()
	pool.AddCert(cert)
	kder, err := x509.MarshalECPrivateKey(key)
	require.NoError(t, err)
	dir := t.TempDir()
	certFile, keyFile = filepath.Join(dir, "cert.pem"), filepath.Join(dir, "key.pem")
	require.NoError(t, os.WriteFile(certFile, pem.EncodeToMemory(&pem.Block{Type: "CERTIFICATE", Bytes: der}), 0o600))
	require.NoError(t, os.WriteFile(keyFile, pem.EncodeToMemory(&pem.Block{Type: "EC PRIVATE KEY", Bytes: kder}), 0o600))
	return certFile, keyFile, pool
}

// TestRunTLS: with a certificate and key the server speaks HTTPS only.
func TestRunTLS(t *testing.T) {
	certFile, keyFile, pool := selfSigned(t)
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	var logs syncBuffer
	errc := startRunEnv(ctx, nil, map[string]string{"STAGEWRIGHT_ADDR": "127.0.0.1:0",
		"STAGEWRIGHT_TLS_CERT_FILE": certFile, "STAGEWRIGHT_TLS_KEY_FILE": keyFile}, io.Discard, &logs)
	addr := servingAddr(t, &logs)
	assert.Equal(t, "https://"+addr, logLine(t, &logs, "serving")["url"])
	client := &http.Client{Timeout: 5 * time.Second, Transport: &http.Transport{TLSClientConfig: &tls.Config{RootCAs: pool, MinVersion: tls.VersionTLS12}}}
	resp, err := client.Get("https://" + addr + "/healthz")
	require.NoError(t, err)
	resp.Body.Close()
	assert.Equal(t, http.StatusOK, resp.StatusCode)
	assert.NotNil(t, resp.TLS, "answered over TLS")
	resp, err = (&http.Client{Timeout: 5 * time.Second}).Get("http://" + addr + "/healthz")
	if err == nil {
		resp.Body.Close()
		assert.Equal(t, http.StatusBadRequest, resp.StatusCode, "plain HTTP to a TLS port is refused")
	}
	cancel()
	require.NoError(t, waitRun(t, errc))
}

// TestRunRefusesBadKeyPair: files that exist but are no certificate and
// key stop the start with the variables named.
func TestRunRefusesBadKeyPair(t *testing.T) {
	dir := t.TempDir()
	cert, key := filepath.Join(dir, "c.pem"), filepath.Join(dir, "k.pem")
	require.NoError(t, os.WriteFile(cert, []byte("not a certificate"), 0o600))
	require.NoError(t, os.WriteFile(key, []byte("not a key"), 0o600))
	err := run(context.Background(), []string{"--addr", "127.0.0.1:0"}, envOf(map[string]string{
		"STAGEWRIGHT_TLS_CERT_FILE": cert, "STAGEWRIGHT_TLS_KEY_FILE": key}), io.Discard, io.Discard)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "STAGEWRIGHT_TLS_CERT_FILE")
}

// TestRunWithTokens: the real server refuses /v1 without a token and the
// demo, which sends the first configured token, sizes every duty.
func TestRunWithTokens(t *testing.T) {
	token := "kestrel-ops-token-0123456789abcdef"
	dir := filepath.Join("..", "..", "testdata", "stages")
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	var out, logs syncBuffer
	errc := startRunEnv(ctx, []string{"--addr", "127.0.0.1:0", "--demo", "--demo-dir", dir},
		map[string]string{"STAGEWRIGHT_API_TOKENS": "other-token-aaaaaaaaaaaa," + token}, &out, &logs)
	addr := servingAddr(t, &logs)
	resp, err := (&http.Client{Timeout: 5 * time.Second}).Get("http://" + addr + "/v1/gas/components")
	require.NoError(t, err)
	resp.Body.Close()
	assert.Equal(t, http.StatusUnauthorized, resp.StatusCode)
	files, _ := filepath.Glob(filepath.Join(dir, "*.in.json"))
	require.Eventually(t, func() bool { return strings.Count(out.String(), "\n") >= len(files)+1 }, 20*time.Second, 20*time.Millisecond)
	cancel()
	require.NoError(t, waitRun(t, errc))
	for _, l := range strings.Split(strings.TrimSpace(out.String()), "\n")[1:] {
		assert.Equal(t, "200", strings.Fields(l)[1], l)
	}
	assert.NotContains(t, logs.String(), token)
}
