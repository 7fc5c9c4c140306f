// Tests for src/schema/messages.ts: how values and ranges are worded in messages.

import { describe, expect, it } from 'vitest';
import { describeValue, expectedError, objectError, rangeError } from '../../src/schema/messages.js';

// the raw issue the message builders receive from zod (only the fields they read)
const raw = (input: unknown, extra: Record<string, unknown> = {}) => ({ code: 'custom', input, path: [], ...extra }) as never;

describe('describeValue', () => {
  it('renders JSON values briefly', () => {
    expect([1.5, -0, true, null, undefined, 'abc', [1, 2], [1], {}].map(describeValue)).toEqual(['1.5', '0', 'true', 'null', 'nothing', '"abc"', 'an array of 2 items', 'an array of 1 item', 'an object']);
  });

  it('cuts long strings and says how long they were', () => {
    expect(describeValue('y'.repeat(100))).toBe(`"${'y'.repeat(40)}"... (100 characters)`);
  });
});

describe('message builders', () => {
  it('rangeError names the range, the unit and the value', () => {
    expect(rangeError({ min: 3, max: 40 }, 'm')(raw(2))).toBe('expected a number from 3 to 40 m, got 2');
    expect(rangeError({ min: 1, max: 64 }, '', true)(raw('two'))).toBe('expected an integer from 1 to 64, got "two"');
  });

  it('expectedError names what is expected and the value', () => {
    expect(expectedError('a point [x, y]')(raw([1, 2, 3]))).toBe('expected a point [x, y], got an array of 3 items');
  });

  it('objectError lists unknown and allowed fields, or names the wrong type', () => {
    const message = objectError('an object {min, max}', ['min', 'max']);
    expect(message(raw({}, { code: 'unrecognized_keys', keys: ['avg'] }))).toBe('unknown field "avg"; allowed fields: min, max');
    expect(message(raw({}, { code: 'unrecognized_keys', keys: ['a', 'b'] }))).toBe('unknown fields "a", "b"; allowed fields: min, max');
    expect(message(raw(5, { code: 'invalid_type' }))).toBe('expected an object {min, max}, got 5');
  });
});
