// Tests for src/core/curve/offset.ts.

import { describe, expect, it } from 'vitest';
import { catmullRomClosed } from '../../../src/core/curve/catmull-rom-closed.js';
import { leftNormals, offsetClosed } from '../../../src/core/curve/offset.js';
import { resampleClosedSpline } from '../../../src/core/curve/resample.js';
import { circleControl, closedPolylineLength, ellipseControl, ellipsePerimeter, shoelaceArea } from '../../helpers/curve-fixtures.js';

describe('leftNormals', () => {
  it('rotates each unit tangent by +90°: (tx, ty) → (−ty, tx)', () => {
    expect(Array.from(leftNormals(new Float64Array([1, 0, 0, 1, 0.6, -0.8])))).toEqual([-0, 1, -1, 0, 0.8, 0.6]);
  });
  it('writes into out and guards lengths', () => {
    const out = new Float64Array(2);
    expect(leftNormals(new Float64Array([0, -1]), out)).toBe(out);
    expect(Array.from(out)).toEqual([1, 0]);
    expect(() => leftNormals(new Float64Array(3))).toThrow(/odd length 3/);
    expect(() => leftNormals(new Float64Array(4), new Float64Array(2))).toThrow(/out has length 2, need 4/);
  });
});

describe('offsetClosed', () => {
  it('circle: the left offset lies at R − w and the right at R + w from the centre (common practice, no source)', () => {
    const R = 50;
    const w = 6;
    const curve = resampleClosedSpline(catmullRomClosed(circleControl(90, R)), 1);
    const d = new Float64Array(curve.n).fill(w);
    const left = offsetClosed(curve.points, curve.normals, d, 1);
    const right = offsetClosed(curve.points, curve.normals, d, -1);
    for (let i = 0; i < curve.n; i++) {
      const rc = Math.hypot(curve.points[2 * i], curve.points[2 * i + 1]);
      // at 4° steps the normal misses the centre by δ < 2.5e-5 rad (measured), which moves the
      // offset radius by about w·δ²·R/(2(R ∓ w)) < 1e-8 m [C]; measured 2.1e-9 m
      expect(Math.abs(Math.hypot(left[2 * i], left[2 * i + 1]) - (rc - w))).toBeLessThan(1e-8);
      expect(Math.abs(Math.hypot(right[2 * i], right[2 * i + 1]) - (rc + w))).toBeLessThan(1e-8);
    }
  });
  it('ellipse a=3, b=2, w=0.5: offset lengths L ∓ 2πw and ring area 2wL (Farouki & Neff, CAGD 7, 1990)', () => {
    const L = ellipsePerimeter(3, 2);
    const w = 0.5;
    // [C] the formulas reproduce the published values to their 6 decimals
    expect(Math.abs(L - 15.86544)).toBeLessThan(5e-7);
    expect(Math.abs(L - 2 * Math.PI * w - 12.723847)).toBeLessThan(5e-7);
    expect(Math.abs(L + 2 * Math.PI * w - 19.007032)).toBeLessThan(5e-7);
    expect(Math.abs(2 * w * L - 15.86544)).toBeLessThan(5e-7);

    const curve = resampleClosedSpline(catmullRomClosed(ellipseControl(2000, 3, 2)), 0.001);
    const d = new Float64Array(curve.n).fill(w);
    const inner = offsetClosed(curve.points, curve.normals, d, 1);
    const outer = offsetClosed(curve.points, curve.normals, d, -1);
    // the polygon through the samples loses about h²κ²L/24 of length and h²κL/12 of area
    // (h = 1 mm; measured −9.0e-8, −1.6e-7 and −5.0e-7), so 1e-6 is the budget [C]
    expect(Math.abs(closedPolylineLength(inner) - (L - 2 * Math.PI * w))).toBeLessThan(1e-6);
    expect(Math.abs(closedPolylineLength(outer) - (L + 2 * Math.PI * w))).toBeLessThan(1e-6);
    expect(Math.abs(shoelaceArea(outer) - shoelaceArea(inner) - 2 * w * L)).toBeLessThan(1e-6);
  });
  it('per-vertex distances, out reuse and guards', () => {
    const points = new Float64Array([0, 0, 10, 0]);
    const normals = new Float64Array([0, 1, 0, 1]);
    const out = new Float64Array(4);
    expect(offsetClosed(points, normals, new Float64Array([1, 2]), -1, out)).toBe(out);
    expect(Array.from(out)).toEqual([0, -1, 10, -2]);
    expect(() => offsetClosed(points, normals, new Float64Array(3), 1)).toThrow(/one distance per vertex, got 4, 4, 3/);
    expect(() => offsetClosed(points, new Float64Array(2), new Float64Array(2), 1)).toThrow(RangeError);
    expect(() => offsetClosed(points, normals, new Float64Array(2), 1, new Float64Array(3))).toThrow(/out has length 3, need 4/);
  });
});
