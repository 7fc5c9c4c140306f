/**
 * Wide fuzz: bad input of every kind the HTTP surface takes, through the real app and the real
 * worker pool, one request at a time, and not one 5xx. Request bodies for every POST route
 * (JSON values, NaN and Infinity as strings and as bare words, huge and tiny numbers, nesting
 * from 63 to 100 000 levels placed where a schema lets extra fields through), query strings of
 * GET /v1/tracks/{seed}, headers (Content-Type and Accept variants, stray headers), unicode
 * seeds in the path and the body, and uploaded tracks for POST /v1/tracks/validate (wrong
 * shapes, non-finite numbers, arrays past the cap, a 10^6-point track). Every input tried is
 * counted and the count printed; fast-check runs on a fixed seed so a failure replays.
 */
import { fc, test } from '@fast-check/vitest';
import type { FastifyInstance, InjectOptions } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack } from '../../src/core/index.js';
import type { Track } from '../../src/core/index.js';
import { MAX_TRACK_ARRAY_ENTRIES } from '../../src/schema/track.js';
import { buildApp } from '../../src/server/app.js';
import { jsonDepthExceeds, MAX_JSON_DEPTH } from '../../src/server/json-depth.js';
import { errorSchema } from '../../src/server/schemas.js';
import { json, readyApp } from './helpers.js';

/** fast-check's seed for every property here (replay a failure by its printed path). */
const SEED = 20_260_107;

const tally = { inputs: 0, fiveHundreds: 0, statuses: new Map<number, number>() };

let app: FastifyInstance;
let track: Track;
let trackText: string;
beforeAll(async () => {
  // one worker, a short deadline: the rare heavy valid request ends as a 422, not a slow run
  app = await readyApp({ workers: 1, deadlineMs: 2000, batch: { maxCount: 2 } });
  track = generateTrack({ seed: 'fuzz-wide', lengthM: 400 });
  trackText = JSON.stringify(track);
}, 60_000);
afterAll(async () => {
  await app.close();
  const statuses = Object.fromEntries([...tally.statuses].sort(([a], [b]) => a - b));
  console.log(`fuzz-wide: ${tally.inputs} inputs tried, ${tally.fiveHundreds} answered 5xx; statuses ${JSON.stringify(statuses)}`);
});

// sends one input and checks the invariant of every answer: no 5xx, the error body's shape
async function send(options: InjectOptions, what: string) {
  const res = await app.inject(options);
  tally.inputs++;
  tally.statuses.set(res.statusCode, (tally.statuses.get(res.statusCode) ?? 0) + 1);
  if (res.statusCode >= 500) tally.fiveHundreds++;
  expect(res.statusCode, `${what} answered ${res.statusCode}: ${res.body.slice(0, 300)}`).toBeLessThan(500);
  if (res.statusCode >= 400 && options.method !== 'HEAD') {
    const body = JSON.parse(res.body) as { statusCode: number };
    expect(errorSchema.strict().safeParse(body).success, `${what}: error body of an undocumented shape: ${res.body.slice(0, 300)}`).toBe(true);
    expect(body.statusCode).toBe(res.statusCode);
  }
  return res;
}

// --- values -------------------------------------------------------------------------------

/** Numbers as JSON text that JSON.parse reads as Infinity, 0, -0, a subnormal or an unsafe integer. */
const EXTREME_NUMBER_TEXT = ['1e999', '-1e999', '1e308', '-1.7976931348623157e308', '5e-324', '1e-400', '-0', '0.0', '9007199254740993', '9'.repeat(400), `-${'9'.repeat(400)}`, '4294967296', '-1', '1.0000000000000002'];
/** Non-finite numbers as strings, and words a lenient parser might take for numbers. */
const NUMBER_WORDS = ['NaN', 'Infinity', '-Infinity', '+Infinity', 'nan', 'inf', '1e999', '0x10', '1_000', ' 12 ', '', '١٢', '１２'];

// a sentinel string that becomes a bare number token after JSON.stringify
const RAW = '\u0000raw:';
const raw = (text: string) => `${RAW}${text}`;
function render(value: unknown): string {
  return JSON.stringify(value).replace(/"\\u0000raw:([^"]*)"/g, '$1');
}

