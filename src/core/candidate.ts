/**
 * One deterministic attempt of the pipeline, up to the shipped (rounded) track without its id:
 * plan → trace → coarse clearance → control points → spline centerline → widths, walls,
 * gates, spawns → corners, drivability assessment (speed profile, reference drive, sensors) and
 * metrics. The checker, the drive's verdict and the id are the caller's (generate.ts).
 */
import { placeControlPoints } from './centerline/control-points.js';
import { interpolateClosed } from './geom/interpolate.js';
import { planLap, PLAN_STEP_M } from './centerline/plan.js';
import type { Plan } from './centerline/plan-types.js';
import { chooseStartS } from './centerline/start-line.js';
import { tracePlan, type Trace } from './centerline/trace.js';
import { buildArcLengthTable } from './curve/arc-length.js';
import { cubicSplineClosed } from './curve/cubic-spline-closed.js';
import { resampleClosedSpline, type ResampledCurve } from './curve/resample.js';
import { placeGates } from './layout/gates.js';
import { placeSpawns, type GridLayout } from './layout/spawn.js';
import { limitSlopeCyclic, MAX_WIDTH_SLOPE, widthProfile } from './layout/widths.js';
import { assessTrack } from './drive/assess.js';
import type { DriveResult } from './drive/reference-drive.js';
import { trackMetrics } from './metrics/metrics.js';
import { vehicleMinRadiusM } from './params/drivability.js';
import type { TurnSplit } from './params/feasibility.js';
import type { TrackParams } from './params/types.js';
import { loopNoise } from './random/noise.js';
import { stream } from './random/streams.js';
import { GENERATOR_VERSION } from './rules.js';
import { TRACK_FORMAT, type Corner, type Gate, type Point, type Spawn, type Track } from './track.js';
import { checkClearance } from './validate/clearance.js';

/** Wanted gap between shipped centerline points, metres (the actual gap is lengthM / n). */
export const CENTERLINE_SPACING_M = 1;
/** The clearance metric is measured up to this far beyond the required margin, metres. */
export const CLEARANCE_MEASURE_M = 50;
/** Bumps of the corner-shape noise around the lap (each corner reads 2% of the loop). */
const SHAPE_NOISE_CYCLES = 50;

/** Slope the shipped widths keep: 1 in 20 less what 1 mm rounding of two half widths can add over 5 m. */
const WIDTH_SLOPE_SHIPPED = 0.95 * MAX_WIDTH_SLOPE;

/** Step of the thinned trace the coarse clearance filter runs on, metres. */
const COARSE_STEP_M = 4;

/** A candidate track (id still empty) with its reference drive, or the stage that refused this attempt. */
export type Candidate =
  | { readonly track: Track; readonly drive: DriveResult; readonly stage: 'built' }
  | { readonly track: null; readonly drive: null; readonly stage: 'plan' | 'clearance' | 'min_radius' | 'gates' };

/**
 * Builds attempt `attempt` of a request; every stage draws from its own sub-stream of (seed, attempt).
 *
 * @param p the parameters the geometry follows (minCornerRadiusM may be the raised floor, see
 *   params/drivability.ts)
 * @param echo the resolved parameters the track ships as `params` (as requested)
 */
