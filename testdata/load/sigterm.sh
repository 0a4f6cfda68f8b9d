#!/usr/bin/env bash
# SIGTERM under keep-alive load (issue 13 item 14): wrk drives POST
# /v1/stage/size on 32 keep-alive connections while the service gets
# SIGTERM with a shutdown delay; no request may be lost at the socket.
#
#   testdata/load/sigterm.sh            # 3 s delay, SIGTERM 2 s into an 8 s run
#
# Once shutdown begins every answer says Connection: close, so wrk
# reconnects; after the delay the listener stops new handshakes, takes
# what the kernel has queued and closes, and wrk's new connections are
# refused before it writes a request (wrk counts these as "write" errors,
# as it does not check a non-blocking connect: a load balancer sends them
# to another replica). "read" errors (a request written and never
# answered) must be 0; the script fails otherwise. Loopback only, bounded
# in time.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/../.."
command -v wrk >/dev/null || { apt-get install -y wrk >/dev/null || { apt-get update >/dev/null && apt-get install -y wrk >/dev/null; }; }
WORK=$(mktemp -d)
SERVER_PID=""
cleanup() {
	if [[ -n "$SERVER_PID" ]] && kill -0 "$SERVER_PID" 2>/dev/null; then kill "$SERVER_PID" 2>/dev/null || true; fi
	rm -rf "$WORK"
}
trap cleanup EXIT
go build -o "$WORK/stagewright" ./cmd/stagewright
"$WORK/stagewright" --addr 127.0.0.1:0 --shutdown-delay 3s --shutdown-grace 10s 2>"$WORK/server.log" &
SERVER_PID=$!
addr=""
for _ in $(seq 1 100); do
	addr=$(grep -o '"addr":"127\.0\.0\.1:[0-9]*"' "$WORK/server.log" | grep -o '127\.0\.0\.1:[0-9]*' || true)
	[[ -n "$addr" ]] && break
	sleep 0.1
done
[[ -n "$addr" ]] || { cat "$WORK/server.log"; exit 1; }
(sleep 2 && kill -TERM "$SERVER_PID") &
wrk -t 2 -c 32 -d 8s --timeout 5s -s testdata/load/size.lua "http://$addr" -- testdata/stages/kestrel-instrument-air.in.json >"$WORK/wrk.txt" 2>&1 || true
wait "$SERVER_PID" && status=0 || status=$?
SERVER_PID=""
grep -o '"msg":"listener closing"[^}]*' "$WORK/server.log" || true
sed -n '/Requests\/sec\|requests in\|Socket errors\|Non-2xx/p' "$WORK/wrk.txt"
echo "server exit status: $status"
read_errors=$(grep -o 'read [0-9]*' "$WORK/wrk.txt" | grep -o '[0-9]*' || echo 0)
echo "read errors: ${read_errors:-0}"
if [[ "$status" != 0 || "${read_errors:-0}" != 0 ]]; then
	echo "requests lost at SIGTERM (or an unclean exit)"
	exit 1
fi
