import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { decodeShape, distanceBelow, encodeShape, NOVELTY_SAMPLES, NoveltyIndex, shapeDistance, shapeDistanceBound } from '../../../src/core/batch/novelty.js';
import type { Point } from '../../../src/core/track.js';

function regularPolygon(n: number, r = 1, phase = 0): Point[] {
  return Array.from({ length: n }, (_, k) => [r * Math.cos(phase + (2 * Math.PI * k) / n), r * Math.sin(phase + (2 * Math.PI * k) / n)] as const);
}

/** A star-shaped (hence simple) polygon from angle increments and radii. */
function star(spec: readonly (readonly [number, number])[]): Point[] {
  const total = spec.reduce((s, [da]) => s + da, 0);
  let angle = 0;
  return spec.map(([da, r]) => {
    const p = [r * Math.cos(angle), r * Math.sin(angle)] as const;
    angle += (2 * Math.PI * da) / total;
    return p;
  });
}
const starSpec = fc.array(fc.tuple(fc.double({ min: 0.2, max: 1, noNaN: true }), fc.double({ min: 0.4, max: 1, noNaN: true })), { minLength: 5, maxLength: 40 });

const shape = (points: readonly Point[]) => decodeShape(encodeShape(points));
const SQUARE: Point[] = [[0, 0], [1, 0], [1, 1], [0, 1]];

describe('stored shapes', () => {
  it('encode to base64 of 128 32-bit floats and decode back', () => {
    const text = encodeShape(SQUARE);
    expect(text).toHaveLength(684);
    expect(decodeShape(text).signature.values).toHaveLength(NOVELTY_SAMPLES);
    expect(() => decodeShape(text.slice(4))).toThrow(RangeError);
    expect(() => decodeShape('!'.repeat(684))).toThrow(RangeError);
  });

  test.prop([starSpec, fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.double({ min: 0.01, max: 100, noNaN: true })])(
    'the same outline rotated, scaled and moved is at distance ~0 (float32 storage)',
    (spec, angle, scale) => {
      const a = star(spec);
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      const b = a.map(([x, y]) => [scale * (c * x - s * y) + 123, scale * (s * x + c * y) - 45] as const);
      expect(shapeDistance(shape(a), shape(b))).toBeLessThan(1e-5);
    },
  );

  it('a smooth outline started at any vertex stays close (binning starts at vertex 0: up to half a bin of shift, measured 0.06 rad here)', () => {
    // r = 1 + 0.3 cos 3t + 0.1 sin 5t, 2000 vertices: like a sampled centerline, small turns everywhere
    const outline: Point[] = Array.from({ length: 2000 }, (_, i) => {
      const t = (2 * Math.PI * i) / 2000;
      const r = 1 + 0.3 * Math.cos(3 * t) + 0.1 * Math.sin(5 * t);
      return [r * Math.cos(t), r * Math.sin(t)] as const;
    });
    const a = shape(outline);
    // the error is at most ‖Θ(· + δ) − Θ‖₂ for |δ| ≤ 1/256 (turningDistanceBetween's bound)
    for (const k of [1, 7, 37, 500, 1999]) expect(shapeDistance(a, shape([...outline.slice(k), ...outline.slice(0, k)]))).toBeLessThan(0.1);
  });

  it('square vs circle: π·√(1/48 − 1/49152) = 0.453228 on 128 bins [C]', () => {
    // exact distance π/(4√3) (sawtooth of amplitude π/4, RMS (π/4)/√3); the square's corners fall on bin edges, so
    // binning only removes the circle's in-bin variation, a ramp of 2π/128 with variance (2π/128)²/12:
    // D_binned² = π²/48 − π²/(3·128²) = π²(1/48 − 1/49152)
    const expected = Math.PI * Math.sqrt(1 / 48 - 1 / 49152);
    expect(expected).toBeCloseTo(0.453228, 6);
    // a 4096-gon stands in for the circle: off by π/(4096√3) = 4.4e-4 at most
    expect(Math.abs(shapeDistance(shape(SQUARE), shape(regularPolygon(4096))) - expected)).toBeLessThan(5e-4);
  });

  test.prop([starSpec, starSpec])('the Fourier bound never exceeds the distance, and distanceBelow agrees with the distance', (p, q) => {
    const a = shape(star(p));
    const b = shape(star(q));
    const d = shapeDistance(a, b);
    expect(shapeDistanceBound(a, b)).toBeLessThanOrEqual(d + 1e-9);
    for (const limit of [d * 0.9, d, d * 1.1 + 1e-6]) expect(distanceBelow(a, b, limit)).toBe(d < limit ? d : null);
  });
});

describe('NoveltyIndex', () => {
  it('finds the first held shape closer than the threshold, or null', () => {
    const index = new NoveltyIndex();
    index.add(shape(SQUARE));
    index.add(shape(regularPolygon(4096)));
    expect(index.size).toBe(2);
    expect(index.findWithin(shape(regularPolygon(4000, 5, 0.3)), 0.1)?.index).toBe(1);
    expect(index.findWithin(shape(regularPolygon(3)), 0.2)).toBeNull();
    const hit = index.findWithin(shape(SQUARE.map(([x, y]) => [2 * x, 2 * y] as const)), 0.1);
    expect(hit?.index).toBe(0);
    expect(hit?.distance).toBeLessThan(1e-6);
  });
});
