/**
 * Pure pursuit: steer the rear axle's centre onto the circular arc that leaves it along its
 * heading and passes through a goal point on the path one lookahead distance l_d ahead. With α
 * the angle from the heading to the goal, the arc's curvature is γ = 2·sin α / l_d, and the
 * kinematic bicycle (bicycle.ts) follows it with the front wheel at δ = atan(L·γ).
 *
 * Source: R. C. Coulter, "Implementation of the Pure Pursuit Path Tracking Algorithm",
 * Carnegie Mellon University, Robotics Institute, CMU-RI-TR-92-01 (1992),
 * https://www.ri.cmu.edu/pub_files/pub3/coulter_r_craig_1992_1/coulter_r_craig_1992_1.pdf
 *
 * Axes: x right, y up, angles counter-clockwise; a positive curvature or steering angle turns left.
 */

/**
 * Curvature of the pursuit arc, 1/m: γ = 2·sin α / l_d.
 *
 * @param alphaRad angle from the heading to the goal point, radians (positive: goal on the left)
 * @param lookaheadM distance from the rear axle's centre to the goal point, metres (> 0)
 * @example pursuitCurvature(Math.PI / 6, 10) // 0.1
 */
export function pursuitCurvature(alphaRad: number, lookaheadM: number): number {
  return (2 * Math.sin(alphaRad)) / lookaheadM;
}

/**
 * Pure pursuit's curvature towards a goal point given in the plane: the goal is expressed in the
 * car's frame (x forward, y to the left), where sin α = y / l_d, so γ = 2y / l_d².
 *
 * @param x rear axle's centre, metres
 * @param y rear axle's centre, metres
 * @param hx unit heading vector of the car
 * @param hy unit heading vector of the car
 * @param gx goal point, metres
 * @param gy goal point, metres
 * @returns curvature of the pursuit arc, 1/m (0 when the goal coincides with the car)
 * @example pursuitCurvatureTo(0, 0, 1, 0, 5, 5) // 0.2 (α = 45°, l_d = 5√2)
 */
export function pursuitCurvatureTo(x: number, y: number, hx: number, hy: number, gx: number, gy: number): number {
  const dx = gx - x, dy = gy - y;
  const d2 = dx * dx + dy * dy;
  if (d2 === 0) return 0;
  return (2 * (hx * dy - hy * dx)) / d2;
}

/**
 * Front wheel angle that makes the kinematic bicycle follow curvature γ: δ = atan(L·γ), clamped
 * to ±maxSteerRad.
 *
 * @param curvature wanted path curvature of the rear axle's centre, 1/m
 * @param wheelbaseM distance between the axles, metres
 * @param maxSteerRad steering lock, radians
 * @example steerFor(pursuitCurvature(Math.PI / 3, 15), 5, 1) // 0.5236 rad = 30.0° (Coulter's worked example)
 */
export function steerFor(curvature: number, wheelbaseM: number, maxSteerRad: number): number {
  const d = Math.atan(wheelbaseM * curvature);
  return d > maxSteerRad ? maxSteerRad : d < -maxSteerRad ? -maxSteerRad : d;
}
