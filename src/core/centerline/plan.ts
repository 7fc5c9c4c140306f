import type { TrackParams } from '../params/types.js';
import type { TurnSplit } from '../params/feasibility.js';
import { MIN_STRAIGHT_M } from '../params/feasibility.js';
import type { LoopNoise } from '../random/noise.js';
import type { Rng } from '../random/streams.js';
import { normal, pickWeighted, uniform } from '../random/streams.js';
import { fitAngles } from './angles.js';
import { solveStraights } from './closure.js';
import { drawCornerShape, shapeNoise, type ShapeKind } from './corner-shape.js';
import type { Plan, PlannedCorner } from './plan-types.js';
import { cornerDisplacement } from './trace.js';
import { macroCollision, type MacroCollision } from './macro-check.js';

const DEG = Math.PI / 180;

/**
 * Share of radius the planner keeps above minCornerRadiusM, for the spline's deviation from the
 * plan (control-points.ts keeps it near 0.2%; measured worst case in tests/core/generate).
 */
export const RADIUS_MARGIN = 0.01;

/** Tightest radius the planner uses, metres. */
export function plannedMinRadiusM(minCornerRadiusM: number): number {
  return minCornerRadiusM * (1 + RADIUS_MARGIN);
}

/**
 * Orderings of the corners tried per attempt before the attempt is given up. Many orderings
 * with few wish draws each: whether an outline can keep its distance depends on the ordering
 * (and its angles) far more than on the straights, and an ordering costs little more than a draw.
 */
export const ORDER_DRAWS = 16;
/** Corner count up to which the ordering band keeps its full width (100–200°). */
export const BAND_CORNERS = 15;
/** Draws of straight-length wishes per ordering; the first whose outline keeps its distance (after repair) is kept. */
export const WISH_DRAWS = 3;
/** Repair steps per wish draw: an outline that comes too close to itself is pushed apart this often before the next draw. */
export const REPAIR_STEPS = 3;
/** Each repair step aims this share of the required distance beyond it (the step is solved to first order). */
export const REPAIR_MARGIN = 0.1;
/** Log-normal spread of the straights between features (a few long, many short). */
export const STRAIGHT_SIGMA = 0.9;

/** Trace step used for the closure solve and the coarse check, metres. */
export const PLAN_STEP_M = 2;

/**
 * Feature templates: short runs of corners joined by short straights, in units of
 * M (a corner turning the loop's way) and m (against it). Weights are relative draw chances.
 */
const TEMPLATES: readonly { readonly pattern: string; readonly weight: number }[] = [
  { pattern: 'M', weight: 3 },
  { pattern: 'MM', weight: 1 },
  { pattern: 'mM', weight: 2 },
  { pattern: 'Mm', weight: 2 },
  { pattern: 'MmM', weight: 1.2 },
  { pattern: 'mMm', weight: 0.6 },
  { pattern: 'm', weight: 1.2 },
  { pattern: 'mm', weight: 0.3 },
];

interface Draft {
  readonly signs: (1 | -1)[];
  /** Feature each corner belongs to; consecutive corners of one feature are joined by short straights. */
  readonly feature: number[];
}

/**
 * Plans one lap: groups corners into features (single corners, esses, chicanes, complexes),
 * orders the features so that the running turning stays inside a band around an even climb,
 * gives every corner an angle (each direction's total exact: Hopf's Umlaufsatz, ±360° net),
 * a radius and a noise-modulated curvature profile, then solves the straights so that the
 * lap closes at exactly the requested length.
 *
 * @returns the plan, or null when this draw cannot close (the caller retries with the next attempt)
 */
export function planLap(p: TrackParams, split: TurnSplit, rng: Rng, noise: LoopNoise): Plan | null {
  const loopSign: 1 | -1 = split.loopSign === 0 ? (rng() < 0.5 ? 1 : -1) : split.loopSign;
  const majorCount = loopSign > 0 ? split.leftCount : split.rightCount;
  const minorCount = p.cornerCount - majorCount;
  // the loop's direction carries the +360 (with as many corners each way, the drawn direction does)
  const majorTotal = Math.max(split.leftTurningDeg, split.rightTurningDeg) * DEG;
  const minorTotal = Math.min(split.leftTurningDeg, split.rightTurningDeg) * DEG;
  // the shape noise of the corner at each place, read on the first draw that gets that far
  const wobble: Float64Array[] = [];
  for (let draw = 0; draw < ORDER_DRAWS; draw++) {
    const plan = planOnce(p, rng, noise, wobble, loopSign, majorCount, minorCount, majorTotal, minorTotal);
    if (plan !== null) return plan;
  }
  return null;
}

