import { segmentSegmentDistance } from '../geom/polyline.js';
import { localArcM } from '../validate/clearance.js';
import type { PlannedCorner } from './plan-types.js';

/**
 * Whether a planned lap overlaps itself, judged on its coarse outline: each corner drawn as two
 * chords (entry → middle → exit) and each straight as one segment. Two segments far apart along
 * the lap (beyond the local arc of `localArcM`) that come closer than `requiredM` overlap. When
 * the outline keeps its distance, the traced lap is then checked exactly.
 *
 * @param local per corner [mid x, mid y, end x, end y] from (0, 0) at heading 0 (cornerDisplacement)
 * @param straights straight after each corner, metres
 * @returns true at the first pair that comes too close
 */
export function macroOverlap(corners: readonly PlannedCorner[], local: Float64Array, straights: Float64Array, requiredM: number, minRadiusM: number, out?: Float64Array): boolean {
  return macroCollision(corners, local, straights, requiredM, minRadiusM, out) !== null;
}

/**
 * The pair of outline pieces that come too close, as found by {@link macroOverlap}. Pieces are
 * numbered along the lap: 3i and 3i + 1 are corner i's chords, 3i + 2 the straight after it.
 */
export interface MacroCollision {
  /** The earlier piece along the lap (a < b). */
  readonly a: number;
  readonly b: number;
  /** Where on each piece the two come closest, 0 at its start and 1 at its end. */
  readonly ta: number;
  readonly tb: number;
  /** Unit vector from the closest point of a to that of b: b moving along it, relative to a, parts them (for crossing pieces, b's normal, see closestPair). */
  readonly nx: number;
  readonly ny: number;
  /** Distance between the pieces; for crossing pieces minus how far a's nearer end reaches across b's line. */
  readonly distanceM: number;
}

/**
 * Like {@link macroOverlap}, but returns the first pair that comes too close and where (null
 * when the outline keeps its distance), so that the planner can push the pair apart.
 */
export function macroCollision(corners: readonly PlannedCorner[], local: Float64Array, straights: Float64Array, requiredM: number, minRadiusM: number, out?: Float64Array): MacroCollision | null {
  const n = corners.length;
  const m = 3 * n;
  const v = out ?? new Float64Array(2 * m);
  const s = new Float64Array(m + 1);
  let x = 0, y = 0, h = 0, pos = 0;
  for (let i = 0; i < n; i++) {
    const c = Math.cos(h), sn = Math.sin(h);
    const k = 3 * i;
    v[2 * k] = x;
    v[2 * k + 1] = y;
    s[k] = pos;
    v[2 * k + 2] = x + c * local[4 * i] - sn * local[4 * i + 1];
    v[2 * k + 3] = y + sn * local[4 * i] + c * local[4 * i + 1];
    s[k + 1] = pos + corners[i].lengthM / 2;
    const ex = x + c * local[4 * i + 2] - sn * local[4 * i + 3];
    const ey = y + sn * local[4 * i + 2] + c * local[4 * i + 3];
    v[2 * k + 4] = ex;
    v[2 * k + 5] = ey;
    s[k + 2] = pos + corners[i].lengthM;
    h += corners[i].sign * corners[i].angleRad;
    pos += corners[i].lengthM + straights[i];
    x = ex + straights[i] * Math.cos(h);
    y = ey + straights[i] * Math.sin(h);
  }
  s[m] = pos;
  const lap = pos;
  const exempt = localArcM(requiredM, minRadiusM);
  // sweep and prune: segments sorted by their box's left edge, each compared only with those
  // whose boxes come within requiredM; the first shortfall ends the search
  const box = new Float64Array(4 * m);
  const order = new Array<number>(m);
  for (let a = 0; a < m; a++) {
    const a1 = a + 1 === m ? 0 : a + 1;
    box[4 * a] = Math.min(v[2 * a], v[2 * a1]);
    box[4 * a + 1] = Math.min(v[2 * a + 1], v[2 * a1 + 1]);
    box[4 * a + 2] = Math.max(v[2 * a], v[2 * a1]);
    box[4 * a + 3] = Math.max(v[2 * a + 1], v[2 * a1 + 1]);
    order[a] = a;
  }
  order.sort((x, y) => box[4 * x] - box[4 * y]);
  for (let ia = 0; ia < m; ia++) {
    const a = order[ia];
    const reachX = box[4 * a + 2] + requiredM;
    for (let ib = ia + 1; ib < m; ib++) {
      const b = order[ib];
      if (box[4 * b] > reachX) break;
      if (box[4 * b + 1] > box[4 * a + 3] + requiredM || box[4 * a + 1] > box[4 * b + 3] + requiredM) continue;
      const lo = a < b ? a : b, hi = a < b ? b : a;
      if (hi - lo < 2 || (lo === 0 && hi === m - 1)) continue;
      // separation along the lap between the two pieces
      if (Math.min(s[hi] - s[lo + 1], lap - s[hi + 1] + s[lo]) <= exempt) continue;
      const a1 = a + 1 === m ? 0 : a + 1, b1 = b + 1 === m ? 0 : b + 1;
      const d = segmentSegmentDistance(v[2 * a], v[2 * a + 1], v[2 * a1], v[2 * a1 + 1], v[2 * b], v[2 * b + 1], v[2 * b1], v[2 * b1 + 1]);
      if (d < requiredM) return closestPair(v, lo, hi, m, d);
    }
  }
  return null;
}

