import { ROUNDING_M, WALL_OFFSET_TOL_M } from '../rules.js';
import type { TrackParams } from '../params/types.js';
import type { TrackGeometry } from './geometry.js';
import { MAX_ISSUES_PER_RULE, num, worstOfRuns, type IssueSink } from './issue-sink.js';

/**
 * Rule 'width': the road width halfWidthLeftM + halfWidthRightM stays in params.widthM (widened
 * by two roundings), and the geometry agrees with it: each wall vertex lies its half width from
 * its centerline point (within WALL_OFFSET_TOL_M) on its own side, left of the local direction
 * of travel for the left wall. One issue per run of offending points, at the worst one.
 */
export function checkWidths(g: TrackGeometry, params: TrackParams, sink: IssueSink): void {
  const { n, center: c, left: l, right: r, halfLeftM: hl, halfRightM: hr } = g;
  const lo = params.widthM.min - 2 * ROUNDING_M;
  const hi = params.widthM.max + 2 * ROUNDING_M;
  const range = new Float64Array(n);
  const offset = new Float64Array(n);
  const side = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const w = hl[i] + hr[i];
    range[i] = Math.max(lo - w, w - hi);
    const x = c[2 * i], y = c[2 * i + 1];
    const dl = Math.sqrt((l[2 * i] - x) ** 2 + (l[2 * i + 1] - y) ** 2);
    const dr = Math.sqrt((r[2 * i] - x) ** 2 + (r[2 * i + 1] - y) ** 2);
    offset[i] = Math.max(Math.abs(dl - hl[i]), Math.abs(dr - hr[i])) - WALL_OFFSET_TOL_M;
    // local direction of travel: the chord through both neighbours
    const a = i === 0 ? n - 1 : i - 1, b = i + 1 === n ? 0 : i + 1;
    const tx = c[2 * b] - c[2 * a], ty = c[2 * b + 1] - c[2 * a + 1];
    const crossL = tx * (l[2 * i + 1] - y) - ty * (l[2 * i] - x);
    const crossR = tx * (r[2 * i + 1] - y) - ty * (r[2 * i] - x);
    side[i] = crossL > 0 && crossR < 0 ? 0 : 1;
  }
  for (const i of worstOfRuns(range, MAX_ISSUES_PER_RULE)) {
    const w = hl[i] + hr[i];
    const limit = w < lo ? params.widthM.min : params.widthM.max;
    sink.add({
      code: 'width',
      at: { s: num(g.s[i]), index: i },
      limit,
      actual: num(w),
      message: `road width ${num(w)} m ${w < lo ? '<' : '>'} ${limit} m at s=${num(g.s[i])} m`,
    });
  }
  for (const i of worstOfRuns(offset, MAX_ISSUES_PER_RULE)) {
    const x = c[2 * i], y = c[2 * i + 1];
    const dl = Math.sqrt((l[2 * i] - x) ** 2 + (l[2 * i + 1] - y) ** 2);
    const dr = Math.sqrt((r[2 * i] - x) ** 2 + (r[2 * i + 1] - y) ** 2);
    const isLeft = Math.abs(dl - hl[i]) >= Math.abs(dr - hr[i]);
    const [d, h] = isLeft ? [dl, hl[i]] : [dr, hr[i]];
    sink.add({
      code: 'width',
      at: { s: num(g.s[i]), index: i },
      limit: WALL_OFFSET_TOL_M,
      actual: num(Math.abs(d - h), 6),
      message: `${isLeft ? 'left' : 'right'} wall is ${num(d)} m from the centerline, half width says ${num(h)} m (tolerance ${WALL_OFFSET_TOL_M * 1000} mm) at s=${num(g.s[i])} m`,
    });
  }
  for (const i of worstOfRuns(side, MAX_ISSUES_PER_RULE)) {
    sink.add({
      code: 'width',
      at: { s: num(g.s[i]), index: i },
      message: `walls are on the wrong side of the centerline (left wall must lie left of the direction of travel) at s=${num(g.s[i])} m`,
    });
  }
}
