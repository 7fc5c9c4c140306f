/**
 * `npm run load`: the HTTP service under mixed traffic, measured. Builds dist/ (npm run build),
 * starts the real entry (node dist/src/server/main.js) with its defaults in its own process on a
 * loopback port, warms it up, then drives it for --duration seconds (default 60) with autocannon
 * over --connections keep-alive connections (default 50), each an autocannon instance of its own
 * started 1/connections of a second after the previous one, so that their per-second rate limits
 * tick at evenly spread moments and the requests arrive evenly, not in one burst a second:
 *   POST /v1/tracks {seed}          a fresh random seed, default parameters
 *   GET /v1/tracks/{seed}           a fresh random seed, default parameters
 *   GET /v1/tracks/{hot seed}       20 seeds asked again and again, half with If-None-Match (304)
 *   POST /v1/tracks/validate        a real 1.5 km track (about 140 KB of JSON)
 *   POST /v1/batches                count 5, detail summary, a fresh base seed
 * --rate R caps the offered load at R requests/s in all (at least one per connection; 0: no cap,
 * every connection sends its next request as soon as the last is answered).
 *
 * It prints one block: date, machine, server configuration, per kind and overall requests/s and
 * p50/p99/max latency (exact, from every response), errors, answers other than 2xx/304 by status,
 * 5xx, the deepest queue seen, the server's resident memory (VmRSS from /proc) at start, after
 * warm-up, at its peak and at the end, and a consistency check: a sample of the tracks served is
 * made again in this process with generateTrack and must have the same ids. `--write FILE` also
 * writes the block to FILE. Exit 1 when a target is missed (zero errors, zero 5xx, p99 of single
 * default tracks under 250 ms, end RSS within 20% of after warm-up, no id mismatch). Bounded: the
 * run stops by itself after warm-up + duration, each connection sends at most a fixed number of
 * requests, and a watchdog kills the server and exits 2 if anything hangs. Never part of npm test.
 */
