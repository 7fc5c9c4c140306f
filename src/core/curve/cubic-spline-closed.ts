// Closed (periodic) interpolating cubic spline with chord-length knots: C² through every
// control point, so curvature is continuous along the loop and its error shrinks with the
// square of the gap (de Boor, "A Practical Guide to Splines", 1978, ch. IV; periodic end
// conditions). The cyclic tridiagonal system is solved with the Sherman–Morrison formula.
// Output uses the same per-segment cubic layout as catmullRomClosed, so arc length,
// resampling and curvature work on either.

import { COEF_STRIDE, MIN_CHORD_M, type ClosedSpline } from './catmull-rom-closed.js';

/**
 * Build the closed C² cubic spline through `control`, knots spaced by chord length.
 *
 * On segment i (chord h_i, second derivatives M_i, M_{i+1} with respect to t = u·h_i):
 *   S(t) = P_i + b t + M_i t²/2 + (M_{i+1} − M_i) t³ / (6 h_i),
 *   b = (P_{i+1} − P_i)/h_i − h_i (2 M_i + M_{i+1}) / 6,
 * and continuity of S' around the loop gives, for every i (indices modulo n),
 *   h_{i−1} M_{i−1} + 2 (h_{i−1} + h_i) M_i + h_i M_{i+1} = 6 ((P_{i+1} − P_i)/h_i − (P_i − P_{i−1})/h_{i−1}).
 *
 * @param control flat `[x0, y0, x1, y1, …]` in metres, at least 3 points, first not repeated
 * @returns the spline (`alpha` 1: chord-length knots; `knotIntervals` are the chords, m)
 * @throws {RangeError} fewer than 3 points, an odd-length array, a non-finite coordinate, or two
 *   consecutive points closer than MIN_CHORD_M
 * @example
 * const spline = cubicSplineClosed(new Float64Array([10, 0, 0, 10, -10, 0, 0, -10]));
 */
export function cubicSplineClosed(control: Float64Array): ClosedSpline {
  if (control.length % 2 !== 0) throw new RangeError(`control points must be flat [x0, y0, x1, y1, …], got odd length ${control.length}`);
  const n = control.length / 2;
  if (n < 3) throw new RangeError(`closed spline needs >= 3 control points, got ${n}`);
  const p = Float64Array.from(control);
  const h = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const dx = p[2 * j] - p[2 * i], dy = p[2 * j + 1] - p[2 * i + 1];
    // sqrt of a sum of squares is exact IEEE on every engine (Math.hypot is not specified to the bit)
    const d = Math.sqrt(dx * dx + dy * dy);
    if (!(d >= MIN_CHORD_M) || !Number.isFinite(d)) {
      throw new RangeError(`control points ${i} and ${j} are ${d} m apart (need finite and >= ${MIN_CHORD_M} m): remove the duplicate point`);
    }
    h[i] = d;
  }
  const coef = new Float64Array(COEF_STRIDE * n);
  const rhs = new Float64Array(n);
  const m = new Float64Array(n);
  const work = new Float64Array(3 * n);
  for (let k = 0; k < 2; k++) {
    for (let i = 0; i < n; i++) {
      const a = i === 0 ? n - 1 : i - 1;
      const j = i + 1 === n ? 0 : i + 1;
      rhs[i] = 6 * ((p[2 * j + k] - p[2 * i + k]) / h[i] - (p[2 * i + k] - p[2 * a + k]) / h[a]);
    }
    solveCyclic(h, rhs, m, work);
    for (let i = 0; i < n; i++) {
      const j = i + 1 === n ? 0 : i + 1;
      const hi = h[i];
      const p0 = p[2 * i + k], p1 = p[2 * j + k];
      const b = (p1 - p0) / hi - (hi * (2 * m[i] + m[j])) / 6;
      const o = COEF_STRIDE * i + 4 * k;
      coef[o] = p0;
      coef[o + 1] = b * hi;
      coef[o + 2] = (m[i] / 2) * hi * hi;
      coef[o + 3] = ((m[j] - m[i]) / 6) * hi * hi;
    }
  }
  return { alpha: 1, control: p, segmentCount: n, coef, knotIntervals: h };
}

/**
 * Solves the symmetric cyclic tridiagonal system with sub/super-diagonal h_{i−1}, h_i and
 * diagonal 2 (h_{i−1} + h_i): Thomas algorithm on the open system plus a Sherman–Morrison
 * correction for the two corner entries. Strictly diagonally dominant, so no pivoting.
 */
function solveCyclic(h: Float64Array, rhs: Float64Array, out: Float64Array, work: Float64Array): void {
  const n = h.length;
  // A = T + u vᵀ with u = (γ, 0, …, 0, h_{n−1}), v = (1, 0, …, 0, h_{n−1}/γ), γ = −diag_0
  const diag0 = 2 * (h[n - 1] + h[0]);
  const gamma = -diag0;
  const cp = work.subarray(0, n);
  const y = work.subarray(n, 2 * n);
  const z = work.subarray(2 * n, 3 * n);
  // T's diagonal: diag_0 − γ at 0, diag_{n−1} − h_{n−1}²/γ at n−1
  const diagAt = (i: number) => {
    const d = 2 * (h[i === 0 ? n - 1 : i - 1] + h[i]);
    if (i === 0) return d - gamma;
    if (i === n - 1) return d - (h[n - 1] * h[n - 1]) / gamma;
    return d;
  };
  // forward sweep for both right-hand sides (rhs and u)
  let denom = diagAt(0);
  cp[0] = h[0] / denom;
  y[0] = rhs[0] / denom;
  z[0] = gamma / denom;
  for (let i = 1; i < n; i++) {
    const sub = h[i - 1];
    denom = diagAt(i) - sub * cp[i - 1];
    cp[i] = i < n - 1 ? h[i] / denom : 0;
    const ui = i === n - 1 ? h[n - 1] : 0;
    y[i] = (rhs[i] - sub * y[i - 1]) / denom;
    z[i] = (ui - sub * z[i - 1]) / denom;
  }
  for (let i = n - 2; i >= 0; i--) {
    y[i] -= cp[i] * y[i + 1];
    z[i] -= cp[i] * z[i + 1];
  }
  const vn = h[n - 1] / gamma;
  const factor = (y[0] + vn * y[n - 1]) / (1 + z[0] + vn * z[n - 1]);
  for (let i = 0; i < n; i++) out[i] = y[i] - factor * z[i];
}
