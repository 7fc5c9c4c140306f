/**
 * Fuzz: no request makes the service answer 500 or fall over. Random bodies (JSON and not),
 * content types, Accept headers, query strings, path seeds and mangled tracks go through the
 * real app and the real generator; every answer must be one of the documented statuses, and
 * every error body must have the documented shape. Runs are bounded (numRuns) and each request
 * is bounded by the service's own deadline.
 */
import { fc, test } from '@fast-check/vitest';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect } from 'vitest';
import { generateTrack, LIMITS } from '../../src/core/index.js';
import type { Track } from '../../src/core/index.js';
import { errorSchema } from '../../src/server/schemas.js';
import { readyApp } from './helpers.js';

const DOCUMENTED = new Set([200, 304, 400, 404, 406, 413, 415, 422, 503]);
const seen = new Map<number, number>();

let app: FastifyInstance;
let track: Track;
beforeAll(async () => {
  // a short deadline keeps the rare heavy valid request from slowing the run down
  app = await readyApp({ workers: 1, maxQueue: 4, deadlineMs: 2000 });
  track = generateTrack({ seed: 'fuzz', lengthM: 500 });
});
afterAll(async () => {
  await app.close();
  if (process.env.FUZZ_STATS) console.log('statuses seen', Object.fromEntries(seen));
});

// the invariant of every answer
function checkAnswer(res: { statusCode: number; body: string; headers: Record<string, unknown> }, what: string): void {
  seen.set(res.statusCode, (seen.get(res.statusCode) ?? 0) + 1);
  expect(DOCUMENTED.has(res.statusCode), `${what} answered ${res.statusCode}: ${res.body.slice(0, 300)}`).toBe(true);
  if (res.statusCode >= 400 && !what.startsWith('HEAD ')) {
    const body = JSON.parse(res.body) as { statusCode: number };
    expect(errorSchema.strict().safeParse(body).success, `${what}: error body of an undocumented shape: ${res.body.slice(0, 300)}`).toBe(true);
    expect(body.statusCode).toBe(res.statusCode);
    if (res.statusCode === 503) expect(res.headers['retry-after']).toBeDefined();
  }
}

const printable = fc.string({ unit: fc.integer({ min: 0x20, max: 0x7e }).map((c) => String.fromCharCode(c)), maxLength: 40 });

// a number inside the field's range most of the time, anything JSON otherwise
function field(min: number, max: number, integer = false): fc.Arbitrary<unknown> {
  const inRange = integer ? fc.integer({ min, max }) : fc.double({ min, max, noNaN: true });
  return fc.oneof({ weight: 4, arbitrary: inRange }, { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 2 }) });
}

function range(min: number, max: number): fc.Arbitrary<unknown> {
  return fc.oneof({ weight: 4, arbitrary: fc.record({ min: field(min, max), max: field(min, max) }, { requiredKeys: [] }) }, { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 2 }) });
}

// close to a valid request, kept to laps that generate in well under a second
const nearValid = fc.record(
  {
    seed: fc.oneof(fc.integer({ min: -5, max: 2 ** 32 + 5 }), fc.string({ maxLength: 70 }), fc.jsonValue({ maxDepth: 1 })),
    lengthM: field(LIMITS.lengthM.min, 3000),
    widthM: range(LIMITS.widthM.min, 20),
    curvatureBudgetDeg: field(LIMITS.curvatureBudgetDeg.min, 2000),
    turnBalance: field(0, 1),
    cornerCount: field(LIMITS.cornerCount.min, 25, true),
    minCornerRadiusM: field(LIMITS.minCornerRadiusM.min, 60),
    noise: field(0, 1),
    gateSpacingM: range(LIMITS.gateSpacingM.min, 60),
    spawnSlots: field(1, 8, true),
    wall: fc.oneof(fc.record({ heightM: field(0.1, 3), thicknessM: field(0.1, 2) }, { requiredKeys: [] }), fc.jsonValue({ maxDepth: 1 })),
    extra: fc.jsonValue({ maxDepth: 1 }),
  },
  { requiredKeys: [] },
);

// inside every range (the generator runs: 200 or 422, or a 400 for min > max)
const validRequest = fc.record(
  {
    seed: fc.oneof(fc.integer({ min: 0, max: 2 ** 32 - 1 }), fc.string({ minLength: 1, maxLength: 64 })),
    lengthM: fc.integer({ min: LIMITS.lengthM.min, max: 2500 }),
    widthM: fc.record({ min: fc.integer({ min: 3, max: 12 }), max: fc.integer({ min: 12, max: 20 }) }, { requiredKeys: [] }),
    curvatureBudgetDeg: fc.integer({ min: 360, max: 1800 }),
    turnBalance: fc.double({ min: 0, max: 1, noNaN: true }),
    cornerCount: fc.integer({ min: 3, max: 20 }),
    minCornerRadiusM: fc.integer({ min: 2, max: 60 }),
    noise: fc.double({ min: 0, max: 1, noNaN: true }),
    spawnSlots: fc.integer({ min: 1, max: 6 }),
  },
  { requiredKeys: [] },
);

const body = fc.oneof(
  { weight: 3, arbitrary: validRequest.map((b) => JSON.stringify(b)) },
  { weight: 3, arbitrary: nearValid.map((b) => JSON.stringify(b)) },
  { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 3 }).map((v) => JSON.stringify(v)) },
  { weight: 1, arbitrary: fc.string({ maxLength: 60 }) },
  { weight: 1, arbitrary: fc.constantFrom('', '{', '{"__proto__":{"a":1}}', '{"constructor":{"prototype":{"a":1}}}', 'null', '[]', '1e999', '"\\ud800"', '{"lengthM":1e400}') },
);

