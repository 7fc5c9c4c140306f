/**
 * Seeds of a batch: track `slot` of a batch takes the seeds of draws 0, 1, 2, … until one fits
 * (in the requested split, feasible, novel enough). Each (slot, draw) pair is a counter
 *
 *   c = draw · 2^20 + slot        (slot < 2^20, draw < 2^12, so c < 2^32)
 *
 * and the seed is a keyed permutation of c over the unsigned 32-bit integers: a four-round
 * Feistel network on 16-bit halves whose round function is HMAC-SHA256 keyed by the batch's base
 * seed. A permutation never maps two counters to one value, so the seeds of one batch are all
 * different; a slot's seeds depend on nothing but the base seed, the slot and the draw, so any
 * slot can be made alone (shards, workers).
 */
import { createHmac } from 'node:crypto';
import type { Seed } from '../params/types.js';

/** Slots a batch may have: track indices 0 .. 2^20 − 1. */
export const MAX_BATCH_SLOTS = 2 ** 20;

/** Draws one slot may take before the batch gives up on it: 0 .. 2^12 − 1. */
export const MAX_SLOT_DRAWS = 2 ** 12;

// rounds of the Feistel network: four make a pseudo-random permutation from a pseudo-random function
const FEISTEL_ROUNDS = 4;
const HALF_MASK = 0xffff;

/**
 * The seed of draw `draw` of track `slot` in the batch with base seed `baseSeed`: an unsigned
 * 32-bit integer, different for every (slot, draw) of that base seed.
 * @param baseSeed the batch's root seed (integer or string, as a track seed)
 * @param slot track index in the batch, 0 .. MAX_BATCH_SLOTS − 1
 * @param draw attempt for that slot, 0 .. MAX_SLOT_DRAWS − 1
 * @throws {RangeError} when slot or draw is out of range
 * @example batchSeed('larkspur-night-7', 0, 0) // the same integer on every machine
 */
export function batchSeed(baseSeed: Seed, slot: number, draw: number): number {
  if (!Number.isInteger(slot) || slot < 0 || slot >= MAX_BATCH_SLOTS) throw new RangeError(`slot must be an integer from 0 to ${MAX_BATCH_SLOTS - 1}, got ${slot}.`);
  if (!Number.isInteger(draw) || draw < 0 || draw >= MAX_SLOT_DRAWS) throw new RangeError(`draw must be an integer from 0 to ${MAX_SLOT_DRAWS - 1}, got ${draw}.`);
  const key = `lapwright/batch-seed/v1/${JSON.stringify(baseSeed)}`;
  const counter = draw * MAX_BATCH_SLOTS + slot;
  let left = Math.floor(counter / 0x10000);
  let right = counter & HALF_MASK;
  for (let round = 0; round < FEISTEL_ROUNDS; round++) {
    const f = createHmac('sha256', key).update(`${round}/${right}`).digest().readUInt16BE(0);
    const next = (left ^ f) & HALF_MASK;
    left = right;
    right = next;
  }
  return left * 0x10000 + right;
}
