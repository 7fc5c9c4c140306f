/**
 * Held-out splits: which of train, validation and test a seed belongs to, as a pure function of
 * the seed alone. A keyed hash maps the seed to a number u in [0, 1); fixed shares cut [0, 1)
 * into three intervals:
 *
 *   u = HMAC-SHA256(SPLIT_KEY, JSON.stringify(seed)), first 48 bits / 2^48
 *
 *   0 ────────── 0.8 ──── 0.9 ──── 1
 *   │   train     │ valid. │  test  │
 *
 * The key is a constant of this file: the same seed is in the same split on every machine, for
 * every parameter set and every generator version. `7` and `"7"` are different seeds (their JSON
 * differs), as everywhere else.
 */
import { createHmac } from 'node:crypto';
import type { Seed } from '../params/types.js';

/** The three splits, in the order their intervals take on [0, 1). */
export const SPLITS = ['train', 'validation', 'test'] as const;

export type Split = (typeof SPLITS)[number];

/** Share of all seeds in each split (they add to 1). */
export const SPLIT_SHARES: Readonly<Record<Split, number>> = { train: 0.8, validation: 0.1, test: 0.1 };

/** HMAC key of the split hash. Changing it would move seeds between splits: never change it. */
export const SPLIT_KEY = 'lapwright/split/v1';

// 48 bits of the hash: a double holds them exactly, and 2^-48 is far below any share's precision
const SPLIT_BITS_SCALE = 2 ** 48;

/**
 * The seed's position u in [0, 1) on the split line: the first 48 bits of
 * HMAC-SHA256(SPLIT_KEY, JSON.stringify(seed)), divided by 2^48.
 * @example splitValue(7) // the same number on every machine
 */
export function splitValue(seed: Seed): number {
  const digest = createHmac('sha256', SPLIT_KEY).update(JSON.stringify(seed)).digest();
  return digest.readUIntBE(0, 6) / SPLIT_BITS_SCALE;
}

/**
 * The split a seed belongs to: train when u < 0.8, validation when u < 0.9, test otherwise
 * (u = {@link splitValue}).
 * @example splitOf('larkspur-0001') // 'train', 'validation' or 'test', forever
 */
export function splitOf(seed: Seed): Split {
  const u = splitValue(seed);
  if (u < SPLIT_SHARES.train) return 'train';
  if (u < SPLIT_SHARES.train + SPLIT_SHARES.validation) return 'validation';
  return 'test';
}

/** True for one of the split names. */
export function isSplit(value: unknown): value is Split {
  return typeof value === 'string' && (SPLITS as readonly string[]).includes(value);
}
