import type { FastifyInstance } from 'fastify';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack, InfeasibleError, SEED_MAX } from '../../../src/core/index.js';
import type { Track, TrackRequest } from '../../../src/core/index.js';
import { CSV_HEADERS, exportTrack } from '../../../src/export/index.js';
import { CACHE_FOREVER } from '../../../src/server/routes/tracks.js';
import { errorSchema } from '../../../src/server/schemas.js';
import { json, readyApp, TEST_WORKER_URL } from '../helpers.js';

// the bytes the service must answer: the core's track, serialized as JSON
function expectedBody(request: TrackRequest): { text: string; id: string } {
  const track = generateTrack(request);
  return { text: JSON.stringify(track), id: track.id };
}

// the JSON the service answers for a request
async function textOf(request: TrackRequest): Promise<string> {
  return (await app.inject({ method: 'POST', url: '/v1/tracks', payload: request })).body;
}

function infeasible(request: TrackRequest): InfeasibleError {
  try {
    generateTrack(request);
  } catch (err) {
    if (err instanceof InfeasibleError) return err;
    throw err;
  }
  throw new Error(`expected ${JSON.stringify(request)} to be infeasible`);
}

let app: FastifyInstance;
beforeAll(async () => {
  app = await readyApp({ workers: 1 });
});
afterAll(async () => {
  await app.close();
});

