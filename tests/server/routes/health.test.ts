import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GENERATOR_VERSION } from '../../../src/core/index.js';
import { buildApp } from '../../../src/server/app.js';
import { healthSchema, readySchema } from '../../../src/server/schemas.js';
import { readPackageVersion } from '../../../src/version.js';
import { json, readyApp, TEST_WORKER_URL } from '../helpers.js';

describe('GET /healthz and GET /readyz', () => {
  let app: FastifyInstance;
  beforeAll(async () => {
    app = await readyApp({ workers: 1, maxQueue: 3 });
  });
  afterAll(async () => {
    await app.close();
  });

  it('healthz: status, package version and generator version', async () => {
    const res = await app.inject({ method: 'GET', url: '/healthz' });
    expect(res.statusCode).toBe(200);
    expect(json(res)).toEqual({ status: 'ok', version: await readPackageVersion(), generatorVersion: GENERATOR_VERSION });
    expect(healthSchema.strict().safeParse(json(res)).success).toBe(true);
  });

  it('readyz: 200 with the pool figures once every worker is up', async () => {
    const res = await app.inject({ method: 'GET', url: '/readyz' });
    expect(res.statusCode).toBe(200);
    expect(json(res)).toEqual({ status: 'ready', workers: 1, up: 1, busy: 0, queued: 0, maxQueue: 3 });
    expect(readySchema.strict().safeParse(json(res)).success).toBe(true);
  });

  it('every route answers 503 ERR_SHUTTING_DOWN with Retry-After once shutdown began', async () => {
    app.lapwright.shuttingDown = true;
    try {
      for (const url of ['/readyz', '/healthz']) {
        const res = await app.inject({ method: 'GET', url });
        expect(res.statusCode).toBe(503);
        expect(res.headers['retry-after']).toBe('1');
        expect(res.headers.connection).toBe('close');
        expect(json(res)).toEqual({ statusCode: 503, code: 'ERR_SHUTTING_DOWN', error: 'Service Unavailable', message: 'the server is shutting down; retry on another replica' });
      }
    } finally {
      app.lapwright.shuttingDown = false;
    }
  });
});

describe('GET /readyz before the pool is up', () => {
  it('503 ERR_NOT_READY while the workers load', async () => {
    const app = await buildApp({ workers: 1 });
    try {
      // the workers take far longer to load than this request takes to answer
      const res = await app.inject({ method: 'GET', url: '/readyz' });
      expect(res.statusCode).toBe(503);
      expect(res.headers['retry-after']).toBe('1');
      expect(json(res)).toEqual({ statusCode: 503, code: 'ERR_NOT_READY', error: 'Service Unavailable', message: 'the worker pool is starting (0 of 1 workers loaded)' });
      await app.lapwright.pool?.ready;
      expect((await app.inject({ method: 'GET', url: '/readyz' })).statusCode).toBe(200);
    } finally {
      await app.close();
    }
  });

  it('503 ERR_NOT_READY when the app runs without workers, and track requests say so too', async () => {
    const app = await buildApp({ startPool: false, retryAfterS: 5 });
    try {
      const body = { statusCode: 503, code: 'ERR_NOT_READY', error: 'Service Unavailable', message: 'this server was started without generation workers' };
      const ready = await app.inject({ method: 'GET', url: '/readyz' });
      expect([ready.statusCode, ready.headers['retry-after'], json(ready)]).toEqual([503, '5', body]);
      const track = await app.inject({ method: 'POST', url: '/v1/tracks', payload: {} });
      expect([track.statusCode, track.headers['retry-after'], json(track)]).toEqual([503, '5', body]);
    } finally {
      await app.close();
    }
  });

  it('503 ERR_UNAVAILABLE when no worker can load', async () => {
    const app = await buildApp({ workers: 1, workerUrl: TEST_WORKER_URL, workerData: { failToLoad: true } });
    try {
      await expect(app.lapwright.pool?.ready).rejects.toThrow();
      const ready = await app.inject({ method: 'GET', url: '/readyz' });
      expect([ready.statusCode, json(ready)]).toEqual([503, { statusCode: 503, code: 'ERR_UNAVAILABLE', error: 'Service Unavailable', message: 'no generation workers could be started; see the server log' }]);
      const track = await app.inject({ method: 'POST', url: '/v1/tracks', payload: {} });
      expect([track.statusCode, json(track)]).toEqual([503, { statusCode: 503, code: 'ERR_UNAVAILABLE', error: 'Service Unavailable', message: 'no generation workers are running on this server' }]);
    } finally {
      await app.close();
    }
  });
});
