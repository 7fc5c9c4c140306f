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
      if (d < requiredM) return true;
    }
  }
  return false;
}
