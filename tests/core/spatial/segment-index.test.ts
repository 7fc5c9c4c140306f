import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { segmentsIntersect } from '../../../src/core/geom/segment-intersect.js';
import { SegmentIndex, segmentCount } from '../../../src/core/spatial/segment-index.js';

type Seg = [number, number, number, number];

function build(segs: readonly Seg[]): SegmentIndex {
  const index = new SegmentIndex(segs.length);
  for (const s of segs) index.add(...s);
  index.finish();
  return index;
}

const box = (s: Seg): Seg => [Math.min(s[0], s[2]), Math.min(s[1], s[3]), Math.max(s[0], s[2]), Math.max(s[1], s[3])];

function candidates(index: SegmentIndex, q: Seg): number[] {
  const out = new Int32Array(index.numItems);
  const n = index.searchInto(...q, out);
  return Array.from(out.subarray(0, n)).sort((a, b) => a - b);
}

// mixes of short segments (the track case), long ones, zero-length ones and exact duplicates
const short = fc
  .tuple(fc.integer({ min: 0, max: 400 }), fc.integer({ min: 0, max: 400 }), fc.integer({ min: -8, max: 8 }), fc.integer({ min: -8, max: 8 }))
  .map(([x, y, dx, dy]) => [x / 4, y / 4, (x + dx) / 4, (y + dy) / 4] as Seg);
const long = fc.tuple(fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 })) as fc.Arbitrary<Seg>;
const point = fc.tuple(fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 100 })).map(([x, y]) => [x, y, x, y] as Seg);
const segments = fc.array(fc.oneof({ weight: 6, arbitrary: short }, { weight: 1, arbitrary: long }, { weight: 1, arbitrary: point }), { minLength: 1, maxLength: 120 });

