import { describe, expect, it } from 'vitest';
import { batchSeed, MAX_BATCH_SLOTS, MAX_SLOT_DRAWS } from '../../../src/core/batch/seeds.js';

describe('batchSeed', () => {
  it('is a permutation: 65 536 (slot, draw) pairs of one base seed give 65 536 different unsigned 32-bit seeds', () => {
    const seen = new Set<number>();
    for (let slot = 0; slot < 4096; slot++) {
      for (let draw = 0; draw < 16; draw++) {
        const seed = batchSeed('larkspur-night-7', slot, draw);
        expect(Number.isInteger(seed) && seed >= 0 && seed <= 0xffffffff).toBe(true);
        seen.add(seed);
      }
    }
    expect(seen.size).toBe(4096 * 16);
  });

  it('depends on the base seed (7 and "7" differ), and on nothing else', () => {
    expect(batchSeed(7, 0, 0)).toBe(batchSeed(7, 0, 0));
    expect(batchSeed(7, 0, 0)).not.toBe(batchSeed('7', 0, 0));
    expect(batchSeed(7, 3, 0)).not.toBe(batchSeed(8, 3, 0));
  });

  it('regression snapshot: the first seeds of a base seed never change (computed by the code under test)', () => {
    expect([0, 1, 2].map((slot) => batchSeed('larkspur', slot, 0))).toMatchInlineSnapshot(`
      [
        2262046997,
        254415678,
        2411252506,
      ]
    `);
    expect(batchSeed(0, MAX_BATCH_SLOTS - 1, MAX_SLOT_DRAWS - 1)).toMatchInlineSnapshot(`1294235369`);
  });

  it('refuses slots and draws outside their ranges', () => {
    expect(() => batchSeed(1, MAX_BATCH_SLOTS, 0)).toThrow(RangeError);
    expect(() => batchSeed(1, 0, MAX_SLOT_DRAWS)).toThrow(RangeError);
    expect(() => batchSeed(1, -1, 0)).toThrow(RangeError);
    expect(() => batchSeed(1, 0.5, 0)).toThrow(RangeError);
  });
});
