import type { Corner, TrackMetrics } from '../track.js';

/** Reference values of the difficulty figure: turning density (deg per 100 m), radius (m), width (m). */
export const DIFFICULTY_REF = { turningPer100M: 60, radiusM: 15, widthM: 12 } as const;
/** Weights of the three difficulty terms (they add to 1). */
export const DIFFICULTY_WEIGHTS = { turning: 0.5, radius: 0.3, width: 0.2 } as const;

/**
 * Difficulty on 0..10 (README "Difficulty"):
 *   D = 10 · (0.5 h(T / 60) + 0.3 h(15 / Rmin) + 0.2 h(12 / W)),  h(x) = x / (1 + x)
 * with T the total turning in degrees per 100 m of lap, Rmin the tightest radius and W the mean
 * road width, both in metres. Each term rises with what makes a lap harder (more turning per
 * metre, tighter corners, narrower road) and saturates, so D sorts tracks without bound effects;
 * the default request scores 5.
 */
export function difficulty(totalTurningDeg: number, lengthM: number, minRadiusM: number, meanWidthM: number): number {
  const h = (x: number) => x / (1 + x);
  const t = (100 * totalTurningDeg) / lengthM / DIFFICULTY_REF.turningPer100M;
  return (
    10 *
    (DIFFICULTY_WEIGHTS.turning * h(t) +
      DIFFICULTY_WEIGHTS.radius * h(DIFFICULTY_REF.radiusM / minRadiusM) +
      DIFFICULTY_WEIGHTS.width * h(DIFFICULTY_REF.widthM / meanWidthM))
  );
}

/** Input of `trackMetrics`: shipped per-point arrays of an evenly sampled closed centerline. */
export interface MetricsInput {
  readonly lengthM: number;
  readonly spacingM: number;
  readonly curvature: Float64Array;
  readonly widthM: Float64Array;
  readonly corners: readonly Corner[];
  readonly minClearanceM: number;
  readonly gateCount: number;
}

/** Metrics of shared/DESIGN.md from the shipped arrays (turning by the rectangle rule on the even grid). */
export function trackMetrics(m: MetricsInput): Omit<TrackMetrics, never> {
  let abs = 0, net = 0, kMax = 0, wMin = Infinity, wMax = 0, wSum = 0;
  const n = m.curvature.length;
  for (let i = 0; i < n; i++) {
    const k = m.curvature[i];
    abs += Math.abs(k);
    net += k;
    if (Math.abs(k) > kMax) kMax = Math.abs(k);
    const w = m.widthM[i];
    if (w < wMin) wMin = w;
    if (w > wMax) wMax = w;
    wSum += w;
  }
  const deg = (180 / Math.PI) * m.spacingM;
  let right = 0, rightAngle = 0, angle = 0;
  for (const c of m.corners) {
    angle += c.angleDeg;
    if (c.direction === 'right') {
      right++;
      rightAngle += c.angleDeg;
    }
  }
  const totalTurningDeg = abs * deg;
  const minRadiusM = kMax > 0 ? 1 / kMax : Infinity;
  return {
    lengthM: m.lengthM,
    totalTurningDeg,
    netTurningDeg: net * deg,
    rightCornerShare: m.corners.length > 0 ? right / m.corners.length : 0,
    rightTurningShare: angle > 0 ? rightAngle / angle : 0,
    minRadiusM,
    width: { min: wMin, max: wMax },
    minClearanceM: m.minClearanceM,
    cornerCount: m.corners.length,
    gateCount: m.gateCount,
    difficulty: difficulty(totalTurningDeg, m.lengthM, minRadiusM, wSum / n),
  };
}