/**
 * Where outline pieces lo < hi (vertices in `v`, piece k from vertex k to k + 1, cyclic) come
 * closest: the nearest of the four endpoint-to-segment feet, or, when they cross, the crossing
 * with the direction that pushes lo's nearer end back across hi's line and how far it reaches.
 */
function closestPair(v: Float64Array, lo: number, hi: number, m: number, distanceM: number): MacroCollision {
  const lo1 = lo + 1 === m ? 0 : lo + 1, hi1 = hi + 1 === m ? 0 : hi + 1;
  const ax = v[2 * lo], ay = v[2 * lo + 1], bx = v[2 * lo1], by = v[2 * lo1 + 1];
  const cx = v[2 * hi], cy = v[2 * hi + 1], dx = v[2 * hi1], dy = v[2 * hi1 + 1];
  if (distanceM === 0) {
    // crossing: normal of hi, on the side of lo's end nearer to hi's line (moving that end back
    // across undoes the crossing)
    const ex = dx - cx, ey = dy - cy;
    const len = Math.hypot(ex, ey) || 1;
    let nx = -ey / len, ny = ex / len;
    const sa = (ax - cx) * nx + (ay - cy) * ny, sb = (bx - cx) * nx + (by - cy) * ny;
    // n is turned so that lo's nearer end lies on its positive side: moving lo along -n (b's
    // point minus a's point growing along n) takes that end back across
    const near = Math.abs(sa) < Math.abs(sb) ? sa : sb;
    if (near < 0) (nx = -nx), (ny = -ny);
    // the crossing's place on each: lo's ends sit at sa and sb from hi's line
    const ta = sa === sb ? 0.5 : sa / (sa - sb);
    const x = ax + ta * (bx - ax), y = ay + ta * (by - ay);
    const tb = foot(x, y, cx, cy, dx, dy);
    return { a: lo, b: hi, ta, tb, nx, ny, distanceM: -Math.abs(near) };
  }
  let best = Infinity, ta = 0, tb = 0, px = 0, py = 0, qx = 0, qy = 0;
  const consider = (t: number, u: number) => {
    const x1 = ax + t * (bx - ax), y1 = ay + t * (by - ay);
    const x2 = cx + u * (dx - cx), y2 = cy + u * (dy - cy);
    const dd = Math.hypot(x2 - x1, y2 - y1);
    if (dd < best) (best = dd), (ta = t), (tb = u), (px = x1), (py = y1), (qx = x2), (qy = y2);
  };
  consider(0, foot(ax, ay, cx, cy, dx, dy));
  consider(1, foot(bx, by, cx, cy, dx, dy));
  consider(foot(cx, cy, ax, ay, bx, by), 0);
  consider(foot(dx, dy, ax, ay, bx, by), 1);
  const len = Math.hypot(qx - px, qy - py);
  if (len === 0) return { a: lo, b: hi, ta, tb, nx: 0, ny: 0, distanceM };
  return { a: lo, b: hi, ta, tb, nx: (qx - px) / len, ny: (qy - py) / len, distanceM };
}

// parameter of the point of segment [a, b] nearest to p
function foot(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const ex = bx - ax, ey = by - ay;
  const len2 = ex * ex + ey * ey;
  return len2 === 0 ? 0 : Math.min(1, Math.max(0, ((px - ax) * ex + (py - ay) * ey) / len2));
}