import { type ChildProcess, spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import { dirname } from 'node:path';
import { performance } from 'node:perf_hooks';
import { setTimeout as sleep } from 'node:timers/promises';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import { generateTrack, type Seed } from '../../src/core/index.js';
import { startBuiltServer, waitReady } from '../helpers/built-server.js';
import { cpuSeconds, fixed, KindStats, mergeStats, mulberry32, quantile, residentMiB } from './stats.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

/** Kinds of request, their share of the mix, and how the block names them. */
const KINDS = {
  post: { share: 0.35, label: 'POST /v1/tracks {seed}' },
  get: { share: 0.25, label: 'GET /v1/tracks/{seed}' },
  cached: { share: 0.2, label: 'GET repeat seed (½ If-None-Match)' },
  validate: { share: 0.16, label: 'POST /v1/tracks/validate' },
  batch: { share: 0.04, label: 'POST /v1/batches count 5' },
} as const;
type Kind = keyof typeof KINDS;

/** Seeds asked again and again by the cached kind. */
const HOT_SEEDS = 20;
const BATCH_COUNT = 5;
/** p99 latency target of single default tracks, ms (issue 7). */
const P99_TARGET_MS = 250;
/** End RSS may exceed the after-warm-up RSS by this share (issue 7: no leak). */
const RSS_GROWTH_TARGET = 0.2;
/** Per-request timeout of the load generator, s: above the server's 10 s deadline. */
const REQUEST_TIMEOUT_S = 30;
const QUEUE_POLL_MS = 200;
const RSS_POLL_MS = 250;

interface Options {
  readonly durationS: number;
  readonly warmupS: number;
  readonly connections: number;
  /** Offered requests/s in all; 0: no cap (closed loop). */
  readonly rate: number;
  readonly sample: number;
  readonly seed: number;
  readonly write: string | undefined;
  readonly build: boolean;
  readonly workers: string | undefined;
  readonly maxQueue: string | undefined;
}

/** What one request was, and what its answer showed (autocannon's per-connection context). */
interface Context {
  kind: Kind;
  seed: Seed;
  ifNoneMatch: boolean;
  wrong: boolean;
  served: { request: { seed: Seed } & Record<string, unknown>; id: string }[];
}

interface Phase {
  readonly stats: Record<Kind, KindStats>;
  errors: number;
  timeouts: number;
  spanS: number;
}

async function main(): Promise<void> {
  const options = readOptions();
  const watchdog = setTimeout(
    () => {
      console.error('npm run load: the run took far longer than asked; killing the server');
      server?.kill('SIGKILL');
      process.exit(2);
    },
    (options.warmupS + options.durationS + 300) * 1000,
  );
  let server: ChildProcess | null = null;
  if (options.build) {
    const build = spawnSync('npm', ['run', 'build'], { cwd: ROOT, stdio: 'inherit' });
    if (build.status !== 0) throw new Error('npm run build failed');
  }
  const loadBefore = os.loadavg()[0];
  // the defaults are what is measured: no LAPWRIGHT_* from the caller's environment
  const env: Record<string, string> = {};
  for (const [k, v] of Object.entries(process.env)) if (v !== undefined && !k.startsWith('LAPWRIGHT_')) env[k] = v;
  if (options.workers !== undefined) env.LAPWRIGHT_WORKERS = options.workers;
  if (options.maxQueue !== undefined) env.LAPWRIGHT_MAX_QUEUE = options.maxQueue;
  const { base, child } = await startBuiltServer(env, 'pipe');
  server = child;
  let serverLog = '';
  child.stdout!.on('data', (d: Buffer) => (serverLog += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (serverLog += d.toString()));
  try {
    const ready = await waitReady(base, 60);
    const rssStart = residentMiB(child.pid!);
    const rng = mulberry32(options.seed);
    const fixtures = await prepare(base);

    const warm = await drive(base, options, options.warmupS, rng, fixtures, null);
    const rssWarm = residentMiB(child.pid!);

    // the measured run, with the server's memory and queue watched
    const watch = startWatch(base, child.pid!);
    const sample = new Reservoir(options.sample, mulberry32(options.seed + 1));
    const ticks = Number(spawnSync('getconf', ['CLK_TCK'], { encoding: 'utf8' }).stdout.trim()) || 100;
    const cpuBefore = { server: cpuSeconds(child.pid!, ticks), self: process.cpuUsage() };
    const run = await drive(base, options, options.durationS, rng, fixtures, sample);
    const serverAfter = cpuSeconds(child.pid!, ticks);
    const selfUsed = process.cpuUsage(cpuBefore.self);
    const cpu = { server: serverAfter === null || cpuBefore.server === null ? Number.NaN : serverAfter - cpuBefore.server, loadGenerator: (selfUsed.user + selfUsed.system) / 1e6 };
    const watched = await watch.stop();
    const rssEnd = residentMiB(child.pid!);
    const loadAfter = os.loadavg()[0];

    const consistency = remake(sample.items);
    const block = report({ options, ready, loadBefore, loadAfter, cpu, warm, run, rssStart, rssWarm, rssEnd, watched, consistency, serverLog });
    console.log(`\n${block.text}`);
    if (options.write !== undefined) {
      mkdirSync(dirname(options.write), { recursive: true });
      writeFileSync(options.write, `# Load run\n\nMade by \`npm run load${process.argv.slice(2).length > 0 ? ` -- ${process.argv.slice(2).join(' ')}` : ''}\` (tests/load/run.ts); the README ("Load, overload and faults") says what it does and how to read it.\n\n\`\`\`\n${block.text}\n\`\`\`\n`);
      console.log(`written to ${options.write}`);
    }
    if (!block.pass) process.exitCode = 1;
  } finally {
    child.kill('SIGTERM');
    clearTimeout(watchdog);
  }
}

function readOptions(): Options {
  const { values } = parseArgs({
    options: {
      duration: { type: 'string', default: '60' },
      warmup: { type: 'string', default: '10' },
      connections: { type: 'string', default: '50' },
      rate: { type: 'string', default: '100' },
      sample: { type: 'string', default: '200' },
      seed: { type: 'string', default: '1' },
      workers: { type: 'string' },
      'max-queue': { type: 'string' },
      write: { type: 'string' },
      'skip-build': { type: 'boolean', default: false },
    },
  });
  const int = (name: string, text: string, min: number, max: number): number => {
    const n = Number(text);
    if (!Number.isInteger(n) || n < min || n > max) throw new Error(`--${name} must be an integer from ${min} to ${max}, got ${JSON.stringify(text)}`);
    return n;
  };
  const connections = int('connections', values.connections, 1, 1000);
  const rate = int('rate', values.rate, 0, 100_000);
  if (rate !== 0 && rate < connections) throw new Error(`--rate ${rate} is below --connections ${connections}: each connection sends at least 1 request/s (or give --rate 0 for no cap)`);
  return {
    durationS: int('duration', values.duration, 1, 3600),
    warmupS: int('warmup', values.warmup, 1, 600),
    connections,
    rate,
    sample: int('sample', values.sample, 0, 100_000),
    seed: int('seed', values.seed, 0, 2 ** 31 - 1),
    workers: values.workers,
    maxQueue: values['max-queue'],
    write: values.write,
    build: !values['skip-build'],
  };
}

interface Fixtures {
  /** A real track to validate, as JSON bytes. */
  readonly track: Buffer;
  /** Hot seeds and their ETags. */
  readonly hot: readonly { seed: string; etag: string }[];
}

// the track to validate and the ETags of the hot seeds
async function prepare(base: string): Promise<Fixtures> {
  const res = await fetch(`${base}/v1/tracks`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ seed: 'load-validate' }) });
  if (res.status !== 200) throw new Error(`could not fetch the track to validate: ${res.status}`);
  const track = Buffer.from(await res.arrayBuffer());
  const hot: { seed: string; etag: string }[] = [];
  for (let i = 0; i < HOT_SEEDS; i++) {
    const seed = `load-hot-${i}`;
    const r = await fetch(`${base}/v1/tracks/${seed}`);
    await r.arrayBuffer();
    const etag = r.headers.get('etag');
    if (r.status !== 200 || etag === null) throw new Error(`could not fetch hot seed ${seed}: ${r.status}`);
    hot.push({ seed, etag });
  }
  return { track, hot };
}

