// Arkin, Chew, Huttenlocher, Kedem & Mitchell, "An efficiently computable metric for comparing polygonal
// shapes", IEEE Trans. PAMI 13 (1991) 209-216: the turning function of a polygon.
import { signedArea } from '../geom/polyline.js';

const TWO_PI = 2 * Math.PI;

/**
 * The turning function Θ(u) of a closed polygon: the heading (rad) of the boundary at normalised arc
 * length u ∈ [0, 1), walked counter-clockwise from vertex 0. Piecewise constant: Θ = `values[k]` on
 * [`breaks[k]`, `breaks[k + 1]`), with `breaks[0] = 0` and `breaks[m] = 1`. Extended beyond [0, 1) by
 * Θ(u + 1) = Θ(u) + 2π.
 */
export interface TurningFunction {
  /** m + 1 normalised arc-length positions of the vertices, from 0 to 1. */
  readonly breaks: Float64Array;
  /** m headings in rad: atan2 of edge 0, then accumulated signed turns (left positive). */
  readonly values: Float64Array;
  /** ∫₀¹ Θ(u) du in rad. */
  readonly integral: number;
  /** Σ |turn| over all m vertices in rad (the total variation of Θ over one lap, ≥ 2π). */
  readonly totalTurn: number;
}

/**
 * Turning function of the closed polygon with flat coordinates `[x0, y0, x1, y1, …]` (metres, x right,
 * y up; the closing edge is implied).
 *
 * A clockwise polygon (negative signed area) is walked in reverse, so both orientations of one shape give
 * the same function. Zero-length edges (repeated vertices) are dropped and collinear vertices give a zero
 * turn, so neither changes Θ. The polygon may self-intersect as long as its turning number is 1.
 *
 * @throws {RangeError} for fewer than 3 vertices, zero signed area, or a turning number other than 1
 *   (for example a figure-eight or a boundary that turns back on itself by exactly π).
 * @example
 * const f = turningFunction(new Float64Array([0, 0, 1, 0, 1, 1, 0, 1]));
 * f.breaks; // [0, 0.25, 0.5, 0.75, 1]
 * f.values; // [0, π/2, π, 3π/2]
 */
export function turningFunction(coords: Float64Array): TurningFunction {
  const n = coords.length >> 1;
  if (n < 3) throw new RangeError(`turning function needs a polygon of >= 3 vertices, got ${n}.`);
  const area = signedArea(coords);
  if (!(area !== 0)) throw new RangeError(`turning function needs a polygon of non-zero area, got ${area}.`);
  const step = area > 0 ? 1 : -1;
  const first = area > 0 ? 0 : n - 1;

  // edge vectors in walking order, zero-length ones dropped
  const ex: number[] = [];
  const ey: number[] = [];
  const len: number[] = [];
  for (let k = 0; k < n; k++) {
    const i = (first + step * k + n) % n;
    const j = (i + step + n) % n;
    const dx = coords[2 * j] - coords[2 * i];
    const dy = coords[2 * j + 1] - coords[2 * i + 1];
    if (dx === 0 && dy === 0) continue;
    ex.push(dx);
    ey.push(dy);
    len.push(Math.sqrt(dx * dx + dy * dy));
  }
  const m = ex.length;

  const values = new Float64Array(m);
  let heading = Math.atan2(ey[0], ex[0]);
  let totalTurn = 0;
  let winding = 0;
  for (let k = 0; k < m; k++) {
    const p = (k + m - 1) % m;
    // signed exterior angle from the previous edge, in (−π, π]
    const turn = Math.atan2(ex[p] * ey[k] - ey[p] * ex[k], ex[p] * ex[k] + ey[p] * ey[k]);
    if (k > 0) heading += turn;
    values[k] = heading;
    totalTurn += Math.abs(turn);
    winding += turn;
  }
  const turningNumber = Math.round(winding / TWO_PI);
  if (turningNumber !== 1) {
    throw new RangeError(`turning function needs a turning number of 1, got ${turningNumber} - is the polygon a figure-eight or does it fold back?`);
  }

  let perimeter = 0;
  for (let k = 0; k < m; k++) perimeter += len[k];
  const breaks = new Float64Array(m + 1);
  let s = 0;
  let integral = 0;
  for (let k = 0; k < m; k++) {
    s += len[k];
    // the last break is exactly 1 so the pieces tile [0, 1)
    breaks[k + 1] = k + 1 === m ? 1 : s / perimeter;
    integral += values[k] * (breaks[k + 1] - breaks[k]);
  }
  return { breaks, values, integral, totalTurn };
}
