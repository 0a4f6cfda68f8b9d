-- Shared wrk done() hook: one machine-readable line with throughput,
-- latency percentiles (ms) and every error class.
local M = {}

function M.done(summary, latency, requests)
  local secs = summary.duration / 1e6
  local e = summary.errors
  io.write(string.format(
    "RESULT requests=%d seconds=%.2f rps=%.1f p50_ms=%.3f p90_ms=%.3f p99_ms=%.3f max_ms=%.3f " ..
    "non2xx=%d connect=%d read=%d write=%d timeout=%d\n",
    summary.requests, secs, summary.requests / secs,
    latency:percentile(50) / 1000, latency:percentile(90) / 1000, latency:percentile(99) / 1000,
    latency.max / 1000, e.status, e.connect, e.read, e.write, e.timeout))
end

return M
