// A valid track built from closed forms, independent of the generator: a stadium loop (two
// straights joined by two semicircles), sampled evenly by arc length, with walls, gates, spawns,
// corners and params made consistent by construction and every shipped number rounded the way
// the generator ships it. Perimeter 2L + 2πR, curvature 0 on the straights and 1/R on the arcs
// (elementary geometry).

import type { TrackParams } from '../../src/core/params/types.js';
import { GATE_TURN_RAD, SPAWN_LINE_GAP_M } from '../../src/core/rules.js';
import type { Corner, Gate, Point, Spawn, Track } from '../../src/core/track.js';

/** A deep copy whose every field may be assigned (for mutation tests). */
export type MutableTrack = DeepMutable<Track>;
type DeepMutable<T> = T extends object ? { -readonly [K in keyof T]: DeepMutable<T[K]> } : T;

export interface StadiumOptions {
  /** Length of each straight, m (default 120). */
  readonly straightM?: number;
  /** Radius of both semicircles, m (default 40); also params.minCornerRadiusM. */
  readonly radiusM?: number;
  /** Wanted point spacing, m (default 1); the actual one divides the perimeter evenly. */
  readonly spacingM?: number;
  readonly spawnSlots?: number;
}

const r3 = (x: number): number => Math.round(x * 1e3) / 1e3 + 0;
const r6 = (x: number): number => Math.round(x * 1e6) / 1e6 + 0;
type XY = [number, number];
const p3 = (x: number, y: number): XY => [r3(x), r3(y)];

/** Heading in degrees wrapped into (-180, 180]. */
export function wrapDeg(d: number): number {
  const w = d - 360 * Math.ceil((d - 180) / 360);
  return w === -180 ? 180 : w;
}

/** Stadium perimeter 2L + 2πR (elementary geometry). */
export function stadiumPerimeter(straightM: number, radiusM: number): number {
  return 2 * straightM + 2 * Math.PI * radiusM;
}

interface Pose { x: number; y: number; headingRad: number; curvature: number }

/**
 * Pose at arc length s on the counter-clockwise stadium that starts at (0, -R) heading +x: half
 * the bottom straight, the right semicircle, the top straight, the left semicircle, the rest of
 * the bottom straight.
 */
export function stadiumPose(straightM: number, radiusM: number, s: number): Pose {
  const L = straightM, R = radiusM;
  const P = stadiumPerimeter(L, R);
  s = ((s % P) + P) % P;
  const arc = Math.PI * R;
  if (s < L / 2) return { x: s, y: -R, headingRad: 0, curvature: 0 };
  if (s < L / 2 + arc) {
    const phi = -Math.PI / 2 + (s - L / 2) / R;
    return { x: L / 2 + R * Math.cos(phi), y: R * Math.sin(phi), headingRad: phi + Math.PI / 2, curvature: 1 / R };
  }
  if (s < 1.5 * L + arc) return { x: L / 2 - (s - L / 2 - arc), y: R, headingRad: Math.PI, curvature: 0 };
  if (s < 1.5 * L + 2 * arc) {
    const phi = Math.PI / 2 + (s - 1.5 * L - arc) / R;
    return { x: -L / 2 + R * Math.cos(phi), y: R * Math.sin(phi), headingRad: phi + Math.PI / 2, curvature: 1 / R };
  }
  return { x: -L / 2 + (s - 1.5 * L - 2 * arc), y: -R, headingRad: 2 * Math.PI, curvature: 0 };
}

/** Smoothly varying half widths, m: left in [4.25, 5.25], right in [5.5, 6]. */
const halfLeft = (u: number): number => 4.75 + 0.5 * Math.sin(2 * Math.PI * u);
const halfRight = (u: number): number => 5.75 - 0.25 * Math.cos(4 * Math.PI * u);

/**
 * A valid counter-clockwise stadium track (turnBalance 0, budget 360°, two left corners).
 * @example validateTrack(stadiumTrack()).valid; // true
 */
