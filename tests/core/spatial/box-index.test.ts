import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { BoxIndex } from '../../../src/core/spatial/box-index.js';

type Box = [number, number, number, number];

function build(boxes: readonly Box[]): BoxIndex {
  const index = new BoxIndex(boxes.length);
  for (const b of boxes) index.add(...b);
  index.finish();
  return index;
}

function into(index: BoxIndex, count: number, q: Box): number[] {
  const out = new Int32Array(count);
  return Array.from(out.subarray(0, index.searchInto(...q, out)));
}

// small boxes on a grid (many exact touches), some large ones; up to 700 boxes gives trees of one,
// two and three levels below the root (nodes of 16), where whole nodes inside the query are taken
const small = fc
  .tuple(fc.integer({ min: 0, max: 200 }), fc.integer({ min: 0, max: 200 }), fc.integer({ min: 0, max: 6 }), fc.integer({ min: 0, max: 6 }))
  .map(([x, y, w, h]) => [x, y, x + w, y + h] as Box);
const large = fc
  .tuple(fc.integer({ min: 0, max: 200 }), fc.integer({ min: 0, max: 200 }), fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 }))
  .map(([x, y, w, h]) => [x, y, x + w, y + h] as Box);
const boxes = fc.oneof(
  fc.array(fc.oneof({ weight: 8, arbitrary: small }, { weight: 1, arbitrary: large }), { minLength: 1, maxLength: 40 }),
  fc.array(fc.oneof({ weight: 8, arbitrary: small }, { weight: 1, arbitrary: large }), { minLength: 200, maxLength: 700 }),
);
const queries = fc.array(fc.oneof(small, large), { minLength: 1, maxLength: 20 });

describe('BoxIndex', () => {
  test('the example: a query box meets the first box only', () => {
    const index = build([
      [0, 0, 1, 1],
      [5, 5, 6, 6],
    ]);
    expect(index.search(0.5, 0.5, 2, 2)).toEqual([0]);
    expect(into(index, 2, [0.5, 0.5, 2, 2])).toEqual([0]);
  });

  // callers depend on the order of the ids (it decides which clearance violations are listed)
  test.prop([boxes, queries])('searchInto returns the ids search returns, in the same order', (bs, qs) => {
    const index = build(bs);
    for (const q of qs) expect(into(index, bs.length, q)).toEqual(index.search(...q));
    expect(into(index, bs.length, [-Infinity, -Infinity, Infinity, Infinity])).toEqual(index.search(-Infinity, -Infinity, Infinity, Infinity));
  });

  test('searchInto before finish throws', () => {
    const index = new BoxIndex(1);
    index.add(0, 0, 1, 1);
    expect(() => index.searchInto(0, 0, 1, 1, new Int32Array(1))).toThrow(/finish/);
  });
});
