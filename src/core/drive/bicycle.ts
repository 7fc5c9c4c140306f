/**
 * The kinematic bicycle model, referenced at the rear axle: the two wheels of each axle merged
 * into one, no tyre slip, the rear wheel rolling along the car's heading and the front wheel
 * steered by δ. The rear axle's centre then moves on a path of curvature tan δ / L, a circle of
 * radius R = L / tan δ at a fixed steering angle.
 *
 * Source: J. Kong, M. Pfeiffer, G. Schildbach, F. Borrelli, "Kinematic and dynamic vehicle
 * models for autonomous driving control design", IEEE Intelligent Vehicles Symposium (2015),
 * https://doi.org/10.1109/IVS.2015.7225830 (the model with its reference point at the rear axle).
 *
 * Axes: x right, y up, heading counter-clockwise from +x, kept as a unit vector (hx, hy); a
 * positive steering angle or curvature turns left.
 */

/** Pose and speed of the rear axle's centre: metres, unit heading vector, metres per second. */
export interface BicycleState {
  x: number;
  y: number;
  hx: number;
  hy: number;
  speedMps: number;
}

/** What the driver holds over one step: path curvature, 1/m (tan δ / L), and longitudinal acceleration, m/s² (negative brakes). */
export interface BicycleControl {
  curvature: number;
  accelMps2: number;
}

/** Half turns per step up to this use the series below, radians; larger ones Math.sin/cos. */
const SERIES_HALF_TURN_RAD = 0.25;

/**
 * Radius of the circle the rear axle's centre follows at a fixed steering angle: R = L / tan δ.
 *
 * @param wheelbaseM distance between the axles, metres (> 0)
 * @param steerRad front wheel angle, radians, in (0, π/2)
 * @returns the turning radius in metres
 * @example turningRadiusM(2.7, (35 * Math.PI) / 180) // 3.856 m
 */
export function turningRadiusM(wheelbaseM: number, steerRad: number): number {
  return wheelbaseM / Math.tan(steerRad);
}

/**
 * Advances the model by one fixed step `dtS`, the path curvature (tan δ / L) and the
 * longitudinal acceleration held over the step. The path of a step is then an exact arc of that
 * curvature and of length v·dt + a·dt²/2 (speed floored at 0: a braking car stops, it does not
 * reverse), so the pose is exact for any step: there is no integration error. The arc is
 * evaluated from the half turn φ: the chord has length 2·sin(φ)/κ along the heading turned by φ.
 *
 * @param state pose and speed at the start of the step; overwritten with the state at its end
 * @param control path curvature of the rear axle's centre and acceleration over the step (an
 *   object rather than two numbers: a call that is not inlined would box each number)
 * @param dtS step, seconds
 * @returns the distance travelled, metres
 * @example const s = { x: 0, y: 0, hx: 1, hy: 0, speedMps: 10 }; stepBicycle(s, { curvature: 0, accelMps2: 2 }, 1); s.x // 11
 */
export function stepBicycle(state: BicycleState, control: BicycleControl, dtS: number): number {
  const { curvature, accelMps2 } = control;
  const v0 = state.speedMps;
  let v1 = v0 + accelMps2 * dtS;
  let distM: number;
  if (v1 >= 0) {
    distM = v0 * dtS + 0.5 * accelMps2 * dtS * dtS;
  } else {
    // stops inside the step: the distance to standstill, v0² / 2|a|
    distM = accelMps2 < 0 ? (v0 * v0) / (-2 * accelMps2) : 0;
    v1 = 0;
  }
  const half = (curvature * distM) / 2;
  let sinHalf: number, cosHalf: number, sincHalf: number;
  if (Math.abs(half) <= SERIES_HALF_TURN_RAD) {
    // Taylor series to x⁹ (error < 1e-12 at the bound): exact IEEE arithmetic, the same bytes on every engine
    const h2 = half * half;
    sincHalf = 1 - (h2 / 6) * (1 - (h2 / 20) * (1 - (h2 / 42) * (1 - h2 / 72)));
    sinHalf = half * sincHalf;
    cosHalf = 1 - (h2 / 2) * (1 - (h2 / 12) * (1 - (h2 / 30) * (1 - (h2 / 56) * (1 - h2 / 90))));
  } else {
    sinHalf = Math.sin(half);
    cosHalf = Math.cos(half);
    sincHalf = sinHalf / half;
  }
  // chord along the heading turned by the half turn, then the heading turned by the full turn
  const chord = distM * sincHalf;
  const { hx, hy } = state;
  const mx = hx * cosHalf - hy * sinHalf, my = hx * sinHalf + hy * cosHalf;
  state.x += chord * mx;
  state.y += chord * my;
  const nx = mx * cosHalf - my * sinHalf, ny = mx * sinHalf + my * cosHalf;
  // keep the heading a unit vector (square root: exact IEEE)
  const norm = Math.sqrt(nx * nx + ny * ny);
  state.hx = nx / norm;
  state.hy = ny / norm;
  state.speedMps = v1;
  return distM;
}
