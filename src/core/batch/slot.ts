/**
 * One track of a batch, made alone: slot `index` walks its draws d = from, from + 1, … ; a seed
 * outside the requested split is skipped without generating, an infeasible one is redrawn (the
 * next draw), a track outside the requested difficulty band is skipped, and the first feasible
 * one inside the band is the slot's candidate. Whether the candidate is kept
 * (novelty) is decided by whoever holds the tracks before it, in index order; a refused
 * candidate asks for the slot again from its next draw.
 *
 *   draw:    0        1          2           3
 *   seed:    s0       s1         s2          s3
 *            │        │          │           │
 *            other    in split,  in split,   (not reached)
 *            split    infeasible feasible ──► candidate (skippedSplit 1, redrawn 1)
 */
import { generateTrackJson } from '../generate.js';
import { type InfeasibleError, isInfeasibleError } from '../errors.js';
import type { Seed } from '../params/types.js';
import type { Track } from '../track.js';
import { encodeShape } from './novelty.js';
import { type ParamRanges, sampleParams, type ValueRange } from './ranges.js';
import { batchSeed, MAX_SLOT_DRAWS } from './seeds.js';
import { type Split, splitOf } from './split.js';

/** Infeasible draws one call of makeSlotCandidate takes before it gives up on the slot. */
export const MAX_SLOT_REDRAWS = 64;

/** Tracks outside the difficulty band one call of makeSlotCandidate makes before it gives up on the slot. */
export const MAX_SLOT_DIFFICULTY_MISSES = 256;

/** What every slot of a batch shares. */
export interface BatchPlan {
  readonly baseSeed: Seed;
  readonly split: Split | null;
  readonly params: ParamRanges;
  /** Keep only tracks whose metrics.difficulty lies in [min, max]; null: any. */
  readonly difficulty: ValueRange | null;
}

/** A feasible draw of a slot: the track, its JSON (JSON.stringify of it) as UTF-8 bytes, its stored shape. */
export interface SlotCandidate {
  readonly index: number;
  readonly draw: number;
  readonly split: Split;
  readonly track: Track;
  readonly json: Uint8Array;
  readonly shape: string;
}

/** Draws of one call that did not become its candidate. */
export interface SlotSkips {
  /** Seeds outside the split (not generated). */
  readonly skippedSplit: number;
  /** Infeasible draws. */
  readonly redrawn: number;
  /** Tracks made but outside the difficulty band. */
  readonly skippedDifficulty: number;
}

/** Why a slot found no track: too many infeasible draws, too many tracks outside the difficulty band, or no draws left. */
export type SlotFailureReason = 'infeasible' | 'difficulty' | 'exhausted';

/** How one call for a slot ended, with the draws it skipped on the way. */
export type SlotOutcome =
  | (SlotSkips & { readonly ok: true; readonly candidate: SlotCandidate })
  | (SlotSkips & {
      readonly ok: false;
      readonly index: number;
      readonly reason: SlotFailureReason;
      /** The last infeasible draw's error, if any. */
      readonly last: InfeasibleError | null;
    });

/**
 * The first feasible draw of slot `index` from draw `from` on.
 * @throws whatever generateTrack throws besides InfeasibleError (a bug)
 * @example makeSlotCandidate({ baseSeed: 'larkspur', split: 'test', params: {} }, 0, 0)
 */
export function makeSlotCandidate(plan: BatchPlan, index: number, from: number): SlotOutcome {
  let skippedSplit = 0;
  let redrawn = 0;
  let skippedDifficulty = 0;
  let last: InfeasibleError | null = null;
  const band = plan.difficulty;
  for (let draw = from; draw < MAX_SLOT_DRAWS; draw++) {
    const seed = batchSeed(plan.baseSeed, index, draw);
    const split = splitOf(seed);
    if (plan.split !== null && split !== plan.split) {
      skippedSplit++;
      continue;
    }
    let made: { track: Track; bytes: Uint8Array };
    try {
      made = generateTrackJson(sampleParams(plan.params, seed));
    } catch (err) {
      if (!isInfeasibleError(err)) throw err;
      last = err;
      redrawn++;
      if (redrawn >= MAX_SLOT_REDRAWS) return { ok: false, index, reason: 'infeasible', last, skippedSplit, redrawn, skippedDifficulty };
      continue;
    }
    const { track, bytes: json } = made;
    if (band !== null && !(track.metrics.difficulty >= band.min && track.metrics.difficulty <= band.max)) {
      skippedDifficulty++;
      if (skippedDifficulty >= MAX_SLOT_DIFFICULTY_MISSES) return { ok: false, index, reason: 'difficulty', last, skippedSplit, redrawn, skippedDifficulty };
      continue;
    }
    return { ok: true, candidate: { index, draw, split, track, json, shape: encodeShape(track.centerline.points) }, skippedSplit, redrawn, skippedDifficulty };
  }
  return { ok: false, index, reason: 'exhausted', last, skippedSplit, redrawn, skippedDifficulty };
}
