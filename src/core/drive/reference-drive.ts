/**
 * The reference drive: one flying lap of a kinematic bicycle (bicycle.ts) steered by pure
 * pursuit (pure-pursuit.ts) along the centerline, at the speeds of the friction-limited profile
 * (speed-profile.ts), integrated at a fixed step. After every step the car's footprint
 * (footprint.ts) is measured against the wall faces; the lap fails at the first step where it
 * crosses one. It proves that a car of the given size and steering lock can get round the lap
 * between the walls with a simple controller, and reports how close it came.
 *
 * Sources: R. C. Coulter, CMU-RI-TR-92-01 (1992), for the steering law; Kong, Pfeiffer,
 * Schildbach & Borrelli, IEEE IV (2015), for the vehicle model; Kapania, Subosits & Gerdes,
 * J. Dyn. Sys. Meas. Control 138 (2016) 091005, for the speed profile.
 *
 * Axes: x right, y up, metres; headings counter-clockwise from +x; lateral offsets positive to
 * the left of the direction of travel.
 */
import { stepBicycle, type BicycleControl, type BicycleState } from './bicycle.js';
import { footprintClearance, type FootprintClearance, type VertexReach } from './footprint.js';
import { pursuitCurvatureTo } from './pure-pursuit.js';
import { locateQuad, type RoadStrip } from './road-strip.js';

/** Fixed integration step, seconds (50 Hz, a common simulator control rate). */
export const DRIVE_STEP_S = 0.02;
/** Lookahead distance per m/s of speed, seconds. */
export const LOOKAHEAD_TIME_S = 0.5;
/** Shortest lookahead distance, metres: below a few metres pure pursuit oscillates on 1 m samples. */
export const LOOKAHEAD_MIN_M = 4;
/** Added to the bulge bound of the wall faces, metres: rounding of shipped vertices (1 mm) and more. */
const BULGE_SLACK_M = 0.01;
/** The lap is abandoned after this many times the profile's lap time (plus a minute). */
const TIME_LIMIT_FACTOR = 3;

/** The car the drive uses. */
export interface DriveVehicle {
  readonly wheelbaseM: number;
  readonly widthM: number;
  readonly lengthM: number;
  readonly maxSteerRad: number;
  /** Acceleration and braking the car can use, m/s² (already capped by grip). */
  readonly accelMps2: number;
  readonly brakeMps2: number;
}

/** Result of the drive. */
export interface DriveResult {
  readonly completed: boolean;
  /** Time of the lap, seconds (NaN when not completed). */
  readonly lapTimeS: number;
  /** Largest distance of the rear axle's centre from the centerline, metres. */
  readonly maxLateralDeviationM: number;
  /** Smallest distance from the footprint to a wall face over the lap, metres (negative: crossed). */
  readonly minWallMarginM: number;
  /** Lap position (metres from the start line) of that smallest margin, or of the failure. */
  readonly atS: number;
  /** Where the rear axle's centre was then, metres. */
  readonly at: readonly [number, number];
  /** Which wall: 'left' or 'right' of the direction of travel. */
  readonly side: 'left' | 'right';
  /** Why the lap failed: the footprint crossed a wall, or it did not finish in time. */
  readonly failure: 'wall' | 'time' | null;
  readonly steps: number;
}

/**
 * Drives one flying lap: the rear axle's centre starts on the start line (centerline point 0)
 * along the track's heading at the profile's speed; the lap ends when its projection on the
 * centerline has gone once round.
 *
 * @param strip the road (wall faces and centerline)
 * @param speedMps the speed profile at each centerline point, m/s
 * @param headingRad track heading at the start line, radians
 * @param vehicle size, wheelbase, steering lock and longitudinal limits
 * @param referenceLapS the profile's lap time, seconds (sets the time limit)
 * @param exhaustive measure the footprint exactly at every step instead of skipping steps the
 *   bound rules out (for tests and audits: the answer is the same, slower)
 * @returns whether the lap was completed, its time, deviation and closest approach to a wall
 * @throws RangeError when the speed profile and the strip have different lengths
 */
