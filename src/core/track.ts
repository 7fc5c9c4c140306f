/**
 * The track a request yields (format `lapwright.track/1`, shared/DESIGN.md "The track").
 *
 * Axes: x right, y up, counter-clockwise positive, heading 0 along +x; curvature positive turns
 * left; the left wall lies on the +normal side (left of the direction of travel); `s` is arc
 * length in metres from the start line (gate 0), increasing in the direction of travel.
 * Coordinates and lengths ship rounded to 1 mm; the checker runs on the shipped numbers.
 */
import type { Seed, TrackParams } from './params/types.js';

export const TRACK_FORMAT = 'lapwright.track/1';

/** A point [x, y] in metres. */
export type Point = readonly [number, number];

export interface SplineSpec {
  /**
   * The closed (periodic) interpolating cubic spline, C² (de Boor, "A Practical Guide to
   * Splines", 1978): curvature is continuous along the whole lap.
   */
  readonly kind: 'cubic-closed';
  /** Knot spacing: the chord length between consecutive control points. */
  readonly knots: 'chord-length';
  /** Control points the closed spline interpolates, in travel order, first not repeated; 1 µm precision. */
  readonly controlPoints: readonly Point[];
}

export interface Centerline {
  /** Gap between consecutive points along the lap, metres (lengthM / points.length). */
  readonly spacingM: number;
  /** Length of the closed spline, metres. */
  readonly lengthM: number;
  readonly spline: SplineSpec;
  /** Evenly spaced by arc length; closed (the first point is not repeated). */
  readonly points: readonly Point[];
  /** Arc length of each point from the start line, metres. */
  readonly s: readonly number[];
  /** Direction of travel at each point, degrees counter-clockwise from +x, in (-180, 180]. */
  readonly headingDeg: readonly number[];
  /** Signed curvature at each point, 1/m (positive turns left). */
  readonly curvature: readonly number[];
  /** Distance from the centerline to the left and right wall faces, metres. */
  readonly halfWidthLeftM: readonly number[];
  readonly halfWidthRightM: readonly number[];
}

export interface Walls {
  readonly heightM: number;
  readonly thicknessM: number;
  /** Closed polyline of the left wall face (the side touching the road), one vertex per centerline point. */
  readonly left: readonly Point[];
  readonly right: readonly Point[];
}

/** A progress gate across the road: from the left wall face to the right one. */
export interface Gate {
  readonly index: number;
  /** Lap position, metres; gate 0 is the start/finish line at s = 0. */
  readonly s: number;
  readonly left: Point;
  readonly right: Point;
  /** Unit direction of travel through the gate (perpendicular to it). */
  readonly forward: Point;
}

/** A start pose behind the start line. */
export interface Spawn {
  readonly index: number;
  /** Centre of the car, metres. */
  readonly position: Point;
  readonly headingDeg: number;
  /** Lap position of the pose's projection on the centerline, metres (just below lengthM: behind the line). */
  readonly s: number;
  /** Sideways offset from the centerline, metres, positive to the left. */
  readonly lateralM: number;
}

export interface Corner {
  readonly index: number;
  readonly direction: 'left' | 'right';
  /** Absolute turning of the corner, degrees. */
  readonly angleDeg: number;
  /** Tightest radius of curvature inside the corner, metres. */
  readonly minRadiusM: number;
  readonly sStart: number;
  readonly sEnd: number;
}

export interface TrackMetrics {
  readonly lengthM: number;
  /** ∫|κ| ds over the lap, degrees. */
  readonly totalTurningDeg: number;
  /** ∫κ ds over the lap, degrees: +360 counter-clockwise, -360 clockwise. */
  readonly netTurningDeg: number;
  readonly rightCornerShare: number;
  /** Share of the corners' turning (by angle) that turns right. */
  readonly rightTurningShare: number;
  readonly minRadiusM: number;
  readonly width: { readonly min: number; readonly max: number };
  /** Smallest gap between wall solids of parts of the lap far apart along the track, metres. */
  readonly minClearanceM: number;
  readonly cornerCount: number;
  readonly gateCount: number;
  /**
   * Tightest centerline radius the vehicle (params.vehicle) can follow, metres: the kinematic
   * bicycle's turning radius at full lock, wheelbase / tan(maxSteer), plus half its width.
   */
  readonly vehicleMinRadiusM: number;
  /**
   * Radius floor the generator kept, metres: params.minCornerRadiusM, raised to
   * vehicleMinRadiusM when that is larger and params.drivability is 'avoid'.
   */
  readonly cornerRadiusFloorM: number;
  /** Lap time of the friction-limited speed profile of params.vehicle, seconds (one flying lap). */
  readonly referenceLapTimeS: number;
  /** Lap length over referenceLapTimeS, and the profile's lowest and highest speeds, m/s. */
  readonly averageSpeedMps: number;
  readonly minSpeedMps: number;
  readonly maxSpeedMps: number;
  /** Time of the profile's lap spent braking, seconds. */
  readonly brakingTimeS: number;
  /** Lap time of the reference drive (pure pursuit on the kinematic bicycle), seconds. */
  readonly driveLapTimeS: number;
  /** Largest distance of the reference drive's rear axle from the centerline, metres. */
  readonly maxLateralDeviationM: number;
  /** Smallest distance between the reference drive's footprint and a wall face, metres. */
  readonly minWallMarginM: number;
  /** Share of sensor poses (every 10 m) where the rays see a wall within reach on both sides, 0..1. */
  readonly sensorCoverage: number;
  /** Share of sensor poses where a ray meets a gate within reach, 0..1. */
  readonly sensorGateCoverage: number;
  /** Difficulty figure, 0..10 (README, "Drivability and difficulty", "Difficulty"). */
  readonly difficulty: number;
}

export interface Track {
  readonly format: typeof TRACK_FORMAT;
  /** Hex sha256 of the canonical JSON of every field but `id`. */
  readonly id: string;
  readonly seed: Seed;
  readonly generatorVersion: string;
  readonly params: TrackParams;
  /** Deterministic attempts the generator needed (1 = the first layout was valid). */
  readonly attempts: number;
  readonly centerline: Centerline;
  readonly walls: Walls;
  readonly gates: readonly Gate[];
  readonly spawns: readonly Spawn[];
  readonly corners: readonly Corner[];
  readonly metrics: TrackMetrics;
}

/** What the checker answers. */
export interface ValidationResult {
  readonly valid: boolean;
  readonly issues: readonly import('./errors.js').Issue[];
}
