import { describe, expect, test } from 'vitest';
import { generateTrack } from '../../../src/core/generate.js';
import { pointSegmentDistance } from '../../../src/core/geom/polyline.js';
import { checkClearance } from '../../../src/core/validate/clearance.js';

// a stadium: straights of length `straight` along y = ±R joined by half circles of radius R,
// sampled every ~1 m, counter-clockwise from (0, -R)
function stadium(straight: number, R: number): { points: Float64Array; s: Float64Array; lap: number } {
  const xy: number[] = [];
  const ss: number[] = [];
  const lap = 2 * straight + 2 * Math.PI * R;
  const n = Math.round(lap);
  for (let k = 0; k < n; k++) {
    const u = (k * lap) / n;
    let x: number, y: number;
    if (u < straight) [x, y] = [u - straight / 2, -R];
    else if (u < straight + Math.PI * R) {
      const a = (u - straight) / R;
      [x, y] = [straight / 2 + R * Math.sin(a), -R * Math.cos(a)];
    } else if (u < 2 * straight + Math.PI * R) [x, y] = [straight / 2 - (u - straight - Math.PI * R), R];
    else {
      const a = (u - 2 * straight - Math.PI * R) / R;
      [x, y] = [-straight / 2 - R * Math.sin(a), R * Math.cos(a)];
    }
    xy.push(x, y);
    ss.push(u);
  }
  return { points: Float64Array.from(xy), s: Float64Array.from(ss), lap };
}

// the smallest gap over every vertex-segment pair more than πR apart along the lap: all n² pairs
function bruteForceGap(points: Float64Array, s: Float64Array, lap: number, reach: Float64Array, R: number): number {
  const n = s.length;
  let best = Infinity;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const j1 = (j + 1) % n;
      const along = (a: number, b: number) => Math.min(Math.abs(a - b), lap - Math.abs(a - b));
      if (Math.min(along(s[i], s[j]), along(s[i], s[j1])) <= Math.PI * R) continue;
      const d = pointSegmentDistance(points[2 * i], points[2 * i + 1], points[2 * j], points[2 * j + 1], points[2 * j1], points[2 * j1 + 1]);
      best = Math.min(best, d - reach[i] - Math.max(reach[j], reach[j1]));
    }
  }
  return best;
}

describe('checkClearance: the measured gap is the closest approach of the lap to itself', () => {
  // hand computation: on a stadium the straights are 2R apart and any other pair more than πR
  // apart along the lap is farther (a point on a half circle at angle θ and the opposite straight
  // are at least 2R apart), so the gap is 2R less two reaches
  test('stadium of R 30 m with reaches of 6 m: gap 2·30 − 2·6 = 48 m', () => {
    const { points, s, lap } = stadium(200, 30);
    const reach = new Float64Array(s.length).fill(6);
    const r = checkClearance({ points, s, lapLengthM: lap, reach, marginM: 1, minRadiusM: 30, maxViolations: 1, measureBeyondM: 50 });
    expect(r.minGapM).toBeCloseTo(48, 6);
    expect(r.violations).toEqual([]);
  });

  test('the gap is capped at measureBeyondM when nothing comes nearer', () => {
    const { points, s, lap } = stadium(200, 30);
    const reach = new Float64Array(s.length).fill(6);
    const r = checkClearance({ points, s, lapLengthM: lap, reach, marginM: 1, minRadiusM: 30, maxViolations: 1, measureBeyondM: 20 });
    expect(r.minGapM).toBe(20);
  });

  test('straights nearer than the margin are a violation, whether measuring or not', () => {
    const { points, s, lap } = stadium(200, 30);
    // 2·30 − 2·29.8 = 0.4 m between the wall solids, 1 m required
    const reach = new Float64Array(s.length).fill(29.8);
    for (const measureBeyondM of [0, 50]) {
      const r = checkClearance({ points, s, lapLengthM: lap, reach, marginM: 1, minRadiusM: 30, maxViolations: 4, measureBeyondM });
      expect(r.violations.length).toBeGreaterThan(0);
      for (const v of r.violations) expect(v.distanceM).toBeLessThan(v.requiredM);
    }
  });

  test('generated tracks: the branch and bound finds the brute-force minimum over all n² pairs', () => {
    for (const seed of [1, 2, 3, 4]) {
      const t = generateTrack({ seed, lengthM: 900, cornerCount: 7 });
      const n = t.centerline.points.length;
      const points = Float64Array.from(t.centerline.points.flat());
      const s = Float64Array.from(t.centerline.s);
      const reach = Float64Array.from(t.centerline.halfWidthLeftM, (h, i) => Math.max(h, t.centerline.halfWidthRightM[i]) + t.walls.thicknessM);
      const R = t.params.minCornerRadiusM;
      const lap = t.centerline.lengthM;
      const expected = Math.min(50, bruteForceGap(points, s, lap, reach, R));
      const r = checkClearance({ points, s, lapLengthM: lap, reach, marginM: t.params.clearanceM, minRadiusM: R, maxViolations: 1, measureBeyondM: 50 });
      expect(r.minGapM, `seed ${seed}, ${n} points`).toBeCloseTo(expected, 9);
      // the shipped metric is the same measure on the unrounded centerline: within rounding
      expect(Math.abs(t.metrics.minClearanceM - expected)).toBeLessThan(0.01);
    }
  });
});
