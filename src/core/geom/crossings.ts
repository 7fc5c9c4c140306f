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

/**
 * Chain pairs and segment pairs examined per segment up to which {@link findCrossings} merges monotone chains:
 * tracks need about 3. Beyond it the chains are short or tangled and the grid is used instead.
 */
const CHAIN_STEPS_PER_SEGMENT = 16;

/** Work {@link findCrossings} allows the chains beyond the per-segment budget, for inputs of few segments. */
const CHAIN_STEPS_MIN = 256;

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
  const n = pairs.n;
  const viaChains = n <= KEYED_ITEMS_MAX ? byChains(pairs, maxResults, CHAIN_STEPS_PER_SEGMENT) : undefined;
  if (viaChains) return viaChains;
  const { index } = pairs;
  const uncrowded = index.candidatePairCount <= PAIRS_PER_SEGMENT_MAX * n && index.maxCellItems <= CELL_ITEMS_MAX;
  return uncrowded && n <= KEYED_ITEMS_MAX ? byCellPairs(pairs, maxResults) : bySegmentQueries(pairs, maxResults);
}

/**
 * {@link findCrossings} by monotone chains: every pair of segments in different chains whose boxes meet is
 * tested, then the hits are sorted by segment ids and the first `maxResults` kept. Same result as
 * findCrossings, or `undefined` when more than `stepsPerSegment` · n + {@link CHAIN_STEPS_MIN} chain pairs
 * and segment pairs would be examined; exported to test and time the strategies. Cost O(n + c log c +
 * examined pairs + h log h) for c chains and h hits.
 * @param stepsPerSegment work allowed per segment before giving up (may be `Infinity`).
 * @throws {RangeError} as findCrossings, and when there are more than 2²⁶ segments.
 */
export function crossingsByChains(
  polylines: readonly PolylineInput[], maxResults = 16, stepsPerSegment = CHAIN_STEPS_PER_SEGMENT,
): Crossing[] | undefined {
  const pairs = new SegmentPairs(polylines, maxResults);
  if (pairs.n > KEYED_ITEMS_MAX) throw new RangeError(`More than ${KEYED_ITEMS_MAX} segments.`);
  return byChains(pairs, maxResults, stepsPerSegment);
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
  return firstByKey(pairs, keys, maxResults);
}

