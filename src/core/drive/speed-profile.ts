/**
 * The friction-limited speed profile of a closed lap, by the quasi-steady method: the speed at
 * each point is capped by the tyres' grip in the corner, v ≤ √(μg / |κ|), and by the top speed;
 * then a forward pass lets the car accelerate out of each slow point (v² grows by at most
 * 2·a_acc·ds per step) and a backward pass makes it brake in time for the next one (v² falls by
 * at most 2·a_brk·ds). Longitudinal and lateral grip are not coupled (no friction circle): a
 * deliberate simplification that keeps the profile a closed form between slow points.
 *
 * Sources: N. R. Kapania, J. Subosits, J. C. Gerdes, "A sequential two-step algorithm for fast
 * generation of vehicle racing trajectories", J. Dyn. Sys., Meas., Control 138(9) (2016)
 * 091005, https://doi.org/10.1115/1.4033311 (the forward/backward passes); T. Lipp, S. Boyd,
 * "Minimum-time speed optimisation over a fixed path", Int. J. Control 87(6) (2014) 1297–1311.
 */

/** Standard gravity, m/s² (the conventional value, exact by definition). */
export const STANDARD_GRAVITY_MPS2 = 9.80665;

/** Grip and power limits the profile obeys. */
export interface SpeedLimits {
  /** Tyre–road friction coefficient (dimensionless). */
  readonly mu: number;
  /** Largest forward acceleration, m/s² (the tyres cap it at μg as well). */
  readonly maxAccelMps2: number;
  /** Largest braking deceleration (positive), m/s² (the tyres cap it at μg as well). */
  readonly maxBrakeMps2: number;
  /** Top speed, m/s. */
  readonly topSpeedMps: number;
}

/** The profile and its summary figures. */
export interface SpeedProfile {
  /** Speed at each point of the lap, m/s. */
  readonly speedMps: Float64Array;
  /** Time from the start line to each point, seconds (timeS[0] = 0). */
  readonly timeS: Float64Array;
  /** Time of one flying lap, seconds. */
  readonly lapTimeS: number;
  /** Lap length over lap time, m/s. */
  readonly averageSpeedMps: number;
  readonly minSpeedMps: number;
  readonly maxSpeedMps: number;
  /** Time spent on steps where the speed falls, seconds. */
  readonly brakingTimeS: number;
}

/**
 * Speed profile of one flying lap over points evenly spaced along a closed path.
 *
 * The passes start at the point with the lowest grip cap: there the speed equals its cap (no
 * neighbour can force it lower), so one forward and one backward pass settle every point; the
 * loop runs the passes again until nothing changes, which checks that in one more pass.
 * Between points the acceleration is constant, so a step of ds at speeds v₀, v₁ takes
 * 2·ds / (v₀ + v₁) exactly.
 *
 * @param curvature signed curvature at each point, 1/m (only |κ| matters)
 * @param spacingM distance between consecutive points along the path, metres (the last point
 *   joins the first)
 * @param limits friction coefficient, acceleration and braking limits, top speed
 * @returns speeds, times and summary figures of the lap
 * @throws RangeError with fewer than 2 points or non-positive spacing, grip or speed limits
 * @example speedProfile(new Float64Array(314).fill(1 / 50), (2 * Math.PI * 50) / 314, { mu: 1, maxAccelMps2: 9.8, maxBrakeMps2: 9.8, topSpeedMps: 90 }).lapTimeS // 14.1875 s
 */
export function speedProfile(curvature: ArrayLike<number>, spacingM: number, limits: SpeedLimits): SpeedProfile {
  const n = curvature.length;
  if (n < 2) throw new RangeError(`a closed speed profile needs >= 2 points, got ${n}`);
  if (!(spacingM > 0) || !(limits.mu > 0) || !(limits.topSpeedMps > 0) || !(limits.maxAccelMps2 > 0) || !(limits.maxBrakeMps2 > 0)) {
    throw new RangeError('spacingM, mu, topSpeedMps, maxAccelMps2 and maxBrakeMps2 must all be positive');
  }
  const grip = limits.mu * STANDARD_GRAVITY_MPS2;
  const accel = Math.min(limits.maxAccelMps2, grip);
  const brake = Math.min(limits.maxBrakeMps2, grip);
  const vTop2 = limits.topSpeedMps * limits.topSpeedMps;
  // work on v²: the passes are then linear in ds
  const v2 = new Float64Array(n);
  let start = 0;
  for (let i = 0; i < n; i++) {
    const k = Math.abs(curvature[i]);
    v2[i] = k > 0 ? Math.min(vTop2, grip / k) : vTop2;
    if (v2[i] < v2[start]) start = i;
  }
  const up = 2 * accel * spacingM;
  const down = 2 * brake * spacingM;
  for (let changed = true; changed; ) {
    changed = false;
    // once round forward from the start, then once round backward (indices wrap by hand: no modulo)
    for (let k = 1, prev = start; k <= n; k++) {
      const i = prev + 1 === n ? 0 : prev + 1;
      const reach = v2[prev] + up;
      if (reach < v2[i]) {
        v2[i] = reach;
        changed = true;
      }
      prev = i;
    }
    for (let k = 1, next = start; k <= n; k++) {
      const i = next === 0 ? n - 1 : next - 1;
      const reach = v2[next] + down;
      if (reach < v2[i]) {
        v2[i] = reach;
        changed = true;
      }
      next = i;
    }
  }
  const speedMps = new Float64Array(n);
  for (let i = 0; i < n; i++) speedMps[i] = Math.sqrt(v2[i]);
  const timeS = new Float64Array(n);
  let t = 0, braking = 0, vMin = Infinity, vMax = 0;
  for (let i = 0; i < n; i++) {
    const a = speedMps[i], b = speedMps[i + 1 === n ? 0 : i + 1];
    if (i > 0) timeS[i] = t;
    const dt = (2 * spacingM) / (a + b);
    t += dt;
    if (b < a) braking += dt;
    if (a < vMin) vMin = a;
    if (a > vMax) vMax = a;
  }
  return { speedMps, timeS, lapTimeS: t, averageSpeedMps: (n * spacingM) / t, minSpeedMps: vMin, maxSpeedMps: vMax, brakingTimeS: braking };
}