const extremeNumber = fc.constantFrom(...EXTREME_NUMBER_TEXT).map(raw);
const numberWord = fc.constantFrom(...NUMBER_WORDS);
const anyScalar = fc.oneof(extremeNumber, numberWord, fc.double(), fc.integer(), fc.boolean(), fc.constant(null), fc.string({ unit: 'binary', maxLength: 20 }));
const anyValue = fc.oneof({ weight: 3, arbitrary: anyScalar }, { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) }, { weight: 1, arbitrary: fc.array(anyScalar, { maxLength: 4 }) });

/** Nesting depths tried: around the cap, and far past it. */
const DEPTHS = [MAX_JSON_DEPTH - 1, MAX_JSON_DEPTH, MAX_JSON_DEPTH + 1, 1000, 10_000, 100_000] as const;

// JSON text nested `depth` levels: arrays, objects, or both in turn
function nested(depth: number, kind: 'array' | 'object' | 'mixed'): string {
  const open: string[] = [];
  const close: string[] = [];
  for (let i = 0; i < depth; i++) {
    const array = kind === 'array' || (kind === 'mixed' && i % 2 === 0);
    open.push(array ? '[' : '{"k":');
    close.push(array ? ']' : '}');
  }
  return `${open.join('')}0${close.reverse().join('')}`;
}
const deepText = fc.tuple(fc.constantFrom(...DEPTHS), fc.constantFrom('array', 'object', 'mixed') as fc.Arbitrary<'array' | 'object' | 'mixed'>).map(([d, k]) => ({ depth: d, text: nested(d, k) }));

// --- bodies per route ---------------------------------------------------------------------

const PARAM_KEYS = ['seed', 'lengthM', 'widthM', 'curvatureBudgetDeg', 'turnBalance', 'cornerCount', 'minCornerRadiusM', 'noise', 'gateSpacingM', 'spawnSlots', 'wall', 'vehicle', 'sensors', 'drivability', 'extra'];

// a track request with some fields set to bad values
const badTrackRequest = fc.dictionary(fc.constantFrom(...PARAM_KEYS), anyValue, { maxKeys: 4 }).map((r) => ({ lengthM: 400, ...r }));
const badBatch = fc.record({ count: fc.oneof(fc.integer({ min: 0, max: 2 }), anyScalar), params: fc.oneof(badTrackRequest.map((r: Record<string, unknown>) => Object.fromEntries(Object.entries(r).filter(([k]) => k !== 'seed'))), anyValue), split: fc.oneof(fc.constantFrom('train', 'test', 'validation'), anyScalar), baseSeed: anyValue, detail: fc.constantFrom('summary', 'full', 'none') }, { requiredKeys: ['count'] });
const badCurriculum = fc.dictionary(fc.constantFrom('stages', 'from', 'to', 'samples', 'extra'), anyValue, { maxKeys: 3 });
const badOutline = fc.oneof(fc.record({ points: fc.oneof(fc.array(fc.tuple(anyScalar, anyScalar), { maxLength: 5 }), anyValue) }), fc.record({ centerline: fc.record({ points: anyValue }) }), anyValue);
const badDistance = fc.record({ a: badOutline, b: badOutline, method: fc.oneof(fc.constantFrom('exact', 'binned', 'auto'), anyScalar), samples: fc.oneof(fc.constant(16), anyScalar) }, { requiredKeys: [] });

// a body for one route: bad fields, a random JSON value, or JSON-ish text
function bodyFor(fields: fc.Arbitrary<unknown>) {
  return fc.oneof(
    { weight: 4, arbitrary: fields.map(render) },
    { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 4 }).map((v) => JSON.stringify(v)) },
    { weight: 1, arbitrary: fc.constantFrom('NaN', 'Infinity', '{"lengthM": NaN}', '{"lengthM": Infinity}', '{"lengthM": 1e999}', '\ufeff{}', '{"a":1,}', '{"a":1}{"b":2}', '{"a":1} // note', "{'a':1}", '[', '"', '{"\\ud800":1}', '{"a":"\\x41"}', '1'.repeat(5000)) },
  );
}

