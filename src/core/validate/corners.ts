import { CORNER_ANGLE_TOL_DEG, CORNER_ANGLE_TOL_SHARE } from '../rules.js';
import type { TrackParams } from '../params/types.js';
import type { Corner } from '../track.js';
import type { TrackGeometry } from './geometry.js';
import { num, type IssueSink } from './issue-sink.js';
import { segmentAt } from './measure.js';

const DEG = 180 / Math.PI;

/**
 * Rules 'corner_count', 'turn_balance' and 'corner_mismatch'. The corner list has
 * params.cornerCount entries, Math.round(turnBalance × cornerCount) of them turning right; the
 * corners are ordered by sStart, do not overlap and lie in [0, lapM]; each one's geometric
 * turning (direction of travel at sEnd minus at sStart, unwrapped along the lap) matches
 * angleDeg with the sign of its direction within max(CORNER_ANGLE_TOL_DEG,
 * CORNER_ANGLE_TOL_SHARE × angleDeg); and minRadiusM >= params.minCornerRadiusM.
 */
export function checkCorners(g: TrackGeometry, corners: readonly Corner[], params: TrackParams, sink: IssueSink): void {
  if (corners.length !== params.cornerCount) {
    sink.add({
      code: 'corner_count',
      limit: params.cornerCount,
      actual: corners.length,
      message: `${corners.length} corners, requested ${params.cornerCount}`,
    });
  }
  let rights = 0;
  for (const c of corners) if (c.direction === 'right') rights++;
  const wantRights = Math.round(params.turnBalance * params.cornerCount);
  if (rights !== wantRights) {
    sink.add({
      code: 'turn_balance',
      limit: wantRights,
      actual: rights,
      message: `${rights} right-hand corners, turnBalance ${params.turnBalance} of ${params.cornerCount} corners asks for ${wantRights}`,
    });
  }
  for (let k = 0; k < corners.length && !sink.full('corner_mismatch'); k++) {
    const problem = cornerProblem(g, corners, k, params.minCornerRadiusM);
    if (problem) {
      const c = corners[k];
      sink.add({ code: 'corner_mismatch', at: { s: num(c.sStart), index: k }, ...problem, message: `corner ${k}: ${problem.message}` });
    }
  }
}

interface Problem {
  readonly message: string;
  readonly limit?: number;
  readonly actual?: number;
}

function cornerProblem(g: TrackGeometry, corners: readonly Corner[], k: number, minRadiusM: number): Problem | null {
  const c = corners[k];
  if (!(c.sStart < c.sEnd)) return { message: `sStart ${num(c.sStart)} m must be below sEnd ${num(c.sEnd)} m` };
  if (c.sStart < 0 || c.sEnd > g.lapM) return { message: `[${num(c.sStart)}, ${num(c.sEnd)}] m leaves the lap [0, ${num(g.lapM)}] m` };
  if (k > 0 && c.sStart < corners[k - 1].sEnd) {
    return { message: `starts at s=${num(c.sStart)} m, before corner ${k - 1} ends at s=${num(corners[k - 1].sEnd)} m` };
  }
  if (!(c.minRadiusM >= minRadiusM)) {
    return { limit: minRadiusM, actual: c.minRadiusM, message: `minRadiusM ${num(c.minRadiusM)} m < ${minRadiusM} m` };
  }
  const measured = cornerTurningRad(g, c.sStart, c.sEnd) * DEG;
  const want = c.direction === 'left' ? c.angleDeg : -c.angleDeg;
  const tol = Math.max(CORNER_ANGLE_TOL_DEG, CORNER_ANGLE_TOL_SHARE * Math.abs(c.angleDeg));
  if (Math.abs(measured - want) > tol) {
    return {
      limit: num(want),
      actual: num(measured),
      message: `turns ${num(measured)}° (positive left) between s=${num(c.sStart)} and ${num(c.sEnd)} m, but says ${c.direction} ${num(c.angleDeg)}° (tolerance ${num(tol)}°)`,
    };
  }
  return null;
}

/**
 * Signed turning of the shipped polyline from the segment arriving at sStart to the segment
 * leaving sEnd (the exterior angles between, summed). A corner's ends lie on the straights beside
 * it (the generator widens each corner to the samples just outside its ends, and corners are
 * at least two samples apart), so both segments point along the road: the full turning is
 * measured, whatever the corner's length, and rounding moves each end by < 0.1°.
 */
export function cornerTurningRad(g: TrackGeometry, sStart: number, sEnd: number): number {
  const quarter = g.lapM / g.n / 4;
  const net = g.headingRad[g.n] - g.headingRad[0];
  // unwrapped heading of the segment holding lap position s (which may lie beyond either end of the lap)
  const headingOf = (s: number) => g.headingRad[segmentAt(g, s)] + Math.floor(s / g.lapM) * net;
  return headingOf(sEnd + quarter) - headingOf(sStart - quarter);
}