export function buildCandidate(p: TrackParams, split: TurnSplit, grid: GridLayout, attempt: number, echo: TrackParams = p): Candidate {
  const plan = planLap(p, split, stream(p.seed, attempt, 'plan'), loopNoise(stream(p.seed, attempt, 'shape-noise'), SHAPE_NOISE_CYCLES));
  if (plan === null) return { track: null, drive: null, stage: 'plan' };
  const trace = tracePlan(plan, PLAN_STEP_M);
  const startS = chooseStartS(plan, trace, grid.lengthM);
  const width = widthProfile(p.widthM, p.noise, p.lengthM, stream(p.seed, attempt, 'width'));

  // cheap refusal before any spline work: distant parts of the planned lap too close, judged on
  // the trace thinned to COARSE_STEP_M (a lenient filter: chords cut corners by at most
  // step² / 8R, so the margin is lowered by that; the checker decides on the shipped track)
  const coarse = thinTrace(trace, COARSE_STEP_M);
  const m = coarse.s.length;
  const reach = new Float64Array(m);
  for (let k = 0; k < m; k++) reach[k] = width(((coarse.s[k] - startS + plan.lengthM) % plan.lengthM) / plan.lengthM) / 2 + p.wall.thicknessM;
  const sag = (COARSE_STEP_M * COARSE_STEP_M) / (8 * p.minCornerRadiusM);
  const near = checkClearance({ points: coarse.points, s: coarse.s, lapLengthM: plan.lengthM, reach, marginM: Math.max(0, p.clearanceM - sag), minRadiusM: p.minCornerRadiusM, maxViolations: 1 });
  if (near.violations.length > 0) return { track: null, drive: null, stage: 'clearance' };

  const { control, traceS } = placeControlPoints(plan, trace, startS);
  const spline = cubicSplineClosed(control);
  const table = buildArcLengthTable(spline);
  const curve = resampleClosedSpline(spline, CENTERLINE_SPACING_M, table);
  const kLimit = 1 / p.minCornerRadiusM;
  for (let i = 0; i < curve.n; i++) if (Math.abs(curve.curvature[i]) > kLimit) return { track: null, drive: null, stage: 'min_radius' };

  const shipped = shipTrack(p, echo, attempt, plan, trace, startS, control, traceS, table.cumulative, curve, width, grid);
  if (shipped === null) return { track: null, drive: null, stage: 'gates' };
  return { ...shipped, stage: 'built' };
}

