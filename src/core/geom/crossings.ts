// Broad phase + exact narrow phase for the any-segment-intersection problem; the O(n log n) sweep bound is
// from Shamos & Hoey, "Geometric intersection problems", FOCS 1976, and Bentley & Ottmann, IEEE Trans.
// Computers C-28 (1979) 643-647; here a uniform grid stands in for the sweep.
import { SegmentIndex, segmentCount, type PolylineInput } from '../spatial/segment-index.js';
import { orient } from './orient.js';
import { pointSegmentDistance } from './polyline.js';
import { segmentsIntersect } from './segment-intersect.js';

/** Candidate lists up to this long are sorted by insertion (quadratic, but cheaper than a sort call when short). */
const INSERTION_SORT_MAX = 16;

/**
 * Pairs within cells, per segment, up to which {@link findCrossings} lists pairs by cell: tracks have about
 * 2 per segment. Beyond it the cells are crowded and the per-segment queries, which stop after `maxResults`
 * hits, are used instead of a listing that grows quadratically.
 */
const PAIRS_PER_SEGMENT_MAX = 8;

/** Entries in one cell beyond which {@link findCrossings} uses per-segment queries (tracks have about 7). */
const CELL_ITEMS_MAX = 32;

/** Segments up to which pair keys i·n + j stay exact integers in a double (n² < 2⁵³). */
const KEYED_ITEMS_MAX = 2 ** 26;

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
 * Pairs come ordered by (polyline, segment) of `a`, then of `b`, with `a` before `b`; at most `maxResults`
 * of them, the first in that order. Candidates are the pairs whose bounding boxes meet, listed once each from
 * the grid cells ({@link crossingsByCellPairs}); when the cells are crowded (many pairs per segment, or a
 * cell of many entries) one box query per segment is used instead ({@link crossingsBySegmentQueries}), which
 * can stop after `maxResults` hits. Both give the same result. Cost O(n + k) expected for n segments of
 * similar length and k candidate pairs.
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
  const pairs = new SegmentPairs(polylines, maxResults);
  const { index } = pairs;
  const n = index.numItems;
  const uncrowded = index.candidatePairCount <= PAIRS_PER_SEGMENT_MAX * n && index.maxCellItems <= CELL_ITEMS_MAX;
  return uncrowded && n <= KEYED_ITEMS_MAX ? byCellPairs(pairs, maxResults) : bySegmentQueries(pairs, maxResults);
}

/**
 * {@link findCrossings} listing candidate pairs by grid cell ({@link SegmentIndex.forEachCandidatePair}): every
 * pair whose boxes meet is tested, then the hits are sorted by segment ids and the first `maxResults` kept.
 * Same result as findCrossings; exported to test and time the two strategies. Cost O(cells + pairs within
 * cells + h log h) for h hits, whatever `maxResults`: quadratic when the cells are crowded.
 * @throws {RangeError} as findCrossings, and when there are more than 2²⁶ segments.
 */
export function crossingsByCellPairs(polylines: readonly PolylineInput[], maxResults = 16): Crossing[] {
  const pairs = new SegmentPairs(polylines, maxResults);
  if (pairs.index.numItems > KEYED_ITEMS_MAX) throw new RangeError(`More than ${KEYED_ITEMS_MAX} segments.`);
  return byCellPairs(pairs, maxResults);
}

/**
 * {@link findCrossings} with one box query per segment i, testing the later candidates j > i in id order and
 * stopping after `maxResults` hits. Same result as findCrossings; exported to test and time the two
 * strategies. Cost O(n + candidates seen before stopping), each candidate found once per cell it shares.
 * @throws {RangeError} as findCrossings.
 */
export function crossingsBySegmentQueries(polylines: readonly PolylineInput[], maxResults = 16): Crossing[] {
  return bySegmentQueries(new SegmentPairs(polylines, maxResults), maxResults);
}

/** The hits among the cell-listed candidate pairs, sorted by key i·n + j (exact for n ≤ 2²⁶), first `maxResults`. */
function byCellPairs(pairs: SegmentPairs, maxResults: number): Crossing[] {
  const { index } = pairs;
  if (maxResults === 0) return [];
  const n = index.numItems;
  const keys: number[] = [];
  index.forEachCandidatePair((i, j) => {
    if (pairs.meet(i, j)) keys.push(i * n + j);
  });
  const sorted = Float64Array.from(keys).sort();
  const results: Crossing[] = [];
  for (let k = 0; k < sorted.length && results.length < maxResults; k++) {
    const j = sorted[k] % n;
    results.push(pairs.crossing((sorted[k] - j) / n, j));
  }
  return results;
}

/** The hits among each segment's later box-query candidates, in id order, stopping after `maxResults`. */
function bySegmentQueries(pairs: SegmentPairs, maxResults: number): Crossing[] {
  const { index, seg } = pairs;
  const n = index.numItems;
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
    for (let k = 0; k < count && results.length < maxResults; k++) {
      if (pairs.meet(i, candidates[k])) results.push(pairs.crossing(i, candidates[k]));
    }
  }
  return results;
}

