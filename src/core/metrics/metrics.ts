import type { Assessment } from '../drive/assess.js';
import type { VehicleSpec } from '../params/types.js';
import type { Corner, TrackMetrics } from '../track.js';

/** Weights of the three difficulty terms (they add to 1). */
export const DIFFICULTY_WEIGHTS = { pace: 0.6, tightness: 0.25, narrowness: 0.15 } as const;

/** What the difficulty figure is made of (README, "Drivability and difficulty", "Difficulty"). */
export interface DifficultyFigures {
  readonly lengthM: number;
  /** Lap time of the friction-limited speed profile, seconds. */
  readonly referenceLapTimeS: number;
  readonly topSpeedMps: number;
  /** Tightest radius of the lap and the tightest the vehicle can follow, metres. */
  readonly minRadiusM: number;
  readonly vehicleMinRadiusM: number;
  readonly meanWidthM: number;
  readonly vehicleWidthM: number;
}

/**
 * Difficulty on 0..10 (README, "Drivability and difficulty", "Difficulty"):
 *   D = 10 · (0.6 · P + 0.25 · C + 0.15 · N)
 *   P = 1 − (L / v_top) / T_ref    share of the lap time lost to corners and braking
 *   C = min(1, R_vehicle / R_min)  how near the tightest corner comes to full lock
 *   N = min(1, w_vehicle / W)      share of the (mean) road width the car takes
 * Each term lies in [0, 1] and rises with what makes a lap harder. A tighter corner anywhere
 * lowers the profile's speed there and never raises it elsewhere, so T_ref, P and C never fall:
 * tightening a lap never makes it easier.
 */
export function trackDifficulty(f: DifficultyFigures): number {
  const pace = Math.max(0, 1 - f.lengthM / f.topSpeedMps / f.referenceLapTimeS);
  const tightness = Math.min(1, f.vehicleMinRadiusM / f.minRadiusM);
  const narrowness = Math.min(1, f.vehicleWidthM / f.meanWidthM);
  return 10 * (DIFFICULTY_WEIGHTS.pace * pace + DIFFICULTY_WEIGHTS.tightness * tightness + DIFFICULTY_WEIGHTS.narrowness * narrowness);
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
  readonly vehicle: VehicleSpec;
  /** Tightest radius the vehicle can follow, and the radius floor the generator kept, metres. */
  readonly vehicleMinRadiusM: number;
  readonly cornerRadiusFloorM: number;
  /** Speed profile, reference drive and sensor check on the shipped track. */
  readonly assessment: Assessment;
}

/**
 * Metrics of shared/DESIGN.md from the shipped arrays (turning by the rectangle rule on the even
 * grid), the drivability figures of the assessment, and the difficulty.
 */
export function trackMetrics(m: MetricsInput): TrackMetrics {
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
  const { profile, drive, sensors } = m.assessment;
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
    vehicleMinRadiusM: m.vehicleMinRadiusM,
    cornerRadiusFloorM: m.cornerRadiusFloorM,
    referenceLapTimeS: profile.lapTimeS,
    averageSpeedMps: profile.averageSpeedMps,
    minSpeedMps: profile.minSpeedMps,
    maxSpeedMps: profile.maxSpeedMps,
    brakingTimeS: profile.brakingTimeS,
    driveLapTimeS: drive.lapTimeS,
    maxLateralDeviationM: drive.maxLateralDeviationM,
    minWallMarginM: drive.minWallMarginM,
    sensorCoverage: sensors.wallsBothSides,
    sensorGateCoverage: sensors.gateInSight,
    difficulty: trackDifficulty({
      lengthM: m.lengthM,
      referenceLapTimeS: profile.lapTimeS,
      topSpeedMps: m.vehicle.topSpeedMps,
      minRadiusM,
      vehicleMinRadiusM: m.vehicleMinRadiusM,
      meanWidthM: wSum / n,
      vehicleWidthM: m.vehicle.widthM,
    }),
  };
}
