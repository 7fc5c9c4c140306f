import { fc, test } from '@fast-check/vitest';
import { polygon } from '@turf/helpers';
import { kinks } from '@turf/kinks';
import { describe, expect } from 'vitest';
import { findCrossings, type Crossing } from '../../../src/core/geom/crossings.js';
import { intersectionExact, isAt } from '../../helpers/exact-geometry.js';

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
