/**
 * SIGTERM during a streamed batch, on the real entry (src/server/main.ts) in its own process on a
 * loopback port: the stream ends with one complete last line (the error, where to resume, the
 * manifest of what was sent), never a cut line; the process exits 0; and the same body with
 * resume.startIndex makes exactly the tracks an uninterrupted batch has after them.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { request } from 'node:http';
import { fileURLToPath } from 'node:url';
import type { FastifyInstance } from 'fastify';
import { afterAll, describe, expect, it } from 'vitest';
import type { Manifest, Track } from '../../src/core/index.js';
import { manifestSchema } from '../../src/server/batch-schemas.js';
import { readyApp } from './helpers.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
// short laps keep the batch quick; detail full makes every line tens of KB, so a cut would show
const BODY = { count: 400, baseSeed: 'larkspur-sigterm', params: { lengthM: { min: 600, max: 900 }, curvatureBudgetDeg: { min: 500, max: 700 }, cornerCount: { min: 5, max: 6 } } };
/** Lines received before the signal is sent. */
const LINES_BEFORE_SIGNAL = 3;

let child: ChildProcess | null = null;
let local: FastifyInstance | null = null;
afterAll(async () => {
  if (child !== null && child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  await local?.close();
});

describe('SIGTERM during POST /v1/batches (real process)', () => {
  it('the stream ends with a complete resume line, every line parses, exit 0; the resumed lines equal the uninterrupted run', async () => {
    const proc = spawn(process.execPath, ['--import', 'tsx', 'src/server/main.ts'], { cwd: ROOT, env: { ...process.env, PORT: '0', HOST: '127.0.0.1', LAPWRIGHT_WORKERS: '1' }, stdio: ['ignore', 'pipe', 'pipe'] });
    child = proc;
    let log = '';
    proc.stdout!.on('data', (d: Buffer) => (log += d.toString()));
    proc.stderr!.on('data', (d: Buffer) => (log += d.toString()));
    const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => proc.on('exit', (code, signal) => resolve({ code, signal })));
    await expect.poll(() => /Server listening at http:\/\/127\.0\.0\.1:\d+/.test(log), { timeout: 20_000 }).toBe(true);
    const url = /Server listening at (http:\/\/127\.0\.0\.1:\d+)/.exec(log)![1];
    await expect.poll(async () => (await fetch(`${url}/readyz`)).status, { timeout: 20_000 }).toBe(200);

    // read the stream; after a few lines, send SIGTERM to the server and read on to the end
    const text = await new Promise<string>((resolve, reject) => {
      const payload = JSON.stringify(BODY);
      const req = request(`${url}/v1/batches`, { method: 'POST', agent: false, headers: { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload) } }, (res) => {
        expect(res.statusCode).toBe(200);
        let body = '';
        let signalled = false;
        res.setEncoding('utf8');
        res.on('data', (chunk: string) => {
          body += chunk;
          if (!signalled && body.split('\n').length > LINES_BEFORE_SIGNAL) {
            signalled = true;
            proc.kill('SIGTERM');
          }
        });
        res.on('end', () => resolve(body));
        res.on('error', reject);
      });
      req.on('error', reject);
      req.end(payload);
    });
    expect(await exited).toEqual({ code: 0, signal: null });

    expect(text.endsWith('\n')).toBe(true);
    const rawLines = text.slice(0, -1).split('\n');
    const lines = rawLines.map((l) => JSON.parse(l) as unknown);
    const tracks = lines.slice(0, -1) as Track[];
    const last = lines.at(-1) as { error: { statusCode: number; code: string }; resume: { baseSeed: unknown; startIndex: number; lastIndex: number; lastSeed: unknown }; manifest: Manifest };
    expect(tracks.length).toBeGreaterThanOrEqual(LINES_BEFORE_SIGNAL);
    expect(tracks.length).toBeLessThan(BODY.count);
    for (const track of tracks) expect(track).toMatchObject({ format: 'lapwright.track/1', id: expect.stringMatching(/^[0-9a-f]{64}$/) });
    expect(last.error).toMatchObject({ statusCode: 503, code: 'ERR_SHUTTING_DOWN' });
    expect(last.resume).toEqual({ baseSeed: BODY.baseSeed, startIndex: tracks.length, lastIndex: tracks.length - 1, lastSeed: tracks.at(-1)!.seed });
    expect(manifestSchema.safeParse(last.manifest).success).toBe(true);
    expect(last.manifest.tracks.map((t) => [t.index, t.seed, t.id])).toEqual(tracks.map((t, i) => [i, t.seed, t.id]));

    // the uninterrupted batch (two tracks longer than what was sent) and the resumed one, in-process
    local = await readyApp({ workers: 1 });
    const k = last.resume.startIndex;
    const whole = await local.inject({ method: 'POST', url: '/v1/batches', payload: { ...BODY, count: k + 2 } });
    const resumed = await local.inject({ method: 'POST', url: '/v1/batches', payload: { ...BODY, count: k + 2, baseSeed: last.resume.baseSeed, startIndex: k } });
    const wholeLines = whole.body.split('\n');
    const resumedLines = resumed.body.split('\n');
    expect(wholeLines.slice(0, k)).toEqual(rawLines.slice(0, k));
    expect(resumedLines.slice(0, 2)).toEqual(wholeLines.slice(k, k + 2));
    const wholeManifest = JSON.parse(wholeLines[k + 2]) as Manifest;
    expect([...last.manifest.tracks, ...(JSON.parse(resumedLines[2]) as Manifest).tracks]).toEqual(wholeManifest.tracks);
  });
});
