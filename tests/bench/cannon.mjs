// Drives the served app with autocannon in a process of its own (so the load generator never shares the benchmark's
// event loop), and prints one JSON line: requests per second, latency percentiles, bytes, errors and statuses.
// Input: one JSON argument { url, connections, seconds, headers, requests: [{ name, method, path, headers, body,
// paths? }] } where `paths` (optional) is a list the request cycles through.
import { createRequire } from "node:module";

const autocannon = createRequire(import.meta.url)("autocannon");
const input = JSON.parse(process.argv[2]);

function percentile(sorted, p) {
  if (sorted.length === 0) return null;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

const counters = input.requests.map(() => 0);
const perRoute = input.requests.map(() => ({ times: [], statuses: {} }));
const all = [];
const instance = autocannon({
  url: input.url,
  connections: input.connections,
  duration: input.seconds,
  timeout: 10,
  headers: input.headers,
  requests: input.requests.map(({ name: _name, paths, ...request }, i) => ({
    ...request,
    ...(paths ? { setupRequest: (r) => ({ ...r, path: paths[counters[i]++ % paths.length] }) } : {}),
  })),
});
instance.on("response", (client, statusCode, _bytes, responseTimeMs) => {
  all.push(responseTimeMs);
  const index = client.requestIterator?.currentRequestIndex ?? -1;
  const route = perRoute[index];
  if (!route) return;
  route.times.push(responseTimeMs);
  route.statuses[statusCode] = (route.statuses[statusCode] ?? 0) + 1;
});
const result = await instance;
all.sort((a, b) => a - b);
console.log(
  JSON.stringify({
    requestsPerSecond: result.requests.total / result.duration,
    count: all.length,
    p50: percentile(all, 50),
    p95: percentile(all, 95),
    p99: percentile(all, 99),
    bytesPerResponse: all.length ? result.throughput.total / all.length : 0,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
    routes: perRoute.map((r, i) => {
      const sorted = r.times.sort((a, b) => a - b);
      return {
        name: input.requests[i].name,
        count: sorted.length,
        p50: percentile(sorted, 50),
        p95: percentile(sorted, 95),
        statuses: r.statuses,
      };
    }),
  }),
);