// one phase of mixed traffic: one autocannon instance per connection, started evenly over a second
async function drive(base: string, options: Options, durationS: number, rng: () => number, fixtures: Fixtures, sample: Reservoir | null): Promise<Phase> {
  const stats = Object.fromEntries(Object.keys(KINDS).map((k) => [k, new KindStats()])) as Record<Kind, KindStats>;
  const phase: Phase = { stats, errors: 0, timeouts: 0, spanS: 0 };
  const { connections, rate } = options;
  const perConnection = (i: number): number | undefined => (rate === 0 ? undefined : Math.floor(rate / connections) + (i < rate % connections ? 1 : 0));
  // a hard cap on requests per connection: twice its rate (or 200/s closed loop) for the whole phase
  const cap = (i: number): number => Math.ceil(2 * (perConnection(i) ?? 200) * durationS) + 10;
  const start = performance.now();
  await Promise.all(
    Array.from({ length: connections }, async (_, i) => {
      await sleep((i * 1000) / connections);
      const result = await runConnection(base, durationS, perConnection(i), cap(i), rng, fixtures, stats, sample);
      phase.errors += result.errors;
      phase.timeouts += result.timeouts;
    }),
  );
  phase.spanS = (performance.now() - start) / 1000;
  return phase;
}

function runConnection(base: string, durationS: number, rate: number | undefined, cap: number, rng: () => number, fixtures: Fixtures, stats: Record<Kind, KindStats>, sample: Reservoir | null): Promise<autocannon.Result> {
  let current: Context | null = null;
  const setupRequest = (request: autocannon.Request, context: object): autocannon.Request => {
    const ctx = context as Context;
    current = ctx;
    ctx.kind = pickKind(rng());
    ctx.wrong = false;
    ctx.served = [];
    ctx.ifNoneMatch = false;
    const seed = Math.floor(rng() * 2 ** 32);
    ctx.seed = seed;
    switch (ctx.kind) {
      case 'post':
        return { ...request, method: 'POST', path: '/v1/tracks', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ seed }) };
      case 'get':
        return { ...request, method: 'GET', path: `/v1/tracks/${seed}`, headers: {}, body: undefined };
      case 'cached': {
        const hot = fixtures.hot[Math.floor(rng() * fixtures.hot.length)];
        ctx.seed = hot.seed;
        ctx.ifNoneMatch = rng() < 0.5;
        return { ...request, method: 'GET', path: `/v1/tracks/${hot.seed}`, headers: ctx.ifNoneMatch ? { 'if-none-match': hot.etag } : {}, body: undefined };
      }
      case 'validate':
        return { ...request, method: 'POST', path: '/v1/tracks/validate', headers: { 'content-type': 'application/json' }, body: fixtures.track };
      case 'batch':
        return { ...request, method: 'POST', path: '/v1/batches', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ count: BATCH_COUNT, baseSeed: seed, detail: 'summary' }) };
    }
  };
  const onResponse = (status: number, body: string, context: object, headers: autocannon.Request['headers']): void => {
    const ctx = context as Context;
    ctx.wrong = !answerIsRight(ctx, status, body, headers ?? {}, fixtures);
  };
  return new Promise((resolve, reject) => {
    const instance = autocannon(
      { url: base, connections: 1, connectionRate: rate, duration: durationS, timeout: REQUEST_TIMEOUT_S, maxConnectionRequests: cap, requests: [{ setupRequest, onResponse }] },
      (err, result) => (err ? reject(err) : resolve(result)),
    );
    instance.on('response', (_client, status, _bytes, latencyMs) => {
      const ctx = current;
      if (ctx === null) return;
      const s = stats[ctx.kind];
      s.record(status, latencyMs);
      if (ctx.wrong) s.wrong++;
      if (sample !== null && !ctx.wrong) for (const item of ctx.served) sample.offer(item);
    });
  });
}