export function stadiumTrack(options: StadiumOptions = {}): Track {
  const L = options.straightM ?? 120;
  const R = options.radiusM ?? 40;
  const slots = options.spawnSlots ?? 4;
  const P = stadiumPerimeter(L, R);
  const n = Math.round(P / (options.spacingM ?? 1));
  const spacing = P / n;

  const points: Point[] = [], left: Point[] = [], right: Point[] = [];
  const s: number[] = [], headingDeg: number[] = [], curvature: number[] = [], hl: number[] = [], hr: number[] = [];
  for (let i = 0; i < n; i++) {
    const si = i * spacing;
    const p = stadiumPose(L, R, si);
    const nx = -Math.sin(p.headingRad), ny = Math.cos(p.headingRad);
    const a = r3(halfLeft(si / P)), b = r3(halfRight(si / P));
    points.push(p3(p.x, p.y));
    left.push(p3(p.x + a * nx, p.y + a * ny));
    right.push(p3(p.x - b * nx, p.y - b * ny));
    s.push(r3(si));
    headingDeg.push(r3(wrapDeg((p.headingRad * 180) / Math.PI)));
    curvature.push(r6(p.curvature));
    hl.push(a);
    hr.push(b);
  }

  const params: TrackParams = {
    seed: 1,
    lengthM: r3(P),
    widthM: { min: 10, max: 14 },
    curvatureBudgetDeg: 360,
    turnBalance: 0,
    cornerCount: 2,
    minCornerRadiusM: R,
    noise: 0,
    gateSpacingM: { min: 5, max: 25 },
    spawnSlots: slots,
    wall: { heightM: 1.2, thicknessM: 0.5 },
    clearanceM: 1,
    car: { lengthM: 4.5, widthM: 2 },
    vehicle: { wheelbaseM: 2.5, widthM: 2, lengthM: 4.5, maxSteerDeg: 30, mu: 0.9, maxAccelMps2: 6, maxBrakeMps2: 8, topSpeedMps: 60 },
    drivability: 'avoid',
    sensors: { count: 9, spreadDeg: 180, lengthM: 30 },
  };

  const gates = placeGates(L, R, params, { s, left, right });
  const spawns = placeSpawns(L, R, params);
  const arc = Math.PI * R;
  const corners: Corner[] = [
    { index: 0, direction: 'left', angleDeg: 180, minRadiusM: R, sStart: r3(L / 2), sEnd: r3(L / 2 + arc) },
    { index: 1, direction: 'left', angleDeg: 180, minRadiusM: R, sStart: r3(1.5 * L + arc), sEnd: r3(1.5 * L + 2 * arc) },
  ];
  const widths = hl.map((a, i) => a + hr[i]);
  return {
    format: 'lapwright.track/1',
    id: 'synthetic-stadium',
    seed: 1,
    generatorVersion: 'test',
    params,
    attempts: 1,
    centerline: {
      spacingM: r3(spacing),
      lengthM: r3(P),
      spline: { kind: 'cubic-closed', knots: 'chord-length', controlPoints: [p3(0, -R), p3(L / 2 + R, 0), p3(0, R), p3(-L / 2 - R, 0)] },
      points, s, headingDeg, curvature, halfWidthLeftM: hl, halfWidthRightM: hr,
    },
    walls: { heightM: 1.2, thicknessM: 0.5, left, right },
    gates,
    spawns,
    corners,
    metrics: {
      lengthM: r3(P),
      totalTurningDeg: 360,
      netTurningDeg: 360,
      rightCornerShare: 0,
      rightTurningShare: 0,
      minRadiusM: R,
      width: { min: r3(Math.min(...widths)), max: r3(Math.max(...widths)) },
      minClearanceM: r3(2 * R - 2 * (6 + 0.5) - 1),
      cornerCount: 2,
      gateCount: gates.length,
      // drivability figures are not made for the synthetic track (the checker does not read them)
      vehicleMinRadiusM: 0,
      cornerRadiusFloorM: R,
      referenceLapTimeS: 0,
      averageSpeedMps: 0,
      minSpeedMps: 0,
      maxSpeedMps: 0,
      brakingTimeS: 0,
      driveLapTimeS: 0,
      maxLateralDeviationM: 0,
      minWallMarginM: 0,
      sensorCoverage: 0,
      sensorGateCoverage: 0,
      difficulty: 0,
    },
  };
}

