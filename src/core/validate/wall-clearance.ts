import type { TrackParams } from '../params/types.js';
import type { TrackGeometry } from './geometry.js';
import { checkClearance, type ClearanceViolation } from './clearance.js';
import { MAX_ISSUES_PER_RULE, num, type IssueSink } from './issue-sink.js';

/** Vertex-segment pairs collected before grouping them into pinches: a few per reported pinch. */
const CLEARANCE_SCAN_LIMIT = 32 * MAX_ISSUES_PER_RULE;

/**
 * Rule 'clearance' (shared/DESIGN.md guarantee 4): wall solids of parts of the lap far apart along
 * the track keep params.clearanceM between them; see {@link checkClearance}. Each vertex reaches
 * max(half widths) + wall thickness from the centerline. Violations are grouped into pinches (both
 * parts within the required distance of an already reported pair, along the lap) and the
 * tightest pair of each pinch is reported with the lap positions of both parts.
 */
export function checkWallClearance(g: TrackGeometry, params: TrackParams, sink: IssueSink): void {
  const { n } = g;
  const reach = new Float64Array(n);
  const thickness = params.wall.thicknessM;
  for (let i = 0; i < n; i++) reach[i] = Math.max(g.halfLeftM[i], g.halfRightM[i]) + thickness;
  const { violations } = checkClearance({
    points: g.center,
    s: g.s.subarray(0, n),
    lapLengthM: g.lapM,
    reach,
    marginM: params.clearanceM,
    minRadiusM: params.minCornerRadiusM,
    maxViolations: CLEARANCE_SCAN_LIMIT,
  });
  const pinches: ClearanceViolation[] = [];
  for (const v of violations) {
    const k = pinches.findIndex((p) => samePinch(g, p, v));
    if (k < 0) pinches.push(v);
    else if (v.distanceM - v.requiredM < pinches[k].distanceM - pinches[k].requiredM) pinches[k] = v;
  }
  for (const p of pinches) {
    const si = num(g.s[p.i]), sj = num(g.s[p.j]);
    const gap = p.distanceM - (p.requiredM - params.clearanceM);
    sink.add({
      code: 'clearance',
      at: { s: si, index: p.i, x: g.center[2 * p.i], y: g.center[2 * p.i + 1] },
      limit: params.clearanceM,
      actual: num(gap),
      message: `wall solids at s=${si} m and s=${sj} m ${gap < 0 ? `overlap by ${num(-gap)} m` : `are ${num(gap)} m apart`}, need ${params.clearanceM} m (centerlines ${num(p.distanceM)} m apart, need ${num(p.requiredM)} m)`,
    });
  }
}

function samePinch(g: TrackGeometry, a: ClearanceViolation, b: ClearanceViolation): boolean {
  const near = Math.max(a.requiredM, b.requiredM);
  const lap = g.lapM;
  const d = (x: number, y: number): number => {
    const e = Math.abs(g.s[x] - g.s[y]);
    return Math.min(e, lap - e);
  };
  // a pinch shows up as (i, j) and as (j, i): match either way round
  return (d(a.i, b.i) <= near && d(a.j, b.j) <= near) || (d(a.i, b.j) <= near && d(a.j, b.i) <= near);
}
