// Shared fixtures and independent reference computations for the tests of src/core/curve.
// Nothing here calls the arc-length code under test: lengths come from composite Simpson.

import fc from 'fast-check';
import { splineDerivatives, type ClosedSpline } from '../../src/core/curve/catmull-rom-closed.js';

/** n control points on the circle of radius r, counter-clockwise from (r, 0). */
export function circleControl(n: number, r: number): Float64Array {
  const c = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const t = (2 * Math.PI * i) / n;
    c[2 * i] = r * Math.cos(t);
    c[2 * i + 1] = r * Math.sin(t);
  }
  return c;
}

/** n control points (a cos t, b sin t) at t = 2πi/n, counter-clockwise from (a, 0). */
export function ellipseControl(n: number, a: number, b: number): Float64Array {
  const c = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const t = (2 * Math.PI * i) / n;
    c[2 * i] = a * Math.cos(t);
    c[2 * i + 1] = b * Math.sin(t);
  }
  return c;
}

/** exact ellipse perimeter 4aE(e) by the arithmetic–geometric mean:
 *  P = 2π/M(a, b) · (a² − Σ_{n>=0} 2^{n−1} c_n²), c_0² = a² − b², c_{n+1} = (a_n − b_n)/2 */
export function ellipsePerimeter(a: number, b: number): number {
  let an = a;
  let bn = b;
  let weight = 0.5;
  let sum = weight * (a * a - b * b);
  for (let i = 0; i < 12; i++) {
    const c = 0.5 * (an - bn);
    [an, bn] = [0.5 * (an + bn), Math.sqrt(an * bn)];
    weight *= 2;
    sum += weight * c * c;
  }
  return (2 * Math.PI * (a * a - sum)) / (0.5 * (an + bn));
}

/** signed area of a closed polygon (shoelace), positive when counter-clockwise */
export function shoelaceArea(coords: Float64Array): number {
  const n = coords.length / 2;
  let twice = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) twice += coords[2 * j] * coords[2 * i + 1] - coords[2 * i] * coords[2 * j + 1];
  return twice / 2;
}

/** perimeter of a closed polygon */
export function closedPolylineLength(coords: Float64Array): number {
  const n = coords.length / 2;
  let sum = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) sum += Math.sqrt((coords[2 * i] - coords[2 * j]) ** 2 + (coords[2 * i + 1] - coords[2 * j + 1]) ** 2);
  return sum;
}

/** number of proper crossings between non-adjacent edges of an open polyline */
export function openPolylineCrossings(coords: Float64Array): number {
  const m = coords.length / 2 - 1;
  let count = 0;
  for (let i = 0; i < m; i++) {
    for (let j = i + 2; j < m; j++) {
      const ax = coords[2 * i], ay = coords[2 * i + 1], bx = coords[2 * i + 2], by = coords[2 * i + 3];
      const cx = coords[2 * j], cy = coords[2 * j + 1], dx = coords[2 * j + 2], dy = coords[2 * j + 3];
      const d1 = orient(ax, ay, bx, by, cx, cy);
      const d2 = orient(ax, ay, bx, by, dx, dy);
      const d3 = orient(cx, cy, dx, dy, ax, ay);
      const d4 = orient(cx, cy, dx, dy, bx, by);
      if (d1 * d2 < 0 && d3 * d4 < 0) count++;
    }
  }
  return count;
}

function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

/** arc length of one segment between u0 and u1 by composite Simpson with m (even) panels */
export function simpsonArcLength(spline: ClosedSpline, seg: number, u0: number, u1: number, m = 512): number {
  const d = new Float64Array(4);
  const h = (u1 - u0) / m;
  let sum = 0;
  for (let i = 0; i <= m; i++) {
    splineDerivatives(spline, seg, u0 + i * h, d);
    const w = i === 0 || i === m ? 1 : i % 2 === 1 ? 4 : 2;
    sum += w * Math.sqrt(d[0] * d[0] + d[1] * d[1]);
  }
  return (sum * h) / 3;
}

/** arc length from (seg0, u0) forward to (seg1, u1) around the closed spline, by Simpson */
export function simpsonArcBetween(spline: ClosedSpline, seg0: number, u0: number, seg1: number, u1: number): number {
  if (seg0 === seg1 && u1 >= u0) return simpsonArcLength(spline, seg0, u0, u1);
  let total = simpsonArcLength(spline, seg0, u0, 1);
  for (let s = (seg0 + 1) % spline.segmentCount; s !== seg1; s = (s + 1) % spline.segmentCount) total += simpsonArcLength(spline, s, 0, 1);
  return total + simpsonArcLength(spline, seg1, 0, u1);
}

/** true when no two consecutive points coincide and no point reverses the path exactly
 *  (previous and next chord anti-parallel: there any C¹ interpolant must stop) */
export function isProperControlPolygon(c: Float64Array): boolean {
  const n = c.length / 2;
  for (let i = 0; i < n; i++) {
    const h = (i + n - 1) % n;
    const j = (i + 1) % n;
    const ax = c[2 * i] - c[2 * h], ay = c[2 * i + 1] - c[2 * h + 1];
    const bx = c[2 * j] - c[2 * i], by = c[2 * j + 1] - c[2 * i + 1];
    if (bx === 0 && by === 0) return false;
    if (ax * by - ay * bx === 0 && ax * bx + ay * by < 0) return false;
  }
  return true;
}

/** closed control polygons of 3–10 points on the integer grid [-10, 10]², proper as above */
export const gridPolygon = fc
  .array(fc.tuple(fc.integer({ min: -10, max: 10 }), fc.integer({ min: -10, max: 10 })), { minLength: 3, maxLength: 10 })
  .map((pts) => Float64Array.from(pts.flat()))
  .filter(isProperControlPolygon);
