// Tests for src/core/drive/speed-profile.ts: the friction-limited speed profile of a closed lap.

import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { speedProfile, STANDARD_GRAVITY_MPS2 as g } from '../../../src/core/drive/speed-profile.js';

/** Curvature samples of a stadium: straights of `straightM`, half circles of radius `radiusM`, every `spacingM`. */
function stadiumCurvature(straightM: number, radiusM: number, spacingM: number): { curvature: Float64Array; spacing: number } {
  const arc = Math.PI * radiusM;
  const lap = 2 * straightM + 2 * arc;
  const n = Math.round(lap / spacingM);
  const spacing = lap / n;
  const curvature = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = (i + 0.5) * spacing;
    const inArc = (s > straightM && s < straightM + arc) || s > 2 * straightM + arc;
    curvature[i] = inArc ? 1 / radiusM : 0;
  }
  return { curvature, spacing };
}

const grippy = (mu: number, top = 200) => ({ mu, maxAccelMps2: 100, maxBrakeMps2: 100, topSpeedMps: top });

describe('speedProfile: reference values', () => {
  it('a constant-radius arc: v = sqrt(mu·g·R) at every point', () => {
    // cornering at the grip limit: m v² / R = mu m g (shared/REFERENCES.md, friction-limited speed)
    for (const [R, mu] of [[50, 1], [15, 0.9], [200, 0.45]]) {
      const n = 400;
      const p = speedProfile(new Float64Array(n).fill(1 / R), (2 * Math.PI * R) / n, grippy(mu));
      for (const v of p.speedMps) expect(v).toBeCloseTo(Math.sqrt(mu * g * R), 9);
      expect(p.brakingTimeS).toBe(0);
    }
  });

  it('a circle R = 50 m, mu = 1: lap 2π·sqrt(R / (mu·g)) = 14.1875 s', () => {
    // Kapania, Subosits & Gerdes (2016) method on a circle; closed form (shared/REFERENCES.md, computed)
    const R = 50;
    const p = speedProfile(new Float64Array(1000).fill(-1 / R), (2 * Math.PI * R) / 1000, grippy(1));
    expect(2 * Math.PI * Math.sqrt(R / g)).toBeCloseTo(14.1875, 4);
    expect(p.lapTimeS).toBeCloseTo(14.1875, 3);
    expect(p.averageSpeedMps).toBeCloseTo(Math.sqrt(g * R), 9);
  });

  it('stadium (straights 200 m, half circles R = 50 m, mu = 1, a = μg both ways): corner 22.1435, peak 49.5143, lap 25.3516 s within 1%', () => {
    // forward/backward passes by hand (shared/REFERENCES.md, computed): corner v_c = sqrt(g R);
    // half a straight accelerating at g from v_c: v_p² = v_c² + 2 g · 100; each half straight takes
    // (v_p − v_c) / g; lap = 2πR / v_c + 4 (v_p − v_c) / g
    const R = 50, straight = 200;
    const vc = Math.sqrt(g * R);
    const vp = Math.sqrt(vc * vc + 2 * g * (straight / 2));
    const lap = (2 * Math.PI * R) / vc + (4 * (vp - vc)) / g;
    expect(vc).toBeCloseTo(22.1435, 4);
    expect(vp).toBeCloseTo(49.5143, 4);
    expect(lap).toBeCloseTo(25.3516, 4);
    const { curvature, spacing } = stadiumCurvature(straight, R, 0.5);
    const p = speedProfile(curvature, spacing, { mu: 1, maxAccelMps2: g, maxBrakeMps2: g, topSpeedMps: 200 });
    expect(Math.abs(p.minSpeedMps / 22.1435 - 1)).toBeLessThan(0.01);
    expect(Math.abs(p.maxSpeedMps / 49.5143 - 1)).toBeLessThan(0.01);
    expect(Math.abs(p.lapTimeS / 25.3516 - 1)).toBeLessThan(0.01);
    // half of each straight is braking: 2 × 2 × (v_p − v_c) / g
    expect(Math.abs(p.brakingTimeS / ((2 * (vp - vc)) / g) - 1)).toBeLessThan(0.02);
  });

  it('a straight after a corner: s = v0·t + a·t²/2 until braking begins', () => {
    // constant acceleration from the corner speed v0 (classical kinematics)
    const R = 20, straight = 600, a = 3;
    const { curvature, spacing } = stadiumCurvature(straight, R, 1);
    const p = speedProfile(curvature, spacing, { mu: 1, maxAccelMps2: a, maxBrakeMps2: 9, topSpeedMps: 200 });
    // the last point of the first half circle: the car leaves it at the corner speed
    const exit = p.speedMps.findIndex((v, i) => i > 0 && curvature[i + 1] === 0 && curvature[i] !== 0 && i * spacing > straight);
    const v0 = p.speedMps[exit];
    expect(v0).toBeCloseTo(Math.sqrt(g * R), 6);
    for (const k of [10, 50, 150]) {
      const t = p.timeS[exit + k] - p.timeS[exit];
      expect(v0 * t + (a * t * t) / 2).toBeCloseTo(k * spacing, 6);
      expect(p.speedMps[exit + k]).toBeCloseTo(v0 + a * t, 6);
    }
  });

  it('the top speed caps every point', () => {
    const { curvature, spacing } = stadiumCurvature(1000, 60, 1);
    const p = speedProfile(curvature, spacing, { mu: 1.2, maxAccelMps2: 8, maxBrakeMps2: 9, topSpeedMps: 40 });
    expect(p.maxSpeedMps).toBe(40);
    for (const v of p.speedMps) expect(v).toBeLessThanOrEqual(40);
  });

  it('guards: fewer than 2 points or non-positive limits are programmer errors', () => {
    expect(() => speedProfile([0.1], 1, grippy(1))).toThrow(RangeError);
    expect(() => speedProfile([0.1, 0.1], 0, grippy(1))).toThrow(RangeError);
    expect(() => speedProfile([0.1, 0.1], 1, grippy(0))).toThrow(RangeError);
  });
});

