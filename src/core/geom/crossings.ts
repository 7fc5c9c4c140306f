// Broad phase + exact narrow phase for the any-segment-intersection problem; the O(n log n) sweep bound is
// from Shamos & Hoey, "Geometric intersection problems", FOCS 1976, and Bentley & Ottmann, IEEE Trans.
// Computers C-28 (1979) 643-647; here a uniform grid stands in for the sweep.
import { SegmentIndex, segmentCount, type PolylineInput } from '../spatial/segment-index.js';
import { orient } from './orient.js';
import { pointSegmentDistance } from './polyline.js';
import { segmentsIntersect } from './segment-intersect.js';

/** Candidate lists up to this long are sorted by insertion (quadratic, but cheaper than a sort call when short). */
const INSERTION_SORT_MAX = 16;

/** A segment named by its polyline and its index within it (segment i runs from vertex i to vertex i + 1). */
export interface SegmentRef {
  readonly polyline: number;
  readonly segment: number;
}

/** Two segments that touch or cross; `x`, `y` (metres) is an approximate common point, for messages only. */
export interface Crossing {
  readonly a: SegmentRef;
  readonly b: SegmentRef;
  readonly x: number;
  readonly y: number;
}

/**
 * Every pair of segments, within and across the given polylines, whose closed segments share a point, except
 * the shared vertex of two consecutive segments of one polyline (the last and first of a closed one count as
 * consecutive).
 *
 * Decided exactly ({@link segmentsIntersect}). Consecutive segments are still reported when they overlap
 * collinearly (the path folds back on itself). Zero-length segments (repeated vertices) are skipped over when
 * deciding which segments are consecutive, so they cause no report at their own vertex; a repeated point that
 * also lies on another part of the path is reported with every segment that touches it there.
 *
 * Pairs come ordered by (polyline, segment) of `a`, then of `b`, with `a` before `b`; the scan stops after
 * `maxResults`. Cost O(n + k) expected for n segments of similar length and k candidate pairs.
 *
 * @param polylines flat coordinates `[x0, y0, x1, y1, …]` in metres; `closed` adds the segment last → first.
 * @param maxResults stop after this many pairs (≥ 0, may be `Infinity`).
 * @throws {RangeError} when maxResults is negative or NaN, or a coordinate is not finite.
 * @example
 * // a bow tie: segments 0 and 2 cross at (1, 1)
 * findCrossings([{ coords: new Float64Array([0, 0, 2, 2, 2, 0, 0, 2]), closed: true }]);
 * // [{ a: { polyline: 0, segment: 0 }, b: { polyline: 0, segment: 2 }, x: 1, y: 1 }]
 */
export function findCrossings(polylines: readonly PolylineInput[], maxResults = 16): Crossing[] {
  if (!(maxResults >= 0)) throw new RangeError(`maxResults must be >= 0, got ${maxResults}.`);
  const index = SegmentIndex.fromPolylines(polylines);
  const n = index.numItems;
  const seg = segmentCoords(polylines, n);
  const gap = forwardGaps(polylines, seg, n);
  const firstId = new Int32Array(polylines.length + 1);
  for (let k = 0; k < polylines.length; k++) firstId[k + 1] = firstId[k] + segmentCount(polylines[k]);

  const results: Crossing[] = [];
  const candidates = new Int32Array(n);
  for (let i = 0; i < n && results.length < maxResults; i++) {
    const ax = seg[4 * i], ay = seg[4 * i + 1], bx = seg[4 * i + 2], by = seg[4 * i + 3];
    const found = index.searchInto(Math.min(ax, bx), Math.min(ay, by), Math.max(ax, bx), Math.max(ay, by), candidates);
    // keep each pair once (j > i) and in id order, so output does not depend on the grid layout
    let count = 0;
    for (let k = 0; k < found; k++) if (candidates[k] > i) candidates[count++] = candidates[k];
    // usually a handful of candidates: insertion sort in place, no view allocated per query
    if (count > INSERTION_SORT_MAX) candidates.subarray(0, count).sort();
    else {
      for (let k = 1; k < count; k++) {
        const v = candidates[k];
        let m = k - 1;
        for (; m >= 0 && candidates[m] > v; m--) candidates[m + 1] = candidates[m];
        candidates[m + 1] = v;
      }
    }
    const later = candidates;
    for (let k = 0; k < count && results.length < maxResults; k++) {
      const j = later[k];
      const cx = seg[4 * j], cy = seg[4 * j + 1], dx = seg[4 * j + 2], dy = seg[4 * j + 3];
      const p = index.polyline(i);
      let hit: boolean;
      if (p === index.polyline(j)) {
        const si = index.segment(i);
        const sj = index.segment(j);
        const m = firstId[p + 1] - firstId[p];
        const ij = sj - si <= gap[i];
        const ji = polylines[p].closed && m - (sj - si) <= gap[j];
        if (ij || ji) {
          // consecutive (maybe across repeated vertices): only a fold-back makes them meet beyond the vertex
          hit = (ij && foldsBack(ax, ay, bx, by, dx, dy)) || (ji && foldsBack(cx, cy, dx, dy, bx, by));
          if (hit) results.push(crossing(index, i, j, ij ? bx : dx, ij ? by : dy));
          continue;
        }
      }
      hit = segmentsIntersect(ax, ay, bx, by, cx, cy, dx, dy);
      if (hit) {
        const [x, y] = contactPoint(ax, ay, bx, by, cx, cy, dx, dy);
        results.push(crossing(index, i, j, x, y));
      }
    }
  }
  return results;
}

