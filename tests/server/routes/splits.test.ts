import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { splitValue } from '../../../src/core/index.js';
import { json, readyApp } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await readyApp({ startPool: false });
});
afterAll(async () => {
  await app.close();
});

describe('GET /v1/splits/{seed}', () => {
  it('says which split a seed is in, cacheable forever; digits that fit are the integer seed', async () => {
    const res = await app.inject({ method: 'GET', url: '/v1/splits/14' });
    expect(res.statusCode).toBe(200);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(json(res)).toEqual({ seed: 14, split: 'validation', value: splitValue(14), shares: { train: 0.8, validation: 0.1, test: 0.1 } });
    const text = json(await app.inject({ method: 'GET', url: '/v1/splits/larkspur%20heldout' })) as { seed: unknown };
    expect(text.seed).toBe('larkspur heldout');
  });

  it('400 for a seed longer than 64 characters', async () => {
    const res = await app.inject({ method: 'GET', url: `/v1/splits/${'x'.repeat(65)}` });
    expect([res.statusCode, json(res)]).toEqual([
      400,
      { statusCode: 400, code: 'ERR_INVALID_PARAMS', error: 'Bad Request', message: 'invalid track parameters: 1 issue, listed with its path in issues', issues: [{ path: 'seed', message: 'expected an integer seed or a string of 1 to 64 characters, got 65 characters' }] },
    ]);
  });
});
