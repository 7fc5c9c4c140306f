// Closed Catmull–Rom spline with chord-power knots, as cubic polynomials per segment.
// Source: C. Yuksel, S. Schaefer, J. Keyser, "Parameterization and applications of
// Catmull–Rom curves", Computer-Aided Design 43 (2011) 747–755; the pyramid evaluation it
// builds on is P. J. Barry, R. N. Goldman, "A recursive evaluation algorithm for a class of
// Catmull–Rom splines", SIGGRAPH 1988.
//
// Knots: t_{i+1} = t_i + |P_{i+1} − P_i|^alpha, wrapping from the last point to the first.
// Segment i runs from P_i (u = 0) to P_{i+1} (u = 1); u ∈ [0, 1] is the local parameter
// of one segment, t = t_i + u·Δt_i. The Barry–Goldman pyramid on (P_{i-1}, P_i, P_{i+1},
// P_{i+2}) is the cubic Hermite curve whose end derivatives (d/dt) are
//
//   m_i = (P_i − P_{i-1})/Δ_{i-1} − (P_{i+1} − P_{i-1})/(Δ_{i-1} + Δ_i) + (P_{i+1} − P_i)/Δ_i
//
// so every control point gets one derivative and the curve is C¹ in t (only C¹: curvature
// jumps at control points). Within [0, 1], alpha = 0.5 is the only exponent that guarantees
// no cusp and no self-intersection inside a segment; segments can still cross each other.
//
//        P_{i-1}         P_{i+2}
//           \    seg i     /
//            P_i ~~~~~~~ P_{i+1}
//           m_i           m_{i+1}

/** Chords shorter than this (m) are rejected: the knot interval Δ = chord^alpha tends to 0
 *  and the tangent m_i divides by it, so the spline would blow up near a duplicate point. */
export const MIN_CHORD_M = 1e-9;

/** Numbers stored per segment in {@link ClosedSpline.coef}. */
export const COEF_STRIDE = 8;

/**
 * A closed piecewise-cubic curve through the control points, one segment per chord.
 * Segment `seg` is `x(u) = c[0] + c[1]·u + c[2]·u² + c[3]·u³` and `y(u)` likewise with
 * `c[4..7]`, where `c = coef.subarray(8·seg, 8·seg + 8)` and u ∈ [0, 1].
 * Axes: x right, y up, metres.
 */
export type ClosedSpline = {
  /** knot exponent: 0 uniform, 0.5 centripetal, 1 chordal */
  readonly alpha: number;
  /** copy of the control points `[x0, y0, x1, y1, …]` (m); segment i starts at point i */
  readonly control: Float64Array;
  /** number of segments = number of control points */
  readonly segmentCount: number;
  /** cubic coefficients, {@link COEF_STRIDE} per segment: `[x0, x1, x2, x3, y0, y1, y2, y3]` */
  readonly coef: Float64Array;
  /** knot interval Δ_i = |P_{i+1} − P_i|^alpha of each segment (m^alpha) */
  readonly knotIntervals: Float64Array;
};

/**
 * Build the closed Catmull–Rom spline through `control` with knot exponent `alpha`.
 * The curve passes through every control point and wraps from the last back to the first.
 *
 * @param control flat coordinates `[x0, y0, x1, y1, …]` in metres, at least 3 points,
 *   the first point not repeated at the end
 * @param alpha knot exponent in [0, 1]: 0 uniform, 0.5 centripetal (no cusp or
 *   self-intersection within a segment), 1 chordal
 * @returns the spline with per-segment cubic coefficients
 * @throws {RangeError} fewer than 3 points, an odd-length array, alpha outside [0, 1], a
 *   non-finite coordinate, or two consecutive points closer than {@link MIN_CHORD_M}
 * @example
 * const square = new Float64Array([0, 0, 10, 0, 10, 10, 0, 10]);
 * const spline = catmullRomClosed(square); // centripetal
 * const p = new Float64Array(2);
 * splinePoint(spline, 1, 0, p); // p = [10, 0]
 */
