import { request as httpRequest } from 'node:http';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { decodeShape, generateTrack, type Manifest, type ManifestTrack, shapeDistance, splitOf, type Track } from '../../../src/core/index.js';
import { manifestSchema } from '../../../src/server/batch-schemas.js';
import { batchGauge } from '../../../src/server/routes/batches.js';
import { json, readyApp } from '../helpers.js';

// short laps keep the batches quick
const SHORT = { lengthM: { min: 600, max: 900 }, curvatureBudgetDeg: { min: 500, max: 700 }, cornerCount: { min: 5, max: 6 } };

let app: FastifyInstance;
beforeAll(async () => {
  app = await readyApp({ workers: 1, batch: { maxCount: 400 } });
});
afterAll(async () => {
  await app.close();
});

async function batch(body: unknown): Promise<{ status: number; lines: unknown[]; type: string | undefined; raw: string }> {
  const res = await app.inject({ method: 'POST', url: '/v1/batches', payload: body as object });
  const lines = res.statusCode === 200 ? res.body.trimEnd().split('\n').map((l) => JSON.parse(l)) : [json(res)];
  return { status: res.statusCode, lines, type: res.headers['content-type'] as string | undefined, raw: res.body };
}

describe('POST /v1/batches', () => {
  it('streams one track per line, then a manifest that matches them; every seed in the split, every track made again alone', async () => {
    const { status, lines, type, raw } = await batch({ count: 4, split: 'test', baseSeed: 'larkspur-night-1', params: SHORT });
    expect([status, type]).toEqual([200, 'application/x-ndjson; charset=utf-8']);
    expect(lines).toHaveLength(5);
    const tracks = lines.slice(0, 4) as Track[];
    const manifest = lines[4] as Manifest;
    expect(manifestSchema.safeParse(manifest).success).toBe(true);
    expect(manifest).toMatchObject({ format: 'lapwright.manifest/1', split: 'test', shard: null, request: { count: 4, split: 'test', baseSeed: 'larkspur-night-1', params: SHORT, minNovelty: 0, reference: null } });
    const rawLines = raw.split('\n');
    tracks.forEach((track, i) => {
      const entry = manifest.tracks[i];
      expect(entry).toMatchObject({ index: i, seed: track.seed, id: track.id, split: 'test', params: track.params, metrics: track.metrics });
      expect(splitOf(track.seed)).toBe('test');
      // the line is the track's JSON, as POST /v1/tracks sends it
      expect(rawLines[i]).toBe(JSON.stringify(track));
      expect(generateTrack(entry.params).id).toBe(entry.id);
    });
    // the seeds skipped for their split are counted
    expect(manifest.skipped.split).toBe(manifest.tracks.reduce((s, t) => s + t.draw, 0) - manifest.redrawn);
  });

  it('detail summary: each line is the track\'s manifest entry, without the geometry', async () => {
    const { lines } = await batch({ count: 3, baseSeed: 7, params: SHORT, detail: 'summary' });
    const manifest = lines[3] as Manifest;
    expect(lines.slice(0, 3)).toEqual(manifest.tracks);
    expect(Object.keys(manifest.tracks[0])).toEqual(['index', 'seed', 'draw', 'split', 'id', 'params', 'metrics', 'shape']);
  });

  it('a test set novel against a train set: disjoint seeds, every distance at least minNovelty, the reference named in the manifest', async () => {
    const train = (await batch({ count: 4, split: 'train', baseSeed: 'larkspur-train', params: SHORT, detail: 'summary' })).lines.at(-1) as Manifest;
    const test = (await batch({ count: 3, split: 'test', baseSeed: 'larkspur-test', params: SHORT, detail: 'summary', minNovelty: 0.6, reference: train })).lines.at(-1) as Manifest;
    expect(test.request.reference).toEqual({ tracks: 4, digest: expect.stringMatching(/^[0-9a-f]{64}$/) });
    const trainSeeds = new Set(train.tracks.map((t) => t.seed));
    for (const t of test.tracks) {
      expect(trainSeeds.has(t.seed)).toBe(false);
      for (const r of [...train.tracks, ...test.tracks.filter((u) => u.index < t.index)]) expect(shapeDistance(decodeShape(t.shape), decodeShape(r.shape))).toBeGreaterThanOrEqual(0.6);
    }
  });

  it('400 names every bad field; a count over the server\'s cap is one of them', async () => {
    const { status, lines } = await batch({ count: 401, split: 'holdout', params: { lengthM: { min: 900, max: 800 } } });
    expect(status).toBe(400);
    expect(lines[0]).toEqual({
      statusCode: 400,
      code: 'ERR_INVALID_PARAMS',
      error: 'Bad Request',
      message: 'invalid track parameters: 2 issues, listed with their paths in issues',
      issues: [
        { path: 'split', message: 'expected one of train, validation, test, got "holdout"' },
        { path: 'params.lengthM', message: 'range min 900 is greater than its max 800' },
      ],
    });
    const over = await batch({ count: 401 });
    expect((over.lines[0] as { issues: unknown }).issues).toEqual([
      { path: 'count', message: 'expected at most 400 tracks per request on this server, got 401: ask in several batches (count and a different baseSeed each), or make large datasets with lapwright batch' },
    ]);
  });

  it('400 for a reference shape that does not decode to finite numbers', async () => {
    const nan = Buffer.alloc(512);
    for (let k = 0; k < 128; k++) nan.writeFloatLE(Number.NaN, 4 * k);
    const { status, lines } = await batch({ count: 1, minNovelty: 0.2, reference: { tracks: [{ shape: nan.toString('base64') }] } });
    expect(status).toBe(400);
    expect((lines[0] as { issues: unknown }).issues).toEqual([{ path: 'reference.tracks.0.shape', message: 'shape value 0 is not a finite number.' }]);
  });

  it('startIndex: the lines of a resumed batch are the tail of the uninterrupted one, byte for byte, and its manifest holds that tail', async () => {
    const body = { count: 6, baseSeed: 'larkspur-resume', params: SHORT };
    const whole = await batch(body);
    const tail = await batch({ ...body, startIndex: 4 });
    expect(whole.status).toBe(200);
    expect(tail.status).toBe(200);
    const wholeLines = whole.raw.split('\n');
    const tailLines = tail.raw.split('\n');
    expect(tailLines.slice(0, 2)).toEqual(wholeLines.slice(4, 6));
    const wholeManifest = whole.lines.at(-1) as Manifest;
    const tailManifest = tail.lines.at(-1) as Manifest;
    expect(tailManifest.tracks).toEqual(wholeManifest.tracks.slice(4));
    expect(tailManifest.request).toEqual(wholeManifest.request);
    expect(manifestSchema.safeParse(tailManifest).success).toBe(true);
  });

  it('startIndex with minNovelty: the tracks already received, added to reference, give the same tail', async () => {
    const body = { count: 5, baseSeed: 'larkspur-resume-novel', params: SHORT, detail: 'summary', minNovelty: 0.5 };
    const whole = (await batch(body)).lines.at(-1) as Manifest;
    // the test means something only if novelty turned draws away
    expect(whole.skipped.novelty).toBeGreaterThan(0);
    const tail = (await batch({ ...body, startIndex: 3, reference: { tracks: whole.tracks.slice(0, 3) } })).lines.at(-1) as Manifest;
    expect(tail.tracks).toEqual(whole.tracks.slice(3));
  });

  it('400 for a startIndex that is not below count', async () => {
    const { status, lines } = await batch({ count: 3, startIndex: 3 });
    expect(status).toBe(400);
    expect((lines[0] as { issues: unknown }).issues).toEqual([{ path: 'startIndex', message: 'expected a track index below count (3), got 3: a batch resumes at the index after the last track it sent' }]);
  });

  it('422 when the first track finds no feasible draw, with the last draw\'s reason and hint', async () => {
    const { status, lines } = await batch({ count: 3, params: { turnBalance: 0, curvatureBudgetDeg: 900, cornerCount: 9 } });
    expect(status).toBe(422);
    expect(lines[0]).toEqual({
      statusCode: 422,
      code: 'ERR_INFEASIBLE',
      error: 'Unprocessable Entity',
      message: 'track 0: 64 of its draws were infeasible (last: turning_vs_balance: every one of the 9 corners turns left (turnBalance 0), so a closed loop turns exactly 360 degrees, not 900)',
      reason: 'turning_vs_balance',
      hint: 'set curvatureBudgetDeg to 360, or set turnBalance so that round(turnBalance * 9) is between 1 and 8 (e.g. 0.12); or narrow the parameter ranges to values that are feasible',
      issues: [],
      attempts: 0,
    });
  });
});

