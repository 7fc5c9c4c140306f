import { pointSegmentDistance } from '../geom/polyline.js';
import { BoxIndex } from '../spatial/box-index.js';

/**
 * Input of the clearance rule: a closed centerline with its lap positions and, per vertex, the
 * reach of the road plus wall solid on the wider side (half width + wall thickness).
 */
export interface ClearanceInput {
  /** Closed centerline [x0, y0, ...], metres; the closing vertex is not repeated. */
  readonly points: Float64Array;
  /** Lap position of each vertex, metres, increasing from 0. */
  readonly s: Float64Array;
  readonly lapLengthM: number;
  /** Half width + wall thickness at each vertex, metres. */
  readonly reach: Float64Array;
  /** Gap kept between wall solids of distant parts, metres. */
  readonly marginM: number;
  /** Radius of curvature the centerline keeps everywhere, metres (see `localArcM`). */
  readonly minRadiusM: number;
  /** Also measure gaps up to this much larger than required (for the clearance metric), metres. */
  readonly measureBeyondM?: number;
  readonly maxViolations?: number;
}

export interface ClearanceViolation {
  readonly i: number;
  readonly j: number;
  readonly distanceM: number;
  readonly requiredM: number;
}

export interface ClearanceResult {
  /**
   * Smallest gap between the wall solids of two parts of the lap more than πR apart along it,
   * metres (capped at measureBeyondM). When only violations are searched (measureBeyondM 0) it
   * is at most 0, and the search stops once maxViolations are found.
   */
  readonly minGapM: number;
  readonly violations: ClearanceViolation[];
}

/**
 * Guarantee 4 of shared/DESIGN.md: parts of the lap far apart along the track keep their wall
 * solids `marginM` apart. For a vertex i and a centerline segment j, the wall solids reach
 * r_i and r_j from the centerline, so they need distance >= r_i + r_j + margin =: a.
 *
 * "Far apart along the track" is made exact by Schur's comparison theorem: on a curve whose
 * curvature never exceeds 1/R, two points an arc length Δs <= πR apart are at least as far as
 * on the circle of radius R, 2R sin(Δs / 2R). Pairs closer along the lap than
 * Δ*(a) = 2R asin(a / 2R) (or πR when a >= 2R) are the same part and their distance follows from
 * the radius rule; pairs between Δ*(a) and πR are at least a apart by that bound. So only pairs
 * more than πR apart along the lap are measured, and every such pair nearer than a is a
 * violation. The measured gap (`minGapM`) is thus the closest approach of the lap to itself.
 *
 * Cost: one box index of chunks of 8 segments, one query per chunk: O(n log n) in practice.
 */
export function checkClearance(input: ClearanceInput): ClearanceResult {
  const { points, s, lapLengthM, reach, marginM, minRadiusM } = input;
  const beyond = input.measureBeyondM ?? 0;
  const maxViolations = input.maxViolations ?? 16;
  const n = s.length;
  // chunks of CHUNK consecutive segments, boxed and indexed; each chunk of vertices queries once
  const chunks = Math.ceil(n / CHUNK);
  const index = new BoxIndex(chunks);
  // the per-chunk arrays share one buffer (one allocation instead of six, three times per track)
  const store = new Float64Array(9 * chunks);
  const box = store.subarray(0, 4 * chunks);
  // reach of a chunk's vertices (as the vertex side of a pair) and of its segments (their end
  // vertex belongs to the next chunk)
  const chunkReach = store.subarray(4 * chunks, 5 * chunks);
  const segmentReach = store.subarray(5 * chunks, 6 * chunks);
  const sFirst = store.subarray(6 * chunks, 7 * chunks);
  const sLast = store.subarray(7 * chunks, 8 * chunks);
  const sNext = store.subarray(8 * chunks, 9 * chunks);
  for (let c = 0; c < chunks; c++) {
    let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity, r = 0;
    const end = Math.min(n, (c + 1) * CHUNK);
    for (let k = c * CHUNK; k <= end; k++) {
      const v = k === n ? 0 : k;
      const x = points[2 * v], y = points[2 * v + 1];
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
      if (k < end && reach[v] > r) r = reach[v];
    }
    box[4 * c] = minX;
    box[4 * c + 1] = minY;
    box[4 * c + 2] = maxX;
    box[4 * c + 3] = maxY;
    chunkReach[c] = r;
    segmentReach[c] = Math.max(r, reach[end === n ? 0 : end]);
    sFirst[c] = s[c * CHUNK];
    sLast[c] = s[end - 1];
    sNext[c] = s[end === n ? 0 : end];
    index.add(minX, minY, maxX, maxY);
  }
  // every vertex's reach is in one chunk's
  let reachMax = 0;
  for (let c = 0; c < chunks; c++) if (chunkReach[c] > reachMax) reachMax = chunkReach[c];
  index.finish();
  // pairs up to πR apart along the lap are one part of it: beyond the local arc of the required
  // distance and up to πR, Schur's bound keeps them farther apart than required, given the
  // curvature bound the radius rule checks, so only pairs farther apart along the lap count
  // (also for the measured gap: the closest approach of the lap to itself, not of a bend to itself)
  const exemptM = Math.PI * minRadiusM;
  const scan: PairScan = { points, s, lapLengthM, reach, marginM, exemptM, n, maxViolations, measureOnlyViolations: beyond === 0, minGap: beyond, violations: [] };
  // chunk pairs by a lower bound of their gap (box distance less both reaches), in order of that
  // bound (a counting sort into BOUND_STEP_M buckets), stopping once the bound reaches both the
  // margin (no violation left) and the smallest gap found (no smaller gap left: branch and bound);
  // a whole chunk pair within πR along the lap is the same part of it. Pairs are listed in rounds
  // of growing bound (most laps' closest approach is found within the first), so distant pairs
  // are not listed when a smaller gap is already known; the pairs are scanned in the same order
  // as in one round (the first round takes every bucket that may hold a violation).
  const limit = Math.max(marginM, beyond);
  const cells: ChunkCells = { index, hits: new Int32Array(chunks), box, chunkReach, segmentReach, reachMax, sFirst, sLast, sNext, chunks, lapLengthM, exemptM };
  let from = -Infinity;
  let to = Math.min(limit, (Math.ceil(Math.max(marginM, FIRST_ROUND_SHARE * beyond) / BOUND_STEP_M) + 1) * BOUND_STEP_M);
  for (;;) {
    const done = scanRound(scan, cells, from, to, to >= limit);
    if (done || to >= limit || Math.max(marginM, scan.minGap) <= to) break;
    from = to;
    to = Math.min(limit, 2 * to);
  }
  return { minGapM: scan.minGap, violations: scan.violations };
}

