#!/usr/bin/env bash
# Loopback load benchmark of stagewright with wrk (see README.md here).
#
#   testdata/load/run.sh                # 20 s per endpoint, 32 connections
#   testdata/load/run.sh -d 60          # 60 s per endpoint (the RSS-flat check)
#   testdata/load/run.sh -d 10 -c 16 -t 2
#
# Builds the service, starts it on 127.0.0.1 at a free port, and drives,
# each for the same bounded time: GET /healthz (the trivial endpoint); POST
# /v1/stage/size rotating the demo duties testdata/stages/*.in.json; the
# ideal-gas duty alone (kestrel-instrument-air); the five-component
# Peng-Robinson duty alone (kestrel-fuel-gas-booster); and batches of 500
# ideal-gas duties on 2 connections. Prints throughput, latency
# percentiles, errors, the issue 14 ratios to /healthz's throughput in the
# same run and the server's resident memory (VmRSS) over the run.
# Installs wrk from Debian (apt-get) when it is missing. Never leaves the
# loopback interface. A benchmark to report, not a pass/fail test.
set -euo pipefail

DURATION=20
CONNECTIONS=32
THREADS=2
while getopts "d:c:t:h" opt; do
	case $opt in
	d) DURATION=$OPTARG ;;
	c) CONNECTIONS=$OPTARG ;;
	t) THREADS=$OPTARG ;;
	*)
		sed -n '2,14p' "$0"
		exit 2
		;;
	esac
done
for v in "$DURATION" "$CONNECTIONS" "$THREADS"; do
	if ! [[ "$v" =~ ^[0-9]+$ ]] || ((v < 1)); then
		echo "run.sh: -d, -c and -t take positive integers" >&2
		exit 2
	fi
done
if ((DURATION > 600)); then
	echo "run.sh: at most 600 s per endpoint" >&2
	exit 2
fi

HERE=$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)
ROOT=$(cd "$HERE/../.." && pwd)
WORK=$(mktemp -d)
SERVER_PID=""
SAMPLER_PID=""
cleanup() {
	if [[ -n "$SAMPLER_PID" ]]; then kill "$SAMPLER_PID" 2>/dev/null || true; fi
	if [[ -n "$SERVER_PID" ]] && kill -0 "$SERVER_PID" 2>/dev/null; then
		kill "$SERVER_PID" 2>/dev/null || true
		wait "$SERVER_PID" 2>/dev/null || true
	fi
	rm -rf "$WORK"
}
trap cleanup EXIT

if ! command -v wrk >/dev/null; then
	echo "wrk is missing: installing the Debian package (apt-get install wrk)"
	if [[ $(id -u) -eq 0 ]]; then SUDO=""; else SUDO="sudo"; fi
	$SUDO apt-get update -qq
	DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq wrk >/dev/null
fi

