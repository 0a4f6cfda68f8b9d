-- wrk script: POST /v1/stage/size/batch with one batch of N copies of the
-- duty given after "--" (file, then N; the load script sends 500 copies
-- of the ideal-gas demo duty), and the summary line run.sh parses.
local body

function init(args)
  local name, n = args[1], tonumber(args[2] or "500")
  if not name then
    error("batch.lua: give the duty file (and the count) after --")
  end
  local f = assert(io.open(name, "rb"))
  local duty = f:read("*a")
  f:close()
  local duties = {}
  for i = 1, n do
    duties[i] = duty
  end
  body = wrk.format("POST", "/v1/stage/size/batch",
    { ["Content-Type"] = "application/json" }, '{"duties":[' .. table.concat(duties, ",") .. "]}")
end

function request()
  return body
end

done = require("summary").done
