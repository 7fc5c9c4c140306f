/**
 * The road as a closed strip of quadrilaterals: quad j has the right wall face's vertices j, j+1
 * and the left one's j+1, j (counter-clockwise), and the rungs R_j–L_j join the two faces at every
 * centerline point. Wall vertex j is the offset of centerline point j (walls.ts), so the quads
 * tile the road exactly, and each is convex where the radius exceeds the half width (a
 * guarantee of every valid track).
 *
 *      L_j ◀──────── L_j+1        left face (road on its right)
 *       │    quad j    ▲          rungs: R_j → L_j, R_j+1 → L_j+1
 *       ▼              │
 *      R_j ────────▶ R_j+1        right face (road on its left); travel →
 *
 * Locating a point is a walk across rungs from a nearby quad, so a car or a ray that moves a
 * little costs O(1). On a valid track the nearest wall face of a point on the road is that of
 * its own stretch of road: parts of the lap far apart keep their wall solids `clearanceM` apart
 * (guarantee 4), so a point between its own two faces is on the road.
 *
 * Axes: x right, y up, metres; the left face is on the driver's left.
 */
import type { Track } from '../track.js';

/** The strip of one track: flat wall face coordinates and inverse face segment lengths. */
export interface RoadStrip {
  /** Number of quads (= centerline points = vertices per wall face). */
  readonly n: number;
  /** Left and right wall faces, [x0, y0, x1, y1, …], metres. */
  readonly left: Float64Array;
  readonly right: Float64Array;
  /** Centerline points, [x0, y0, …], metres, and the gap between them along the lap. */
  readonly center: Float64Array;
  readonly spacingM: number;
  /** 1 / length of face segment j (from vertex j to j+1), 1/m. */
  readonly invLeft: Float64Array;
  readonly invRight: Float64Array;
}

/** Rungs a locating walk may cross before it gives up (the point is then far off the road). */
export const MAX_WALK_STEPS = 64;

/**
 * Builds the strip of a track from its shipped wall faces and centerline.
 * @throws RangeError when the faces and the centerline have different vertex counts
 */
export function buildRoadStrip(track: Pick<Track, 'centerline' | 'walls'>): RoadStrip {
  const n = track.centerline.points.length;
  if (track.walls.left.length !== n || track.walls.right.length !== n) {
    throw new RangeError(`wall faces need one vertex per centerline point (${n}), got ${track.walls.left.length} and ${track.walls.right.length}`);
  }
  const left = flat(track.walls.left), right = flat(track.walls.right), center = flat(track.centerline.points);
  return { n, left, right, center, spacingM: track.centerline.spacingM, invLeft: inverseLengths(left), invRight: inverseLengths(right) };
}

/**
 * The quad holding a point: the j with the point on or ahead of rung j and behind rung j + 1,
 * found by walking across rungs from `hint`.
 *
 * @param strip the road
 * @param x point, metres
 * @param y point, metres
 * @param hint a quad near the point (the last answer for a moving point)
 * @returns the quad index, or -1 when the walk does not settle within MAX_WALK_STEPS rungs
 */
export function locateQuad(strip: RoadStrip, x: number, y: number, hint: number): number {
  const { n, left: L, right: R } = strip;
  let j = hint;
  for (let step = 0; step < MAX_WALK_STEPS; step++) {
    const k = j + 1 === n ? 0 : j + 1;
    if (rungSide(L, R, k, x, y) < 0) {
      j = k;
      continue;
    }
    if (rungSide(L, R, j, x, y) > 0) {
      j = j === 0 ? n - 1 : j - 1;
      continue;
    }
    return j;
  }
  return -1;
}

/**
 * Signed distance from a point to the left wall face segment of quad j (the line through its
 * vertices j and j + 1), metres: positive on the road side.
 */
export function leftFaceDistance(strip: RoadStrip, j: number, x: number, y: number): number {
  const k = j + 1 === strip.n ? 0 : j + 1;
  const L = strip.left;
  const ax = L[2 * j], ay = L[2 * j + 1];
  // road on the right of the face's direction of travel
  return ((x - ax) * (L[2 * k + 1] - ay) - (y - ay) * (L[2 * k] - ax)) * strip.invLeft[j];
}

/** Signed distance from a point to the right wall face segment of quad j, metres: positive on the road side. */
export function rightFaceDistance(strip: RoadStrip, j: number, x: number, y: number): number {
  const k = j + 1 === strip.n ? 0 : j + 1;
  const R = strip.right;
  const ax = R[2 * j], ay = R[2 * j + 1];
  // road on the left of the face's direction of travel
  return ((R[2 * k] - ax) * (y - ay) - (R[2 * k + 1] - ay) * (x - ax)) * strip.invRight[j];
}

/**
 * Which side of rung j (the line from R_j to L_j) a point lies on: negative ahead of it (in the
 * direction of travel), positive behind, 0 on it. Not normalized.
 */
export function rungSide(L: Float64Array, R: Float64Array, j: number, x: number, y: number): number {
  const rx = R[2 * j], ry = R[2 * j + 1];
  return (L[2 * j] - rx) * (y - ry) - (L[2 * j + 1] - ry) * (x - rx);
}

function flat(points: readonly (readonly [number, number])[]): Float64Array {
  const out = new Float64Array(2 * points.length);
  for (let i = 0; i < points.length; i++) {
    out[2 * i] = points[i][0];
    out[2 * i + 1] = points[i][1];
  }
  return out;
}

function inverseLengths(face: Float64Array): Float64Array {
  const n = face.length >> 1;
  const inv = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const k = j + 1 === n ? 0 : j + 1;
    const dx = face[2 * k] - face[2 * j], dy = face[2 * k + 1] - face[2 * j + 1];
    inv[j] = 1 / Math.sqrt(dx * dx + dy * dy);
  }
  return inv;
}
