/**
 * The examples work against the real service on a loopback port: the TypeScript client, the
 * Python client, curl.sh, the request files, and the Kubernetes manifests agree with the
 * service's port, probes and names.
 */
import { spawn, spawnSync } from 'node:child_process';
import { readdir, readFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { parseAllDocuments } from 'yaml';
import { LapwrightClient, LapwrightError } from '../../examples/client.js';
import { generateTrack, isInfeasibleError } from '../../src/core/index.js';
import { trackRequestSchema } from '../../src/schema/params.js';
import { PRESETS } from '../../src/server/presets.js';
import { readyApp } from '../server/helpers.js';

const EXAMPLES = fileURLToPath(new URL('../../examples/', import.meta.url));
const hasPython = spawnSync('python3', ['--version']).status === 0;
const hasCurl = spawnSync('curl', ['--version']).status === 0;

let app: FastifyInstance;
let url: string;
beforeAll(async () => {
  app = await readyApp({ workers: 1 });
  url = await app.listen({ port: 0, host: '127.0.0.1' });
});
afterAll(async () => {
  await app.close();
});

function run(command: string, args: string[], env: Record<string, string> = {}): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(command, args, { env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

describe('examples/client.ts', () => {
  it('health, presets, a track by POST and by seed, validation, and a typed error', async () => {
    const client = new LapwrightClient(url);
    expect((await client.health()).status).toBe('ok');
    expect((await client.presets()).map((p) => p.name)).toEqual(PRESETS.map((p) => p.name));
    const params = { lengthM: 700, widthM: { min: 9, max: 12 } };
    const posted = await client.track({ ...params, seed: 'larkspur-7' });
    expect(posted.id).toBe(generateTrack({ ...params, seed: 'larkspur-7' }).id);
    const got = await client.trackBySeed('larkspur-7', params);
    expect(got.id).toBe(posted.id);
    expect(await client.validate(got)).toEqual({ valid: true, issues: [] });
    const err = await client.track({ turnBalance: 0, curvatureBudgetDeg: 900 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(LapwrightError);
    expect(err).toMatchObject({ status: 422, code: 'ERR_INFEASIBLE', reason: 'turning_vs_balance' });
    const bad = await client.track({ lengthM: 1 }).catch((e: unknown) => e);
    expect(bad).toMatchObject({ status: 400, code: 'ERR_INVALID_PARAMS', issues: [{ path: 'lengthM', message: 'expected a number from 300 to 20000 m, got 1' }] });
  });
});

describe('examples/client.ts against a server with an API token and a rate limit', () => {
  it('sends the token it is given, and without it gets the 401 as a LapwrightError', async () => {
    const token = 'larkspur-farm-token-0001';
    const guarded = await readyApp({ workers: 1, apiToken: token });
    try {
      const at = await guarded.listen({ port: 0, host: '127.0.0.1' });
      expect((await new LapwrightClient(at, { token }).presets()).length).toBe(PRESETS.length);
      const err = await new LapwrightClient(at, { token: 'not-the-farm-token-0001' }).presets().catch((e: unknown) => e);
      expect(err).toBeInstanceOf(LapwrightError);
      expect((err as LapwrightError).status).toBe(401);
      expect((err as LapwrightError).code).toBe('ERR_UNAUTHORIZED');
      if (hasPython) {
        // the Python client takes the token from LAPWRIGHT_API_TOKEN
        const withToken = await run('python3', [`${EXAMPLES}client.py`, '--url', at], { LAPWRIGHT_API_TOKEN: token });
        expect(withToken.stderr).toBe('');
        expect(withToken.code).toBe(0);
        const without = await run('python3', [`${EXAMPLES}client.py`, '--url', at], { LAPWRIGHT_API_TOKEN: '' });
        expect(without.code).toBe(1);
        expect(without.stderr).toMatch(/401 ERR_UNAUTHORIZED/);
      }
    } finally {
      await guarded.close();
    }
  }, 120_000);

  it('waits out a 429 for its Retry-After and then gets its answer', async () => {
    // 2 requests per 1 s window: the third is refused with Retry-After 1, retried, and answered
    const limited = await readyApp({ workers: 1, rateLimitMax: 2, rateLimitWindowMs: 1000 });
    try {
      const at = await limited.listen({ port: 0, host: '127.0.0.1' });
      const client = new LapwrightClient(at, { retries: 3 });
      // the statuses the client saw, read off its fetch calls
      const statuses: number[] = [];
      const realFetch = globalThis.fetch;
      const spy = vi.spyOn(globalThis, 'fetch').mockImplementation(async (...args) => {
        const res = await realFetch(...args);
        statuses.push(res.status);
        return res;
      });
      try {
        for (let i = 0; i < 3; i++) expect((await client.presets()).length).toBe(PRESETS.length);
      } finally {
        spy.mockRestore();
      }
      expect(statuses).toContain(429);
      expect(statuses.filter((s) => s === 200)).toHaveLength(3);
    } finally {
      await limited.close();
    }
  }, 30_000);
});

describe.skipIf(!hasPython)('examples/client.py', () => {
  it('runs its demo against the service: a track per preset, the same track by seed, a refused request', async () => {
    const r = await run('python3', [`${EXAMPLES}client.py`, '--url', url]);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toMatch(/^lapwright \S+ \(generator \S+\) at http:\/\/127\.0\.0\.1:\d+$/);
    expect(lines.slice(1, 1 + PRESETS.length).map((l) => l.split(/\s+/)[0])).toEqual(PRESETS.map((p) => p.name));
    expect(lines.slice(1 + PRESETS.length)).toEqual([
      'GET by seed gives the same track: True',
      'validate: True',
      expect.stringMatching(/^refused as expected: ERR_INFEASIBLE \(turning_vs_balance\): set curvatureBudgetDeg to 360/),
    ]);
  }, 120_000);
});

describe.skipIf(!hasCurl)('examples/curl.sh', () => {
  it('every request answers with the status it is there to show', async () => {
    const r = await run('bash', [`${EXAMPLES}curl.sh`], { LAPWRIGHT_URL: url });
    expect(r.code, r.stderr).toBe(0);
    const statuses = r.stdout.split('\n').filter((l) => /^\d{3} /.test(l));
    expect(statuses).toEqual([
      '200 liveness',
      '200 readiness (503 until the worker pool is up)',
      '200 the difficulty presets',
      '200 a track with the defaults',
      '304 the same request with If-None-Match (304, no body)',
      '200 GET by seed, cacheable forever',
      '200 validate a track',
      '400 400: every bad field with its path',
      '422 422: infeasible, with reason and hint',
      '406 406: the Accept header allows no format',
      '200 the held-out track as glb (3D scene)',
      '200 the same track as a drawing with the road coloured by curvature',
      '200 its gates as CSV',
      "200 the track format's JSON Schema",
      `200 the OpenAPI document (interactive documentation at ${url}/docs)`,
    ]);
  }, 120_000);
});

describe('examples/requests', () => {
  it('every request file is a valid request; all but the deliberately infeasible one generate', async () => {
    const dir = `${EXAMPLES}requests/`;
    const files = (await readdir(dir)).filter((f) => f.endsWith('.json')).sort();
    expect(files).toEqual(['heldout-eval.json', 'night-shift-stress.json', 'one-way-too-much-turning.json', 'warmup-loop.json']);
    for (const file of files) {
      const parsed = trackRequestSchema.safeParse(JSON.parse(await readFile(dir + file, 'utf8')));
      expect(parsed.success, file).toBe(true);
      const request = { ...parsed.data!, seed: parsed.data!.seed ?? 0 };
      if (file === 'one-way-too-much-turning.json') {
        expect(() => generateTrack(request)).toThrow();
        try {
          generateTrack(request);
        } catch (err) {
          expect(isInfeasibleError(err)).toBe(true);
        }
      } else {
        expect(generateTrack(request).format).toBe('lapwright.track/1');
      }
    }
  });
});

describe('examples/k8s', () => {
  it('Deployment, Service and HorizontalPodAutoscaler agree with each other and with the service', async () => {
    const load = async (name: string) => parseAllDocuments(await readFile(`${EXAMPLES}k8s/${name}`, 'utf8')).map((d) => d.toJS() as Record<string, any>);
    const [deployment] = await load('deployment.yaml');
    const [service] = await load('service.yaml');
    const [hpa] = await load('hpa.yaml');
    expect([deployment.kind, service.kind, hpa.kind]).toEqual(['Deployment', 'Service', 'HorizontalPodAutoscaler']);
    const container = deployment.spec.template.spec.containers[0];
    expect(container.ports).toEqual([{ name: 'http', containerPort: 8080 }]);
    expect(container.readinessProbe.httpGet).toEqual({ path: '/readyz', port: 'http' });
    expect(container.livenessProbe.httpGet).toEqual({ path: '/healthz', port: 'http' });
    const env = Object.fromEntries(container.env.map((e: { name: string; value: string }) => [e.name, e.value]));
    expect(env).toMatchObject({ HOST: '0.0.0.0', PORT: '8080', LAPWRIGHT_WORKERS: container.resources.limits.cpu });
    // the grace period covers the preStop pause and the server's own drain timeout
    expect(deployment.spec.template.spec.terminationGracePeriodSeconds).toBeGreaterThan(Number(env.LAPWRIGHT_SHUTDOWN_TIMEOUT_MS) / 1000 + 5);
    expect(deployment.spec.template.spec.securityContext.runAsNonRoot).toBe(true);
    expect(service.spec.selector).toEqual(deployment.spec.selector.matchLabels);
    expect(service.spec.ports[0].targetPort).toBe('http');
    expect(hpa.spec.scaleTargetRef).toEqual({ apiVersion: 'apps/v1', kind: 'Deployment', name: deployment.metadata.name });
  });
});
