// Arkin, Chew, Huttenlocher, Kedem & Mitchell, "An efficiently computable metric for comparing polygonal
// shapes", IEEE Trans. PAMI 13 (1991) 209-216: the turning-function distance, here on binned signatures.
/**
 * Novelty of a track's shape: the turning-function distance between centerlines, which ignores
 * position, rotation, start point and scale (and the direction of travel: a clockwise outline is
 * walked in reverse). Each track's turning function is binned into NOVELTY_SAMPLES equal steps of
 * normalised arc length, centred (a rotation) and rounded to 32-bit floats: that is its stored
 * shape (`shape` in a manifest, base64). Every novelty decision is taken on stored shapes, so a
 * batch decides the same way whether a shape was just computed or read back from a manifest.
 *
 * A batch compares each candidate with every accepted shape. To keep that cheap, a lower bound
 * prunes pairs first: with p(k) = Θ(k) − 2πk/N periodic and P its discrete Fourier transform,
 * Parseval gives, for every cyclic shift,
 *
 *   D² ≥ (1/N²) Σ_{f≠0} (|P_a(f)| − |P_b(f)|)² ≥ (2/N²) Σ_{f=1..K} (|P_a(f)| − |P_b(f)|)²
 *
 * (shifting multiplies P(f) by a unit phase, and |x − y| ≥ ||x| − |y||). Only pairs whose bound
 * falls below the threshold get the full O(N²) distance.
 */
import { Buffer } from 'node:buffer';
import type { Point } from '../track.js';
import { turningDistanceBetween, turningSignature, type TurningSignature } from '../metrics/turning-distance.js';

/** Bins of normalised arc length of a stored shape. */
export const NOVELTY_SAMPLES = 128;

/** Fourier magnitudes kept for the pruning bound (harmonics 1..K of N/2). */
const SPECTRUM_HARMONICS = 24;

/** Pruning keeps a pair whose bound is within this of the threshold (rad): cos/sin may differ in the last bits between engines. */
const BOUND_MARGIN_RAD = 1e-9;

/** Relative slack on the early-exit cap of distanceBelow: far above rounding, far below any threshold's meaning. */
const CAP_SLACK = 1e-9;

const TWO_PI = 2 * Math.PI;

/** A stored shape, ready to compare: its signature, the signature over two laps, and the magnitudes of the pruning bound. */
export interface Shape {
  readonly signature: TurningSignature;
  /** Θ over two laps (values, then values + 2π), as turningDistanceBetween lays it out. */
  readonly twoLaps: Float64Array;
  readonly spectrum: Float64Array;
}

/**
 * The stored shape of a closed polyline (a track's `centerline.points`), base64 of
 * NOVELTY_SAMPLES little-endian 32-bit floats: the binned turning function minus its mean, rad.
 * @throws {RangeError} for a degenerate polyline (see turningSignature)
 * @example encodeShape(track.centerline.points).length // 684
 */
export function encodeShape(points: readonly Point[]): string {
  const coords = new Float64Array(2 * points.length);
  for (let i = 0; i < points.length; i++) {
    coords[2 * i] = points[i][0];
    coords[2 * i + 1] = points[i][1];
  }
  const sig = turningSignature(coords, NOVELTY_SAMPLES);
  const bytes = new Uint8Array(4 * NOVELTY_SAMPLES);
  const view = new DataView(bytes.buffer);
  for (let k = 0; k < NOVELTY_SAMPLES; k++) view.setFloat32(4 * k, sig.values[k] - sig.mean, true);
  return Buffer.from(bytes).toString('base64');
}

/**
 * Reads a stored shape back.
 * @throws {RangeError} when the text is not base64 of NOVELTY_SAMPLES finite 32-bit floats
 */
