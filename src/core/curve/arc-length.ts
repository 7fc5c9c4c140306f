// Arc length of a closed spline and its inverse s → (segment, u).
// Quadrature: 5-point Gauss–Legendre (exact for polynomials of degree <= 9; on an interval
// of width h the error is h^11·(5!)^4/(11·(10!)^3)·f^(10)(ξ) ≈ 3.9e-13·h^11·f^(10)(ξ); see
// Abramowitz & Stegun, "Handbook of Mathematical Functions" (1964) 25.4.30), applied
// adaptively: a piece is split in half until one rule and the sum over its halves agree.
// Inversion: Newton on s(u) − s with a bisection fallback inside the piece's bracket.
// Names: u ∈ [0, 1] is a segment's local parameter, s is arc length in metres from control
// point 0.

import { COEF_STRIDE, type ClosedSpline } from './catmull-rom-closed.js';

/** Accept a piece when one rule and its two halves agree to this fraction of the segment
 *  length: far below the 1e-6 m evenness target for segments up to kilometres long, and
 *  relative so that scaling the curve by a power of two gives the same pieces. */
export const ARC_REL_TOL = 1e-13;

/** Halving depth at which a piece is accepted regardless: only a zero-speed point (a cusp,
 *  possible with alpha = 0) gets this deep, and 2^-30 of a segment is below metre-scale noise. */
export const MAX_ARC_DEPTH = 30;

/** Newton stops once |s(u) − s| is below this fraction of the piece length (a few hundred
 *  units in the last place, reachable although the quadrature sum itself rounds). */
export const NEWTON_REL_TOL = 1e-13;

/** Newton + bisection iteration cap: 60 halvings shrink a unit bracket below 1e-18. */
export const MAX_NEWTON_ITER = 60;

/**
 * Cumulative arc length of a closed spline. Each segment is cut into one or more pieces
 * `[pieceU[j], end)`, where `end` is `pieceU[j + 1]` inside the segment and 1 for its last
 * piece; `pieceS[j]` is the arc length from the segment start to the piece start.
 */
export type ArcLengthTable = {
  /** total length (m) */
  readonly lengthM: number;
  /** arc length (m) at the start of each segment; `cumulative[segmentCount] = lengthM` */
  readonly cumulative: Float64Array;
  /** arc length (m) of each segment */
  readonly segmentLengths: Float64Array;
  /** index of the first piece of each segment; `pieceStart[segmentCount]` = piece count */
  readonly pieceStart: Uint32Array;
  /** local parameter u at which each piece starts */
  readonly pieceU: Float64Array;
  /** arc length (m) from the start of its segment to the start of each piece */
  readonly pieceS: Float64Array;
};

/** A position on the spline: segment index and local parameter u ∈ [0, 1]. */
export type SplineLocation = { segment: number; u: number };

/**
 * Arc length (m) of segment `seg` between local parameters u0 and u1 with one 5-point
 * Gauss–Legendre rule (no subdivision; use {@link buildArcLengthTable} for whole segments).
 * @example segmentArcLength(spline, 0, 0, 1); // length of the first segment
 */
export function segmentArcLength(spline: ClosedSpline, seg: number, u0: number, u1: number): number {
  const c = spline.coef;
  const o = COEF_STRIDE * seg;
  const bx = c[o + 1], cx = 2 * c[o + 2], dx = 3 * c[o + 3];
  const by = c[o + 5], cy = 2 * c[o + 6], dy = 3 * c[o + 7];
  const h = u1 - u0;
  const m = u0 + 0.5 * h;
  let sum = 0;
  for (let k = 0; k < 5; k++) {
    const u = m + GL_X[k] * h;
    const vx = bx + u * (cx + u * dx);
    const vy = by + u * (cy + u * dy);
    sum += GL_W[k] * Math.sqrt(vx * vx + vy * vy);
  }
  return sum * h;
}

/**
 * Speed |dP/du| (m per unit u) of segment `seg` at local parameter u.
 * @example speedAt(spline, 2, 0.5);
 */
export function speedAt(spline: ClosedSpline, seg: number, u: number): number {
  const c = spline.coef;
  const o = COEF_STRIDE * seg;
  const vx = c[o + 1] + u * (2 * c[o + 2] + 3 * u * c[o + 3]);
  const vy = c[o + 5] + u * (2 * c[o + 6] + 3 * u * c[o + 7]);
  return Math.sqrt(vx * vx + vy * vy);
}

/**
 * Build the cumulative arc-length table of a closed spline, starting at s = 0 on control
 * point 0. Each segment's length is accurate to about {@link ARC_REL_TOL} of itself.
 * @example
 * const table = buildArcLengthTable(catmullRomClosed(control));
 * table.lengthM; // lap length in metres
 */