// one ordering of the corners, its angles, shapes and radii, then the straights
function planOnce(
  p: TrackParams,
  rng: Rng,
  noise: LoopNoise,
  wobble: Float64Array[],
  loopSign: 1 | -1,
  majorCount: number,
  minorCount: number,
  majorTotal: number,
  minorTotal: number,
): Plan | null {

  // the band narrows as 1/√n beyond BAND_CORNERS corners: the running turn of many corners
  // strays like a random walk, and wide strays make long laps fold over themselves
  const band = uniform(rng, 100, 200) * DEG * Math.min(1, Math.sqrt(BAND_CORNERS / (majorCount + minorCount)));
  const draft = orderFeatures(rng, majorCount, minorCount, band, majorTotal / Math.max(1, majorCount), minorCount > 0 ? minorTotal / minorCount : 0);
  if (draft === null) return null;
  const n = draft.signs.length;
  // the draft says major (+1) or minor (-1); the loop's direction turns that into left or right
  const signs = draft.signs.map((s) => (s === 1 ? loopSign : -loopSign) as 1 | -1);

  // nominal angles: a mixture from kinks to hairpins, then each direction scaled to its exact total
  const nominal = new Float64Array(n);
  for (let i = 0; i < n; i++) nominal[i] = drawNominalAngle(rng);
  const majorIdx: number[] = [];
  const minorIdx: number[] = [];
  for (let i = 0; i < n; i++) (draft.signs[i] === 1 ? majorIdx : minorIdx).push(i);
  const angles = new Float64Array(n);
  const fitMajor = fitAngles(majorIdx.map((i) => nominal[i]), majorTotal);
  majorIdx.forEach((i, k) => (angles[i] = fitMajor[k]));
  if (minorIdx.length > 0) {
    const fitMinor = fitAngles(minorIdx.map((i) => nominal[i]), minorTotal);
    minorIdx.forEach((i, k) => (angles[i] = fitMinor[k]));
  }

  // shapes, then radii: a relative radius per corner, scaled so that corners take their share of the lap
  const noiseAmp = 0.45 * p.noise;
  // (every draw orders all the corners: n, and so each place's noise, is the same)
  const shapes = signs.map((_, i) => drawCornerShape(rng, drawShapeKind(rng), (wobble[i] ??= shapeNoise(noise, i / n)), noiseAmp));
  const relRadius = new Float64Array(n);
  const meanAngle = (majorTotal + minorTotal) / n;
  for (let i = 0; i < n; i++) relRadius[i] = drawRelativeRadius(rng, angles[i] / meanAngle);
  const rMin = plannedMinRadiusM(p.minCornerRadiusM);
  const cornerShare = uniform(rng, 0.35, 0.65);
  const radii = fitRadii(angles, shapes.map((s) => s.mean), relRadius, rMin, cornerShare * p.lengthM, p.lengthM - n * MIN_STRAIGHT_M * 4);
  const corners: PlannedCorner[] = [];
  let cornerLength = 0;
  for (let i = 0; i < n; i++) {
    const peak = 1 / radii[i];
    const lengthM = angles[i] / (peak * shapes[i].mean);
    cornerLength += lengthM;
    corners.push({ sign: signs[i], angleRad: angles[i], peakCurvature: peak, lengthM, shape: shapes[i] });
  }
  const straightTotal = p.lengthM - cornerLength;
  if (straightTotal < n * MIN_STRAIGHT_M) return null;

  // headings of the straights and the corners' summed displacement
  const cosH = new Float64Array(n);
  const sinH = new Float64Array(n);
  const local = new Float64Array(4 * n);
  let h = 0, rx = 0, ry = 0;
  for (let i = 0; i < n; i++) {
    const [mx, my, dx, dy] = cornerDisplacement(corners[i], PLAN_STEP_M);
    local[4 * i] = mx;
    local[4 * i + 1] = my;
    local[4 * i + 2] = dx;
    local[4 * i + 3] = dy;
    const c = Math.cos(h), s = Math.sin(h);
    rx -= c * dx - s * dy;
    ry -= s * dx + c * dy;
    h += corners[i].sign * corners[i].angleRad;
    cosH[i] = Math.cos(h);
    sinH[i] = Math.sin(h);
  }

  // wishes: long straights between features (log-normal: a few long, many short), short ones
  // inside; of WISH_DRAWS draws, keep the first whose coarse outline keeps its distance, after
  // up to REPAIR_STEPS steps that push a pair coming too close apart (none: this ordering is
  // given up)
  const inside = new Uint8Array(n);
  for (let i = 0; i < n; i++) inside[i] = draft.feature[i] === draft.feature[(i + 1) % n] ? 1 : 0;
  const lo = new Float64Array(n).fill(MIN_STRAIGHT_M);
  const wish = new Float64Array(n);
  const weight = new Float64Array(n);
  let best: Float64Array | null = null;
  // the outline's pieces must stay two road reaches and the margin apart
  const required = p.widthM.max + 2 * p.wall.thicknessM + p.clearanceM;
  const outline = new Float64Array(6 * n);
  for (let draw = 0; draw < WISH_DRAWS && best === null; draw++) {
    let wishSum = 0;
    for (let i = 0; i < n; i++) {
      wish[i] = inside[i] ? uniform(rng, 0.02, 0.12) : Math.exp(STRAIGHT_SIGMA * normal(rng));
      wishSum += wish[i];
    }
    for (let i = 0; i < n; i++) {
      wish[i] *= straightTotal / wishSum;
      weight[i] = Math.max(wish[i], 5);
    }
    let d = solveStraights(cosH, sinH, wish, weight, lo, rx, ry, straightTotal);
    // whether straights above their bounds can close the lap does not depend on the wishes:
    // when the first draw finds none, the others would not either
    if (d === null && draw === 0) return null;
    for (let step = 0; d !== null; step++) {
      const hit = macroCollision(corners, local, d, required, p.minCornerRadiusM, outline);
      if (hit === null) best = d;
      if (hit === null || step === REPAIR_STEPS) break;
      const gain = required * (1 + REPAIR_MARGIN) + chordBulgeM(corners, hit.a) + chordBulgeM(corners, hit.b) - hit.distanceM;
      d = pushApart(cosH, sinH, d, hit, weight, lo, rx, ry, straightTotal, gain);
    }
  }
  if (best === null) return null;
  const straights = best;
  return { corners, straights, loopSign, lengthM: p.lengthM };
}

