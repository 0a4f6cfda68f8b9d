//go:build linux

package main

import (
	"errors"
	"fmt"
	"io"
	"net"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// dialAndWrite opens n connections to addr (the kernel completes them into
// the listener's accept queue) and writes "request i" on each, as a client
// that has just reconnected does.
func dialAndWrite(t *testing.T, addr string, n int) []net.Conn {
	t.Helper()
	var cs []net.Conn
	for i := range n {
		c, err := net.DialTimeout("tcp", addr, time.Second)
		require.NoError(t, err)
		_, err = fmt.Fprintf(c, "request %d", i)
		require.NoError(t, err)
		cs = append(cs, c)
	}
	t.Cleanup(func() {
		for _, c := range cs {
			_ = c.Close()
		}
	})
	return cs
}

// waitQueue waits until the listener's accept queue holds n connections.
func waitQueue(t *testing.T, ln *drainingListener, n int) {
	t.Helper()
	require.Eventually(t, func() bool {
		q, err := acceptQueueLen(ln.TCPListener)
		return err == nil && q == n
	}, 2*time.Second, time.Millisecond, "accept queue never held %d connections", n)
}

// TestListenerRefusesNewConnectionsWhenClosing (issue 13 item 14): once
// Close has begun, the kernel starts no new handshake on the listener (a
// client's SYN is dropped, so its dial waits and later is refused, before
// it has written a request), while the connections it had already
// completed are still handed out. Before, the listener was a multipath
// TCP socket, which takes no socket filter, so clients went on connecting
// until it closed and the last ones queued were reset with their request
// unread (2-30 wrk read errors per SIGTERM run in testdata/load/sigterm.sh).
func TestListenerRefusesNewConnectionsWhenClosing(t *testing.T) {
	ln, err := listen("127.0.0.1:0")
	require.NoError(t, err)
	addr := ln.Addr().String()
	dialAndWrite(t, addr, 3)
	waitQueue(t, ln, 3)

	require.NoError(t, ln.Close())
	assert.True(t, ln.filtered.Load(), "the SYN filter must attach to the listening socket")

	// A new dial gets no answer while the listener drains.
	c, err := net.DialTimeout("tcp", addr, 300*time.Millisecond)
	if c != nil {
		_ = c.Close()
	}
	var ne net.Error
	require.True(t, errors.As(err, &ne) && ne.Timeout(), "a dial while closing must wait (SYN dropped), got %v", err)

	for i := range 3 {
		got, err := ln.Accept()
		require.NoError(t, err, "queued connection %d must be accepted", i)
		buf := make([]byte, 9)
		_, err = io.ReadFull(got, buf)
		require.NoError(t, err)
		assert.Equal(t, fmt.Sprintf("request %d", i), string(buf))
		_ = got.Close()
	}
	_, err = ln.Accept()
	require.ErrorIs(t, err, net.ErrClosed)

	// Closed now: a dial is refused at once.
	_, err = net.DialTimeout("tcp", addr, time.Second)
	require.ErrorIs(t, err, syscall.ECONNREFUSED)
}

// TestListenerDrainOutlastsAStarvedAcceptor (issue 13 item 14): if the
// accepting goroutine first runs after the drain's deadline (a busy
// machine), the connections still queued are accepted, not reset: the
// drain goes on while the kernel's accept queue holds any. Before, the
// listener closed at the deadline whatever was queued.
func TestListenerDrainOutlastsAStarvedAcceptor(t *testing.T) {
	ln, err := listen("127.0.0.1:0")
	require.NoError(t, err)
	clients := dialAndWrite(t, ln.Addr().String(), 4)
	waitQueue(t, ln, 4)
	require.NoError(t, ln.Close())
	time.Sleep(3 * acceptDrain)

	for i := range 4 {
		got, err := ln.Accept()
		require.NoError(t, err, "queued connection %d must be accepted after the deadline", i)
		_, err = io.ReadFull(got, make([]byte, 9)) // the request (closing with it unread would reset)
		require.NoError(t, err)
		_, err = got.Write([]byte("answer"))
		require.NoError(t, err)
		_ = got.Close()
	}
	_, err = ln.Accept()
	require.ErrorIs(t, err, net.ErrClosed)
	for i, c := range clients { // every client reads its answer, none a reset
		require.NoError(t, c.SetReadDeadline(time.Now().Add(time.Second)))
		b, err := io.ReadAll(c)
		require.NoError(t, err, "client %d", i)
		assert.Equal(t, "answer", string(b), "client %d", i)
	}
}

// TestAcceptQueueLen checks the queue reading the drain relies on against
// connections counted by hand.
func TestAcceptQueueLen(t *testing.T) {
	ln, err := listen("127.0.0.1:0")
	require.NoError(t, err)
	defer ln.TCPListener.Close()
	n, err := acceptQueueLen(ln.TCPListener)
	require.NoError(t, err)
	assert.Equal(t, 0, n)
	dialAndWrite(t, ln.Addr().String(), 2)
	waitQueue(t, ln, 2)
	c, err := ln.Accept()
	require.NoError(t, err)
	_ = c.Close()
	n, err = acceptQueueLen(ln.TCPListener)
	require.NoError(t, err)
	assert.Equal(t, 1, n)
}
