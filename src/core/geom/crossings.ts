// Broad phase + exact narrow phase for the any-segment-intersection problem; the O(n log n) sweep bound is
// from Shamos & Hoey, "Geometric intersection problems", FOCS 1976, and Bentley & Ottmann, IEEE Trans.
// Computers C-28 (1979) 643-647; here monotone chains merged pairwise (a uniform grid when they are too
// many or too tangled) stand in for the sweep.
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
 * of them, the first in that order. Candidates are the pairs whose bounding boxes meet, across monotone chains
 * (runs of segments that cannot meet one another; {@link crossingsByChains}), found by merging each pair of
 * chains whose boxes meet. When that takes more than a few steps per segment (short or tangled chains) they
 * are listed once each from grid cells instead ({@link crossingsByCellPairs}), and when the cells are
 * crowded too (many pairs per segment, or a cell of many entries) one box query per segment is used
 * ({@link crossingsBySegmentQueries}), which can stop after `maxResults` hits. All give the same result.
 * Cost O(n + c log c + k) for n segments in c chains and k candidate pairs; a smooth closed curve has a few
 * chains per turn.
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
 * both zero (a zero-length segment, and the closing segment of a closed polyline, are chains of their own).
 * Its vertices are monotone in x and in y, strictly in at least one, so two segments of one chain never meet
 * except neighbours at their shared vertex, which do not fold back: no pair within a chain is reported. Its
 * box is spanned by its first and last vertex. Chain pairs whose boxes meet come from a sort by min x; each
 * chain is cut to the segments that meet the common box, and the two are merged along an axis in which both
 * are monotone, each segment paired with the run of the other chain's segments that overlap it on that axis,
 * then tested on the other axis and exactly. Signs and comparisons are exact, so no pair whose boxes meet is
 * missed.
 */
function byChains(pairs: SegmentPairs, maxResults: number, stepsPerSegment: number): Crossing[] | undefined {
  if (maxResults === 0) return [];
  const { n, firstId, polylines } = pairs;
  // per chain: its vertices (coordinates, first vertex), the id of its first segment, its length, its signs
  const vertices: Float64Array[] = [];
  const first: number[] = [];
  const id0: number[] = [];
  const len: number[] = [];
  const sx: number[] = [];
  const sy: number[] = [];
  for (let k = 0; k < polylines.length; k++) {
    const c = polylines[k].coords;
    const m = segmentCount(polylines[k]);
    // the closing segment ends at vertex 0: a chain of its own, on a copy of its two vertices
    const open = polylines[k].closed && m > 0 ? m - 1 : m;
    let dirX = 0, dirY = 0;
    for (let i = 0; i < open; i++) {
      const ax = c[2 * i], ay = c[2 * i + 1], bx = c[2 * i + 2], by = c[2 * i + 3];
      const x = bx > ax ? 1 : bx < ax ? -1 : 0;
      const y = by > ay ? 1 : by < ay ? -1 : 0;
      if (i > 0 && x === dirX && y === dirY && (x !== 0 || y !== 0)) {
        len[len.length - 1]++;
        continue;
      }
      vertices.push(c);
      first.push(i);
      id0.push(firstId[k] + i);
      len.push(1);
      sx.push(x);
      sy.push(y);
      dirX = x;
      dirY = y;
    }
    if (open < m) {
      const ax = c[2 * open], ay = c[2 * open + 1], bx = c[0], by = c[1];
      vertices.push(Float64Array.of(ax, ay, bx, by));
      first.push(0);
      id0.push(firstId[k] + open);
      len.push(1);
      sx.push(bx > ax ? 1 : bx < ax ? -1 : 0);
      sy.push(by > ay ? 1 : by < ay ? -1 : 0);
    }
  }
  const chains = len.length;
  const box = new Float64Array(4 * chains);
  for (let c = 0; c < chains; c++) {
    const v = vertices[c], f = 2 * first[c], l = 2 * (first[c] + len[c]);
    box[4 * c] = Math.min(v[f], v[l]);
    box[4 * c + 1] = Math.min(v[f + 1], v[l + 1]);
    box[4 * c + 2] = Math.max(v[f], v[l]);
    box[4 * c + 3] = Math.max(v[f + 1], v[l + 1]);
  }
  const order = Array.from({ length: chains }, (_, c) => c).sort((a, b) => box[4 * a] - box[4 * b]);
  const keys: number[] = [];
  const A = new ChainWalk(), B = new ChainWalk();
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
      const o = (sx[a] !== 0 && sx[b] !== 0) || !(sy[a] !== 0 && sy[b] !== 0) ? 0 : 1;
      const lo = Math.max(box[4 * a + o], box[4 * b + o]), hi = Math.min(box[4 * a + 2 + o], box[4 * b + 2 + o]);
      const w = 1 - o;
      const wLo = Math.max(box[4 * a + w], box[4 * b + w]), wHi = Math.min(box[4 * a + 2 + w], box[4 * b + 2 + w]);
      A.set(vertices[a], first[a], id0[a], len[a], o === 0 ? sx[a] : sy[a], o === 0 ? sy[a] : sx[a], o, lo, hi, wLo, wHi);
      B.set(vertices[b], first[b], id0[b], len[b], o === 0 ? sx[b] : sy[b], o === 0 ? sy[b] : sx[b], o, lo, hi, wLo, wHi);
      budget = mergeWalks(pairs, A, B, o, keys, budget);
      if (budget < 0) return undefined;
    }
  }
  return firstByKey(pairs, keys, maxResults);
}

