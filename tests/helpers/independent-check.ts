// A second, simpler check of generated tracks, written apart from src/core/validate: brute-force
// O(n²) segment tests with plain floating-point orientation, and textbook measures of length,
// turning and radius. For small tracks only (a 600 m lap is ~1.5 M segment pairs).

import type { Track } from '../../src/core/track.js';

type Pts = readonly (readonly [number, number])[];

function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

// proper or touching intersection of closed segments ab and cd (plain doubles; fine away from degeneracy)
function touch(a: readonly number[], b: readonly number[], c: readonly number[], d: readonly number[]): boolean {
  const d1 = orient(c[0], c[1], d[0], d[1], a[0], a[1]);
  const d2 = orient(c[0], c[1], d[0], d[1], b[0], b[1]);
  const d3 = orient(a[0], a[1], b[0], b[1], c[0], c[1]);
  const d4 = orient(a[0], a[1], b[0], b[1], d[0], d[1]);
  return d1 * d2 <= 0 && d3 * d4 <= 0 && Math.min(a[0], b[0]) <= Math.max(c[0], d[0]) && Math.min(c[0], d[0]) <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= Math.max(c[1], d[1]) && Math.min(c[1], d[1]) <= Math.max(a[1], b[1]);
}

/** Pairs (i, j) of touching segments of closed polylines p and q (neighbours of one polyline excluded). */
export function bruteForceCrossings(p: Pts, q: Pts, same: boolean, limit = 5): [number, number][] {
  const out: [number, number][] = [];
  const n = p.length, m = q.length;
  for (let i = 0; i < n; i++) {
    const a = p[i], b = p[(i + 1) % n];
    for (let j = same ? i + 2 : 0; j < m; j++) {
      if (same && i === 0 && j === n - 1) continue;
      if (touch(a, b, q[j], q[(j + 1) % m])) {
        out.push([i, j]);
        if (out.length >= limit) return out;
      }
    }
  }
  return out;
}

/** Perimeter of a closed polyline. */
export function perimeter(p: Pts): number {
  let sum = 0;
  for (let i = 0; i < p.length; i++) {
    const a = p[i], b = p[(i + 1) % p.length];
    sum += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return sum;
}

/** Signed and absolute turning of a closed polyline, taking every k-th vertex, degrees. */
export function turning(p: Pts, k: number): { net: number; total: number } {
  const q = p.filter((_, i) => i % k === 0);
  let net = 0, total = 0;
  for (let i = 0; i < q.length; i++) {
    const a = q[(i + q.length - 1) % q.length], b = q[i], c = q[(i + 1) % q.length];
    const t = Math.atan2(orient(a[0], a[1], b[0], b[1], c[0], c[1]), (b[0] - a[0]) * (c[0] - b[0]) + (b[1] - a[1]) * (c[1] - b[1]));
    net += t;
    total += Math.abs(t);
  }
  return { net: (net * 180) / Math.PI, total: (total * 180) / Math.PI };
}

/** Smallest radius of the circle through vertices i − k, i, i + k (circumradius, abc / 4·area). */
export function smallestCircumradius(p: Pts, k: number): number {
  let best = Infinity;
  const n = p.length;
  for (let i = 0; i < n; i++) {
    const a = p[(i - k + n) % n], b = p[i], c = p[(i + k) % n];
    const area2 = Math.abs(orient(a[0], a[1], b[0], b[1], c[0], c[1]));
    if (area2 === 0) continue;
    const r = (Math.hypot(b[0] - a[0], b[1] - a[1]) * Math.hypot(c[0] - b[0], c[1] - b[1]) * Math.hypot(c[0] - a[0], c[1] - a[1])) / (2 * area2);
    best = Math.min(best, r);
  }
  return best;
}

/** Everything the brute-force check finds wrong with a track (empty when it agrees it is valid). */
export function independentProblems(t: Track): string[] {
  const out: string[] = [];
  const c = t.centerline.points, l = t.walls.left, r = t.walls.right;
  for (const [name, p, q, same] of [
    ['centerline', c, c, true],
    ['left wall', l, l, true],
    ['right wall', r, r, true],
    ['walls', l, r, false],
    ['left wall/centerline', l, c, false],
    ['right wall/centerline', r, c, false],
  ] as const) {
    const x = bruteForceCrossings(p, q, same);
    if (x.length > 0) out.push(`${name} crossing at segments ${JSON.stringify(x[0])}`);
  }
  return out;
}