// the chunk boxes and what the pair listing needs of them
interface ChunkCells {
  readonly index: BoxIndex;
  /** The ids one query of the index returns. */
  readonly hits: Int32Array;
  readonly box: Float64Array;
  readonly chunkReach: Float64Array;
  readonly segmentReach: Float64Array;
  readonly reachMax: number;
  /** Lap positions of each chunk's first and last vertex and of the end vertex of its last segment. */
  readonly sFirst: Float64Array;
  readonly sLast: Float64Array;
  readonly sNext: Float64Array;
  readonly chunks: number;
  readonly lapLengthM: number;
  readonly exemptM: number;
}

// lists the chunk pairs whose bound lies in [from, to) and scans them in order of bound; returns
// true when no later pair can matter (the branch and bound stopped, or this was the last round)
function scanRound(scan: PairScan, cells: ChunkCells, from: number, to: number, last: boolean): boolean {
  const { index, hits, box, chunkReach, segmentReach, reachMax, sFirst, sLast, sNext, chunks, lapLengthM, exemptM } = cells;
  // the listed pairs as (a, b, bucket) triples
  let listed = new Int32Array(PAIRS_PER_CHUNK * 3 * chunks);
  let pairs = 0;
  // buckets of BOUND_STEP_M, wider when the range is absurdly long (a margin of a million metres
  // in an uploaded track's params): the order only steers the search, the answer is the same
  const step = Math.max(BOUND_STEP_M, to / MAX_BUCKETS);
  const buckets = Math.ceil(to / step) + 2;
  const bucketSize = new Int32Array(buckets + 1);
  for (let a = 0; a < chunks; a++) {
    const q = chunkReach[a] + reachMax + to;
    const count = index.searchInto(box[4 * a] - q, box[4 * a + 1] - q, box[4 * a + 2] + q, box[4 * a + 3] + q, hits);
    const aFirst = sFirst[a], aLast = sLast[a];
    for (let h = 0; h < count; h++) {
      const b = hits[h];
      // the whole chunk pair within πR along the lap (largest lap distance between a vertex of
      // chunk a and one of chunk b's segments: the ranges are contiguous, so at their ends)
      const bFirst = sFirst[b], bNext = sNext[b];
      if (cyclicGap(aFirst, bFirst, lapLengthM) <= exemptM && cyclicGap(aFirst, bNext, lapLengthM) <= exemptM && cyclicGap(aLast, bFirst, lapLengthM) <= exemptM && cyclicGap(aLast, bNext, lapLengthM) <= exemptM) continue;
      const lower = boxDistance(box, a, b) - chunkReach[a] - segmentReach[b];
      if (lower >= to || lower < from) continue;
      // bucket 0 holds bounds <= 0, bucket k >= 1 bounds in ((k - 1)·step, k·step]
      const k = lower <= 0 ? 0 : Math.min(buckets - 1, Math.ceil(lower / step));
      if (3 * pairs === listed.length) {
        const more = new Int32Array(2 * listed.length);
        more.set(listed);
        listed = more;
      }
      listed[3 * pairs] = a;
      listed[3 * pairs + 1] = b;
      listed[3 * pairs + 2] = k;
      pairs++;
      bucketSize[k + 1]++;
    }
  }
  // a stable counting sort by bucket: within one, pairs keep the order they were listed in
  for (let k = 0; k < buckets; k++) bucketSize[k + 1] += bucketSize[k];
  const fill = bucketSize.slice(0, buckets);
  const sorted = new Int32Array(2 * pairs);
  for (let p = 0; p < pairs; p++) {
    const o = fill[listed[3 * p + 2]]++;
    sorted[2 * o] = listed[3 * p];
    sorted[2 * o + 1] = listed[3 * p + 1];
  }
  for (let k = 0; k < buckets; k++) {
    // every bound in bucket k exceeds (k - 1)·step
    if (k >= 1 && (k - 1) * step >= Math.max(scan.marginM, scan.minGap)) return true;
    for (let o = bucketSize[k]; o < bucketSize[k + 1]; o++) {
      scanChunkPair(scan, sorted[2 * o], sorted[2 * o + 1], box, segmentReach);
      // violations only (no gap measured): nothing more to find once the list is full
      if (scan.measureOnlyViolations && scan.violations.length >= scan.maxViolations) return true;
    }
  }
  return last;
}

