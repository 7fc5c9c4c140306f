import { NET_TURNING_TOL_DEG, TURNING_TOL } from '../rules.js';
import type { TrackParams } from '../params/types.js';
import type { TrackGeometry } from './geometry.js';
import { num, type IssueSink } from './issue-sink.js';

const DEG = 180 / Math.PI;

/** Net (signed) and total (absolute) turning of a closed polyline, degrees. */
export interface Turning {
  readonly netDeg: number;
  readonly totalDeg: number;
}

/**
 * Rules 'net_turning' and 'total_turning', measured on the centerline decimated to chords of
 * about MEASURE_CHORD_M (so 1 mm rounding cannot add turning): a simple closed loop turns
 * ±360° (Hopf's Umlaufsatz) with the sign of its orientation, and its absolute turning stays
 * within TURNING_TOL of params.curvatureBudgetDeg.
 */
export function checkTurning(g: TrackGeometry, params: TrackParams, sink: IssueSink): Turning {
  const t = measureTurning(g.center, g.stride);
  const wantNet = 360 * g.loopSign;
  if (!(Math.abs(t.netDeg - wantNet) <= NET_TURNING_TOL_DEG)) {
    sink.add({
      code: 'net_turning',
      limit: wantNet,
      actual: num(t.netDeg),
      message: `net turning ${num(t.netDeg)}° must be ${wantNet}° within ${NET_TURNING_TOL_DEG}° on a ${g.loopSign > 0 ? 'counter-clockwise' : 'clockwise'} loop`,
    });
  }
  const budget = params.curvatureBudgetDeg;
  const tol = TURNING_TOL * budget;
  if (!(Math.abs(t.totalDeg - budget) <= tol)) {
    const limit = t.totalDeg > budget ? budget + tol : budget - tol;
    sink.add({
      code: 'total_turning',
      limit: num(limit),
      actual: num(t.totalDeg),
      message: `total turning ${num(t.totalDeg)}° is beyond ${num(limit)}° (budget ${num(budget)}° ± ${TURNING_TOL * 100}%)`,
    });
  }
  return t;
}

/**
 * Turning of the closed polyline `coords` decimated to about every `stride`-th vertex: m =
 * max(3, round(n / stride)) vertices at indices floor(j·n/m), so the closing chord is no shorter
 * than the others. Sums the exterior angles, signed (counter-clockwise positive) and absolute.
 * @example measureTurning(square, 1); // { netDeg: 360, totalDeg: 360 } for a counter-clockwise square
 */
export function measureTurning(coords: Float64Array, stride: number): Turning {
  const n = coords.length >> 1;
  const m = Math.max(3, Math.round(n / stride));
  let net = 0, total = 0;
  // previous chord direction, starting with the closing chord into vertex 0
  let last = Math.floor(((m - 1) * n) / m);
  let ux = coords[0] - coords[2 * last], uy = coords[1] - coords[2 * last + 1];
  last = 0;
  for (let j = 1; j <= m; j++) {
    const v = j === m ? 0 : Math.floor((j * n) / m);
    const vx = coords[2 * v] - coords[2 * last], vy = coords[2 * v + 1] - coords[2 * last + 1];
    const a = Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
    net += a;
    total += Math.abs(a);
    ux = vx;
    uy = vy;
    last = v;
  }
  return { netDeg: net * DEG, totalDeg: total * DEG };
}
