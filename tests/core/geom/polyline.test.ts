import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import {
  pointInPolygon,
  pointSegmentDistance,
  polylineLength,
  segmentSegmentDistance,
  signedArea,
} from '../../../src/core/geom/polyline.js';
import { segmentsIntersect } from '../../../src/core/geom/segment-intersect.js';
import { twiceAreaExact } from '../../helpers/exact-geometry.js';

const f64 = (...v: number[]) => new Float64Array(v);
const UNIT_SQUARE = f64(0, 0, 1, 0, 1, 1, 0, 1);
const EPS40 = 2 ** -40;

function regularPolygon(n: number): Float64Array {
  const c = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    c[2 * k] = Math.cos((2 * Math.PI * k) / n);
    c[2 * k + 1] = Math.sin((2 * Math.PI * k) / n);
  }
  return c;
}

function reversed(coords: Float64Array): Float64Array {
  const n = coords.length >> 1;
  const out = new Float64Array(coords.length);
  for (let k = 0; k < n; k++) out.set(coords.subarray(2 * (n - 1 - k), 2 * (n - k)), 2 * k);
  return out;
}

describe('polylineLength', () => {
  test('open and closed', () => {
    // 3-4-5 right triangle (Pythagoras)
    expect(polylineLength(f64(0, 0, 3, 4), false)).toBe(5);
    expect(polylineLength(f64(0, 0, 3, 0, 3, 4), true)).toBe(12);
    expect(polylineLength(UNIT_SQUARE, true)).toBe(4);
    expect(polylineLength(UNIT_SQUARE, false)).toBe(3);
    expect(polylineLength(f64(7, 7), true)).toBe(0);
    expect(polylineLength(f64(), false)).toBe(0);
  });

  test('regular 100-gon in the unit circle: perimeter 2N·sin(π/N) = 6.282151816 [C]', () => {
    const expected = 2 * 100 * Math.sin(Math.PI / 100);
    expect(expected).toBeCloseTo(6.282151816, 9); // value of REFERENCES.md, re-derived
    // 100 rounded sums of rounded lengths: relative error below 1e-13
    expect(Math.abs(polylineLength(regularPolygon(100), true) - expected)).toBeLessThan(1e-13 * expected);
  });

  test.prop([fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 4, maxLength: 40 }), fc.integer({ min: -20, max: 20 })])(
    'scales exactly with powers of two',
    (raw, k) => {
      const coords = Float64Array.from(raw.length % 2 ? raw.slice(1) : raw);
      const s = coords.map((v) => v * 2 ** k);
      expect(polylineLength(s, true)).toBe(polylineLength(coords, true) * 2 ** k);
    },
  );
});

describe('signedArea', () => {
  test('unit square: +1 counter-clockwise, -1 clockwise [CP]', () => {
    expect(signedArea(UNIT_SQUARE)).toBe(1);
    expect(signedArea(reversed(UNIT_SQUARE))).toBe(-1);
    // an explicit closing vertex adds nothing
    expect(signedArea(f64(0, 0, 1, 0, 1, 1, 0, 1, 0, 0))).toBe(1);
    expect(signedArea(f64(0, 0, 1, 1))).toBe(0);
  });

  test('regular 100-gon in the unit circle: area (N/2)·sin(2π/N) = 3.139525976 [C]', () => {
    const expected = 50 * Math.sin((2 * Math.PI) / 100);
    expect(expected).toBeCloseTo(3.139525976, 9);
    expect(Math.abs(signedArea(regularPolygon(100)) - expected)).toBeLessThan(1e-13 * expected);
    expect(signedArea(reversed(regularPolygon(100)))).toBeCloseTo(-expected, 13);
  });

  test('far from the origin the area stays accurate', () => {
    // the unit square moved by 1e9 m: exact inputs, area still exactly 1 (measured from the first vertex)
    expect(signedArea(UNIT_SQUARE.map((v) => v + 1e9))).toBe(1);
  });

  test.prop([fc.array(fc.integer({ min: -1000, max: 1000 }), { minLength: 6, maxLength: 40 })])(
    'equals the exact BigInt shoelace sum for integer polygons',
    (raw) => {
      const coords = Float64Array.from(raw.length % 2 ? raw.slice(1) : raw);
      // integer inputs below 2^26 keep every product and sum exact, so the result equals the exact area
      const exact = Number(twiceAreaExact(coords) >> 2148n) / 2;
      expect(signedArea(coords)).toBe(exact);
    },
  );
});

