/**
 * Runs a batch: asks an executor (a worker pool, or the current thread) for slot candidates,
 * several at once, and hands the tracks out strictly in index order as the consumer pulls them.
 * Novelty is decided here, in index order, so the result does not depend on how many workers
 * ran or in which order they finished:
 *
 *   pulled ◄── index i: candidate ready? ── novel (vs reference + tracks 0..i−1)? ── yes ──► yield
 *                                                    │ no
 *                                                    └──► ask slot i again from its next draw
 *   in flight: slots i .. i + window − 1 (issued only while the consumer pulls)
 *
 * Memory bound: at most `window` slots are in flight or finished and waiting to be pulled, so a
 * consumer that stops pulling (a slow client) holds at most `window` tracks here, whatever the
 * batch size.
 */
import { decodeShape, MAX_SLOT_DIFFICULTY_MISSES, MAX_SLOT_REDRAWS, NoveltyIndex } from '../core/index.js';
import type { ManifestTrack, Shape, SlotFailureReason } from '../core/index.js';
import type { SlotInfeasible, SlotResult } from './slot-task.js';

/** Runs one slot from one draw on (in a worker, or in-thread). */
export type SlotExecutor = (index: number, from: number) => Promise<SlotResult>;

/** A track the batch keeps, with its bytes in the format the executor was asked for. */
export interface BatchItem {
  readonly entry: ManifestTrack;
  readonly bytes: Uint8Array | null;
}

/** Counts of a run so far. */
export interface BatchTotals {
  made: number;
  redrawn: number;
  skippedSplit: number;
  skippedDifficulty: number;
  skippedNovelty: number;
}

export interface BatchRunOptions {
  /** Slot indices to make, in order (0 .. count − 1, or one shard's share). */
  readonly indices: readonly number[];
  /** Slots in flight or waiting to be pulled, at least 1. */
  readonly window: number;
  /** Smallest distance to every earlier track and every reference shape (rad); 0: none. */
  readonly minNovelty: number;
  /** Reference shapes a track must also be novel against. */
  readonly reference: readonly Shape[];
  readonly execute: SlotExecutor;
}

/** A slot found no track: too many infeasible draws or tracks outside the difficulty band, or it ran out of draws (split, novelty). */
export class SlotFailure extends Error {
  readonly index: number;
  readonly reason: SlotFailureReason;
  readonly last: SlotInfeasible | null;

  constructor(index: number, reason: SlotFailureReason, last: SlotInfeasible | null, minNovelty: number) {
    super(slotFailureMessage(index, reason, last, minNovelty));
    this.name = 'SlotFailure';
    this.index = index;
    this.reason = reason;
    this.last = last;
  }
}

/**
 * Starts a batch. Pull `tracks` to run it; `totals` grows as it goes.
 * @throws (from the iterator) SlotFailure when a slot finds no track, or what the executor throws
 */
export function runBatch(options: BatchRunOptions): { readonly tracks: AsyncGenerator<BatchItem, void, undefined>; readonly totals: BatchTotals } {
  if (!Number.isInteger(options.window) || options.window < 1) throw new RangeError(`window must be an integer >= 1, got ${options.window}`);
  const totals: BatchTotals = { made: 0, redrawn: 0, skippedSplit: 0, skippedDifficulty: 0, skippedNovelty: 0 };
  return { tracks: iterate(options, totals), totals };
}

async function* iterate(options: BatchRunOptions, totals: BatchTotals): AsyncGenerator<BatchItem, void, undefined> {
  const { indices, window, minNovelty, execute } = options;
  const novelty = new NoveltyIndex();
  if (minNovelty > 0) for (const shape of options.reference) novelty.add(shape);
  const pending = new Map<number, Promise<SlotResult>>();
  let issued = 0;
  const issue = (position: number, from: number): void => {
    const promise = execute(indices[position], from);
    // a run abandoned by its consumer must not leave a rejection nobody handles
    promise.catch(() => undefined);
    pending.set(position, promise);
  };
  try {
    for (let position = 0; position < indices.length; position++) {
      for (; issued < indices.length && issued < position + window; issued++) issue(issued, 0);
      for (;;) {
        const result = await pending.get(position)!;
        totals.redrawn += result.redrawn;
        totals.skippedSplit += result.skippedSplit;
        totals.skippedDifficulty += result.skippedDifficulty;
        if (!result.ok) throw new SlotFailure(result.index, result.reason, result.last, minNovelty);
        if (minNovelty > 0) {
          const shape = decodeShape(result.entry.shape);
          if (novelty.findWithin(shape, minNovelty) !== null) {
            totals.skippedNovelty++;
            issue(position, result.entry.draw + 1);
            continue;
          }
          novelty.add(shape);
        }
        pending.delete(position);
        totals.made++;
        yield { entry: result.entry, bytes: result.bytes };
        break;
      }
    }
  } finally {
    pending.clear();
  }
}

function slotFailureMessage(index: number, reason: SlotFailureReason, last: SlotInfeasible | null, minNovelty: number): string {
  if (reason === 'infeasible') return `track ${index}: ${MAX_SLOT_REDRAWS} of its draws were infeasible (last: ${last?.reason ?? 'unknown'}: ${last?.message ?? ''})`;
  if (reason === 'difficulty') return `track ${index}: ${MAX_SLOT_DIFFICULTY_MISSES} of its tracks fell outside the difficulty band; widen the band or move the parameter ranges towards it`;
  if (minNovelty > 0) return `track ${index}: no draw was at least ${minNovelty} rad from every earlier and reference track; lower minNovelty, or widen the parameter ranges`;
  return `track ${index}: ran out of draws`;
}
