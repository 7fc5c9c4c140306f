import { GATE_TURN_RAD } from '../rules.js';

/**
 * Gate positions along the lap: gate 0 at s = 0 (the start line), then gates at equal steps of
 * ∫ ds / gap_c(s), where the wanted gap is gap_c = clamp(c · GATE_TURN_RAD / |κ|, min, max).
 * The number of gates is n = ceil(∫ ds / gap_1) and c <= 1 is found by bisection so that the
 * integral is exactly n: every gap is then a harmonic mean of gap_c over itself, hence within
 * [min, max] and never longer than the arithmetic mean of gap_1 (denser where the road bends).
 *
 * @param curvature signed curvature at n evenly spaced points, 1/m
 * @param spacingM gap between points, metres
 * @returns increasing lap positions, the first 0; null when no whole number of gates fits
 */
export function placeGates(curvature: Float64Array, spacingM: number, range: { min: number; max: number }): Float64Array | null {
  const n = curvature.length;
  const lapM = n * spacingM;
  const integralFor = (c: number, out?: Float64Array) => {
    let sum = 0;
    let prev = 1 / wantedGap(curvature[0], c, range.min, range.max);
    if (out) out[0] = 0;
    for (let i = 1; i <= n; i++) {
      const next = 1 / wantedGap(curvature[i % n], c, range.min, range.max);
      sum += 0.5 * (prev + next) * spacingM;
      if (out) out[i] = sum;
      prev = next;
    }
    return sum;
  };
  const p1 = integralFor(1);
  const count = Math.max(1, Math.ceil(p1 - 1e-9));
  if (count > Math.floor(lapM / range.min + 1e-9)) return null;
  let lo = 0, hi = 1;
  if (integralFor(lo) < count) return null;
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
  const g = (c * GATE_TURN_RAD) / a;
  return g < min ? min : g > max ? max : g;
}
