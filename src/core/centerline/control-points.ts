/**
 * Control points of the shipped spline, placed along a traced plan.
 *
 * The shipped centerline is the closed C² cubic spline through these points (de Boor 1978;
 * curve/cubic-spline-closed.ts), whose curvature error on an arc is about 0.1 θ² for a turn θ
 * per gap (measured in tests/core/curve/cubic-spline-closed.test.ts) and which follows a ramp
 * of curvature closely once the ramp spans a few gaps. (A centripetal Catmull–Rom spline is only
 * C¹: its curvature jumps at every control point, by ~10% of the peak on corner ramps six gaps
 * long, so it is not used for the shipped centerline.) Each corner's gap is the smallest of
 * CONTROL_TURN_RAD / κ, its shortest ramp over RAMP_GAPS and its length over CORNER_GAPS; gaps
 * then grade smoothly into the straights (by at most CONTROL_GAP_SLOPE per metre).
 *
 * Control points ship with CONTROL_DECIMALS decimals (1 µm), not the 1 mm of other coordinates:
 * rounding the points an interpolating spline passes through to 1 mm moves its curvature by up
 * to ~12 · 0.5 mm / g² (measured on rounded circles: 6% at R = 15 m with 1.2 m gaps), while
 * 1 µm moves it by < 0.01%.
 */
import { interpolateClosed } from '../geom/interpolate.js';
import { CONTROL_DECIMALS } from '../rules.js';
import type { Plan, PlannedCorner } from './plan-types.js';
import type { Trace } from './trace.js';

/** Largest turn of the plan between neighbouring control points, radians (0.1 θ² = 0.1%). */
export const CONTROL_TURN_RAD = (6 * Math.PI) / 180;
/** Control gaps per ramp of a corner's curvature profile at the least. */
export const RAMP_GAPS = 6;
/** Control gaps per corner at the least. */
export const CORNER_GAPS = 12;
/** Shortest control gap, metres (far above the 1 µm rounding of control points). */
export const MIN_CONTROL_GAP_M = 0.1;
/** Longest control gap on a straight, metres. */
export const MAX_CONTROL_GAP_M = 15;
/** Largest change of the control gap per metre of lap (gaps grade, never jump). */
export const CONTROL_GAP_SLOPE = 0.03;

/** Control gap inside a planned corner, metres. */
export function cornerControlGapM(c: PlannedCorner): number {
  const g = Math.min(CONTROL_TURN_RAD / c.peakCurvature, (c.shape.minRamp * c.lengthM) / RAMP_GAPS, c.lengthM / CORNER_GAPS);
  return Math.min(MAX_CONTROL_GAP_M, Math.max(MIN_CONTROL_GAP_M, g));
}

/**
 * Places control points along the trace, starting exactly at lap position `startS` (the start
 * line) and going the way of travel: gaps follow the corner gaps graded by CONTROL_GAP_SLOPE,
 * spread at equal steps of ∫ ds / gap so that the loop closes with no odd last gap. Returns the
 * points moved so that the start line is at the origin heading along +x, rounded to 1 µm, and
 * each control point's trace position relative to `startS`.
 */