// builds the shipped track (numbers rounded) with an empty id, and its reference drive
function shipTrack(
  p: TrackParams,
  echo: TrackParams,
  attempt: number,
  plan: Plan,
  trace: Trace,
  startS: number,
  control: Float64Array,
  traceS: Float64Array,
  controlSplineS: Float64Array,
  curve: ResampledCurve,
  width: (u: number) => number,
  grid: GridLayout,
): { track: Track; drive: DriveResult } | null {
  const n = curve.n;
  const L = curve.lengthM;
  const spacing = curve.spacingM;
  const half = new Float64Array(n);
  const widthM = new Float64Array(n);
  const curvature = new Float64Array(n);
  // the shipped per-point arrays, appended to in index order by the loop below so that they stay
  // packed: `new Array(n)` makes holey arrays, which JSON.stringify walks on a slow path (a
  // default track's text took 1.60 ms instead of 1.15 ms); copying typed arrays with Array.from
  // is slow
  const points: Point[] = [];
  const left: Point[] = [];
  const right: Point[] = [];
  const s: number[] = [];
  const headingDeg: number[] = [];
  const curvatureList: number[] = [];
  const halfLeftList: number[] = [];
  const halfRightList: number[] = [];
  // the wanted widths, graded, then halved and rounded in place
  for (let i = 0; i < n; i++) half[i] = width(i / n);
  limitSlopeCyclic(half, spacing, WIDTH_SLOPE_SHIPPED);
  for (let i = 0; i < n; i++) {
    const h = r3(half[i] / 2);
    half[i] = h;
    widthM[i] = 2 * h;
    curvature[i] = r6(curve.curvature[i]);
    curvatureList[i] = curvature[i];
    halfLeftList[i] = h;
    halfRightList[i] = h;
    const x = curve.points[2 * i], y = curve.points[2 * i + 1];
    const nx = curve.normals[2 * i], ny = curve.normals[2 * i + 1];
    points[i] = [r3(x), r3(y)];
    left[i] = [r3(x + nx * h), r3(y + ny * h)];
    right[i] = [r3(x - nx * h), r3(y - ny * h)];
    s[i] = r3(i * spacing);
    headingDeg[i] = degrees(Math.atan2(curve.tangents[2 * i + 1], curve.tangents[2 * i]));
  }

  const gateS = placeGates(curvature, spacing, p.gateSpacingM);
  if (gateS === null) return null;
  const gates: Gate[] = [];
  for (let k = 0; k < gateS.length; k++) {
    const gs = r3(gateS[k]);
    const x = gs / spacing;
    const i = Math.min(n - 1, Math.floor(x));
    const j = (i + 1) % n;
    const t = x - i;
    // the wall faces (unrounded) at the two samples, as the walls above were made from them
    const lx = lerp(face(curve.points, curve.normals, half, 2 * i, 1), face(curve.points, curve.normals, half, 2 * j, 1), t);
    const ly = lerp(face(curve.points, curve.normals, half, 2 * i + 1, 1), face(curve.points, curve.normals, half, 2 * j + 1, 1), t);
    const rx = lerp(face(curve.points, curve.normals, half, 2 * i, -1), face(curve.points, curve.normals, half, 2 * j, -1), t);
    const ry = lerp(face(curve.points, curve.normals, half, 2 * i + 1, -1), face(curve.points, curve.normals, half, 2 * j + 1, -1), t);
    const gx = lx - rx, gy = ly - ry;
    const len = Math.sqrt(gx * gx + gy * gy);
    gates.push({ index: k, s: gs, left: [r3(lx), r3(ly)], right: [r3(rx), r3(ry)], forward: [r6((ly - ry) / len), r6(-(lx - rx) / len)] });
  }

  const spawns: Spawn[] = placeSpawns(grid, curve.points, curve.tangents, curve.normals, spacing).map((sp, index) => ({
    index,
    position: [r3(sp.x), r3(sp.y)],
    headingDeg: degrees(sp.headingRad),
    s: r3(sp.s),
    lateralM: r3(sp.lateralM),
  }));

  const corners = measureCorners(plan, trace, startS, traceS, controlSplineS, curvature, curve.tangents, spacing, L);
  // the clearance metric (the search box shrinks as smaller gaps turn up)
  const clearance = checkClearance({
    points: curve.points,
    s: curve.s,
    lapLengthM: L,
    reach: half.map((h) => h + p.wall.thicknessM),
    marginM: p.clearanceM,
    minRadiusM: p.minCornerRadiusM,
    maxViolations: 1,
    measureBeyondM: CLEARANCE_MEASURE_M,
  });
  const controlPoints: Point[] = [];
  for (let j = 0; j < control.length / 2; j++) controlPoints.push([control[2 * j], control[2 * j + 1]]);
  const centerline = {
    spacingM: r9(spacing),
    lengthM: r3(L),
    spline: { kind: 'cubic-closed', knots: 'chord-length', controlPoints },
    points,
    s,
    headingDeg,
    curvature: curvatureList,
    halfWidthLeftM: halfLeftList,
    halfWidthRightM: halfRightList,
  } as const;
  const walls = { heightM: p.wall.heightM, thicknessM: p.wall.thicknessM, left, right };
  // speed profile, reference drive and sensors on the numbers that ship
  const assessment = assessTrack({ centerline, walls, gates }, p.vehicle, p.sensors);
  const m = trackMetrics({
    lengthM: L,
    spacingM: spacing,
    curvature,
    widthM,
    corners,
    minClearanceM: clearance.minGapM,
    gateCount: gates.length,
    vehicle: p.vehicle,
    vehicleMinRadiusM: vehicleMinRadiusM(p.vehicle),
    cornerRadiusFloorM: p.minCornerRadiusM,
    assessment,
  });

  const track: Track = {
    format: TRACK_FORMAT,
    id: '',
    seed: p.seed,
    generatorVersion: GENERATOR_VERSION,
    params: echo,
    attempts: attempt + 1,
    centerline,
    walls,
    gates,
    spawns,
    corners,
    metrics: {
      lengthM: r3(m.lengthM),
      totalTurningDeg: r3(m.totalTurningDeg),
      netTurningDeg: r3(m.netTurningDeg),
      rightCornerShare: r6(m.rightCornerShare),
      rightTurningShare: r6(m.rightTurningShare),
      minRadiusM: r3(m.minRadiusM),
      width: { min: r3(m.width.min), max: r3(m.width.max) },
      minClearanceM: r3(m.minClearanceM),
      cornerCount: m.cornerCount,
      gateCount: m.gateCount,
      vehicleMinRadiusM: r3(m.vehicleMinRadiusM),
      cornerRadiusFloorM: r3(m.cornerRadiusFloorM),
      referenceLapTimeS: r3(m.referenceLapTimeS),
      averageSpeedMps: r3(m.averageSpeedMps),
      minSpeedMps: r3(m.minSpeedMps),
      maxSpeedMps: r3(m.maxSpeedMps),
      brakingTimeS: r3(m.brakingTimeS),
      driveLapTimeS: r3(m.driveLapTimeS),
      maxLateralDeviationM: r3(m.maxLateralDeviationM),
      minWallMarginM: r3(m.minWallMarginM),
      sensorCoverage: r6(m.sensorCoverage),
      sensorGateCoverage: r6(m.sensorGateCoverage),
      difficulty: r3(m.difficulty),
    },
  };
  return { track, drive: assessment.drive };
}

