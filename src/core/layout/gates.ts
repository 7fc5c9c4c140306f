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
      const next = 1 / clamp(c * law[i % n], range.min, range.max);
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
  // integralFor falls from lapM / min (c → 0) to lapM / max (c → ∞)
  let lo = 0, hi = 1;
  while (integralFor(hi) > count && hi < 1e6) hi *= 2;
  for (let it = 0; it < 60; it++) {
    const mid = 0.5 * (lo + hi);
    if (integralFor(mid) > count) lo = mid;
    else hi = mid;
  }
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

/** Wanted gap between gates at curvature κ: clamp(c · GATE_TURN_RAD / |κ|, min, max), metres. */
export function wantedGap(kappa: number, c: number, min: number, max: number): number {
  const a = Math.abs(kappa);
  if (a === 0) return max;
  return clamp((c * GATE_TURN_RAD) / a, min, max);
}

function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}
