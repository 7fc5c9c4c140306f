import { GATE_TURN_RAD } from '../rules.js';

/**
 * Gate positions along the lap: gate 0 at s = 0 (the start line), then gates at equal steps of
 * ∫ ds / gap_c(s), where the law's gap g(κ) = clamp(GATE_TURN_RAD / |κ|, min, max) is scaled and
 * clamped again, gap_c = clamp(c · g, min, max). The count is n = ceil(∫ ds / g) (or the most
 * gaps of at least `min` that fit, when fewer), and c is found by bisection so that the integral
 * is exactly n. Every gap is then a harmonic mean of gap_c over itself: within [min, max], and,
 * as c <= 1 unless capped, no longer than the arithmetic mean of the law over it (denser where
 * the road bends harder).
 *
 * @param curvature signed curvature at n evenly spaced points, 1/m
 * @param spacingM gap between points, metres
 * @returns increasing lap positions, the first 0; null when no whole number of gaps fits [min, max]
 */
export function placeGates(curvature: Float64Array, spacingM: number, range: { min: number; max: number }): Float64Array | null {
  const n = curvature.length;
  const lapM = n * spacingM;
  const law = new Float64Array(n);
  for (let i = 0; i < n; i++) law[i] = wantedGap(curvature[i], 1, range.min, range.max);
  const integralFor = (c: number, out?: Float64Array) => {
    let sum = 0;
    let prev = 1 / clamp(c * law[0], range.min, range.max);
    if (out) out[0] = 0;
    for (let i = 1; i <= n; i++) {
      // law[i % n] without an integer division (the root search runs a dozen passes)
      const next = 1 / clamp(c * law[i < n ? i : 0], range.min, range.max);
      sum += 0.5 * (prev + next) * spacingM;
      if (out) out[i] = sum;
      prev = next;
    }
    return sum;
  };
  const fewest = Math.ceil(lapM / range.max - 1e-9);
  const most = Math.floor(lapM / range.min + 1e-9);
  if (fewest > most) return null;
  const count = Math.max(1, Math.min(most, Math.ceil(integralFor(1) - 1e-9)));
  // integralFor falls from lapM / min (c → 0) to lapM / max (c → ∞): bracket, then regula falsi
  // with the Illinois step (superlinear; a few passes over the samples instead of sixty)
  let lo = 0, hi = 1;
  let fLo = integralFor(lo) - count, fHi = integralFor(hi) - count;
  while (fHi > 0 && hi < 1e6) {
    lo = hi;
    fLo = fHi;
    hi *= 2;
    fHi = integralFor(hi) - count;
  }
  let side = 0;
  for (let it = 0; it < ROOT_MAX_ITER && fLo > 0 && fHi < 0; it++) {
    const c = (lo * fHi - hi * fLo) / (fHi - fLo);
    const f = integralFor(c) - count;
    if (Math.abs(f) <= ROOT_TOL * count) {
      hi = c;
      break;
    }
    if (f > 0) {
      lo = c;
      fLo = f;
      if (side === -1) fHi /= 2;
      side = -1;
    } else {
      hi = c;
      fHi = f;
      if (side === 1) fLo /= 2;
      side = 1;
    }
  }
  if (fLo === 0) hi = lo; // the lower end solves it exactly (every gap at its minimum)
  const cumulative = new Float64Array(n + 1);
  const total = integralFor(hi, cumulative);
  const s = new Float64Array(count);
  let i = 0;
  for (let k = 1; k < count; k++) {
    const target = (k * total) / count;
    while (cumulative[i + 1] < target) i++;
    const t = (target - cumulative[i]) / (cumulative[i + 1] - cumulative[i]);
    s[k] = (i + t) * spacingM;
  }
  return s;
}

/** Relative tolerance of the gate count's integral (far below what 1 mm rounding of s shows). */
const ROOT_TOL = 1e-12;
/** Root-finding passes at most (the Illinois step converges in ~10). */
const ROOT_MAX_ITER = 100;

/** Wanted gap between gates at curvature κ: clamp(c · GATE_TURN_RAD / |κ|, min, max), metres. */
export function wantedGap(kappa: number, c: number, min: number, max: number): number {
  const a = Math.abs(kappa);
  if (a === 0) return max;
  return clamp((c * GATE_TURN_RAD) / a, min, max);
}

function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}
