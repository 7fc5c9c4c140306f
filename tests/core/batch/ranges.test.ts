import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { isValueRange, type ParamRanges, sampleParams } from '../../../src/core/batch/ranges.js';

describe('sampleParams', () => {
  it('copies fixed values, draws each range inside it, and keeps the seed', () => {
    const p = sampleParams({ lengthM: 900, widthM: { min: { min: 8, max: 9 }, max: 12 }, cornerCount: { min: 6, max: 9 }, noise: { min: 0.1, max: 0.2 } }, 'larkspur-3');
    expect(p.seed).toBe('larkspur-3');
    expect(p.lengthM).toBe(900);
    expect(p.widthM?.max).toBe(12);
    expect(p.widthM?.min).toBeGreaterThanOrEqual(8);
    expect(p.widthM?.min).toBeLessThanOrEqual(9);
    expect(Number.isInteger(p.cornerCount)).toBe(true);
    expect(p.cornerCount).toBeGreaterThanOrEqual(6);
    expect(p.cornerCount).toBeLessThanOrEqual(9);
    expect(Object.keys(p)).toEqual(['seed', 'lengthM', 'widthM', 'cornerCount', 'noise']);
  });

  test.prop([fc.integer({ min: 0, max: 0xffffffff }), fc.double({ min: 300, max: 20_000, noNaN: true }), fc.double({ min: 0, max: 5000, noNaN: true })])(
    'a continuous draw lies in [min, max] and has at most 3 decimals (or is a bound, when rounding would leave the range)',
    (seed, lo, width) => {
      const max = Math.min(20_000, lo + width);
      const x = sampleParams({ lengthM: { min: lo, max } }, seed).lengthM!;
      expect(x).toBeGreaterThanOrEqual(lo);
      expect(x).toBeLessThanOrEqual(max);
      if (x !== lo && x !== max) expect(Math.abs(x * 1000 - Math.round(x * 1000))).toBeLessThan(1e-6 * Math.max(1, x));
    },
  );

  it('is reproducible per seed, and a leaf does not move when another leaf becomes ranged', () => {
    const a = sampleParams({ lengthM: { min: 800, max: 1600 }, noise: 0.2 }, 99);
    const b = sampleParams({ lengthM: { min: 800, max: 1600 }, noise: { min: 0, max: 1 } }, 99);
    expect(sampleParams({ lengthM: { min: 800, max: 1600 }, noise: 0.2 }, 99)).toEqual(a);
    expect(b.lengthM).toBe(a.lengthM);
  });

  it('draws whole numbers uniformly over an integer range (each of 3..5 about a third of 3000 seeds)', () => {
    const counts = new Map<number, number>();
    for (let seed = 0; seed < 3000; seed++) {
      const n = sampleParams({ cornerCount: { min: 3, max: 5 } }, seed).cornerCount!;
      counts.set(n, (counts.get(n) ?? 0) + 1);
    }
    expect([...counts.keys()].sort()).toEqual([3, 4, 5]);
    // binomial sd of a third of 3000 is 26: 5 sd either side
    for (const c of counts.values()) expect(Math.abs(c - 1000)).toBeLessThan(130);
  });

  it('tells a range from a {min, max} pair parameter and from nested objects, and copies other values', () => {
    // a text field (as an enum parameter would be) is copied as it is
    const p = sampleParams({ gateSpacingM: { min: 4, max: 20 }, wall: { heightM: { min: 1, max: 2 }, thicknessM: 0.4 }, spawnSlots: { min: 2, max: 6 }, mode: 'strict' } as ParamRanges, 5);
    expect(p.gateSpacingM).toEqual({ min: 4, max: 20 });
    expect(p.wall?.thicknessM).toBe(0.4);
    expect(p.wall?.heightM).toBeGreaterThanOrEqual(1);
    expect(p.wall?.heightM).toBeLessThanOrEqual(2);
    expect((p as unknown as Record<string, unknown>).mode).toBe('strict');
    expect(Number.isInteger(p.spawnSlots)).toBe(true);
    expect(isValueRange({ min: 1, max: 2 })).toBe(true);
    expect(isValueRange({ min: 1, max: 2, x: 3 })).toBe(false);
    expect(isValueRange({ min: 1 })).toBe(false);
  });
});