/**
 * One chain of {@link byChains} walked so that its coordinate on the merge axis does not decrease: walk step
 * t goes from vertex base + dir·t to base + dir·(t + 1) and is segment ids + dir·t. Only the steps
 * [start, end), those whose boxes meet the common box of the two chains merged, are merged.
 */
class ChainWalk {
  v: Float64Array = new Float64Array(0);
  base = 0;
  dir = 1;
  ids = 0;
  start = 0;
  end = 0;

  /**
   * Walk the chain of `len` segments from vertex `first` of `v`, the first being segment `ids`, whose
   * coordinates change with signs so on axis o and sw on the other, cut to the box [lo, hi] x [wLo, wHi].
   */
  set(v: Float64Array, first: number, ids: number, len: number, so: number, sw: number, o: number, lo: number, hi: number, wLo: number, wHi: number): void {
    this.v = v;
    this.dir = so < 0 ? -1 : 1;
    this.base = so < 0 ? first + len : first;
    this.ids = so < 0 ? ids + len - 1 : ids;
    const { base, dir } = this;
    const w = 1 - o;
    // the walk's first and last vertex span the chain's box: no search where the common box holds that end
    const v0 = 2 * base, v1 = 2 * (base + dir * len);
    // on axis o: from the first step ending at or after lo to the last starting at or before hi
    let start = lo > v[v0 + o] ? firstStep(v, base, dir, len, o, 1, lo, 1) : 0;
    let end = hi < v[v1 + o] ? firstStep(v, base, dir, len, o, 0, hi, 1) : len;
    // on the other axis, increasing along the walk: the same; decreasing: from the first step ending at or
    // below wHi to the last starting at or above wLo
    if ((so < 0 ? -sw : sw) >= 0) {
      if (wLo > v[v0 + w]) start = Math.max(start, firstStep(v, base, dir, len, w, 1, wLo, 1));
      if (wHi < v[v1 + w]) end = Math.min(end, firstStep(v, base, dir, len, w, 0, wHi, 1));
    } else {
      if (wHi < v[v0 + w]) start = Math.max(start, firstStep(v, base, dir, len, w, 1, -wHi, -1));
      if (wLo > v[v1 + w]) end = Math.min(end, firstStep(v, base, dir, len, w, 0, -wLo, -1));
    }
    this.start = start;
    this.end = end;
  }
}

/**
 * Test each pair of segments, one of each walk, whose boxes meet, pushing the keys of those that
 * {@link SegmentPairs.meet}: for each step of A in order, the run of B's steps that overlap it on axis o (its
 * start only moves forward), tested on the other axis, then exactly.
 * @returns the budget left, less one per pair and step examined (negative: stop).
 */