// what the answer must be, beyond its status: ids as ETags, 304 only when asked, a whole batch
function answerIsRight(ctx: Context, status: number, body: string, headers: Record<string, unknown>, fixtures: Fixtures): boolean {
  const etag = String(headers.etag ?? headers.ETag ?? '');
  if (status === 304) return ctx.kind === 'cached' && ctx.ifNoneMatch;
  if (status !== 200) return true; // counted by status, not as wrong content
  switch (ctx.kind) {
    case 'post':
    case 'get': {
      const m = /^"([0-9a-f]{64})"$/.exec(etag);
      if (m === null) return false;
      ctx.served.push({ request: { seed: ctx.seed }, id: m[1] });
      return true;
    }
    case 'cached':
      return !ctx.ifNoneMatch && etag === fixtures.hot.find((h) => h.seed === ctx.seed)?.etag;
    case 'validate':
      return (JSON.parse(body) as { valid?: unknown }).valid === true;
    case 'batch': {
      const lines = body.trimEnd().split('\n');
      const manifest = JSON.parse(lines.at(-1)!) as { format?: string; tracks?: { seed: Seed; params: { seed: Seed } & Record<string, unknown>; id: string }[] };
      if (manifest.format !== 'lapwright.manifest/1' || manifest.tracks?.length !== BATCH_COUNT || lines.length !== BATCH_COUNT + 1) return false;
      for (const t of manifest.tracks) ctx.served.push({ request: { ...t.params, seed: t.seed }, id: t.id });
      return true;
    }
  }
}

function pickKind(u: number): Kind {
  let acc = 0;
  for (const [kind, { share }] of Object.entries(KINDS) as [Kind, { share: number }][]) {
    acc += share;
    if (u < acc) return kind;
  }
  return 'post';
}

/** A uniform sample of fixed size from a stream (reservoir sampling, Vitter 1985, algorithm R). */
class Reservoir {
  readonly items: { request: { seed: Seed } & Record<string, unknown>; id: string }[] = [];
  private seen = 0;

  constructor(
    private readonly size: number,
    private readonly rng: () => number,
  ) {}

  offer(item: { request: { seed: Seed } & Record<string, unknown>; id: string }): void {
    this.seen++;
    if (this.items.length < this.size) this.items.push(item);
    else {
      const j = Math.floor(this.rng() * this.seen);
      if (j < this.size) this.items[j] = item;
    }
  }
}

// the sample made again in this process: the same request must give the same id
function remake(items: readonly { request: { seed: Seed } & Record<string, unknown>; id: string }[]): { checked: number; mismatches: string[] } {
  const mismatches: string[] = [];
  for (const { request, id } of items) {
    const again = generateTrack(request).id;
    if (again !== id) mismatches.push(`seed ${JSON.stringify(request.seed)}: served ${id.slice(0, 12)}, made again ${again.slice(0, 12)}`);
  }
  return { checked: items.length, mismatches };
}

interface Watched {
  rssPeak: number;
  hwm: number;
  maxQueued: number;
  maxBusy: number;
  polls: number;
}