duties=("$ROOT"/testdata/stages/*.in.json)
IDEAL="$ROOT/testdata/stages/kestrel-instrument-air.in.json"
PR5="$ROOT/testdata/stages/kestrel-fuel-gas-booster.in.json"
BATCH=500
if [[ ! -f "${duties[0]}" ]]; then
	echo "run.sh: no demo duties in testdata/stages" >&2
	exit 1
fi

echo "building the service"
(cd "$ROOT" && go build -o "$WORK/stagewright" ./cmd/stagewright)

# A free loopback port: the first one nothing answers on.
port=""
for _ in $(seq 1 50); do
	p=$((20000 + RANDOM % 40000))
	if ! (exec 3<>"/dev/tcp/127.0.0.1/$p") 2>/dev/null; then
		port=$p
		break
	fi
done
[[ -n "$port" ]] || { echo "run.sh: no free port found" >&2; exit 1; }
URL="http://127.0.0.1:$port"

# Production settings: info level, one JSON log line per request (to a file,
# as a container runtime would collect it).
"$WORK/stagewright" --addr "127.0.0.1:$port" 2>"$WORK/server.log" >/dev/null &
SERVER_PID=$!
for _ in $(seq 1 100); do
	if (exec 3<>"/dev/tcp/127.0.0.1/$port") 2>/dev/null; then break; fi
	kill -0 "$SERVER_PID" 2>/dev/null || { cat "$WORK/server.log"; exit 1; }
	sleep 0.1
done

rss() { awk '/^VmRSS:/ {print $2}' "/proc/$SERVER_PID/status"; }

# VmRSS every second for the whole run, with the phase it belongs to.
echo "warmup" >"$WORK/phase"
(
	while kill -0 "$SERVER_PID" 2>/dev/null; do
		printf '%s %s %s\n' "$(date +%s)" "$(cat "$WORK/phase")" "$(rss)" >>"$WORK/rss.log"
		sleep 1
	done
) &
SAMPLER_PID=$!

export LUA_PATH="$HERE/?.lua;;"
echo "load average before: $(cut -d' ' -f1-3 /proc/loadavg) (other work on the machine skews every figure)"
echo "server $URL (pid $SERVER_PID), wrk -t$THREADS -c$CONNECTIONS -d${DURATION}s, $(nproc) CPUs, ${#duties[@]} demo duties"
echo "warm-up: 2 s of each endpoint"
wrk -t"$THREADS" -c"$CONNECTIONS" -d2s -s "$HERE/healthz.lua" "$URL" >/dev/null
wrk -t"$THREADS" -c"$CONNECTIONS" -d2s -s "$HERE/size.lua" "$URL" -- "${duties[@]}" >/dev/null

run() { # phase, connections, wrk script, extra args
	local phase=$1 conns=$2 script=$3
	shift 3
	echo "$phase" >"$WORK/phase"
	wrk -t"$(min "$THREADS" "$conns")" -c"$conns" -d"${DURATION}s" --latency -s "$HERE/$script" "$URL" "$@" >"$WORK/$phase.out"
	grep '^RESULT ' "$WORK/$phase.out" | sed "s/^RESULT /$phase /"
}
min() { if (($1 < $2)); then echo "$1"; else echo "$2"; fi; }
field() { grep -o "$2=[0-9.]*" <<<"$1" | cut -d= -f2; }

echo
trivial=$(run healthz "$CONNECTIONS" healthz.lua)
sizing=$(run size "$CONNECTIONS" size.lua -- "${duties[@]}")
ideal=$(run ideal "$CONNECTIONS" size.lua -- "$IDEAL")
pr5=$(run pr5 "$CONNECTIONS" size.lua -- "$PR5")
batch=$(run batch 2 batch.lua -- "$IDEAL" "$BATCH")
echo "idle" >"$WORK/phase"
sleep 1

printf '\n%-8s %10s %9s %9s %9s %9s %8s %8s\n' endpoint "req/s" "p50 ms" "p90 ms" "p99 ms" "max ms" "non-2xx" "sock err"
for line in "$trivial" "$sizing" "$ideal" "$pr5" "$batch"; do
	read -r name _ <<<"$line"
	sock=$(($(field "$line" connect) + $(field "$line" read) + $(field "$line" write) + $(field "$line" timeout)))
	printf '%-8s %10s %9s %9s %9s %9s %8s %8s\n' "$name" "$(field "$line" rps)" "$(field "$line" p50_ms)" \
		"$(field "$line" p90_ms)" "$(field "$line" p99_ms)" "$(field "$line" max_ms)" "$(field "$line" non2xx)" "$sock"
done
echo "(batch: one request is $BATCH ideal-gas duties, 2 connections)"
awk -v s="$(field "$sizing" rps)" -v t="$(field "$trivial" rps)" -v i="$(field "$ideal" rps)" -v p="$(field "$pr5" rps)" \
	-v b="$(field "$batch" rps)" -v n="$BATCH" 'BEGIN {
	printf "\nratios to /healthz req/s in this run:\n"
	printf "  ideal-gas sizing / healthz:       %.3f (target >= 0.35)\n", i / t
	printf "  5-component PR sizing / healthz:  %.3f (target >= 0.25)\n", p / t
	printf "  batch duties/s / healthz:         %.3f (target >= 0.6; %.0f duties/s)\n", b * n / t, b * n
	printf "  demo rotation / healthz:          %.3f\n", s / t }'
awk -v p="$(field "$sizing" p99_ms)" 'BEGIN { printf "sizing p99: %.2f ms (target <= 5 ms at 32 connections)\n", p }'

echo
echo "server resident memory (VmRSS, kB) per phase: first, last, max sample"
awk '{ if (!($2 in first)) { first[$2] = $3; order[++n] = $2 } last[$2] = $3; if ($3 > max[$2]) max[$2] = $3 }
	END { for (i = 1; i <= n; i++) { p = order[i]; printf "  %-8s %8d %8d %8d\n", p, first[p], last[p], max[p] } }' "$WORK/rss.log"
awk '$2 == "size" { if (!a) a = $3; b = $3 } END { if (a) printf "  sizing phase: %+.1f %% from its first to its last sample\n", 100 * (b - a) / a }' "$WORK/rss.log"
echo "server log lines: $(wc -l <"$WORK/server.log"); server errors logged: $(grep -c '"level":"ERROR"' "$WORK/server.log" || true)"
grep '"level":"ERROR"' "$WORK/server.log" | head -n 5 || true
echo "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
