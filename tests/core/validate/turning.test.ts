import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import { measureTurning } from '../../../src/core/validate/turning.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, mirrorTrack, stadiumTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();

function circle(n: number, r: number, windings = 1, sign = 1): Float64Array {
  const c = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const a = (sign * 2 * Math.PI * windings * i) / n;
    c[2 * i] = r * Math.cos(a);
    c[2 * i + 1] = r * Math.sin(a);
  }
  return c;
}

describe('turning rules', () => {
  test('a simple closed loop turns ±360° net (Hopf, Umlaufsatz) and a convex one 360° in total', () => {
    // Hopf 1935, "Über die Drehung der Tangenten und Sehnen ebener Kurven": rotation index ±1 for simple closed curves
    expect(measureTurning(circle(100, 10), 3).netDeg).toBeCloseTo(360, 9);
    expect(measureTurning(circle(100, 10), 3).totalDeg).toBeCloseTo(360, 9);
    expect(measureTurning(circle(101, 10, 1, -1), 1).netDeg).toBeCloseTo(-360, 9);
  });

  test('a doubly wound circle turns 720°', () => {
    expect(measureTurning(circle(300, 10, 2), 3).netDeg).toBeCloseTo(720, 9);
  });

  test('decimation keeps the closing chord no shorter than the others', () => {
    // 10 vertices with stride 3: 3 chords (indices 0, 3, 6), still closed and still turning 360°
    expect(measureTurning(circle(10, 1), 3).netDeg).toBeCloseTo(360, 9);
  });

  test("a doubly wound centerline is a 'net_turning' issue", () => {
    const t = cloneTrack(base);
    const n = t.centerline.points.length;
    // odd point count, so the two windings never share a point
    t.centerline.points = Array.from(circle(n, 80, 2)).reduce<[number, number][]>((acc, v, k) => {
      if (k % 2 === 0) acc.push([Math.round(v * 1e3) / 1e3, 0]);
      else acc[acc.length - 1][1] = Math.round(v * 1e3) / 1e3;
      return acc;
    }, []);
    expect(codesOf(validateTrack(t as Track))).toContain('net_turning');
  });

  test("a budget the track does not meet is a 'total_turning' issue", () => {
    const t = cloneTrack(base);
    t.params.curvatureBudgetDeg = 720;
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['total_turning']);
    expect(r.issues[0]).toMatchObject({ limit: 684 });
    expect(r.issues[0].actual).toBeCloseTo(360, 0);
  });

  test('a budget within 5% passes', () => {
    const t = cloneTrack(base);
    t.params.curvatureBudgetDeg = 375;
    expect(validateTrack(t as Track).issues).toEqual([]);
    expect(validateTrack(mirrorTrack(t as Track)).issues).toEqual([]);
  });
});
