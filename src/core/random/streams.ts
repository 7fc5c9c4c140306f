import seedrandom from 'seedrandom';
import type { Seed } from '../params/types.js';

/** A uniform generator on [0, 1), like Math.random but seeded. */
export type Rng = () => number;

/**
 * One named sub-stream of the root seed (Alea generator from seedrandom). Each stage draws
 * from its own stream, keyed by seed, attempt and stage name, so that adding draws to one
 * stage never shifts the numbers of another. A number seed and the same digits as a string
 * are different seeds.
 *
 * @param seed root seed of the request
 * @param attempt layout attempt, 0-based
 * @param stage stable stage name, e.g. 'plan' or 'width'
 * @example const rng = stream(7, 0, 'plan'); rng() // same value on every machine
 */
export function stream(seed: Seed, attempt: number, stage: string): Rng {
  return seedrandom.alea(`lapwright/${JSON.stringify(seed)}/${attempt}/${stage}`);
}

/** Uniform number in [lo, hi). */
export function uniform(rng: Rng, lo: number, hi: number): number {
  return lo + (hi - lo) * rng();
}

/** Uniform integer in [lo, hi] (both inclusive). */
export function integer(rng: Rng, lo: number, hi: number): number {
  return lo + Math.floor(rng() * (hi - lo + 1));
}

/** Standard normal deviate (Box-Muller, one of the pair). */
export function normal(rng: Rng): number {
  const u = 1 - rng(); // in (0, 1], keeps log finite
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rng());
}

/** Picks an index with probability proportional to its weight. */
export function pickWeighted(rng: Rng, weights: readonly number[]): number {
  let total = 0;
  for (const w of weights) total += w;
  let r = rng() * total;
  for (let i = 0; i < weights.length; i++) {
    r -= weights[i];
    if (r < 0) return i;
  }
  return weights.length - 1;
}

/** Fisher-Yates shuffle in place. */
export function shuffle<T>(rng: Rng, items: T[]): T[] {
  for (let i = items.length - 1; i > 0; i--) {
    const j = Math.floor(rng() * (i + 1));
    const t = items[i];
    items[i] = items[j];
    items[j] = t;
  }
  return items;
}
