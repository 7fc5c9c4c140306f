import { describe, expect, test } from 'vitest';
import { circumCurvature } from '../../../src/core/curve/curvature.js';
import { validateTrack } from '../../../src/core/validate/index.js';
import { roundingCurvatureAllowance, SAGITTA_ROUNDING_M } from '../../../src/core/validate/radius.js';
import { ROUNDING_M } from '../../../src/core/rules.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, insertGate, stadiumTrack, type MutableTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();
const n = base.centerline.points.length;
const codes = (f: (t: MutableTrack) => void): string[] => {
  const t = cloneTrack(base);
  f(t);
  return codesOf(validateTrack(t as Track));
};

describe('radius rules', () => {
  test('the rounding allowance bounds what 1 mm rounding does to a circumcircle', () => {
    // circle through three points h apart on a circle of radius r (curvature 1/r, do Carmo 1976), each moved by
    // ±ROUNDING_M in x and y in the worst way: curvature grows by no more than the allowance
    const r = 40, h = 3;
    const pts = [-1, 0, 1].map((k) => [r * Math.sin((k * h) / r), r - r * Math.cos((k * h) / r)]);
    let worst = 0;
    for (let mask = 0; mask < 64; mask++) {
      const d = (bit: number) => ((mask >> bit) & 1 ? ROUNDING_M : -ROUNDING_M);
      const k = circumCurvature(pts[0][0] + d(0), pts[0][1] + d(1), pts[1][0] + d(2), pts[1][1] + d(3), pts[2][0] + d(4), pts[2][1] + d(5));
      worst = Math.max(worst, k - 1 / r);
    }
    expect(worst).toBeGreaterThan(0);
    expect(worst).toBeLessThanOrEqual(roundingCurvatureAllowance(h));
    expect(SAGITTA_ROUNDING_M).toBeCloseTo(2 * Math.SQRT2 * ROUNDING_M, 15);
  });

  test("a shipped curvature tighter than minCornerRadiusM is a 'min_radius' issue", () => {
    // radius 38.9 m on the right arc (radius 40 m): the spacing law there barely moves
    expect(codes((t) => { t.centerline.curvature[120] = 0.0257; })).toEqual(['min_radius']);
  });

  test("a kink in the shipped points is a 'min_radius' issue", () => {
    const t = cloneTrack(base);
    // move point 150 of the right arc (centre (60, 0)) and its wall vertices 3 cm outwards: widths still agree
    const gateNear = t.gates.some((g) => Math.abs(g.s - t.centerline.s[150]) < 3);
    expect(gateNear).toBe(false);
    const [x, y] = t.centerline.points[150];
    const ux = (x - 60) / Math.hypot(x - 60, y), uy = y / Math.hypot(x - 60, y);
    const move = (p: readonly [number, number]): [number, number] => [p[0] + 0.03 * ux, p[1] + 0.03 * uy];
    t.centerline.points[150] = move(t.centerline.points[150]);
    t.walls.left[150] = move(t.walls.left[150]);
    t.walls.right[150] = move(t.walls.right[150]);
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['min_radius']);
    expect(r.issues[0].message).toContain('circle through points 3 apart');
  });

  test("metrics.minRadiusM below the limit is a 'min_radius' issue", () => {
    expect(codes((t) => { t.metrics.minRadiusM = 30; })).toEqual(['min_radius']);
  });

  test('a tighter limit than the arcs is reported by every radius check and by the corners', () => {
    expect(codes((t) => { t.params.minCornerRadiusM = 41; })).toEqual(['corner_mismatch', 'min_radius']);
  });

  test("a radius below half width + wall thickness is a 'radius_vs_width' issue", () => {
    // with feasible params (minCornerRadiusM > half width + thickness) such a radius also breaks min_radius
    const t = cloneTrack(base);
    // the point in the middle of a gate gap on the top straight (s in [186, 305] m)
    const k = t.gates.findIndex((g, j) => g.s > 186 && j + 1 < t.gates.length && t.gates[j + 1].s < 305);
    const i = Math.round((t.gates[k].s + t.gates[k + 1].s) / 2 / t.centerline.spacingM);
    t.centerline.curvature[i] = -1 / (t.centerline.halfWidthRightM[i] + 0.3); // turning right: the right side is inner
    // the tight spot wants gates 5 m apart: split its gap so the spacing law still holds
    insertGate(t, t.centerline.s[i]);
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['min_radius', 'radius_vs_width']);
    const issue = r.issues.find((x) => x.code === 'radius_vs_width')!;
    expect(issue).toMatchObject({ at: { index: i }, limit: t.centerline.halfWidthRightM[i] + 0.5 });
    expect(n).toBeGreaterThan(i);
  });
});
