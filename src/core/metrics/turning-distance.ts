// Arkin, Chew, Huttenlocher, Kedem & Mitchell, "An efficiently computable metric for comparing polygonal
// shapes", IEEE Trans. PAMI 13 (1991) 209-216.
import { turningFunction, type TurningFunction } from './turning-function.js';

const TWO_PI = 2 * Math.PI;

/**
 * Turning-function distance between two closed polygons, computed exactly (up to rounding):
 *
 *   D(A, B) = min over t ∈ [0, 1), θ of ( ∫₀¹ (Θ_A(u + t) − Θ_B(u) + θ)² du )^½
 *
 * with each perimeter normalised to 1. Invariant to translation, rotation, uniform scale, start vertex and
 * inserted collinear or repeated vertices; a metric (0 for similar polygons, symmetric, triangle inequality).
 * Both polygons are walked counter-clockwise: a clockwise one is reversed first (see {@link turningFunction}).
 *
 * For a fixed shift t the best rotation is θ = ∫Θ_B − ∫Θ_A − 2πt. Between critical shifts, where a vertex
 * of A lines up with a vertex of B, ∫(Θ_A(u+t) − Θ_B(u))² is linear in t and the squared mean is a
 * quadratic in t with positive leading coefficient 4π², so the minimised objective is concave there and
 * its minimum over t lies at a critical shift. All m·n of them are tried at O(m + n) each: O(mn(m + n))
 * for m and n vertices, so keep to a few thousand vertex pairs; use {@link turningDistance} beyond.
 *
 * @param a flat coordinates `[x0, y0, x1, y1, …]` in metres, closing edge implied.
 * @param b the same for the second polygon.
 * @returns the distance, in rad (a turning angle RMS over normalised arc length).
 * @throws {RangeError} when either polygon is degenerate (see {@link turningFunction}).
 * @example
 * const square = new Float64Array([0, 0, 1, 0, 1, 1, 0, 1]);
 * turningDistanceExact(square, new Float64Array([5, 5, 7, 5, 7, 7, 5, 7])); // 0
 */
export function turningDistanceExact(a: Float64Array, b: Float64Array): number {
  const f = turningFunction(a);
  const g = turningFunction(b);
  let best = Infinity;
  for (let i = 0; i < f.breaks.length - 1; i++) {
    for (let j = 0; j < g.breaks.length - 1; j++) {
      let t = f.breaks[i] - g.breaks[j];
      if (t < 0) t += 1;
      if (t >= 1) t -= 1;
      const h = squaredDistanceAtShift(f, g, t);
      if (h < best) best = h;
    }
  }
  return Math.sqrt(best);
}

/**
 * min over θ of ∫₀¹ (Θ_f(u + t) − Θ_g(u) + θ)² du for one shift t ∈ [0, 1), by merging the breakpoints of
 * Θ_f(· + t) and Θ_g. Exported for tests that sample t densely.
 */
export function squaredDistanceAtShift(f: TurningFunction, g: TurningFunction, t: number): number {
  const fb = f.breaks;
  const fv = f.values;
  const gb = g.breaks;
  const gv = g.values;
  const m = fv.length;
  // ∫₀¹ Θ_f(u + t) du = ∫Θ_f + 2πt since Θ_f(u + 1) = Θ_f(u) + 2π; subtracting the mean up front
  // avoids the cancellation of ∫d² − (∫d)²
  const mean = f.integral + TWO_PI * t - g.integral;

  // piece of Θ_f that contains t
  let lo = 0;
  let hi = m - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (fb[mid] <= t) lo = mid;
    else hi = mid - 1;
  }
  let q = lo; // index into Θ_f, ≥ m once wrapped past u + t = 1
  let fEnd = fb[q + 1] - t;
  let fVal = fv[q];
  let k = 0;
  let pos = 0;
  let sum = 0;
  while (pos < 1) {
    const end = Math.min(fEnd, gb[k + 1], 1);
    const d = fVal - gv[k] - mean;
    sum += (end - pos) * d * d;
    pos = end;
    if (fEnd <= end) {
      q++;
      const r = q < m ? q : q - m;
      fEnd = q < m ? fb[r + 1] - t : fb[r + 1] + 1 - t;
      fVal = q < m ? fv[r] : fv[r] + TWO_PI;
    }
    if (gb[k + 1] <= end && k + 1 < gv.length) k++;
  }
  return sum;
}

/**
 * Per-polygon data for {@link turningDistanceBetween}: the turning function averaged over `samples` equal
 * bins of normalised arc length (its L2 projection onto step functions on that grid).
 */
export interface TurningSignature {
  /** Number of bins N. */
  readonly samples: number;
  /** Mean of Θ (rad) over bin k = [k/N, (k+1)/N), for k = 0 … N − 1. */
  readonly values: Float64Array;
  /** ∫₀¹ Θ in rad (the mean of `values`). */
  readonly mean: number;
  /** ‖Θ − binned Θ‖₂ in rad: how far the bins are from the exact turning function. */
  readonly residual: number;
}

