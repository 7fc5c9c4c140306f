/**
 * The real entry (src/server/main.ts) in its own process, on a loopback port the OS picks:
 * HTTP over a socket, readiness, and the graceful SIGTERM (in-flight request finishes, new
 * connections are refused, exit 0).
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { request } from 'node:http';
import { fileURLToPath } from 'node:url';
import { afterEach, describe, expect, it } from 'vitest';
import { generateTrack } from '../../src/core/index.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const MAIN = 'src/server/main.ts';
const children: ChildProcess[] = [];

afterEach(() => {
  for (const child of children.splice(0)) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
});

interface Running {
  readonly child: ChildProcess;
  readonly url: string;
  readonly output: () => string;
  readonly exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

// starts the entry with PORT=0 and waits for the address it logs
async function startMain(env: Record<string, string>): Promise<Running> {
  const child = spawn(process.execPath, ['--import', 'tsx', MAIN], { cwd: ROOT, env: { ...process.env, PORT: '0', HOST: '127.0.0.1', ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  children.push(child);
  let out = '';
  child.stdout!.on('data', (d: Buffer) => (out += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (out += d.toString()));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.on('exit', (code, signal) => resolve({ code, signal })));
  const url = await new Promise<string>((resolve, reject) => {
    const check = (): void => {
      const m = /Server listening at (http:\/\/127\.0\.0\.1:\d+)/.exec(out);
      if (m) resolve(m[1]);
    };
    child.stdout!.on('data', check);
    void exited.then(() => reject(new Error(`server exited before listening:\n${out}`)));
  });
  return { child, url, output: () => out, exited };
}

// one request on a fresh connection (no keep-alive pool), so a refused connection shows
function httpRequest(url: string, method: string, body?: unknown): Promise<{ status: number; headers: Record<string, unknown>; text: string }> {
  return new Promise((resolve, reject) => {
    const payload = body === undefined ? undefined : JSON.stringify(body);
    const req = request(url, { method, agent: false, headers: payload === undefined ? {} : { 'content-type': 'application/json', 'content-length': Buffer.byteLength(payload) } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString('utf8') }));
      res.on('error', reject);
    });
    req.on('error', reject);
    req.end(payload);
  });
}

async function waitReady(url: string): Promise<void> {
  for (let i = 0; i < 300; i++) {
    const res = await httpRequest(`${url}/readyz`, 'GET');
    if (res.status === 200) return;
    expect(res.status).toBe(503);
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('the worker pool did not come up');
}

describe('src/server/main.ts, a real process on a loopback port', () => {
  it('answers over HTTP, then on SIGTERM finishes the request in flight, refuses new connections and exits 0', async () => {
    const server = await startMain({ LAPWRIGHT_WORKERS: '1' });
    await waitReady(server.url);

    const health = await httpRequest(`${server.url}/healthz`, 'GET');
    expect(health.status).toBe(200);
    expect(JSON.parse(health.text)).toMatchObject({ status: 'ok' });

    const expected = generateTrack({ seed: 7, lengthM: 800 });
    const track = await httpRequest(`${server.url}/v1/tracks`, 'POST', { seed: 7, lengthM: 800 });
    expect(track.status).toBe(200);
    expect(track.headers.etag).toBe(`"${expected.id}"`);
    expect(track.text).toBe(JSON.stringify(expected));

    // a long lap keeps the worker busy while the signal arrives
    const inFlight = httpRequest(`${server.url}/v1/tracks`, 'POST', { seed: 8, lengthM: 20000 });
    await expect.poll(() => server.output().includes('"url":"/v1/tracks"') && server.output().split('"url":"/v1/tracks"').length > 2, { timeout: 10_000 }).toBe(true);
    server.child.kill('SIGTERM');
    await expect.poll(() => server.output().includes('shutting down: finishing in-flight requests'), { timeout: 10_000 }).toBe(true);
    await expect(httpRequest(`${server.url}/healthz`, 'GET')).rejects.toMatchObject({ code: 'ECONNREFUSED' });

    const finished = await inFlight;
    expect(finished.status).toBe(200);
    expect(JSON.parse(finished.text)).toMatchObject({ seed: 8, params: { lengthM: 20000 } });
    expect(await server.exited).toEqual({ code: 0, signal: null });
    const log = server.output();
    expect(log).toContain('shut down cleanly');
    // the long request was still running when the signal came
    expect(log.indexOf('shutting down: finishing in-flight requests')).toBeLessThan(log.lastIndexOf('"res":{"statusCode":200}'));
  });

  it('exits 2 naming the bad variable', async () => {
    const child = spawn(process.execPath, ['--import', 'tsx', MAIN], { cwd: ROOT, env: { ...process.env, PORT: 'eighty', LAPWRIGHT_WORKERS: '1' }, stdio: ['ignore', 'pipe', 'pipe'] });
    children.push(child);
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    const code = await new Promise<number | null>((resolve) => child.on('exit', (c) => resolve(c)));
    expect(code).toBe(2);
    expect(err).toBe('lapwright: invalid configuration: PORT must be an integer from 0 to 65535, got "eighty"\n');
  });
});
