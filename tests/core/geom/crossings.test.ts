import { fc, test } from '@fast-check/vitest';
import { polygon } from '@turf/helpers';
import { kinks } from '@turf/kinks';
import { describe, expect } from 'vitest';
import { generateTrack } from '../../../src/core/generate.js';
import { crossingsByCellPairs, crossingsByChains, crossingsBySegmentQueries, findCrossings, type Crossing } from '../../../src/core/geom/crossings.js';
import { orient } from '../../../src/core/geom/orient.js';
import { segmentsIntersect } from '../../../src/core/geom/segment-intersect.js';
import { SegmentIndex } from '../../../src/core/spatial/segment-index.js';
import { intersectionExact, isAt } from '../../helpers/exact-geometry.js';
import { mulberry32 } from '../../helpers/mulberry32.js';

interface Poly { coords: Float64Array; closed: boolean }
type Pair = [number, number, number, number]; // polyline a, segment a, polyline b, segment b

const f64 = (...v: number[]) => new Float64Array(v);
const pairs = (cs: readonly Crossing[]): Pair[] => cs.map((c) => [c.a.polyline, c.a.segment, c.b.polyline, c.b.segment]);

function regularPolygon(n: number, step = 1): Float64Array {
  const c = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    c[2 * k] = Math.cos((2 * Math.PI * ((k * step) % n)) / n);
    c[2 * k + 1] = Math.sin((2 * Math.PI * ((k * step) % n)) / n);
  }
  return c;
}

// --- independent brute-force oracle -------------------------------------------------------------------

function segmentsOf(p: Poly): [number, number, number, number][] {
  const n = p.coords.length >> 1;
  const m = p.closed ? n : Math.max(n - 1, 0);
  const c = p.coords;
  return Array.from({ length: m }, (_, i) => {
    const j = (i + 1) % n;
    return [c[2 * i], c[2 * i + 1], c[2 * j], c[2 * j + 1]];
  });
}

const isPoint = (s: readonly number[]) => s[0] === s[2] && s[1] === s[3];

/** End vertex of segment `from` if every segment strictly between `from` and `to` (walking forward) is a point. */
function sharedVertex(segs: readonly number[][], closed: boolean, from: number, to: number): [number, number] | null {
  const m = segs.length;
  for (let k = from + 1; ; k++) {
    if (k === m) {
      if (!closed) return null;
      k = 0;
    }
    if (k === to) return [segs[from][2], segs[from][3]];
    if (!isPoint(segs[k])) return null;
  }
}

/** Every pair whose closed segments share a point other than a vertex the two legitimately share as neighbours. */
function bruteForce(polys: readonly Poly[]): Pair[] {
  const all = polys.flatMap((p, pi) => segmentsOf(p).map((s, si) => ({ s, pi, si })));
  const out: Pair[] = [];
  for (let i = 0; i < all.length; i++) {
    for (let j = i + 1; j < all.length; j++) {
      const A = all[i];
      const B = all[j];
      const hit = intersectionExact(...A.s, ...B.s);
      if (hit.kind === 'none') continue;
      const legit: [number, number][] = [];
      if (A.pi === B.pi) {
        const segs = segmentsOf(polys[A.pi]);
        const ab = sharedVertex(segs, polys[A.pi].closed, A.si, B.si);
        const ba = sharedVertex(segs, polys[A.pi].closed, B.si, A.si);
        if (ab) legit.push(ab);
        if (ba) legit.push(ba);
      }
      if (hit.kind === 'point' && legit.some(([x, y]) => isAt(hit.p, x, y))) continue;
      out.push([A.pi, A.si, B.pi, B.si]);
    }
  }
  return out;
}

// --- reference for the two candidate strategies: brute force over all pairs, as documented ---------------
// Every pair of segments is tested with segmentsIntersect, except consecutive segments of one polyline
// (only zero-length segments between them, walking forward, cyclically when closed), which are reported
// only when the path folds back at the vertex they share: both legs non-empty, collinear, pointing the same way.

/** Whether every segment strictly between `from` and `to`, walking forward, has zero length. */
function follows(segs: readonly number[][], closed: boolean, from: number, to: number): boolean {
  return sharedVertex(segs, closed, from, to) !== null;
}

