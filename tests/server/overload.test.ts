/**
 * Overload, in-process (app.inject, the real generation worker): a server of 1 worker and a queue
 * of 2 takes 3 requests at a time; 30 clients that each send their next request the moment the
 * last is answered (no back-off) put 10 times that on it. What it cannot take must be refused at
 * once with 503 ERR_OVERLOADED and Retry-After; what it took must complete (200, the id the core
 * makes for the same request, a valid track) within its deadline; a batch sent into the storm
 * waits for room instead of failing; and once the storm ends the server serves normally again
 * without any help. Nothing here reads a clock: "within its deadline" is the server's own
 * verdict (a request past its deadline would be answered 503 or 422, not 200).
 */
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack, type Manifest, type Track, validateTrack } from '../../src/core/index.js';
import { readyApp } from './helpers.js';

const WORKERS = 1;
const MAX_QUEUE = 2;
/** Clients, each with one request outstanding: 10 times what the server holds (workers + queue). */
const CLIENTS = 10 * (WORKERS + MAX_QUEUE);
/** Requests each client sends, one after the other. */
const ROUNDS = 4;
const RETRY_AFTER_S = 3;

let app: FastifyInstance;
beforeAll(async () => {
  app = await readyApp({ workers: WORKERS, maxQueue: MAX_QUEUE, deadlineMs: 30_000, retryAfterS: RETRY_AFTER_S });
});
afterAll(async () => {
  await app.close();
});

interface Answer {
  readonly seed: number;
  readonly status: number;
  readonly retryAfter: unknown;
  readonly body: string;
}

describe('overload: 10 times what the server holds', () => {
  it('refuses the excess at once with 503 + Retry-After, completes everything it took with valid ids, lets a batch wait, and recovers by itself', async () => {
    const answers: Answer[] = [];
    const client = async (c: number): Promise<void> => {
      for (let r = 0; r < ROUNDS; r++) {
        const seed = 1000 * c + r;
        const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed } });
        answers.push({ seed, status: res.statusCode, retryAfter: res.headers['retry-after'], body: res.body });
      }
    };
    const storm = Promise.all(Array.from({ length: CLIENTS }, (_, c) => client(c)));
    // a small batch sent into the storm: its slots wait for room in the queue rather than fail
    const batch = app.inject({ method: 'POST', url: '/v1/batches', payload: { count: 3, baseSeed: 'larkspur-storm', detail: 'summary' } });
    await storm;

    expect(answers).toHaveLength(CLIENTS * ROUNDS);
    const refused = answers.filter((a) => a.status === 503);
    const taken = answers.filter((a) => a.status === 200);
    // every answer is one or the other: nothing lost, no 500, no deadline overrun
    expect(refused.length + taken.length).toBe(answers.length);
    expect(taken.length).toBeGreaterThanOrEqual(WORKERS + MAX_QUEUE);
    expect(refused.length).toBeGreaterThan(0);
    for (const a of refused) {
      expect(a.retryAfter).toBe(String(RETRY_AFTER_S));
      expect(JSON.parse(a.body)).toEqual({
        statusCode: 503,
        code: 'ERR_OVERLOADED',
        error: 'Service Unavailable',
        message: `the server is busy: all ${WORKERS} workers are busy and ${MAX_QUEUE} tasks are waiting (the most allowed); retry after ${RETRY_AFTER_S} s`,
      });
    }
    for (const a of taken) {
      const track = JSON.parse(a.body) as Track;
      expect(track.seed).toBe(a.seed);
      expect(track.id).toBe(generateTrack({ seed: a.seed }).id);
      expect(validateTrack(track).valid).toBe(true);
    }

    const streamed = await batch;
    expect(streamed.statusCode).toBe(200);
    const manifest = JSON.parse(streamed.body.trimEnd().split('\n').at(-1)!) as Manifest;
    expect(manifest).toMatchObject({ format: 'lapwright.manifest/1' });
    expect(manifest.tracks.map((t) => t.index)).toEqual([0, 1, 2]);
    for (const t of manifest.tracks) expect(generateTrack(t.params).id).toBe(t.id);

    // the storm is over: nothing waits, nothing runs, and a normal request is served
    expect(app.lapwright.pool?.stats()).toMatchObject({ up: WORKERS, busy: 0, queued: 0 });
    const after = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 424242 } });
    expect(after.statusCode).toBe(200);
    expect((JSON.parse(after.body) as Track).id).toBe(generateTrack({ seed: 424242 }).id);
    const ready = await app.inject({ method: 'GET', url: '/readyz' });
    expect(ready.statusCode).toBe(200);
  });
});
