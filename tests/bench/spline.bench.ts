// Times catmullRomClosed + resampleClosedSpline (1 m spacing) on closed curves of 1.5 km
// and 8 km. Run by hand: npx tsx tests/bench/spline.bench.ts
// Control points are placed the way the generator does: one per heading step of turning, at
// most a maximum chord apart, on seeded smooth loops r(θ) = R·(1 + Σ a_k cos(kθ + φ_k)).
// Two spacings: sparse (4°, 15 m) and dense (3°, 5 m, about 300 points per 1.5 km).

import { catmullRomClosed } from '../../src/core/curve/catmull-rom-closed.js';
import { resampleClosedSpline } from '../../src/core/curve/resample.js';
import { mulberry32 } from '../helpers/mulberry32.js';

const SPACINGS = [
  { name: 'sparse', stepDeg: 4, maxChordM: 15 },
  { name: 'dense', stepDeg: 3, maxChordM: 5 },
];
const MIN_GAP_M = 1; // never place two control points closer than this
const SPACING_M = 1;
const WARMUP = 200;
const ITERATIONS = 1000;

type Case = { name: string; control: Float64Array };

const cases: Case[] = [];
for (const lengthM of [1500, 8000]) {
  for (const { name, stepDeg, maxChordM } of SPACINGS) {
    cases.push({ name: `circle ${lengthM} m ${name}`, control: placeControl(loop(lengthM, 0, 0), stepDeg, maxChordM) });
    for (const seed of [1, 2]) {
      cases.push({ name: `wobbly ${lengthM} m ${name} s${seed}`, control: placeControl(loop(lengthM, 6, seed), stepDeg, maxChordM) });
    }
  }
}

let sink = 0;
for (const { name, control } of cases) {
  for (let i = 0; i < WARMUP; i++) sink += run(control);
  const times = new Float64Array(ITERATIONS);
  for (let i = 0; i < ITERATIONS; i++) {
    const t0 = performance.now();
    sink += run(control);
    times[i] = performance.now() - t0;
  }
  const n = resampleClosedSpline(catmullRomClosed(control), SPACING_M).n;
  console.log(`${name.padEnd(28)} control ${String(control.length / 2).padStart(5)}  samples ${String(n).padStart(5)}  ${stats(times)}`);
}
console.log(`(checksum ${sink.toFixed(3)})`);

function run(control: Float64Array): number {
  const curve = resampleClosedSpline(catmullRomClosed(control), SPACING_M);
  // consume the result so the work cannot be optimized away
  return curve.points[curve.n] + curve.curvature[curve.n >> 1];
}

function stats(times: Float64Array): string {
  let min = Infinity;
  let sum = 0;
  for (const t of times) {
    min = Math.min(min, t);
    sum += t;
  }
  const mean = sum / times.length;
  let sq = 0;
  for (const t of times) sq += (t - mean) * (t - mean);
  const std = Math.sqrt(sq / (times.length - 1));
  return `min ${min.toFixed(3)} ms  mean ${mean.toFixed(3)} ± ${std.toFixed(3)} ms`;
}

// dense polyline of a seeded smooth loop scaled to about lengthM
function loop(lengthM: number, harmonics: number, seed: number): Float64Array {
  const rand = mulberry32(seed);
  const amp: number[] = [];
  const phase: number[] = [];
  for (let k = 2; k < 2 + harmonics; k++) {
    amp.push((0.25 * rand()) / k);
    phase.push(2 * Math.PI * rand());
  }
  const m = 20000;
  const pts = new Float64Array(2 * m);
  let perimeter = 0;
  for (let i = 0; i < m; i++) {
    const th = (2 * Math.PI * i) / m;
    let r = 1;
    for (let k = 0; k < amp.length; k++) r += amp[k] * Math.cos((k + 2) * th + phase[k]);
    pts[2 * i] = r * Math.cos(th);
    pts[2 * i + 1] = r * Math.sin(th);
    if (i > 0) perimeter += Math.sqrt((pts[2 * i] - pts[2 * i - 2]) ** 2 + (pts[2 * i + 1] - pts[2 * i - 1]) ** 2);
  }
  const scale = lengthM / perimeter;
  for (let i = 0; i < pts.length; i++) pts[i] *= scale;
  return pts;
}

// walk the dense loop; emit a control point after stepDeg of turning or maxChordM of travel
function placeControl(dense: Float64Array, stepDeg: number, maxChordM: number): Float64Array {
  const m = dense.length / 2;
  const out: number[] = [dense[0], dense[1]];
  const step = (stepDeg * Math.PI) / 180;
  let turned = 0;
  let travelled = 0;
  let prev = Math.atan2(dense[3] - dense[1], dense[2] - dense[0]);
  for (let i = 1; i < m; i++) {
    const j = (i + 1) % m;
    const heading = Math.atan2(dense[2 * j + 1] - dense[2 * i + 1], dense[2 * j] - dense[2 * i]);
    let dh = heading - prev;
    if (dh > Math.PI) dh -= 2 * Math.PI;
    if (dh < -Math.PI) dh += 2 * Math.PI;
    prev = heading;
    turned += Math.abs(dh);
    travelled += Math.sqrt((dense[2 * i] - dense[2 * i - 2]) ** 2 + (dense[2 * i + 1] - dense[2 * i - 1]) ** 2);
    if ((turned >= step || travelled >= maxChordM) && travelled >= MIN_GAP_M) {
      out.push(dense[2 * i], dense[2 * i + 1]);
      turned = 0;
      travelled = 0;
    }
  }
  // the walk may end just short of the start: drop a last point that nearly duplicates it
  const n = out.length / 2;
  if (Math.sqrt((out[2 * n - 2] - out[0]) ** 2 + (out[2 * n - 1] - out[1]) ** 2) < MIN_GAP_M) out.length -= 2;
  return new Float64Array(out);
}

