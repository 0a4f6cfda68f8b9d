-- wrk script: GET /healthz (the trivial endpoint) with the same summary line.
wrk.method = "GET"
wrk.path = "/healthz"
done = require("summary").done
