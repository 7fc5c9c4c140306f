/**
 * Casting a ray along the road strip (road-strip.ts): from its quad, the ray leaves each convex
 * quad through exactly one edge; through a rung it enters the neighbouring quad, through a wall
 * face it has hit the wall. A ray that starts on the road therefore meets the first wall face it
 * reaches, whichever part of the lap that face belongs to, after visiting only the quads it
 * crosses. Gates between the rungs of a visited quad are tested on the way.
 *
 * Exit edge of a convex polygon: the edge A→B (interior on its left, counter-clockwise order)
 * is crossed outward where cross(B − A, P + tD − A) falls through 0, i.e. for cross(B − A, D) < 0
 * at t = −cross(B − A, P − A) / cross(B − A, D); the smallest such t is the exit (the classic
 * convex clipping of a line against half-planes: Cyrus & Beck, "Generalized two- and
 * three-dimensional clipping", Computers & Graphics 3(1) (1978) 23–28).
 *
 * Axes: x right, y up, metres.
 */
import type { RoadStrip } from './road-strip.js';

/** Gate segments grouped by the quad they lie in. */
export interface GateCells {
  /** Gates of quad j are first[j] .. first[j + 1] - 1 (n + 1 entries). */
  readonly first: Int32Array;
  /** [lx, ly, rx, ry] per gate, metres, ordered by quad. */
  readonly ends: Float64Array;
}

/** What a ray met: distances along it, metres (Infinity when nothing within its length). */
export interface RayHit {
  wallM: number;
  /** 1: the left wall face, -1: the right one, 0: none. */
  wallSide: number;
  gateM: number;
}

// edges of quad j: 0 right face, 1 front rung, 2 left face, 3 back rung
const NONE = -1;

/**
 * Casts one ray from a point inside quad `j` (or on its edge).
 *
 * @param strip the road
 * @param j the quad the ray starts in
 * @param px start, metres
 * @param py start, metres
 * @param dx unit direction
 * @param dy unit direction
 * @param lengthM ray length, metres
 * @param gates gate segments per quad, or null to ignore gates
 * @param out receives the hit (reused to avoid allocation)
 * @returns `out`
 */
export function castRay(strip: RoadStrip, j: number, px: number, py: number, dx: number, dy: number, lengthM: number, gates: GateCells | null, out: RayHit): RayHit {
  const { n, left: L, right: R } = strip;
  out.wallM = Infinity;
  out.wallSide = 0;
  out.gateM = Infinity;
  let entry = NONE;
  // corners of the current quad, carried to the next one across the rung the ray leaves by
  let k = j + 1 === n ? 0 : j + 1;
  let rjx = R[2 * j], rjy = R[2 * j + 1], ljx = L[2 * j], ljy = L[2 * j + 1];
  let rkx = R[2 * k], rky = R[2 * k + 1], lkx = L[2 * k], lky = L[2 * k + 1];
  for (let visited = 0; visited <= n; visited++) {
    if (gates !== null && out.gateM === Infinity) {
      for (let g = gates.first[j]; g < gates.first[j + 1]; g++) {
        const t = raySegment(px, py, dx, dy, gates.ends[4 * g], gates.ends[4 * g + 1], gates.ends[4 * g + 2], gates.ends[4 * g + 3]);
        if (t <= lengthM && t < out.gateM) out.gateM = t;
      }
    }
    // the edges counter-clockwise, the first smallest exit wins
    let best = Infinity, exit = NONE, t: number;
    if (entry !== 0 && (t = exitAlong(rjx, rjy, rkx, rky, px, py, dx, dy)) < best) (best = t), (exit = 0);
    if (entry !== 1 && (t = exitAlong(rkx, rky, lkx, lky, px, py, dx, dy)) < best) (best = t), (exit = 1);
    if (entry !== 2 && (t = exitAlong(lkx, lky, ljx, ljy, px, py, dx, dy)) < best) (best = t), (exit = 2);
    if (entry !== 3 && (t = exitAlong(ljx, ljy, rjx, rjy, px, py, dx, dy)) < best) (best = t), (exit = 3);
    if (exit === NONE || best > lengthM) return out;
    if (exit === 0 || exit === 2) {
      out.wallM = Math.max(0, best);
      out.wallSide = exit === 2 ? 1 : -1;
      if (out.gateM > out.wallM) out.gateM = Infinity;
      return out;
    }
    if (exit === 1) {
      j = k;
      k = j + 1 === n ? 0 : j + 1;
      (rjx = rkx), (rjy = rky), (ljx = lkx), (ljy = lky);
      (rkx = R[2 * k]), (rky = R[2 * k + 1]), (lkx = L[2 * k]), (lky = L[2 * k + 1]);
      entry = 3;
    } else {
      k = j;
      j = j === 0 ? n - 1 : j - 1;
      (rkx = rjx), (rky = rjy), (lkx = ljx), (lky = ljy);
      (rjx = R[2 * j]), (rjy = R[2 * j + 1]), (ljx = L[2 * j]), (ljy = L[2 * j + 1]);
      entry = 1;
    }
  }
  return out;
}

/**
 * Groups gate segments by quad: a gate at lap position s lies in quad floor(s / spacing), or in a
 * neighbour of it when the shipped spacing and positions are rounded, so each gate is listed in
 * that quad and the two beside it (a ray tests it in whichever it visits; castRay keeps the
 * nearest hit and drops one beyond the wall the ray stops at).
 * @param gates gates ordered by s, with ends on the wall faces
 */
export function gateCells(strip: RoadStrip, gates: readonly { readonly s: number; readonly left: readonly [number, number]; readonly right: readonly [number, number] }[]): GateCells {
  const { n, spacingM } = strip;
  const quadOf = gates.map((g) => Math.min(n - 1, Math.max(0, Math.floor(g.s / spacingM))));
  // the quads each gate is listed in: its own and its neighbours (distinct on laps of >= 3 quads)
  const near = (q: number) => [q === 0 ? n - 1 : q - 1, q, q + 1 === n ? 0 : q + 1];
  const first = new Int32Array(n + 1);
  for (const q of quadOf) for (const r of near(q)) first[r + 1]++;
  for (let j = 0; j < n; j++) first[j + 1] += first[j];
  const next = first.slice(0, n);
  const ends = new Float64Array(4 * first[n]);
  gates.forEach((g, i) => {
    for (const r of near(quadOf[i])) {
      const at = next[r]++;
      ends[4 * at] = g.left[0];
      ends[4 * at + 1] = g.left[1];
      ends[4 * at + 2] = g.right[0];
      ends[4 * at + 3] = g.right[1];
    }
  });
  return { first, ends };
}

// where the ray leaves across the edge A→B (interior on its left): the t of the crossing, or
// Infinity when the ray does not point outward across it
function exitAlong(ax: number, ay: number, bx: number, by: number, px: number, py: number, dx: number, dy: number): number {
  const ex = bx - ax, ey = by - ay;
  const den = ex * dy - ey * dx;
  if (!(den < 0)) return Infinity;
  return -(ex * (py - ay) - ey * (px - ax)) / den;
}

// distance along the ray (unit direction) to the segment A–B, Infinity when it misses
function raySegment(px: number, py: number, dx: number, dy: number, ax: number, ay: number, bx: number, by: number): number {
  const ex = bx - ax, ey = by - ay;
  const den = dx * ey - dy * ex;
  if (den === 0) return Infinity;
  const wx = ax - px, wy = ay - py;
  const t = (wx * ey - wy * ex) / den;
  const u = (wx * dy - wy * dx) / den;
  return t >= 0 && u >= 0 && u <= 1 ? t : Infinity;
}
