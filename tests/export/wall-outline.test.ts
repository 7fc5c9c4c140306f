// Tests for src/export/wall-outline.ts: the far side of a wall solid, offset from its face.

import { test as propTest, fc } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import type { Point } from '../../src/core/index.js';
import { wallOutline } from '../../src/export/wall-outline.js';

/** n points on a circle of radius r, counter-clockwise from (r, 0). */
function circle(n: number, r: number): Point[] {
  return Array.from({ length: n }, (_, i) => [r * Math.cos((2 * Math.PI * i) / n), r * Math.sin((2 * Math.PI * i) / n)] as const);
}

describe('wallOutline', () => {
  // a regular n-gon of circumradius r has its edges at distance r·cos(π/n) from the centre
  // (elementary geometry); a mitred offset by t moves every edge out by t, so the vertices of
  // the offset n-gon lie at (r·cos(π/n) + t) / cos(π/n) from the centre
  it.each([
    ['left', -1],
    ['right', 1],
  ] as const)('counter-clockwise circle, %s side: the edges move %i·t along the radius', (side, sign) => {
    const n = 360, r = 50, t = 0.5;
    const { outer, normals } = wallOutline(circle(n, r), t, side);
    const expected = (r * Math.cos(Math.PI / n) + sign * t) / Math.cos(Math.PI / n);
    for (let i = 0; i < n; i++) {
      expect(Math.hypot(outer[2 * i], outer[2 * i + 1])).toBeCloseTo(expected, 9);
      // the left of a counter-clockwise circle is its inside
      const [cx, cy] = circle(n, r)[i];
      expect((normals[2 * i] * cx + normals[2 * i + 1] * cy) / r).toBeCloseTo(sign, 9);
    }
  });

  // on a square with mitred corners, the corner moves t·√2 along the diagonal
  it('a square: mitred corners at t·√2 on the diagonal, outside for the right side of a counter-clockwise loop', () => {
    const { outer } = wallOutline([[0, 0], [10, 0], [10, 10], [0, 10]], 1, 'right');
    expect([...outer].map((v) => Math.round(v * 1e12) / 1e12)).toEqual([-1, -1, 11, -1, 11, 11, -1, 11]);
  });

  propTest.prop([fc.integer({ min: 3, max: 200 }), fc.double({ min: 5, max: 500, noNaN: true }), fc.double({ min: 0.1, max: 4, noNaN: true })])(
    'normals are unit vectors and each outer vertex is at least t from its face vertex',
    (n, r, t) => {
      const { outer, normals } = wallOutline(circle(n, r), t, 'right');
      for (let i = 0; i < n; i++) {
        expect(Math.hypot(normals[2 * i], normals[2 * i + 1])).toBeCloseTo(1, 12);
        const [x, y] = circle(n, r)[i];
        expect(Math.hypot(outer[2 * i] - x, outer[2 * i + 1] - y)).toBeGreaterThanOrEqual(t * (1 - 1e-12));
      }
    },
  );

  it('a vertex repeated in place takes its normal from the nearest distinct neighbours', () => {
    const { normals } = wallOutline([[0, 0], [5, 0], [5, 0], [10, 0], [10, 10], [0, 10]], 1, 'left');
    expect([normals[2], normals[3], normals[4], normals[5]]).toEqual([0, 1, 0, 1]);
  });

  it('refuses fewer than 3 vertices', () => {
    expect(() => wallOutline([[0, 0], [1, 0]], 1, 'left')).toThrow(new RangeError('a closed wall face needs >= 3 vertices, got 2'));
  });
});