describe('SegmentIndex', () => {
  test.prop([segments])('candidates for each segment are a superset of the brute-force intersecting pairs (oracle)', (segs) => {
    const index = build(segs);
    for (let i = 0; i < segs.length; i++) {
      const found = new Set(candidates(index, box(segs[i])));
      for (let j = 0; j < segs.length; j++) {
        if (segmentsIntersect(...segs[i], ...segs[j])) expect(found.has(j)).toBe(true);
      }
    }
  });

  test.prop([segments, long])('returns exactly the segments whose boxes meet the query box, each once', (segs, q) => {
    const index = build(segs);
    const query = box(q);
    // brute force over boxes, touching included: the index filters by exact Float64 boxes
    const expected = segs
      .map((s, id) => [box(s), id] as const)
      .filter(([b]) => b[0] <= query[2] && b[2] >= query[0] && b[1] <= query[3] && b[3] >= query[1])
      .map(([, id]) => id);
    expect(candidates(index, query)).toEqual(expected);
    const visited: number[] = [];
    index.search(...query, (id) => void visited.push(id));
    expect(visited.sort((a, b) => a - b)).toEqual(expected);
  });

  // reference: brute force over all pairs of boxes, touching included (the index compares exact Float64 boxes)
  test.prop([segments])('forEachCandidatePair visits exactly the pairs whose boxes meet, each once with i < j (oracle)', (segs) => {
    const index = build(segs);
    const expected: string[] = [];
    for (let i = 0; i < segs.length; i++) {
      for (let j = i + 1; j < segs.length; j++) {
        const [p, q] = [box(segs[i]), box(segs[j])];
        if (p[0] <= q[2] && q[0] <= p[2] && p[1] <= q[3] && q[1] <= p[3]) expected.push(`${i},${j}`);
      }
    }
    const visited: string[] = [];
    index.forEachCandidatePair((i, j) => {
      expect(i).toBeLessThan(j);
      visited.push(`${i},${j}`);
    });
    expect([...visited].sort()).toEqual([...expected].sort());
    expect(index.candidatePairCount).toBeGreaterThanOrEqual(visited.length);
    expect(index.maxCellItems).toBeLessThanOrEqual(segs.length);
  });

  test('candidate pairs: one cell, spread-out cells, a long segment across many cells, and an empty index', () => {
    const listed = (index: SegmentIndex) => {
      const out: [number, number][] = [];
      index.forEachCandidatePair((i, j) => void out.push([i, j]));
      return out;
    };
    // all at one point: one cell of k entries, every pair listed
    const same = build(Array.from({ length: 5 }, (): Seg => [2, 3, 2, 3]));
    expect(same.candidatePairCount).toBe(10);
    expect(same.maxCellItems).toBe(5);
    expect(listed(same).length).toBe(10);
    // a collinear run: each segment meets its neighbours only, at shared endpoints
    const line = build(Array.from({ length: 50 }, (_, i): Seg => [i, 0, i + 1, 0]));
    expect(listed(line).sort((p, q) => p[0] - q[0])).toEqual(Array.from({ length: 49 }, (_, i) => [i, i + 1]));
    // a long diagonal shares many cells with short segments along it, yet each pair comes once
    const diagonal: Seg[] = [[0, 0, 40, 40], ...Array.from({ length: 40 }, (_, i): Seg => [i, i + 0.5, i + 1, i + 0.5])];
    const pairs = listed(build(diagonal));
    expect(new Set(pairs.map(String)).size).toBe(pairs.length);
    expect(pairs.filter(([i]) => i === 0).length).toBe(40);
    const empty = build([]);
    expect(listed(empty)).toEqual([]);
    expect(empty.candidatePairCount).toBe(0);
    expect(() => new SegmentIndex(1).forEachCandidatePair(() => {})).toThrow('Index not finished - call finish().');
  });

  test('fromPolylines maps ids to (polyline, segment), closing segments included', () => {
    const index = SegmentIndex.fromPolylines([
      { coords: new Float64Array([0, 0, 1, 0, 1, 1]), closed: true },
      { coords: new Float64Array([5, 5, 6, 5, 7, 5]), closed: false },
      { coords: new Float64Array([9, 9]), closed: false },
    ]);
    expect(index.numItems).toBe(5);
    expect([0, 1, 2, 3, 4].map((id) => [index.polyline(id), index.segment(id)])).toEqual([[0, 0], [0, 1], [0, 2], [1, 0], [1, 1]]);
    // the closing segment (1,1)-(0,0) is id 2 and crosses x = y only there
    expect(candidates(index, [0.4, 0.4, 0.6, 0.6])).toEqual([2]);
    expect(candidates(index, [6, 5, 6, 5])).toEqual([3, 4]); // touching boxes count
    expect(candidates(index, [2, 2, 4, 4])).toEqual([]);
  });

  test('segmentCount: n - 1 open, n closed', () => {
    const coords = new Float64Array([0, 0, 1, 0, 1, 1]);
    expect(segmentCount({ coords, closed: false })).toBe(2);
    expect(segmentCount({ coords, closed: true })).toBe(3);
    expect(segmentCount({ coords: new Float64Array(0), closed: false })).toBe(0);
  });

  test('search stops when the visitor returns true; searchInto reports overflow', () => {
    const index = build([[0, 0, 1, 1], [0, 1, 1, 0], [0.5, 0, 0.5, 1]]);
    let visits = 0;
    index.search(0, 0, 1, 1, () => ++visits === 2);
    expect(visits).toBe(2);
    const out = new Int32Array(1);
    expect(index.searchInto(0, 0, 1, 1, out)).toBe(3);
    expect([0, 1, 2]).toContain(out[0]);
  });

  test('all segments at one point, all collinear, and an empty index', () => {
    const same = build([[2, 3, 2, 3], [2, 3, 2, 3]]);
    expect(candidates(same, [2, 3, 2, 3])).toEqual([0, 1]);
    expect(candidates(same, [2.5, 3, 3, 3])).toEqual([]);
    const line = build(Array.from({ length: 50 }, (_, i): Seg => [i, 0, i + 1, 0]));
    expect(candidates(line, [10.5, -1, 11.5, 1])).toEqual([10, 11]);
    const empty = build([]);
    expect(candidates(empty, [-Infinity, -Infinity, Infinity, Infinity])).toEqual([]);
  });

  test('guards, with messages that name the fix', () => {
    const index = new SegmentIndex(1);
    expect(() => index.searchInto(0, 0, 1, 1, new Int32Array(1))).toThrow('Index not finished - call finish().');
    expect(() => index.finish()).toThrow('Added 0 segments when expected 1.');
    index.add(0, 0, 1, 1);
    expect(() => index.add(0, 0, 1, 1)).toThrow('Added more than the expected 1 segments.');
    index.finish();
    expect(() => index.add(0, 0, 1, 1)).toThrow('Index already finished');
    expect(() => new SegmentIndex(-1)).toThrow(RangeError);
    expect(() => new SegmentIndex(1).add(0, 0, Infinity, 1)).toThrow(RangeError);
  });
});