/** Legs a → v and v → b fold back: both non-empty, collinear, with b on a's side of v. */
function foldBack(a: readonly number[], v: readonly number[], b: readonly number[]): boolean {
  const [ux, uy, wx, wy] = [a[0] - v[0], a[1] - v[1], b[0] - v[0], b[1] - v[1]];
  if ((ux === 0 && uy === 0) || (wx === 0 && wy === 0)) return false;
  // collinear non-zero vectors point the same way iff their components have equal signs (no product to underflow)
  return orient(a[0], a[1], v[0], v[1], b[0], b[1]) === 0 && Math.sign(ux) === Math.sign(wx) && Math.sign(uy) === Math.sign(wy);
}

/** Brute force over all pairs in (polyline, segment) order; a box check first only saves time (meeting segments have meeting boxes). */
function referencePairs(polys: readonly Poly[]): Pair[] {
  const all = polys.flatMap((p, pi) => segmentsOf(p).map((s, si) => ({ s, pi, si })));
  const boxes = all.map(({ s }) => [Math.min(s[0], s[2]), Math.min(s[1], s[3]), Math.max(s[0], s[2]), Math.max(s[1], s[3])]);
  const segsOf = polys.map(segmentsOf);
  const out: Pair[] = [];
  for (let i = 0; i < all.length; i++) {
    for (let j = i + 1; j < all.length; j++) {
      const [p, q] = [boxes[i], boxes[j]];
      if (p[0] > q[2] || q[0] > p[2] || p[1] > q[3] || q[1] > p[3]) continue;
      const A = all[i];
      const B = all[j];
      const same = A.pi === B.pi;
      const bAfterA = same && follows(segsOf[A.pi], polys[A.pi].closed, A.si, B.si);
      const aAfterB = same && follows(segsOf[A.pi], polys[A.pi].closed, B.si, A.si);
      const [a, b, c, d] = [A.s.slice(0, 2), A.s.slice(2), B.s.slice(0, 2), B.s.slice(2)];
      const hit = bAfterA || aAfterB
        ? (bAfterA && foldBack(a, b, d)) || (aAfterB && foldBack(c, d, b))
        : segmentsIntersect(...A.s, ...B.s);
      if (hit) out.push([A.pi, A.si, B.pi, B.si]);
    }
  }
  return out;
}

/** The three strategies and findCrossings give the same crossings (points included), and their pairs are the reference's. */
function expectStrategiesAgree(polys: readonly Poly[], maxResults = Infinity): void {
  const byCells = crossingsByCellPairs(polys, maxResults);
  expect(crossingsBySegmentQueries(polys, maxResults)).toEqual(byCells);
  expect(crossingsByChains(polys, maxResults, Infinity)).toEqual(byCells);
  expect(findCrossings(polys, maxResults)).toEqual(byCells);
  expect(pairs(byCells)).toEqual(referencePairs(polys).slice(0, maxResults));
}

const flat = (points: readonly (readonly [number, number])[]) => Float64Array.from(points.flat());

/** Centerline and both wall faces of a generated track, as findCrossings' validity check passes them. */
function trackPolylines(seed: number): Poly[] {
  const t = generateTrack({ seed });
  return [t.centerline.points, t.walls.left, t.walls.right].map((p) => ({ coords: flat(p), closed: true }));
}

// small integer grids make repeated points, collinear runs and touches common
const vertexList = (max: number, minLength: number) =>
  fc.array(fc.tuple(fc.integer({ min: 0, max }), fc.integer({ min: 0, max })), { minLength, maxLength: 14 }).map((vs) => Float64Array.from(vs.flat()));
const polyline = fc.record({ coords: vertexList(4, 0), closed: fc.boolean() });

