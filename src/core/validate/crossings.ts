import { findCrossings } from '../geom/crossings.js';
import type { IssueCode } from '../errors.js';
import type { TrackGeometry } from './geometry.js';
import { MAX_ISSUES_PER_RULE, num, type IssueSink } from './issue-sink.js';

/** Crossing pairs scanned at most: enough to fill every crossing code's quota in the usual case. */
const CROSSING_SCAN_LIMIT = 4 * MAX_ISSUES_PER_RULE;

const NAMES = ['centerline', 'left wall', 'right wall'];

/**
 * Rules 'centerline_crossing', 'wall_crossing', 'walls_touch' and 'wall_touches_centerline':
 * the centerline and both wall faces are simple closed polylines that never touch one another.
 * Decided exactly (orientation predicates); touching counts, except the shared vertex of
 * adjacent segments of one polyline. Cost O(n) expected (monotone chains, or a grid, as broad phase).
 * @returns whether any crossing was found.
 */
export function checkCrossings(g: TrackGeometry, sink: IssueSink): boolean {
  const found = findCrossings(
    [
      { coords: g.center, closed: true },
      { coords: g.left, closed: true },
      { coords: g.right, closed: true },
    ],
    CROSSING_SCAN_LIMIT,
  );
  for (const c of found) {
    const pa = c.a.polyline, pb = c.b.polyline;
    const code: IssueCode = pa === pb
      ? (pa === 0 ? 'centerline_crossing' : 'wall_crossing')
      : (pa === 0 ? 'wall_touches_centerline' : 'walls_touch');
    // wall vertices pair with centerline points, so a wall segment has the lap position of its start
    const i = c.a.segment;
    const what = pa === pb
      ? `${NAMES[pa]} crosses itself: segments ${c.a.segment} and ${c.b.segment}`
      : `${NAMES[pb]} segment ${c.b.segment} touches ${NAMES[pa]} segment ${c.a.segment}`;
    sink.add({
      code,
      at: { s: num(g.s[i]), index: i, x: num(c.x), y: num(c.y) },
      message: `${what} near (${num(c.x)}, ${num(c.y)}) at s=${num(g.s[i])} m and s=${num(g.s[c.b.segment])} m`,
    });
  }
  return found.length > 0;
}
