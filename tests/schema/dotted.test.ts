import { describe, expect, it } from 'vitest';
import { readNumberText, readSeedText, setDotted } from '../../src/schema/dotted.js';

describe('dotted parameters', () => {
  it('readSeedText: digits that fit are the integer seed, anything else a string', () => {
    expect(['7', '4294967295', '4294967296', '07x', ''].map(readSeedText)).toEqual([7, 4294967295, '4294967296', '07x', '']);
  });

  it('readNumberText: JSON numbers only', () => {
    expect(['8', ' -0.5 ', '1e3', '0x10', '.5', 'NaN'].map(readNumberText)).toEqual([8, -0.5, 1000, '0x10', '.5', 'NaN']);
  });

  it('setDotted creates the objects on the way and stops at a value that is not an object', () => {
    const body: Record<string, unknown> = { noise: 0.1 };
    expect(setDotted(body, ['widthM', 'min'], 8)).toBeNull();
    expect(setDotted(body, ['widthM', 'max'], 12)).toBeNull();
    expect(setDotted(body, ['noise', 'x'], 1)).toEqual({ at: 'noise', value: 0.1 });
    expect(body).toEqual({ noise: 0.1, widthM: { min: 8, max: 12 } });
  });
});
