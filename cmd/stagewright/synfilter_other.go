//go:build !linux

package main

import (
	"errors"
	"net"
)

// refuseNewConnections is Linux only (a BPF socket filter); elsewhere the
// listener drains for acceptDrain and closes, and a connection queued in
// that last instant may be reset.
func refuseNewConnections(*net.TCPListener) error {
	return errors.New("not supported on this system")
}

// acceptQueueLen is Linux only; elsewhere the drain lasts acceptDrain.
func acceptQueueLen(*net.TCPListener) (int, error) {
	return 0, errors.New("not supported on this system")
}
