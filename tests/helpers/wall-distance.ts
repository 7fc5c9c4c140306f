// Brute-force references for the drive's geometry, independent of the road strip: distances and
// ray hits against every wall face segment of a track, O(n) per query, plain floating point.

import type { Point, Track } from '../../src/core/track.js';

type Seg = [number, number, number, number];

/** Every segment of both closed wall faces, and of the gates. */
export function wallSegments(track: Track): { walls: Seg[]; gates: Seg[] } {
  const walls: Seg[] = [];
  for (const face of [track.walls.left, track.walls.right]) {
    for (let i = 0; i < face.length; i++) {
      const a = face[i], b = face[(i + 1) % face.length];
      walls.push([a[0], a[1], b[0], b[1]]);
    }
  }
  return { walls, gates: track.gates.map((g) => [g.left[0], g.left[1], g.right[0], g.right[1]]) };
}

/** Distance from a point to a segment (elementary geometry). */
export function pointSegment(px: number, py: number, s: Seg): number {
  const [ax, ay, bx, by] = s;
  const dx = bx - ax, dy = by - ay;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / len2));
  return Math.hypot(px - ax - t * dx, py - ay - t * dy);
}

/** Nearest hit of a ray (unit direction) on any of the segments, Infinity when none. */
export function rayHit(px: number, py: number, dx: number, dy: number, segs: readonly Seg[]): number {
  let best = Infinity;
  for (const [ax, ay, bx, by] of segs) {
    const ex = bx - ax, ey = by - ay;
    const den = dx * ey - dy * ex;
    if (den === 0) continue;
    const wx = ax - px, wy = ay - py;
    const t = (wx * ey - wy * ex) / den, u = (wx * dy - wy * dx) / den;
    if (t >= 0 && u >= 0 && u <= 1 && t < best) best = t;
  }
  return best;
}

/** Corners of a length × width rectangle centred at (cx, cy) along unit (ux, uy), counter-clockwise. */
export function rectangle(cx: number, cy: number, ux: number, uy: number, length: number, width: number): Point[] {
  const a = length / 2, b = width / 2;
  return [[-a, -b], [a, -b], [a, b], [-a, b]].map(([p, q]) => [cx + p * ux - q * uy, cy + p * uy + q * ux] as Point);
}

/**
 * Distance between a rectangle and the wall segments: 0 when they touch or cross (any segment
 * crossing a rectangle edge, or a wall vertex inside), else the smallest vertex-to-segment
 * distance either way (the distance of two disjoint polygonal sets is attained at a vertex).
 */
export function rectangleToWalls(corners: readonly Point[], segs: readonly Seg[]): number {
  const edges: Seg[] = corners.map((c, i) => [c[0], c[1], corners[(i + 1) % 4][0], corners[(i + 1) % 4][1]]);
  let best = Infinity;
  for (const s of segs) {
    for (const e of edges) if (segmentsCross(s, e)) return 0;
    if (insideConvex(s[0], s[1], corners)) return 0;
    for (const c of corners) best = Math.min(best, pointSegment(c[0], c[1], s));
    for (const e of edges) best = Math.min(best, pointSegment(s[0], s[1], e), pointSegment(s[2], s[3], e));
  }
  return best;
}

function cross(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

function segmentsCross(p: Seg, q: Seg): boolean {
  const d1 = cross(q[0], q[1], q[2], q[3], p[0], p[1]), d2 = cross(q[0], q[1], q[2], q[3], p[2], p[3]);
  const d3 = cross(p[0], p[1], p[2], p[3], q[0], q[1]), d4 = cross(p[0], p[1], p[2], p[3], q[2], q[3]);
  return d1 * d2 < 0 && d3 * d4 < 0;
}

function insideConvex(x: number, y: number, corners: readonly Point[]): boolean {
  for (let i = 0; i < 4; i++) {
    const a = corners[i], b = corners[(i + 1) % 4];
    if (cross(a[0], a[1], b[0], b[1], x, y) <= 0) return false;
  }
  return true;
}
