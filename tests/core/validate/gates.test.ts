import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import { GATE_TURN_RAD } from '../../../src/core/rules.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, mirrorTrack, stadiumTrack, type MutableTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();
const codes = (f: (t: MutableTrack) => void): string[] => {
  const t = cloneTrack(base);
  f(t);
  return codesOf(validateTrack(t as Track));
};
/** Position in the gate list of the first gate whose gap lies inside the right arc (s in [60, 185.7] m). */
const arcGate = base.gates.findIndex((g, k) => g.s > 60 && base.gates[k + 1].s < 185);

describe('gate order, spacing and density', () => {
  test('the fixture obeys the spacing law: 25 m on the straights, GATE_TURN_RAD·R on the arcs (scaled by c <= 1)', () => {
    const gap = base.gates[arcGate + 1].s - base.gates[arcGate].s;
    expect(gap).toBeLessThanOrEqual(GATE_TURN_RAD * 40 + 0.001);
    expect(gap).toBeGreaterThan(0.95 * GATE_TURN_RAD * 40);
  });

  test("two swapped gates are a 'gate_order' issue (spacing and density are then not judged)", () => {
    expect(codes((t) => { [t.gates[3], t.gates[4]] = [t.gates[4], t.gates[3]]; })).toEqual(['gate_order']);
  });

  test.each([
    ['gate 0 off the start line', (t: MutableTrack) => { t.gates[0] = { ...t.gates[0], s: 0.001 }; }],
    ['a wrong index', (t: MutableTrack) => { t.gates[5].index = 6; }],
    ['a gate beyond the lap', (t: MutableTrack) => { t.gates[t.gates.length - 1].s = t.centerline.lengthM; }],
  ])("%s is a 'gate_order' issue", (_, f) => {
    expect(codes(f)).toContain('gate_order');
  });

  test("a minimum spacing above the arcs' gaps is a 'gate_spacing' issue", () => {
    expect(codes((t) => { t.params.gateSpacingM.min = 8; })).toEqual(['gate_spacing']);
  });

  test("a maximum spacing below the straights' gaps is reported as spacing and density", () => {
    expect(codes((t) => { t.params.gateSpacingM.max = 20; })).toEqual(['gate_density', 'gate_spacing']);
  });

  test('the wrap-around gap (last gate to the start line) counts', () => {
    const t = cloneTrack(base);
    const last = t.gates.length - 1;
    // drop the last gate: the wrap-around gap on the bottom straight grows past 25 m
    t.gates.pop();
    t.metrics.gateCount = last;
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['gate_density', 'gate_spacing']);
    expect(r.issues.find((i) => i.code === 'gate_spacing')!.message).toContain('to the start line');
  });

  test("a gate missing in a corner is a 'gate_density' issue", () => {
    const r = validateTrack(
      (() => {
        const t = cloneTrack(base);
        t.gates.splice(arcGate + 1, 1);
        t.gates.forEach((g, k) => { g.index = k; });
        return t as Track;
      })(),
    );
    // the gap doubles to ~13.8 m: inside [5, 25] m, but the law wants ~7 m on the arc
    expect(codesOf(r)).toEqual(['gate_density']);
    expect(r.issues[0]).toMatchObject({ at: { index: arcGate } });
    expect(r.issues[0].limit!).toBeCloseTo(1.01 * GATE_TURN_RAD * 40, 1);
  });

  test('the mirrored track keeps its gates valid', () => {
    expect(validateTrack(mirrorTrack(base)).issues).toEqual([]);
  });
});
