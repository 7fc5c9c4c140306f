// Times the binned turning-function distance on 50 seeded smooth loops of 4 600 vertices (1 225 pairs),
// the size of the generator's benchmark. Run by hand: npx tsx tests/bench/turning-distance.bench.ts
// Also times the exact distance on small polygons (regular 20-gon vs 200-gon) for scale.

import {
  turningDistanceBetween,
  turningDistanceExact,
  turningSignature,
} from '../../src/core/metrics/turning-distance.js';
import { fmt, time, wobblyLoop } from './geometry-bench-util.js';

const POLYGONS = 50;
const VERTICES = 4600;
const SAMPLES = 512;

const loops = Array.from({ length: POLYGONS }, (_, k) => wobblyLoop(VERTICES, 300, 8, 100 + k));

const signature = time(() => turningSignature(loops[0], SAMPLES).mean, 20, 200);
console.log(`turningSignature, ${VERTICES} vertices, ${SAMPLES} bins: ${fmt(signature)}`);

const sigs = loops.map((c) => turningSignature(c, SAMPLES));
const pair = time(() => turningDistanceBetween(sigs[0], sigs[1]), 50, 500);
console.log(`turningDistanceBetween, one pair, ${SAMPLES} bins: ${fmt(pair)}`);

const all = time(() => {
  let sum = 0;
  for (let i = 0; i < POLYGONS; i++) {
    for (let j = i + 1; j < POLYGONS; j++) sum += turningDistanceBetween(sigs[i], sigs[j]);
  }
  return sum;
}, 1, 5);
const pairs = (POLYGONS * (POLYGONS - 1)) / 2;
console.log(`all ${pairs} pairs from signatures: ${fmt(all)} (${(all.min / pairs).toFixed(4)} ms per pair at best)`);

const full = time(() => {
  let sum = 0;
  const s = loops.map((c) => turningSignature(c, SAMPLES));
  for (let i = 0; i < POLYGONS; i++) {
    for (let j = i + 1; j < POLYGONS; j++) sum += turningDistanceBetween(s[i], s[j]);
  }
  return sum;
}, 1, 5);
console.log(`all ${pairs} pairs including the ${POLYGONS} signatures: ${fmt(full)}`);

const ngon = (n: number) => Float64Array.from({ length: 2 * n }, (_, i) => (i % 2 ? Math.sin : Math.cos)((2 * Math.PI * (i >> 1)) / n));
const exact = time(() => turningDistanceExact(ngon(20), ngon(200)), 3, 20);
console.log(`turningDistanceExact, 20-gon vs 200-gon: ${fmt(exact)}`);

// convergence for one pair: the value settles long before the residual bound (rA + rB) says it must
for (const n of [128, 512, 2048]) {
  const [a, b] = [turningSignature(loops[0], n), turningSignature(loops[1], n)];
  console.log(`pair 0-1 at ${n} bins: ${turningDistanceBetween(a, b).toFixed(6)} rad, rA + rB = ${(a.residual + b.residual).toFixed(6)}`);
}
