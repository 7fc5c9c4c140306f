import type { RangeM } from '../params/types.js';
import { loopNoise } from '../random/noise.js';
import type { Rng } from '../random/streams.js';

/** Steepest change of road width along the lap, metres per metre: 1 in 20 (motorsport practice, REFERENCES "Facts of the trade"). */
export const MAX_WIDTH_SLOPE = 1 / 20;
/** The width's noise is planned to this share of MAX_WIDTH_SLOPE: the noise's steepest slope is an estimate. */
const SLOPE_SHARE = 0.8;
/** Shortest wavelength of the width variation, metres. */
export const MIN_WIDTH_WAVELENGTH_M = 150;
/** Gain of the noise inside tanh: at noise 1 the width reaches near both ends of the range. */
const WIDTH_GAIN = 3;
/** Largest |d noise / du| of loop noise per cycle, measured on the simplex noise used (≈ 1.5 · 2π). */
const NOISE_SLOPE_PER_CYCLE = 1.5 * 2 * Math.PI;

/**
 * Road width along the lap as a function of the lap fraction u in [0, 1): the middle of the range
 * moved by tanh-squashed simplex noise, so it stays strictly inside [min, max], changes by at most
 * MAX_WIDTH_SLOPE per metre, and is constant when `noise` is 0 or the range is a single value.
 */
export function widthProfile(range: RangeM, noise: number, lapM: number, rng: Rng): (u: number) => number {
  const mid = 0.5 * (range.min + range.max);
  const half = 0.5 * (range.max - range.min);
  const gain = WIDTH_GAIN * noise;
  if (half === 0 || gain === 0) return () => mid;
  const norm = Math.tanh(WIDTH_GAIN);
  // slope ≈ half · gain / norm · NOISE_SLOPE_PER_CYCLE · cycles / lapM <= MAX_WIDTH_SLOPE
  const bySlope = (SLOPE_SHARE * MAX_WIDTH_SLOPE * lapM * norm) / (half * gain * NOISE_SLOPE_PER_CYCLE);
  const cycles = Math.max(0.5, Math.min(lapM / MIN_WIDTH_WAVELENGTH_M, bySlope));
  const n = loopNoise(rng, cycles);
  return (u) => mid + (half * Math.tanh(gain * n(u))) / norm;
}

/**
 * Lowers values of an evenly sampled closed profile until no two neighbours differ by more than
 * `slope` per metre (a Lipschitz bound; values only fall, so a profile inside [min, max] stays
 * there). Two passes each way around the loop settle it.
 */
export function limitSlopeCyclic(values: Float64Array, spacingM: number, slope: number): void {
  const n = values.length;
  const step = slope * spacingM;
  // neighbour indices wrap by comparison, not by integer division
  for (let round = 0; round < 2; round++) {
    for (let k = 1; k <= n; k++) {
      const i = k < n ? k : 0, j = k - 1;
      if (values[i] > values[j] + step) values[i] = values[j] + step;
    }
    for (let k = n - 2; k >= -1; k--) {
      const i = k >= 0 ? k : n - 1, j = k + 1;
      if (values[i] > values[j] + step) values[i] = values[j] + step;
    }
  }
}
