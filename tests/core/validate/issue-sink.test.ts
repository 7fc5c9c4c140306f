import { describe, expect, test } from 'vitest';
import { createIssueSink, num, worstOfRuns } from '../../../src/core/validate/issue-sink.js';

describe('issue sink', () => {
  test('keeps at most maxPerCode issues of each code, in order', () => {
    const sink = createIssueSink(2);
    for (let k = 0; k < 5; k++) sink.add({ code: 'width', message: `w${k}` });
    expect(sink.add({ code: 'length', message: 'l' })).toBe(true);
    expect(sink.full('width')).toBe(true);
    expect(sink.full('length')).toBe(false);
    expect(sink.issues.map((i) => i.message)).toEqual(['w0', 'w1', 'l']);
  });

  test('num rounds for messages without trailing zeros or -0', () => {
    expect(num(6.2000001)).toBe(6.2);
    expect(num(-0.0001)).toBe(0);
    expect(Object.is(num(-0.0001), -0)).toBe(false);
    expect(num(12.34567, 1)).toBe(12.3);
    expect(num(Infinity)).toBe(Infinity);
  });

  test('worstOfRuns picks the largest entry of each run of positives', () => {
    const e = new Float64Array([0, 1, 3, 2, 0, -1, 5, 0, 0.5]);
    expect(worstOfRuns(e, 10)).toEqual([2, 6, 8]);
    expect(worstOfRuns(e, 2)).toEqual([2, 6]);
    expect(worstOfRuns(new Float64Array([Infinity, 0]), 10)).toEqual([0]);
  });
});