describe('POST /v1/tracks', () => {
  it('answers the core track byte for byte, with its id as the ETag', async () => {
    const expected = expectedBody({ seed: 7, lengthM: 900 });
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 7, lengthM: 900 } });
    expect(res.statusCode).toBe(200);
    expect(res.headers['content-type']).toBe('application/json; charset=utf-8');
    expect(res.headers.etag).toBe(`"${expected.id}"`);
    expect(res.headers.vary).toBe('Accept');
    expect(res.headers['cache-control']).toBeUndefined();
    expect(res.headers['content-disposition']).toBe(`inline; filename="track-${expected.id.slice(0, 8)}.json"`);
    expect(res.body).toBe(expected.text);
  });

  it('draws a seed when it is left out and echoes it in the track', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { lengthM: 600 } });
    expect(res.statusCode).toBe(200);
    const track = json(res) as Track;
    expect(Number.isInteger(track.seed)).toBe(true);
    expect(track.seed as number).toBeGreaterThanOrEqual(0);
    expect(track.seed as number).toBeLessThanOrEqual(SEED_MAX);
    // the echoed seed reproduces the track
    expect(res.body).toBe(expectedBody({ seed: track.seed, lengthM: 600 }).text);
  });

  it('no body at all means every default', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks' });
    expect(res.statusCode).toBe(200);
    const track = json(res) as Track;
    expect(track.params).toMatchObject({ lengthM: 1500, curvatureBudgetDeg: 900 });
  });

  it('If-None-Match with the ETag answers 304 without a body (strong, weak, in a list, or *)', async () => {
    const { id } = expectedBody({ seed: 'etag-check', lengthM: 600 });
    for (const header of [`"${id}"`, `W/"${id}"`, `"other", "${id}"`, '*']) {
      const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'etag-check', lengthM: 600 }, headers: { 'if-none-match': header } });
      expect(res.statusCode).toBe(304);
      expect(res.body).toBe('');
      expect(res.headers.etag).toBe(`"${id}"`);
    }
    const other = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'etag-check', lengthM: 600 }, headers: { 'if-none-match': '"not-it"' } });
    expect(other.statusCode).toBe(200);
  });

  it('format=json and Accept headers that allow JSON answer JSON', async () => {
    for (const [url, accept] of [
      ['/v1/tracks?format=json', 'image/svg+xml'],
      ['/v1/tracks', 'application/json'],
      ['/v1/tracks', '*/*'],
      ['/v1/tracks', 'text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8'],
      ['/v1/tracks', 'text/csv;q=0.5, application/*'],
    ] as const) {
      const res = await app.inject({ method: 'POST', url, payload: { seed: 3, lengthM: 600 }, headers: { accept } });
      expect([url, accept, res.statusCode]).toEqual([url, accept, 200]);
    }
  });

  it('exports by format query: glb, svg and csv bytes equal the exporters\' output, with media type, ETag per format and a file name', async () => {
    const request = { seed: 7, lengthM: 900 };
    const track = generateTrack(request);
    const stem = `track-${track.id.slice(0, 8)}`;
    const cases = [
      ['glb', {}, 'model/gltf-binary', `"${track.id}.glb"`, `attachment; filename="${stem}.glb"`],
      ['svg', {}, 'image/svg+xml; charset=utf-8', `"${track.id}.svg"`, `inline; filename="${stem}.svg"`],
      ['csv', {}, 'text/csv; charset=utf-8', `"${track.id}.csv"`, `attachment; filename="${stem}-centerline.csv"`],
      ['json', { pretty: true }, 'application/json; charset=utf-8', `"${track.id}.pretty.json"`, `inline; filename="${stem}.json"`],
    ] as const;
    for (const [format, options, type, etag, disposition] of cases) {
      const query = new URLSearchParams({ format, ...Object.fromEntries(Object.entries(options).map(([k, v]) => [k, String(v)])) });
      const res = await app.inject({ method: 'POST', url: `/v1/tracks?${query}`, payload: request });
      expect([format, res.statusCode, res.headers['content-type'], res.headers.etag, res.headers['content-disposition'], res.headers.vary]).toEqual([format, 200, type, etag, disposition, 'Accept']);
      const expected = await exportTrack(track, format, options);
      expect(Buffer.compare(res.rawPayload, Buffer.from(expected))).toBe(0);
    }
  });

  it('glb starts with the glTF magic, svg is well-formed XML of the track, csv has its header row', async () => {
    const glb = await app.inject({ method: 'POST', url: '/v1/tracks?format=glb', payload: { seed: 'bytes', lengthM: 600 } });
    expect(glb.rawPayload.subarray(0, 4).toString('latin1')).toBe('glTF');
    expect(glb.rawPayload.readUInt32LE(4)).toBe(2);
    expect(glb.rawPayload.readUInt32LE(8)).toBe(glb.rawPayload.length);
    const svg = await app.inject({ method: 'POST', url: '/v1/tracks?format=svg&heat=true&widthPx=600', payload: { seed: 'bytes', lengthM: 600 } });
    expect(XMLValidator.validate(svg.body)).toBe(true);
    const root = new XMLParser({ ignoreAttributes: false }).parse(svg.body).svg;
    expect([root['@_width'], root['@_data-track-id']]).toEqual(['600', (JSON.parse(await textOf({ seed: 'bytes', lengthM: 600 })) as Track).id]);
    const csv = await app.inject({ method: 'POST', url: '/v1/tracks?format=csv&table=gates', payload: { seed: 'bytes', lengthM: 600 } });
    const lines = csv.body.trimEnd().split('\n');
    expect(lines[0]).toBe(CSV_HEADERS.gates.join(','));
    expect(lines.length - 1).toBe((JSON.parse(await textOf({ seed: 'bytes', lengthM: 600 })) as Track).gates.length);
  });

  it('exports by Accept header (most preferred format wins; JSON on a tie)', async () => {
    const cases = [
      ['model/gltf-binary', 'model/gltf-binary'],
      ['image/svg+xml', 'image/svg+xml; charset=utf-8'],
      ['text/*', 'text/csv; charset=utf-8'],
      ['model/gltf-binary, application/json;q=0.5', 'model/gltf-binary'],
      ['text/csv;q=0.5, application/*', 'application/json; charset=utf-8'],
      ['image/svg+xml, application/json', 'application/json; charset=utf-8'],
    ] as const;
    for (const [accept, type] of cases) {
      const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 3, lengthM: 600 }, headers: { accept } });
      expect([accept, res.statusCode, res.headers['content-type']]).toEqual([accept, 200, type]);
    }
    // the format query wins over Accept
    const svg = await app.inject({ method: 'POST', url: '/v1/tracks?format=svg', payload: { seed: 3, lengthM: 600 }, headers: { accept: 'application/json' } });
    expect(svg.headers['content-type']).toBe('image/svg+xml; charset=utf-8');
  });

  it('If-None-Match works per format: the glb tag matches the glb only', async () => {
    const { id } = expectedBody({ seed: 'etag-format', lengthM: 600 });
    const payload = { seed: 'etag-format', lengthM: 600 };
    const glb304 = await app.inject({ method: 'POST', url: '/v1/tracks?format=glb', payload, headers: { 'if-none-match': `"${id}.glb"` } });
    expect([glb304.statusCode, glb304.body, glb304.headers.etag]).toEqual([304, '', `"${id}.glb"`]);
    const jsonTagOnGlb = await app.inject({ method: 'POST', url: '/v1/tracks?format=glb', payload, headers: { 'if-none-match': `"${id}"` } });
    expect(jsonTagOnGlb.statusCode).toBe(200);
    const glbTagOnJson = await app.inject({ method: 'POST', url: '/v1/tracks', payload, headers: { 'if-none-match': `"${id}.glb"` } });
    expect(glbTagOnJson.statusCode).toBe(200);
    const heat = await app.inject({ method: 'POST', url: '/v1/tracks?format=svg&heat=true', payload, headers: { 'if-none-match': `"${id}.svg"` } });
    expect([heat.statusCode, heat.headers.etag]).toEqual([200, `"${id}.heat.svg"`]);
  });

  it('406 when the Accept header allows none of the formats', async () => {
    const message = (accept: string) =>
      `the Accept header ${JSON.stringify(accept)} allows none of application/json, image/svg+xml, model/gltf-binary, text/csv; send one of them, or name the format in the query (format=json|svg|glb|csv)`;
    for (const accept of ['text/html', 'application/json;q=0, image/*;q=0, model/*;q=0, text/*;q=0']) {
      const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 3 }, headers: { accept } });
      expect([res.statusCode, json(res)]).toEqual([406, { statusCode: 406, code: 'ERR_NOT_ACCEPTABLE', error: 'Not Acceptable', message: message(accept) }]);
    }
  });

  it('400 for an option of another format than the one answered, or a bad option value', async () => {
    const wrong = await app.inject({ method: 'POST', url: '/v1/tracks?format=svg&table=gates&pretty=true', payload: { seed: 3 } });
    expect([wrong.statusCode, json(wrong)]).toEqual([
      400,
      {
        statusCode: 400,
        code: 'ERR_INVALID_PARAMS',
        error: 'Bad Request',
        message: 'invalid track parameters: 2 issues, listed with their paths in issues',
        issues: [
          { path: 'table', message: 'table is an option of the csv export; this answer is svg (add format=csv)' },
          { path: 'pretty', message: 'pretty is an option of the json export; this answer is svg (add format=json)' },
        ],
      },
    ]);
    // an option with the format chosen by Accept counts too
    const byAccept = await app.inject({ method: 'POST', url: '/v1/tracks?heat=true', payload: { seed: 3 }, headers: { accept: 'text/csv' } });
    expect([byAccept.statusCode, (json(byAccept) as { issues: unknown }).issues]).toEqual([400, [{ path: 'heat', message: 'heat is an option of the svg export; this answer is csv (add format=svg)' }]]);
    const values = await app.inject({ method: 'POST', url: '/v1/tracks?format=svg&heat=yes&widthPx=100&table=all', payload: { seed: 3 } });
    expect([values.statusCode, json(values)]).toEqual([
      400,
      {
        statusCode: 400,
        code: 'ERR_INVALID_PARAMS',
        error: 'Bad Request',
        message: 'invalid track parameters: 3 issues, listed with their paths in issues',
        issues: [
          { path: 'table', message: 'expected one of centerline, gates, got "all"' },
          { path: 'heat', message: 'expected true or false, got "yes"' },
          { path: 'widthPx', message: 'expected an integer from 200 to 4000 px, got 100' },
        ],
      },
    ]);
  });

  it('400 ERR_INVALID_PARAMS names every offending field with its path', async () => {
    const res = await app.inject({
      method: 'POST',
      url: '/v1/tracks',
      payload: { seed: -1, lengthM: 'long', widthM: { min: 20, max: 10 }, wall: { colour: 'red' }, noise: 2, cornerCount: 4.5, laps: 3 },
    });
    expect(res.statusCode).toBe(400);
    expect(json(res)).toMatchInlineSnapshot(`
      {
        "code": "ERR_INVALID_PARAMS",
        "error": "Bad Request",
        "issues": [
          {
            "message": "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got -1",
            "path": "seed",
          },
          {
            "message": "expected a number from 300 to 20000 m, got "long"",
            "path": "lengthM",
          },
          {
            "message": "min 20 m is greater than max 10 m",
            "path": "widthM",
          },
          {
            "message": "expected an integer from 3 to 80, got 4.5",
            "path": "cornerCount",
          },
          {
            "message": "expected a number from 0 to 1, got 2",
            "path": "noise",
          },
          {
            "message": "unknown field "colour"; allowed fields: heightM, thicknessM",
            "path": "wall.colour",
          },
          {
            "message": "unknown field "laps"; allowed fields: seed, lengthM, widthM, curvatureBudgetDeg, turnBalance, cornerCount, minCornerRadiusM, noise, gateSpacingM, spawnSlots, wall, clearanceM, car, vehicle, drivability, sensors",
            "path": "laps",
          },
        ],
        "message": "invalid track parameters: 7 issues, listed with their paths in issues",
        "statusCode": 400,
      }
    `);
    expect(errorSchema.strict().safeParse(json(res)).success).toBe(true);
  });

  it('400 for a body that is not an object, a bad format value or an unknown query key', async () => {
    const array = await app.inject({ method: 'POST', url: '/v1/tracks', payload: [1, 2] });
    expect([array.statusCode, json(array)]).toEqual([
      400,
      { statusCode: 400, code: 'ERR_INVALID_PARAMS', error: 'Bad Request', message: 'invalid track parameters: 1 issue, listed with its path in issues', issues: [{ path: '(root)', message: 'expected an object of track parameters, got an array of 2 items' }] },
    ]);
    const format = await app.inject({ method: 'POST', url: '/v1/tracks?format=png', payload: {} });
    expect([format.statusCode, json(format)]).toEqual([
      400,
      { statusCode: 400, code: 'ERR_INVALID_PARAMS', error: 'Bad Request', message: 'invalid track parameters: 1 issue, listed with its path in issues', issues: [{ path: 'format', message: 'expected one of json, svg, glb, csv, got "png"' }] },
    ]);
    const query = await app.inject({ method: 'POST', url: '/v1/tracks?lengthM=900', payload: {} });
    expect([query.statusCode, json(query)]).toEqual([
      400,
      { statusCode: 400, code: 'ERR_INVALID_PARAMS', error: 'Bad Request', message: 'invalid track parameters: 1 issue, listed with its path in issues', issues: [{ path: 'lengthM', message: 'unknown field "lengthM"; allowed fields: format, table, heat, widthPx, pretty' }] },
    ]);
  });

  it('400 ERR_INVALID_JSON for a body that is not JSON, or empty with a JSON content type', async () => {
    const bad = await app.inject({ method: 'POST', url: '/v1/tracks', payload: '{"seed": 1,', headers: { 'content-type': 'application/json' } });
    expect([bad.statusCode, json(bad)]).toEqual([
      400,
      {
        statusCode: 400,
        code: 'ERR_INVALID_JSON',
        error: 'Bad Request',
        message: 'request body is not valid JSON: Expected double-quoted property name in JSON at position 11',
        issues: [{ path: '(root)', message: 'not valid JSON: Expected double-quoted property name in JSON at position 11' }],
      },
    ]);
    const poisoned = await app.inject({ method: 'POST', url: '/v1/tracks', payload: '{"__proto__": {"x": 1}}', headers: { 'content-type': 'application/json' } });
    expect([poisoned.statusCode, (json(poisoned) as { code: string }).code]).toEqual([400, 'ERR_INVALID_JSON']);
    const empty = await app.inject({ method: 'POST', url: '/v1/tracks', payload: '', headers: { 'content-type': 'application/json' } });
    expect([empty.statusCode, json(empty)]).toEqual([
      400,
      {
        statusCode: 400,
        code: 'ERR_INVALID_JSON',
        error: 'Bad Request',
        message: 'request body is empty but Content-Type is application/json: send a JSON object ({} for all defaults)',
        issues: [{ path: '(root)', message: 'expected a JSON object, got nothing' }],
      },
    ]);
  });

  it('415 for a body that is not application/json', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: 'seed=7', headers: { 'content-type': 'application/x-www-form-urlencoded' } });
    expect([res.statusCode, json(res)]).toEqual([
      415,
      { statusCode: 415, code: 'ERR_UNSUPPORTED_MEDIA_TYPE', error: 'Unsupported Media Type', message: 'request body of type "application/x-www-form-urlencoded" is not accepted: send JSON with Content-Type: application/json' },
    ]);
  });

  it('413 for a body over the 1 MiB cap', async () => {
    const payload = JSON.stringify({ seed: 'x', pad: 'y'.repeat(1024 * 1024) });
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload, headers: { 'content-type': 'application/json' } });
    expect([res.statusCode, json(res)]).toEqual([
      413,
      { statusCode: 413, code: 'ERR_BODY_TOO_LARGE', error: 'Payload Too Large', message: 'request body is larger than the 1048576-byte limit (1 MiB) of POST /v1/tracks' },
    ]);
  });

  it('422 ERR_INFEASIBLE carries the core\'s reason, hint, issues and attempts', async () => {
    const request = { seed: 1, turnBalance: 0, curvatureBudgetDeg: 900 };
    const err = infeasible(request);
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: request });
    expect(res.statusCode).toBe(422);
    expect(json(res)).toEqual({ statusCode: 422, code: 'ERR_INFEASIBLE', error: 'Unprocessable Entity', message: err.message, reason: 'turning_vs_balance', hint: err.hint, issues: [], attempts: 0 });
    expect(errorSchema.strict().safeParse(json(res)).success).toBe(true);
  });

  it('422 ERR_INFEASIBLE when the radius cannot hold the road', async () => {
    const request = { seed: 1, widthM: { min: 20, max: 30 }, minCornerRadiusM: 12 };
    const err = infeasible(request);
    const res = await app.inject({ method: 'POST', url: '/v1/tracks', payload: request });
    expect(json(res)).toEqual({ statusCode: 422, code: 'ERR_INFEASIBLE', error: 'Unprocessable Entity', message: err.message, reason: 'radius_vs_width', hint: err.hint, issues: [], attempts: 0 });
  });
});