/**
 * One repair step for a closed lap whose outline pieces `hit.a` and `hit.b` come too close:
 * the straights move along the steepest ascent of the pair's separation (measured in the
 * solve's weighting, so long straights give more), kept closed and at the exact length by
 * solveStraights, with the step scaled so that to first order the pair gains `gainM`. The
 * corners are untouched, so the turning and radii stay as planned; the straights stay >= lo.
 *
 * @param d the current straights (closing the lap)
 * @returns the new straights, or null when no step along the ascent parts the pair or closes
 */
export function pushApart(
  cosH: Float64Array,
  sinH: Float64Array,
  d: Float64Array,
  hit: MacroCollision,
  weight: Float64Array,
  lo: Float64Array,
  rx: number,
  ry: number,
  total: number,
  gainM: number,
): Float64Array | null {
  const n = d.length;
  const g = separationGradient(cosH, sinH, hit, n);
  // a trial step of one weight unit shows how much separation the closing solve leaves of the ascent
  const wish = new Float64Array(n);
  for (let i = 0; i < n; i++) wish[i] = d[i] + weight[i] * g[i];
  const trial = solveStraights(cosH, sinH, wish, weight, lo, rx, ry, total);
  if (trial === null) return null;
  let slope = 0;
  for (let i = 0; i < n; i++) slope += g[i] * (trial[i] - d[i]);
  if (!(slope > 1e-9)) return null;
  const scale = gainM / slope;
  for (let i = 0; i < n; i++) wish[i] = d[i] + scale * weight[i] * g[i];
  return solveStraights(cosH, sinH, wish, weight, lo, rx, ry, total);
}

/**
 * How far the traced corner bulges beyond outline piece `piece` (a chord over half a corner),
 * taken as the sagitta of a circular arc of the corner's mean radius: a repair that parts
 * chords by the required distance alone would leave the corners themselves too close. 0 for
 * a straight.
 */
function chordBulgeM(corners: readonly PlannedCorner[], piece: number): number {
  if (piece % 3 === 2) return 0;
  const c = corners[Math.floor(piece / 3)];
  return (c.lengthM / c.angleRad) * (1 - Math.cos(c.angleRad / 4));
}

/**
 * How the separation of the pair along `hit`'s direction changes per metre of each straight:
 * straight j moves b's closest point relative to a's by its heading times the share of it
 * lying between the two points (1 for straights wholly between, the closest point's
 * parameter for a straight that is one of the pieces).
 */
function separationGradient(cosH: Float64Array, sinH: Float64Array, hit: MacroCollision, n: number): Float64Array {
  const g = new Float64Array(n);
  const ia = Math.floor(hit.a / 3), ib = Math.floor(hit.b / 3);
  // share of straight j before a piece's closest point: whole before its corner, its parameter on itself
  const before = (j: number, i: number, onStraight: boolean, t: number) => (j < i ? 1 : j === i && onStraight ? t : 0);
  for (let j = ia; j <= ib && j < n; j++) {
    const share = before(j, ib, hit.b % 3 === 2, hit.tb) - before(j, ia, hit.a % 3 === 2, hit.ta);
    g[j] = share * (cosH[j] * hit.nx + sinH[j] * hit.ny);
  }
  return g;
}

