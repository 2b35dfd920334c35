// Runs one autocannon load in its own process, so the load generator never shares a CPU event
// loop with the server it measures. Input: one JSON argument; output: one JSON line.
//   { url, connections, duration, headers?, paths?: string[] }
// With `paths`, each connection cycles through those paths (formulas and plans in the soak test).
import autocannon from 'autocannon';

const cfg = JSON.parse(process.argv[2]);
const base = new URL(cfg.url);
if (base.hostname !== '127.0.0.1' && base.hostname !== 'localhost') {
  process.stderr.write(`autocannon-worker: loopback only; refusing ${base.hostname}\n`);
  process.exit(2);
}

const result = await autocannon({
  url: cfg.url,
  connections: cfg.connections,
  duration: cfg.duration,
  headers: cfg.headers ?? {},
  timeout: 10,
  ...(cfg.paths ? { requests: cfg.paths.map((path) => ({ method: 'GET', path })) } : {}),
});

const statusCounts = Object.fromEntries(Object.entries(result.statusCodeStats ?? {}).map(([code, s]) => [code, s.count]));
process.stdout.write(
  `${JSON.stringify({
    connections: cfg.connections,
    duration: result.duration,
    requests: result.requests.total,
    rps: result.requests.average,
    latency: { p50: result.latency.p50, p90: result.latency.p90, p99: result.latency.p99, max: result.latency.max, mean: result.latency.average },
    errors: result.errors,
    timeouts: result.timeouts,
    non2xx: result.non2xx,
    statusCounts,
    bytes: result.throughput.total,
  })}\n`,
);