describe('pointInPolygon', () => {
  // an L-shaped, non-convex polygon (hand-drawn; expected classes checked on the sketch)
  //  (0,2)---(1,2)
  //    |       |
  //    |     (1,1)---(2,1)
  //    |               |
  //  (0,0)-----------(2,0)
  const L = f64(0, 0, 2, 0, 2, 1, 1, 1, 1, 2, 0, 2);

  test('inside, on the boundary, outside', () => {
    expect(pointInPolygon(0.5, 0.5, UNIT_SQUARE)).toBe(1);
    expect(pointInPolygon(1, 0.5, UNIT_SQUARE)).toBe(0);
    expect(pointInPolygon(1, 1, UNIT_SQUARE)).toBe(0);
    expect(pointInPolygon(1.5, 0.5, UNIT_SQUARE)).toBe(-1);
    expect(pointInPolygon(0.5, 1.5, L)).toBe(1);
    expect(pointInPolygon(1.5, 1.5, L)).toBe(-1); // the notch
    expect(pointInPolygon(1.5, 1, L)).toBe(0);
    expect(pointInPolygon(1, 1.5, L)).toBe(0);
    // a ray through a vertex at the same height must not double count
    expect(pointInPolygon(-1, 1, L)).toBe(-1);
    expect(pointInPolygon(0.5, 1, L)).toBe(1);
    expect(pointInPolygon(3, 1, L)).toBe(-1);
  });

  test('points 2^-40 off an edge are classified exactly', () => {
    expect(pointInPolygon(1 - EPS40, 0.5, UNIT_SQUARE)).toBe(1);
    expect(pointInPolygon(1 + EPS40, 0.5, UNIT_SQUARE)).toBe(-1);
    // a slanted edge from (0,0) to (3,1): the point (1.5, 0.5) lies on it
    const tri = f64(0, 0, 3, 1, 0, 1);
    expect(pointInPolygon(1.5, 0.5, tri)).toBe(0);
    expect(pointInPolygon(1.5, 0.5 + EPS40, tri)).toBe(1);
    expect(pointInPolygon(1.5, 0.5 - EPS40, tri)).toBe(-1);
  });

  test('orientation does not matter', () => {
    for (const [x, y] of [[0.5, 1.5], [1.5, 1.5], [1.5, 1], [0.5, 1], [-1, 1]]) {
      expect(pointInPolygon(x, y, reversed(L))).toBe(pointInPolygon(x, y, L));
    }
  });

  const gridPoint = fc.tuple(fc.integer({ min: -1, max: 5 }), fc.integer({ min: -1, max: 5 })).map(([x, y]) => [x / 2, y / 2]);
  test.prop([gridPoint])('matches the L shape described by inequalities, and a 90 degree rotation', ([x, y]) => {
    // the L is the union of the open boxes (0,2)x(0,1) and (0,1)x(0,2) plus their shared interior edge
    const interior = (x > 0 && x < 2 && y > 0 && y < 1) || (x > 0 && x < 1 && y > 0 && y < 2) || (x > 0 && x < 1 && y === 1);
    const closure = (x >= 0 && x <= 2 && y >= 0 && y <= 1) || (x >= 0 && x <= 1 && y >= 0 && y <= 2);
    const where = pointInPolygon(x, y, L);
    expect(where).toBe(interior ? 1 : closure ? 0 : -1);
    // unchanged by a 90 degree rotation of point and polygon together (exact)
    const rotated = new Float64Array(12);
    for (let i = 0; i < 6; i++) [rotated[2 * i], rotated[2 * i + 1]] = [-L[2 * i + 1], L[2 * i]];
    expect(pointInPolygon(-y, x, rotated)).toBe(where);
  });
});

describe('pointSegmentDistance', () => {
  test('foot inside, beyond either end, and a zero-length segment', () => {
    expect(pointSegmentDistance(1, 1, 0, 0, 2, 0)).toBe(1);
    expect(pointSegmentDistance(3, 0, 0, 0, 2, 0)).toBe(1);
    expect(pointSegmentDistance(-3, 4, 0, 0, 2, 0)).toBe(5);
    expect(pointSegmentDistance(3, 4, 0, 0, 0, 0)).toBe(5);
    expect(pointSegmentDistance(1, 0, 0, 0, 2, 0)).toBe(0);
  });

  const c = fc.double({ min: -100, max: 100, noNaN: true });
  test.prop([c, c, c, c, c, c])('no farther than either endpoint and no nearer than the line', (px, py, ax, ay, bx, by) => {
    const d = pointSegmentDistance(px, py, ax, ay, bx, by);
    // rounding bound: a few ulps of the squared coordinate scale S², divided by a length of at least 1
    const S = 1 + Math.max(Math.abs(px), Math.abs(py), Math.abs(ax), Math.abs(ay), Math.abs(bx), Math.abs(by));
    const tol = 16 * Number.EPSILON * S * S;
    expect(d).toBeLessThanOrEqual(Math.hypot(px - ax, py - ay) + tol);
    expect(d).toBeLessThanOrEqual(Math.hypot(px - bx, py - by) + tol);
    const len = Math.hypot(bx - ax, by - ay);
    if (len >= 1) {
      const lineDistance = Math.abs((bx - ax) * (py - ay) - (by - ay) * (px - ax)) / len;
      expect(d).toBeGreaterThanOrEqual(lineDistance - tol);
    }
  });
});

describe('segmentSegmentDistance', () => {
  test('fixtures', () => {
    expect(segmentSegmentDistance(0, 0, 2, 0, 0, 1, 2, 1)).toBe(1); // parallel, 1 apart
    expect(segmentSegmentDistance(0, 0, 2, 2, 0, 2, 2, 0)).toBe(0); // crossing
    expect(segmentSegmentDistance(0, 0, 1, 0, 4, 4, 5, 4)).toBe(5); // (1,0)-(4,4): 3-4-5
    expect(segmentSegmentDistance(0, 0, 2, 0, 1, EPS40, 1, 5)).toBe(EPS40); // T-junction just missing
  });

  const s = fc.integer({ min: -4, max: 4 });
  test.prop([s, s, s, s, s, s, s, s])('zero exactly when the segments intersect; symmetric bit for bit', (ax, ay, bx, by, cx, cy, dx, dy) => {
    const d = segmentSegmentDistance(ax, ay, bx, by, cx, cy, dx, dy);
    expect(d === 0).toBe(segmentsIntersect(ax, ay, bx, by, cx, cy, dx, dy));
    expect(segmentSegmentDistance(cx, cy, dx, dy, ax, ay, bx, by)).toBe(d);
    expect(segmentSegmentDistance(bx, by, ax, ay, dx, dy, cx, cy)).toBe(d);
  });
});
