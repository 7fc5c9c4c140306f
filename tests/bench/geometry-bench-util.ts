// Shared helpers for the geometry benches: a seeded generator, smooth seeded loops and timing stats.
import { mulberry32 } from '../helpers/mulberry32.js';

export { mulberry32 };

/** Closed loop r(θ) = R·(1 + Σ a_k cos(kθ + φ_k)), k = 2…harmonics+1, sampled at n points; R sets the size in m. */
export function wobblyLoop(n: number, radiusM: number, harmonics: number, seed: number): Float64Array {
  const rand = mulberry32(seed);
  const amp = Array.from({ length: harmonics }, (_, k) => (0.25 * rand()) / (k + 1));
  const phase = Array.from({ length: harmonics }, () => 2 * Math.PI * rand());
  const c = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const th = (2 * Math.PI * i) / n;
    let r = 1;
    for (let k = 0; k < harmonics; k++) r += amp[k] * Math.cos((k + 2) * th + phase[k]);
    c[2 * i] = radiusM * r * Math.cos(th);
    c[2 * i + 1] = radiusM * r * Math.sin(th);
  }
  return c;
}

/** Run `fn` warmup times, then `iterations` timed times; returns min, mean and std in ms. */
export function time(fn: () => number, warmup: number, iterations: number): { min: number; mean: number; std: number; sink: number } {
  let sink = 0;
  for (let i = 0; i < warmup; i++) sink += fn();
  const t = new Float64Array(iterations);
  for (let i = 0; i < iterations; i++) {
    const t0 = performance.now();
    sink += fn();
    t[i] = performance.now() - t0;
  }
  const mean = t.reduce((a, b) => a + b, 0) / iterations;
  const std = Math.sqrt(t.reduce((a, b) => a + (b - mean) ** 2, 0) / iterations);
  return { min: Math.min(...t), mean, std, sink };
}

export const fmt = (s: { min: number; mean: number; std: number }) =>
  `min ${s.min.toFixed(3)} ms, mean ${s.mean.toFixed(3)} ± ${s.std.toFixed(3)} ms`;
