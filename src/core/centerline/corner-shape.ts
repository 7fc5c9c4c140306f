import type { LoopNoise } from '../random/noise.js';
import type { Rng } from '../random/streams.js';
import { uniform } from '../random/streams.js';

/** Knot intervals of a corner's curvature profile. */
export const SHAPE_INTERVALS = 32;

/** Shape families of a corner's curvature profile (internal names). */
export type ShapeKind = 'constant' | 'tightening' | 'opening' | 'double-apex';

/**
 * Curvature profile of one corner, as a share of its peak curvature at SHAPE_INTERVALS + 1
 * evenly spaced knots in corner fraction (piecewise linear between knots). It starts and ends
 * at 0, so that curvature is continuous with the straights (a clothoid-like entry and exit),
 * and peaks at exactly 1, so that the corner's tightest radius is 1 / peak curvature.
 *
 *   1 |        ______                 f(v): share of peak curvature
 *     |      /        \__/‾‾\         v: fraction of the corner's length
 *     |    /               \
 *   0 |__/                   \__
 *       0        ramp   plateau   1
 */
export interface CornerShape {
  readonly kind: ShapeKind;
  readonly knots: Float64Array;
  /** Mean of the profile over the corner (integral over v in [0, 1]). */
  readonly mean: number;
  /** Shortest ramp (in or out) as a share of the corner's length: the profile's finest feature. */
  readonly minRamp: number;
}

/**
 * Draws a corner's curvature profile: a smooth ramp in, a plateau of the chosen kind, a ramp
 * out; then modulated by noise (amplitude `noiseAmp`) and renormalised to peak 1. The corner's
 * turning is its mean times its length times its peak curvature, so the caller keeps the
 * planned angle exact by setting the length from the mean (noise stays inside the budget).
 *
 * @param rng the plan stream
 * @param kind plateau family
 * @param wobble the noise at the knots, from {@link shapeNoise}
 * @param noiseAmp relative amplitude of the modulation, 0..0.6
 */
export function drawCornerShape(rng: Rng, kind: ShapeKind, wobble: Float64Array, noiseAmp: number): CornerShape {
  const rampIn = uniform(rng, 0.1, 0.35);
  const rampOut = uniform(rng, 0.1, 0.35);
  const plateauFrom = kind === 'tightening' ? uniform(rng, 0.6, 0.85) : 1;
  const plateauTo = kind === 'opening' ? uniform(rng, 0.6, 0.85) : 1;
  const dip = kind === 'double-apex' ? uniform(rng, 0.3, 0.5) : 0;
  const knots = new Float64Array(SHAPE_INTERVALS + 1);
  let peak = 0;
  for (let j = 1; j < SHAPE_INTERVALS; j++) {
    const v = j / SHAPE_INTERVALS;
    const ramp = Math.min(smoothstep(v / rampIn), smoothstep((1 - v) / rampOut));
    // plateau level moves linearly between the ramps; a double apex dips in the middle
    const level = plateauFrom + (plateauTo - plateauFrom) * v - dip * bump((v - 0.5) / 0.25);
    const f = Math.max(0, ramp * level * (1 + noiseAmp * wobble[j]));
    knots[j] = f;
    if (f > peak) peak = f;
  }
  let sum = 0;
  for (let j = 1; j < SHAPE_INTERVALS; j++) {
    knots[j] /= peak;
    sum += knots[j];
  }
  // trapezoid rule of the piecewise-linear profile; the end knots are 0
  return { kind, knots, mean: sum / SHAPE_INTERVALS, minRamp: Math.min(rampIn, rampOut) };
}

/**
 * The noise a corner's profile is modulated by, at its inner knots j = 1..SHAPE_INTERVALS - 1
 * (the end knots stay 0): seamless noise read along a window of the loop starting at `noiseAt`
 * (2% of the loop per corner). It depends on the corner's place only, so the planner reads it
 * once per place for all its draws.
 */
export function shapeNoise(noise: LoopNoise, noiseAt: number): Float64Array {
  const wobble = new Float64Array(SHAPE_INTERVALS + 1);
  for (let j = 1; j < SHAPE_INTERVALS; j++) wobble[j] = noise(noiseAt + (j / SHAPE_INTERVALS) * 0.02);
  return wobble;
}

/** Share of peak curvature at corner fraction v in [0, 1] (linear between knots). */
export function shapeAt(shape: CornerShape, v: number): number {
  const x = v * SHAPE_INTERVALS;
  const j = Math.min(SHAPE_INTERVALS - 1, Math.max(0, Math.floor(x)));
  const t = x - j;
  return shape.knots[j] * (1 - t) + shape.knots[j + 1] * t;
}

function smoothstep(x: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  return x * x * (3 - 2 * x);
}

// raised cosine on [-1, 1], 0 outside
function bump(x: number): number {
  return Math.abs(x) >= 1 ? 0 : 0.5 * (1 + Math.cos(Math.PI * x));
}
