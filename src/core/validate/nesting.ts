import { pointInPolygon } from '../geom/polyline.js';
import type { TrackGeometry } from './geometry.js';
import type { IssueSink } from './issue-sink.js';

/**
 * Rule 'wall_nesting': the road is the ring between the wall faces. On a counter-clockwise loop
 * the left face is the inner one, so a left-face vertex lies strictly inside the right face and
 * the centerline lies inside the right face and outside the left; mirrored on a clockwise loop.
 *
 * Without crossings (checked separately) every polyline is simple and none meets another, so by
 * the Jordan curve theorem one vertex of each settles where the whole polyline lies. Exact
 * (orientation predicates); cost O(n).
 */
export function checkNesting(g: TrackGeometry, sink: IssueSink): void {
  const ccw = g.loopSign > 0;
  const inner = ccw ? g.left : g.right;
  const outer = ccw ? g.right : g.left;
  const innerName = ccw ? 'left' : 'right';
  const outerName = ccw ? 'right' : 'left';
  const loop = ccw ? 'counter-clockwise' : 'clockwise';
  if (pointInPolygon(inner[0], inner[1], outer) !== 1) {
    sink.add({
      code: 'wall_nesting',
      at: { s: 0, index: 0, x: inner[0], y: inner[1] },
      message: `on a ${loop} loop the ${innerName} wall must lie inside the ${outerName} wall; its vertex 0 does not`,
    });
  }
  const cx = g.center[0], cy = g.center[1];
  if (pointInPolygon(cx, cy, outer) !== 1 || pointInPolygon(cx, cy, inner) !== -1) {
    sink.add({
      code: 'wall_nesting',
      at: { s: 0, index: 0, x: cx, y: cy },
      message: `the centerline must run between the walls (inside the ${outerName}, outside the ${innerName} on a ${loop} loop); point 0 does not`,
    });
  }
}
