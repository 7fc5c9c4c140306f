/**
 * Parameter ranges of a batch: every numeric parameter of a track request (nested ones too, such
 * as `widthM.min` or `wall.heightM`) is either a fixed number or a range `{min, max}`, drawn for
 * each track from a stream of that track's own seed. So a track of a batch is made again from its
 * seed and the batch's ranges alone, or from its seed and the resolved params the manifest records.
 *
 * Telling a range from a nested object: an object `{min, max}` of two numbers is a range, except
 * at a path whose parameter is itself a {min, max} pair (PAIR_PATHS: widthM, gateSpacingM), where
 * it is that pair and its bounds may each be ranged (`widthM: {min: {min: 8, max: 9}, max: 12}`).
 */
import type { Seed, TrackRequest } from '../params/types.js';
import { stream } from '../random/streams.js';

/** A closed interval to draw a parameter from, in the parameter's unit. */
export interface ValueRange {
  readonly min: number;
  readonly max: number;
}

/** A parameter of a batch: a fixed number or a range drawn per track. */
export type Ranged = number | ValueRange;

/** A request type with every numeric field (at any depth) allowed to be a range. */
export type Rangeable<T> = {
  readonly [K in keyof T]?: NonNullable<T[K]> extends number ? Ranged : NonNullable<T[K]> extends object ? Rangeable<NonNullable<T[K]>> : T[K];
};

/** Parameters of a batch: a track request without a seed, any numeric leaf ranged. */
export type ParamRanges = Rangeable<Omit<TrackRequest, 'seed'>>;

/** Parameters that are {min, max} pairs themselves: an object there is the pair, not a range. */
export const PAIR_PATHS: readonly string[] = ['widthM', 'gateSpacingM'];

/** Parameters that take whole numbers: a range there draws integers. */
export const INTEGER_PATHS: readonly string[] = ['cornerCount', 'spawnSlots', 'sensors.count'];

/** Drawn values of continuous parameters are rounded to this many decimals (1 mm for lengths). */
export const DRAWN_DECIMALS = 3;
const DRAWN_SCALE = 10 ** DRAWN_DECIMALS;

/** True for a range {min, max} of two numbers (and nothing else). */
export function isValueRange(value: unknown): value is ValueRange {
  if (typeof value !== 'object' || value === null) return false;
  const keys = Object.keys(value);
  return keys.length === 2 && typeof (value as ValueRange).min === 'number' && typeof (value as ValueRange).max === 'number';
}

/**
 * The track request for one seed of a batch: fixed values copied, each range drawn from its own
 * stream of the seed (`stream(seed, 0, 'batch-params/<dotted path>')`), so a leaf's value never
 * depends on which other leaves are ranged. A continuous draw is uniform on [min, max] rounded
 * to DRAWN_DECIMALS (and kept inside the range); a whole-number leaf (INTEGER_PATHS) is uniform
 * over the integers in [min, max].
 *
 * The ranges are taken as checked by the shell's schema (inside the core's LIMITS, min <= max,
 * a pair's lower range at or below its upper one).
 * @example sampleParams({ lengthM: { min: 800, max: 1200 }, cornerCount: 6 }, 42) // { seed: 42, lengthM: 1034.217, cornerCount: 6 }
 */
export function sampleParams(ranges: ParamRanges, seed: Seed): TrackRequest {
  return { seed, ...(drawObject(ranges as Record<string, unknown>, '', seed) as object) } as TrackRequest;
}

function drawObject(ranges: Record<string, unknown>, prefix: string, seed: Seed): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(ranges)) {
    const path = prefix === '' ? key : `${prefix}.${key}`;
    if (isValueRange(value) && !PAIR_PATHS.includes(path)) out[key] = draw(value, path, seed);
    else if (typeof value === 'object' && value !== null && !Array.isArray(value)) out[key] = drawObject(value as Record<string, unknown>, path, seed);
    else out[key] = value;
  }
  return out;
}

function draw(range: ValueRange, path: string, seed: Seed): number {
  const rng = stream(seed, 0, `batch-params/${path}`);
  if (INTEGER_PATHS.includes(path)) {
    const lo = Math.ceil(range.min);
    const hi = Math.floor(range.max);
    return lo + Math.floor(rng() * (hi - lo + 1));
  }
  const x = Math.round((range.min + (range.max - range.min) * rng()) * DRAWN_SCALE) / DRAWN_SCALE;
  return Math.min(range.max, Math.max(range.min, x));
}