describe('GET /v1/tracks/{seed}', () => {
  it('the same track as POST, from flattened query parameters, cacheable forever', async () => {
    const request = { seed: 42, lengthM: 800, widthM: { min: 8, max: 12 }, wall: { thicknessM: 0.4 } };
    const expected = expectedBody(request);
    const res = await app.inject({ method: 'GET', url: '/v1/tracks/42?lengthM=800&widthM.min=8&widthM.max=12&wall.thicknessM=0.4' });
    expect(res.statusCode).toBe(200);
    expect(res.headers['cache-control']).toBe(CACHE_FOREVER);
    expect(res.headers.etag).toBe(`"${expected.id}"`);
    expect(res.body).toBe(expected.text);
    const post = await app.inject({ method: 'POST', url: '/v1/tracks', payload: request });
    expect(post.body).toBe(res.body);
  });

  it('string seeds, URL-encoded', async () => {
    const res = await app.inject({ method: 'GET', url: `/v1/tracks/${encodeURIComponent('held out/007')}?lengthM=600` });
    expect(res.statusCode).toBe(200);
    expect(res.body).toBe(expectedBody({ seed: 'held out/007', lengthM: 600 }).text);
    // digits past SEED_MAX are a string seed
    const big = await app.inject({ method: 'GET', url: '/v1/tracks/4294967296?lengthM=600' });
    expect((json(big) as Track).seed).toBe('4294967296');
  });

  it('304 with If-None-Match keeps the caching headers', async () => {
    const { id } = expectedBody({ seed: 5, lengthM: 600 });
    const res = await app.inject({ method: 'GET', url: '/v1/tracks/5?lengthM=600', headers: { 'if-none-match': `"${id}"` } });
    expect(res.statusCode).toBe(304);
    expect(res.body).toBe('');
    expect(res.headers['cache-control']).toBe(CACHE_FOREVER);
    expect(res.headers.etag).toBe(`"${id}"`);
  });

  it('HEAD answers the headers without the body', async () => {
    const res = await app.inject({ method: 'HEAD', url: '/v1/tracks/5?lengthM=600' });
    expect(res.statusCode).toBe(200);
    expect(res.body).toBe('');
    expect(res.headers['cache-control']).toBe(CACHE_FOREVER);
  });

  it('400 lists every bad field of path and query at once, in the words of POST', async () => {
    const res = await app.inject({ method: 'GET', url: `/v1/tracks/${'s'.repeat(65)}?lengthM=long&widthM.min=2&widthM=9&seed=3&wall..x=1&noise=0.5&noise=0.6&format=png&laps=3` });
    expect(res.statusCode).toBe(400);
    expect(json(res)).toMatchInlineSnapshot(`
      {
        "code": "ERR_INVALID_PARAMS",
        "error": "Bad Request",
        "issues": [
          {
            "message": "expected one of json, svg, glb, csv, got "png"",
            "path": "format",
          },
          {
            "message": "query sets "widthM" both as a value and as an object ("widthM"); use the dotted keys only",
            "path": "widthM",
          },
          {
            "message": "the seed goes in the path (/v1/tracks/{seed}), not in the query string",
            "path": "seed",
          },
          {
            "message": "query key "wall..x" has an empty part; nested fields are written parent.child (widthM.min=8)",
            "path": "wall..x",
          },
          {
            "message": "expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got "ssssssssssssssssssssssssssssssssssssssss"... (65 characters)",
            "path": "seed",
          },
          {
            "message": "expected a number from 300 to 20000 m, got "long"",
            "path": "lengthM",
          },
          {
            "message": "expected a number from 3 to 40 m, got 2",
            "path": "widthM.min",
          },
          {
            "message": "expected a number from 0 to 1, got an array of 2 items",
            "path": "noise",
          },
          {
            "message": "unknown field "laps"; allowed fields: seed, lengthM, widthM, curvatureBudgetDeg, turnBalance, cornerCount, minCornerRadiusM, noise, gateSpacingM, spawnSlots, wall, clearanceM, car, vehicle, drivability, sensors",
            "path": "laps",
          },
        ],
        "message": "invalid track parameters: 9 issues, listed with their paths in issues",
        "statusCode": 400,
      }
    `);
  });

  it('exports by format query, cacheable forever, with the same bytes as POST', async () => {
    const request = { seed: 42, lengthM: 800 };
    const track = generateTrack(request);
    const res = await app.inject({ method: 'GET', url: '/v1/tracks/42?lengthM=800&format=csv&table=gates' });
    expect([res.statusCode, res.headers['content-type'], res.headers.etag, res.headers['cache-control'], res.headers['content-disposition']]).toEqual([
      200,
      'text/csv; charset=utf-8',
      `"${track.id}.gates.csv"`,
      CACHE_FOREVER,
      `attachment; filename="track-${track.id.slice(0, 8)}-gates.csv"`,
    ]);
    expect(res.body).toBe(await exportTrack(track, 'csv', { table: 'gates' }));
    const glb = await app.inject({ method: 'GET', url: '/v1/tracks/42?lengthM=800', headers: { accept: 'model/gltf-binary' } });
    const posted = await app.inject({ method: 'POST', url: '/v1/tracks?format=glb', payload: request });
    expect(glb.rawPayload.subarray(0, 4).toString('latin1')).toBe('glTF');
    expect(Buffer.compare(glb.rawPayload, posted.rawPayload)).toBe(0);
    const again = await app.inject({ method: 'GET', url: '/v1/tracks/42?lengthM=800&format=glb', headers: { 'if-none-match': `"${track.id}.glb"` } });
    expect([again.statusCode, again.headers['cache-control']]).toEqual([304, CACHE_FOREVER]);
  });

  it('400 for export options of another format; 422 for an infeasible request, whatever the format', async () => {
    const wrong = await app.inject({ method: 'GET', url: '/v1/tracks/1?widthPx=600' });
    expect([wrong.statusCode, json(wrong)]).toEqual([
      400,
      { statusCode: 400, code: 'ERR_INVALID_PARAMS', error: 'Bad Request', message: 'invalid track parameters: 1 issue, listed with its path in issues', issues: [{ path: 'widthPx', message: 'widthPx is an option of the svg export; this answer is json (add format=svg)' }] },
    ]);
    const err = infeasible({ seed: 1, turnBalance: 1, curvatureBudgetDeg: 900 });
    for (const format of ['json', 'glb', 'svg']) {
      const res = await app.inject({ method: 'GET', url: `/v1/tracks/1?turnBalance=1&curvatureBudgetDeg=900&format=${format}` });
      expect([res.statusCode, res.headers['content-type'], json(res)]).toEqual([
        422,
        'application/json; charset=utf-8',
        { statusCode: 422, code: 'ERR_INFEASIBLE', error: 'Unprocessable Entity', message: err.message, reason: 'turning_vs_balance', hint: err.hint, issues: [], attempts: 0 },
      ]);
      expect(res.headers['cache-control']).toBeUndefined();
    }
  });
});