// the server's RSS every 250 ms and its queue (GET /readyz) every 200 ms during the run
function startWatch(base: string, pid: number): { stop: () => Promise<Watched> } {
  const watched: Watched = { rssPeak: 0, hwm: 0, maxQueued: 0, maxBusy: 0, polls: 0 };
  const rssTimer = setInterval(() => {
    const m = residentMiB(pid);
    if (m !== null) watched.rssPeak = Math.max(watched.rssPeak, m.rss);
  }, RSS_POLL_MS);
  let running = true;
  const poller = (async () => {
    while (running) {
      try {
        const r = await fetch(`${base}/readyz`);
        const body = (await r.json()) as { queued?: number; busy?: number };
        watched.polls++;
        watched.maxQueued = Math.max(watched.maxQueued, body.queued ?? 0);
        watched.maxBusy = Math.max(watched.maxBusy, body.busy ?? 0);
      } catch {
        // counted by the load generator if the server stops answering
      }
      await sleep(QUEUE_POLL_MS);
    }
  })();
  return {
    stop: async () => {
      running = false;
      clearInterval(rssTimer);
      await poller;
      const m = residentMiB(pid);
      if (m !== null) {
        watched.rssPeak = Math.max(watched.rssPeak, m.rss);
        watched.hwm = m.hwm;
      }
      return watched;
    },
  };
}

interface ReportInput {
  readonly options: Options;
  readonly ready: { workers: number; maxQueue: number };
  readonly loadBefore: number;
  readonly loadAfter: number;
  /** CPU seconds used during the measured run by the server process (every thread) and by this one. */
  readonly cpu: { readonly server: number; readonly loadGenerator: number };
  readonly warm: Phase;
  readonly run: Phase;
  readonly rssStart: { rss: number } | null;
  readonly rssWarm: { rss: number } | null;
  readonly rssEnd: { rss: number } | null;
  readonly watched: Watched;
  readonly consistency: { checked: number; mismatches: string[] };
  readonly serverLog: string;
}

