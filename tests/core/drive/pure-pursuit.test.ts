// Tests for src/core/drive/pure-pursuit.ts: the pure pursuit steering law.

import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { pursuitCurvature, pursuitCurvatureTo, steerFor } from '../../../src/core/drive/pure-pursuit.js';

describe('pure pursuit', () => {
  it("Coulter's worked example: L = 5 m, l_d = 15 m, α = 60° steer 30.0°", () => {
    // R. C. Coulter, CMU-RI-TR-92-01 (1992): δ = atan(2 L sin α / l_d) = atan(2·5·sin 60° / 15) = 30.0°
    const delta = steerFor(pursuitCurvature(Math.PI / 3, 15), 5, Math.PI / 2);
    expect((delta * 180) / Math.PI).toBeCloseTo(30, 9);
  });

  it('the steering angle is clamped to the lock', () => {
    expect(steerFor(1, 2.5, 0.3)).toBe(0.3);
    expect(steerFor(-1, 2.5, 0.3)).toBe(-0.3);
  });

  test.prop([fc.double({ min: 2, max: 500, noNaN: true }), fc.double({ min: 0.01, max: 0.99, noNaN: true }), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), fc.boolean()])(
    'on a circle, with the car on it along its tangent and the goal point on it, γ = 2 sin α / l_d = 1/R exactly',
    (R, share, phi, clockwise) => {
      // Coulter (1992): the pursuit arc through the car tangent to its heading and through a goal
      // on the same circle is that circle; chord l_d = 2R sin(θ/2) for a goal θ further round
      const sign = clockwise ? -1 : 1;
      const theta = share * Math.PI;
      const ld = 2 * R * Math.sin(theta / 2);
      const x = R * Math.cos(phi), y = R * Math.sin(phi);
      const hx = -sign * Math.sin(phi), hy = sign * Math.cos(phi);
      const gx = R * Math.cos(phi + sign * theta), gy = R * Math.sin(phi + sign * theta);
      expect(Math.hypot(gx - x, gy - y)).toBeCloseTo(ld, 9);
      const gamma = pursuitCurvatureTo(x, y, hx, hy, gx, gy);
      expect(gamma * R).toBeCloseTo(sign, 9);
      // the same through the angle form: α is half the arc's turn θ
      expect(pursuitCurvature(sign * (theta / 2), ld) * R).toBeCloseTo(sign, 9);
    },
  );

  it('a goal on the left turns left, on the right turns right, straight ahead not at all', () => {
    expect(pursuitCurvatureTo(0, 0, 1, 0, 10, 1)).toBeGreaterThan(0);
    expect(pursuitCurvatureTo(0, 0, 1, 0, 10, -1)).toBeLessThan(0);
    expect(pursuitCurvatureTo(0, 0, 1, 0, 10, 0)).toBe(0);
    expect(pursuitCurvatureTo(1, 1, 1, 0, 1, 1)).toBe(0);
  });
});
