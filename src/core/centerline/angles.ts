import { MAX_CORNER_ANGLE_DEG, MIN_CORNER_ANGLE_DEG } from '../params/feasibility.js';

const DEG = Math.PI / 180;

/**
 * Scales nominal corner angles so that they add up to `totalRad` exactly while each stays in
 * [MIN_CORNER_ANGLE_DEG, MAX_CORNER_ANGLE_DEG]: clamped corners are fixed at their bound and
 * the rest rescaled, until nothing moves (at most one pass per corner).
 *
 * @param nominal relative sizes (> 0), one per corner of one direction
 * @param totalRad exact sum wanted, radians (feasibility guarantees it fits the bounds)
 * @returns angles in radians, same order
 */
export function fitAngles(nominal: readonly number[], totalRad: number): Float64Array {
  const n = nominal.length;
  const lo = MIN_CORNER_ANGLE_DEG * DEG;
  const hi = MAX_CORNER_ANGLE_DEG * DEG;
  const out = new Float64Array(n);
  const fixed = new Uint8Array(n);
  for (let pass = 0; pass <= n; pass++) {
    let freeNominal = 0;
    let fixedSum = 0;
    for (let i = 0; i < n; i++) {
      if (fixed[i]) fixedSum += out[i];
      else freeNominal += nominal[i];
    }
    if (freeNominal === 0) break;
    const scale = (totalRad - fixedSum) / freeNominal;
    let moved = false;
    for (let i = 0; i < n; i++) {
      if (fixed[i]) continue;
      const a = nominal[i] * scale;
      if (a < lo || a > hi) {
        out[i] = a < lo ? lo : hi;
        fixed[i] = 1;
        moved = true;
      } else out[i] = a;
    }
    if (!moved) break;
  }
  // the last free corner absorbs rounding so that the sum is exact to the last bit we can get
  let sum = 0;
  for (let i = 0; i < n; i++) sum += out[i];
  let k = n - 1;
  while (k > 0 && fixed[k]) k--;
  out[k] += totalRad - sum;
  return out;
}