// corners in lap order from the start line, measured on the shipped curvature
function measureCorners(plan: Plan, trace: Trace, startS: number, traceS: Float64Array, splineS: Float64Array, curvature: Float64Array, tangents: Float64Array, spacing: number, L: number): Corner[] {
  const lapM = plan.lengthM;
  // trace position → spline arc length, linear between control points (whose positions both know)
  const toSpline = (ts: number) => interpolateClosed(traceS, lapM, splineS, L, (ts - startS + lapM) % lapM);
  const n = curvature.length;
  const raw = plan.corners.map((c, i) => {
    const endS = trace.cornerEnd[i] < trace.s.length ? trace.s[trace.cornerEnd[i]] : lapM;
    // the corner spans whole samples, widened to the samples just outside its ends (where the
    // curvature is zero); straights of at least MIN_STRAIGHT_M keep neighbours from overlapping
    const first = Math.max(0, Math.floor(toSpline(trace.s[trace.cornerStart[i]]) / spacing));
    let last = Math.ceil(toSpline(endS) / spacing);
    if (last <= first) last = n;
    // turning = heading change of the spline between the end samples, unwrapped sample by sample
    let turn = 0, kMax = 0;
    for (let k = first; k < last; k++) {
      const a = k % n, b = (k + 1) % n;
      turn += Math.atan2(tangents[2 * a] * tangents[2 * b + 1] - tangents[2 * a + 1] * tangents[2 * b], tangents[2 * a] * tangents[2 * b] + tangents[2 * a + 1] * tangents[2 * b + 1]);
      kMax = Math.max(kMax, Math.abs(curvature[a]));
    }
    kMax = Math.max(kMax, Math.abs(curvature[last % n]));
    return { sign: c.sign, sStart: first * spacing, sEnd: Math.min(last * spacing, L), angleDeg: Math.abs(turn) * (180 / Math.PI), minRadiusM: kMax > 0 ? 1 / kMax : Infinity };
  });
  raw.sort((a, b) => a.sStart - b.sStart);
  return raw.map((c, index) => ({
    index,
    direction: c.sign > 0 ? 'left' : 'right',
    angleDeg: r3(c.angleDeg),
    minRadiusM: r3(c.minRadiusM),
    sStart: r3(c.sStart),
    sEnd: r3(c.sEnd),
  }));
}

// every trace vertex at least `step` metres along the lap after the last one kept
function thinTrace(trace: Trace, step: number): { points: Float64Array; s: Float64Array } {
  const keep: number[] = [];
  let last = -Infinity;
  for (let k = 0; k < trace.s.length; k++) {
    if (trace.s[k] - last >= step) {
      keep.push(k);
      last = trace.s[k];
    }
  }
  const points = new Float64Array(2 * keep.length);
  const s = new Float64Array(keep.length);
  keep.forEach((k, i) => {
    points[2 * i] = trace.points[2 * k];
    points[2 * i + 1] = trace.points[2 * k + 1];
    s[i] = trace.s[k];
  });
  return { points, s };
}

function degrees(rad: number): number {
  let d = Math.round(rad * (180 / Math.PI) * 1000) / 1000;
  if (d <= -180) d += 360;
  return d + 0;
}

// coordinate c (2i: x, 2i + 1: y) of the left (side 1) or right (side -1) wall face at sample i
function face(points: Float64Array, normals: Float64Array, half: Float64Array, c: number, side: 1 | -1): number {
  const h = half[c >> 1];
  return side > 0 ? points[c] + normals[c] * h : points[c] - normals[c] * h;
}

function lerp(a: number, b: number, t: number): number {
  return a + (b - a) * t;
}

function r3(x: number): number {
  return Math.round(x * 1e3) / 1e3 + 0;
}

function r6(x: number): number {
  return Math.round(x * 1e6) / 1e6 + 0;
}

function r9(x: number): number {
  return Math.round(x * 1e9) / 1e9 + 0;
}
