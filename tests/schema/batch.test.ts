import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { INTEGER_PATHS, PAIR_PATHS } from '../../src/core/index.js';
import { batchBodySchema, paramRangesSchema } from '../../src/schema/batch.js';
import { formatIssues } from '../../src/schema/issues.js';
import { trackRequestSchema } from '../../src/schema/params.js';

const issues = (schema: z.ZodType, value: unknown) => {
  const r = schema.safeParse(value);
  return r.success ? [] : formatIssues(r.error);
};

// leaves of the request schema, found by walking it: whole-number leaves and {min, max} pair objects
function walk(shape: Record<string, z.ZodType>, prefix: string, ints: string[], pairs: string[]): void {
  for (const [key, field] of Object.entries(shape)) {
    const path = prefix ? `${prefix}.${key}` : key;
    const inner = field instanceof z.ZodOptional ? (field.unwrap() as z.ZodType) : field;
    if (inner instanceof z.ZodNumber && inner.isInt) ints.push(path);
    if (inner instanceof z.ZodObject) {
      const keys = Object.keys(inner.shape);
      if (keys.length === 2 && keys.includes('min') && keys.includes('max')) pairs.push(path);
      walk(inner.shape as Record<string, z.ZodType>, path, ints, pairs);
    }
  }
}

describe('paramRangesSchema', () => {
  it('the core draws whole numbers and keeps pairs exactly where the request schema has integer leaves and {min, max} pairs', () => {
    const ints: string[] = [];
    const pairs: string[] = [];
    walk(trackRequestSchema.shape as Record<string, z.ZodType>, '', ints, pairs);
    expect(ints.every((p) => INTEGER_PATHS.includes(p))).toBe(true);
    expect([...pairs].sort()).toEqual([...PAIR_PATHS].sort());
  });

  it('takes fixed values and ranges at any numeric leaf, with the request schema\'s limits and messages', () => {
    expect(issues(paramRangesSchema, { lengthM: { min: 800, max: 1200 }, widthM: { min: { min: 8, max: 9 }, max: 12 }, wall: { heightM: { min: 1, max: 2 } } })).toEqual([]);
    expect(issues(paramRangesSchema, { lengthM: { min: 100, max: 1200 } })).toEqual([{ path: 'lengthM.min', message: 'expected a number from 300 to 20000 m, got 100' }]);
    expect(issues(paramRangesSchema, { lengthM: { min: 1300, max: 1200 } })).toEqual([{ path: 'lengthM', message: 'range min 1300 is greater than its max 1200' }]);
    expect(issues(paramRangesSchema, { cornerCount: { min: 3.5, max: 6 } })).toEqual([{ path: 'cornerCount', message: 'expected an integer from 3 to 80, or a range {min, max} of them, got an object' }]);
  });

  it('refuses unknown fields, a seed, and pair ranges that could invert', () => {
    expect(issues(paramRangesSchema, { seed: 4 })[0].path).toBe('seed');
    expect(issues(paramRangesSchema, { laps: 3 })[0].message).toMatch(/^unknown field "laps"; allowed fields: lengthM, widthM/);
    expect(issues(paramRangesSchema, { widthM: { min: { min: 8, max: 13 }, max: { min: 12, max: 14 } } })).toEqual([
      { path: 'widthM', message: "min can be drawn as high as 13 m and max as low as 12 m: keep min's range at or below max's so that no track gets min > max" },
    ]);
  });
});

describe('batchBodySchema', () => {
  it('names every bad field', () => {
    expect(issues(batchBodySchema, { count: 0, split: 'holdout', difficulty: { min: 5, max: 3 }, minNovelty: -1, reference: { tracks: [{ shape: 'abc' }] }, detail: 'all' })).toEqual([
      { path: 'count', message: 'expected an integer from 1 to 1048576, got 0' },
      { path: 'split', message: 'expected one of train, validation, test, got "holdout"' },
      { path: 'difficulty', message: 'range min 5 is greater than its max 3' },
      { path: 'minNovelty', message: 'expected a number from 0 to 10 rad, got -1' },
      { path: 'reference.tracks.0.shape', message: 'expected a shape of 684 characters (base64 of 128 32-bit floats), got "abc"' },
      { path: 'detail', message: 'expected one of full, summary, got "all"' },
    ]);
    expect(issues(batchBodySchema, { count: 3 })).toEqual([]);
  });
});