describe('POST /v1/batches over loopback', () => {
  let url: string;
  beforeAll(async () => {
    url = await app.listen({ port: 0, host: '127.0.0.1' });
  });

  it('a client that stops reading: the server holds at most window + 1 tracks it has made and not sent, and stops making them', async () => {
    const gauge = batchGauge(app.lapwright);
    const window = 2; // 1 worker x 2
    const count = 400;
    const before = { made: gauge.made, flushed: gauge.flushed };
    gauge.maxHeld = gauge.held;
    // default 1.5 km laps: about 140 KB a line, 56 MB for the whole batch, far more than socket buffers hold
    const body = JSON.stringify({ count, baseSeed: 'larkspur-slow-reader' });
    const res = await new Promise<import('node:http').IncomingMessage>((resolve, reject) => {
      const req = httpRequest(`${url}/v1/batches`, { method: 'POST', headers: { 'content-type': 'application/json' } }, resolve);
      req.on('error', reject);
      req.end(body);
    });
    expect(res.statusCode).toBe(200);
    // read one chunk, then stop reading
    await new Promise<void>((resolve) => res.once('data', () => resolve()));
    res.pause();
    // wait until the server stops making tracks (bounded: 20 s)
    let last = -1;
    for (let i = 0; i < 100 && gauge.made !== last; i++) {
      last = gauge.made;
      await new Promise((r) => setTimeout(r, 200));
    }
    const made = gauge.made - before.made;
    const unsent = made - (gauge.flushed - before.flushed);
    expect(made).toBeLessThan(count / 2);
    expect(unsent).toBeLessThanOrEqual(window + 1);
    expect(gauge.maxHeld).toBeLessThanOrEqual(window + 1);
    res.destroy();
    // the batch stops when the client goes away, and lets go of what it held
    for (let i = 0; i < 50 && gauge.held !== 0; i++) await new Promise((r) => setTimeout(r, 100));
    expect(gauge.held).toBe(0);
  });

  it('a batch cut short (the server shutting down) ends with one complete line: the error, where to resume, the manifest of what was sent', async () => {
    const res = await fetch(`${url}/v1/batches`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ count: 60, baseSeed: 3, params: SHORT, detail: 'summary' }) });
    const reader = res.body!.getReader();
    const first = await reader.read();
    app.lapwright.shuttingDown = true;
    let text = new TextDecoder().decode(first.value);
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      text += new TextDecoder().decode(value);
    }
    app.lapwright.shuttingDown = false;
    expect(text.endsWith('\n')).toBe(true);
    const lines = text.trimEnd().split('\n').map((l) => JSON.parse(l));
    const last = lines.at(-1) as { error: { code: string; statusCode: number }; resume: unknown; manifest: Manifest };
    const sent = lines.slice(0, -1) as ManifestTrack[];
    expect(last.error).toMatchObject({ statusCode: 503, code: 'ERR_SHUTTING_DOWN' });
    expect(lines.length).toBeLessThan(61);
    for (const line of sent) expect(line.id).toMatch(/^[0-9a-f]{64}$/);
    expect(last.resume).toEqual({ baseSeed: 3, startIndex: sent.length, lastIndex: sent.length - 1, lastSeed: sent.at(-1)!.seed });
    expect(manifestSchema.safeParse(last.manifest).success).toBe(true);
    expect(last.manifest.tracks).toEqual(sent);
    expect(last.manifest.request).toMatchObject({ count: 60, baseSeed: 3 });
  });
});
