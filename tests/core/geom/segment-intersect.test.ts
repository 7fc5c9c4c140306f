import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { segmentsCross, segmentsIntersect } from '../../../src/core/geom/segment-intersect.js';
import { intersectionExact } from '../../helpers/exact-geometry.js';

type Seg = [number, number, number, number, number, number, number, number];
const EPS40 = 2 ** -40; // near-parallel offset from STYLE.md's degenerate-case list

// small integers make touching, collinear and coincident cases common
const small = fc.integer({ min: -3, max: 3 });
// dyadic values k / 1024: scaling by powers of two and rotating stay exact
const dyadic = fc.integer({ min: -(2 ** 20), max: 2 ** 20 }).map((k) => k / 1024);
const segs = (c: fc.Arbitrary<number>) => fc.tuple(c, c, c, c, c, c, c, c) as fc.Arbitrary<Seg>;
const anySegs = fc.oneof(segs(small), segs(dyadic));

describe('segmentsIntersect', () => {
  // expected values: hand-checked sketches of each configuration (common practice, no source)
  test('degenerate fixtures', () => {
    expect(segmentsIntersect(0, 0, 2, 2, 0, 2, 2, 0)).toBe(true); // X crossing
    expect(segmentsIntersect(0, 0, 1, 0, 1, 0, 2, 5)).toBe(true); // shared endpoint
    expect(segmentsIntersect(0, 0, 2, 0, 1, 0, 1, 5)).toBe(true); // T-junction
    expect(segmentsIntersect(0, 0, 2, 0, 1, 0, 3, 0)).toBe(true); // collinear overlap
    expect(segmentsIntersect(0, 0, 4, 0, 1, 0, 2, 0)).toBe(true); // collinear containment
    expect(segmentsIntersect(0, 0, 1, 0, 2, 0, 3, 0)).toBe(false); // collinear, apart
    expect(segmentsIntersect(0, 0, 1, 0, 1, 0, 1, 0)).toBe(true); // point on endpoint
    expect(segmentsIntersect(0, 0, 2, 2, 1, 1, 1, 1)).toBe(true); // point inside
    expect(segmentsIntersect(0, 0, 2, 2, 1, 1 + EPS40, 1, 1 + EPS40)).toBe(false); // point just off
    expect(segmentsIntersect(3, 3, 3, 3, 3, 3, 3, 3)).toBe(true); // coincident points
    expect(segmentsIntersect(3, 3, 3, 3, 3, 4, 3, 4)).toBe(false); // distinct points
    expect(segmentsIntersect(0, 0, 1, 0, 0, 1, 1, 1)).toBe(false); // parallel
  });

  test('near-parallel segments offset by 2^-40', () => {
    // parallel and 2^-40 apart: no contact
    expect(segmentsIntersect(0, 0, 1, 1, 0, EPS40, 1, 1 + EPS40)).toBe(false);
    // tilted by 2^-40 at each end: they cross at x = 1/2
    expect(segmentsIntersect(0, 0, 1, 1, 0, EPS40, 1, 1 - EPS40)).toBe(true);
    expect(segmentsCross(0, 0, 1, 1, 0, EPS40, 1, 1 - EPS40)).toBe(true);
    // the second segment ends 2^-40 short of the first: apart
    expect(segmentsIntersect(0, 0, 1, 1, 0.5 + EPS40, 0.5 - EPS40, 1, 0)).toBe(false);
    // ... and exactly on it: a touch, not a crossing
    expect(segmentsIntersect(0, 0, 1, 1, 0.5, 0.5, 1, 0)).toBe(true);
    expect(segmentsCross(0, 0, 1, 1, 0.5, 0.5, 1, 0)).toBe(false);
  });

  test.prop([fc.oneof(segs(small), segs(dyadic), segs(fc.double({ min: -1e3, max: 1e3, noNaN: true }).map((x) => (Math.abs(x) < 2 ** -300 ? 0 : x))))])(
    'agrees with exact rational intersection (oracle)',
    (s) => {
      expect(segmentsIntersect(...s)).toBe(intersectionExact(...s).kind !== 'none');
    },
  );

  test.prop([anySegs])('symmetric in segment order and endpoint order', ([ax, ay, bx, by, cx, cy, dx, dy]) => {
    const r = segmentsIntersect(ax, ay, bx, by, cx, cy, dx, dy);
    expect(segmentsIntersect(cx, cy, dx, dy, ax, ay, bx, by)).toBe(r);
    expect(segmentsIntersect(bx, by, ax, ay, cx, cy, dx, dy)).toBe(r);
    expect(segmentsIntersect(ax, ay, bx, by, dx, dy, cx, cy)).toBe(r);
    expect(segmentsIntersect(bx, by, ax, ay, dx, dy, cx, cy)).toBe(r);
  });

  test.prop([anySegs])('unchanged by 90 degree rotation (swap and negate, exact)', ([ax, ay, bx, by, cx, cy, dx, dy]) => {
    const r = segmentsIntersect(ax, ay, bx, by, cx, cy, dx, dy);
    expect(segmentsIntersect(-ay, ax, -by, bx, -cy, cx, -dy, dx)).toBe(r);
    expect(segmentsCross(-ay, ax, -by, bx, -cy, cx, -dy, dx)).toBe(segmentsCross(ax, ay, bx, by, cx, cy, dx, dy));
  });

  test.prop([anySegs, fc.integer({ min: -40, max: 40 })])('unchanged by scaling with a power of two', (s, k) => {
    const f = 2 ** k;
    const t = s.map((v) => v * f) as Seg;
    expect(segmentsIntersect(...t)).toBe(segmentsIntersect(...s));
    expect(segmentsCross(...t)).toBe(segmentsCross(...s));
  });

  test.prop([segs(small), fc.integer({ min: -(2 ** 40), max: 2 ** 40 }), fc.integer({ min: -(2 ** 40), max: 2 ** 40 })])(
    'unchanged by integer shifts of integer coordinates',
    (s, sx, sy) => {
      const t = s.map((v, i) => v + (i % 2 ? sy : sx)) as Seg;
      expect(segmentsIntersect(...t)).toBe(segmentsIntersect(...s));
      expect(segmentsCross(...t)).toBe(segmentsCross(...s));
    },
  );
});

