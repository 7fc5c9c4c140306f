import { orient } from './orient.js';
import { segmentsIntersect } from './segment-intersect.js';

// Math.hypot is implementation-approximated in ECMAScript; sqrt of a sum of squares is exact IEEE everywhere
function dist(ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax;
  const dy = by - ay;
  return Math.sqrt(dx * dx + dy * dy);
}

/**
 * Length of a polyline given as flat coordinates `[x0, y0, x1, y1, …]` in metres.
 *
 * @param closed when true the segment from the last vertex back to the first is included.
 * @returns the length in metres; 0 for fewer than two vertices.
 * @example
 * polylineLength(new Float64Array([0, 0, 3, 4]), false); // 5
 * polylineLength(new Float64Array([0, 0, 1, 0, 1, 1, 0, 1]), true); // 4
 */
export function polylineLength(coords: Float64Array, closed: boolean): number {
  const n = coords.length >> 1;
  let length = 0;
  for (let i = 1; i < n; i++) {
    length += dist(coords[2 * i - 2], coords[2 * i - 1], coords[2 * i], coords[2 * i + 1]);
  }
  if (closed && n > 1) length += dist(coords[2 * n - 2], coords[2 * n - 1], coords[0], coords[1]);
  return length;
}

/**
 * Signed area of the closed polygon through the flat coordinates `[x0, y0, x1, y1, …]` (shoelace formula), in m².
 *
 * Axes x right, y up: counter-clockwise polygons are positive, clockwise negative. The closing edge is implied;
 * a repeated first vertex at the end is harmless. Self-intersecting polygons give the winding-weighted sum.
 *
 * @example
 * signedArea(new Float64Array([0, 0, 1, 0, 1, 1, 0, 1])); // 1
 * signedArea(new Float64Array([0, 0, 0, 1, 1, 1, 1, 0])); // -1
 */
export function signedArea(coords: Float64Array): number {
  const n = coords.length >> 1;
  if (n < 3) return 0;
  // measure from the first vertex: far-away coordinates would otherwise cancel catastrophically
  const ox = coords[0];
  const oy = coords[1];
  let sum = 0;
  for (let i = 1; i < n - 1; i++) {
    const x1 = coords[2 * i] - ox;
    const y1 = coords[2 * i + 1] - oy;
    const x2 = coords[2 * i + 2] - ox;
    const y2 = coords[2 * i + 3] - oy;
    sum += x1 * y2 - x2 * y1;
  }
  return sum / 2;
}

/**
 * Where a point lies relative to a closed polygon `[x0, y0, x1, y1, …]`, decided exactly with {@link orient}.
 *
 * Uses the non-zero winding rule, which equals the even-odd rule for simple polygons; works for either
 * orientation.
 *
 * @returns `1` strictly inside, `0` on the boundary (a vertex or an edge), `-1` strictly outside.
 * @example
 * const square = new Float64Array([0, 0, 2, 0, 2, 2, 0, 2]);
 * pointInPolygon(1, 1, square); // 1
 * pointInPolygon(2, 1, square); // 0
 * pointInPolygon(3, 1, square); // -1
 */
export function pointInPolygon(px: number, py: number, coords: Float64Array): 1 | 0 | -1 {
  const n = coords.length >> 1;
  let winding = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const ax = coords[2 * j];
    const ay = coords[2 * j + 1];
    const bx = coords[2 * i];
    const by = coords[2 * i + 1];
    const side = orient(ax, ay, bx, by, px, py);
    if (side === 0 && segmentsIntersect(ax, ay, bx, by, px, py, px, py)) return 0;
    // half-open rule on y: an edge counts when it spans py, so a vertex at height py is counted once
    if (ay <= py) {
      if (by > py && side > 0) winding++;
    } else if (by <= py && side < 0) {
      winding--;
    }
  }
  return winding !== 0 ? 1 : -1;
}

/**
 * Euclidean distance in metres from point p to the closed segment [a, b]; a zero-length segment is a point.
 *
 * @example
 * pointSegmentDistance(1, 1, 0, 0, 2, 0); // 1
 * pointSegmentDistance(3, 0, 0, 0, 2, 0); // 1 (nearest point is the endpoint b)
 */
export function pointSegmentDistance(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  // measure from the lexicographically smaller end, so [a, b] and [b, a] round identically
  // (swapped in place rather than by a recursive call, so that the function inlines)
  let ux = ax, uy = ay, vx = bx, vy = by;
  if (ax > bx || (ax === bx && ay > by)) (ux = bx), (uy = by), (vx = ax), (vy = ay);
  const ex = vx - ux;
  const ey = vy - uy;
  const len2 = ex * ex + ey * ey;
  if (len2 === 0) return dist(px, py, ux, uy);
  // parameter of the foot of the perpendicular, clamped onto the segment
  const t = Math.min(1, Math.max(0, ((px - ux) * ex + (py - uy) * ey) / len2));
  return dist(px, py, ux + t * ex, uy + t * ey);
}

/**
 * Euclidean distance in metres between the closed segments [a, b] and [c, d]; exactly 0 when they intersect
 * (decided by {@link segmentsIntersect}), otherwise the least of the four endpoint-to-segment distances.
 *
 * @example
 * segmentSegmentDistance(0, 0, 2, 0, 0, 1, 2, 1); // 1
 * segmentSegmentDistance(0, 0, 2, 2, 0, 2, 2, 0); // 0
 */
export function segmentSegmentDistance(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
): number {
  if (segmentsIntersect(ax, ay, bx, by, cx, cy, dx, dy)) return 0;
  // disjoint segments are closest at an endpoint of one of them
  return Math.min(
    pointSegmentDistance(ax, ay, cx, cy, dx, dy),
    pointSegmentDistance(bx, by, cx, cy, dx, dy),
    pointSegmentDistance(cx, cy, ax, ay, bx, by),
    pointSegmentDistance(dx, dy, ax, ay, bx, by),
  );
}