describe('findCrossings', () => {
  test('regular N-gons have no crossings [C: convex polygons are simple]', () => {
    for (const n of [3, 4, 5, 7, 16, 64, 1000]) {
      expect(findCrossings([{ coords: regularPolygon(n), closed: true }], Infinity)).toEqual([]);
    }
  });

  test('pentagram {5/2}: exactly 5 crossing pairs [C: each edge crosses its two non-neighbours]', () => {
    const star = findCrossings([{ coords: regularPolygon(5, 2), closed: true }], Infinity);
    expect(pairs(star)).toEqual([[0, 0, 0, 2], [0, 0, 0, 3], [0, 1, 0, 3], [0, 1, 0, 4], [0, 2, 0, 4]]);
  });

  test('bow tie: one crossing located at the centre', () => {
    const [c, ...rest] = findCrossings([{ coords: f64(0, 0, 2, 2, 2, 0, 0, 2), closed: true }]);
    expect(rest).toEqual([]);
    expect(c).toEqual({ a: { polyline: 0, segment: 0 }, b: { polyline: 0, segment: 2 }, x: 1, y: 1 });
  });

  test('degenerate cases: fold-back, repeated vertices, explicit closing vertex, touching', () => {
    const run = (coords: Float64Array, closed: boolean) => pairs(findCrossings([{ coords, closed }], Infinity));
    // neighbours that overlap collinearly are reported at the shared vertex
    expect(findCrossings([{ coords: f64(0, 0, 2, 0, 1, 0), closed: false }])).toEqual([
      { a: { polyline: 0, segment: 0 }, b: { polyline: 0, segment: 1 }, x: 2, y: 0 },
    ]);
    expect(run(f64(0, 0, 2, 0, 3, 0), false)).toEqual([]); // straight on: only the shared vertex
    expect(run(f64(0, 0, 1, 0), true)).toEqual([[0, 0, 0, 1]]); // there and back
    expect(run(f64(0, 0, 1, 0, 1, 0, 0, 0), false)).toEqual([[0, 0, 0, 2]]); // fold-back across a repeated vertex
    // repeated vertices alone are harmless, also at the closing vertex
    expect(run(f64(0, 0, 1, 0, 1, 0, 1, 1), false)).toEqual([]);
    expect(run(f64(0, 0, 1, 0, 1, 1, 0, 0), true)).toEqual([]);
    expect(run(f64(0, 0, 1, 0, 1, 1, 1, 1, 1, 1, 0, 1), true)).toEqual([]);
    expect(run(f64(5, 5, 5, 5, 5, 5), true)).toEqual([]);
    // a vertex visited twice touches the path there: every non-neighbour pair meeting at (1,0)
    expect(run(f64(0, 0, 1, 0, 1, 1, 0, 1, 1, 0, 2, 0), false)).toEqual([[0, 0, 0, 3], [0, 0, 0, 4], [0, 1, 0, 3], [0, 1, 0, 4]]);
    // a vertex on a non-adjacent edge (T-junction)
    expect(run(f64(0, 0, 2, 0, 2, 2, 1, 0), false)).toEqual([[0, 0, 0, 2]]);
  });

  test('pairs across polylines, ordered, and maxResults stops the scan', () => {
    const square = { coords: f64(0, 0, 2, 0, 2, 2, 0, 2), closed: true };
    const line = { coords: f64(-1, 1, 3, 1), closed: false };
    expect(pairs(findCrossings([square, line]))).toEqual([[0, 1, 1, 0], [0, 3, 1, 0]]);
    expect(pairs(findCrossings([square, line], 1))).toEqual([[0, 1, 1, 0]]);
    expect(findCrossings([square, line], 0)).toEqual([]);
    expect(findCrossings([])).toEqual([]);
    expect(() => findCrossings([square], -1)).toThrow(RangeError);
  });

  test.prop([fc.array(polyline, { minLength: 1, maxLength: 3 })])('equals a brute-force O(n²) scan with exact rational intersections (oracle)', (polys) => {
    expect(pairs(findCrossings(polys, Infinity))).toEqual(bruteForce(polys));
  });

  test.prop([fc.array(polyline, { minLength: 1, maxLength: 3 }), fc.integer({ min: 1, max: 5 })])('maxResults returns a prefix of the full list', (polys, k) => {
    expect(findCrossings(polys, k)).toEqual(findCrossings(polys, Infinity).slice(0, k));
  });

  test.prop([fc.array(polyline, { minLength: 1, maxLength: 3 }), fc.oneof(fc.constant(Infinity), fc.integer({ min: 0, max: 6 }))])(
    'cell-pair listing and per-segment queries agree with each other and with the all-pairs reference (small grids)',
    (polys, k) => expectStrategiesAgree(polys, k),
  );

  // magnitudes 0 or at least 1e-9: orient's sign is exact only above about 2^-300, and the grid's cell side
  // must have a finite inverse
  const coordinate = fc.double({ min: -50, max: 50, noNaN: true }).map((v) => (Math.abs(v) < 1e-9 ? 0 : v));
  const floatPolyline = fc.record({
    coords: fc.array(coordinate, { minLength: 0, maxLength: 120 }).map((v) => Float64Array.from(v.length % 2 ? v.slice(1) : v)),
    closed: fc.boolean(),
  });
  test.prop([fc.array(floatPolyline, { minLength: 1, maxLength: 3 }), fc.oneof(fc.constant(Infinity), fc.integer({ min: 1, max: 40 }))])(
    'cell-pair listing and per-segment queries agree with the all-pairs reference on random float polygons',
    (polys, k) => expectStrategiesAgree(polys, k),
  );

  test('strategies agree on simple and self-crossing random polygons of many vertices', () => {
    const random = mulberry32(11);
    for (const n of [3, 10, 100, 400]) {
      // star-shaped around the origin (simple), then the same vertices shuffled (many crossings)
      const star = Array.from({ length: n }, (_, k): [number, number] => {
        const angle = (2 * Math.PI * (k + 0.8 * random())) / n;
        const r = 10 + 5 * random();
        return [r * Math.cos(angle), r * Math.sin(angle)];
      });
      expectStrategiesAgree([{ coords: flat(star), closed: true }]);
      expect(findCrossings([{ coords: flat(star), closed: true }], Infinity)).toEqual([]);
      const shuffled = [...star].sort(() => random() - 0.5);
      expectStrategiesAgree([{ coords: flat(shuffled), closed: true }]);
      expectStrategiesAgree([{ coords: flat(shuffled), closed: false }, { coords: flat(star), closed: true }], 16);
    }
  });

  test('strategies agree on degenerate input: collinear, touching, repeated points, all points equal', () => {
    const cases: Poly[][] = [
      [{ coords: f64(0, 0, 1, 0, 2, 0, 3, 0, 1.5, 0, 0.5, 0), closed: false }], // collinear back and forth
      [{ coords: f64(0, 0, 4, 0, 2, 0, 6, 0), closed: true }], // collinear, closed
      [{ coords: f64(0, 0, 1, 1, 2, 2, 3, 3), closed: true }], // a closed polyline on one line
      [{ coords: f64(0, 0, 2, 0, 2, 2, 1, 0, 0, 2), closed: true }], // vertex on an edge (T-junction)
      [{ coords: f64(0, 0, 1, 0, 1, 1, 0, 1, 1, 0, 2, 0), closed: false }], // a vertex visited twice
      [{ coords: f64(0, 0, 0, 0, 1, 0, 1, 0, 1, 0, 1, 1, 0, 0, 0, 0), closed: true }], // repeated vertices, closing ones too
      [{ coords: f64(0, 0, 1, 0, 1, 0, 0, 0), closed: false }], // fold-back across a repeated vertex
      [{ coords: f64(0, 0, 1, 0), closed: true }], // there and back
      [{ coords: new Float64Array(40).fill(3), closed: true }], // all points equal
      [{ coords: new Float64Array(40).fill(3), closed: false }, { coords: f64(3, 3), closed: true }, { coords: f64(0, 3, 6, 3), closed: false }],
      [{ coords: f64(0, 0, 2, 0, 2, 2, 0, 2), closed: true }, { coords: f64(2, 0, 4, 0, 4, 2, 2, 2), closed: true }], // squares sharing an edge
      [{ coords: f64(0, 0, 1e-9, 0, 1e-9, 1e-9), closed: true }, { coords: f64(1e-9, 0, 1e6, 0), closed: false }], // tiny and huge
      // a span of subnormal size (1 / cell side overflows): one cell, no hang (orientation signs of
      // subnormal coordinates underflow, so only points on one line, where they are 0 anyway)
      [{ coords: f64(-5e-324, 0, -5e-324, 5e-324, -5e-324, 5e-324, -5e-324, 5e-324), closed: true }],
      [{ coords: f64(), closed: true }, { coords: f64(1, 1), closed: false }, { coords: f64(5, 5), closed: true }],
    ];
    for (const polys of cases) for (const k of [Infinity, 1, 2]) expectStrategiesAgree(polys, k);
  });

  test('crowded cells make findCrossings use per-segment queries, with the same result', () => {
    // 60 segments through one point: one cell holds them all (past the listing's limit of a few dozen)
    const fan = Array.from({ length: 60 }, (_, k): Poly => {
      const [c, s] = [Math.cos(k / 10), Math.sin(k / 10)];
      return { coords: f64(-c, -s, c, s), closed: false };
    });
    expect(SegmentIndex.fromPolylines(fan).maxCellItems).toBeGreaterThan(32);
    for (const k of [Infinity, 16, 1]) expectStrategiesAgree(fan, k);
    expect(findCrossings(fan, Infinity).length).toBe((60 * 59) / 2);
    // 60 one-segment chains whose boxes all meet: 1770 chain pairs, past the merge's budget without the per-segment part
    expect(crossingsByChains(fan, Infinity, 0)).toBeUndefined();
  });

  // generated tracks (about 4500 segments each) are the hot case: no crossings as generated; moving a few
  // vertices makes touches, self-crossings, wall-over-centerline crossings and repeated points
  test('strategies agree with the all-pairs reference on generated tracks, as generated and perturbed', () => {
    for (const seed of [1, 2, 3]) {
      const polys = trackPolylines(seed);
      expect(findCrossings(polys, Infinity)).toEqual([]);
      expectStrategiesAgree(polys);

      const [center, left, right] = polys.map((p) => p.coords.slice());
      const n = center.length >> 1;
      const at = (c: Float64Array, k: number) => [c[2 * k], c[2 * k + 1]];
      const put = (c: Float64Array, k: number, [x, y]: number[]) => void ((c[2 * k] = x), (c[2 * k + 1] = y));
      const k = 100 * seed;
      put(center, k, at(left, k)); // the centerline touches the left wall at a vertex
      put(left, k + 300, at(left, k + 302)); // the left wall jumps ahead and back: a self-crossing
      put(left, k + 500, at(left, k + 501)); // a repeated vertex, harmless on its own
      for (let m = k + 700; m < k + 740; m++) put(right, m % n, at(left, m % n)); // the right wall over the left
      put(right, (k + 900) % n, at(center, (k + 950) % n)); // a long spike across the road
      const perturbed: Poly[] = [center, left, right].map((coords) => ({ coords, closed: true }));
      const all = findCrossings(perturbed, Infinity);
      expect(all.length).toBeGreaterThan(40);
      for (const max of [Infinity, 40, 16, 1]) expectStrategiesAgree(perturbed, max);
    }
  });

  // @turf/kinks reports points, not pairs. It skips index-adjacent segments (i, i+1 and the closing pair),
  // reports nothing for parallel or zero-length segments (zero denominator), and otherwise reports the
  // point of every pair that meets, touches included. Where both speak about the same pairs -- not
  // index-adjacent, both non-degenerate and not parallel -- the point sets must agree. The one difference
  // inside that set is deliberate: segments that are neighbours across a repeated vertex share that vertex
  // legitimately here, while turf reports it.
  test.prop([fc.oneof(vertexList(6, 3), vertexList(1000, 3))])('agrees with @turf/kinks where their conventions agree', (coords) => {
    const n = coords.length >> 1;
    const ring = Array.from({ length: n + 1 }, (_, k) => [coords[2 * (k % n)], coords[2 * (k % n) + 1]]);
    const turfPoints = kinks(polygon([ring])).features.map((f) => f.geometry.coordinates as [number, number]);

    const segs = segmentsOf({ coords, closed: true });
    const inTurfDomain = (i: number, j: number) => {
      const [a, b] = [segs[i], segs[j]];
      const den = (a[2] - a[0]) * (b[3] - b[1]) - (a[3] - a[1]) * (b[2] - b[0]);
      return j - i !== 1 && !(i === 0 && j === n - 1) && den !== 0;
    };
    const expected: [number, number][] = [];
    for (const c of findCrossings([{ coords, closed: true }], Infinity)) {
      if (inTurfDomain(c.a.segment, c.b.segment)) expected.push([c.x, c.y]);
    }
    for (let i = 0; i < n; i++) {
      for (let j = i + 1; j < n; j++) {
        const v = sharedVertex(segs, true, i, j) ?? sharedVertex(segs, true, j, i);
        if (v && inTurfDomain(i, j)) expected.push(v);
      }
    }
    expect(turfPoints.length).toBe(expected.length);
    // both evaluate the same line-intersection formula in doubles on coordinates ≤ 1000: equal within
    // a few hundred ulps of 1000
    const unmatched = [...expected];
    for (const [x, y] of turfPoints) {
      const k = unmatched.findIndex(([ex, ey]) => Math.abs(ex - x) <= 1e-10 && Math.abs(ey - y) <= 1e-10);
      expect(k).toBeGreaterThanOrEqual(0);
      unmatched.splice(k, 1);
    }
  });
});
