/**
 * The sensor check: does a fan of range sensors see the walls from the road? From poses on the
 * centerline every SENSOR_POSE_STEP_M along the lap, `count` rays spread evenly over
 * `spreadDeg` (symmetric about the heading) are cast up to `lengthM` (ray-cast.ts). A pose is
 * covered when some ray to the left of the heading and some ray to its right hit a wall within
 * their length; a ray straight ahead counts for neither side. The share of covered poses tells
 * before training whether the sensor length suits the road's width and corners: an agent whose
 * rays cannot reach a wall is blind there.
 *
 * Axes: x right, y up, metres; ray angles counter-clockwise from the heading, so positive angles
 * look left.
 */
import { castRay, gateCells, type RayHit } from './ray-cast.js';
import type { RoadStrip } from './road-strip.js';

/** Gap between sensor poses along the lap, metres. */
export const SENSOR_POSE_STEP_M = 10;

/** A fan of range sensors. */
export interface SensorFan {
  /** Number of rays (1 casts a single ray straight ahead). */
  readonly count: number;
  /** Angle between the outermost rays, degrees (0..360). */
  readonly spreadDeg: number;
  /** Reach of every ray, metres. */
  readonly lengthM: number;
}

/** Coverage figures of the sensor check. */
export interface SensorCoverage {
  /** Share of poses with a wall within reach both to the left and to the right, 0..1. */
  readonly wallsBothSides: number;
  /** Share of poses where some ray meets a gate within reach, 0..1. */
  readonly gateInSight: number;
  readonly poses: number;
}

/**
 * Runs the sensor check on a road.
 *
 * @param strip the road
 * @param headingRad direction of travel at each centerline point, radians
 * @param gates the gates (ends on the wall faces), ordered by s
 * @param fan number, spread and length of the rays
 * @returns the shares of covered poses
 * @example sensorCoverage(strip, headings, track.gates, { count: 9, spreadDeg: 180, lengthM: 30 }).wallsBothSides // 1 on a 12 m road
 */
export function sensorCoverage(
  strip: RoadStrip,
  headingRad: ArrayLike<number>,
  gates: readonly { readonly s: number; readonly left: readonly [number, number]; readonly right: readonly [number, number] }[],
  fan: SensorFan,
): SensorCoverage {
  const { n, center: C, spacingM } = strip;
  const cells = gateCells(strip, gates);
  const stride = Math.max(1, Math.round(SENSOR_POSE_STEP_M / spacingM));
  const spread = (fan.spreadDeg * Math.PI) / 180;
  const offsets = new Float64Array(fan.count);
  for (let r = 0; r < fan.count; r++) offsets[r] = fan.count === 1 ? 0 : -spread / 2 + (r * spread) / (fan.count - 1);
  // rays in the order most likely to settle a pose soonest: the outermost first (the shortest
  // way to a wall on either side), then from the middle outwards (the longest view along the
  // road, where gates are; spiralling out from the middle reaches every ray); a pose is settled
  // once it has seen both walls and a gate, and the rays left would not change its answer
  const order: number[] = [];
  if (fan.count > 1) order.push(0, fan.count - 1);
  for (let k = 0; k < fan.count; k++) {
    const r = Math.floor((fan.count - 1) / 2) + (k % 2 === 0 ? k / 2 : -(k + 1) / 2);
    if (r >= 0 && r < fan.count && !order.includes(r)) order.push(r);
  }
  const hit: RayHit = { wallM: Infinity, wallSide: 0, gateM: Infinity };
  let poses = 0, covered = 0, seeGate = 0;
  for (let i = 0; i < n; i += stride) {
    poses++;
    let left = false, right = false, gate = false;
    for (let k = 0; k < order.length && !(left && right && gate); k++) {
      const r = order[k];
      const a = headingRad[i] + offsets[r];
      castRay(strip, i, C[2 * i], C[2 * i + 1], Math.cos(a), Math.sin(a), fan.lengthM, cells, hit);
      if (hit.wallM <= fan.lengthM) {
        if (offsets[r] > 0) left = true;
        else if (offsets[r] < 0) right = true;
      }
      if (hit.gateM <= fan.lengthM) gate = true;
    }
    if (left && right) covered++;
    if (gate) seeGate++;
  }
  return { wallsBothSides: covered / poses, gateInSight: seeGate / poses, poses };
}