export function referenceDrive(strip: RoadStrip, speedMps: Float64Array, headingRad: number, vehicle: DriveVehicle, referenceLapS: number, exhaustive = false): DriveResult {
  const { n, center: C, spacingM } = strip;
  if (speedMps.length !== n) throw new RangeError(`speed profile has ${speedMps.length} points, the road ${n}`);
  const lapM = n * spacingM;
  const maxSteps = Math.ceil((TIME_LIMIT_FACTOR * referenceLapS + 60) / DRIVE_STEP_S);
  const { reach: vertices, bulgeM: bulge } = vertexReach(strip, vehicle);
  const clearance: FootprintClearance = { marginM: Infinity, side: 0, quad: 0, exact: true };
  const aim = new Float64Array(2);
  const control: BicycleControl = { curvature: NaN, accelMps2: NaN };

  const state: BicycleState = { x: C[0], y: C[1], hx: Math.cos(headingRad), hy: Math.sin(headingRad), speedMps: speedMps[0] };
  // the steering lock caps the path curvature at tan(lock) / L (bicycle.ts)
  const maxCurvature = Math.tan(vehicle.maxSteerRad) / vehicle.wheelbaseM;
  let quad = 0, goal = 1, progress = 0, lastS = 0;
  // distance from the rear axle's centre to the farthest footprint corner
  const reach = Math.sqrt((vehicle.lengthM / 2 + vehicle.wheelbaseM / 2) ** 2 + (vehicle.widthM / 2) ** 2);
  let lastMargin = Infinity, moved = 0;
  let maxDev = 0, minMargin = Infinity, atS = 0, atX = C[0], atY = C[1], side = 1;
  for (let step = 0; step < maxSteps; step++) {
    // where the rear axle is along the lap
    const j = locateQuad(strip, state.x, state.y, quad);
    if (j < 0) return fail('wall', step, lastS, state, maxDev, -Infinity, side);
    quad = j;
    const k = j + 1 === n ? 0 : j + 1;
    const ex = C[2 * k] - C[2 * j], ey = C[2 * k + 1] - C[2 * j + 1];
    const e2 = ex * ex + ey * ey;
    const px = state.x - C[2 * j], py = state.y - C[2 * j + 1];
    const t = Math.min(1, Math.max(0, (px * ex + py * ey) / e2));
    const dev = Math.abs(ex * py - ey * px) / Math.sqrt(e2);
    if (dev > maxDev) maxDev = dev;
    const s = (j + t) * spacingM;
    let ds = s - lastS;
    if (ds < -lapM / 2) ds += lapM;
    else if (ds > lapM / 2) ds -= lapM;
    const before = progress;
    progress += ds;
    lastS = s;
    if (progress >= lapM) {
      const lapTimeS = (step - 1 + (lapM - before) / (progress - before)) * DRIVE_STEP_S;
      return { completed: true, lapTimeS, maxLateralDeviationM: maxDev, minWallMarginM: minMargin, atS, at: [atX, atY], side: side > 0 ? 'left' : 'right', failure: null, steps: step };
    }

    // how close the footprint is to a wall: measured unless the motion since the last
    // measurement cannot have brought it below the smallest margin so far (the margin is
    // 1-Lipschitz in the footprint's displacement), so the smallest margin stays exact
    if (exhaustive || lastMargin - moved <= minMargin) {
      vertices.floorM = exhaustive ? Infinity : minMargin;
      vertices.bulgeM = bulge[j];
      footprintClearance(strip, vehicle, state, quad, vertices, clearance);
      lastMargin = clearance.exact ? clearance.marginM : clearance.marginM - vertices.bulgeM;
      moved = 0;
      if (clearance.marginM < minMargin) {
        minMargin = clearance.marginM;
        atS = s;
        atX = state.x;
        atY = state.y;
        side = clearance.side;
      }
      if (clearance.marginM < 0) return fail('wall', step, s, state, maxDev, clearance.marginM, clearance.side);
    }

    // speed from the profile, within the car's limits
    const target = speedMps[j] + t * (speedMps[k] - speedMps[j]);
    let accel = (target - state.speedMps) / DRIVE_STEP_S;
    if (accel > vehicle.accelMps2) accel = vehicle.accelMps2;
    else if (accel < -vehicle.brakeMps2) accel = -vehicle.brakeMps2;

    // pure pursuit towards the centerline point one lookahead ahead
    const lookahead = Math.max(LOOKAHEAD_MIN_M, LOOKAHEAD_TIME_S * state.speedMps);
    goal = goalIndex(C, n, state.x, state.y, lookahead, j, goal);
    goalPoint(C, n, state.x, state.y, lookahead, goal, aim);
    const gx = aim[0], gy = aim[1];
    let curvature = pursuitCurvatureTo(state.x, state.y, state.hx, state.hy, gx, gy);
    if (curvature > maxCurvature) curvature = maxCurvature;
    else if (curvature < -maxCurvature) curvature = -maxCurvature;
    control.curvature = curvature;
    control.accelMps2 = accel;
    const dist = stepBicycle(state, control, DRIVE_STEP_S);
    // farthest any footprint point moved: the distance plus the turn times the reach
    moved += dist * (1 + Math.abs(curvature) * reach);
  }
  return fail('time', maxSteps, lastS, state, maxDev, minMargin, side);
}