// the block: everything in one place, plain text, fixed-width columns
function report(r: ReportInput): { text: string; pass: boolean } {
  const { options, run } = r;
  const cpus = os.cpus();
  const lines: string[] = [];
  const pad = (s: string, n: number): string => s.padEnd(n);
  const num = (s: string, n: number): string => s.padStart(n);
  lines.push(`lapwright load run, ${new Date().toISOString().replace(/\.\d+Z$/, 'Z')}`);
  lines.push(`machine  ${cpus.length} CPUs (${cpus[0]?.model.trim() ?? 'unknown'}), ${fixed(os.totalmem() / 1024 ** 3)} GiB RAM, ${os.platform()} ${os.arch()}, Node ${process.version}; 1-min load average ${fixed(r.loadBefore, 2)} before the run, ${fixed(r.loadAfter, 2)} after`);
  const set = [options.workers !== undefined ? `LAPWRIGHT_WORKERS=${options.workers}` : '', options.maxQueue !== undefined ? `LAPWRIGHT_MAX_QUEUE=${options.maxQueue}` : ''].filter((x) => x !== '');
  lines.push(`server   node dist/src/server/main.js, ${set.length === 0 ? 'defaults (no LAPWRIGHT_* set)' : `defaults but ${set.join(' ')}`}: ${r.ready.workers} workers, queue ${r.ready.maxQueue}, deadline 10 s; LOG_LEVEL warn`);
  lines.push(`load     autocannon in one process beside the server, ${options.connections} keep-alive connections, ${options.durationS} s after a ${options.warmupS} s warm-up of the same mix; ${options.rate === 0 ? 'no rate cap (closed loop: each connection sends when answered)' : `offered ${options.rate} requests/s in all (each connection ${Math.floor(options.rate / options.connections)}${options.rate % options.connections === 0 ? '' : `-${Math.floor(options.rate / options.connections) + 1}`} per second, the connections' seconds staggered)`}`);
  lines.push(`mix      ${(Object.keys(KINDS) as Kind[]).map((k) => `${KINDS[k].label} ${Math.round(KINDS[k].share * 100)}%`).join(', ')}`);
  lines.push('');
  const header = `${pad('kind', 36)}${num('requests', 9)}${num('req/s', 8)}${num('p50 ms', 9)}${num('p99 ms', 9)}${num('max ms', 9)}  answers`;
  lines.push(header);
  const row = (label: string, s: KindStats): string => {
    const answers = [...s.statuses].sort(([a], [b]) => a - b).map(([status, n]) => `${status}×${n}`).join(' ');
    return `${pad(label, 36)}${num(String(s.count), 9)}${num(fixed(s.count / run.spanS), 8)}${num(fixed(quantile(s.latenciesMs, 0.5)), 9)}${num(fixed(quantile(s.latenciesMs, 0.99)), 9)}${num(fixed(s.count === 0 ? Number.NaN : Math.max(...s.latenciesMs)), 9)}  ${answers}`;
  };
  for (const k of Object.keys(KINDS) as Kind[]) lines.push(row(KINDS[k].label, run.stats[k]));
  const single = mergeStats([run.stats.post, run.stats.get]);
  const all = mergeStats(Object.values(run.stats));
  lines.push(row('single default tracks (POST + GET)', single));
  lines.push(row('all', all));
  lines.push('');
  const failures = all.failures();
  const warmAll = mergeStats(Object.values(r.warm.stats));
  const fiveXX = [...failures].filter(([s]) => s >= 500).reduce((n, [, c]) => n + c, 0);
  const warmFiveXX = [...warmAll.failures()].filter(([s]) => s >= 500).reduce((n, [, c]) => n + c, 0);
  const errors = run.errors + all.wrong;
  lines.push(`errors   ${run.errors} without an answer (connection errors and timeouts: ${run.timeouts}); ${all.wrong} wrong answers (2xx/304 whose content was wrong)`);
  lines.push(`status   answers other than 2xx/304: ${failures.size === 0 ? 'none' : [...failures].map(([s, n]) => `${s}×${n}`).join(' ')}; 5xx: ${fiveXX}`);
  lines.push(`warm-up  ${warmAll.count} answers, ${r.warm.errors} errors, ${warmAll.wrong} wrong, 5xx: ${warmFiveXX}`);
  lines.push(`cpu      during the run the server used ${fixed(r.cpu.server)} CPU-s (${fixed(r.cpu.server / run.spanS, 2)} cores, ${fixed((1000 * r.cpu.server) / Math.max(1, all.count))} ms per request), the load generator ${fixed(r.cpu.loadGenerator)} CPU-s (${fixed(r.cpu.loadGenerator / run.spanS, 2)} cores), of the machine's ${os.cpus().length}`);
  lines.push(`queue    at most ${r.watched.maxQueued} requests waiting and ${r.watched.maxBusy} workers busy (GET /readyz every ${QUEUE_POLL_MS} ms, ${r.watched.polls} polls)`);
  const mib = (m: { rss: number } | null): string => (m === null ? '-' : fixed(m.rss));
  const growth = r.rssWarm !== null && r.rssEnd !== null ? r.rssEnd.rss / r.rssWarm.rss - 1 : Number.NaN;
  lines.push(`memory   server VmRSS (MiB, /proc/<pid>/status): start ${mib(r.rssStart)}, after warm-up ${mib(r.rssWarm)}, peak ${fixed(r.watched.rssPeak)} (VmHWM ${fixed(r.watched.hwm)}), end ${mib(r.rssEnd)}: end vs after warm-up ${growth >= 0 ? '+' : ''}${fixed(100 * growth)}%`);
  const { checked, mismatches } = r.consistency;
  lines.push(`same ids ${checked} tracks served during the run (uniform sample of single tracks and batch entries) made again in-process with generateTrack: ${checked - mismatches.length} same id, ${mismatches.length} mismatches${mismatches.length > 0 ? `: ${mismatches.slice(0, 5).join('; ')}` : ''}`);
  const warnings = r.serverLog.split('\n').filter((l) => l.trim() !== '').length;
  lines.push(`log      ${warnings} server log lines at warn or above`);
  const singleP99 = quantile(single.latenciesMs, 0.99);
  const targets = [
    { name: 'zero errors', pass: errors === 0 && r.warm.errors === 0 && warmAll.wrong === 0 },
    { name: 'zero 5xx', pass: fiveXX === 0 && warmFiveXX === 0 },
    { name: `p99 of single default tracks ${fixed(singleP99)} ms < ${P99_TARGET_MS} ms`, pass: singleP99 < P99_TARGET_MS },
    { name: `end RSS within ${100 * RSS_GROWTH_TARGET}% of after warm-up`, pass: Number.isFinite(growth) && growth <= RSS_GROWTH_TARGET },
    { name: 'no id mismatch', pass: mismatches.length === 0 && checked > 0 },
  ];
  lines.push(`targets  ${targets.map((t) => `${t.name}: ${t.pass ? 'met' : 'MISSED'}`).join('; ')}`);
  return { text: lines.join('\n'), pass: targets.every((t) => t.pass) };
}

main().catch((err: Error) => {
  console.error(`npm run load failed: ${err.stack ?? err.message}`);
  process.exit(1);
});