export function placeControlPoints(plan: Plan, trace: Trace, startS: number): { control: Float64Array; traceS: Float64Array } {
  const m = trace.s.length;
  const lapM = plan.lengthM;
  // wanted gap per trace vertex: the corner's gap inside corners, the longest on straights
  const gap = new Float64Array(m).fill(MAX_CONTROL_GAP_M);
  for (let c = 0; c < plan.corners.length; c++) {
    const g = cornerControlGapM(plan.corners[c]);
    for (let k = trace.cornerStart[c]; k <= trace.cornerEnd[c] && k < m; k++) gap[k] = Math.min(gap[k], g);
  }
  gradeCyclic(gap, trace.s, lapM, CONTROL_GAP_SLOPE);
  // cumulative ∫ ds / gap, trapezoid over the closed trace
  const integral = new Float64Array(m + 1);
  for (let k = 0; k < m; k++) {
    const ds = (k + 1 < m ? trace.s[k + 1] : lapM) - trace.s[k];
    integral[k + 1] = integral[k] + (ds * (1 / gap[k] + 1 / gap[k + 1 < m ? k + 1 : 0])) / 2;
  }
  const total = integral[m];
  // the integral at the trace's vertices: the knots of its inverse (one view for all the points)
  const knots = integral.subarray(0, m);
  const count = Math.max(8, Math.round(total));
  const i0 = integralAt(integral, trace.s, lapM, startS);
  const traceS = new Float64Array(count);
  const control = new Float64Array(2 * count);
  const cursor = { k: 0 };
  const p = new Float64Array(3);
  const origin = pointOnTrace(trace, lapM, startS, cursor, new Float64Array(3));
  const cos = Math.cos(-origin[2]), sin = Math.sin(-origin[2]);
  cursor.k = 0;
  for (let j = 0; j < count; j++) {
    let target = i0 + (j * total) / count;
    if (target >= total) target -= total;
    const s = interpolateClosed(knots, total, trace.s, lapM, target);
    traceS[j] = (s - startS + lapM) % lapM;
    pointOnTrace(trace, lapM, s, cursor, p);
    const dx = p[0] - origin[0], dy = p[1] - origin[1];
    control[2 * j] = roundControl(dx * cos - dy * sin);
    control[2 * j + 1] = roundControl(dx * sin + dy * cos);
  }
  return { control, traceS };
}

/**
 * Position and heading on the trace at lap position s (exact: each trace step is a circular arc).
 * `cursor.k` remembers the last step for increasing queries; reset it to 0 to search afresh.
 */
export function pointOnTrace(trace: Trace, lapM: number, s: number, cursor: { k: number }, out: Float64Array): Float64Array {
  const m = trace.s.length;
  let k = cursor.k;
  if (k >= m || trace.s[k] > s) k = 0;
  while (k + 1 < m && trace.s[k + 1] <= s) k++;
  cursor.k = k;
  const s1 = k + 1 < m ? trace.s[k + 1] : lapM;
  const h0 = trace.heading[k];
  const h1 = k + 1 < m ? trace.heading[k + 1] : trace.endHeading;
  const step = s1 - trace.s[k];
  const t = s - trace.s[k];
  const kappa = step > 0 ? (h1 - h0) / step : 0;
  const turn = kappa * t;
  const half = 0.5 * turn;
  const chord = Math.abs(half) < 1e-8 ? t : (t * Math.sin(half)) / half;
  out[0] = trace.points[2 * k] + chord * Math.cos(h0 + half);
  out[1] = trace.points[2 * k + 1] + chord * Math.sin(h0 + half);
  out[2] = h0 + turn;
  return out;
}

// limit |gap_a - gap_b| <= slope * |s_a - s_b| around the loop (two passes each way cover the wrap)
function gradeCyclic(gap: Float64Array, s: Float64Array, lapM: number, slope: number): void {
  const m = gap.length;
  // neighbour indices wrap by comparison, not by integer division
  for (let round = 0; round < 2; round++) {
    for (let k = 1; k <= m; k++) {
      const a = k - 1, b = k < m ? k : 0;
      const ds = b === 0 ? lapM - s[a] : s[b] - s[a];
      gap[b] = Math.min(gap[b], gap[a] + slope * ds);
    }
    for (let k = m - 1; k >= 0; k--) {
      const a = k + 1 < m ? k + 1 : 0, b = k;
      const ds = a === 0 ? lapM - s[b] : s[a] - s[b];
      gap[b] = Math.min(gap[b], gap[a] + slope * ds);
    }
  }
}

// ∫ ds / gap at lap position x (the trace's vertices are the knots)
function integralAt(integral: Float64Array, s: Float64Array, lapM: number, x: number): number {
  return interpolateClosed(s, lapM, integral, integral[s.length], x);
}

const CONTROL_SCALE = 10 ** CONTROL_DECIMALS;

function roundControl(x: number): number {
  return Math.round(x * CONTROL_SCALE) / CONTROL_SCALE + 0; // + 0 turns -0 into 0
}