/**
 * Binned turning function of a closed polygon, to compare many polygons pairwise with
 * {@link turningDistanceBetween}. O(m + samples) for m vertices.
 *
 * @param coords flat coordinates `[x0, y0, x1, y1, …]` in metres, closing edge implied; a clockwise
 *   polygon is reversed first.
 * @param samples number of bins N (a positive integer).
 * @throws {RangeError} when samples is not a positive integer or the polygon is degenerate.
 * @example
 * const sig = turningSignature(new Float64Array([0, 0, 1, 0, 1, 1, 0, 1]), 4);
 * sig.values; // [0, π/2, π, 3π/2]
 */
export function turningSignature(coords: Float64Array, samples = 512): TurningSignature {
  if (!Number.isInteger(samples) || samples < 1) {
    throw new RangeError(`samples must be a positive integer, got ${samples}.`);
  }
  const f = turningFunction(coords);
  const values = new Float64Array(samples);
  binIntegrals(f, samples, (k, w, v) => (values[k] += w * v * samples));
  let residual2 = 0;
  binIntegrals(f, samples, (k, w, v) => (residual2 += w * (v - values[k]) ** 2));
  return { samples, values, mean: f.integral, residual: Math.sqrt(residual2) };
}

/** Calls `add(bin, width, value)` for every overlap of a piece of Θ with one of `samples` equal bins. */
function binIntegrals(f: TurningFunction, samples: number, add: (bin: number, width: number, value: number) => void): void {
  const { breaks, values } = f;
  let piece = 0;
  for (let k = 0; k < samples; k++) {
    const lo = k / samples;
    const hi = (k + 1) / samples;
    while (piece < values.length - 1 && breaks[piece + 1] <= lo) piece++;
    for (let p = piece; p < values.length && breaks[p] < hi; p++) {
      const w = Math.min(hi, breaks[p + 1]) - Math.max(lo, breaks[p]);
      if (w > 0) add(k, w, values[p]);
    }
  }
}

/**
 * Approximate turning-function distance (rad) between two signatures with the same number of bins N:
 * the exact distance of the binned functions, minimised over the N cyclic bin shifts with the best
 * rotation per shift in closed form. O(N²).
 *
 * Error: if D is the exact distance ({@link turningDistanceExact}), then
 * D − (rA + rB) ≤ result ≤ D + ‖Θ_A(· + δ) − Θ_A‖₂ for some |δ| ≤ 1/(2N), where rA, rB are the signatures'
 * `residual`s. Both terms shrink with the size of the largest turns, so the approximation suits smooth
 * polygons with many small turns (sampled tracks) better than coarse ones.
 *
 * @throws {RangeError} when the signatures have different numbers of bins.
 * @example
 * const circle = (n: number) => Float64Array.from({ length: 2 * n }, (_, i) =>
 *   (i % 2 ? Math.sin : Math.cos)((2 * Math.PI * (i >> 1)) / n));
 * turningDistanceBetween(turningSignature(circle(1000)), turningSignature(circle(3000))); // ≈ 0.002
 */
export function turningDistanceBetween(a: TurningSignature, b: TurningSignature): number {
  const n = a.samples;
  if (b.samples !== n) throw new RangeError(`signatures differ in samples: ${n} and ${b.samples}.`);
  // Θ_A over two laps, so a shift needs no wrap test in the inner loop
  const av = new Float64Array(2 * n);
  av.set(a.values);
  for (let k = 0; k < n; k++) av[n + k] = a.values[k] + TWO_PI;
  const bv = b.values;
  let best = Infinity;
  for (let j = 0; j < n; j++) {
    // the optimal rotation makes the mean difference zero; the mean of the shifted Θ_A grows by 2π·j/N
    const mean = a.mean + (TWO_PI * j) / n - b.mean;
    let sum = 0;
    for (let k = 0; k < n; k++) {
      const d = av[j + k] - bv[k] - mean;
      sum += d * d;
    }
    if (sum < best) best = sum;
  }
  return Math.sqrt(best / n);
}

/**
 * Approximate turning-function distance (rad) between two closed polygons, for large polygons:
 * `turningDistanceBetween(turningSignature(a, samples), turningSignature(b, samples))`. To compare many
 * polygons, compute each signature once instead.
 *
 * @param samples bins of normalised arc length (positive integer); more is finer and slower (O(samples²)).
 * @throws {RangeError} when samples is not a positive integer or a polygon is degenerate.
 * @example
 * const square = new Float64Array([0, 0, 1, 0, 1, 1, 0, 1]);
 * turningDistance(square, square.map((v) => 3 * v)); // 0
 */
export function turningDistance(a: Float64Array, b: Float64Array, samples = 512): number {
  return turningDistanceBetween(turningSignature(a, samples), turningSignature(b, samples));
}
