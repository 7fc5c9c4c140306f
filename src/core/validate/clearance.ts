import { pointSegmentDistance } from '../geom/polyline.js';
import { SegmentIndex } from '../spatial/segment-index.js';

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
  /** Query every `stride`-th vertex only (a quick upper bound of the gap); default 1. */
  readonly stride?: number;
}

export interface ClearanceViolation {
  readonly i: number;
  readonly j: number;
  readonly distanceM: number;
  readonly requiredM: number;
}

export interface ClearanceResult {
  /** Smallest gap between wall solids of distant parts found, metres (capped at measureBeyondM). */
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
 * on the circle of radius R, 2R sin(Δs / 2R). So pairs closer along the lap than
 * Δ*(a) = 2R asin(a / 2R) (or πR when a >= 2R) are the same part, and their distance follows
 * from the radius rule; every other pair nearer than a is a genuine violation.
 *
 * Cost: one segment index, one box query per vertex: O(n log n) in practice.
 */
export function checkClearance(input: ClearanceInput): ClearanceResult {
  const { points, s, lapLengthM, reach, marginM, minRadiusM } = input;
  const beyond = input.measureBeyondM ?? 0;
  const maxViolations = input.maxViolations ?? 16;
  const n = s.length;
  const index = SegmentIndex.fromPolylines([{ coords: points, closed: true }]);
  let reachMax = 0;
  let reachMin = Infinity;
  for (let i = 0; i < n; i++) {
    if (reach[i] > reachMax) reachMax = reach[i];
    if (reach[i] < reachMin) reachMin = reach[i];
  }
  // localArcM grows with a: pairs closer than the smallest local arc are local for any a (saves asin calls)
  const localFloor = localArcM(2 * reachMin + marginM, minRadiusM);
  const found = new Int32Array(index.numItems);
  const violations: ClearanceViolation[] = [];
  let minGap = beyond;
  const stride = input.stride ?? 1;
  for (let i = 0; i < n; i += stride) {
    const px = points[2 * i], py = points[2 * i + 1];
    // the box shrinks as the smallest gap found so far shrinks (branch and bound on the metric)
    const q = reach[i] + reachMax + marginM + Math.max(0, minGap);
    // pairs within the local arc of the largest required distance cannot break the rule (Schur,
    // with the curvature bound the radius rule checks), so one arcsine per vertex suffices
    const exempt = localArcM(reach[i] + reachMax + marginM, minRadiusM);
    const count = index.searchInto(px - q, py - q, px + q, py + q, found);
    for (let k = 0; k < count; k++) {
      const j = index.segment(found[k]);
      const j1 = j + 1 === n ? 0 : j + 1;
      const ds = Math.min(cyclicGap(s[i], s[j], lapLengthM), cyclicGap(s[i], s[j1], lapLengthM));
      if (ds <= exempt) continue;
      const a = reach[i] + Math.max(reach[j], reach[j1]) + marginM;
      const d = pointSegmentDistance(px, py, points[2 * j], points[2 * j + 1], points[2 * j1], points[2 * j1 + 1]);
      const gap = d - (a - marginM);
      if (gap < minGap) minGap = gap;
      if (d < a && violations.length < maxViolations) violations.push({ i, j, distanceM: d, requiredM: a });
    }
  }
  return { minGapM: minGap, violations };
}

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
