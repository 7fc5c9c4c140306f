import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { interpolateClosed } from '../../../src/core/geom/interpolate.js';

describe('interpolateClosed', () => {
  it('hits the knots and is linear between them, the last piece closing at (xEnd, yEnd)', () => {
    const xs = new Float64Array([0, 10, 30]);
    const ys = new Float64Array([5, 7, 1]);
    expect(interpolateClosed(xs, 40, ys, 5, 0)).toBe(5);
    expect(interpolateClosed(xs, 40, ys, 5, 10)).toBe(7);
    expect(interpolateClosed(xs, 40, ys, 5, 20)).toBe(4);
    expect(interpolateClosed(xs, 40, ys, 5, 35)).toBe(3);
  });
  test.prop([fc.array(fc.double({ min: 0.1, max: 10, noNaN: true }), { minLength: 1, maxLength: 20 }), fc.double({ min: 0, max: 1, noNaN: true })])(
    'on a straight line y = 2x + 1 it returns the line exactly (up to rounding)',
    (gaps, u) => {
      const xs = new Float64Array(gaps.length);
      for (let i = 1; i < gaps.length; i++) xs[i] = xs[i - 1] + gaps[i - 1];
      const xEnd = xs[gaps.length - 1] + gaps[gaps.length - 1];
      const ys = xs.map((x) => 2 * x + 1);
      const x = u * xEnd;
      expect(interpolateClosed(xs, xEnd, ys, 2 * xEnd + 1, x)).toBeCloseTo(2 * x + 1, 9);
    },
  );
});