const ROUTES = {
  '/v1/tracks': bodyFor(badTrackRequest),
  '/v1/tracks/validate': bodyFor(badTrackRequest),
  '/v1/batches': bodyFor(badBatch),
  '/v1/curricula': bodyFor(badCurriculum),
  '/v1/tracks/distance': bodyFor(badDistance),
} as const;
type Route = keyof typeof ROUTES;

// where a deep value goes in a body of each route: places whose schema lets extra fields through
// (an uploaded track, a reference manifest, a track given to /distance) are the dangerous ones
const DEEP_PLACES: Readonly<Record<Route, readonly ((deep: string) => string)[]>> = {
  '/v1/tracks': [(d) => d, (d) => `{"seed":${d}}`, (d) => `{"widthM":{"min":${d}}}`, (d) => `{"extra":${d}}`],
  '/v1/tracks/validate': [(d) => d, (d) => `${trackText.slice(0, -1)},"junk":${d}}`, (d) => trackText.replace('"metrics":{', `"metrics":{"junk":${d},`), (d) => trackText.replace('"centerline":{', `"centerline":{"junk":${d},`)],
  '/v1/batches': [(d) => d, (d) => `{"count":1,"params":{"lengthM":400},"reference":{"tracks":[{"shape":"x","junk":${d}}]}}`, (d) => `{"count":1,"params":${d}}`],
  '/v1/curricula': [(d) => d, (d) => `{"stages":2,"junk":${d}}`],
  '/v1/tracks/distance': [(d) => d, (d) => `{"a":{"centerline":{"points":[[0,0],[1,0],[0,1]],"junk":${d}}},"b":{"points":[[0,0],[1,0],[0,1]]}}`],
};

// --- headers ------------------------------------------------------------------------------

const CONTENT_TYPES = [
  'application/json',
  'application/json; charset=utf-8',
  'application/json;charset=UTF-8',
  'APPLICATION/JSON',
  'application/json ; charset=utf-8',
  'application/json; charset=utf-16le',
  'application/json; charset=latin1',
  'application/json; foo="bar;baz"',
  'application/jsonx',
  'application/vnd.lapwright+json',
  'application/merge-patch+json',
  'text/json',
  'application/json, text/plain',
  ';',
  '',
  'multipart/form-data; boundary=x',
  'application/x-www-form-urlencoded',
  'application/octet-stream',
  '*/*',
  'application/*',
  'text/plain',
];
const ACCEPTS = [
  'application/json',
  '*/*',
  'image/svg+xml',
  'model/gltf-binary',
  'text/csv',
  'text/csv;q=0.9, application/json;q=0.8',
  'application/json;q=0',
  'application/json;q=abc',
  'application/json;q=1e999',
  'application/json;q=-1',
  '*/*;q=0',
  'model/*',
  'text/html',
  ',,,',
  Array.from({ length: 300 }, (_, i) => `type${i}/sub;q=0.${i % 10}`).join(', '),
];
const printable = fc.string({ unit: fc.integer({ min: 0x20, max: 0x7e }).map((c) => String.fromCharCode(c)), maxLength: 60 });
const headerName = fc.oneof(fc.constantFrom('if-none-match', 'content-encoding', 'accept-charset', 'accept-encoding', 'range', 'origin', 'x-forwarded-for', 'authorization', 'expect', 'cookie', 'x-http-method-override'), fc.stringMatching(/^x-[a-z0-9-]{1,20}$/));
const strayHeaders = fc.dictionary(headerName, printable, { maxKeys: 3 });

// --- query strings ------------------------------------------------------------------------

const QUERY_KEYS = ['lengthM', 'widthM.min', 'widthM.max', 'widthM', 'curvatureBudgetDeg', 'turnBalance', 'cornerCount', 'noise', 'spawnSlots', 'wall.heightM', 'vehicle.mu', 'sensors.count', 'drivability', 'format', 'table', 'heat', 'widthPx', 'pretty', 'seed', '__proto__', '__proto__.polluted', 'constructor.prototype.polluted', 'a..b', '.', 'widthM.min.deeper'];
const queryKey = fc.oneof({ weight: 5, arbitrary: fc.constantFrom(...QUERY_KEYS) }, { weight: 1, arbitrary: printable }, { weight: 1, arbitrary: fc.string({ unit: 'binary', minLength: 1, maxLength: 10 }) }, { weight: 1, arbitrary: fc.integer({ min: 2, max: 2000 }).map((n) => Array.from({ length: n }, () => 'a').join('.')) });
const queryValue = fc.oneof(fc.constantFrom(...NUMBER_WORDS, ...EXTREME_NUMBER_TEXT, 'json', 'svg', 'glb', 'csv', 'png', 'true', 'avoid', 'refuse'), printable, fc.string({ unit: 'binary', maxLength: 12 }), fc.double().map(String));
const query = fc.array(fc.tuple(queryKey, queryValue), { maxLength: 6 }).map((pairs) => new URLSearchParams(pairs).toString());

