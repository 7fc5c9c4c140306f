/**
 * Where slot tasks run: on a worker pool (the HTTP service's, or the CLI's own), or in the
 * current thread (tests, tiny runs). Both give the same results: a slot depends on nothing but
 * the plan, its index and its first draw.
 */
import { performance } from 'node:perf_hooks';
import { setTimeout as sleep } from 'node:timers/promises';
import type { BatchPlan } from '../core/index.js';
import { PoolError, type TrackPool } from '../server/pool/track-pool.js';
import type { SlotExecutor } from './run-batch.js';
import { runSlotTask, type SlotBytes, type SlotResult } from './slot-task.js';

/** Wait before asking a full pool again, ms. */
const QUEUE_FULL_BACKOFF_MS = 25;

/** A task the core could not finish (a bug in the worker), as the executor reports it. */
export class SlotTaskError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SlotTaskError';
  }
}

/**
 * Runs slots on a pool. A full queue is not an error for a batch: the slot waits and asks again,
 * for at most `deadlineMs` in all (then the pool's PoolError 'queue_full' is thrown); each task
 * also has `deadlineMs` on a worker (DeadlineError).
 */
export function poolExecutor(pool: TrackPool, plan: BatchPlan, bytes: SlotBytes, deadlineMs: number): SlotExecutor {
  return async (index, from) => {
    const start = performance.now();
    for (;;) {
      try {
        const out = await pool.run({ kind: 'batch-slot', plan, index, from, bytes }, deadlineMs);
        if (out.ok && out.kind === 'batch-slot') return out.result;
        throw new SlotTaskError(out.ok ? `unexpected answer ${out.kind} to a batch-slot task` : out.error.message);
      } catch (err) {
        const full = err instanceof PoolError && err.kind === 'queue_full';
        if (!full || performance.now() - start + QUEUE_FULL_BACKOFF_MS > deadlineMs) throw err;
        await sleep(QUEUE_FULL_BACKOFF_MS);
      }
    }
  };
}

/** Runs slots in the current thread, one at a time. */
export function inThreadExecutor(plan: BatchPlan, bytes: SlotBytes): SlotExecutor {
  return async (index: number, from: number): Promise<SlotResult> => (await runSlotTask({ kind: 'batch-slot', plan, index, from, bytes })).output.result;
}