/** The crossings of the pairs with keys i·n + j (i < j, any order), sorted by key, first `maxResults`. */
function firstByKey(pairs: SegmentPairs, keys: readonly number[], maxResults: number): Crossing[] {
  const n = pairs.n;
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

/**
 * The hits among pairs of segments in different monotone chains whose boxes meet, sorted by key; `undefined`
 * once more than `stepsPerSegment` · n + CHAIN_STEPS_MIN chain pairs and segment pairs have been examined.
 *
 * A chain is a run of segments of one polyline whose coordinate differences all have the same signs, not
 * both zero (a zero-length segment is a chain of its own). Its vertices are monotone in x and in y, strictly
 * in at least one, so two segments of one chain never meet except neighbours at their shared vertex, which
 * do not fold back: no pair within a chain is reported. Its box is spanned by its first and last vertex.
 * Chain pairs whose boxes meet come from a sort by min x; the segments of two chains are merged along an axis
 * in which both are monotone, each segment paired with the run of the other chain's segments that overlap it
 * on that axis, then tested on the other axis and exactly. Signs and comparisons are exact, so no pair whose
 * boxes meet is missed.
 */
function byChains(pairs: SegmentPairs, maxResults: number, stepsPerSegment: number): Crossing[] | undefined {
  if (maxResults === 0) return [];
  const { n, seg, firstId } = pairs;
  // chain starts by id, then n; per chain its signs of dx and dy
  const start: number[] = [];
  const sx: number[] = [];
  const sy: number[] = [];
  for (let k = 0; k + 1 < firstId.length; k++) {
    let dirX = 0, dirY = 0;
    for (let id = firstId[k]; id < firstId[k + 1]; id++) {
      const ax = seg[4 * id], ay = seg[4 * id + 1], bx = seg[4 * id + 2], by = seg[4 * id + 3];
      const x = bx > ax ? 1 : bx < ax ? -1 : 0;
      const y = by > ay ? 1 : by < ay ? -1 : 0;
      if (id === firstId[k] || x !== dirX || y !== dirY || (x === 0 && y === 0)) {
        start.push(id);
        sx.push(x);
        sy.push(y);
        dirX = x;
        dirY = y;
      }
    }
  }
  const chains = sx.length;
  start.push(n);
  const box = new Float64Array(4 * chains);
  for (let c = 0; c < chains; c++) {
    const f = 4 * start[c], l = 4 * (start[c + 1] - 1);
    box[4 * c] = Math.min(seg[f], seg[l + 2]);
    box[4 * c + 1] = Math.min(seg[f + 1], seg[l + 3]);
    box[4 * c + 2] = Math.max(seg[f], seg[l + 2]);
    box[4 * c + 3] = Math.max(seg[f + 1], seg[l + 3]);
  }
  const order = Array.from({ length: chains }, (_, c) => c).sort((a, b) => box[4 * a] - box[4 * b]);
  const keys: number[] = [];
  let budget = stepsPerSegment * n + CHAIN_STEPS_MIN;
  for (let u = 0; u < chains; u++) {
    const a = order[u];
    for (let v = u + 1; v < chains; v++) {
      const b = order[v];
      if (box[4 * b] > box[4 * a + 2]) break;
      if (--budget < 0) return undefined;
      if (box[4 * b + 1] > box[4 * a + 3] || box[4 * b + 3] < box[4 * a + 1]) continue;
      // merge along x when both are monotone in it and not both constant, else along y; a chain constant in
      // x with one constant in y merges along x too (each of its segments overlaps one or two of the other's)
      const alongX = (sx[a] !== 0 && sx[b] !== 0) || !(sy[a] !== 0 && sy[b] !== 0);
      budget = alongX
        ? mergeChains(pairs, start[a], start[a + 1], sx[a], start[b], start[b + 1], sx[b], 0, box, a, b, keys, budget)
        : mergeChains(pairs, start[a], start[a + 1], sy[a], start[b], start[b + 1], sy[b], 1, box, a, b, keys, budget);
      if (budget < 0) return undefined;
    }
  }
  return firstByKey(pairs, keys, maxResults);
}

/**
 * Test the segment pairs of chains a (ids fa … ea − 1, sign sa on axis o) and b whose boxes meet, pushing the
 * keys of those that {@link SegmentPairs.meet}; returns the budget left (negative when it ran out).
 */
function mergeChains(
  pairs: SegmentPairs, fa: number, ea: number, sa: number, fb: number, eb: number, sb: number,
  o: number, box: Float64Array, a: number, b: number, keys: number[], budget: number,
): number {
  const { seg, n } = pairs;
  const w = 1 - o;
  // walk each chain so that its coordinate on axis o does not decrease: lo and hi are then the start and end
  // coordinates (offsets into seg) of each segment's interval, both non-decreasing along the walk
  const la = ea - fa, lb = eb - fb;
  const baseA = sa < 0 ? ea - 1 : fa, stepA = sa < 0 ? -1 : 1;
  const baseB = sb < 0 ? eb - 1 : fb, stepB = sb < 0 ? -1 : 1;
  const loA = sa < 0 ? o + 2 : o, hiA = sa < 0 ? o : o + 2;
  const loB = sb < 0 ? o + 2 : o, hiB = sb < 0 ? o : o + 2;
  // the common range of the two chains on axis o
  const lo = Math.max(box[4 * a + o], box[4 * b + o]);
  const hi = Math.min(box[4 * a + 2 + o], box[4 * b + 2 + o]);
  let p = firstReaching(seg, baseA, stepA, hiA, la, lo);
  let q0 = firstReaching(seg, baseB, stepB, hiB, lb, lo);
  for (; p < la; p++) {
    const i = baseA + stepA * p;
    const iLo = seg[4 * i + loA];
    if (iLo > hi) break;
    const iHi = seg[4 * i + hiA];
    const i0 = seg[4 * i + w], i1 = seg[4 * i + 2 + w];
    const iMin = Math.min(i0, i1), iMax = Math.max(i0, i1);
    while (q0 < lb && seg[4 * (baseB + stepB * q0) + hiB] < iLo) q0++;
    budget--;
    for (let q = q0; q < lb; q++) {
      const j = baseB + stepB * q;
      if (seg[4 * j + loB] > iHi) break;
      budget--;
      const j0 = seg[4 * j + w], j1 = seg[4 * j + 2 + w];
      if ((j0 < iMin && j1 < iMin) || (j0 > iMax && j1 > iMax)) continue;
      if (i < j ? pairs.meet(i, j) : pairs.meet(j, i)) keys.push(i < j ? i * n + j : j * n + i);
    }
    if (budget < 0) return budget;
  }
  return budget;
}

/** The first position 0 … count − 1 along a chain walk whose interval end (offset hi) reaches x; count if none. */
function firstReaching(seg: Float64Array, base: number, step: number, hi: number, count: number, x: number): number {
  let lo = 0, up = count;
  while (lo < up) {
    const mid = (lo + up) >> 1;
    if (seg[4 * (base + step * mid) + hi] < x) lo = mid + 1;
    else up = mid;
  }
  return lo;
}

const NOT_CONSECUTIVE = 0;
const I_THEN_J = 1;
const J_THEN_I = 2;

/**
 * The segments of some polylines by id (polyline 0's segments first) with the exact pair test of
 * {@link findCrossings}. Construction copies the endpoints, O(n); the grid index and the zero-length runs
 * are built on first use.
 */
class SegmentPairs {
  /** Number of segments. */
  readonly n: number;
  /** Endpoints `[ax, ay, bx, by]` of every segment, by id. */
  readonly seg: Float64Array;
  /** Polyline of each segment, and its index within the polyline, by id. */
  readonly polylineOf: Int32Array;
  readonly segmentOf: Int32Array;
  /** Id of the first segment of each polyline, then the total. */
  readonly firstId: Int32Array;
  private readonly polylines: readonly PolylineInput[];
  private readonly closed: boolean[];
  private grid: SegmentIndex | undefined;
  // steps forward to the next segment of non-zero length (forwardGaps), by id
  private gaps: Int32Array | undefined;

  /** @throws {RangeError} when maxResults is negative or NaN, or a coordinate is not finite. */
  constructor(polylines: readonly PolylineInput[], maxResults: number) {
    if (!(maxResults >= 0)) throw new RangeError(`maxResults must be >= 0, got ${maxResults}.`);
    this.polylines = polylines;
    this.firstId = new Int32Array(polylines.length + 1);
    for (let k = 0; k < polylines.length; k++) this.firstId[k + 1] = this.firstId[k] + segmentCount(polylines[k]);
    this.n = this.firstId[polylines.length];
    this.seg = new Float64Array(4 * this.n);
    this.polylineOf = new Int32Array(this.n);
    this.segmentOf = new Int32Array(this.n);
    copySegments(polylines, this.seg, this.polylineOf, this.segmentOf);
    this.closed = polylines.map((p) => p.closed);
  }

  /** The grid index over the segments (same ids), built on first use. */
  get index(): SegmentIndex {
    return (this.grid ??= SegmentIndex.fromPolylines(this.polylines));
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
    const { seg } = this;
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
      a: { polyline: this.polylineOf[i], segment: this.segmentOf[i] },
      b: { polyline: this.polylineOf[j], segment: this.segmentOf[j] },
      x,
      y,
    };
  }

  // for segments i < j: I_THEN_J when j follows i along one polyline with only zero-length segments between,
  // J_THEN_I when i follows j so (across the closing segment of a closed polyline); either, both or neither
  private consecutive(i: number, j: number): number {
    const p = this.polylineOf[i];
    if (p !== this.polylineOf[j]) return NOT_CONSECUTIVE;
    const steps = this.segmentOf[j] - this.segmentOf[i];
    const m = this.firstId[p + 1] - this.firstId[p];
    return (this.within(i, steps) ? I_THEN_J : 0) | (this.closed[p] && this.within(j, m - steps) ? J_THEN_I : 0);
  }

  // whether the segments strictly between segment `id` and the one `steps` ahead of it along the polyline
  // (cyclically) all have zero length; one step, or a next segment of non-zero length, needs no run lengths
  private within(id: number, steps: number): boolean {
    if (steps === 1) return true;
    const p = this.polylineOf[id];
    const next = this.segmentOf[id] + 1 < this.firstId[p + 1] - this.firstId[p] ? id + 1 : this.firstId[p];
    const { seg } = this;
    if (seg[4 * next] !== seg[4 * next + 2] || seg[4 * next + 1] !== seg[4 * next + 3]) return false;
    return steps <= (this.gaps ??= forwardGaps(this.polylines, seg, this.n))[id];
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

/**
 * Copy the endpoints `[ax, ay, bx, by]` of every segment into `seg`, with its polyline and index within it,
 * in index id order; checks the coordinates as {@link SegmentIndex} does, with the same errors.
 * @throws {RangeError} on a non-finite coordinate, or when the coordinate span overflows a double.
 */
function copySegments(polylines: readonly PolylineInput[], seg: Float64Array, polylineOf: Int32Array, segmentOf: Int32Array): void {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  let id = 0;
  for (let k = 0; k < polylines.length; k++) {
    const p = polylines[k];
    const c = p.coords;
    const vertices = c.length >> 1;
    const m = segmentCount(p);
    for (let i = 0; i < m; i++, id++) {
      const j = i + 1 === vertices ? 0 : i + 1;
      const ax = c[2 * i], ay = c[2 * i + 1], bx = c[2 * j], by = c[2 * j + 1];
      if (!Number.isFinite(ax + ay + bx + by)) {
        throw new RangeError(`Segment ${id} has a non-finite coordinate: (${ax}, ${ay})-(${bx}, ${by}).`);
      }
      seg[4 * id] = ax;
      seg[4 * id + 1] = ay;
      seg[4 * id + 2] = bx;
      seg[4 * id + 3] = by;
      polylineOf[id] = k;
      segmentOf[id] = i;
      if (ax < minX) minX = ax;
      if (ax > maxX) maxX = ax;
      if (bx < minX) minX = bx;
      if (bx > maxX) maxX = bx;
      if (ay < minY) minY = ay;
      if (ay > maxY) maxY = ay;
      if (by < minY) minY = by;
      if (by > maxY) maxY = by;
    }
  }
  const w = maxX - minX;
  const h = maxY - minY;
  if (id > 0 && (!Number.isFinite(w) || !Number.isFinite(h))) {
    throw new RangeError(`Coordinate span ${w} x ${h} overflows - translate or scale the input.`);
  }
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
