// Tests for src/core/curve/catmull-rom-closed.ts.
//
// Curvature error of the spline on a circle sampled at equal angle steps (measured here,
// alpha = 0, 0.5 and 1 agree because all chords are equal; independent of the radius;
// max over 1001 u per segment of |κ·R − 1|; about 0.75·θ² with θ the step in radians):
//
//   step θ   control points   max relative κ error   relative length error
//   2°       180              9.14e-4                −1.86e-8
//   3°       120              2.06e-3                −9.39e-8
//   5°        72              5.72e-3                −7.24e-7
//   10°       36              2.30e-2                −1.15e-5
//
// Unequal neighbouring chords add a first-order term. Circle with alternating steps in the
// ratio r at a mean of 3° (max relative κ error, alpha 0 / 0.5 / 1):
//   r = 1.05: 1.0e-1 / 4.9e-2 / 2.1e-3;  r = 1.1: 2.1e-1 / 1.0e-1 / 2.1e-3;  r = 1.2: 4.6e-1 / 2.0e-1 / 2.2e-3
// Smoothly graded spacing (ellipses 1.1:1 to 3:1, one control point per heading step) gives
// about 0.5·(r − 1) for alpha 0.5 and 1.0·(r − 1) for alpha 1, r the largest ratio of
// neighbouring chords. A jump in curvature (straight into an arc) overshoots by 30–50 % for
// any alpha and any spacing: a C¹ cubic cannot follow it, so plan continuous curvature.

import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import {
  catmullRomClosed,
  MIN_CHORD_M,
  splineDerivatives,
  splinePoint,
  type ClosedSpline,
} from '../../../src/core/curve/catmull-rom-closed.js';
import { curvatureFromDerivatives } from '../../../src/core/curve/curvature.js';
import { circleControl, ellipseControl, gridPolygon, openPolylineCrossings } from '../../helpers/curve-fixtures.js';

const DEG = Math.PI / 180;

function maxCurvatureError(spline: ClosedSpline, radius: number, perSegment: number): number {
  const d = new Float64Array(4);
  let worst = 0;
  for (let seg = 0; seg < spline.segmentCount; seg++) {
    for (let k = 0; k <= perSegment; k++) {
      splineDerivatives(spline, seg, k / perSegment, d);
      worst = Math.max(worst, Math.abs(curvatureFromDerivatives(d[0], d[1], d[2], d[3]) * radius - 1));
    }
  }
  return worst;
}

function sampleSegment(spline: ClosedSpline, seg: number, m: number): Float64Array {
  const out = new Float64Array(2 * (m + 1));
  const p = new Float64Array(2);
  for (let k = 0; k <= m; k++) {
    splinePoint(spline, seg, k / m, p);
    out[2 * k] = p[0];
    out[2 * k + 1] = p[1];
  }
  return out;
}

// smallest speed |P'(u)| over the segment: dense scan, then golden-section refinement
function minSpeed(spline: ClosedSpline, seg: number): number {
  const d = new Float64Array(4);
  const speed = (u: number) => (splineDerivatives(spline, seg, u, d), Math.sqrt(d[0] * d[0] + d[1] * d[1]));
  const m = 512;
  let best = 0;
  for (let k = 1; k <= m; k++) if (speed(k / m) < speed(best / m)) best = k;
  let lo = Math.max(0, (best - 1) / m);
  let hi = Math.min(1, (best + 1) / m);
  const g = (Math.sqrt(5) - 1) / 2;
  for (let it = 0; it < 80; it++) {
    const a = hi - g * (hi - lo);
    const b = lo + g * (hi - lo);
    if (speed(a) < speed(b)) hi = b;
    else lo = a;
  }
  return Math.min(speed(lo), speed(0), speed(1));
}

function hasCuspOrLoop(control: Float64Array, alpha: number): boolean {
  const spline = catmullRomClosed(control, alpha);
  for (let seg = 0; seg < spline.segmentCount; seg++) {
    if (!(minSpeed(spline, seg) > 0)) return true;
    if (openPolylineCrossings(sampleSegment(spline, seg, 256)) > 0) return true;
  }
  return false;
}

