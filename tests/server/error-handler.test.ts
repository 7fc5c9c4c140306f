import { describe, expect, it } from 'vitest';
import { buildApp } from '../../src/server/app.js';
import { errorBody, HTTP_ERRORS } from '../../src/server/errors.js';
import { errorSchema } from '../../src/server/schemas.js';
import { json } from './helpers.js';

describe('error handler', () => {
  it('an unexpected error is a 500 "Internal Server Error" with no message or stack of its own', async () => {
    const app = await buildApp({ startPool: false });
    app.get('/boom', async () => {
      throw new Error('secret detail at /srv/lapwright/src/x.ts:12');
    });
    try {
      const res = await app.inject({ method: 'GET', url: '/boom' });
      expect([res.statusCode, json(res)]).toEqual([500, { statusCode: 500, code: 'ERR_INTERNAL', error: 'Internal Server Error', message: 'Internal Server Error' }]);
      expect(res.body).not.toMatch(/secret|\.ts:/);
    } finally {
      await app.close();
    }
  });

  it('404 ERR_NOT_FOUND for an unknown route or method', async () => {
    const app = await buildApp({ startPool: false });
    try {
      const res = await app.inject({ method: 'GET', url: '/v2/tracks?x=1' });
      expect([res.statusCode, json(res)]).toEqual([404, { statusCode: 404, code: 'ERR_NOT_FOUND', error: 'Not Found', message: 'no route GET /v2/tracks?x=1; GET /openapi.json lists the endpoints' }]);
      const del = await app.inject({ method: 'DELETE', url: '/v1/tracks' });
      expect([del.statusCode, json(del)]).toEqual([404, { statusCode: 404, code: 'ERR_NOT_FOUND', error: 'Not Found', message: 'no route DELETE /v1/tracks; GET /openapi.json lists the endpoints' }]);
      const long = await app.inject({ method: 'GET', url: `/${'x'.repeat(300)}` });
      expect((json(long) as { message: string }).message).toBe(`no route GET /${'x'.repeat(199)}...; GET /openapi.json lists the endpoints`);
    } finally {
      await app.close();
    }
  });

  it('400 ERR_BAD_REQUEST for a URL that does not decode', async () => {
    const app = await buildApp({ startPool: false });
    try {
      const res = await app.inject({ method: 'GET', url: '/v1/tracks/%E0%A4%A' });
      expect(res.statusCode).toBe(400);
      expect(json(res)).toEqual({ statusCode: 400, code: 'ERR_BAD_REQUEST', error: 'Bad Request', message: expect.stringContaining("'/v1/tracks/%E0%A4%A' is not a valid url component") });
    } finally {
      await app.close();
    }
  });

  it('every code has its status and the body shape the schema documents', () => {
    for (const code of Object.keys(HTTP_ERRORS) as (keyof typeof HTTP_ERRORS)[]) {
      const body = errorBody(code, 'm', code === 'ERR_INFEASIBLE' ? { reason: 'r', hint: 'h', issues: [], attempts: 2 } : {});
      expect(body.statusCode).toBe(HTTP_ERRORS[code].status);
      expect(errorSchema.strict().safeParse(body).success).toBe(true);
    }
    expect(Object.keys(errorBody('ERR_INFEASIBLE', 'm', { attempts: 1, issues: [], hint: 'h', reason: 'r' }))).toEqual(['statusCode', 'code', 'error', 'message', 'reason', 'hint', 'issues', 'attempts']);
  });
});