const NOT_CONSECUTIVE = 0;
const I_THEN_J = 1;
const J_THEN_I = 2;

/**
 * The segments of some polylines by id (polyline 0's segments first) with the exact pair test of
 * {@link findCrossings}. Construction builds the grid index: O(n).
 */
class SegmentPairs {
  readonly index: SegmentIndex;
  /** Endpoints `[ax, ay, bx, by]` of every segment, by id. */
  readonly seg: Float64Array;
  // steps forward to the next segment of non-zero length (forwardGaps), by id
  private readonly gap: Int32Array;
  // id of the first segment of each polyline, then the total
  private readonly firstId: Int32Array;
  private readonly closed: boolean[];

  /** @throws {RangeError} when maxResults is negative or NaN, or a coordinate is not finite. */
  constructor(polylines: readonly PolylineInput[], maxResults: number) {
    if (!(maxResults >= 0)) throw new RangeError(`maxResults must be >= 0, got ${maxResults}.`);
    this.index = SegmentIndex.fromPolylines(polylines);
    const n = this.index.numItems;
    this.seg = segmentCoords(polylines, n);
    this.gap = forwardGaps(polylines, this.seg, n);
    this.firstId = new Int32Array(polylines.length + 1);
    for (let k = 0; k < polylines.length; k++) this.firstId[k + 1] = this.firstId[k] + segmentCount(polylines[k]);
    this.closed = polylines.map((p) => p.closed);
  }

  /**
   * Whether segments i < j are reported: consecutive segments of one polyline (maybe across repeated
   * vertices) only when the path folds back, all others when the closed segments share a point. Exact; O(1).
   */
  meet(i: number, j: number): boolean {
    const { seg } = this;
    const ax = seg[4 * i], ay = seg[4 * i + 1], bx = seg[4 * i + 2], by = seg[4 * i + 3];
    const cx = seg[4 * j], cy = seg[4 * j + 1], dx = seg[4 * j + 2], dy = seg[4 * j + 3];
    const order = this.consecutive(i, j);
    if (order !== NOT_CONSECUTIVE) {
      return ((order & I_THEN_J) !== 0 && foldsBack(ax, ay, bx, by, dx, dy))
        || ((order & J_THEN_I) !== 0 && foldsBack(cx, cy, dx, dy, bx, by));
    }
    return segmentsIntersect(ax, ay, bx, by, cx, cy, dx, dy);
  }

  /**
   * The report for segments i < j that {@link SegmentPairs.meet}: located at the vertex they share when
   * consecutive (the end of i when j follows i), else at an approximate common point.
   */
  crossing(i: number, j: number): Crossing {
    const { index, seg } = this;
    const order = this.consecutive(i, j);
    let x: number, y: number;
    if (order !== NOT_CONSECUTIVE) {
      const o = (order & I_THEN_J) !== 0 ? 4 * i + 2 : 4 * j + 2;
      x = seg[o];
      y = seg[o + 1];
    } else {
      [x, y] = contactPoint(
        seg[4 * i], seg[4 * i + 1], seg[4 * i + 2], seg[4 * i + 3],
        seg[4 * j], seg[4 * j + 1], seg[4 * j + 2], seg[4 * j + 3],
      );
    }
    return {
      a: { polyline: index.polyline(i), segment: index.segment(i) },
      b: { polyline: index.polyline(j), segment: index.segment(j) },
      x,
      y,
    };
  }

  // for segments i < j: I_THEN_J when j follows i along one polyline with only zero-length segments between,
  // J_THEN_I when i follows j so (across the closing segment of a closed polyline); either, both or neither
  private consecutive(i: number, j: number): number {
    const { index, gap } = this;
    const p = index.polyline(i);
    if (p !== index.polyline(j)) return NOT_CONSECUTIVE;
    const steps = index.segment(j) - index.segment(i);
    const m = this.firstId[p + 1] - this.firstId[p];
    return (steps <= gap[i] ? I_THEN_J : 0) | (this.closed[p] && m - steps <= gap[j] ? J_THEN_I : 0);
  }
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
    const c = p.coords;
    const vertices = c.length >> 1;
    const m = segmentCount(p);
    for (let i = 0; i < m; i++, id++) {
      const j = i + 1 === vertices ? 0 : i + 1;
      seg[4 * id] = c[2 * i];
      seg[4 * id + 1] = c[2 * i + 1];
      seg[4 * id + 2] = c[2 * j];
      seg[4 * id + 3] = c[2 * j + 1];
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
    // walk backwards; a closed polyline needs two laps for the wrap-around to settle
    let run = m;
    for (let s = (p.closed ? 2 * m : m) - 1; s >= 0; s--) {
      const here = s < m ? s : s - m;
      // the segment after this one, or -1 past the end of an open polyline
      const next = here + 1 < m ? here + 1 : p.closed ? 0 : -1;
      const o = 4 * (first + next);
      run = next >= 0 && (seg[o] !== seg[o + 2] || seg[o + 1] !== seg[o + 3]) ? 1 : Math.min(run + 1, m);
      gap[first + here] = run;
    }
    first += m;
  }
  return gap;
}