export function buildArcLengthTable(spline: ClosedSpline): ArcLengthTable {
  const n = spline.segmentCount;
  const cumulative = new Float64Array(n + 1);
  const segmentLengths = new Float64Array(n);
  const pieceStart = new Uint32Array(n + 1);
  const acc: PieceAccumulator = { u: new Float64Array(2 * n), s: new Float64Array(2 * n), count: 0, segS: 0 };
  for (let i = 0; i < n; i++) {
    pieceStart[i] = acc.count;
    acc.segS = 0;
    const whole = segmentArcLength(spline, i, 0, 1);
    addPieces(spline, i, 0, 1, whole, ARC_REL_TOL * whole, 0, acc);
    segmentLengths[i] = acc.segS;
    cumulative[i + 1] = cumulative[i] + acc.segS;
  }
  pieceStart[n] = acc.count;
  return {
    lengthM: cumulative[n],
    cumulative,
    segmentLengths,
    pieceStart,
    pieceU: acc.u.slice(0, acc.count),
    pieceS: acc.s.slice(0, acc.count),
  };
}

/**
 * Find the segment and local parameter u at arc length `s` (m); s is wrapped into
 * [0, lengthM) because the curve is closed.
 * @param out reused result object, to avoid allocation in loops
 * @throws {RangeError} when s is not finite
 * @example locateArcLength(spline, table, 0.5 * table.lengthM, { segment: 0, u: 0 });
 */
export function locateArcLength(spline: ClosedSpline, table: ArcLengthTable, s: number, out: SplineLocation): SplineLocation {
  if (!Number.isFinite(s)) throw new RangeError(`arc length must be finite, got ${s}`);
  const L = table.lengthM;
  let w = s % L;
  if (w < 0) w += L;
  const seg = upperIndex(table.cumulative, 0, spline.segmentCount, w);
  const local = w - table.cumulative[seg];
  const piece = upperIndex(table.pieceS, table.pieceStart[seg], table.pieceStart[seg + 1], local);
  out.segment = seg;
  out.u = solvePieceU(spline, table, seg, piece, local - table.pieceS[piece]);
  return out;
}

/**
 * Local parameter u inside piece `piece` of segment `seg` whose arc length from the piece
 * start is `target` (m, clamped to the piece). Newton from a linear guess, falling back to
 * bisection whenever a step leaves the bracket; converges to {@link NEWTON_REL_TOL} of the
 * piece length. Indices are not checked (inner loop of the resampler).
 * @example solvePieceU(spline, table, 0, table.pieceStart[0], 2.5); // u at 2.5 m into segment 0
 */
export function solvePieceU(spline: ClosedSpline, table: ArcLengthTable, seg: number, piece: number, target: number): number {
  const a = table.pieceU[piece];
  const last = piece + 1 === table.pieceStart[seg + 1];
  const b = last ? 1 : table.pieceU[piece + 1];
  const endS = last ? table.segmentLengths[seg] : table.pieceS[piece + 1];
  const len = endS - table.pieceS[piece];
  if (target <= 0) return a;
  if (target >= len) return b;
  const tol = NEWTON_REL_TOL * len;
  let lo = a;
  let hi = b;
  let u = a + (b - a) * (target / len);
  for (let it = 0; it < MAX_NEWTON_ITER; it++) {
    const f = segmentArcLength(spline, seg, a, u) - target;
    if (Math.abs(f) <= tol) break;
    if (f < 0) lo = u;
    else hi = u;
    let next = u - f / speedAt(spline, seg, u);
    // !(inside) also rejects NaN from a zero speed
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (next === u) break;
    u = next;
  }
  return u;
}

type PieceAccumulator = { u: Float64Array; s: Float64Array; count: number; segS: number };

// append accepted pieces of [a, b] in order of u
function addPieces(spline: ClosedSpline, seg: number, a: number, b: number, whole: number, tol: number, depth: number, acc: PieceAccumulator): void {
  const m = 0.5 * (a + b);
  const left = segmentArcLength(spline, seg, a, m);
  const right = segmentArcLength(spline, seg, m, b);
  if (depth >= MAX_ARC_DEPTH || Math.abs(left + right - whole) <= tol) {
    if (acc.count === acc.u.length) grow(acc);
    acc.u[acc.count] = a;
    acc.s[acc.count] = acc.segS;
    acc.count++;
    // the piece keeps the single-rule value so that solvePieceU reproduces it at u = b
    acc.segS += whole;
    return;
  }
  addPieces(spline, seg, a, m, left, tol, depth + 1, acc);
  addPieces(spline, seg, m, b, right, tol, depth + 1, acc);
}

function grow(acc: PieceAccumulator): void {
  const u = new Float64Array(2 * acc.u.length);
  const s = new Float64Array(2 * acc.s.length);
  u.set(acc.u);
  s.set(acc.s);
  acc.u = u;
  acc.s = s;
}

// largest index i in [lo, hi) with values[i] <= x (lo when x < values[lo])
function upperIndex(values: Float64Array, lo: number, hi: number, x: number): number {
  let l = lo;
  let h = hi - 1;
  while (l < h) {
    const mid = (l + h + 1) >> 1;
    if (values[mid] <= x) l = mid;
    else h = mid - 1;
  }
  return l;
}

// 5-point Gauss–Legendre on [-1/2, 1/2]: nodes ±x/2 and weights w/2 of the [-1, 1] rule
const GL_X = [-0.4530899229693320, -0.26923465505284155, 0, 0.26923465505284155, 0.4530899229693320];
const GL_W = [0.11846344252809454, 0.23931433524968323, 64 / 225, 0.23931433524968323, 0.11846344252809454];
