import { GATE_DENSITY_TOL, GATE_TURN_RAD, ROUNDING_M } from '../rules.js';
import type { TrackParams } from '../params/types.js';
import type { Gate } from '../track.js';
import type { TrackGeometry } from './geometry.js';
import { num, type IssueSink } from './issue-sink.js';
import { lapPosition, segmentAt } from './measure.js';

/**
 * Rules 'gate_order', 'gate_spacing' and 'gate_density' (shared/DESIGN.md guarantee 5).
 *
 * Order: gates[k].index === k, gate 0 at s = 0, s strictly increasing and below the lap length.
 * Spacing: every gap, the wrap-around one (lap length − last s) included, lies in
 * params.gateSpacingM widened by two roundings.
 * Density: the spacing law wants a gap of clamp(GATE_TURN_RAD / |κ|, min, max) where the road
 * turns; the generator places gates at equal integrals c <= 1 of 1 / law, so a gap is c times
 * the harmonic mean of the law over it, which never exceeds the arithmetic mean. Hence every gap
 * <= (1 + GATE_DENSITY_TOL) × the mean of the law over it, the law taken linear between shipped
 * points. Spacing and density are skipped when the order is broken (gaps would be meaningless).
 */
export function checkGateSpacing(g: TrackGeometry, gates: readonly Gate[], params: TrackParams, sink: IssueSink): void {
  if (!checkOrder(g, gates, sink)) return;
  const lo = params.gateSpacingM.min - 2 * ROUNDING_M;
  const hi = params.gateSpacingM.max + 2 * ROUNDING_M;
  const law = lawIntegral(g, params);
  for (let k = 0; k < gates.length; k++) {
    const sa = gates[k].s;
    const sb = k + 1 < gates.length ? gates[k + 1].s : g.lapM;
    const gap = sb - sa;
    const next = k + 1 < gates.length ? `gate ${k + 1}` : 'the start line';
    if ((gap < lo || gap > hi) && !sink.full('gate_spacing')) {
      const limit = gap < lo ? params.gateSpacingM.min : params.gateSpacingM.max;
      sink.add({
        code: 'gate_spacing',
        at: { s: num(sa), index: k },
        limit,
        actual: num(gap),
        message: `gap ${num(gap)} m from gate ${k} (s=${num(sa)} m) to ${next} is ${gap < lo ? 'below' : 'above'} ${limit} m`,
      });
    }
    const mean = (integralTo(g, law, sb) - integralTo(g, law, sa)) / gap;
    const limit = (1 + GATE_DENSITY_TOL) * mean;
    if (gap > limit && !sink.full('gate_density')) {
      sink.add({
        code: 'gate_density',
        at: { s: num(sa), index: k },
        limit: num(limit),
        actual: num(gap),
        message: `gap ${num(gap)} m from gate ${k} (s=${num(sa)} m) to ${next} exceeds ${num(limit)} m, the spacing law's mean ${num(mean)} m there + ${GATE_DENSITY_TOL * 100}%`,
      });
    }
  }
}

function checkOrder(g: TrackGeometry, gates: readonly Gate[], sink: IssueSink): boolean {
  let ok = true;
  const fail = (k: number, message: string): void => {
    ok = false;
    sink.add({ code: 'gate_order', at: { s: num(gates[k].s), index: k }, message });
  };
  if (gates[0].s !== 0) fail(0, `gate 0 is the start line and must sit at s=0, not s=${num(gates[0].s)} m`);
  for (let k = 0; k < gates.length && !sink.full('gate_order'); k++) {
    if (gates[k].index !== k) fail(k, `gate at position ${k} has index ${gates[k].index}`);
    if (k > 0 && !(gates[k].s > gates[k - 1].s)) fail(k, `gate ${k} at s=${num(gates[k].s)} m does not come after gate ${k - 1} at s=${num(gates[k - 1].s)} m`);
    if (!(gates[k].s < g.lapM)) fail(k, `gate ${k} at s=${num(gates[k].s)} m is beyond the lap length ${num(g.lapM)} m`);
  }
  return ok;
}

/** The spacing law at every point (index n repeats point 0 at s = lapM) and its running integral, m and m². */
interface LawIntegral {
  readonly law: Float64Array;
  readonly integral: Float64Array;
}

function lawIntegral(g: TrackGeometry, params: TrackParams): LawIntegral {
  const { n } = g;
  const { min, max } = params.gateSpacingM;
  const law = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const a = Math.abs(g.curvature[i]);
    const want = a > 0 ? GATE_TURN_RAD / a : max;
    law[i] = want < min ? min : want > max ? max : want;
  }
  law[n] = law[0];
  const integral = new Float64Array(n + 1);
  for (let i = 1; i <= n; i++) integral[i] = integral[i - 1] + 0.5 * (law[i - 1] + law[i]) * (g.s[i] - g.s[i - 1]);
  return { law, integral };
}

/** ∫ law ds from 0 to s (s in [0, lapM]), the law linear between points. */
function integralTo(g: TrackGeometry, { law, integral }: LawIntegral, s: number): number {
  if (s >= g.lapM) return integral[g.n];
  const i = segmentAt(g, s);
  const span = g.s[i + 1] - g.s[i];
  const ds = lapPosition(g, s) - g.s[i];
  const at = law[i] + (span > 0 ? (ds / span) * (law[i + 1] - law[i]) : 0);
  return integral[i] + 0.5 * (law[i] + at) * ds;
}