export function decodeShape(text: string): Shape {
  const bytes = Buffer.from(text, 'base64');
  if (bytes.length !== 4 * NOVELTY_SAMPLES || bytes.toString('base64') !== text) {
    throw new RangeError(`a shape is base64 of ${NOVELTY_SAMPLES} 32-bit floats (${Math.ceil((4 * NOVELTY_SAMPLES) / 3) * 4} characters), got ${text.length} characters that do not decode to it.`);
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const values = new Float64Array(NOVELTY_SAMPLES);
  let sum = 0;
  for (let k = 0; k < NOVELTY_SAMPLES; k++) {
    values[k] = view.getFloat32(4 * k, true);
    if (!Number.isFinite(values[k])) throw new RangeError(`shape value ${k} is not a finite number.`);
    sum += values[k];
  }
  const signature: TurningSignature = { samples: NOVELTY_SAMPLES, values, mean: sum / NOVELTY_SAMPLES, residual: 0 };
  const twoLaps = new Float64Array(2 * NOVELTY_SAMPLES);
  twoLaps.set(values);
  for (let k = 0; k < NOVELTY_SAMPLES; k++) twoLaps[NOVELTY_SAMPLES + k] = values[k] + TWO_PI;
  return { signature, twoLaps, spectrum: spectrumOf(values) };
}

/**
 * Turning-function distance between two stored shapes, rad: the binned distance of
 * turningDistanceBetween (best cyclic shift, best rotation). Symmetric up to rounding; 0 for the
 * same shape.
 * @example shapeDistance(decodeShape(a.shape), decodeShape(b.shape)) // e.g. 0.81
 */
export function shapeDistance(a: Shape, b: Shape): number {
  return turningDistanceBetween(a.signature, b.signature);
}

/**
 * A lower bound of shapeDistance(a, b) from the Fourier magnitudes alone (see the file comment).
 */
export function shapeDistanceBound(a: Shape, b: Shape): number {
  let sum = 0;
  for (let f = 0; f < a.spectrum.length; f++) {
    const d = a.spectrum[f] - b.spectrum[f];
    sum += d * d;
  }
  return Math.sqrt((2 * sum) / (NOVELTY_SAMPLES * NOVELTY_SAMPLES));
}

/**
 * The shapes a batch has accepted (and its reference shapes), searched for one closer than a
 * threshold. Lifecycle: add() as shapes are accepted, findWithin() for each candidate.
 * @example
 * const index = new NoveltyIndex();
 * index.add(decodeShape(first.shape));
 * index.findWithin(decodeShape(candidate.shape), 0.3) // null when the candidate is novel
 */
export class NoveltyIndex {
  private readonly shapes: Shape[] = [];

  /** Number of shapes held. */
  get size(): number {
    return this.shapes.length;
  }

  add(shape: Shape): void {
    this.shapes.push(shape);
  }

  /**
   * The first held shape (in the order added) closer than `threshold` to `shape`, with its
   * distance; null when every held shape is at least `threshold` away.
   */
  findWithin(shape: Shape, threshold: number): { readonly index: number; readonly distance: number } | null {
    for (let i = 0; i < this.shapes.length; i++) {
      const other = this.shapes[i];
      if (shapeDistanceBound(shape, other) > threshold + BOUND_MARGIN_RAD) continue;
      const distance = distanceBelow(shape, other, threshold);
      if (distance !== null) return { index: i, distance };
    }
    return null;
  }
}

/**
 * shapeDistance(a, b) when it is below `limit`, else null. The same sums in the same order as
 * turningDistanceBetween (so the same bits), but a cyclic shift is dropped as soon as its partial
 * sum of squares passes limit²·N: the rest of its terms are not negative.
 */
export function distanceBelow(a: Shape, b: Shape, limit: number): number | null {
  const n = NOVELTY_SAMPLES;
  const av = a.twoLaps;
  const bv = b.signature.values;
  // a hair above limit²·N, so a dropped shift is surely not below the limit after rounding
  const cap = limit * limit * n * (1 + CAP_SLACK);
  let best = Infinity;
  for (let j = 0; j < n; j++) {
    const mean = a.signature.mean + (TWO_PI * j) / n - b.signature.mean;
    let sum = 0;
    let k = 0;
    for (; k < n && sum < cap; k++) {
      const d = av[j + k] - bv[k] - mean;
      sum += d * d;
    }
    if (k === n && sum < best) best = sum;
  }
  if (best === Infinity) return null;
  const distance = Math.sqrt(best / n);
  return distance < limit ? distance : null;
}

// |P(f)| for f = 1..K of p(k) = Θ(k) − 2πk/N, by a direct sum (K·N operations)
function spectrumOf(values: Float64Array): Float64Array {
  const n = values.length;
  const p = new Float64Array(n);
  for (let k = 0; k < n; k++) p[k] = values[k] - (TWO_PI * k) / n;
  const harmonics = Math.min(SPECTRUM_HARMONICS, Math.floor((n - 1) / 2));
  const out = new Float64Array(harmonics);
  for (let f = 1; f <= harmonics; f++) {
    let re = 0;
    let im = 0;
    for (let k = 0; k < n; k++) {
      const angle = (TWO_PI * f * k) / n;
      re += p[k] * Math.cos(angle);
      im -= p[k] * Math.sin(angle);
    }
    out[f - 1] = Math.sqrt(re * re + im * im);
  }
  return out;
}
