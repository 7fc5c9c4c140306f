import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { batchSeed } from '../../../src/core/batch/seeds.js';
import { isSplit, SPLIT_KEY, SPLIT_SHARES, SPLITS, splitOf, splitValue } from '../../../src/core/batch/split.js';

const N = 100_000;

describe('splitOf', () => {
  it('follows its documented definition: HMAC-SHA256 keyed by SPLIT_KEY over the seed JSON, first 48 bits / 2^48, cut at 0.8 and 0.9', () => {
    // recomputed here from the definition in the file comment, without the code under test
    for (const seed of [0, 1, 7, 4_294_967_295, 'larkspur-heldout-0042', '7', 'ü-seed']) {
      const u = createHmac('sha256', 'lapwright/split/v1').update(JSON.stringify(seed)).digest().readUIntBE(0, 6) / 2 ** 48;
      expect(splitValue(seed)).toBe(u);
      expect(splitOf(seed)).toBe(u < 0.8 ? 'train' : u < 0.9 ? 'validation' : 'test');
    }
    expect(SPLIT_KEY).toBe('lapwright/split/v1');
    expect(SPLIT_SHARES).toEqual({ train: 0.8, validation: 0.1, test: 0.1 });
  });

  it('regression snapshot: the split of a few seeds never changes (computed by the code under test)', () => {
    expect([0, 14, 22, 42, 1000, 1001, 1002, 1003, 1004, 1005, "larkspur-0001"].map((s) => `${s}: ${splitOf(s)}`)).toMatchInlineSnapshot(`
      [
        "0: train",
        "14: validation",
        "22: validation",
        "42: train",
        "1000: train",
        "1001: test",
        "1002: train",
        "1003: train",
        "1004: train",
        "1005: train",
        "larkspur-0001: train",
      ]
    `);
  });

  it('7 and "7" are different seeds, hashed apart', () => {
    expect(splitValue(7)).not.toBe(splitValue('7'));
  });

  it(`shares over ${N} integer seeds and ${N} string seeds are within 1% of 80/10/10`, () => {
    for (const make of [(i: number) => i, (i: number) => `larkspur-${i}`]) {
      const counts = { train: 0, validation: 0, test: 0 };
      for (let i = 0; i < N; i++) counts[splitOf(make(i))]++;
      for (const split of SPLITS) expect(Math.abs(counts[split] / N - SPLIT_SHARES[split])).toBeLessThan(0.01);
    }
  });

  it(`batches of different splits never share a seed: ${N} batch seeds, each taken by exactly one split`, () => {
    const bySplit = { train: new Set<number>(), validation: new Set<number>(), test: new Set<number>() };
    // the seeds batches draw from, over several base seeds, as a batch filters them
    for (let i = 0; i < N; i++) {
      const seed = batchSeed(['larkspur-a', 'larkspur-b', 3, 4][i % 4], (i >> 2) % 1000, Math.floor(i / 4000));
      bySplit[splitOf(seed)].add(seed);
    }
    const [train, validation, test] = SPLITS.map((s) => bySplit[s]);
    for (const seed of test) expect(train.has(seed) || validation.has(seed)).toBe(false);
    for (const seed of validation) expect(train.has(seed)).toBe(false);
    expect(train.size + validation.size + test.size).toBeGreaterThan(0.99 * N);
    for (const split of SPLITS) expect(Math.abs(bySplit[split].size / N - SPLIT_SHARES[split])).toBeLessThan(0.01);
  });

  it('isSplit names the three splits only', () => {
    expect(SPLITS.every(isSplit)).toBe(true);
    expect(isSplit('holdout')).toBe(false);
    expect(isSplit(0)).toBe(false);
  });
});