describe('segmentsCross', () => {
  test('touching, overlapping and zero-length configurations do not cross', () => {
    expect(segmentsCross(0, 0, 2, 2, 0, 2, 2, 0)).toBe(true);
    expect(segmentsCross(0, 0, 1, 0, 1, 0, 2, 5)).toBe(false);
    expect(segmentsCross(0, 0, 2, 0, 1, 0, 1, 5)).toBe(false);
    expect(segmentsCross(0, 0, 2, 0, 1, 0, 3, 0)).toBe(false);
    expect(segmentsCross(0, 0, 2, 2, 1, 1, 1, 1)).toBe(false);
  });

  test.prop([anySegs])('crossing means a single interior point of both (oracle) and implies intersecting', (s) => {
    const [ax, ay, bx, by, cx, cy, dx, dy] = s;
    const exact = intersectionExact(...s);
    // a proper crossing: one point, both segments non-degenerate, and no endpoint lies on the other segment
    const touchesAtEndpoint =
      intersectionExact(ax, ay, ax, ay, cx, cy, dx, dy).kind !== 'none' ||
      intersectionExact(bx, by, bx, by, cx, cy, dx, dy).kind !== 'none' ||
      intersectionExact(cx, cy, cx, cy, ax, ay, bx, by).kind !== 'none' ||
      intersectionExact(dx, dy, dx, dy, ax, ay, bx, by).kind !== 'none';
    const expected = exact.kind === 'point' && !touchesAtEndpoint;
    expect(segmentsCross(...s)).toBe(expected);
    if (segmentsCross(...s)) expect(segmentsIntersect(...s)).toBe(true);
  });
});
