import { describe, expect, it } from 'vitest';
import { generateTrack, validateTrack } from '../../../src/core/index.js';
import { encodeShape } from '../../../src/core/batch/novelty.js';
import { sampleParams } from '../../../src/core/batch/ranges.js';
import { batchSeed } from '../../../src/core/batch/seeds.js';
import { type BatchPlan, makeSlotCandidate, MAX_SLOT_REDRAWS } from '../../../src/core/batch/slot.js';
import { splitOf } from '../../../src/core/batch/split.js';

// short laps keep the test fast
const SHORT = { lengthM: { min: 700, max: 900 }, curvatureBudgetDeg: { min: 540, max: 720 }, cornerCount: { min: 5, max: 6 } } as const;

describe('makeSlotCandidate', () => {
  it('takes the first draw in the split, and that track is generateTrack of its seed and drawn params', () => {
    const plan: BatchPlan = { baseSeed: 'larkspur-slot', split: 'test', params: SHORT, difficulty: null };
    for (const index of [0, 1, 2]) {
      const out = makeSlotCandidate(plan, index, 0);
      if (!out.ok) throw new Error(`slot ${index} failed: ${out.reason}`);
      const { candidate } = out;
      expect(candidate.track.seed).toBe(batchSeed(plan.baseSeed, index, candidate.draw));
      expect(splitOf(candidate.track.seed)).toBe('test');
      // every draw before it was outside the split or infeasible
      expect(out.skippedSplit + out.redrawn).toBe(candidate.draw);
      for (let d = 0; d < candidate.draw; d++) if (splitOf(batchSeed(plan.baseSeed, index, d)) === 'test') expect(out.redrawn).toBeGreaterThan(0);
      const again = generateTrack(sampleParams(SHORT, candidate.track.seed));
      expect(again.id).toBe(candidate.track.id);
      expect(new TextDecoder().decode(candidate.json)).toBe(JSON.stringify(again));
      expect(generateTrack(candidate.track.params).id).toBe(candidate.track.id);
      expect(candidate.shape).toBe(encodeShape(candidate.track.centerline.points));
      expect(validateTrack(candidate.track).valid).toBe(true);
    }
  });

  it('continues from a later draw with the slot\'s next seeds', () => {
    const plan: BatchPlan = { baseSeed: 9, split: null, params: SHORT, difficulty: null };
    const first = makeSlotCandidate(plan, 4, 0);
    if (!first.ok) throw new Error('slot failed');
    const next = makeSlotCandidate(plan, 4, first.candidate.draw + 1);
    if (!next.ok) throw new Error('slot failed');
    expect(next.candidate.draw).toBeGreaterThan(first.candidate.draw);
    expect(next.candidate.track.seed).toBe(batchSeed(9, 4, next.candidate.draw));
  });

  it('redraws infeasible draws and counts them (turnBalance below 1/18 with 9 corners turns every corner left, which 900 degrees cannot)', () => {
    const plan: BatchPlan = { baseSeed: 'larkspur-redraw', split: null, params: { lengthM: 800, curvatureBudgetDeg: 900, cornerCount: 9, turnBalance: { min: 0, max: 0.2 } }, difficulty: null };
    let redrawn = 0;
    for (let index = 0; index < 12; index++) {
      const out = makeSlotCandidate(plan, index, 0);
      if (!out.ok) throw new Error('slot failed');
      redrawn += out.redrawn;
      expect(Math.round(out.candidate.track.params.turnBalance * 9)).toBeGreaterThan(0);
    }
    expect(redrawn).toBeGreaterThan(0);
  });

  it('gives up after MAX_SLOT_REDRAWS infeasible draws, with the last reason', () => {
    const out = makeSlotCandidate({ baseSeed: 1, split: null, params: { turnBalance: 0, curvatureBudgetDeg: 900 }, difficulty: null }, 0, 0);
    expect(out.ok).toBe(false);
    if (out.ok) return;
    expect(out.reason).toBe('infeasible');
    expect(out.redrawn).toBe(MAX_SLOT_REDRAWS);
    expect(out.last?.reason).toBe('turning_vs_balance');
  });

  it('skips tracks outside the difficulty band and counts them', () => {
    const free: BatchPlan = { baseSeed: 'band', split: null, params: SHORT, difficulty: null };
    const d: number[] = [];
    for (let index = 0; index < 6; index++) {
      const out = makeSlotCandidate(free, index, 0);
      if (out.ok) d.push(out.candidate.track.metrics.difficulty);
    }
    d.sort((a, b) => a - b);
    const band = { min: d[2], max: d[5] };
    let skipped = 0;
    for (let index = 0; index < 6; index++) {
      const out = makeSlotCandidate({ ...free, difficulty: band }, index, 0);
      if (!out.ok) throw new Error('slot failed');
      expect(out.candidate.track.metrics.difficulty).toBeGreaterThanOrEqual(band.min);
      expect(out.candidate.track.metrics.difficulty).toBeLessThanOrEqual(band.max);
      skipped += out.skippedDifficulty;
    }
    // two of the six free tracks lie below the band
    expect(skipped).toBeGreaterThanOrEqual(2);
  });
});
