-- Drives one endpoint for wrk: each request takes the next line of BENCH_FILE (method, path, cookie, JSON
-- body, tab-separated), the lines shared out between wrk's threads so none is sent twice while the list
-- lasts. BENCH_UNIQUE_ADDRESS=1 gives every request its own X-Forwarded-For, as many visitors would have.
-- done() prints one line of JSON that scripts/lib/bench/wrk.ts reads.
local file = os.getenv("BENCH_FILE")
local nthreads = tonumber(os.getenv("BENCH_THREADS") or "1")
local unique_address = os.getenv("BENCH_UNIQUE_ADDRESS") == "1"
local thread_count = 0

function setup(thread)
  thread:set("tid", thread_count)
  thread_count = thread_count + 1
end

local items = {}
local counter = 0

local function load(share)
  local n = 0
  for line in io.lines(file) do
    if not share or n % nthreads == tid then
      local method, path, cookie, body = line:match("^([^\t]*)\t([^\t]*)\t([^\t]*)\t(.*)$")
      local headers = {}
      if cookie ~= "" then headers["Cookie"] = cookie end
      if body ~= "" then headers["Content-Type"] = "application/json" end
      table.insert(items, { method = method, path = path, headers = headers, body = body ~= "" and body or nil })
    end
    n = n + 1
  end
end

function init(args)
  load(true)
  -- A list shorter than the number of threads (one health URL): every thread sends all of it.
  if #items == 0 then load(false) end
end

function request()
  counter = counter + 1
  local item = items[((counter - 1) % #items) + 1]
  if unique_address then
    item.headers["X-Forwarded-For"] = string.format("10.%d.%d.%d", 100 + tid, math.floor(counter / 256) % 256, counter % 256)
  end
  return wrk.format(item.method, item.path, item.headers, item.body)
end

function done(summary, latency, requests)
  local e = summary.errors
  io.write(string.format(
    'BENCH_RESULT {"requests":%d,"durationUs":%d,"p50Us":%d,"p90Us":%d,"p99Us":%d,"meanUs":%.1f,"maxUs":%d,"errors":{"connect":%d,"read":%d,"write":%d,"status":%d,"timeout":%d}}\n',
    summary.requests, summary.duration, latency:percentile(50), latency:percentile(90), latency:percentile(99), latency.mean, latency.max,
    e.connect, e.read, e.write, e.status, e.timeout))
end
