// Why control points ship at 1 µm (src/core/centerline/control-points.ts): the measurement.

import { describe, expect, it } from 'vitest';
import { cubicSplineClosed } from '../../../src/core/curve/cubic-spline-closed.js';
import { resampleClosedSpline } from '../../../src/core/curve/resample.js';

// points on a circle of radius r, offset and rotated so that rounding is not aligned with the axes
function roundedCircle(r: number, gapM: number, decimals: number): Float64Array {
  const n = Math.round((2 * Math.PI * r) / gapM);
  const scale = 10 ** decimals;
  const c = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const a = 0.37 + (2 * Math.PI * i) / n;
    c[2 * i] = Math.round((123.4567 + r * Math.cos(a)) * scale) / scale;
    c[2 * i + 1] = Math.round((-76.5432 + r * Math.sin(a)) * scale) / scale;
  }
  return c;
}

function worstCurvatureError(control: Float64Array, r: number): number {
  const curve = resampleClosedSpline(cubicSplineClosed(control), 0.1);
  let worst = 0;
  for (const k of curve.curvature) worst = Math.max(worst, Math.abs(k * r - 1));
  return worst;
}

describe('control point precision', () => {
  it('1 mm rounding of the points a spline interpolates moves curvature by percents; 1 µm by < 0.01%', () => {
    // radius 15 m (the default tightest corner) with 1.2 m gaps (a 4.6° turn per gap); the
    // unrounded points give the interpolation error alone (about 0.1 θ², 0.06%)
    const exact = worstCurvatureError(roundedCircle(15, 1.2, 12), 15);
    const mm = worstCurvatureError(roundedCircle(15, 1.2, 3), 15);
    const um = worstCurvatureError(roundedCircle(15, 1.2, 6), 15);
    expect(exact).toBeLessThan(0.001);
    expect(mm - exact).toBeGreaterThan(0.01);
    expect(Math.abs(um - exact)).toBeLessThan(0.0001);
  });
});