function fail(failure: 'wall' | 'time', steps: number, s: number, state: BicycleState, maxDev: number, margin: number, side: number): DriveResult {
  return { completed: false, lapTimeS: NaN, maxLateralDeviationM: maxDev, minWallMarginM: margin, atS: s, at: [state.x, state.y], side: side > 0 ? 'left' : 'right', failure, steps };
}

/**
 * First centerline point (as an index that may run past n, taken modulo n) at least `lookahead`
 * from the car, searched forward from the car's quad; `hint` is the last answer (the goal only
 * moves back when the lookahead shrinks).
 */
function goalIndex(C: Float64Array, n: number, x: number, y: number, lookahead: number, quad: number, hint: number): number {
  const l2 = lookahead * lookahead;
  // unwrap the hint so that it lies ahead of the car's quad
  let g = hint % n;
  if (g <= quad) g += n;
  if (g - quad > n / 2) g = quad + 1;
  // g stays in (quad, quad + n], below 2n: one subtraction wraps it; the squared distances are
  // written out here (a call that is not inlined would box each one)
  // back off while the point before is already far enough
  for (; g - 1 > quad; g--) {
    const i = g - 1 < n ? g - 1 : g - 1 - n;
    const dx = C[2 * i] - x, dy = C[2 * i + 1] - y;
    if (!(dx * dx + dy * dy >= l2)) break;
  }
  // forward until far enough (at most once round)
  const end = quad + n;
  for (; g < end; g++) {
    const i = g < n ? g : g - n;
    const dx = C[2 * i] - x, dy = C[2 * i + 1] - y;
    if (!(dx * dx + dy * dy < l2)) break;
  }
  return g < n ? g : g - n;
}

// the point on the segment before centerline point `g` at distance `lookahead` from (x, y), into `out`
function goalPoint(C: Float64Array, n: number, x: number, y: number, lookahead: number, g: number, out: Float64Array): void {
  const a = g === 0 ? n - 1 : g - 1;
  const ax = C[2 * a] - x, ay = C[2 * a + 1] - y;
  const dx = C[2 * g] - C[2 * a], dy = C[2 * g + 1] - C[2 * a + 1];
  // |A + τD|² = l² for the larger root τ in [0, 1]
  const qa = dx * dx + dy * dy, qb = 2 * (ax * dx + ay * dy), qc = ax * ax + ay * ay - lookahead * lookahead;
  const disc = qb * qb - 4 * qa * qc;
  let tau = disc >= 0 ? (-qb + Math.sqrt(disc)) / (2 * qa) : 1;
  if (!(tau >= 0)) tau = 0;
  else if (tau > 1) tau = 1;
  out[0] = C[2 * a] + tau * dx;
  out[1] = C[2 * a + 1] + tau * dy;
}

