import { describe, expect, test } from 'vitest';
import { turningFunction } from '../../../src/core/metrics/turning-function.js';

const f64 = (...v: number[]) => new Float64Array(v);
const SQUARE = f64(0, 0, 1, 0, 1, 1, 0, 1);
// L shape: five left turns and one right turn of π/2
const L = f64(0, 0, 2, 0, 2, 1, 1, 1, 1, 2, 0, 2);

function curve(n: number, x: (t: number) => number, y: (t: number) => number): Float64Array {
  const c = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    const t = (2 * Math.PI * k) / n;
    c[2 * k] = x(t);
    c[2 * k + 1] = y(t);
  }
  return c;
}

describe('turningFunction', () => {
  test('unit square: four quarter-turn steps at quarters of the perimeter [C]', () => {
    const f = turningFunction(SQUARE);
    expect(Array.from(f.breaks)).toEqual([0, 0.25, 0.5, 0.75, 1]);
    const expected = [0, Math.PI / 2, Math.PI, (3 * Math.PI) / 2];
    f.values.forEach((v, k) => expect(v).toBeCloseTo(expected[k], 15));
    // ∫Θ = (0 + 1 + 2 + 3)·(π/2)/4 = 3π/4
    expect(f.integral).toBeCloseTo((3 * Math.PI) / 4, 15);
    // convex: total turning exactly one full turn (Fenchel, 1929 [M])
    expect(f.totalTurn).toBeCloseTo(2 * Math.PI, 15);
  });

  test('a clockwise polygon is walked counter-clockwise: same function', () => {
    const cw = f64(0, 1, 1, 1, 1, 0, 0, 0);
    expect(turningFunction(cw)).toEqual(turningFunction(SQUARE));
  });

  test('repeated and collinear vertices leave the step function unchanged', () => {
    const f = turningFunction(SQUARE);
    const g = turningFunction(f64(0, 0, 0.5, 0, 1, 0, 1, 0, 1, 1, 0, 1, 0, 0));
    expect(Array.from(g.breaks)).toEqual([0, 0.125, 0.25, 0.5, 0.75, 1]);
    expect(g.values[0]).toBe(0);
    expect(g.values[1]).toBe(0); // straight on: zero turn
    expect(g.integral).toBeCloseTo(f.integral, 15);
  });

  test('L shape: total turning K = 3π, so right turns (K − 2π)/2 = π/2 (turn balance from Hopf, REFERENCES.md) [C]', () => {
    const f = turningFunction(L);
    expect(f.totalTurn).toBeCloseTo(3 * Math.PI, 14);
    expect(f.values[f.values.length - 1] - f.values[0]).toBeCloseTo((3 * Math.PI) / 2, 14);
  });

  test('rejects too few vertices, zero area and turning numbers other than 1', () => {
    expect(() => turningFunction(f64(0, 0, 1, 1))).toThrow('>= 3 vertices');
    expect(() => turningFunction(f64(0, 0, 1, 1, 2, 2))).toThrow('non-zero area');
    // limaçon r = 1 + 2 cos t has turning number 2 (Hopf's Umlaufsatz fixture in REFERENCES.md) [C]
    const limacon = curve(400, (t) => (1 + 2 * Math.cos(t)) * Math.cos(t), (t) => (1 + 2 * Math.cos(t)) * Math.sin(t));
    expect(() => turningFunction(limacon)).toThrow('turning number of 1, got 2');
    // a figure-eight with non-zero area: the lobes differ in size, turning number 0
    const eight = curve(400, (t) => Math.sin(t), (t) => Math.sin(t) * Math.cos(t) * (1 + 0.5 * Math.sin(t)));
    expect(() => turningFunction(eight)).toThrow('got 0');
  });
});