describe('deadline, overload and worker failure (fixture worker)', () => {
  let slow: FastifyInstance;
  beforeAll(async () => {
    slow = await readyApp({ workers: 1, maxQueue: 1, deadlineMs: 400, retryAfterS: 2, workerUrl: TEST_WORKER_URL });
  });
  afterAll(async () => {
    await slow.close();
  });

  it('422 ERR_DEADLINE_EXCEEDED when the request alone overruns the deadline; the worker is replaced', async () => {
    const res = await slow.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'block:60000' } });
    expect([res.statusCode, json(res)]).toEqual([
      422,
      {
        statusCode: 422,
        code: 'ERR_DEADLINE_EXCEEDED',
        error: 'Unprocessable Entity',
        message: "generating this track takes longer than the server's 400 ms deadline",
        reason: 'deadline_exceeded',
        hint: 'ask for less work: a shorter lap (lengthM), fewer corners (cornerCount) or less turning (curvatureBudgetDeg); an operator can raise LAPWRIGHT_DEADLINE_MS',
        issues: [],
      },
    ]);
    await slow.lapwright.pool?.ready;
    await expect.poll(() => slow.lapwright.pool?.stats().up, { timeout: 30_000 }).toBe(1);
  });

  it('503 ERR_OVERLOADED with Retry-After when the queue is full', async () => {
    // the first request holds the only worker until its deadline, the second waits in the one queue place
    const running = slow.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'block:60000' } });
    await expect.poll(() => slow.lapwright.pool?.stats().busy).toBe(1);
    const waiting = slow.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'block:0' } });
    await expect.poll(() => slow.lapwright.pool?.stats().queued).toBe(1);
    const full = await slow.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'block:0' } });
    expect(full.statusCode).toBe(503);
    expect(full.headers['retry-after']).toBe('2');
    expect(json(full)).toEqual({
      statusCode: 503,
      code: 'ERR_OVERLOADED',
      error: 'Service Unavailable',
      message: 'the server is busy: all 1 workers are busy and 1 tasks are waiting (the most allowed); retry after 2 s',
    });
    expect((await running).statusCode).toBe(422);
    expect((await waiting).statusCode).toBe(503);
    await expect.poll(() => slow.lapwright.pool?.stats().up, { timeout: 30_000 }).toBe(1);
  });

  it('503 ERR_OVERLOADED when the deadline runs out while waiting for a worker', async () => {
    // the first request holds the only worker past both deadlines; its replacement loads too late for the second
    const running = slow.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'block:60000' } });
    await expect.poll(() => slow.lapwright.pool?.stats().busy).toBe(1);
    const waited = await slow.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'block:0' } });
    expect(waited.statusCode).toBe(503);
    expect(waited.headers['retry-after']).toBe('2');
    expect(json(waited)).toEqual({
      statusCode: 503,
      code: 'ERR_OVERLOADED',
      error: 'Service Unavailable',
      message: expect.stringMatching(/^the server is busy: this request waited \d+ ms for a worker and ran out of its 400 ms deadline; retry after 2 s$/),
    });
    expect((await running).statusCode).toBe(422);
    await expect.poll(() => slow.lapwright.pool?.stats().up, { timeout: 30_000 }).toBe(1);
  });

  it('503 ERR_WORKER_CRASHED with Retry-After, without the cause, when a worker dies under a request', async () => {
    const res = await slow.inject({ method: 'POST', url: '/v1/tracks', payload: { seed: 'crash' } });
    expect([res.statusCode, res.headers['retry-after'], json(res)]).toEqual([
      503,
      '2',
      { statusCode: 503, code: 'ERR_WORKER_CRASHED', error: 'Service Unavailable', message: 'the worker thread making this answer stopped unexpectedly and was replaced; retry after 2 s' },
    ]);
    expect(res.body).not.toContain('crashed on purpose');
  });
});
