/**
 * `npm run bench:batch`: dataset throughput. Builds dist/ (npm run build), then
 *   - measures how many cores this process can get right now (two threads spinning for a second:
 *     on a machine shared with other work, the speed-up of 2 workers cannot exceed it);
 *   - runs the real `lapwright batch` (node bin/lapwright.js) for BENCH_COUNT tracks (default 1000,
 *     default parameters: 1.5 km laps) with 1 and with 2 worker threads, the same base seed each
 *     time, and reports tracks/s over the whole process (start-up included) and as the command
 *     reports it, and the speed-up of 2 workers over 1;
 *   - starts the real service (node dist/src/server/main.js, BENCH_WORKERS workers, default 2) and
 *     reads a streamed POST /v1/batches of the same tracks, detail full and summary, reporting
 *     tracks/s and MB/s to the last byte.
 * Each figure is the best of BENCH_REPEATS runs (default 2), after a small warm-up run. Run by
 * hand; never part of npm test. Compare figures only between runs on the same machine.
 */
import { spawn, spawnSync } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { startBuiltServer, waitReady } from '../helpers/built-server.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const COUNT = Number(process.env.BENCH_COUNT ?? 1000);
const REPEATS = Number(process.env.BENCH_REPEATS ?? 2);
const SERVER_WORKERS = Number(process.env.BENCH_WORKERS ?? 2);
const BASE_SEED = 'larkspur-bench';

interface Figure {
  readonly run: string;
  readonly tracks: number;
  readonly seconds: number;
  readonly tracksPerS: number;
  readonly note: string;
}

async function main(): Promise<void> {
  const build = spawnSync('npm', ['run', '--silent', 'build'], { cwd: ROOT, stdio: 'inherit' });
  if (build.status !== 0) throw new Error('build failed');
  const dir = await mkdtemp(join(tmpdir(), 'lapwright-bench-'));
  console.log(`lapwright batch benchmark: ${COUNT} tracks of the default request (1.5 km), best of ${REPEATS}; Node ${process.versions.node}, ${cpus().length} × ${cpus()[0]?.model ?? 'cpu'}, load ${loadavg()[0].toFixed(2)}`);
  console.log(`cores this process gets now (two spinning threads, 1 s): ${(await coresAvailable()).toFixed(2)}`);
  const figures: Figure[] = [];
  try {
    await cli(dir, 1, 5, 'warm-up');
    for (const workers of [1, 2]) {
      figures.push(await best(() => cli(dir, workers, COUNT, `lapwright batch --workers ${workers}`)));
      console.log(`${figures.at(-1)!.run}: ${figures.at(-1)!.tracksPerS.toFixed(1)} tracks/s`);
    }
    figures.push(...(await http()));
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
  console.table(figures.map((f) => ({ run: f.run, tracks: f.tracks, 's': f.seconds.toFixed(2), 'tracks/s': f.tracksPerS.toFixed(1), note: f.note })));
  const [one, two] = figures;
  console.log(`speed-up of 2 workers over 1 (lapwright batch, whole process): ${(two.tracksPerS / one.tracksPerS).toFixed(2)}`);
}

// one `lapwright batch` process, timed from spawn to exit
async function cli(dir: string, workers: number, count: number, name: string): Promise<Figure> {
  const out = join(dir, `w${workers}-${count}-${Math.random().toString(36).slice(2)}`);
  const start = performance.now();
  const { code, stderr } = await runProcess(['bin/lapwright.js', 'batch', '--count', String(count), '--workers', String(workers), '--base-seed', BASE_SEED, '--out', out]);
  const seconds = (performance.now() - start) / 1000;
  if (code !== 0) throw new Error(`lapwright batch exited ${code}: ${stderr}`);
  const reported = /\(([\d.]+) tracks\/s/.exec(stderr)?.[1] ?? '?';
  await rm(out, { recursive: true, force: true });
  return { run: name, tracks: count, seconds, tracksPerS: count / seconds, note: `the command reports ${reported} tracks/s (after its workers start)` };
}

// the streamed batch over loopback, full lines and summary lines
async function http(): Promise<Figure[]> {
  const { base, child: server } = await startBuiltServer({ ...process.env, LAPWRIGHT_WORKERS: String(SERVER_WORKERS) });
  try {
    await waitReady(base);
    await stream(base, 5, 'full');
    const out: Figure[] = [];
    for (const detail of ['full', 'summary'] as const) out.push(await best(() => stream(base, COUNT, detail)));
    return out;
  } finally {
    server.kill('SIGTERM');
  }
}

async function stream(base: string, count: number, detail: 'full' | 'summary'): Promise<Figure> {
  const start = performance.now();
  const res = await fetch(`${base}/v1/batches`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ count, baseSeed: BASE_SEED, detail }) });
  if (res.status !== 200) throw new Error(`POST /v1/batches answered ${res.status}: ${await res.text()}`);
  let bytes = 0;
  let lines = 0;
  for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
    bytes += chunk.byteLength;
    for (const b of chunk) if (b === 10) lines++;
  }
  const seconds = (performance.now() - start) / 1000;
  if (lines !== count + 1) throw new Error(`expected ${count + 1} lines, got ${lines}`);
  return { run: `POST /v1/batches detail ${detail}, ${SERVER_WORKERS} workers`, tracks: count, seconds, tracksPerS: count / seconds, note: `${(bytes / 1e6 / seconds).toFixed(1)} MB/s, ${(bytes / 1e6).toFixed(1)} MB in all` };
}

// CPU seconds two busy threads get in one second of wall time
async function coresAvailable(): Promise<number> {
  const code = 'const t = Date.now(); let x = 0; while (Date.now() - t < 1000) x += Math.sqrt(x + 1);';
  const before = process.cpuUsage();
  const start = performance.now();
  await Promise.all([0, 1].map(() => new Promise((resolve) => new Worker(code, { eval: true }).on('exit', resolve))));
  const used = process.cpuUsage(before);
  return (used.user + used.system) / 1000 / (performance.now() - start);
}

async function best(run: () => Promise<Figure>): Promise<Figure> {
  let top: Figure | null = null;
  for (let i = 0; i < REPEATS; i++) {
    const f = await run();
    if (top === null || f.tracksPerS > top.tracksPerS) top = f;
  }
  return top!;
}

function runProcess(args: string[]): Promise<{ code: number; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, args, { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code: code ?? 1, stderr }));
  });
}

await main();