const contentType = fc.oneof(
  { weight: 6, arbitrary: fc.constant('application/json') },
  { weight: 1, arbitrary: fc.option(fc.constantFrom('application/json; charset=utf-8', 'text/plain', 'application/x-www-form-urlencoded', 'application/json; charset=latin1', 'multipart/form-data', 'garbage'), { nil: undefined }) },
);
const accept = fc.option(fc.oneof(fc.constantFrom('application/json', '*/*', 'image/svg+xml', 'text/csv;q=0.9, application/json;q=0.8', 'application/json;q=0', 'model/*'), printable), { nil: undefined });
const queryKey = fc.oneof(fc.constantFrom('format', 'lengthM', 'widthM.min', 'widthM', 'seed', 'wall.heightM', '__proto__', '__proto__.x', 'constructor.prototype', 'a..b', '.', 'noise'), printable);
const queryValue = fc.oneof(fc.constantFrom('json', 'svg', 'png', '8', '-1', '1e3', '0x10', '', 'NaN', 'Infinity'), printable, fc.double({ noNaN: true }).map(String));
const query = fc.array(fc.tuple(queryKey, queryValue), { maxLength: 6 }).map((pairs) => {
  const s = new URLSearchParams(pairs).toString();
  return s === '' ? '' : `?${s}`;
});
const pathSeed = fc.oneof(fc.integer({ min: 0, max: 2 ** 33 }).map(String), fc.string({ minLength: 1, maxLength: 80 }).map(encodeURIComponent), fc.constantFrom('%E0%A4%A', '%', '..', '%2F', 'a%00b'));

describe('fuzz: no input answers 500 or crashes the service', () => {
  test.prop([fc.constantFrom('/v1/tracks', '/v1/tracks/validate'), query, body, contentType, accept], { numRuns: 120 })('POST with random bodies, content types, Accept headers and query strings', async (path, q, payload, type, acc) => {
    const headers: Record<string, string> = {};
    if (type !== undefined) headers['content-type'] = type;
    if (acc !== undefined) headers.accept = acc;
    const res = await app.inject({ method: 'POST', url: `${path}${q}`, payload, headers });
    checkAnswer(res, `POST ${path}${q} ${JSON.stringify(payload).slice(0, 200)} (${type}, ${acc})`);
  });

  test.prop([validRequest], { numRuns: 30 })('POST /v1/tracks with requests inside every range: a track, or a reasoned 400/422', async (request) => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: request });
    checkAnswer(res, `POST /v1/tracks ${JSON.stringify(request)}`);
    expect([200, 400, 422]).toContain(res.statusCode);
    if (res.statusCode === 200) expect(res.headers.etag).toBe(`"${(JSON.parse(res.body) as Track).id}"`);
  });

  test.prop([pathSeed, query, accept], { numRuns: 80 })('GET /v1/tracks/{seed} with random seeds and query strings', async (seed, q, acc) => {
    const res = await app.inject({ method: 'GET', url: `/v1/tracks/${seed}${q}`, headers: acc === undefined ? {} : { accept: acc } });
    checkAnswer(res, `GET /v1/tracks/${seed}${q} (${acc})`);
  });

  // a real track with one part broken: the shape check or the checker must catch it, never a throw
  const mangle = fc.tuple(
    fc.constantFrom('centerline', 'walls', 'gates', 'spawns', 'corners', 'metrics', 'params', 'centerline.points', 'centerline.s', 'centerline.headingDeg', 'walls.left', 'walls.right', 'centerline.spline.controlPoints'),
    fc.oneof(fc.jsonValue({ maxDepth: 2 }), fc.constant([]), fc.constant([[0, 0]]), fc.constant([[0, 0], [0, 0], [0, 0]]), fc.integer({ min: 0, max: 5 })),
  );
  test.prop([mangle], { numRuns: 60 })('POST /v1/tracks/validate with one part of a real track replaced', async ([path, value]) => {
    const copy = JSON.parse(JSON.stringify(track)) as Record<string, unknown>;
    const keys = path.split('.');
    let target = copy;
    for (const k of keys.slice(0, -1)) target = target[k] as Record<string, unknown>;
    const last = keys[keys.length - 1];
    // a number means: keep that many entries of the array there
    const current = target[last];
    target[last] = typeof value === 'number' && Array.isArray(current) ? current.slice(0, value) : value;
    const res = await app.inject({ method: 'POST', url: '/v1/tracks/validate', payload: copy });
    checkAnswer(res, `validate with ${path} = ${JSON.stringify(value).slice(0, 100)}`);
    expect([200, 400, 503, 422]).toContain(res.statusCode);
  });

  test.prop([fc.constantFrom('GET', 'PUT', 'DELETE', 'PATCH', 'OPTIONS', 'HEAD'), fc.oneof(printable.map((s) => `/${encodeURIComponent(s)}`), fc.constantFrom('/', '/v1', '/v1/presets', '/healthz', '/readyz', '/openapi.json', '/docs', '/v1/tracks'))], { numRuns: 40 })(
    'other methods and paths',
    async (method, url) => {
      const res = await app.inject({ method: method as 'GET', url });
      checkAnswer(res, `${method} ${url}`);
    },
  );

  test.prop([fc.constant(0)], { numRuns: 1 })('the service still answers afterwards', async () => {
    expect((await app.inject({ method: 'GET', url: '/healthz' })).statusCode).toBe(200);
    await expect.poll(async () => (await app.inject({ method: 'GET', url: '/readyz' })).statusCode, { timeout: 30_000 }).toBe(200);
  });
});
