import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack, validateTrack } from '../../../src/core/index.js';
import type { Track } from '../../../src/core/index.js';
import { validationResultSchema } from '../../../src/server/schemas.js';
import { json, readyApp } from '../helpers.js';

let app: FastifyInstance;
let track: Track;
beforeAll(async () => {
  app = await readyApp({ workers: 1, trackBodyLimitBytes: 512 * 1024 });
  track = generateTrack({ seed: 'validate-me', lengthM: 800 });
});
afterAll(async () => {
  await app.close();
});

describe('POST /v1/tracks/validate', () => {
  it('a generated track is valid', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload: track });
    expect([res.statusCode, json(res)]).toEqual([200, { valid: true, issues: [] }]);
    expect(validationResultSchema.strict().safeParse(json(res)).success).toBe(true);
  });

  it('a well-formed track that breaks a guarantee: 200, valid false, the checker\'s issues', async () => {
    // a designer tightened the radius rule without changing the layout
    const edited: Track = { ...track, params: { ...track.params, minCornerRadiusM: 200 } };
    const expected = validateTrack(edited);
    expect(expected.valid).toBe(false);
    const res = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload: edited });
    expect(res.statusCode).toBe(200);
    expect(json(res)).toEqual({ valid: false, issues: JSON.parse(JSON.stringify(expected.issues)) });
    expect((json(res) as { issues: { code: string }[] }).issues.map((i) => i.code)).toContain('min_radius');
  });

  it('400 ERR_INVALID_TRACK names every malformed field with its path', async () => {
    const broken = {
      ...track,
      format: 'lapwright.track/0',
      seed: null,
      walls: { ...track.walls, left: [[0, 0], [1, 'x']] },
      gates: [{ index: 0, s: 0, left: [0, 0], right: [1] }],
      metrics: undefined,
    };
    const res = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload: broken });
    expect(res.statusCode).toBe(400);
    expect(json(res)).toMatchInlineSnapshot(`
      {
        "code": "ERR_INVALID_TRACK",
        "error": "Bad Request",
        "issues": [
          {
            "message": "expected "lapwright.track/1", got "lapwright.track/0"",
            "path": "format",
          },
          {
            "message": "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got null",
            "path": "seed",
          },
          {
            "message": "expected a finite number, got "x"",
            "path": "walls.left.1.1",
          },
          {
            "message": "expected a point [x, y] of two finite numbers, got an array of 1 item",
            "path": "gates.0.right",
          },
          {
            "message": "expected a point [x, y] of two finite numbers, got nothing",
            "path": "gates.0.forward",
          },
          {
            "message": "expected an object (the metrics), got nothing",
            "path": "metrics",
          },
        ],
        "message": "malformed track: 6 issues, listed with their paths in issues",
        "statusCode": 400,
      }
    `);
  });

  it('400 for a body that is not a track at all, or not JSON', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload: { seed: 7 } });
    expect(res.statusCode).toBe(400);
    expect((json(res) as { code: string; issues: unknown[] }).code).toBe('ERR_INVALID_TRACK');
    const bad = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload: 'not json', headers: { 'content-type': 'application/json' } });
    expect([bad.statusCode, (json(bad) as { code: string }).code]).toEqual([400, 'ERR_INVALID_JSON']);
  });

  it('413 above the track upload cap (its own knob, larger than the parameter cap)', async () => {
    const payload = JSON.stringify({ ...track, pad: 'x'.repeat(512 * 1024) });
    const res = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload, headers: { 'content-type': 'application/json' } });
    expect([res.statusCode, json(res)]).toEqual([
      413,
      { statusCode: 413, code: 'ERR_BODY_TOO_LARGE', error: 'Payload Too Large', message: 'request body is larger than the 524288-byte limit (512 KiB) of POST /v1/tracks/validate' },
    ]);
  });

  it('415 for a body that is not JSON', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload: 'x', headers: { 'content-type': 'text/plain' } });
    expect([res.statusCode, json(res)]).toEqual([
      415,
      { statusCode: 415, code: 'ERR_UNSUPPORTED_MEDIA_TYPE', error: 'Unsupported Media Type', message: 'request body of type "text/plain" is not accepted: send JSON with Content-Type: application/json' },
    ]);
  });
});
