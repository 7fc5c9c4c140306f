/**
 * Curricula: stages of parameter ranges that ramp difficulty, from a gentle loop whose corners
 * all turn one way, through a loop the other way, to mixed technical circuits.
 *
 * A ladder maps a level x in [0, 1] to parameters; along it every parameter moves towards a
 * harder lap (more turning per metre, more and tighter corners, a narrower road, more noise).
 * A curriculum of n stages spaces n levels evenly from `from` to `to` and gives each stage the
 * ranges the ladder spans over a band of levels around its own (a quarter of the gap to the next
 * stage each side), so stages never share a level and their parameters move monotonically. The
 * shells then measure each stage's difficulty on sample tracks and give every stage a band of
 * the difficulty figure (difficultyBands) that a batch keeps its tracks inside, so that every
 * track of a later stage is harder than every track of an earlier one.
 *
 *   x:    0 ─────── 0.15 ─────── 0.3 ──── 0.5 ──── 0.75 ──── 1
 *         loop, left   loop, right │ steady   lively  technical  fierce
 *         (360°, all corners one way) (mixed directions, rising budget, narrowing road)
 */
import type { ParamRanges, Ranged, ValueRange } from './ranges.js';

/** One anchor of the ladder: parameters at a level; between anchors they are interpolated linearly. */
interface Anchor {
  readonly x: number;
  readonly lengthM: number;
  readonly widthMin: number;
  readonly widthMax: number;
  readonly budgetDeg: number;
  readonly turnBalance: number;
  readonly cornerCount: number;
  readonly radiusM: number;
  readonly noise: number;
}

// level where the loop's direction flips, and where loops end and mixed circuits begin
const FLIP_X = 0.15;
const MIXED_X = 0.3;

// one-direction loops: the budget stays at 360 (a closed loop with every corner one way)
const LOOP_START: Anchor = { x: 0, lengthM: 1200, widthMin: 14, widthMax: 18, budgetDeg: 360, turnBalance: 0, cornerCount: 4, radiusM: 40, noise: 0.1 };
const LOOP_END: Anchor = { x: MIXED_X, lengthM: 1000, widthMin: 12.5, widthMax: 16.5, budgetDeg: 360, turnBalance: 1, cornerCount: 6, radiusM: 30, noise: 0.2 };
// mixed circuits, from wide and open to narrow and busy
const MIXED: readonly Anchor[] = [
  { x: MIXED_X, lengthM: 1800, widthMin: 12, widthMax: 16, budgetDeg: 640, turnBalance: 0.2, cornerCount: 6, radiusM: 28, noise: 0.2 },
  { x: 0.5, lengthM: 2400, widthMin: 11, widthMax: 14, budgetDeg: 1000, turnBalance: 0.3, cornerCount: 10, radiusM: 20, noise: 0.3 },
  { x: 0.75, lengthM: 3000, widthMin: 9, widthMax: 12, budgetDeg: 1500, turnBalance: 0.4, cornerCount: 15, radiusM: 14, noise: 0.35 },
  { x: 1, lengthM: 3200, widthMin: 7, widthMax: 10, budgetDeg: 2100, turnBalance: 0.45, cornerCount: 21, radiusM: 11, noise: 0.4 },
];

/** Level of the technical circuits: the default end of a curriculum. */
export const TECHNICAL_LEVEL = 0.75;

/** Stages a curriculum may have. */
export const CURRICULUM_STAGES = { min: 2, max: 10 } as const;

/** Smallest gap between the levels of consecutive stages: closer stages would be hard to tell apart by difficulty. */
export const MIN_LEVEL_STEP = 0.08;

/** Level band of a stage, as a share of the gap between stages, each side. */
const BAND_SHARE = 0.25;
/** Widest band each side, in level. */
const MAX_BAND = 0.04;
/** Inner difficulty band edges sit half a unit of the difficulty's last (third) decimal off its grid. */
const BAND_EDGE_OFFSET = 0.0005;

/** One stage of a curriculum. */
export interface CurriculumStage {
  readonly index: number;
  /** 'loop-left', 'loop-right' or 'mixed'. */
  readonly kind: 'loop-left' | 'loop-right' | 'mixed';
  readonly description: string;
  /** Level on the ladder, 0..1. */
  readonly level: number;
  /** Batch parameters of the stage (ranges), ready for POST /v1/batches or lapwright batch --params. */
  readonly params: ParamRanges;
}

/**
 * The stages of a curriculum, easiest first.
 * @param stages number of stages, CURRICULUM_STAGES.min..max
 * @param from level of the first stage, 0..1 (default 0: the gentlest loop)
 * @param to level of the last stage, 0..1 (default TECHNICAL_LEVEL: technical circuits), above `from`
 * @throws {RangeError} when stages, from or to are outside their ranges, or stages are closer than MIN_LEVEL_STEP
 * @example curriculumStages(5).map((s) => s.kind) // ['loop-left', 'loop-right', 'mixed', 'mixed', 'mixed']
 */
