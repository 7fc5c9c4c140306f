import { SPAWN_ALIGN_TOL_DEG, SPAWN_LINE_GAP_M, SPAWN_LINE_SLACK_M } from '../rules.js';
import type { TrackParams } from '../params/types.js';
import type { Gate, Spawn } from '../track.js';
import type { TrackGeometry } from './geometry.js';
import { wrapAngle } from './geometry.js';
import { num, type IssueSink } from './issue-sink.js';
import { headingAt } from './measure.js';
import { buildRoadRing } from './road-ring.js';

const DEG = 180 / Math.PI;

/**
 * Spawn rules (shared/DESIGN.md guarantee 6) on the car footprint: a params.car.lengthM ×
 * params.car.widthM rectangle centred on the position, long side along headingDeg.
 *
 * 'spawn_outside': every footprint corner lies strictly inside the road ring.
 * 'spawn_ahead': every corner lies at least SPAWN_LINE_GAP_M (less SPAWN_LINE_SLACK_M) behind
 * the start line (gate 0, along its forward), and s is in the second half of the lap.
 * 'spawn_alignment': headingDeg follows the centerline's direction at s within SPAWN_ALIGN_TOL_DEG.
 * 'spawn_overlap': no two footprints overlap (separating-axis test; touching is not overlap).
 */
export function checkSpawns(g: TrackGeometry, spawns: readonly Spawn[], start: Gate, params: TrackParams, sink: IssueSink): void {
  if (spawns.length === 0) return;
  const halfL = params.car.lengthM / 2, halfW = params.car.widthM / 2;
  const m = spawns.length;
  // footprint frame per spawn: centre, unit heading u; v = u turned left
  const frame = new Float64Array(4 * m);
  for (let k = 0; k < m; k++) {
    const h = spawns[k].headingDeg / DEG;
    frame[4 * k] = spawns[k].position[0];
    frame[4 * k + 1] = spawns[k].position[1];
    frame[4 * k + 2] = Math.cos(h);
    frame[4 * k + 3] = Math.sin(h);
  }
  const ring = buildRoadRing(g, 4 * m);
  const midX = (start.left[0] + start.right[0]) / 2, midY = (start.left[1] + start.right[1]) / 2;
  const fx = start.forward[0], fy = start.forward[1];
  const lineGap = SPAWN_LINE_GAP_M - SPAWN_LINE_SLACK_M;
  for (let k = 0; k < m; k++) {
    const sp = spawns[k];
    const at = { s: num(sp.s), index: k, x: sp.position[0], y: sp.position[1] };
    const cx = frame[4 * k], cy = frame[4 * k + 1], ux = frame[4 * k + 2], uy = frame[4 * k + 3];
    let outside = 0;
    let ahead = -Infinity;
    for (let c = 0; c < 4; c++) {
      const a = c & 1 ? halfL : -halfL, b = c & 2 ? halfW : -halfW;
      const x = cx + a * ux - b * uy, y = cy + a * uy + b * ux;
      if (!ring.contains(x, y)) outside++;
      ahead = Math.max(ahead, (x - midX) * fx + (y - midY) * fy);
    }
    if (outside > 0) {
      sink.add({ code: 'spawn_outside', at, message: `spawn ${k}: ${outside} of 4 footprint corners are not strictly inside the road at s=${num(sp.s)} m` });
    }
    if (ahead > -lineGap) {
      sink.add({
        code: 'spawn_ahead',
        at,
        limit: -SPAWN_LINE_GAP_M,
        actual: num(ahead),
        message: `spawn ${k}: footprint reaches ${num(ahead)} m past the start line, must stay ${SPAWN_LINE_GAP_M} m behind it`,
      });
    }
    if (!(sp.s > g.lapM / 2)) {
      sink.add({ code: 'spawn_ahead', at, message: `spawn ${k}: s=${num(sp.s)} m must lie in the lap's second half (behind the start line, s > ${num(g.lapM / 2)} m)` });
    }
    const off = wrapAngle(sp.headingDeg / DEG - headingAt(g, sp.s)) * DEG;
    if (!(Math.abs(off) <= SPAWN_ALIGN_TOL_DEG)) {
      sink.add({
        code: 'spawn_alignment',
        at,
        limit: SPAWN_ALIGN_TOL_DEG,
        actual: num(Math.abs(off)),
        message: `spawn ${k}: heading is ${num(Math.abs(off))}° off the track's direction at s=${num(sp.s)} m, tolerance ${SPAWN_ALIGN_TOL_DEG}°`,
      });
    }
  }
  checkOverlaps(spawns, frame, halfL, halfW, sink);
}

/** Sweep by x over bounding circles (O(m log m + pairs)), then the separating-axis test. */
function checkOverlaps(spawns: readonly Spawn[], frame: Float64Array, halfL: number, halfW: number, sink: IssueSink): void {
  const m = spawns.length;
  const reach = 2 * Math.sqrt(halfL * halfL + halfW * halfW);
  const order = Array.from({ length: m }, (_, k) => k).sort((a, b) => frame[4 * a] - frame[4 * b] || a - b);
  for (let p = 0; p < m && !sink.full('spawn_overlap'); p++) {
    const i = order[p];
    for (let q = p + 1; q < m && frame[4 * order[q]] - frame[4 * i] < reach; q++) {
      const j = order[q];
      if (!rectanglesOverlap(frame, i, j, halfL, halfW)) continue;
      const [a, b] = i < j ? [i, j] : [j, i];
      sink.add({
        code: 'spawn_overlap',
        at: { s: num(spawns[a].s), index: a },
        message: `spawns ${a} (s=${num(spawns[a].s)} m) and ${b} (s=${num(spawns[b].s)} m) overlap`,
      });
    }
  }
}

/** Whether two equal oriented rectangles share interior points: no axis of either separates them. */
function rectanglesOverlap(frame: Float64Array, i: number, j: number, halfL: number, halfW: number): boolean {
  const dx = frame[4 * j] - frame[4 * i], dy = frame[4 * j + 1] - frame[4 * i + 1];
  for (const k of [i, j]) {
    const ux = frame[4 * k + 2], uy = frame[4 * k + 3];
    // axes u and v = (-uy, ux) of rectangle k
    for (let axis = 0; axis < 2; axis++) {
      const wx = axis === 0 ? ux : -uy, wy = axis === 0 ? uy : ux;
      let r = 0;
      for (const o of [i, j]) {
        const ox = frame[4 * o + 2], oy = frame[4 * o + 3];
        r += halfL * Math.abs(ox * wx + oy * wy) + halfW * Math.abs(-oy * wx + ox * wy);
      }
      if (Math.abs(dx * wx + dy * wy) >= r) return false;
    }
  }
  return true;
}
