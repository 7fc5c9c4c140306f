/**
 * `npm run bench:http`: load figure of the HTTP service on loopback. Builds dist/, starts the
 * real entry (node dist/src/server/main.js) with BENCH_WORKERS workers (default 2) in its own
 * process, warms it up, then drives it with autocannon for BENCH_SECONDS (default 10) each:
 *   GET /healthz       (the HTTP ceiling of this machine: no generation)
 *   POST /v1/tracks {} (default parameters, a fresh random seed per request)
 * and prints requests/s, p50/p99 latency, errors and non-2xx answers, and the tracks' rate as a
 * share of the health check's. Run by hand; never part of npm test. Figures depend on the
 * machine and on whatever else runs on it: compare runs made on the same machine.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { startBuiltServer, waitReady } from '../helpers/built-server.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const WORKERS = Number(process.env.BENCH_WORKERS ?? 2);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
/** Connections per run: twice the workers keeps every worker busy with one request waiting. */
const TRACK_CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 2 * WORKERS);
const HEALTH_CONNECTIONS = 10;

interface Figure {
  readonly name: string;
  readonly connections: number;
  readonly requestsPerS: number;
  readonly p50Ms: number;
  readonly p99Ms: number;
  readonly requests: number;
  readonly errors: number;
  readonly non2xx: number;
}

async function main(): Promise<void> {
  const build = spawnSync('npm', ['run', 'build'], { cwd: ROOT, stdio: 'inherit' });
  if (build.status !== 0) throw new Error('build failed');
  const { base, child: server } = await startBuiltServer({ ...process.env, LAPWRIGHT_WORKERS: String(WORKERS) });
  try {
    await waitReady(base);
    console.log(`lapwright ${base}: ${WORKERS} workers, Node ${process.versions.node}, ${SECONDS} s per run, autocannon in this process`);
    await run('warm-up', { url: `${base}/v1/tracks`, method: 'POST', body: '{}', headers: { 'content-type': 'application/json' }, connections: TRACK_CONNECTIONS, duration: 2 });
    const health = await run('GET /healthz', { url: `${base}/healthz`, connections: HEALTH_CONNECTIONS, duration: SECONDS });
    const tracks = await run('POST /v1/tracks {}', { url: `${base}/v1/tracks`, method: 'POST', body: '{}', headers: { 'content-type': 'application/json' }, connections: TRACK_CONNECTIONS, duration: SECONDS });
    console.log('');
    console.table([health, tracks].map((f) => ({ run: f.name, connections: f.connections, 'req/s': f.requestsPerS, 'p50 ms': f.p50Ms, 'p99 ms': f.p99Ms, requests: f.requests, errors: f.errors, non2xx: f.non2xx })));
    console.log(`POST /v1/tracks / GET /healthz requests/s: ${(tracks.requestsPerS / health.requestsPerS).toFixed(4)} (1 : ${(health.requestsPerS / tracks.requestsPerS).toFixed(0)})`);
  } finally {
    server.kill('SIGTERM');
  }
}

async function run(name: string, options: autocannon.Options): Promise<Figure> {
  const result = await autocannon(options);
  return {
    name,
    connections: options.connections ?? 10,
    requestsPerS: round(result.requests.average),
    p50Ms: round(result.latency.p50),
    p99Ms: round(result.latency.p99),
    requests: result.requests.total,
    errors: result.errors,
    non2xx: result.non2xx,
  };
}

function round(x: number): number {
  return Math.round(x * 10) / 10;
}

main().catch((err: Error) => {
  console.error(`bench:http failed: ${err.message}`);
  process.exitCode = 1;
});
