// Tests for src/schema/issues.ts: zod errors flattened into {path, message} per offending field.

import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { formatIssues, formatPath, ROOT_PATH } from '../../src/schema/issues.js';
import { objectError, rangeError } from '../../src/schema/messages.js';

function errorOf(schema: z.ZodType, value: unknown): z.ZodError {
  const result = schema.safeParse(value);
  if (result.success) throw new Error('expected a refusal');
  return result.error;
}

describe('formatPath', () => {
  it('joins keys and indexes with dots; the empty path is (root)', () => {
    expect(formatPath(['widthM', 'min'])).toBe('widthM.min');
    expect(formatPath(['gates', 3, 'left', 0])).toBe('gates.3.left.0');
    expect(formatPath([])).toBe(ROOT_PATH);
    expect(ROOT_PATH).toBe('(root)');
  });
});

describe('formatIssues', () => {
  it('keeps the schema message and gives the dotted path, array indexes included', () => {
    const error = rangeError({ min: 0, max: 1 }, '');
    const schema = z.object({ list: z.array(z.tuple([z.number({ error }), z.number({ error })])) });
    expect(formatIssues(errorOf(schema, { list: [[0, 0], [0, 'x']] }))).toEqual([{ path: 'list.1.1', message: 'expected a number from 0 to 1, got "x"' }]);
  });

  it('splits an unknown-fields issue into one entry per field, repeating the allowed list', () => {
    const shape = { a: z.number().optional() };
    const schema = z.strictObject(shape, { error: objectError('an object {a}', Object.keys(shape)) });
    expect(formatIssues(errorOf(schema, { b: 1, c: 2 }))).toEqual([
      { path: 'b', message: 'unknown field "b"; allowed fields: a' },
      { path: 'c', message: 'unknown field "c"; allowed fields: a' },
    ]);
  });

  it('names unknown fields of a schema without the shared messages too', () => {
    expect(formatIssues(errorOf(z.strictObject({ inner: z.strictObject({}) }), { inner: { x: 1 } }))).toEqual([{ path: 'inner.x', message: 'unknown field "x"' }]);
  });

  it('keeps one of identical entries (one value failing two checks with the same message)', () => {
    const error = rangeError({ min: 3, max: 80 }, '', true);
    const schema = z.int({ error }).min(3, { error }).max(80, { error });
    expect(errorOf(schema, 1e20).issues.length).toBe(2);
    expect(formatIssues(errorOf(schema, 1e20))).toEqual([{ path: '(root)', message: 'expected an integer from 3 to 80, got 100000000000000000000' }]);
  });

  it('an empty error gives an empty list', () => {
    expect(formatIssues(new z.ZodError([]))).toEqual([]);
  });
});
