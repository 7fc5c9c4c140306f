import { createNoise2D } from 'simplex-noise';
import type { Rng } from './streams.js';

/** A smooth periodic signal on u in [0, 1): value(u) = value(u + 1), |value| < 1. */
export type LoopNoise = (u: number) => number;

/**
 * Seamless 1-D simplex noise on a loop: 2-D simplex noise (Gustavson, "Simplex noise
 * demystified", 2005) sampled on a circle of radius `cycles / (2π)`, so that about `cycles`
 * features fit in one period and the end meets the start.
 *
 * @param rng the stream that builds the permutation table
 * @param cycles rough number of bumps per period (> 0)
 * @example const n = loopNoise(stream(7, 0, 'width'), 6); n(0) === n(1)
 */
export function loopNoise(rng: Rng, cycles: number): LoopNoise {
  const noise2 = createNoise2D(rng);
  const radius = cycles / (2 * Math.PI);
  const ox = rng() * 1000; // offset so that different streams do not share the origin lattice vertex
  const oy = rng() * 1000;
  return (u) => {
    const a = 2 * Math.PI * u;
    return noise2(ox + radius * Math.cos(a), oy + radius * Math.sin(a));
  };
}
