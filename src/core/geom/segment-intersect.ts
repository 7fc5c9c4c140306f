import { orient } from './orient.js';

/**
 * Whether the closed segments [a, b] and [c, d] share at least one point, decided exactly.
 *
 * Every kind of contact counts: a proper crossing, an endpoint touching the other segment (T-junction),
 * shared endpoints, collinear overlap, and zero-length segments (a point on the other segment, or two equal
 * points). Exact wherever {@link orient} is (all metre-scale coordinates) because it only combines orient
 * signs with coordinate comparisons. Coordinates in metres, any axes.
 *
 * @example
 * segmentsIntersect(0, 0, 2, 2, 0, 2, 2, 0); // true: an X
 * segmentsIntersect(0, 0, 1, 0, 1, 0, 2, 5); // true: touching endpoints
 * segmentsIntersect(0, 0, 1, 0, 2, 0, 3, 0); // false: collinear but apart
 */
export function segmentsIntersect(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
): boolean {
  const o1 = Math.sign(orient(ax, ay, bx, by, cx, cy));
  const o2 = Math.sign(orient(ax, ay, bx, by, dx, dy));
  const o3 = Math.sign(orient(cx, cy, dx, dy, ax, ay));
  const o4 = Math.sign(orient(cx, cy, dx, dy, bx, by));

  // each segment's line separates (or touches at one point) the other segment's endpoints
  if (o1 !== o2 && o3 !== o4) return true;
  // otherwise only a collinear endpoint lying inside the other segment's box can touch
  if (o1 === 0 && inBox(cx, cy, ax, ay, bx, by)) return true;
  if (o2 === 0 && inBox(dx, dy, ax, ay, bx, by)) return true;
  if (o3 === 0 && inBox(ax, ay, cx, cy, dx, dy)) return true;
  if (o4 === 0 && inBox(bx, by, cx, cy, dx, dy)) return true;
  return false;
}

/**
 * Whether the segments [a, b] and [c, d] cross properly: their interiors meet in exactly one point and no
 * endpoint lies on the other segment. Collinear overlap, touching and zero-length segments give `false`.
 * Exact wherever {@link orient} is.
 *
 * @example
 * segmentsCross(0, 0, 2, 2, 0, 2, 2, 0); // true
 * segmentsCross(0, 0, 2, 0, 1, 0, 1, 5); // false: a T-junction only touches
 */
export function segmentsCross(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
): boolean {
  const o1 = Math.sign(orient(ax, ay, bx, by, cx, cy));
  const o2 = Math.sign(orient(ax, ay, bx, by, dx, dy));
  const o3 = Math.sign(orient(cx, cy, dx, dy, ax, ay));
  const o4 = Math.sign(orient(cx, cy, dx, dy, bx, by));
  // strictly opposite signs on both lines: a zero anywhere means a touch or a degenerate segment
  return o1 * o2 < 0 && o3 * o4 < 0;
}

/** Whether p lies in the closed axis-aligned box spanned by a and b; for p collinear with a, b it means p ∈ [a, b]. */
function inBox(px: number, py: number, ax: number, ay: number, bx: number, by: number): boolean {
  return px >= Math.min(ax, bx) && px <= Math.max(ax, bx) && py >= Math.min(ay, by) && py <= Math.max(ay, by);
}
