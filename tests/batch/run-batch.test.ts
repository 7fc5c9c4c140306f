import { setTimeout as sleep } from 'node:timers/promises';
import { describe, expect, it } from 'vitest';
import { encodeShape, type ManifestTrack, type Point } from '../../src/core/index.js';
import { inThreadExecutor } from '../../src/batch/executors.js';
import { batchJob, slotIndices } from '../../src/batch/job.js';
import { runBatch, SlotFailure, type SlotExecutor } from '../../src/batch/run-batch.js';
import type { SlotResult } from '../../src/batch/slot-task.js';

function polygon(n: number): Point[] {
  return Array.from({ length: n }, (_, k) => [Math.cos((2 * Math.PI * k) / n), Math.sin((2 * Math.PI * k) / n)] as const);
}
// regular 3- to 40-gons: neighbours with many vertices lie closer than 0.1 rad, so some draws are not novel
const SHAPES = Array.from({ length: 38 }, (_, k) => encodeShape(polygon(3 + k)));

/** A stand-in executor: slot i, draw d yields shape (7i + d) mod 38 after a pseudo-random delay; counts calls in flight. */
function fakeExecutor(seed: number): SlotExecutor & { inFlight: number; maxInFlight: number } {
  let state = seed;
  const executor = (async (index: number, from: number): Promise<SlotResult> => {
    executor.inFlight++;
    executor.maxInFlight = Math.max(executor.maxInFlight, executor.inFlight);
    state = (state * 1103515245 + 12345) % 2 ** 31;
    await sleep(state % 5);
    executor.inFlight--;
    const entry = { index, seed: index * 1000 + from, draw: from, split: 'train', id: `${index}/${from}`, shape: SHAPES[(7 * index + from) % 38] } as unknown as ManifestTrack;
    return { ok: true, entry, bytes: null, skippedSplit: 0, redrawn: 0, skippedDifficulty: 0 };
  }) as SlotExecutor & { inFlight: number; maxInFlight: number };
  executor.inFlight = 0;
  executor.maxInFlight = 0;
  return executor;
}

async function collect(run: ReturnType<typeof runBatch>): Promise<string[]> {
  const ids: string[] = [];
  for await (const item of run.tracks) ids.push(item.entry.id);
  return ids;
}

describe('runBatch', () => {
  it('hands tracks out in index order, and novelty decisions do not depend on the window or on finishing order', async () => {
    const runs: string[][] = [];
    for (const [window, seed] of [[1, 1], [3, 2], [8, 3]] as const) {
      const run = runBatch({ indices: [0, 1, 2, 3, 4, 5, 6, 7], window, minNovelty: 0.1, reference: [], execute: fakeExecutor(seed) });
      runs.push(await collect(run));
      expect(run.totals.skippedNovelty).toBeGreaterThan(0);
    }
    expect(runs[1]).toEqual(runs[0]);
    expect(runs[2]).toEqual(runs[0]);
    expect(runs[0].map((id) => Number(id.split('/')[0]))).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
  });

  it('a consumer that stops pulling holds at most `window` slots in flight or waiting', async () => {
    const execute = fakeExecutor(7);
    const run = runBatch({ indices: Array.from({ length: 100 }, (_, i) => i), window: 4, minNovelty: 0, reference: [], execute });
    await run.tracks.next();
    await sleep(50);
    expect(execute.maxInFlight).toBeLessThanOrEqual(4);
    await run.tracks.return(undefined);
  });

  it('the shards of a batch together make exactly the tracks of the whole batch', async () => {
    const job = batchJob({ count: 5, split: 'validation', baseSeed: 'larkspur-shards', params: { lengthM: { min: 600, max: 800 }, curvatureBudgetDeg: 540, cornerCount: 5 } }, null);
    const entries = async (indices: number[]) => {
      const out: ManifestTrack[] = [];
      for await (const item of runBatch({ indices, window: 2, minNovelty: 0, reference: [], execute: inThreadExecutor(job.plan, { format: 'none' }) }).tracks) out.push(item.entry);
      return out;
    };
    const whole = await entries(slotIndices(5, null));
    const shards = [...(await entries(slotIndices(5, { index: 0, count: 2 }))), ...(await entries(slotIndices(5, { index: 1, count: 2 })))];
    expect(slotIndices(5, { index: 1, count: 2 })).toEqual([1, 3]);
    expect(JSON.stringify(shards.sort((a, b) => a.index - b.index))).toBe(JSON.stringify(whole));
    expect(whole.every((t) => t.split === 'validation')).toBe(true);
  });

  it('stops with SlotFailure when a slot finds no track', async () => {
    const job = batchJob({ count: 2, baseSeed: 1, params: { turnBalance: 0, curvatureBudgetDeg: 900 } }, null);
    const run = runBatch({ indices: [0, 1], window: 1, minNovelty: 0, reference: [], execute: inThreadExecutor(job.plan, { format: 'none' }) });
    await expect(run.tracks.next()).rejects.toBeInstanceOf(SlotFailure);
  });
});
