// Exact reference geometry in BigInt for oracle tests: every finite double is an integer multiple of 2^-1074,
// so scaling by 2^1074 turns coordinates into integers without rounding and all arithmetic below is exact.

/** The finite double x times 2^1074, exactly. */
export function scaled(x: number): bigint {
  if (!Number.isFinite(x)) throw new RangeError(`scaled() needs a finite double, got ${x}`);
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, x);
  const hi = view.getUint32(0);
  const lo = view.getUint32(4);
  const biased = (hi >>> 20) & 0x7ff;
  let mantissa = (BigInt(hi & 0xfffff) << 32n) | BigInt(lo);
  let shift = 0; // subnormals: value = mantissa · 2^-1074
  if (biased !== 0) {
    mantissa |= 1n << 52n;
    shift = biased - 1; // value = mantissa · 2^(biased − 1075)
  }
  const v = mantissa << BigInt(shift);
  return hi >>> 31 ? -v : v;
}

/** Exact sign of the cross product (b − a) × (c − a): +1 counter-clockwise in y-up axes, 0 collinear. */
export function orientSignExact(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  const [Ax, Ay, Bx, By, Cx, Cy] = [ax, ay, bx, by, cx, cy].map(scaled);
  const det = (Bx - Ax) * (Cy - Ay) - (By - Ay) * (Cx - Ax);
  return det > 0n ? 1 : det < 0n ? -1 : 0;
}

type P = readonly [bigint, bigint];
/** A rational point (x / den, y / den) with den > 0. */
export interface RationalPoint { readonly x: bigint; readonly y: bigint; readonly den: bigint }
/** The exact intersection of two closed segments: empty, one point, or a segment of positive length. */
export type Intersection =
  | { readonly kind: 'none' }
  | { readonly kind: 'point'; readonly p: RationalPoint }
  | { readonly kind: 'segment' };

const cross = (u: P, v: P): bigint => u[0] * v[1] - u[1] * v[0];
const dot = (u: P, v: P): bigint => u[0] * v[0] + u[1] * v[1];
const sub = (u: P, v: P): P => [u[0] - v[0], u[1] - v[1]];
const eq = (u: P, v: P): boolean => u[0] === v[0] && u[1] === v[1];
const at = (p: P): RationalPoint => ({ x: p[0], y: p[1], den: 1n });

// point p on closed segment [a, b] with a ≠ b
function onSegment(p: P, a: P, b: P): boolean {
  const e = sub(b, a);
  const w = sub(p, a);
  return cross(e, w) === 0n && dot(e, w) >= 0n && dot(e, w) <= dot(e, e);
}

/**
 * The set [a, b] ∩ [c, d], computed by parametric line algebra over the rationals (a different method
 * from the orientation-sign tests under test).
 */
export function intersectionExact(
  ax: number, ay: number, bx: number, by: number,
  cx: number, cy: number, dx: number, dy: number,
): Intersection {
  const a: P = [scaled(ax), scaled(ay)];
  const b: P = [scaled(bx), scaled(by)];
  const c: P = [scaled(cx), scaled(cy)];
  const d: P = [scaled(dx), scaled(dy)];
  const none = { kind: 'none' } as const;
  if (eq(a, b) && eq(c, d)) return eq(a, c) ? { kind: 'point', p: at(a) } : none;
  if (eq(a, b)) return onSegment(a, c, d) ? { kind: 'point', p: at(a) } : none;
  if (eq(c, d)) return onSegment(c, a, b) ? { kind: 'point', p: at(c) } : none;
  const e = sub(b, a);
  const f = sub(d, c);
  let den = cross(e, f);
  const ca = sub(c, a);
  if (den !== 0n) {
    // a + t e = c + u f  with  t = (ca × f) / den,  u = (ca × e) / den
    let tn = cross(ca, f);
    let un = cross(ca, e);
    if (den < 0n) [den, tn, un] = [-den, -tn, -un];
    if (tn < 0n || tn > den || un < 0n || un > den) return none;
    return { kind: 'point', p: { x: a[0] * den + tn * e[0], y: a[1] * den + tn * e[1], den } };
  }
  if (cross(ca, e) !== 0n) return none; // parallel lines apart
  // collinear: overlap of the parameter intervals along e
  const len = dot(e, e);
  const tc = dot(ca, e);
  const td = dot(sub(d, a), e);
  const lo = [0n, tc < td ? tc : td].reduce((x, y) => (x > y ? x : y));
  const hi = [len, tc < td ? td : tc].reduce((x, y) => (x < y ? x : y));
  if (lo > hi) return none;
  if (lo < hi) return { kind: 'segment' };
  return { kind: 'point', p: { x: a[0] * len + lo * e[0], y: a[1] * len + lo * e[1], den: len } };
}

/** Whether a rational point equals the double point (x, y). */
export function isAt(p: RationalPoint, x: number, y: number): boolean {
  return p.x === scaled(x) * p.den && p.y === scaled(y) * p.den;
}

/** Twice the signed area of a closed polygon times 2^2148, exactly: its sign is the exact orientation. */
export function twiceAreaExact(coords: Float64Array): bigint {
  const n = coords.length >> 1;
  let sum = 0n;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    sum += scaled(coords[2 * i]) * scaled(coords[2 * j + 1]) - scaled(coords[2 * j]) * scaled(coords[2 * i + 1]);
  }
  return sum;
}