// --- seeds --------------------------------------------------------------------------------

const unicodeSeed = fc.oneof(
  fc.string({ unit: 'binary', minLength: 1, maxLength: 70 }),
  fc.string({ unit: 'grapheme', minLength: 1, maxLength: 40 }),
  fc.constantFrom('\ud800', 'a\udfff', '\u202eevil', 'nul\u0000byte', 'é', 'e\u0301', '🏁'.repeat(32), '🏁'.repeat(33), 'ﷺ', '\ufeff', ' ', '\u2028'),
);
// percent-encoded bytes that are not UTF-8: an encoded surrogate, an overlong slash, a lone continuation byte
const BAD_PATH_BYTES = ['%ED%A0%80', '%C0%AF', '%FF', '%80', '%E0%A4%A', '%', '%00', '%2F', '..', '%2e%2e'];
function pathSeed(seed: string): string {
  try {
    return encodeURIComponent(seed);
  } catch {
    // a lone surrogate has no UTF-8: send its CESU-8 bytes instead
    return '%ED%A0%80';
  }
}

// --- tracks -------------------------------------------------------------------------------

const TRACK_PATHS = ['format', 'id', 'seed', 'generatorVersion', 'params', 'params.lengthM', 'attempts', 'centerline', 'centerline.spacingM', 'centerline.points', 'centerline.s', 'centerline.headingDeg', 'centerline.spline', 'centerline.spline.controlPoints', 'walls', 'walls.left', 'walls.heightM', 'gates', 'spawns', 'corners', 'metrics', 'metrics.lengthM', 'metrics.difficulty'];
const badPoint = fc.oneof(fc.tuple(anyScalar, anyScalar), fc.constant([0, 0, 0]), fc.constant([0]), fc.constant({ x: 0, y: 0 }), fc.constant('0,0'), fc.constant([raw('1e999'), 0]), fc.constant(['NaN', 'Infinity']));
const trackPart = fc.oneof(
  { weight: 3, arbitrary: anyValue },
  { weight: 2, arbitrary: fc.array(badPoint, { minLength: 1, maxLength: 6 }) },
  { weight: 1, arbitrary: fc.constantFrom('many', 'one-bad') },
);

// a copy of the real track with `path` replaced
function mangled(path: string, value: unknown): string {
  const copy = JSON.parse(trackText) as Record<string, unknown>;
  const keys = path.split('.');
  let target = copy;
  for (const k of keys.slice(0, -1)) target = target[k] as Record<string, unknown>;
  const last = keys[keys.length - 1];
  const current = target[last];
  if (value === 'many' && Array.isArray(current)) {
    // one entry past the cap: a small filler keeps the body under the upload cap
    target[last] = new Array(MAX_TRACK_ARRAY_ENTRIES + 1).fill(current[0]);
  } else if (value === 'one-bad' && Array.isArray(current) && current.length > 0) {
    target[last] = current.map((v, i) => (i === Math.floor(current.length / 2) ? raw('1e999') : v));
  } else {
    target[last] = value;
  }
  return render(copy);
}

// --- the runs -----------------------------------------------------------------------------

