// Signed curvature of plane curves and of closed polylines.
// Source: M. P. do Carmo, "Differential Geometry of Curves and Surfaces", Prentice-Hall, 1976
// (κ = (x′y″ − y′x″)/(x′² + y′²)^{3/2}); the discrete form is the reciprocal circumradius of
// three vertices, κ = 2·((b − a) × (c − b)) / (|b − a|·|c − b|·|c − a|).
// Axes: x right, y up, counter-clockwise positive, so κ > 0 turns left.

/**
 * Signed curvature (1/m) from the first and second derivatives of any regular
 * parameterization; the result does not depend on the parameter's speed.
 * Positive for a left (counter-clockwise) turn. Where the speed is zero the curvature is
 * undefined and the result is NaN or ±Infinity.
 * @example curvatureFromDerivatives(0, 2, -2, 0); // circle of radius 2 at (2, 0): 0.5
 */
export function curvatureFromDerivatives(dx: number, dy: number, ddx: number, ddy: number): number {
  const v2 = dx * dx + dy * dy;
  return (dx * ddy - dy * ddx) / (v2 * Math.sqrt(v2));
}

/**
 * Signed curvature (1/m) of the circle through a, b, c (1/circumradius), positive when
 * a → b → c turns left, 0 for three distinct collinear points. NaN when two points coincide
 * (no unique circle).
 * @example circumCurvature(1, 0, 0, 1, -1, 0); // unit circle, counter-clockwise: 1
 */
export function circumCurvature(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  const ux = bx - ax;
  const uy = by - ay;
  const vx = cx - bx;
  const vy = cy - by;
  const wx = cx - ax;
  const wy = cy - ay;
  const cross = ux * vy - uy * vx;
  const denom = Math.sqrt((ux * ux + uy * uy) * (vx * vx + vy * vy)) * Math.sqrt(wx * wx + wy * wy);
  if (denom === 0) return NaN;
  return (2 * cross) / denom;
}

/**
 * Discrete signed curvature (1/m) at every vertex of a closed polyline: vertex i uses the
 * circle through vertices i − stencil, i, i + stencil (indices wrap around). A wider stencil
 * smooths noise from evenly resampled curves; stencil 1 uses the direct neighbours.
 * @param coords closed polyline `[x0, y0, x1, y1, …]` (m), first vertex not repeated
 * @param stencil neighbour offset, an integer with 1 <= stencil and 2·stencil < vertex count
 * @param out optional output of length vertex count
 * @returns curvature per vertex (1/m)
 * @throws {RangeError} fewer than 3 vertices, a bad stencil, a too-short `out`, or a vertex
 *   that coincides with a stencil neighbour (or has a non-finite coordinate)
 * @example discreteCurvatureClosed(points, 2); // points: a resampled centerline
 */
export function discreteCurvatureClosed(coords: Float64Array, stencil: number, out?: Float64Array): Float64Array {
  const n = coords.length >> 1;
  if (n < 3 || coords.length % 2 !== 0) {
    throw new RangeError(`closed polyline needs >= 3 vertices as flat [x0, y0, …], got length ${coords.length}`);
  }
  if (!Number.isInteger(stencil) || stencil < 1 || 2 * stencil >= n) {
    throw new RangeError(`stencil must be an integer in [1, ${Math.ceil(n / 2) - 1}] for ${n} vertices, got ${stencil}`);
  }
  const k = out ?? new Float64Array(n);
  if (k.length < n) throw new RangeError(`out has length ${k.length}, need ${n}`);
  for (let i = 0; i < n; i++) {
    const a = i - stencil < 0 ? i - stencil + n : i - stencil;
    const c = i + stencil >= n ? i + stencil - n : i + stencil;
    const v = circumCurvature(coords[2 * a], coords[2 * a + 1], coords[2 * i], coords[2 * i + 1], coords[2 * c], coords[2 * c + 1]);
    if (Number.isNaN(v)) {
      throw new RangeError(`curvature undefined at vertex ${i}: it coincides with vertex ${a} or ${c}, or a coordinate is not finite`);
    }
    k[i] = v;
  }
  return k;
}