function crossing(index: SegmentIndex, i: number, j: number, x: number, y: number): Crossing {
  return {
    a: { polyline: index.polyline(i), segment: index.segment(i) },
    b: { polyline: index.polyline(j), segment: index.segment(j) },
    x,
    y,
  };
}

/**
 * Whether the path a → v → b turns back on itself: both legs non-empty, collinear, and b on the same side of
 * v as a, so the legs overlap beyond v. Exact (orient sign and coordinate comparisons).
 */
function foldsBack(ax: number, ay: number, vx: number, vy: number, bx: number, by: number): boolean {
  if ((ax === vx && ay === vy) || (bx === vx && by === vy)) return false;
  // collinear legs point the same way iff a non-zero component has the same sign in both; the signs of
  // differences are exact, so test them first and leave orient (slow on exactly collinear input) for last
  const ux = Math.sign(ax - vx);
  const uy = Math.sign(ay - vy);
  const sameWay = (ux !== 0 && ux === Math.sign(bx - vx)) || (uy !== 0 && uy === Math.sign(by - vy));
  return sameWay && orient(ax, ay, vx, vy, bx, by) === 0;
}

/** An approximate common point of two intersecting segments: the line intersection, else a touching endpoint. */
function contactPoint(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
): [number, number] {
  const ex = bx - ax, ey = by - ay, fx = dx - cx, fy = dy - cy;
  const den = ex * fy - ey * fx;
  if (den !== 0) {
    const t = Math.min(1, Math.max(0, ((cx - ax) * fy - (cy - ay) * fx) / den));
    return [ax + t * ex, ay + t * ey];
  }
  // parallel or degenerate: some endpoint lies on the other segment, take the closest one
  const options: [number, number, number][] = [
    [pointSegmentDistance(cx, cy, ax, ay, bx, by), cx, cy],
    [pointSegmentDistance(dx, dy, ax, ay, bx, by), dx, dy],
    [pointSegmentDistance(ax, ay, cx, cy, dx, dy), ax, ay],
    [pointSegmentDistance(bx, by, cx, cy, dx, dy), bx, by],
  ];
  let best = options[0];
  for (const o of options) if (o[0] < best[0]) best = o;
  return [best[1], best[2]];
}

/** Endpoints `[ax, ay, bx, by]` of every segment, in index id order. */
function segmentCoords(polylines: readonly PolylineInput[], n: number): Float64Array {
  const seg = new Float64Array(4 * n);
  let id = 0;
  for (const p of polylines) {
    const vertices = p.coords.length >> 1;
    const m = segmentCount(p);
    for (let i = 0; i < m; i++, id++) {
      const j = i + 1 === vertices ? 0 : i + 1;
      seg[4 * id] = p.coords[2 * i];
      seg[4 * id + 1] = p.coords[2 * i + 1];
      seg[4 * id + 2] = p.coords[2 * j];
      seg[4 * id + 3] = p.coords[2 * j + 1];
    }
  }
  return seg;
}

/**
 * For each segment, the number of steps forward along its polyline (cyclically if closed) to the next
 * segment of non-zero length; segments up to that many steps ahead share its end vertex exactly.
 * Saturates at the polyline's segment count when there is none.
 */
function forwardGaps(polylines: readonly PolylineInput[], seg: Float64Array, n: number): Int32Array {
  const gap = new Int32Array(n);
  let first = 0;
  for (const p of polylines) {
    const m = segmentCount(p);
    const nonZero = (s: number): boolean => {
      const o = 4 * (first + s);
      return seg[o] !== seg[o + 2] || seg[o + 1] !== seg[o + 3];
    };
    // walk backwards; a closed polyline needs two laps for the wrap-around to settle
    let run = m;
    for (let s = (p.closed ? 2 * m : m) - 1; s >= 0; s--) {
      const next = s + 1;
      const known = p.closed || next < m;
      run = known && nonZero(next % m) ? 1 : Math.min(run + 1, m);
      gap[first + (s % m)] = run;
    }
    first += m;
  }
  return gap;
}