/**
 * Gates at equal integrals of 1 / law_c, where law = clamp(GATE_TURN_RAD / |κ|, min, max) (max
 * on the straights) and law_c = clamp(c · law, min, max) are constant on each piece of the
 * stadium and integrated in closed form. The count is ceil of the integral at c = 1, and
 * c <= 1 is found by bisection so the lap holds exactly that many gaps: every gap then lies in
 * [min, max] and is no longer than the law's mean over it. Ends lie on the shipped faces.
 */
function placeGates(L: number, R: number, params: TrackParams, shipped: ShippedFaces): Gate[] {
  const { min, max } = params.gateSpacingM;
  const clamp = (x: number): number => Math.min(max, Math.max(min, x));
  const arc = Math.PI * R;
  // pieces of the lap: [length, law at c = 1]
  const arcLaw = clamp(GATE_TURN_RAD * R);
  const pieces: [number, number][] = [[L / 2, max], [arc, arcLaw], [L, max], [arc, arcLaw], [L / 2, max]];
  const integral = (c: number): number => pieces.reduce((a, [len, law]) => a + len / clamp(c * law), 0);
  const count = Math.ceil(integral(1) - 1e-9);
  let lo = 0, hi = 1;
  for (let it = 0; it < 60; it++) {
    const mid = (lo + hi) / 2;
    if (integral(mid) > count) lo = mid;
    else hi = mid;
  }
  const step = integral(hi) / count;
  const gates: Gate[] = [];
  const lap = r3(stadiumPerimeter(L, R));
  for (let j = 0; j < count; j++) {
    // invert the piecewise-linear integral
    let want = j * step, sAt = 0;
    for (const [len, law] of pieces) {
      const g = clamp(hi * law);
      if (want <= len / g) { sAt += want * g; break; }
      want -= len / g;
      sAt += len;
    }
    gates.push(gateAt(shipped, lap, j, sAt));
  }
  return gates;
}

interface ShippedFaces {
  readonly s: readonly number[];
  readonly left: readonly Point[];
  readonly right: readonly Point[];
}

/**
 * A gate at lap position s (rounded to 1 mm) whose ends lie on the shipped wall faces, linear
 * between the face vertices around s, with forward = (left − right) turned clockwise by 90°.
 * @param lapM the lap length the positions refer to (centerline.lengthM).
 */
export function gateAt(shipped: ShippedFaces, lapM: number, index: number, s: number): Gate {
  const n = shipped.s.length;
  const sg = r3(s);
  let i = 0;
  while (i + 1 < n && shipped.s[i + 1] <= sg) i++;
  const sNext = i + 1 < n ? shipped.s[i + 1] : lapM;
  const t = (sg - shipped.s[i]) / (sNext - shipped.s[i]);
  const k = i + 1 < n ? i + 1 : 0;
  const lerp = (a: Point, b: Point): Point => p3(a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]));
  const gl = lerp(shipped.left[i], shipped.left[k]);
  const gr = lerp(shipped.right[i], shipped.right[k]);
  const dx = gl[0] - gr[0], dy = gl[1] - gr[1];
  const len = Math.sqrt(dx * dx + dy * dy);
  return { index, s: sg, left: gl, right: gr, forward: [r6(dy / len), r6(-dx / len)] };
}

/** Two staggered columns (±2 m) on the bottom straight behind the start line, rows 3 m apart. */
function placeSpawns(L: number, R: number, params: TrackParams): Spawn[] {
  const P = stadiumPerimeter(L, R);
  const spawns: Spawn[] = [];
  for (let j = 0; j < params.spawnSlots; j++) {
    const back = SPAWN_LINE_GAP_M + 0.1 + params.car.lengthM / 2 + 3 * j;
    const lateral = j % 2 === 0 ? 2 : -2;
    const p = stadiumPose(L, R, P - back);
    spawns.push({
      index: j,
      position: p3(p.x - lateral * Math.sin(p.headingRad), p.y + lateral * Math.cos(p.headingRad)),
      headingDeg: r3(wrapDeg((p.headingRad * 180) / Math.PI)),
      s: r3(P - back),
      lateralM: lateral,
    });
  }
  return spawns;
}

