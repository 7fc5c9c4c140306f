// Measuring on the shipped centerline by lap position s: which segment holds s, the point at s
// (linear between shipped points) and the direction of travel at s (a chord of about
// MEASURE_CHORD_M centred on s, unwrapped along the lap).
import type { TrackGeometry } from './geometry.js';
import { wrapAngle } from './geometry.js';

/**
 * Index i of the centerline segment holding lap position s (s[i] <= s < s[i + 1], where
 * s[n] = lapM closes the lap); s is first taken modulo the lap. Binary search, O(log n).
 * @example segmentAt(g, 0); // 0
 */
export function segmentAt(g: TrackGeometry, s: number): number {
  const u = lapPosition(g, s);
  const pos = g.s;
  let lo = 0, hi = g.n - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (pos[mid] <= u) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** s modulo the lap, in [0, lapM). */
export function lapPosition(g: TrackGeometry, s: number): number {
  const u = s - g.lapM * Math.floor(s / g.lapM);
  return u >= g.lapM ? 0 : u;
}

/**
 * The centerline point at lap position s, linear between the two shipped points around it.
 * @param out receives [x, y] in metres.
 * @returns the segment index holding s.
 */
export function pointAt(g: TrackGeometry, s: number, out: Float64Array): number {
  const i = segmentAt(g, s);
  const j = i + 1 === g.n ? 0 : i + 1;
  const span = g.s[i + 1] - g.s[i];
  const t = span > 0 ? (lapPosition(g, s) - g.s[i]) / span : 0;
  const c = g.center;
  out[0] = c[2 * i] + t * (c[2 * j] - c[2 * i]);
  out[1] = c[2 * i + 1] + t * (c[2 * j + 1] - c[2 * i + 1]);
  return i;
}

const scratchA = new Float64Array(2);
const scratchB = new Float64Array(2);

/**
 * Direction of travel at lap position s, radians, unwrapped along the lap: continuous in s and
 * grown by the loop's net turning (±2π) per lap, so headingAt(b) − headingAt(a) is the signed
 * turning from a to b. Measured on the chord from s − h/2 to s + h/2 with h = stride · spacing
 * (about MEASURE_CHORD_M), which sees 1 mm rounding as a few hundredths of a degree.
 */
export function headingAt(g: TrackGeometry, s: number): number {
  const half = (g.stride * g.lapM) / (2 * g.n);
  pointAt(g, s - half, scratchA);
  pointAt(g, s + half, scratchB);
  const i = segmentAt(g, s);
  const chord = Math.atan2(scratchB[1] - scratchA[1], scratchB[0] - scratchA[0]);
  const laps = Math.floor(s / g.lapM);
  const net = g.headingRad[g.n] - g.headingRad[0];
  return g.headingRad[i] + wrapAngle(chord - g.segmentRad[i]) + laps * net;
}

/** Unit tangent (direction of travel) at lap position s, written to out as [dx, dy]. */
export function tangentAt(g: TrackGeometry, s: number, out: Float64Array): void {
  const a = headingAt(g, s);
  out[0] = Math.cos(a);
  out[1] = Math.sin(a);
}
