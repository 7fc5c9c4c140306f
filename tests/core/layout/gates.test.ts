// Tests for src/core/layout/gates.ts: gates follow the spacing law and get denser in corners.

import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { placeGates, wantedGap } from '../../../src/core/layout/gates.js';
import { GATE_TURN_RAD } from '../../../src/core/rules.js';

function gaps(s: Float64Array, lap: number): number[] {
  const out: number[] = [];
  for (let k = 0; k < s.length; k++) out.push((k + 1 < s.length ? s[k + 1] : lap) - s[k]);
  return out;
}

describe('placeGates', () => {
  it('a straight loop section gets gates at the widest spacing; a lap length that divides evenly gives equal gaps', () => {
    const curvature = new Float64Array(1000); // 1000 m at 1 m, no bending
    const s = placeGates(curvature, 1, { min: 5, max: 25 })!;
    expect(s.length).toBe(40);
    for (const g of gaps(s, 1000)) expect(g).toBeCloseTo(25, 9);
  });

  it('a circle of radius 20 m: the law gives 20 · 10° = 3.49 m, clamped to min 5', () => {
    const curvature = new Float64Array(1257).fill(1 / 20);
    const s = placeGates(curvature, 1, { min: 5, max: 25 })!;
    for (const g of gaps(s, 1257)) expect(g).toBeGreaterThanOrEqual(5 - 1e-9);
    expect(s.length).toBe(251); // floor(1257 / 5)
    // radius 100 m: 100 · GATE_TURN_RAD = 17.45 m wanted, so ceil(1257 / 17.45) = 73 gates
    const wide = placeGates(new Float64Array(1257).fill(1 / 100), 1, { min: 5, max: 25 })!;
    expect(wide.length).toBe(Math.ceil(1257 / (100 * GATE_TURN_RAD)));
  });

  test.prop([fc.array(fc.double({ min: -0.2, max: 0.2, noNaN: true }), { minLength: 20, maxLength: 60 }), fc.double({ min: 1, max: 10, noNaN: true }), fc.double({ min: 10, max: 60, noNaN: true })])(
    'every gap lies in [min, max], starts at 0, and is no longer than the mean of the law over it',
    (knots, min, max) => {
      // a smooth-ish curvature profile: piecewise linear through the knots, 20 samples per knot
      const n = knots.length * 20;
      const curvature = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        const k = Math.floor(i / 20), t = (i % 20) / 20;
        curvature[i] = knots[k] * (1 - t) + knots[(k + 1) % knots.length] * t;
      }
      const s = placeGates(curvature, 1, { min, max });
      if (s === null) return;
      expect(s[0]).toBe(0);
      const g = gaps(s, n);
      for (let k = 0; k < s.length; k++) {
        expect(g[k]).toBeGreaterThanOrEqual(min - 1e-6);
        expect(g[k]).toBeLessThanOrEqual(max + 1e-6);
        // mean over the gap of the law, taken between samples as the mean of its two ends: the
        // generator's density is constant between samples, and a harmonic mean never exceeds an
        // arithmetic one
        const law = (x: number) => {
          const i = Math.floor(x);
          return (wantedGap(curvature[i % n], 1, min, max) + wantedGap(curvature[(i + 1) % n], 1, min, max)) / 2;
        };
        let integral = 0;
        const a = s[k], b = s[k] + g[k];
        const cuts = [a];
        for (let x = Math.floor(a) + 1; x < b; x++) cuts.push(x);
        cuts.push(b);
        for (let c = 0; c + 1 < cuts.length; c++) integral += law(cuts[c]) * (cuts[c + 1] - cuts[c]);
        // when the law asks for more gates than gaps of `min` fit, the count is capped and gaps
        // may reach lap / count (at most min · (1 + 1 / count))
        const capped = s.length === Math.floor(n / min + 1e-9) ? n / s.length : 0;
        expect(g[k]).toBeLessThanOrEqual(Math.max(integral / g[k], capped) + 1e-9);
      }
    },
  );
});
