// Times SegmentIndex (uniform grid) against a plain flatbush tree on 10 000 segments of about 1 m, and
// findCrossings on a 10 km closed loop. Run by hand: npx tsx tests/bench/segment-index.bench.ts
// Distributions: a smooth closed loop (the track case), uniform unit segments in 100 x 100 m, the same
// with 1 % long segments, and all segments on one line (degenerate).

import Flatbush from 'flatbush';
import { findCrossings } from '../../src/core/geom/crossings.js';
import { SegmentIndex } from '../../src/core/spatial/segment-index.js';
import { fmt, mulberry32, time, wobblyLoop } from './geometry-bench-util.js';

const N = 10_000;
const WARMUP = 20;
const ITERATIONS = 100;

type Segs = Float64Array; // [ax, ay, bx, by] per segment

function loopSegments(coords: Float64Array): Segs {
  const n = coords.length >> 1;
  const s = new Float64Array(4 * n);
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    s.set([coords[2 * i], coords[2 * i + 1], coords[2 * j], coords[2 * j + 1]], 4 * i);
  }
  return s;
}

function uniform(seed: number, longShare: number): Segs {
  const rand = mulberry32(seed);
  const s = new Float64Array(4 * N);
  for (let i = 0; i < N; i++) {
    const [x, y, a] = [100 * rand(), 100 * rand(), 2 * Math.PI * rand()];
    if (rand() < longShare) s.set([x, y, 100 * rand(), 100 * rand()], 4 * i);
    else s.set([x, y, x + Math.cos(a), y + Math.sin(a)], 4 * i);
  }
  return s;
}

// a 10 km loop sampled every ~1 m: R = 10 000 / 2π m before the wobble
const loop = wobblyLoop(N, 10_000 / (2 * Math.PI), 6, 1);
const cases: [string, Segs][] = [
  ['loop 10 km', loopSegments(loop)],
  ['uniform', uniform(2, 0)],
  ['uniform, 1% long', uniform(3, 0.01)],
  ['collinear', Float64Array.from({ length: 4 * N }, (_, k) => [k >> 2, 0, (k >> 2) + 1, 0][k % 4])],
];

const out = new Int32Array(N);
const lo = (s: Segs, i: number, o: number) => Math.min(s[4 * i + o], s[4 * i + o + 2]);
const hi = (s: Segs, i: number, o: number) => Math.max(s[4 * i + o], s[4 * i + o + 2]);

for (const [name, s] of cases) {
  const buildGrid = () => {
    const index = new SegmentIndex(N);
    for (let i = 0; i < N; i++) index.add(s[4 * i], s[4 * i + 1], s[4 * i + 2], s[4 * i + 3]);
    index.finish();
    return index;
  };
  const buildTree = () => {
    const tree = new Flatbush(N);
    for (let i = 0; i < N; i++) tree.add(lo(s, i, 0), lo(s, i, 1), hi(s, i, 0), hi(s, i, 1));
    tree.finish();
    return tree;
  };
  const grid = buildGrid();
  const tree = buildTree();
  const gridBuild = time(() => buildGrid().numItems, WARMUP, ITERATIONS);
  const treeBuild = time(() => buildTree().numItems, WARMUP, ITERATIONS);
  const gridQuery = time(() => {
    let c = 0;
    for (let i = 0; i < N; i++) c += grid.searchInto(lo(s, i, 0), lo(s, i, 1), hi(s, i, 0), hi(s, i, 1), out);
    return c;
  }, WARMUP, ITERATIONS);
  const treeQuery = time(() => {
    let c = 0;
    for (let i = 0; i < N; i++) c += tree.search(lo(s, i, 0), lo(s, i, 1), hi(s, i, 0), hi(s, i, 1)).length;
    return c;
  }, WARMUP, ITERATIONS);
  if (gridQuery.sink !== treeQuery.sink) throw new Error(`${name}: grid and tree disagree on candidate counts`);
  console.log(`${name}\n  grid     build ${fmt(gridBuild)}\n  grid     ${N} queries ${fmt(gridQuery)}`);
  console.log(`  flatbush build ${fmt(treeBuild)}\n  flatbush ${N} queries ${fmt(treeQuery)}`);
}

const found = findCrossings([{ coords: loop, closed: true }], Infinity).length;
const crossings = time(() => findCrossings([{ coords: loop, closed: true }], Infinity).length, 5, 50);
console.log(`findCrossings, 10 km loop of ${N} segments (${found} crossings): ${fmt(crossings)}`);