/**
 * Share of the measured range whose pairs the first round lists (the rest come in rounds that
 * double the bound): on default and 8 km laps, 0.625 of 50 m left the fewest pairs listed and
 * took 0.70 of the time of one round over the whole range (0.5: 0.74, 0.8: 0.80).
 */
const FIRST_ROUND_SHARE = 0.625;

/** Width of the buckets chunk pairs are ordered in by their lower bound, metres. */
const BOUND_STEP_M = 0.5;
/** Room for listed pairs per chunk before the list grows: default laps list a median 2.4 per chunk, 5 at the 90th percentile. */
const PAIRS_PER_CHUNK = 8;
/** Most buckets one round sorts chunk pairs into. */
const MAX_BUCKETS = 4096;

// the state of a clearance scan: inputs, and the smallest gap and violations found so far
interface PairScan {
  readonly points: Float64Array;
  readonly s: Float64Array;
  readonly lapLengthM: number;
  readonly reach: Float64Array;
  readonly marginM: number;
  readonly exemptM: number;
  readonly n: number;
  readonly maxViolations: number;
  /** No gap is measured (measureBeyondM 0): the scan may stop once the violations list is full. */
  readonly measureOnlyViolations: boolean;
  minGap: number;
  readonly violations: ClearanceViolation[];
}

// every vertex of chunk a against every segment of chunk b more than πR away along the lap
function scanChunkPair(scan: PairScan, a: number, b: number, box: Float64Array, segmentReach: Float64Array): void {
  const { points, s, lapLengthM, reach, marginM, exemptM, n, maxViolations, violations } = scan;
  const aFrom = a * CHUNK, aTo = Math.min(n, aFrom + CHUNK);
  const bFrom = b * CHUNK, bTo = Math.min(n, bFrom + CHUNK);
  let minGap = scan.minGap;
  for (let i = aFrom; i < aTo; i++) {
    const px = points[2 * i], py = points[2 * i + 1];
    // a vertex farther than this from chunk b's box can neither break the margin nor beat the gap
    const qi = reach[i] + segmentReach[b] + Math.max(marginM, minGap);
    if (px < box[4 * b] - qi || px > box[4 * b + 2] + qi || py < box[4 * b + 1] - qi || py > box[4 * b + 3] + qi) continue;
    const si = s[i];
    // lap distance to the start of segment j (the end of segment j - 1)
    let toStart = cyclicGap(si, s[bFrom], lapLengthM);
    for (let j = bFrom; j < bTo; j++) {
      const j1 = j + 1 === n ? 0 : j + 1;
      const toEnd = cyclicGap(si, s[j1], lapLengthM);
      const ds = Math.min(toStart, toEnd);
      toStart = toEnd;
      if (ds <= exemptM) continue;
      const a2 = reach[i] + Math.max(reach[j], reach[j1]) + marginM;
      const d = pointSegmentDistance(px, py, points[2 * j], points[2 * j + 1], points[2 * j1], points[2 * j1 + 1]);
      const gap = d - (a2 - marginM);
      if (gap < minGap) minGap = gap;
      if (d < a2 && violations.length < maxViolations) violations.push({ i, j, distanceM: d, requiredM: a2 });
    }
  }
  scan.minGap = minGap;
}

// distance between the boxes of chunks a and b (0 when they meet)
function boxDistance(box: Float64Array, a: number, b: number): number {
  const dx = Math.max(0, box[4 * b] - box[4 * a + 2], box[4 * a] - box[4 * b + 2]);
  const dy = Math.max(0, box[4 * b + 1] - box[4 * a + 3], box[4 * a + 1] - box[4 * b + 3]);
  return Math.sqrt(dx * dx + dy * dy);
}

/** Segments per indexed chunk: fewer, larger boxes, so local stretches are skipped wholesale. */
const CHUNK = 8;

/**
 * Arc length within which two points of a curve of radius >= R are the same part of it, for a
 * required distance a: 2R asin(a / 2R), or πR when a >= 2R (Schur's comparison theorem).
 */
export function localArcM(a: number, radiusM: number): number {
  return a >= 2 * radiusM ? Math.PI * radiusM : 2 * radiusM * Math.asin(a / (2 * radiusM));
}

function cyclicGap(a: number, b: number, length: number): number {
  const d = Math.abs(a - b);
  return d > length / 2 ? length - d : d;
}