// wall vertices to test against the footprint: those within half the car's diagonal along the
// shortest face segment (plus one) either side of its quad, and only when a face could bulge
// past the corners' margin: by at most l²κ/8 over the car's length l at the faces' largest
// curvature κ (circumcircles of three consecutive vertices) near the car, doubled for safety.
// `bulgeM[j]` takes κ over the vertices the test can reach from a car whose rear axle is in quad
// j (its centre may lie a few quads further on), so on straights the test is rarely needed.
function vertexReach(strip: RoadStrip, v: DriveVehicle): { reach: VertexReach; bulgeM: Float64Array } {
  const n = strip.n;
  // largest curvature of either face at each vertex
  const kappa = new Float64Array(n);
  let shortest = Infinity;
  for (const face of [strip.left, strip.right]) {
    for (let j = 0; j < n; j++) {
      const i = j === 0 ? n - 1 : j - 1, k = j + 1 === n ? 0 : j + 1;
      const ax = face[2 * j] - face[2 * i], ay = face[2 * j + 1] - face[2 * i + 1];
      const bx = face[2 * k] - face[2 * j], by = face[2 * k + 1] - face[2 * j + 1];
      const a = Math.sqrt(ax * ax + ay * ay), b = Math.sqrt(bx * bx + by * by);
      const cx = ax + bx, cy = ay + by;
      const kj = (2 * Math.abs(ax * by - ay * bx)) / (a * b * Math.sqrt(cx * cx + cy * cy));
      // NaN (a repeated vertex) counts as unbounded
      if (!(kj <= kappa[j])) kappa[j] = kj === kj ? kj : Infinity;
      if (b < shortest) shortest = b;
    }
  }
  const halfDiag = Math.sqrt(v.lengthM * v.lengthM + v.widthM * v.widthM) / 2;
  const side = Math.max(v.lengthM, v.widthM);
  const window = Math.min(n >> 1, Math.ceil(halfDiag / shortest) + 1);
  // vertices window + 1 either side of the centre's quad (curvature takes a neighbour), the
  // centre up to half a wheelbase ahead of the rear axle, and two quads of slack
  const lead = Math.ceil(v.wheelbaseM / 2 / shortest) + 1;
  const bulgeM = windowMax(kappa, window + lead + 3);
  for (let j = 0; j < n; j++) bulgeM[j] = (side * side * bulgeM[j]) / 4 + BULGE_SLACK_M;
  return { reach: { window, bulgeM: Infinity, floorM: Infinity }, bulgeM };
}

// largest value within r places either side of each place of a closed sequence (van Herk 1992,
// Gil & Werman 1993): over e[i] = a[i - r] (closed), the window of place j is e[j .. j + 2r], which
// meets at most two blocks of its length: the suffix maximum of the first and the prefix maximum
// of the second
function windowMax(a: Float64Array, r: number): Float64Array {
  const n = a.length, w = 2 * r + 1;
  const out = new Float64Array(n);
  if (w >= n) {
    let m = -Infinity;
    for (let i = 0; i < n; i++) if (a[i] > m) m = a[i];
    return out.fill(m);
  }
  const len = n + 2 * r;
  const suf = new Float64Array(len);
  // blocks end where i + 1 is a multiple of w, and at the end; `at` indexes a for e[i]
  for (let i = len - 1, b = len % w, at = (len - 1 - r) % n; i >= 0; i--) {
    suf[i] = i === len - 1 || b === 0 || a[at] > suf[i + 1] ? a[at] : suf[i + 1];
    b = b === 0 ? w - 1 : b - 1;
    at = at === 0 ? n - 1 : at - 1;
  }
  for (let i = 0, b = 0, at = n - r, pre = -Infinity; i < len; i++) {
    if (at === n) at = 0;
    pre = b === 0 || a[at] > pre ? a[at] : pre;
    if (i >= w - 1) out[i - w + 1] = Math.max(suf[i - w + 1], pre);
    if (++b === w) b = 0;
    at++;
  }
  return out;
}
