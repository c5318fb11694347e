/**
 * Child process of npm run bench: one autocannon run (options as JSON in argv[2]), its result as one
 * JSON line. A separate process, so the load generator never shares the server's event loop or memory.
 */
import autocannon from 'autocannon';

const opts = JSON.parse(process.argv[2] ?? '{}') as autocannon.Options;
const r = await autocannon(opts);
console.log(
  JSON.stringify({
    requestsPerS: r.requests.average,
    total: r.requests.total,
    p50Ms: r.latency.p50,
    p99Ms: r.latency.p99,
    maxMs: r.latency.max,
    errors: r.errors,
    timeouts: r.timeouts,
    non2xx: r.non2xx,
    status5xx: r['5xx'],
    statusCodes: r.statusCodeStats,
  }),
);