function mergeWalks(pairs: SegmentPairs, A: ChainWalk, B: ChainWalk, o: number, keys: number[], budget: number): number {
  const { v: av, base: aBase, dir: aDir, ids: aIds, end: aEnd } = A;
  const { v: bv, base: bBase, dir: bDir, ids: bIds, end: bEnd } = B;
  const w = 1 - o;
  const n = pairs.n;
  let q0 = B.start;
  for (let t = A.start; t < aEnd; t++) {
    const p = 2 * (aBase + aDir * t), p1 = p + 2 * aDir;
    const iLo = av[p + o], iHi = av[p1 + o];
    const iMin = Math.min(av[p + w], av[p1 + w]), iMax = Math.max(av[p + w], av[p1 + w]);
    while (q0 < bEnd && bv[2 * (bBase + bDir * (q0 + 1)) + o] < iLo) q0++;
    budget--;
    for (let q = q0; q < bEnd; q++) {
      const r = 2 * (bBase + bDir * q);
      if (bv[r + o] > iHi) break;
      budget--;
      const j0 = bv[r + w], j1 = bv[r + 2 * bDir + w];
      if ((j0 < iMin && j1 < iMin) || (j0 > iMax && j1 > iMax)) continue;
      const i = aIds + aDir * t, j = bIds + bDir * q;
      if (i < j ? pairs.meet(i, j) : pairs.meet(j, i)) keys.push(i < j ? i * n + j : j * n + i);
    }
    if (budget < 0) return budget;
  }
  return budget;
}

/**
 * The first walk step t in [0, len) whose vertex t + ends (0: its start, 1: its end) has sign · coordinate on
 * axis c at least x (strictly above x when ends is 0, for the first step past the range); len if none. The
 * coordinate times sign must not decrease along the walk.
 */
function firstStep(v: Float64Array, base: number, dir: number, len: number, c: number, ends: number, x: number, sign: number): number {
  let lo = 0, up = len;
  if (ends === 1) {
    while (lo < up) {
      const mid = (lo + up) >> 1;
      if (sign * v[2 * (base + dir * (mid + 1)) + c] < x) lo = mid + 1;
      else up = mid;
    }
  } else {
    while (lo < up) {
      const mid = (lo + up) >> 1;
      if (sign * v[2 * (base + dir * mid) + c] <= x) lo = mid + 1;
      else up = mid;
    }
  }
  return lo;
}

const NOT_CONSECUTIVE = 0;
const I_THEN_J = 1;
const J_THEN_I = 2;

/**
 * The segments of some polylines by id (polyline 0's segments first) with the exact pair test of
 * {@link findCrossings}. Construction checks the coordinates, O(n); the endpoint copy, the grid index and
 * the zero-length runs are built on first use.
 */
class SegmentPairs {
  /** Number of segments. */
  readonly n: number;
  /** Id of the first segment of each polyline, then the total. */
  readonly firstId: Int32Array;
  readonly polylines: readonly PolylineInput[];
  private readonly closed: boolean[];
  private endpoints: Float64Array | undefined;
  private grid: SegmentIndex | undefined;
  // steps forward to the next segment of non-zero length (forwardGaps), by id
  private gaps: Int32Array | undefined;
  // endpoints of the two segments meet and crossing look at
  private readonly scratch = new Float64Array(8);

  /** @throws {RangeError} when maxResults is negative or NaN, or a coordinate is not finite. */
  constructor(polylines: readonly PolylineInput[], maxResults: number) {
    if (!(maxResults >= 0)) throw new RangeError(`maxResults must be >= 0, got ${maxResults}.`);
    this.polylines = polylines;
    this.firstId = new Int32Array(polylines.length + 1);
    for (let k = 0; k < polylines.length; k++) this.firstId[k + 1] = this.firstId[k] + segmentCount(polylines[k]);
    this.n = this.firstId[polylines.length];
    checkCoordinates(polylines);
    this.closed = polylines.map((p) => p.closed);
  }

