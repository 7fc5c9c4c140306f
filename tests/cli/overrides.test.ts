// Tests for src/cli/overrides.ts: --seed and --set parsing.

import { describe, expect, it } from 'vitest';
import { SEED_MAX } from '../../src/core/index.js';
import { InputError } from '../../src/cli/io.js';
import { applySet, parseSeedFlag, parseSetValue } from '../../src/cli/overrides.js';

describe('parseSeedFlag', () => {
  it('digits that fit in 0..SEED_MAX are the integer; anything else is a string seed', () => {
    expect(parseSeedFlag('0')).toBe(0);
    expect(parseSeedFlag('42')).toBe(42);
    expect(parseSeedFlag(String(SEED_MAX))).toBe(SEED_MAX);
    expect(parseSeedFlag(String(SEED_MAX + 1))).toBe(String(SEED_MAX + 1));
    expect(parseSeedFlag('123456789012345678901234567890')).toBe('123456789012345678901234567890');
    expect(parseSeedFlag('-5')).toBe('-5');
    expect(parseSeedFlag('1.5')).toBe('1.5');
    expect(parseSeedFlag('lap-7')).toBe('lap-7');
    expect(parseSeedFlag('')).toBe('');
  });
});

describe('parseSetValue', () => {
  it('JSON numbers become numbers (spaces around allowed)', () => {
    expect(['8', '-0.5', '1e3', '2E-2', ' 12 '].map(parseSetValue)).toEqual([8, -0.5, 1000, 0.02, 12]);
  });

  it('everything else stays the string as typed', () => {
    expect(['abc', '0x10', 'Infinity', 'NaN', '.5', '1,5', '', 'true', '{"min":8}'].map(parseSetValue)).toEqual(['abc', '0x10', 'Infinity', 'NaN', '.5', '1,5', '', 'true', '{"min":8}']);
  });
});

describe('applySet', () => {
  it('sets top-level and dotted keys, creating nested objects and keeping their siblings', () => {
    const body: Record<string, unknown> = { widthM: { max: 14 }, lengthM: 1000 };
    applySet(body, 'widthM.min=8');
    applySet(body, 'lengthM=1200');
    applySet(body, 'wall.heightM=2');
    expect(body).toEqual({ widthM: { max: 14, min: 8 }, lengthM: 1200, wall: { heightM: 2 } });
  });

  it('the value may contain "=" (only the first one splits)', () => {
    const body: Record<string, unknown> = {};
    applySet(body, 'seed=a=b');
    expect(body).toEqual({ seed: 'a=b' });
  });

  it('seed follows the --seed rule: digits beyond SEED_MAX stay a string', () => {
    const body: Record<string, unknown> = {};
    applySet(body, `seed=${SEED_MAX + 1}`);
    expect(body.seed).toBe(String(SEED_MAX + 1));
    applySet(body, 'seed=9');
    expect(body.seed).toBe(9);
  });

  it('__proto__ becomes an own field (for the schema to refuse by name), never the prototype', () => {
    const body: Record<string, unknown> = {};
    applySet(body, '__proto__.polluted=1');
    expect(Object.getPrototypeOf(body)).toBe(Object.prototype);
    expect(Object.keys(body)).toEqual(['__proto__']);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('refuses entries without "=", empty key parts and keys that run into a non-object', () => {
    const attempt = (entry: string, body: Record<string, unknown> = {}) => {
      try {
        applySet(body, entry);
      } catch (err) {
        expect(err).toBeInstanceOf(InputError);
        return (err as Error).message;
      }
      throw new Error(`expected ${entry} to be refused`);
    };
    expect(attempt('widthM.min')).toBe('--set expects key=value (e.g. widthM.min=8), got "widthM.min"');
    expect(attempt('=5')).toBe('--set expects key=value (e.g. widthM.min=8), got "=5"');
    expect(attempt('widthM..min=5')).toBe('--set key "widthM..min" has an empty part');
    expect(attempt('widthM.min=5', { widthM: 12 })).toBe('--set widthM.min: widthM is 12, not an object');
    expect(attempt('car.size.x=1', { car: { size: [1] } })).toBe('--set car.size.x: car.size is an array of 1 item, not an object');
  });
});
