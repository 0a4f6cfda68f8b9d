-- wrk script: POST /v1/stage/size, rotating the request bodies given after
-- "--" (the demo duties testdata/stages/*.in.json), and a summary line
-- that run.sh parses.
local bodies = {}
local n = 0

function init(args)
  for _, name in ipairs(args) do
    local f = assert(io.open(name, "rb"))
    local body = f:read("*a")
    f:close()
    bodies[#bodies + 1] = wrk.format("POST", "/v1/stage/size",
      { ["Content-Type"] = "application/json" }, body)
  end
  if #bodies == 0 then
    error("size.lua: give the duty files after --")
  end
end

function request()
  n = n + 1
  return bodies[(n - 1) % #bodies + 1]
end

done = require("summary").done
