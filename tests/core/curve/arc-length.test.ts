// Tests for src/core/curve/arc-length.ts. Reference lengths come from closed forms or from
// composite Simpson in tests/helpers/curve-fixtures.ts, never from the code under test.

import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import {
  buildArcLengthTable,
  locateArcLength,
  segmentArcLength,
  type SplineLocation,
} from '../../../src/core/curve/arc-length.js';
import { catmullRomClosed, splinePoint, type ClosedSpline } from '../../../src/core/curve/catmull-rom-closed.js';
import {
  circleControl,
  closedPolylineLength,
  ellipseControl,
  ellipsePerimeter,
  gridPolygon,
  simpsonArcLength,
} from '../../helpers/curve-fixtures.js';

describe('buildArcLengthTable', () => {
  it('circle: length → 2πR, error as in the catmull-rom-closed table (do Carmo 1976; bounds measured here)', () => {
    const R = 300;
    // step → relative error measured: 2° 1.86e-8, 3° 9.39e-8, 5° 7.24e-7, 10° 1.15e-5
    const cases: [number, number][] = [[2, 2e-8], [3, 1e-7], [5, 8e-7], [10, 1.2e-5]];
    for (const [stepDeg, bound] of cases) {
      const L = buildArcLengthTable(catmullRomClosed(circleControl(360 / stepDeg, R))).lengthM;
      const rel = (2 * Math.PI * R - L) / (2 * Math.PI * R);
      expect(rel).toBeGreaterThan(0); // the spline runs inside the circle between control points
      expect(rel).toBeLessThan(bound);
    }
  });
  it('ellipse a=2, b=1: perimeter near the exact 4aE(e) = 9.688448220548, closer than Ramanujan I', () => {
    const exact = ellipsePerimeter(2, 1);
    expect(exact).toBeCloseTo(9.688448220548, 12); // [C] AGM evaluation of 4aE(e)
    const ramanujan = Math.PI * (3 * 3 - Math.sqrt(7 * 5)); // [C] π(3(a+b) − √((3a+b)(a+3b)))
    expect(ramanujan).toBeCloseTo(9.688421097671, 12);
    const L = buildArcLengthTable(catmullRomClosed(ellipseControl(720, 2, 1))).lengthM;
    // measured 1.45e-9 below exact at 720 control points; Ramanujan I is 2.7e-5 below
    expect(Math.abs(L - exact)).toBeLessThan(2e-9);
    expect(Math.abs(L - exact)).toBeLessThan(Math.abs(ramanujan - exact) / 1000);
  });
  it('cumulative table: starts at 0, increases, ends at lengthM, and agrees with Simpson per segment', () => {
    const spline = catmullRomClosed(new Float64Array([0, 0, 40, -5, 70, 20, 55, 60, 10, 45, -20, 20]));
    const table = buildArcLengthTable(spline);
    expect(table.cumulative[0]).toBe(0);
    expect(table.cumulative[spline.segmentCount]).toBe(table.lengthM);
    for (let i = 0; i < spline.segmentCount; i++) {
      expect(table.cumulative[i + 1]).toBeGreaterThan(table.cumulative[i]);
      // Simpson with 512 panels on a smooth cubic: error far below 1e-9 m (common practice, no source)
      expect(Math.abs(table.segmentLengths[i] - simpsonArcLength(spline, i, 0, 1))).toBeLessThan(1e-9);
    }
  });
  it('collinear monotone segment: arc length equals the chord [C: the speed is then a quadratic, exact for 5-point Gauss–Legendre]', () => {
    // P0..P3 on the x-axis; segment 1 runs from x=1 to x=3 without turning back
    const spline = catmullRomClosed(new Float64Array([0, 0, 1, 0, 3, 0, 1.5, 0]));
    expect(segmentArcLength(spline, 1, 0, 1)).toBeCloseTo(2, 14);
    expect(buildArcLengthTable(spline).segmentLengths[1]).toBeCloseTo(2, 14);
  });
  test.prop([gridPolygon])('bounds: a closed interpolating spline is at least as long as its control polygon', (control) => {
    for (const alpha of [0, 0.5, 1]) {
      const L = buildArcLengthTable(catmullRomClosed(control, alpha)).lengthM;
      // each arc >= its chord [C]; slack for quadrature and rounding relative to ARC_REL_TOL
      expect(L).toBeGreaterThanOrEqual(closedPolylineLength(control) * (1 - 1e-12));
    }
  });
});

describe('locateArcLength', () => {
  const control = new Float64Array([0, 0, 40, -5, 70, 20, 55, 60, 10, 45, -20, 20]);
  it('the start of every segment maps to its control point (interpolating)', () => {
    const spline = catmullRomClosed(control);
    const table = buildArcLengthTable(spline);
    const loc: SplineLocation = { segment: -1, u: -1 };
    const p = new Float64Array(2);
    for (let i = 0; i < spline.segmentCount; i++) {
      locateArcLength(spline, table, table.cumulative[i], loc);
      expect(loc).toEqual({ segment: i, u: 0 });
      splinePoint(spline, loc.segment, loc.u, p);
      expect([p[0], p[1]]).toEqual([control[2 * i], control[2 * i + 1]]);
    }
  });
  it('wraps s into [0, L) and rejects non-finite s', () => {
    const spline = catmullRomClosed(control);
    const table = buildArcLengthTable(spline);
    const a = locateArcLength(spline, table, 30, { segment: 0, u: 0 });
    const b = locateArcLength(spline, table, 30 + 2 * table.lengthM, { segment: 0, u: 0 });
    const c = locateArcLength(spline, table, 30 - table.lengthM, { segment: 0, u: 0 });
    expect(b.segment).toBe(a.segment);
    expect(c.segment).toBe(a.segment);
    expect(Math.abs(b.u - a.u)).toBeLessThan(1e-12);
    expect(Math.abs(c.u - a.u)).toBeLessThan(1e-12);
    expect(() => locateArcLength(spline, table, NaN, a)).toThrow(/arc length must be finite, got NaN/);
  });
  test.prop([gridPolygon, fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), fc.constantFrom(0, 0.5, 1)])(
    'oracle: the arc length from the segment start to the located u equals the requested s (Simpson)',
    (ctrl, fraction, alpha) => {
      const spline = catmullRomClosed(ctrl, alpha);
      const table = buildArcLengthTable(spline);
      const s = fraction * table.lengthM;
      const loc = locateArcLength(spline, table, s, { segment: 0, u: 0 });
      const reached = table.cumulative[loc.segment] + convergedSimpson(spline, loc.segment, 0, loc.u);
      // 60 000 seeded runs measured at most 1.04e-11 m against the converged reference (with a
      // fixed 8192 intervals: 5.2e-8 m, the reference's own error near a cusp)
      expect(Math.abs(reached - s)).toBeLessThan(1e-9);
    },
  );
});

// composite Simpson from 8192 intervals, doubled until a doubling moves it by less than 1e-11 m
// (2^22 at most). Near a cusp of an alpha = 0 curve (speed 0.006 m per unit u) 8192 intervals
// were 5.2e-8 m off and 65 536 were 4.7e-12 m off: the error of a fixed count has no bound there.
function convergedSimpson(spline: ClosedSpline, seg: number, u0: number, u1: number): number {
  let m = 8192;
  let last = simpsonArcLength(spline, seg, u0, u1, m);
  while (m < 1 << 22) {
    m *= 2;
    const next = simpsonArcLength(spline, seg, u0, u1, m);
    if (Math.abs(next - last) < 1e-11) return next;
    last = next;
  }
  return last;
}
