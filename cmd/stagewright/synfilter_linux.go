//go:build linux

package main

import (
	"net"

	"golang.org/x/sys/unix"
)

// refuseNewConnections attaches a classic BPF socket filter to the
// listening socket that drops every segment carrying SYN without ACK: the
// kernel then starts no new handshake on it, while the handshakes already
// answered (their final ACK carries ACK) still complete into the accept
// queue. A client whose SYN is dropped retransmits it about a second
// later, finds the socket closed and is refused before it has written
// anything, instead of having its request reset unread in the queue.
//
// For a TCP socket the filter sees the segment from its TCP header
// (tcp_v4_rcv and tcp_v6_rcv run it with skb->data there): byte 13 holds
// the flags, SYN 0x02 and ACK 0x10 (RFC 9293 section 3.1).
func refuseNewConnections(l *net.TCPListener) error {
	prog := []unix.SockFilter{
		{Code: unix.BPF_LD | unix.BPF_B | unix.BPF_ABS, K: 13},                  // A = flags
		{Code: unix.BPF_ALU | unix.BPF_AND | unix.BPF_K, K: 0x12},               // A &= SYN|ACK
		{Code: unix.BPF_JMP | unix.BPF_JEQ | unix.BPF_K, K: 0x02, Jt: 0, Jf: 1}, // SYN alone?
		{Code: unix.BPF_RET | unix.BPF_K, K: 0},                                 // drop
		{Code: unix.BPF_RET | unix.BPF_K, K: 0xffffffff},                        // keep all
	}
	rc, err := l.SyscallConn()
	if err != nil {
		return err
	}
	var serr error
	err = rc.Control(func(fd uintptr) {
		serr = unix.SetsockoptSockFprog(int(fd), unix.SOL_SOCKET, unix.SO_ATTACH_FILTER,
			&unix.SockFprog{Len: uint16(len(prog)), Filter: &prog[0]})
	})
	if err != nil {
		return err
	}
	return serr
}

// acceptQueueLen is the number of connections the kernel has completed on
// the listening socket and not yet handed to accept (for a listener,
// TCP_INFO's tcpi_unacked holds the accept queue's length).
func acceptQueueLen(l *net.TCPListener) (int, error) {
	rc, err := l.SyscallConn()
	if err != nil {
		return 0, err
	}
	var info *unix.TCPInfo
	var serr error
	if err := rc.Control(func(fd uintptr) {
		info, serr = unix.GetsockoptTCPInfo(int(fd), unix.IPPROTO_TCP, unix.TCP_INFO)
	}); err != nil {
		return 0, err
	}
	if serr != nil {
		return 0, serr
	}
	return int(info.Unacked), nil
}
