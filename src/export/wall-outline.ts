/**
 * The far side of a wall solid: the wall face (the side touching the road) offset by the wall
 * thickness away from the road, with the outward unit normal at every vertex. Shared by the
 * exporters that draw or build the wall solids (glb, svg).
 *
 * Axes (shared/DESIGN.md): x right, y up, counter-clockwise positive; the face polyline runs in
 * the direction of travel, so the left wall's solid lies on the left of it and the right wall's
 * on the right.
 *
 *        outer  o-----------o-----------o        (face + thicknessM · normal, mitred)
 *                    ^ normal
 *        face   *-----------*-----------*        (walls.left, direction of travel →)
 *               ~~~~~~~~~~ road ~~~~~~~~~~
 */
import type { Point } from '../core/index.js';

/** Which side of the road a wall stands on (left = the driver's left). */
export type WallSide = 'left' | 'right';

/** The outer polyline and outward normals of one wall, as flat [x0, y0, x1, y1, …] arrays. */
export interface WallOutline {
  /** Outer polyline, one vertex per face vertex, metres. */
  readonly outer: Float64Array;
  /** Outward unit normal (away from the road) at each face vertex. */
  readonly normals: Float64Array;
}

/** Consecutive face vertices closer than this are one vertex for the normal, metres (shorter chords give noise directions). */
const MIN_CHORD_M = 1e-9;
/**
 * Smallest cosine between a vertex normal and its segments' normals used for the mitre, so a
 * sharp kink cannot throw the outer vertex far out (a valid track turns < 10° per vertex).
 */
const MIN_MITRE_COS = 0.5;

/**
 * Offsets a closed wall face polyline by the wall thickness away from the road.
 * Each vertex moves along the bisector of its two segments' normals by thicknessM / cos(half
 * the turn), so both segments stay exactly thicknessM from the face.
 * @param face closed polyline of the wall face in travel order, first vertex not repeated
 * @param thicknessM wall thickness, metres
 * @param side 'left' for walls.left (solid on the left of travel), 'right' for walls.right
 * @throws RangeError when the face has fewer than 3 distinct vertices
 * @example wallOutline(track.walls.left, track.walls.thicknessM, 'left').outer
 */
export function wallOutline(face: readonly Point[], thicknessM: number, side: WallSide): WallOutline {
  const n = face.length;
  if (n < 3) throw new RangeError(`a closed wall face needs >= 3 vertices, got ${n}`);
  // left of the travel direction (dx, dy) is (-dy, dx); right is (dy, -dx)
  const sign = side === 'left' ? 1 : -1;
  const outer = new Float64Array(2 * n);
  const normals = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const [px, py] = face[i];
    const [ax, ay] = segmentNormal(face, distinctNeighbour(face, i, -1), i, sign);
    const [bx, by] = segmentNormal(face, i, distinctNeighbour(face, i, 1), sign);
    let nx = ax + bx;
    let ny = ay + by;
    const len = Math.hypot(nx, ny);
    // a full reversal has no bisector: keep the incoming segment's normal
    if (len < MIN_CHORD_M) {
      nx = ax;
      ny = ay;
    } else {
      nx /= len;
      ny /= len;
    }
    const mitre = thicknessM / Math.max(nx * ax + ny * ay, MIN_MITRE_COS);
    outer[2 * i] = px + mitre * nx;
    outer[2 * i + 1] = py + mitre * ny;
    normals[2 * i] = nx;
    normals[2 * i + 1] = ny;
  }
  return { outer, normals };
}

// the nearest vertex before (step -1) or after (step 1) vertex i that is not on top of it
function distinctNeighbour(face: readonly Point[], i: number, step: 1 | -1): number {
  const n = face.length;
  const [px, py] = face[i];
  for (let k = 1; k < n; k++) {
    const j = (((i + step * k) % n) + n) % n;
    if (Math.hypot(face[j][0] - px, face[j][1] - py) > MIN_CHORD_M) return j;
  }
  throw new RangeError('a closed wall face needs >= 2 distinct vertices, got 1');
}

// unit normal of the segment from vertex a to vertex b on the wall's outer side
function segmentNormal(face: readonly Point[], a: number, b: number, sign: number): [number, number] {
  const dx = face[b][0] - face[a][0];
  const dy = face[b][1] - face[a][1];
  const len = Math.hypot(dx, dy);
  // + 0 turns -0 into 0
  return [(-sign * dy) / len + 0, (sign * dx) / len + 0];
}
