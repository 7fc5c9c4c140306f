/**
 * The car's footprint on the road: a lengthM × widthM rectangle centred midway between the axles,
 * its long side along the heading, and its smallest distance to the wall faces (road-strip.ts).
 *
 * The distance between a convex polygon and a polyline that do not meet is attained at a vertex
 * of one of them against an edge of the other, so two families of tests give it exactly:
 * - each corner of the rectangle against the face segment of the quad it lies in (a corner off
 *   the road has a negative distance: the footprint crosses the wall);
 * - each wall face vertex near the car against the rectangle (a vertex inside it is a crossing
 *   too: on the inside of a tight corner the wall can bulge between two corners of the car).
 * A wall segment that cuts the rectangle with both ends outside it leaves a corner beyond the
 * face, so the first family catches that crossing.
 *
 * Axes: x right, y up, metres; the heading is a unit vector.
 */
import { leftFaceDistance, locateQuad, rightFaceDistance, type RoadStrip } from './road-strip.js';

/** Size of the car and where its rear axle sits, metres. */
export interface FootprintSpec {
  readonly lengthM: number;
  readonly widthM: number;
  readonly wheelbaseM: number;
}

/** Where the car is: rear axle's centre, metres, and unit heading vector. */
export interface Pose {
  readonly x: number;
  readonly y: number;
  readonly hx: number;
  readonly hy: number;
}

/** Closest approach of the footprint to a wall at one pose (reused between calls). */
export interface FootprintClearance {
  /** Smallest distance to a wall face, metres; negative when the footprint crosses it. */
  marginM: number;
  /** 1: the left wall is the closest, -1: the right one. */
  side: number;
  /** Quad of the footprint's centre (a hint for the next pose); -1 when it could not be located. */
  quad: number;
  /** Whether the wall vertices were tested (marginM is then exact). */
  exact: boolean;
}

/** Which wall vertices a clearance test looks at (see footprintClearance). */
export interface VertexReach {
  readonly window: number;
  bulgeM: number;
  floorM: number;
}

/**
 * Distance from the footprint at a pose to the nearest wall face.
 *
 * @param strip the road
 * @param spec footprint and wheelbase
 * @param pose the rear axle's centre (x, y), metres, and the unit heading vector (hx, hy)
 * @param hint a quad near the car (the last pose's `quad`)
 * @param reach which wall vertices to test against the rectangle, and when: `window` vertices
 *   either side of the centre's quad (enough to span half the car's diagonal along the tightest
 *   face); skipped when the corners keep more than `floorM + bulgeM` from the walls, where
 *   `bulgeM` bounds how far a face can bulge into the rectangle between two of its corners
 * @param out receives the answer: the exact margin, or, when the vertices were skipped, the
 *   corners' margin (the exact one then lies in [marginM - bulgeM, marginM], above floorM)
 * @returns `out`
 */
export function footprintClearance(strip: RoadStrip, spec: FootprintSpec, pose: Pose, hint: number, reach: VertexReach, out: FootprintClearance): FootprintClearance {
  const x = pose.x, y = pose.y, ux = pose.hx, uy = pose.hy;
  const halfL = spec.lengthM / 2, halfW = spec.widthM / 2;
  const cx = x + (spec.wheelbaseM / 2) * ux, cy = y + (spec.wheelbaseM / 2) * uy;
  const centre = locateQuad(strip, cx, cy, hint);
  out.quad = centre;
  out.marginM = Infinity;
  out.side = 0;
  out.exact = true;
  if (centre < 0) {
    out.marginM = -Infinity;
    return out;
  }
  const n = strip.n;
  // the smallest margin so far and its wall, kept in locals (written to `out` on return)
  let margin = Infinity, side = 0;
  // the front and rear corners lie about half a length ahead of and behind the centre
  const shift = Math.min(n >> 2, Math.round(halfL / strip.spacingM));
  for (let c = 0; c < 4; c++) {
    const a = c & 1 ? halfL : -halfL, b = c & 2 ? halfW : -halfW;
    const px = cx + a * ux - b * uy, py = cy + a * uy + b * ux;
    const h = c & 1 ? centre + shift : centre - shift;
    const j = locateQuad(strip, px, py, h >= n ? h - n : h < 0 ? h + n : h);
    if (j < 0) {
      out.marginM = -Infinity;
      out.side = b > 0 ? 1 : -1;
      return out;
    }
    const dl = leftFaceDistance(strip, j, px, py);
    if (dl < margin) (margin = dl), (side = 1);
    const dr = rightFaceDistance(strip, j, px, py);
    if (dr < margin) (margin = dr), (side = -1);
  }
  if (margin - reach.bulgeM > reach.floorM) {
    out.marginM = margin;
    out.side = side;
    out.exact = false;
    return out;
  }
  // wall vertices inside the rectangle lower the margin by their depth; of those outside, the
  // squared distances are compared and one square root taken at the end (the same answer:
  // sqrt is monotonic)
  const window = reach.window;
  const L = strip.left, R = strip.right;
  let outside2 = Infinity, outsideSide = 0;
  let i = (((centre - window) % n) + n) % n;
  for (let w = -window; w <= window + 1; w++) {
    for (let faceSide = 1; faceSide >= -1; faceSide -= 2) {
      const face = faceSide > 0 ? L : R;
      const dx = face[2 * i] - cx, dy = face[2 * i + 1] - cy;
      const ox = Math.abs(dx * ux + dy * uy) - halfL;
      const oy = Math.abs(dy * ux - dx * uy) - halfW;
      if (ox < 0 && oy < 0) {
        const depth = ox > oy ? ox : oy;
        if (depth < margin) (margin = depth), (side = faceSide);
      } else {
        const px = ox > 0 ? ox : 0, py = oy > 0 ? oy : 0;
        const d2 = px * px + py * py;
        if (d2 < outside2) (outside2 = d2), (outsideSide = faceSide);
      }
    }
    i = i + 1 === n ? 0 : i + 1;
  }
  const d = Math.sqrt(outside2);
  if (d < margin) (margin = d), (side = outsideSide);
  out.marginM = margin;
  out.side = side;
  return out;
}