describe('catmullRomClosed: guards', () => {
  it('rejects fewer than 3 control points', () => {
    expect(() => catmullRomClosed(new Float64Array([0, 0, 1, 0]))).toThrow(
      new RangeError('closed spline needs >= 3 control points, got 2'),
    );
  });
  it('rejects an odd-length coordinate array', () => {
    expect(() => catmullRomClosed(new Float64Array([0, 0, 1, 0, 1]))).toThrow(/odd length 5/);
  });
  it('rejects coincident consecutive points and names them, including the wrap-around', () => {
    expect(() => catmullRomClosed(new Float64Array([0, 0, 1, 0, 1, 0, 0, 1]))).toThrow(/control points 1 and 2 are 0 m apart/);
    expect(() => catmullRomClosed(new Float64Array([0, 0, 1, 0, 0, 1, 0, 0]))).toThrow(/control points 3 and 0/);
    const tight = MIN_CHORD_M / 2;
    expect(() => catmullRomClosed(new Float64Array([0, 0, tight, 0, 0, 1]))).toThrow(RangeError);
  });
  it('rejects non-finite coordinates and alpha outside [0, 1]', () => {
    expect(() => catmullRomClosed(new Float64Array([0, 0, NaN, 0, 0, 1]))).toThrow(/control points 0 and 1/);
    expect(() => catmullRomClosed(new Float64Array([0, 0, Infinity, 0, 0, 1]))).toThrow(RangeError);
    expect(() => catmullRomClosed(circleControl(8, 1), 1.5)).toThrow(/alpha must lie in \[0, 1\], got 1.5/);
    expect(() => catmullRomClosed(circleControl(8, 1), NaN)).toThrow(RangeError);
  });
  it('copies the control points', () => {
    const control = circleControl(6, 1);
    const spline = catmullRomClosed(control);
    control[0] = 99;
    expect(spline.control[0]).toBe(1);
  });
});

describe('catmullRomClosed: interpolation and continuity', () => {
  const control = new Float64Array([0, 0, 40, -5, 70, 20, 55, 60, 10, 45, -20, 20]);
  for (const alpha of [0, 0.5, 1]) {
    const spline = catmullRomClosed(control, alpha);
    const n = spline.segmentCount;
    it(`alpha ${alpha}: u = 0 returns the control point exactly (interpolating)`, () => {
      const p = new Float64Array(2);
      for (let i = 0; i < n; i++) {
        splinePoint(spline, i, 0, p);
        expect([p[0], p[1]]).toEqual([control[2 * i], control[2 * i + 1]]);
      }
    });
    it(`alpha ${alpha}: last point of a segment equals the first of the next (C0)`, () => {
      const a = new Float64Array(2);
      const b = new Float64Array(2);
      for (let i = 0; i < n; i++) {
        splinePoint(spline, i, 1, a);
        splinePoint(spline, (i + 1) % n, 0, b);
        // rounding of the cubic sum only: coordinates below 100 m (common practice, no source)
        expect(Math.abs(a[0] - b[0])).toBeLessThan(1e-12);
        expect(Math.abs(a[1] - b[1])).toBeLessThan(1e-12);
      }
    });
    it(`alpha ${alpha}: d/dt matches across every joint (C1 in the knot parameter)`, () => {
      const a = new Float64Array(4);
      const b = new Float64Array(4);
      for (let i = 0; i < n; i++) {
        const j = (i + 1) % n;
        splineDerivatives(spline, i, 1, a);
        splineDerivatives(spline, j, 0, b);
        // dP/dt = (dP/du)/Δ on each side (chain rule [C]); relative rounding tolerance
        const ta = [a[0] / spline.knotIntervals[i], a[1] / spline.knotIntervals[i]];
        const tb = [b[0] / spline.knotIntervals[j], b[1] / spline.knotIntervals[j]];
        const scale = Math.hypot(tb[0], tb[1]);
        expect(Math.abs(ta[0] - tb[0]) / scale).toBeLessThan(1e-12);
        expect(Math.abs(ta[1] - tb[1]) / scale).toBeLessThan(1e-12);
      }
    });
  }
  it('alpha 0: the tangent at P_i is (P_{i+1} − P_{i−1})/2 [C: uniform knots, Δ = 1]', () => {
    const spline = catmullRomClosed(control, 0);
    const d = new Float64Array(4);
    splineDerivatives(spline, 2, 0, d);
    expect(d[0]).toBeCloseTo((control[6] - control[2]) / 2, 13);
    expect(d[1]).toBeCloseTo((control[7] - control[3]) / 2, 13);
  });
  it('centripetal: a collinear reversal gets a zero tangent [C: 1 − √e − (1 − e)/(1 + √e) = 0]', () => {
    // P_{i−1} = (0,0), P_i = (1,0), P_{i+1} = (0.25,0): chords 1 and e = 0.75, anti-parallel
    const spline = catmullRomClosed(new Float64Array([0, 0, 1, 0, 0.25, 0, 0.5, 3]), 0.5);
    const d = new Float64Array(4);
    splineDerivatives(spline, 1, 0, d);
    expect(Math.abs(d[0])).toBeLessThan(1e-15);
    expect(Math.abs(d[1])).toBeLessThan(1e-15);
  });
});