describe('wide fuzz: no input answers 5xx', () => {
  test.prop([fc.constantFrom(...(Object.keys(ROUTES) as Route[])).chain((route) => fc.tuple(fc.constant(route), ROUTES[route]))], { numRuns: 600, seed: SEED })('request bodies of every POST route', async ([route, payload]) => {
    await send({ method: 'POST', url: route, payload, headers: { 'content-type': 'application/json' } }, `POST ${route} ${payload.slice(0, 200)}`);
  });

  test.prop([fc.constantFrom(...(Object.keys(ROUTES) as Route[])), deepText, fc.nat()], { numRuns: 120, seed: SEED })('deep nesting, at the root and where schemas let extra fields through', async (route, { depth, text }, pick) => {
    const places = DEEP_PLACES[route];
    const payload = places[pick % places.length](text);
    const res = await send({ method: 'POST', url: route, payload, headers: { 'content-type': 'application/json' } }, `POST ${route} nested ${depth} deep`);
    // the body's own depth: the value's, plus the levels it sits in
    if (jsonDepthExceeds(payload, MAX_JSON_DEPTH)) {
      expect(json(res)).toEqual({
        statusCode: 400,
        code: 'ERR_INVALID_JSON',
        error: 'Bad Request',
        message: `request body nests arrays and objects more than ${MAX_JSON_DEPTH} levels deep; a whole track nests 5`,
        issues: [{ path: '(root)', message: `nests arrays and objects more than ${MAX_JSON_DEPTH} levels deep` }],
      });
    }
  });

  test.prop([fc.constantFrom(...CONTENT_TYPES), fc.option(fc.constantFrom(...ACCEPTS), { nil: undefined }), strayHeaders, fc.constantFrom('/v1/tracks', '/v1/tracks/validate', '/v1/batches'), fc.constantFrom('{"seed":1,"lengthM":400}', '{}', '{"lengthM":"NaN"}', '')], { numRuns: 240, seed: SEED })(
    'headers: Content-Type and Accept variants, stray headers',
    async (type, accept, stray, route, payload) => {
      const headers: Record<string, string> = { ...stray, 'content-type': type };
      if (accept !== undefined) headers.accept = accept;
      await send({ method: 'POST', url: `${route}?format=json`, payload, headers }, `POST ${route} (${JSON.stringify(headers).slice(0, 200)})`);
    },
  );

  test.prop([fc.oneof(fc.integer({ min: 0, max: 2 ** 32 + 2 }).map(String), unicodeSeed.map(pathSeed), fc.constantFrom(...BAD_PATH_BYTES)), query, fc.option(fc.constantFrom(...ACCEPTS), { nil: undefined })], { numRuns: 400, seed: SEED })(
    'query strings and path seeds of GET /v1/tracks/{seed}',
    async (seed, q, accept) => {
      // keep any lap that does generate short
      const url = `/v1/tracks/${seed}?lengthM=400${q === '' ? '' : `&${q}`}`;
      await send({ method: 'GET', url, headers: accept === undefined ? {} : { accept } }, `GET ${url.slice(0, 300)} (${accept})`);
    },
  );

  // a small one-way loop: feasible for every seed, and quick
  const LOOP = { lengthM: 600, curvatureBudgetDeg: 360, turnBalance: 0, cornerCount: 4 };
  test.prop([unicodeSeed], { numRuns: 30, seed: SEED })('unicode seeds: a track or a 400 naming the seed; the same seed twice, or in the path, the same id', async (seed) => {
    const payload = JSON.stringify({ seed, ...LOOP });
    const first = await send({ method: 'POST', url: '/v1/tracks', payload, headers: { 'content-type': 'application/json' } }, `POST /v1/tracks seed ${JSON.stringify(seed)}`);
    expect([200, 400]).toContain(first.statusCode);
    if (first.statusCode === 400) {
      expect((json(first) as { issues: { path: string }[] }).issues.map((i) => i.path)).toEqual(['seed']);
      return;
    }
    const id = (json(first) as Track).id;
    const again = await send({ method: 'POST', url: '/v1/tracks', payload, headers: { 'content-type': 'application/json' } }, 'the same seed again');
    expect((json(again) as Track).id).toBe(id);
    // the path form reads digits as a number seed; '.' and '..' are path steps, not seeds
    if (/^\d+$/.test(seed) || seed === '.' || seed === '..' || pathSeed(seed) === '%ED%A0%80') return;
    const query = new URLSearchParams(Object.entries(LOOP).map(([k, v]) => [k, String(v)])).toString();
    const byPath = await send({ method: 'GET', url: `/v1/tracks/${pathSeed(seed)}?${query}` }, `GET seed ${JSON.stringify(seed)}`);
    expect([byPath.statusCode, (json(byPath) as Track).id]).toEqual([200, id]);
  });

  test.prop([fc.constantFrom(...TRACK_PATHS), trackPart], { numRuns: 240, seed: SEED })('uploaded tracks: one part of a real track replaced by a wrong shape, a non-finite number or too many entries', async (path, value) => {
    const payload = mangled(path, value);
    const res = await send({ method: 'POST', url: '/v1/tracks/validate', payload, headers: { 'content-type': 'application/json' } }, `validate with ${path} = ${JSON.stringify(value).slice(0, 100)}`);
    expect([200, 400, 413, 422]).toContain(res.statusCode);
  });
});

