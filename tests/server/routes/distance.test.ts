import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack } from '../../../src/core/index.js';
import { json, readyApp } from '../helpers.js';

let app: FastifyInstance;
beforeAll(async () => {
  app = await readyApp({ workers: 1 });
});
afterAll(async () => {
  await app.close();
});

type P = [number, number];
const SQUARE: P[] = [[0, 0], [1, 0], [1, 1], [0, 1]];
const ngon = (n: number): P[] => Array.from({ length: n }, (_, k) => [Math.cos((2 * Math.PI * k) / n), Math.sin((2 * Math.PI * k) / n)]);
// turned by 30°, scaled by 7, moved, and started at another vertex
const move = (points: P[], start: number): P[] =>
  [...points.slice(start), ...points.slice(0, start)].map(([x, y]) => [7 * (x * Math.cos(0.5236) - y * Math.sin(0.5236)) + 40, 7 * (x * Math.sin(0.5236) + y * Math.cos(0.5236)) - 3]);

async function distance(body: object): Promise<{ status: number; body: { distance: number; method: string; samples: number | null } }> {
  const res = await app.inject({ method: 'POST', url: '/v1/tracks/distance', payload: body });
  return { status: res.statusCode, body: json(res) as never };
}

describe('POST /v1/tracks/distance', () => {
  it('the same shape at any rotation, start point, scale and position: 0 (exact)', async () => {
    const { status, body } = await distance({ a: { points: SQUARE }, b: { points: move(SQUARE, 2) } });
    expect([status, body.method, body.samples]).toEqual([200, 'exact', null]);
    // a square root of rounding errors: about 1e-8
    expect(body.distance).toBeLessThan(1e-6);
    const star: P[] = [[0, 0], [4, 1], [5, 4], [2, 2.5], [1, 5]];
    expect((await distance({ a: { points: star }, b: { points: move(star, 3) } })).body.distance).toBeLessThan(1e-6);
  });

  it('square vs circle: π/(4√3) = 0.453450 exact; π·√(1/48 − 1/49152) = 0.453228 on 128 bins [C]', async () => {
    // Θ of the square minus Θ of the circle is a sawtooth of amplitude π/4 over each quarter: RMS (π/4)/√3 = π/(4√3).
    // On 128 bins the square's corners fall on bin edges, so binning only removes the circle's in-bin ramp of
    // 2π/128, whose variance is (2π/128)²/12: D² = π²/48 − π²/49152. A 4096-gon stands in for the circle
    // (off by at most π/(4096√3) = 4.4e-4).
    const circle = { points: ngon(4096) };
    const exact = await distance({ a: { points: SQUARE }, b: circle });
    expect(exact.body.method).toBe('exact');
    expect(Math.abs(exact.body.distance - Math.PI / (4 * Math.sqrt(3)))).toBeLessThan(5e-4);
    const binned = await distance({ a: { points: SQUARE }, b: circle, method: 'binned' });
    expect([binned.body.method, binned.body.samples]).toEqual(['binned', 128]);
    expect(Math.abs(binned.body.distance - Math.PI * Math.sqrt(1 / 48 - 1 / 49152))).toBeLessThan(5e-4);
  });

  it('takes tracks: a track against itself turned and scaled is ~0, against another track clearly not', async () => {
    const a = generateTrack({ seed: 'larkspur-d1', lengthM: 700 });
    const b = generateTrack({ seed: 'larkspur-d2', lengthM: 700 });
    const moved = { points: move(a.centerline.points as P[], 0) };
    const same = await distance({ a, b: moved });
    expect(same.body.method).toBe('binned');
    expect(same.body.distance).toBeLessThan(1e-5);
    expect((await distance({ a, b })).body.distance).toBeGreaterThan(0.2);
  });

  it('400 for a degenerate outline, naming it', async () => {
    const { status, body } = await distance({ a: { points: [[0, 0], [1, 0], [2, 0]] }, b: { points: SQUARE } });
    expect(status).toBe(400);
    expect((body as unknown as { issues: { path: string }[] }).issues.map((i) => i.path)).toEqual(['a']);
  });
});
