import { segmentSegmentDistance } from '../geom/polyline.js';
import { localArcM } from '../validate/clearance.js';
import type { PlannedCorner } from './plan-types.js';

/**
 * How badly a planned lap overlaps itself, measured on its coarse outline: each corner drawn as
 * two chords (entry → middle → exit) and each straight as one segment. Pairs of segments far
 * apart along the lap (beyond the local arc of `localArcM`) that come closer than `requiredM`
 * add their shortfall. Zero means the outline keeps its distance; the traced lap is then checked
 * exactly. O(m²) in the 3n segments, which is cheap against tracing for n <= 80 corners.
 *
 * @param local per corner [mid x, mid y, end x, end y] from (0, 0) at heading 0 (cornerDisplacement)
 * @param straights straight after each corner, metres
 * @returns total shortfall, metres (0 = no overlap)
 */
export function macroOverlap(corners: readonly PlannedCorner[], local: Float64Array, straights: Float64Array, requiredM: number, minRadiusM: number, out?: Float64Array): number {
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
  let shortfall = 0;
  for (let a = 0; a < m; a++) {
    const a1 = a + 1 === m ? 0 : a + 1;
    for (let b = a + 2; b < m; b++) {
      if (a === 0 && b === m - 1) continue;
      // separation along the lap between the two pieces
      const gapFwd = s[b] - s[a + 1];
      const gapBack = lap - s[b + 1] + s[a];
      if (Math.min(gapFwd, gapBack) <= exempt) continue;
      const b1 = b + 1 === m ? 0 : b + 1;
      const d = segmentSegmentDistance(v[2 * a], v[2 * a + 1], v[2 * a1], v[2 * a1 + 1], v[2 * b], v[2 * b + 1], v[2 * b1], v[2 * b1 + 1]);
      if (d < requiredM) shortfall += requiredM - d;
    }
  }
  return shortfall;
}
