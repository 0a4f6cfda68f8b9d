package main

import (
	"bytes"
	"context"
	"errors"
	"io"
	"net"
	"net/http"
	"net/http/httptrace"
	"os"
	"os/signal"
	"path/filepath"
	"sync"
	"sync/atomic"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestKeepAliveClientThroughSIGTERM (issue 13 item 14): keep-alive
// clients size duties in a loop while the server gets SIGTERM. Every
// answer to a request sent after readiness turned off must carry
// Connection: close, and every request written must be answered (none
// lost at the socket). A client that is told Connection: close while the
// service drains goes to another replica, as a load balancer's pool does
// (there is none here, so it stops). Before the fix, the answers during
// the shutdown delay kept the connections alive, and requests sent on
// them as Shutdown closed them were lost (net/http drops a request it
// reads once Shutdown has begun).
func TestKeepAliveClientThroughSIGTERM(t *testing.T) {
	ctx, stop := signal.NotifyContext(context.Background(), syscall.SIGTERM) // as main does
	defer stop()
	var logs syncBuffer
	errc := startRunEnv(ctx, nil, map[string]string{
		"STAGEWRIGHT_ADDR": "127.0.0.1:0", "STAGEWRIGHT_SHUTDOWN_DELAY": "1s", "STAGEWRIGHT_SHUTDOWN_GRACE": "20s",
	}, io.Discard, &logs)
	base := "http://" + servingAddr(t, &logs)
	duty, err := os.ReadFile(filepath.Join("..", "..", "testdata", "stages", "kestrel-instrument-air.in.json"))
	require.NoError(t, err)

	var refusedDials atomic.Int64
	dialer := &net.Dialer{Timeout: 2 * time.Second}
	tr := &http.Transport{
		MaxIdleConnsPerHost: 16,
		DialContext: func(ctx context.Context, network, addr string) (net.Conn, error) {
			c, err := dialer.DialContext(ctx, network, addr)
			if err != nil {
				refusedDials.Add(1)
			}
			return c, err
		},
	}
	defer tr.CloseIdleConnections()
	client := &http.Client{Transport: tr, Timeout: 20 * time.Second}

	var draining atomic.Bool // set once /readyz has answered 503
	var answered, answeredDraining, closeWhileDraining, reused, notSent atomic.Int64
	var mu sync.Mutex
	var lost []error
	const workers = 8
	var wg sync.WaitGroup
	for range workers {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				afterDrain := draining.Load()
				var wrote, wasReused bool
				trace := &httptrace.ClientTrace{
					GotConn:      func(i httptrace.GotConnInfo) { wasReused = i.Reused },
					WroteRequest: func(i httptrace.WroteRequestInfo) { wrote = i.Err == nil },
				}
				req, err := http.NewRequestWithContext(httptrace.WithClientTrace(context.Background(), trace),
					http.MethodPost, base+"/v1/stage/size", bytes.NewReader(duty))
				if err != nil {
					panic(err)
				}
				req.Header.Set("Content-Type", "application/json")
				resp, err := client.Do(req)
				if err != nil {
					if !wrote {
						notSent.Add(1) // the listener has closed: the connection was refused
						return
					}
					mu.Lock()
					lost = append(lost, err)
					mu.Unlock()
					return
				}
				_, err = io.Copy(io.Discard, resp.Body)
				resp.Body.Close()
				if err != nil || resp.StatusCode != http.StatusOK {
					mu.Lock()
					lost = append(lost, errors.Join(err, errors.New(resp.Status)))
					mu.Unlock()
					return
				}
				answered.Add(1)
				if wasReused {
					reused.Add(1)
				}
				if afterDrain {
					answeredDraining.Add(1)
					if resp.Close {
						closeWhileDraining.Add(1)
						return // reconnect to another replica
					}
				}
			}
		}()
	}
	require.Eventually(t, func() bool { return reused.Load() >= 4*workers }, 10*time.Second, 5*time.Millisecond,
		"the clients never reused a connection")
	require.NoError(t, syscall.Kill(os.Getpid(), syscall.SIGTERM))
	probe := &http.Client{Timeout: 2 * time.Second, Transport: &http.Transport{DisableKeepAlives: true}}
	require.Eventually(t, func() bool {
		resp, err := probe.Get(base + "/readyz")
		if err != nil {
			return false
		}
		resp.Body.Close()
		return resp.StatusCode == http.StatusServiceUnavailable
	}, 2*time.Second, 2*time.Millisecond, "/readyz did not turn 503 on SIGTERM")
	draining.Store(true)
	wg.Wait()
	require.NoError(t, waitRun(t, errc), "a graceful shutdown returns nil")

	assert.Empty(t, lost, "requests written but not answered")
	assert.Positive(t, answeredDraining.Load(), "no request was answered while draining")
	assert.Equal(t, answeredDraining.Load(), closeWhileDraining.Load(),
		"every answer while draining must say Connection: close")
	assert.Zero(t, notSent.Load(), "no client should meet a closed listener")
	t.Logf("answered %d (%d while draining, all with Connection: close), lost %d, refused connections %d",
		answered.Load(), answeredDraining.Load(), len(lost), refusedDials.Load())
	assert.Zero(t, refusedDials.Load())
}
