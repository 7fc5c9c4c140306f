import { pointSegmentDistance } from '../geom/polyline.js';
import { segmentsIntersect } from '../geom/segment-intersect.js';
import { GATE_ENDPOINT_TOL_M, GATE_FORWARD_PERP_TOL, GATE_FORWARD_UNIT_TOL } from '../rules.js';
import { SegmentIndex } from '../spatial/segment-index.js';
import type { Gate } from '../track.js';
import type { TrackGeometry } from './geometry.js';
import { num, type IssueSink } from './issue-sink.js';
import { pointAt, tangentAt } from './measure.js';

/**
 * Face segments searched on each side of the gate's own centerline segment for its ends: the
 * gate end sits on the face segment paired with that centerline segment; one more each way
 * absorbs a gate that lies exactly on a vertex.
 */
const GATE_FACE_WINDOW = 2;

/** The endpoint distances of a gate, in the order checked: what is off, and from what. */
const ENDPOINT_CHECKS = [
  ['left end is', 'from the left wall face'],
  ['right end is', 'from the right wall face'],
  ['gate passes', 'from the centerline point at its s'],
] as const;

type GateAt = { readonly s: number; readonly index: number };

/**
 * Rules 'gate_endpoint', 'gate_forward' and 'gate_crossing' (shared/DESIGN.md guarantee 5).
 *
 * Endpoint: `left` lies within GATE_ENDPOINT_TOL_M of the left face and `right` of the right
 * face (searched near the centerline segment holding the gate's s), and the gate passes within
 * GATE_ENDPOINT_TOL_M of the centerline point at s.
 * Forward: unit length within GATE_FORWARD_UNIT_TOL, perpendicular to left − right within
 * GATE_FORWARD_PERP_TOL of its length, and pointing the way of travel.
 * Crossing: no two gates share a point (exact, grid broad phase).
 */
export function checkGateGeometry(g: TrackGeometry, gates: readonly Gate[], sink: IssueSink): void {
  const p = new Float64Array(2);
  const tangent = new Float64Array(2);
  for (let k = 0; k < gates.length; k++) {
    const gate = gates[k];
    const lx = gate.left[0], ly = gate.left[1];
    const rx = gate.right[0], ry = gate.right[1];
    // the issues of one gate share this; made only when one is reported (num formats the number)
    let at: GateAt | undefined;
    const i = pointAt(g, gate.s, p);
    if (!sink.full('gate_endpoint')) {
      const dl = faceDistance(g.left, g.n, i, lx, ly);
      const dr = faceDistance(g.right, g.n, i, rx, ry);
      const dc = pointSegmentDistance(p[0], p[1], lx, ly, rx, ry);
      for (let c = 0; c < ENDPOINT_CHECKS.length; c++) {
        const d = c === 0 ? dl : c === 1 ? dr : dc;
        if (d <= GATE_ENDPOINT_TOL_M) continue;
        const [what, from] = ENDPOINT_CHECKS[c];
        sink.add({
          code: 'gate_endpoint',
          at: (at ??= { s: num(gate.s), index: k }),
          limit: GATE_ENDPOINT_TOL_M,
          actual: num(d, 6),
          message: `gate ${k}: ${what} ${num(d * 1000, 2)} mm ${from} (tolerance ${GATE_ENDPOINT_TOL_M * 1000} mm) at s=${num(gate.s)} m`,
        });
      }
    }
    if (!sink.full('gate_forward')) {
      const fx = gate.forward[0], fy = gate.forward[1];
      const norm = Math.sqrt(fx * fx + fy * fy);
      const wx = lx - rx, wy = ly - ry;
      const width = Math.sqrt(wx * wx + wy * wy);
      tangentAt(g, gate.s, tangent);
      let problem = '';
      if (!(Math.abs(norm - 1) <= GATE_FORWARD_UNIT_TOL)) problem = `forward has length ${num(norm, 6)}, must be 1 within ${GATE_FORWARD_UNIT_TOL}`;
      else if (!(Math.abs(fx * wx + fy * wy) <= GATE_FORWARD_PERP_TOL * width)) {
        problem = `forward is not perpendicular to the gate (cosine ${num((fx * wx + fy * wy) / width, 6)}, tolerance ${GATE_FORWARD_PERP_TOL})`;
      } else if (!(fx * tangent[0] + fy * tangent[1] > 0)) problem = 'forward points against the direction of travel';
      if (problem) sink.add({ code: 'gate_forward', at: (at ??= { s: num(gate.s), index: k }), message: `gate ${k}: ${problem} at s=${num(gate.s)} m` });
    }
  }
  checkGateCrossings(gates, sink);
}

/** Least distance from (x, y) to the closed face polyline's segments i − W … i + W (cyclic). */
function faceDistance(face: Float64Array, n: number, i: number, x: number, y: number): number {
  let best = Infinity;
  for (let d = -GATE_FACE_WINDOW; d <= GATE_FACE_WINDOW; d++) {
    const a = (((i + d) % n) + n) % n;
    const b = a + 1 === n ? 0 : a + 1;
    const dist = pointSegmentDistance(x, y, face[2 * a], face[2 * a + 1], face[2 * b], face[2 * b + 1]);
    if (dist < best) best = dist;
  }
  return best;
}

function checkGateCrossings(gates: readonly Gate[], sink: IssueSink): void {
  const index = new SegmentIndex(gates.length);
  for (const gate of gates) index.add(gate.left[0], gate.left[1], gate.right[0], gate.right[1]);
  index.finish();
  const found = new Int32Array(gates.length);
  for (let k = 0; k < gates.length && !sink.full('gate_crossing'); k++) {
    const a = gates[k];
    const ax = a.left[0], ay = a.left[1];
    const bx = a.right[0], by = a.right[1];
    const count = index.searchInto(Math.min(ax, bx), Math.min(ay, by), Math.max(ax, bx), Math.max(ay, by), found);
    for (let c = 0; c < count; c++) {
      const j = found[c];
      if (j <= k) continue;
      const b = gates[j];
      if (!segmentsIntersect(ax, ay, bx, by, b.left[0], b.left[1], b.right[0], b.right[1])) continue;
      sink.add({
        code: 'gate_crossing',
        at: { s: num(a.s), index: k },
        message: `gates ${k} (s=${num(a.s)} m) and ${j} (s=${num(b.s)} m) cross`,
      });
    }
  }
}