export function curriculumStages(stages: number, from = 0, to = TECHNICAL_LEVEL): CurriculumStage[] {
  if (!Number.isInteger(stages) || stages < CURRICULUM_STAGES.min || stages > CURRICULUM_STAGES.max) {
    throw new RangeError(`stages must be an integer from ${CURRICULUM_STAGES.min} to ${CURRICULUM_STAGES.max}, got ${stages}.`);
  }
  if (!(from >= 0 && from <= 1) || !(to >= 0 && to <= 1)) throw new RangeError(`from and to must be levels from 0 to 1, got ${from} and ${to}.`);
  if (!(from < to)) throw new RangeError(`from (${from}) must be below to (${to}).`);
  const step = (to - from) / (stages - 1);
  if (step < MIN_LEVEL_STEP - 1e-12) {
    throw new RangeError(`${stages} stages from level ${from} to ${to} are ${round(step, 3)} apart, closer than ${MIN_LEVEL_STEP}: ask for at most ${Math.floor((to - from) / MIN_LEVEL_STEP + 1e-9) + 1} stages, or widen from..to.`);
  }
  const band = Math.min(MAX_BAND, BAND_SHARE * step);
  return Array.from({ length: stages }, (_, k) => {
    const x = from + step * k;
    const kind = x < FLIP_X ? 'loop-left' : x < MIXED_X ? 'loop-right' : 'mixed';
    return { index: k, kind, description: DESCRIPTIONS[kind], level: round(x, 6), params: stageRanges(x, band, kind) };
  });
}

/**
 * Difficulty bands of consecutive stages from the difficulty measured on each stage's sample
 * tracks (their medians, rising): each inner edge lies halfway between two medians, moved half a
 * unit of the third decimal off the grid the difficulty figure is rounded to, so no track sits on
 * an edge; the first band starts at 0 and the last ends at 10. Bands rise and do not overlap.
 * @returns the bands, or null when the medians do not rise strictly (stages too alike to band)
 * @example difficultyBands([3.3, 3.9, 4.6]) // [{min: 0, max: 3.6005}, {min: 3.6005, max: 4.2505}, {min: 4.2505, max: 10}]
 */
export function difficultyBands(medians: readonly number[]): ValueRange[] | null {
  for (let k = 1; k < medians.length; k++) if (!(medians[k] > medians[k - 1])) return null;
  const edges = medians.slice(1).map((m, k) => round(round((medians[k] + m) / 2, 3) + BAND_EDGE_OFFSET, 4));
  return medians.map((_, k) => ({ min: k === 0 ? 0 : edges[k - 1], max: k === medians.length - 1 ? 10 : edges[k] }));
}

const DESCRIPTIONS = {
  'loop-left': 'A loop whose corners all turn left (counter-clockwise): wide road, open corners, learning to stay between the walls.',
  'loop-right': 'The same kind of loop the other way round (every corner right, clockwise), a little narrower and tighter.',
  mixed: 'Circuits with corners both ways; budget, corner count and tightness rise and the road narrows along the stages.',
} as const;

// parameters at level x: loops interpolate LOOP_START..LOOP_END (direction by FLIP_X), circuits the MIXED anchors
function ladderAt(x: number): Anchor {
  if (x < MIXED_X) {
    const a = lerpAnchor(LOOP_START, LOOP_END, x / MIXED_X);
    return { ...a, budgetDeg: 360, turnBalance: x < FLIP_X ? 0 : 1 };
  }
  for (let i = 1; i < MIXED.length; i++) {
    if (x <= MIXED[i].x) return lerpAnchor(MIXED[i - 1], MIXED[i], (x - MIXED[i - 1].x) / (MIXED[i].x - MIXED[i - 1].x));
  }
  return MIXED[MIXED.length - 1];
}

function lerpAnchor(a: Anchor, b: Anchor, t: number): Anchor {
  const l = (p: number, q: number): number => p + (q - p) * t;
  return {
    x: l(a.x, b.x),
    lengthM: l(a.lengthM, b.lengthM),
    widthMin: l(a.widthMin, b.widthMin),
    widthMax: l(a.widthMax, b.widthMax),
    budgetDeg: l(a.budgetDeg, b.budgetDeg),
    turnBalance: l(a.turnBalance, b.turnBalance),
    cornerCount: l(a.cornerCount, b.cornerCount),
    radiusM: l(a.radiusM, b.radiusM),
    noise: l(a.noise, b.noise),
  };
}

// the ranges the ladder spans over [x − band, x + band], kept inside the stage's phase
function stageRanges(x: number, band: number, kind: CurriculumStage['kind']): ParamRanges {
  const [phaseLo, phaseHi] = kind === 'loop-left' ? [0, FLIP_X - 1e-9] : kind === 'loop-right' ? [FLIP_X, MIXED_X - 1e-9] : [MIXED_X, 1];
  const lo = ladderAt(Math.max(phaseLo, x - band));
  const hi = ladderAt(Math.min(phaseHi, x + band));
  const span = (p: number, q: number, decimals: number): Ranged => {
    const a = round(Math.min(p, q), decimals);
    const b = round(Math.max(p, q), decimals);
    return a === b ? a : ({ min: a, max: b } satisfies ValueRange);
  };
  const loop = kind !== 'mixed';
  return {
    lengthM: span(lo.lengthM, hi.lengthM, 0),
    widthM: { min: span(lo.widthMin, hi.widthMin, 1), max: span(lo.widthMax, hi.widthMax, 1) },
    // a loop whose corners all turn one way turns exactly 360 degrees
    curvatureBudgetDeg: loop ? 360 : span(lo.budgetDeg, hi.budgetDeg, 0),
    turnBalance: kind === 'loop-left' ? 0 : kind === 'loop-right' ? 1 : span(lo.turnBalance, hi.turnBalance, 2),
    cornerCount: span(Math.round(lo.cornerCount), Math.round(hi.cornerCount), 0),
    minCornerRadiusM: span(lo.radiusM, hi.radiusM, 1),
    noise: span(lo.noise, hi.noise, 2),
  };
}

function round(x: number, decimals: number): number {
  const scale = 10 ** decimals;
  return Math.round(x * scale) / scale;
}