describe('catmullRomClosed: the centripetal property (Yuksel, Schaefer, Keyser 2011)', () => {
  // (0,0),(1,1),(1.1,1),(2.1,0): the middle segment loops once with uniform knots [C]
  const fixture = new Float64Array([0, 0, 1, 1, 1.1, 1, 2.1, 0]);
  it('uniform knots (alpha 0): the middle segment crosses itself exactly once [C]', () => {
    expect(openPolylineCrossings(sampleSegment(catmullRomClosed(fixture, 0), 1, 2000))).toBe(1);
  });
  it('centripetal and chordal: the middle segment never crosses itself [C]', () => {
    expect(openPolylineCrossings(sampleSegment(catmullRomClosed(fixture, 0.5), 1, 2000))).toBe(0);
    expect(openPolylineCrossings(sampleSegment(catmullRomClosed(fixture, 1), 1, 2000))).toBe(0);
  });
  test.prop([gridPolygon], { numRuns: 300 })('centripetal: no segment has a cusp or crosses itself', (control) => {
    expect(hasCuspOrLoop(control, 0.5)).toBe(false);
  });
  it('the same check finds loops in uniform splines (so the property can fail)', () => {
    const result = fc.check(fc.property(gridPolygon, (control) => !hasCuspOrLoop(control, 0)), { seed: 2011, numRuns: 1000 });
    expect(result.failed).toBe(true);
  });
});

describe('catmullRomClosed: accuracy on a circle and an ellipse', () => {
  // bound 0.76·θ² and floor 0.74·θ² around the measured 0.750–0.754·θ² (table in the header)
  for (const stepDeg of [2, 3, 5, 10]) {
    it(`circle, ${stepDeg}° steps: curvature within 0.76·θ² of 1/R (do Carmo 1976; bound measured here)`, () => {
      const R = 250;
      const theta = stepDeg * DEG;
      const err = maxCurvatureError(catmullRomClosed(circleControl(Math.round(360 / stepDeg), R)), R, 1000);
      expect(err).toBeLessThan(0.76 * theta * theta);
      expect(err).toBeGreaterThan(0.74 * theta * theta);
    });
  }
  it('ellipse a=2, b=1: curvature 2.0 at (±a, 0) and 0.25 at (0, ±b) [C: ab/(a² sin² t + b² cos² t)^{3/2}]', () => {
    const n = 720;
    const spline = catmullRomClosed(ellipseControl(n, 2, 1));
    const d = new Float64Array(4);
    const kappa = (seg: number, u: number) => {
      splineDerivatives(spline, seg, u, d);
      return curvatureFromDerivatives(d[0], d[1], d[2], d[3]);
    };
    // measured error at n = 720: 5.71e-4 at (±a, 0), 1.0e-10 at (0, ±b)
    for (const i of [0, n / 2]) {
      expect(Math.abs(kappa(i, 0) - 2)).toBeLessThan(6e-4);
      expect(Math.abs(kappa((i + n - 1) % n, 1) - 2)).toBeLessThan(6e-4);
    }
    for (const i of [n / 4, (3 * n) / 4]) {
      expect(Math.abs(kappa(i, 0) - 0.25)).toBeLessThan(1e-9);
    }
  });
  it('ellipse a=2, b=1: the curvature error at (a, 0) falls 4× per halving of the step (second order)', () => {
    const d = new Float64Array(4);
    const err = (n: number) => {
      splineDerivatives(catmullRomClosed(ellipseControl(n, 2, 1)), 0, 0, d);
      return Math.abs(curvatureFromDerivatives(d[0], d[1], d[2], d[3]) - 2);
    };
    // [C] 2 is the exact value; ratio 4 is the measured order (5.71e-4 → 1.43e-4 → 3.57e-5)
    expect(err(720) / err(1440)).toBeCloseTo(4, 1);
    expect(err(1440) / err(2880)).toBeCloseTo(4, 1);
  });
  it('circle with alternating chord ratio 1.1: centripetal error about r − 1 (measured here, regression)', () => {
    const r = 1.1;
    const a = (6 / (1 + r)) * DEG;
    const angles: number[] = [];
    for (let t = 0, i = 0; t < 2 * Math.PI - 1e-9; t += i++ % 2 === 0 ? a : r * a) angles.push(t);
    const c = new Float64Array(angles.flatMap((t) => [100 * Math.cos(t), 100 * Math.sin(t)]));
    // measured 9.99e-2 (alpha 0.5) and 2.12e-3 (alpha 1)
    expect(maxCurvatureError(catmullRomClosed(c, 0.5), 100, 200)).toBeCloseTo(0.0999, 3);
    expect(maxCurvatureError(catmullRomClosed(c, 1), 100, 200)).toBeLessThan(2.2e-3);
  });
});
