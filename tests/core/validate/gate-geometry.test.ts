import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, stadiumTrack, type MutableTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();
const codes = (f: (t: MutableTrack) => void): string[] => {
  const t = cloneTrack(base);
  f(t);
  return codesOf(validateTrack(t as Track));
};
const k = 10; // a gate on the right arc

describe('gate ends, forward and crossings', () => {
  test("a left end moved 5 mm off the wall face (along the gate) is a 'gate_endpoint' issue", () => {
    const t = cloneTrack(base);
    const g = t.gates[k];
    const dx = g.left[0] - g.right[0], dy = g.left[1] - g.right[1], len = Math.hypot(dx, dy);
    g.left = [g.left[0] + (0.005 * dx) / len, g.left[1] + (0.005 * dy) / len];
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['gate_endpoint']);
    expect(r.issues[0]).toMatchObject({ at: { index: k }, limit: 0.002 });
    // 5 mm, give or take the end's own 1 mm rounding
    expect(Math.abs(r.issues[0].actual! - 0.005)).toBeLessThan(0.001);
    expect(r.issues[0].message).toContain('left end is');
  });

  test('a gate moved 5 mm along the road misses the centerline point at its s', () => {
    const r = codes((t) => {
      const g = t.gates[1]; // on the bottom straight, travel along +x
      g.left = [g.left[0] + 0.005, g.left[1]];
      g.right = [g.right[0] + 0.005, g.right[1]];
    });
    expect(r).toEqual(['gate_endpoint']);
  });

  test.each([
    ['reversed', (f: [number, number]) => [-f[0], -f[1]]],
    ['turned by 1°', (f: [number, number]) => [f[0] * Math.cos(0.01745) - f[1] * Math.sin(0.01745), f[0] * Math.sin(0.01745) + f[1] * Math.cos(0.01745)]],
    ['not unit length', (f: [number, number]) => [f[0] * 1.001, f[1] * 1.001]],
  ])("a forward vector %s is a 'gate_forward' issue", (_, turn) => {
    expect(codes((t) => { t.gates[k].forward = turn([...t.gates[k].forward]) as [number, number]; })).toEqual(['gate_forward']);
  });

  test("two gates whose right ends are swapped cross: 'gate_crossing'", () => {
    const r = codes((t) => { [t.gates[k].right, t.gates[k + 1].right] = [t.gates[k + 1].right, t.gates[k].right]; });
    // the swapped ends also leave their own gate's stretch of face, and forward no longer fits
    expect(r).toContain('gate_crossing');
  });

  test('a duplicated gate crosses its original', () => {
    const r = codes((t) => {
      t.gates[k + 1] = { ...t.gates[k], index: k + 1, s: t.gates[k + 1].s };
    });
    expect(r).toContain('gate_crossing');
  });
});
