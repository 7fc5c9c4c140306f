import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { orient } from '../../../src/core/geom/orient.js';
import { orientSignExact } from '../../helpers/exact-geometry.js';

const ULP_HALF = 2 ** -53; // spacing of doubles in [0.5, 1)

describe('orient', () => {
  test('positive for counter-clockwise, negative for clockwise, zero for collinear (y-up axes)', () => {
    // convention stated in the module doc: c left of a→b is positive
    expect(orient(0, 0, 1, 0, 0, 1)).toBeGreaterThan(0);
    expect(orient(0, 0, 0, 1, 1, 0)).toBeLessThan(0);
    expect(orient(0, 0, 1, 1, 2, 2)).toBe(0);
    expect(orient(3, 4, 3, 4, 5, 6)).toBe(0); // a = b
    // twice the triangle area for small integers (shoelace, common practice, no source)
    expect(orient(0, 0, 2, 0, 0, 3)).toBe(6);
  });

  test('collinear gives +0, never -0', () => {
    expect(Object.is(orient(0, 0, 1, 1, 2, 2), 0)).toBe(true);
    expect(Object.is(orient(2, 2, 1, 1, 0, 0), 0)).toBe(true);
  });

  // near-degenerate grid after Kettner, Mehlhorn, Pion, Schirra & Yap, "Classroom examples of robustness
  // problems in geometric computations", CGTA 40 (2008) 61-78: p = (0.5 + i·2^-53, 0.5 + j·2^-53),
  // q = (12, 12), r = (24, 24); [C] the reference sign is exact BigInt arithmetic
  test('agrees with exact BigInt evaluation on the 256 x 256 near-degenerate grid', () => {
    let mismatches = 0;
    let naiveWrong = 0;
    const signs = new Set<number>();
    for (let i = 0; i < 256; i++) {
      for (let j = 0; j < 256; j++) {
        const px = 0.5 + i * ULP_HALF;
        const py = 0.5 + j * ULP_HALF;
        const exact = orientSignExact(px, py, 12, 12, 24, 24);
        if (Math.sign(orient(px, py, 12, 12, 24, 24)) !== exact) mismatches++;
        const naive = Math.sign((12 - px) * (24 - py) - (12 - py) * (24 - px));
        if (naive !== exact) naiveWrong++;
        signs.add(exact);
      }
    }
    expect(mismatches).toBe(0);
    // the grid really is hard: plain double arithmetic gets many signs wrong, and all three signs occur
    expect(naiveWrong).toBeGreaterThan(1000);
    expect(signs).toEqual(new Set([-1, 0, 1]));
  });

  // the documented exact domain: 0 or magnitudes in [2^-300, 2^500] (subnormal products would underflow)
  const coord = fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => (Math.abs(x) < 2 ** -300 ? 0 : x));
  // small integers hit collinear cases often
  const small = fc.integer({ min: -4, max: 4 });
  const pts = (c: fc.Arbitrary<number>) => fc.tuple(c, c, c, c, c, c);

  test.prop([fc.oneof(pts(coord), pts(small))])('sign equals the exact BigInt sign', ([ax, ay, bx, by, cx, cy]) => {
    expect(Math.sign(orient(ax, ay, bx, by, cx, cy))).toBe(orientSignExact(ax, ay, bx, by, cx, cy));
  });

  test.prop([fc.oneof(pts(coord), pts(small))])('unchanged by 0/90/180/270 degree rotations, flipped by a mirror', ([ax, ay, bx, by, cx, cy]) => {
    const s = Math.sign(orient(ax, ay, bx, by, cx, cy));
    // rotations by multiples of 90 degrees swap and negate coordinates, which is exact
    expect(Math.sign(orient(-ay, ax, -by, bx, -cy, cx))).toBe(s);
    expect(Math.sign(orient(-ax, -ay, -bx, -by, -cx, -cy))).toBe(s);
    expect(Math.sign(orient(ay, -ax, by, -bx, cy, -cx))).toBe(s);
    expect(Math.sign(orient(ax, -ay, bx, -by, cx, -cy))).toBe(-s || 0);
    // cyclic order keeps the sign, a swap flips it
    expect(Math.sign(orient(bx, by, cx, cy, ax, ay))).toBe(s);
    expect(Math.sign(orient(bx, by, ax, ay, cx, cy))).toBe(-s || 0);
  });
});
