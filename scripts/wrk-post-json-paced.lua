-- wrk script: as wrk-post-json.lua, but each connection pauses before every request, so that
-- the total rate is about connections * 1000 / PAUSE_MS requests per second.
--   wrk ... -s scripts/wrk-post-json-paced.lua URL -- body.json PAUSE_MS
-- The pauses are drawn from an exponential distribution (Poisson arrivals per connection, as
-- independent clients would send), and rounded up or down at random because wrk pauses whole
-- milliseconds; both keep the mean at PAUSE_MS and keep connections from marching in step.

local pause_ms
local next_thread = 1

function setup(thread)
  thread:set("thread_number", next_thread)
  next_thread = next_thread + 1
end

function init(args)
  local file = assert(io.open(args[1], "rb"), "cannot open the body file " .. tostring(args[1]))
  wrk.method = "POST"
  wrk.body = file:read("*a")
  file:close()
  wrk.headers["Content-Type"] = "application/json"
  pause_ms = assert(tonumber(args[2]), "the second script argument is the mean pause in ms")
  -- each thread has its own Lua state; without its own seed every thread draws the same pauses
  math.randomseed(1000 + (thread_number or 0))
end

function delay()
  local wanted = -math.log(1 - math.random()) * pause_ms
  local whole = math.floor(wanted)
  if math.random() < wanted - whole then
    whole = whole + 1
  end
  return whole
end