export function catmullRomClosed(control: Float64Array, alpha = 0.5): ClosedSpline {
  if (control.length % 2 !== 0) {
    throw new RangeError(`control points must be flat [x0, y0, x1, y1, …], got odd length ${control.length}`);
  }
  const n = control.length / 2;
  if (n < 3) throw new RangeError(`closed spline needs >= 3 control points, got ${n}`);
  if (!(alpha >= 0 && alpha <= 1)) throw new RangeError(`alpha must lie in [0, 1], got ${alpha}`);

  const p = Float64Array.from(control);
  const dt = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const dx = p[2 * j] - p[2 * i];
    const dy = p[2 * j + 1] - p[2 * i + 1];
    const d2 = dx * dx + dy * dy;
    // !(>=) also catches NaN and infinite coordinates
    if (!(d2 >= MIN_CHORD_M * MIN_CHORD_M) || !Number.isFinite(d2)) {
      throw new RangeError(
        `control points ${i} and ${j} are ${Math.sqrt(d2)} m apart (need finite and >= ${MIN_CHORD_M} m): remove the duplicate point`,
      );
    }
    dt[i] = knotInterval(d2, alpha);
  }

  // derivative d/dt at every control point (see header)
  const m = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const h = i === 0 ? n - 1 : i - 1;
    const j = i + 1 === n ? 0 : i + 1;
    const d0 = dt[h];
    const d1 = dt[i];
    const d01 = d0 + d1;
    for (let k = 0; k < 2; k++) {
      const a = p[2 * h + k];
      const b = p[2 * i + k];
      const c = p[2 * j + k];
      m[2 * i + k] = (b - a) / d0 - (c - a) / d01 + (c - b) / d1;
    }
  }

  // cubic Hermite in u: tangents scaled by the segment's knot interval
  const coef = new Float64Array(COEF_STRIDE * n);
  for (let i = 0; i < n; i++) {
    const j = i + 1 === n ? 0 : i + 1;
    const d = dt[i];
    for (let k = 0; k < 2; k++) {
      const p0 = p[2 * i + k];
      const p1 = p[2 * j + k];
      const v0 = m[2 * i + k] * d;
      const v1 = m[2 * j + k] * d;
      const o = COEF_STRIDE * i + 4 * k;
      coef[o] = p0;
      coef[o + 1] = v0;
      coef[o + 2] = 3 * (p1 - p0) - 2 * v0 - v1;
      coef[o + 3] = 2 * (p0 - p1) + v0 + v1;
    }
  }
  return { alpha, control: p, segmentCount: n, coef, knotIntervals: dt };
}

/**
 * Point of segment `seg` at local parameter u ∈ [0, 1], written to `out[0..1]` (m).
 * `u = 0` returns control point `seg` exactly. `seg` must be an integer in
 * [0, segmentCount); it is not checked because this runs in the innermost loops.
 * @example splinePoint(spline, 0, 0.5, out); // midpoint in parameter of the first segment
 */
export function splinePoint(spline: ClosedSpline, seg: number, u: number, out: Float64Array): Float64Array {
  const c = spline.coef;
  const o = COEF_STRIDE * seg;
  out[0] = c[o] + u * (c[o + 1] + u * (c[o + 2] + u * c[o + 3]));
  out[1] = c[o + 4] + u * (c[o + 5] + u * (c[o + 6] + u * c[o + 7]));
  return out;
}

/**
 * First and second derivatives with respect to the local parameter u of segment `seg`,
 * written to `out = [x′, y′, x″, y″]` (m per unit u, m per unit u²). Divide x′, y′ by
 * `knotIntervals[seg]` for d/dt. `seg` is not checked, as in {@link splinePoint}.
 * @example splineDerivatives(spline, 3, 0.25, out); // out[0..1] is the velocity d/du
 */
export function splineDerivatives(spline: ClosedSpline, seg: number, u: number, out: Float64Array): Float64Array {
  const c = spline.coef;
  const o = COEF_STRIDE * seg;
  out[0] = c[o + 1] + u * (2 * c[o + 2] + 3 * u * c[o + 3]);
  out[1] = c[o + 5] + u * (2 * c[o + 6] + 3 * u * c[o + 7]);
  out[2] = 2 * c[o + 2] + 6 * u * c[o + 3];
  out[3] = 2 * c[o + 6] + 6 * u * c[o + 7];
  return out;
}

// |d|^alpha from d² with exact IEEE operations for the common exponents
function knotInterval(d2: number, alpha: number): number {
  if (alpha === 0) return 1;
  if (alpha === 0.5) return Math.sqrt(Math.sqrt(d2));
  if (alpha === 1) return Math.sqrt(d2);
  return Math.pow(d2, alpha / 2);
}