/** A deep, assignable copy of a track. */
export function cloneTrack(track: Track): MutableTrack {
  return structuredClone(track) as MutableTrack;
}

/**
 * The track with every point mapped by an exact rigid motion: rotation by quarter turns q
 * (x, y) → (−y, x) applied q times, then an integer shift (dx, dy). Headings turn by 90°·q;
 * curvature, lengths and sides are unchanged. Shifted coordinates are re-rounded to 1 mm.
 */
export function moveTrack(track: Track, quarterTurns: number, dx: number, dy: number): Track {
  const q = ((quarterTurns % 4) + 4) % 4;
  const rot = (x: number, y: number): [number, number] => {
    for (let k = 0; k < q; k++) [x, y] = [-y, x];
    return [x, y];
  };
  const move = (p: Point): XY => {
    const [x, y] = rot(p[0], p[1]);
    return p3(x + dx, y + dy);
  };
  const turn = (d: number): number => r3(wrapDeg(d + 90 * q));
  const t = cloneTrack(track);
  t.centerline.points = t.centerline.points.map(move);
  t.centerline.headingDeg = t.centerline.headingDeg.map(turn);
  t.centerline.spline.controlPoints = t.centerline.spline.controlPoints.map(move);
  t.walls.left = t.walls.left.map(move);
  t.walls.right = t.walls.right.map(move);
  for (const g of t.gates) {
    g.left = move(g.left);
    g.right = move(g.right);
    g.forward = rot(g.forward[0], g.forward[1]);
  }
  for (const sp of t.spawns) {
    sp.position = move(sp.position);
    sp.headingDeg = turn(sp.headingDeg);
  }
  return t as Track;
}

/**
 * The mirror image (x, y) → (x, −y): a counter-clockwise track becomes a clockwise one. The
 * driver's left becomes the right, so walls, half widths and gate ends swap sides, headings and
 * curvature change sign, corners turn the other way and turnBalance becomes 1 − turnBalance.
 */
export function mirrorTrack(track: Track): Track {
  const flip = (p: Point): XY => [p[0], -p[1] + 0];
  const neg = (d: number): number => r3(wrapDeg(-d));
  const t = cloneTrack(track);
  const c = t.centerline;
  c.points = c.points.map(flip);
  c.headingDeg = c.headingDeg.map(neg);
  c.curvature = c.curvature.map((k) => -k + 0);
  [c.halfWidthLeftM, c.halfWidthRightM] = [c.halfWidthRightM, c.halfWidthLeftM];
  c.spline.controlPoints = c.spline.controlPoints.map(flip);
  [t.walls.left, t.walls.right] = [t.walls.right.map(flip), t.walls.left.map(flip)];
  for (const g of t.gates) {
    [g.left, g.right] = [flip(g.right), flip(g.left)];
    g.forward = flip(g.forward);
  }
  for (const sp of t.spawns) {
    sp.position = flip(sp.position);
    sp.headingDeg = neg(sp.headingDeg);
    sp.lateralM = -sp.lateralM + 0;
  }
  for (const k of t.corners) k.direction = k.direction === 'left' ? 'right' : 'left';
  t.params = { ...t.params, turnBalance: 1 - t.params.turnBalance };
  t.metrics.netTurningDeg = -t.metrics.netTurningDeg;
  t.metrics.rightCornerShare = 1 - t.metrics.rightCornerShare;
  t.metrics.rightTurningShare = 1 - t.metrics.rightTurningShare;
  return t as Track;
}

/** The distinct issue codes a validation result reports, sorted (for exact assertions). */
export function codesOf(result: { readonly issues: readonly { readonly code: string }[] }): string[] {
  return [...new Set(result.issues.map((i) => i.code))].sort();
}

/** Insert a gate at lap position s (ends on the shipped faces) and renumber the gates. */
export function insertGate(track: MutableTrack, s: number): void {
  const cl = track.centerline;
  const gate = gateAt({ s: cl.s, left: track.walls.left, right: track.walls.right }, cl.lengthM, 0, s) as MutableTrack['gates'][number];
  track.gates.push(gate);
  track.gates.sort((a, b) => a.s - b.s);
  track.gates.forEach((g, k) => { g.index = k; });
  track.metrics.gateCount = track.gates.length;
}