describe('speedProfile: properties', () => {
  const curvatures = fc.array(fc.double({ min: -0.2, max: 0.2, noNaN: true }), { minLength: 3, maxLength: 300 });
  const limits = fc.record({
    mu: fc.double({ min: 0.1, max: 2, noNaN: true }),
    maxAccelMps2: fc.double({ min: 0.5, max: 20, noNaN: true }),
    maxBrakeMps2: fc.double({ min: 0.5, max: 30, noNaN: true }),
    topSpeedMps: fc.double({ min: 5, max: 120, noNaN: true }),
  });

  test.prop([curvatures, limits, fc.double({ min: 1, max: 3, noNaN: true })])('more friction never makes the lap slower', (k, lim, factor) => {
    const slow = speedProfile(k, 1, lim);
    const fast = speedProfile(k, 1, { ...lim, mu: Math.min(3, lim.mu * factor) });
    expect(fast.lapTimeS).toBeLessThanOrEqual(slow.lapTimeS * (1 + 1e-12));
    for (let i = 0; i < k.length; i++) expect(fast.speedMps[i]).toBeGreaterThanOrEqual(slow.speedMps[i] * (1 - 1e-12));
  });

  test.prop([curvatures, limits, fc.array(fc.double({ min: 1, max: 4, noNaN: true }), { minLength: 300, maxLength: 300 })])(
    'tightening the path anywhere never makes the lap faster',
    (k, lim, factors) => {
      const tighter = k.map((x, i) => x * factors[i]);
      expect(speedProfile(tighter, 1, lim).lapTimeS).toBeGreaterThanOrEqual(speedProfile(k, 1, lim).lapTimeS * (1 - 1e-12));
    },
  );

  test.prop([curvatures, limits])('every speed keeps the grip cap, the top speed and the acceleration and braking limits', (k, lim) => {
    const p = speedProfile(k, 1, lim);
    const grip = lim.mu * g;
    const up = 2 * Math.min(lim.maxAccelMps2, grip), down = 2 * Math.min(lim.maxBrakeMps2, grip);
    const n = k.length;
    for (let i = 0; i < n; i++) {
      const v = p.speedMps[i], next = p.speedMps[(i + 1) % n];
      expect(v).toBeLessThanOrEqual(lim.topSpeedMps * (1 + 1e-12));
      expect(v * v * Math.abs(k[i])).toBeLessThanOrEqual(grip * (1 + 1e-9));
      expect(next * next - v * v).toBeLessThanOrEqual(up * (1 + 1e-9) + 1e-9);
      expect(v * v - next * next).toBeLessThanOrEqual(down * (1 + 1e-9) + 1e-9);
    }
  });
});
