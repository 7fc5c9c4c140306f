/**
 * Faults of the generation workers, through the HTTP routes (app.inject, the fixture worker of
 * tests/server/fixtures/test-worker.ts): a worker that dies (an uncaught error, or process.exit)
 * or hangs is replaced, the request it held is answered with an error (never lost), and the next
 * request is served by the replacement. A batch whose worker dies mid-stream ends with one
 * complete line that says where to resume.
 */
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack, type Manifest, type ManifestTrack } from '../../src/core/index.js';
import { manifestSchema } from '../../src/server/batch-schemas.js';
import { json, readyApp, TEST_WORKER_URL } from './helpers.js';

// short laps keep the batches quick
const SHORT = { lengthM: { min: 600, max: 900 }, curvatureBudgetDeg: { min: 500, max: 700 }, cornerCount: { min: 5, max: 6 } };

let app: FastifyInstance;
beforeAll(async () => {
  // the deadline leaves a replacement worker ample time to load (tsx) on a busy machine
  app = await readyApp({ workers: 1, maxQueue: 4, deadlineMs: 20_000, retryAfterS: 2, workerUrl: TEST_WORKER_URL });
});
afterAll(async () => {
  await app.close();
});

const CRASHED = {
  statusCode: 503,
  code: 'ERR_WORKER_CRASHED',
  error: 'Service Unavailable',
  message: 'the worker thread making this answer stopped unexpectedly and was replaced; retry after 2 s',
};

// the replacement is up, and serves a real track equal to the core's
async function expectServedAfterwards(on: FastifyInstance = app): Promise<void> {
  await expect.poll(() => on.lapwright.pool?.stats().up, { timeout: 20_000 }).toBe(1);
  const res = await on.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 11, lengthM: 700 } });
  expect(res.statusCode).toBe(200);
  expect((json(res) as { id: string }).id).toBe(generateTrack({ seed: 11, lengthM: 700 }).id);
}

describe('a worker that dies or hangs under a request', () => {
  it('an uncaught error in the worker: 503 ERR_WORKER_CRASHED with Retry-After, then the replacement serves', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'crash' } });
    expect([res.statusCode, res.headers['retry-after'], json(res)]).toEqual([503, '2', CRASHED]);
    await expectServedAfterwards();
  });

  it('process.exit in the worker (ends the thread, not the server): the same answer, then the replacement serves', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/tracks/exit' });
    expect([res.statusCode, res.headers['retry-after'], json(res)]).toEqual([503, '2', CRASHED]);
    await expectServedAfterwards();
  });

  it('a request waiting behind the one that crashes is served by the replacement, not lost', async () => {
    const crashing = app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'crash' } });
    const waiting = app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 12, lengthM: 700 } });
    expect((await crashing).statusCode).toBe(503);
    const served = await waiting;
    expect(served.statusCode).toBe(200);
    expect((json(served) as { id: string }).id).toBe(generateTrack({ seed: 12, lengthM: 700 }).id);
  });

  it('a hang: answered 422 ERR_DEADLINE_EXCEEDED at the deadline, the worker is terminated and replaced, the next request is served', async () => {
    const short = await readyApp({ workers: 1, maxQueue: 4, deadlineMs: 1000, workerUrl: TEST_WORKER_URL });
    try {
      const res = await short.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'block:600000' } });
      expect([res.statusCode, (json(res) as { code: string }).code]).toEqual([422, 'ERR_DEADLINE_EXCEEDED']);
      await expectServedAfterwards(short);
    } finally {
      await short.close();
    }
  });

  it('a batch whose worker dies mid-stream: every line parses, the last says ERR_WORKER_CRASHED, where to resume and what was sent', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/batches', payload: { count: 4, baseSeed: 'crash-at:2', params: SHORT, detail: 'summary' } });
    expect(res.statusCode).toBe(200);
    expect(res.body.endsWith('\n')).toBe(true);
    const lines = res.body.trimEnd().split('\n').map((l) => JSON.parse(l) as unknown);
    const sent = lines.slice(0, -1) as ManifestTrack[];
    const last = lines.at(-1) as { error: unknown; resume: unknown; manifest: Manifest };
    expect(sent.map((t) => t.index)).toEqual([0, 1]);
    expect(last.error).toEqual(CRASHED);
    expect(last.resume).toEqual({ baseSeed: 'crash-at:2', startIndex: 2, lastIndex: 1, lastSeed: sent[1].seed });
    expect(manifestSchema.safeParse(last.manifest).success).toBe(true);
    expect(last.manifest.tracks).toEqual(sent);
    await expectServedAfterwards();
  });
});