/**
 * Draws features from the templates until the corner counts are used up, then orders them so
 * that the running net turning (in the loop's direction) stays within `band` of an even climb
 * from 0 to 2π; the corners' mean angles stand in for the angles, which are drawn later.
 */
function orderFeatures(rng: Rng, majorCount: number, minorCount: number, band: number, majorMean: number, minorMean: number): Draft | null {
  const features: string[] = [];
  let M = majorCount, m = minorCount;
  while (M + m > 0) {
    const weights = TEMPLATES.map((t) => {
      const needM = count(t.pattern, 'M'), needm = count(t.pattern, 'm');
      if (needM > M || needm > m) return 0;
      // favour templates that use the counts up in proportion
      return t.weight * (needm > 0 ? 1 + (2 * m) / (M + m) : 1);
    });
    if (weights.every((w) => w === 0)) return null;
    const t = TEMPLATES[pickWeighted(rng, weights)].pattern;
    features.push(t);
    M -= count(t, 'M');
    m -= count(t, 'm');
  }
  const total = majorCount + minorCount;
  const remaining = features.slice();
  const signs: (1 | -1)[] = [];
  const feature: number[] = [];
  let turned = 0;
  let done = 0;
  let f = 0;
  while (remaining.length > 0) {
    // candidates that keep every partial turn inside the band; else the least bad one
    const order = remaining.map((_, i) => i);
    let best = -1;
    let bestExcess = Infinity;
    const start = Math.floor(rng() * order.length);
    for (let k = 0; k < order.length; k++) {
      const idx = (start + k) % order.length;
      const excess = bandExcess(remaining[idx], turned, done, total, band, majorMean, minorMean);
      if (excess < bestExcess) {
        bestExcess = excess;
        best = idx;
        if (excess === 0) break;
      }
    }
    const t = remaining.splice(best, 1)[0];
    for (const ch of t) {
      signs.push(ch === 'M' ? 1 : -1);
      feature.push(f);
      turned += ch === 'M' ? majorMean : -minorMean;
      done++;
    }
    f++;
  }
  return { signs, feature };
}

// how far a feature's partial turns leave the band around turned = 2π * corners done / total
function bandExcess(t: string, turned: number, done: number, total: number, band: number, majorMean: number, minorMean: number): number {
  let excess = 0;
  for (const ch of t) {
    turned += ch === 'M' ? majorMean : -minorMean;
    done++;
    const ideal = (2 * Math.PI * done) / total;
    excess += Math.max(0, Math.abs(turned - ideal) - band);
  }
  return excess;
}

function count(s: string, ch: string): number {
  let c = 0;
  for (const x of s) if (x === ch) c++;
  return c;
}

// relative corner sizes: kinks, medium corners, long corners, hairpins
function drawNominalAngle(rng: Rng): number {
  const r = rng();
  if (r < 0.15) return uniform(rng, 0.12, 0.3);
  if (r < 0.65) return uniform(rng, 0.5, 1.1);
  if (r < 0.88) return uniform(rng, 1.1, 1.6);
  return uniform(rng, 1.7, 2.3);
}

function drawShapeKind(rng: Rng): ShapeKind {
  const kinds: ShapeKind[] = ['constant', 'tightening', 'opening', 'double-apex'];
  return kinds[pickWeighted(rng, [4, 2, 2, 1])];
}

// radius relative to the others: hairpins tight, kinks open, the rest spread on a log scale
function drawRelativeRadius(rng: Rng, angleRatio: number): number {
  if (angleRatio > 1.6) return uniform(rng, 1, 1.4);
  if (angleRatio < 0.35) return Math.exp(uniform(rng, Math.log(3), Math.log(10)));
  return Math.exp(uniform(rng, 0, Math.log(5)));
}

/**
 * Radii r_i = max(rMin, λ rel_i) with λ chosen (bisection) so that the corners take `target`
 * metres, but never more than `cap`; every radius stays >= rMin.
 */
function fitRadii(angles: Float64Array, means: number[], rel: Float64Array, rMin: number, target: number, cap: number): Float64Array {
  const n = angles.length;
  const radii = new Float64Array(n);
  const lengthAt = (lambda: number) => {
    let sum = 0;
    for (let i = 0; i < n; i++) sum += (angles[i] * Math.max(rMin, lambda * rel[i])) / means[i];
    return sum;
  };
  const goal = Math.min(target, cap);
  let lo = 0, hi = 1;
  while (lengthAt(hi) < goal && hi < 1e9) hi *= 2;
  for (let it = 0; it < 60; it++) {
    const mid = 0.5 * (lo + hi);
    if (lengthAt(mid) < goal) lo = mid;
    else hi = mid;
  }
  for (let i = 0; i < n; i++) radii[i] = Math.max(rMin, lo * rel[i]);
  return radii;
}