describe('limits on uploads and nesting', () => {
  it('a 10^6-point track is refused: 413 at the default upload cap, 400 naming the array at a raised one', async () => {
    const points = Array.from({ length: 1_000_000 }, (_, i) => [i % 1000, Math.floor(i / 1000)]);
    const payload = JSON.stringify({ ...track, centerline: { ...track.centerline, points } });
    const capped = await send({ method: 'POST', url: '/v1/tracks/validate', payload, headers: { 'content-type': 'application/json' } }, '10^6 points');
    expect([capped.statusCode, (json(capped) as { code: string }).code]).toEqual([413, 'ERR_BODY_TOO_LARGE']);
    const roomy = await buildApp({ workers: 1, trackBodyLimitBytes: 64 * 1024 * 1024 });
    try {
      const res = await roomy.inject({ method: 'POST', url: '/v1/tracks/validate', payload, headers: { 'content-type': 'application/json' } });
      tally.inputs++;
      expect([res.statusCode, (json(res) as { issues: unknown[] }).issues]).toEqual([400, [{ path: 'centerline.points', message: `expected an array of at most ${MAX_TRACK_ARRAY_ENTRIES} points [x, y], got an array of 1000000 items` }]]);
    } finally {
      await roomy.close();
    }
  });

  it(`nesting: ${MAX_JSON_DEPTH} levels reach the schema, ${MAX_JSON_DEPTH + 1} are refused as JSON; the service answers afterwards`, async () => {
    const at = await send({ method: 'POST', url: '/v1/tracks', payload: `{"extra":${nested(MAX_JSON_DEPTH - 1, 'array')}}`, headers: { 'content-type': 'application/json' } }, 'at the cap');
    expect((json(at) as { code: string }).code).toBe('ERR_INVALID_PARAMS');
    const past = await send({ method: 'POST', url: '/v1/tracks', payload: `{"extra":${nested(MAX_JSON_DEPTH, 'array')}}`, headers: { 'content-type': 'application/json' } }, 'past the cap');
    expect((json(past) as { code: string }).code).toBe('ERR_INVALID_JSON');
    // a whole track nests 5 levels, as the message says
    expect([jsonDepthExceeds(trackText, 5), jsonDepthExceeds(trackText, 4)]).toEqual([false, true]);
    const ok = await send({ method: 'POST', url: '/v1/tracks/validate', payload: trackText, headers: { 'content-type': 'application/json' } }, 'a real track');
    expect([ok.statusCode, (json(ok) as { valid: boolean }).valid]).toEqual([200, true]);
  });

  it('jsonDepthExceeds counts brackets outside strings only', () => {
    expect(jsonDepthExceeds('[[1]]', 2)).toBe(false);
    expect(jsonDepthExceeds('[[1]]', 1)).toBe(true);
    expect(jsonDepthExceeds('{"a":[{}]}', 3)).toBe(false);
    expect(jsonDepthExceeds('["[[[[", "\\"[[[["]', 1)).toBe(false);
    expect(jsonDepthExceeds('["\\\\", [[1]]]', 2)).toBe(true);
    expect(jsonDepthExceeds('[1],[2],[3]', 1)).toBe(false);
    expect(jsonDepthExceeds('', 0)).toBe(false);
  });

  it('every input above was answered without a 5xx', () => {
    expect(tally.fiveHundreds).toBe(0);
    expect(tally.inputs).toBeGreaterThan(1500);
  });
});
