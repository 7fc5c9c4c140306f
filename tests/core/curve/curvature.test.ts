// Tests for src/core/curve/curvature.ts.

import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import {
  circumCurvature,
  curvatureFromDerivatives,
  discreteCurvatureClosed,
} from '../../../src/core/curve/curvature.js';
import { circleControl } from '../../helpers/curve-fixtures.js';

const EPS = 2 ** -52;

describe('curvatureFromDerivatives', () => {
  it('circle (R cos t, R sin t): 1/R counter-clockwise, −1/R clockwise (do Carmo 1976)', () => {
    for (const R of [0.5, 10, 2000]) {
      for (const t of [0, 0.7, 2, 4.5]) {
        const [dx, dy, ddx, ddy] = [-R * Math.sin(t), R * Math.cos(t), -R * Math.cos(t), -R * Math.sin(t)];
        expect(curvatureFromDerivatives(dx, dy, ddx, ddy) * R).toBeCloseTo(1, 14);
        // reversed direction of travel: x'(−t) flips sign, x'' does not
        expect(curvatureFromDerivatives(-dx, -dy, ddx, ddy) * R).toBeCloseTo(-1, 14);
      }
    }
  });
  it('ellipse a=2, b=1: 2.0 at (a, 0) and 0.25 at (0, b) [C]', () => {
    // (2 cos t, sin t): t = 0 → x' = 0, y' = 1, x'' = −2, y'' = 0
    expect(curvatureFromDerivatives(0, 1, -2, 0)).toBe(2);
    // t = π/2 → x' = −2, y' = 0, x'' = 0, y'' = −1
    expect(curvatureFromDerivatives(-2, 0, 0, -1)).toBe(0.25);
  });
  it('a straight line has zero curvature and a stationary point gives NaN', () => {
    expect(curvatureFromDerivatives(3, 4, 6, 8)).toBe(0);
    expect(curvatureFromDerivatives(0, 0, 1, 0)).toBeNaN();
  });
  test.prop([fc.double({ min: 0.1, max: 10, noNaN: true }), fc.double({ min: 0, max: 6.28, noNaN: true })])(
    'does not depend on the parameter speed: (c·P′, c²·P″) gives the same κ [C: chain rule]',
    (c, t) => {
      const [dx, dy, ddx, ddy] = [-3 * Math.sin(t), 2 * Math.cos(t), -3 * Math.cos(t), -2 * Math.sin(t)];
      const k = curvatureFromDerivatives(dx, dy, ddx, ddy);
      expect(Math.abs(curvatureFromDerivatives(c * dx, c * dy, c * c * ddx, c * c * ddy) - k)).toBeLessThan(1e-14 * Math.abs(k));
    },
  );
});

describe('circumCurvature', () => {
  it('three points on a circle of radius R give 1/R at any spacing (common practice, no source)', () => {
    for (const R of [0.5, 10, 1000]) {
      for (const step of [1e-4, 1e-3, 1e-2, 0.1, 1, 2]) {
        for (let k = 0; k < 50; k++) {
          const t = 0.37 * k;
          const v = circumCurvature(
            R * Math.cos(t - step), R * Math.sin(t - step),
            R * Math.cos(t), R * Math.sin(t),
            R * Math.cos(t + 1.3 * step), R * Math.sin(t + 1.3 * step),
          );
          // inputs carry ~1e-16 relative rounding and the cross product scales with step²,
          // so the tolerance is 1e-15/step² + 4 ulp (measured 2.4e-8 at step 1e-4)
          expect(Math.abs(v * R - 1)).toBeLessThan(1e-15 / (step * step) + 4 * EPS);
        }
      }
    }
  });
  it('sign: + for a left turn, − for a right turn, 0 when collinear, NaN when two points coincide', () => {
    expect(circumCurvature(1, 0, 0, 1, -1, 0)).toBe(1); // unit circle, counter-clockwise [C]
    expect(circumCurvature(-1, 0, 0, 1, 1, 0)).toBe(-1); // clockwise [C]
    expect(circumCurvature(0, 0, 1, 1, 3, 3)).toBe(0);
    expect(circumCurvature(0, 0, 0, 0, 3, 3)).toBeNaN();
  });
});

describe('discreteCurvatureClosed', () => {
  it('regular polygon inscribed in a circle: every stencil gives 1/R (all vertices lie on the circle) [C]', () => {
    const R = 40;
    const coords = circleControl(36, R);
    for (const stencil of [1, 2, 5, 17]) {
      const k = discreteCurvatureClosed(coords, stencil);
      expect(k.length).toBe(36);
      for (const v of k) expect(v * R).toBeCloseTo(1, 12);
    }
  });
  it('clockwise traversal flips the sign and out is reused', () => {
    const ccw = circleControl(12, 5);
    const cw = new Float64Array(24);
    for (let i = 0; i < 12; i++) {
      cw[2 * i] = ccw[2 * (11 - i)];
      cw[2 * i + 1] = ccw[2 * (11 - i) + 1];
    }
    const out = new Float64Array(12);
    expect(discreteCurvatureClosed(cw, 3, out)).toBe(out);
    for (const v of out) expect(v * 5).toBeCloseTo(-1, 12);
  });
  it('guards: vertex count, stencil range, out length, duplicate vertices', () => {
    expect(() => discreteCurvatureClosed(new Float64Array([0, 0, 1, 0]), 1)).toThrow(/>= 3 vertices/);
    expect(() => discreteCurvatureClosed(circleControl(6, 1), 3)).toThrow(/stencil must be an integer in \[1, 2\] for 6 vertices, got 3/);
    expect(() => discreteCurvatureClosed(circleControl(6, 1), 1.5)).toThrow(RangeError);
    expect(() => discreteCurvatureClosed(circleControl(6, 1), 1, new Float64Array(5))).toThrow(/out has length 5, need 6/);
    expect(() => discreteCurvatureClosed(new Float64Array([0, 0, 1, 0, 1, 0, 0, 1]), 1)).toThrow(/curvature undefined at vertex 1/);
  });
});
