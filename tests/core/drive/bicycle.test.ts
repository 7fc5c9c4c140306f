// Tests for src/core/drive/bicycle.ts: the kinematic bicycle model at the rear axle.

import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { stepBicycle, turningRadiusM, type BicycleState } from '../../../src/core/drive/bicycle.js';

describe('turningRadiusM', () => {
  it('R = L / tan δ: wheelbase 2.7 m at 35° turns on 3.856 m', () => {
    // kinematic bicycle, rear-axle reference (Kong, Pfeiffer, Schildbach, Borrelli, IEEE IV 2015):
    // R = 2.7 / tan(35°) = 3.8560 m (shared/REFERENCES.md, computed)
    expect(turningRadiusM(2.7, (35 * Math.PI) / 180)).toBeCloseTo(3.856, 3);
  });
});

describe('stepBicycle', () => {
  it('at a fixed steering angle the rear axle stays on the circle R = L / tan δ and closes it after 2πR', () => {
    // same model: a constant front wheel angle δ gives path curvature tan δ / L
    const L = 2.7, delta = (35 * Math.PI) / 180, R = turningRadiusM(L, delta);
    const v = 5, dt = 0.02;
    const s: BicycleState = { x: 0, y: 0, hx: 1, hy: 0, speedMps: v };
    const steps = Math.round((2 * Math.PI * R) / (v * dt));
    for (let k = 0; k < steps; k++) {
      stepBicycle(s, { curvature: Math.tan(delta) / L, accelMps2: 0 }, dt);
      // centre of the circle at (0, R): turning left from the origin heading +x
      expect(Math.hypot(s.x, s.y - R)).toBeCloseTo(R, 9);
    }
    // after steps·v·dt metres (within one step of a full turn) the car is back near the start
    expect(Math.hypot(s.x, s.y)).toBeLessThan(v * dt);
  });

  it('a straight: s = v0·t + a·t²/2 and v = v0 + a·t, for any step size', () => {
    // constant acceleration along a line (classical kinematics)
    for (const dt of [0.02, 0.1, 0.5]) {
      const s: BicycleState = { x: 0, y: 0, hx: 1, hy: 0, speedMps: 12 };
      const a = 3.5, steps = Math.round(4 / dt), t = steps * dt;
      for (let k = 0; k < steps; k++) stepBicycle(s, { curvature: 0, accelMps2: a }, dt);
      expect(s.x).toBeCloseTo(12 * t + (a * t * t) / 2, 9);
      expect(s.speedMps).toBeCloseTo(12 + a * t, 9);
      expect(s.y).toBe(0);
    }
  });

  it('braking stops the car at v0² / 2|a| and never reverses it', () => {
    // stopping distance under constant deceleration (classical kinematics)
    const s: BicycleState = { x: 0, y: 0, hx: 0, hy: 1, speedMps: 20 };
    for (let k = 0; k < 300; k++) stepBicycle(s, { curvature: 0, accelMps2: -8 }, 0.02);
    expect(s.speedMps).toBe(0);
    expect(s.y).toBeCloseTo((20 * 20) / (2 * 8), 9);
  });

  // curvature 0, or |κ| >= 1e-3 where the closed form below does not cancel catastrophically
  const curvatures = fc.oneof(fc.constant(0), fc.double({ min: 1e-3, max: 0.5, noNaN: true }), fc.double({ min: -0.5, max: -1e-3, noNaN: true }));
  test.prop([curvatures, fc.double({ min: 0.1, max: 60, noNaN: true }), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true })])(
    'one step is the exact arc: the same pose as the closed form with Math.sin and Math.cos',
    (curvature, v, heading) => {
      const dt = 0.02;
      const s: BicycleState = { x: 3, y: -2, hx: Math.cos(heading), hy: Math.sin(heading), speedMps: v };
      stepBicycle(s, { curvature, accelMps2: 0 }, dt);
      const d = v * dt, turn = curvature * d;
      // arc of curvature κ and length d from the pose (elementary geometry)
      const x = curvature === 0 ? 3 + d * Math.cos(heading) : 3 + (Math.sin(heading + turn) - Math.sin(heading)) / curvature;
      const y = curvature === 0 ? -2 + d * Math.sin(heading) : -2 - (Math.cos(heading + turn) - Math.cos(heading)) / curvature;
      expect(s.x).toBeCloseTo(x, 9);
      expect(s.y).toBeCloseTo(y, 9);
      expect(Math.atan2(s.hy, s.hx)).toBeCloseTo(Math.atan2(Math.sin(heading + turn), Math.cos(heading + turn)), 9);
      expect(Math.hypot(s.hx, s.hy)).toBeCloseTo(1, 14);
    },
  );
});
