-- wrk script: POST one JSON body, read from the file named by the first script argument, to the
-- URL given on the command line.
--   wrk ... -s scripts/wrk-post-json.lua http://127.0.0.1:8080/models/routing/predict -- body.json

function init(args)
  local file = assert(io.open(args[1], "rb"), "cannot open the body file " .. tostring(args[1]))
  wrk.method = "POST"
  wrk.body = file:read("*a")
  file:close()
  wrk.headers["Content-Type"] = "application/json"
end