  /** Endpoints `[ax, ay, bx, by]` of every segment, by id; copied on first use. */
  get seg(): Float64Array {
    return (this.endpoints ??= segmentCoords(this.polylines, this.n));
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
    const e = this.scratch;
    this.load(i, 0);
    this.load(j, 4);
    const ax = e[0], ay = e[1], bx = e[2], by = e[3];
    const cx = e[4], cy = e[5], dx = e[6], dy = e[7];
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
    const e = this.scratch;
    this.load(i, 0);
    this.load(j, 4);
    const order = this.consecutive(i, j);
    let x: number, y: number;
    if (order !== NOT_CONSECUTIVE) {
      const o = (order & I_THEN_J) !== 0 ? 2 : 6;
      x = e[o];
      y = e[o + 1];
    } else {
      [x, y] = contactPoint(e[0], e[1], e[2], e[3], e[4], e[5], e[6], e[7]);
    }
    const p = this.polylineOf(i), q = this.polylineOf(j);
    return {
      a: { polyline: p, segment: i - this.firstId[p] },
      b: { polyline: q, segment: j - this.firstId[q] },
      x,
      y,
    };
  }

  /** Polyline of segment `id`: the last k with firstId[k] <= id (polylines without segments are skipped). */
  private polylineOf(id: number): number {
    const f = this.firstId;
    let lo = 0, hi = f.length - 2;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (f[mid] <= id) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }

  // endpoints [ax, ay, bx, by] of segment id into scratch[at …], read from its polyline
  private load(id: number, at: number): void {
    const p = this.polylineOf(id);
    const s = id - this.firstId[p];
    const c = this.polylines[p].coords;
    const t = s + 1 === c.length >> 1 ? 0 : s + 1;
    const e = this.scratch;
    e[at] = c[2 * s];
    e[at + 1] = c[2 * s + 1];
    e[at + 2] = c[2 * t];
    e[at + 3] = c[2 * t + 1];
  }

  // for segments i < j: I_THEN_J when j follows i along one polyline with only zero-length segments between,
  // J_THEN_I when i follows j so (across the closing segment of a closed polyline); either, both or neither
  private consecutive(i: number, j: number): number {
    const p = this.polylineOf(i);
    if (p !== this.polylineOf(j)) return NOT_CONSECUTIVE;
    const steps = j - i;
    const m = this.firstId[p + 1] - this.firstId[p];
    return (this.within(p, i, steps) ? I_THEN_J : 0) | (this.closed[p] && this.within(p, j, m - steps) ? J_THEN_I : 0);
  }

  // whether the segments strictly between segment `id` of polyline p and the one `steps` ahead of it along
  // the polyline (cyclically) all have zero length; one step, or a next segment of non-zero length, needs no
  // run lengths
  private within(p: number, id: number, steps: number): boolean {
    if (steps === 1) return true;
    const f = this.firstId[p];
    const s = id + 1 < this.firstId[p + 1] ? id + 1 - f : 0;
    const c = this.polylines[p].coords;
    const t = s + 1 === c.length >> 1 ? 0 : s + 1;
    if (c[2 * s] !== c[2 * t] || c[2 * s + 1] !== c[2 * t + 1]) return false;
    return steps <= (this.gaps ??= forwardGaps(this.polylines, this.seg, this.n))[id];
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
 * Check the coordinates of every segment, in id order, as {@link SegmentIndex} does, with the same errors.
 * @throws {RangeError} on a non-finite coordinate, or when the coordinate span overflows a double.
 */
function checkCoordinates(polylines: readonly PolylineInput[]): void {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  let id = 0;
  for (const p of polylines) {
    const c = p.coords;
    const vertices = c.length >> 1;
    const m = segmentCount(p);
    for (let i = 0; i < m; i++, id++) {
      const j = i + 1 === vertices ? 0 : i + 1;
      const ax = c[2 * i], ay = c[2 * i + 1], bx = c[2 * j], by = c[2 * j + 1];
      if (!Number.isFinite(ax + ay + bx + by)) {
        throw new RangeError(`Segment ${id} has a non-finite coordinate: (${ax}, ${ay})-(${bx}, ${by}).`);
      }
      // each vertex starts a segment (an open polyline's last one ends one, and is checked below)
      if (ax < minX) minX = ax;
      if (ax > maxX) maxX = ax;
      if (ay < minY) minY = ay;
      if (ay > maxY) maxY = ay;
    }
    if (m > 0 && !p.closed) {
      const x = c[2 * m], y = c[2 * m + 1];
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
  }
  const w = maxX - minX;
  const h = maxY - minY;
  if (id > 0 && (!Number.isFinite(w) || !Number.isFinite(h))) {
    throw new RangeError(`Coordinate span ${w} x ${h} overflows - translate or scale the input.`);
  }
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
