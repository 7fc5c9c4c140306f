// Shewchuk, "Adaptive Precision Floating-Point Arithmetic and Fast Robust Geometric Predicates",
// Discrete & Computational Geometry 18 (1997) 305-363; implementation from the robust-predicates package.
import { orient2d } from 'robust-predicates';

/**
 * Orientation of point c relative to the directed line a→b, with an exact sign.
 *
 * Axes: x right, y up, counter-clockwise positive. The sign is exact whenever every coordinate is 0 or has a
 * magnitude in [2^-300, 2^500] (about 5e-91 to 3e150 m), which holds for any metre-scale geometry; beyond
 * that the intermediate products can underflow or overflow. The magnitude approximates twice the signed
 * area of the triangle (a, b, c) in m² and is only good for ordering.
 *
 * @returns a positive number iff c lies strictly left of a→b (a, b, c counter-clockwise), a negative number
 *   iff it lies strictly right (clockwise), and exactly `0` (never `-0`) iff the three points are collinear,
 *   which includes a = b.
 * @example
 * orient(0, 0, 1, 0, 0, 1); // > 0: (0,1) is left of the x axis walked in +x
 * orient(0, 0, 1, 1, 2, 2); // 0
 */
export function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  // robust-predicates works in y-down axes, so its counter-clockwise (ours) comes out negative
  const det = orient2d(ax, ay, bx, by, cx, cy);
  return det === 0 ? 0 : -det;
}
