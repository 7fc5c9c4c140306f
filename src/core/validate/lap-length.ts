import { LENGTH_TOL } from '../rules.js';
import type { TrackParams } from '../params/types.js';
import type { TrackGeometry } from './geometry.js';
import { num, type IssueSink } from './issue-sink.js';

/**
 * Rule 'length': the closed centerline polyline is params.lengthM long within LENGTH_TOL
 * (shared/DESIGN.md guarantee 2).
 */
export function checkLapLength(g: TrackGeometry, params: TrackParams, sink: IssueSink): void {
  const want = params.lengthM;
  const tol = LENGTH_TOL * want;
  const got = g.polylineM;
  if (Math.abs(got - want) <= tol) return;
  const limit = got > want ? want + tol : want - tol;
  sink.add({
    code: 'length',
    limit: num(limit),
    actual: num(got),
    message: `lap length ${num(got)} m is beyond ${num(limit)} m (requested ${num(want)} m ± ${LENGTH_TOL * 100}%)`,
  });
}
