import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import {
  squaredDistanceAtShift,
  turningDistance,
  turningDistanceBetween,
  turningDistanceExact,
  turningSignature,
} from '../../../src/core/metrics/turning-distance.js';
import { turningFunction } from '../../../src/core/metrics/turning-function.js';

const EPS = Number.EPSILON;
const SQUARE = new Float64Array([0, 0, 1, 0, 1, 1, 0, 1]);

function regularPolygon(n: number, phase = 0): Float64Array {
  const c = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    c[2 * k] = Math.cos(phase + (2 * Math.PI * k) / n);
    c[2 * k + 1] = Math.sin(phase + (2 * Math.PI * k) / n);
  }
  return c;
}

/** A star-shaped (hence simple, counter-clockwise) polygon from angle increments and radii, on a 2^-20 grid. */
function star(spec: readonly [number, number][]): Float64Array {
  const total = spec.reduce((s, [da]) => s + da, 0);
  const c = new Float64Array(2 * spec.length);
  let angle = 0;
  spec.forEach(([da, r], k) => {
    c[2 * k] = Math.round(r * Math.cos(angle) * 2 ** 20) / 2 ** 20;
    c[2 * k + 1] = Math.round(r * Math.sin(angle) * 2 ** 20) / 2 ** 20;
    angle += (2 * Math.PI * da) / total;
  });
  return c;
}
const starSpec = (maxVertices: number) =>
  fc.array(fc.tuple(fc.double({ min: 0.2, max: 1, noNaN: true }), fc.double({ min: 0.4, max: 1, noNaN: true })), { minLength: 3, maxLength: maxVertices });

/** Turn sizes |turn_k| at vertex k and its normalised arc position, computed here without the code under test. */
function turns(coords: Float64Array): { at: number[]; size: number[]; total: number; max: number } {
  const n = coords.length >> 1;
  const edge = (k: number) => [coords[2 * ((k + 1) % n)] - coords[2 * k], coords[2 * ((k + 1) % n) + 1] - coords[2 * k + 1]];
  const len = Array.from({ length: n }, (_, k) => Math.hypot(...edge(k)));
  const perimeter = len.reduce((a, b) => a + b, 0);
  const at: number[] = [];
  const size: number[] = [];
  let s = 0;
  for (let k = 0; k < n; k++) {
    const [px, py] = edge((k + n - 1) % n);
    const [ex, ey] = edge(k);
    at.push(s / perimeter);
    size.push(Math.abs(Math.atan2(px * ey - py * ex, px * ex + py * ey)));
    s += len[k];
  }
  return { at, size, total: size.reduce((a, b) => a + b, 0), max: Math.max(...size) };
}

/** Largest total turn inside any window of normalised arc length w (cyclic). */
function windowVariation(t: ReturnType<typeof turns>, w: number): number {
  const n = t.at.length;
  let best = 0;
  for (let i = 0; i < n; i++) {
    let sum = 0;
    for (let k = 0; k < n; k++) {
      const gap = (t.at[(i + k) % n] - t.at[i] + 1) % 1;
      if (k > 0 && gap > w) break;
      sum += t.size[(i + k) % n];
    }
    best = Math.max(best, sum);
  }
  return best;
}

/** Heading at normalised arc length u of a convex counter-clockwise polygon, unwrapped, Θ(u + 1) = Θ(u) + 2π. */
function headingAt(coords: Float64Array, u: number): number {
  const n = coords.length >> 1;
  const lap = Math.floor(u);
  const edges = Array.from({ length: n }, (_, k) => [coords[2 * ((k + 1) % n)] - coords[2 * k], coords[2 * ((k + 1) % n) + 1] - coords[2 * k + 1]]);
  const len = edges.map(([x, y]) => Math.hypot(x, y));
  const perimeter = len.reduce((a, b) => a + b, 0);
  let s = (u - lap) * perimeter;
  let heading = Math.atan2(edges[0][1], edges[0][0]);
  for (let k = 0; k < n; k++) {
    let h = Math.atan2(edges[k][1], edges[k][0]);
    while (h < heading - 1e-12) h += 2 * Math.PI;
    heading = h;
    if (s < len[k]) break;
    s -= len[k];
  }
  return heading + 2 * Math.PI * lap;
}

describe('turningDistanceExact', () => {
  test('unit square vs regular 20-gon: 0.444288 [C], 0.4443 [S: a numerical-library documentation example]', () => {
    const d = turningDistanceExact(SQUARE, regularPolygon(20));
    expect(d).toBeCloseTo(0.444288, 6);
    expect(d).toBeCloseTo(0.4443, 4);
  });

  test('re-derived: midpoint rule on a grid that resolves every step, over shifts that are multiples of 1/80 [C]', () => {
    // breaks lie on multiples of 1/20; with 5120 midpoints and shifts k/80 every cell is constant, so the sum is exact
    const K = 5120;
    const b = regularPolygon(20);
    const gv = Array.from({ length: K }, (_, k) => headingAt(b, (k + 0.5) / K));
    let best = Infinity;
    for (let j = 0; j < 80; j++) {
      let sum = 0;
      let sum2 = 0;
      for (let k = 0; k < K; k++) {
        const d = headingAt(SQUARE, (k + 0.5) / K + j / 80) - gv[k];
        sum += d;
        sum2 += d * d;
      }
      best = Math.min(best, sum2 / K - (sum / K) ** 2);
    }
    expect(turningDistanceExact(SQUARE, b)).toBeCloseTo(Math.sqrt(best), 10);
  });

  test('regular n-gon vs circle: π/(n√3), square 0.45345, triangle 0.60460 [C]; a 4096-gon stands in for the circle', () => {
    // the sawtooth Θ_n − Θ_circle has amplitude π/n, so its RMS is (π/n)/√3
    const formula = (n: number) => Math.PI / (n * Math.sqrt(3));
    expect(formula(4)).toBeCloseTo(0.45345, 5);
    expect(formula(3)).toBeCloseTo(0.6046, 5);
    // D is a metric (Arkin et al. 1991), so |D(n-gon, 4096-gon) − D(n-gon, circle)| ≤ D(4096-gon, circle) = formula(4096)
    const circle = regularPolygon(4096);
    expect(Math.abs(turningDistanceExact(SQUARE, circle) - formula(4))).toBeLessThanOrEqual(formula(4096));
    expect(Math.abs(turningDistanceExact(regularPolygon(3, 0.3), circle) - formula(3))).toBeLessThanOrEqual(formula(4096));
  });

  test('zero to itself, exactly', () => {
    expect(turningDistanceExact(SQUARE, SQUARE)).toBe(0);
    const s = star([[1, 1], [0.5, 0.6], [0.7, 0.9], [1, 0.5]]);
    expect(turningDistanceExact(s, s)).toBe(0);
  });

  // rounding budget for exactly transformed copies: breakpoints are sums of m rounded lengths, off by at
  // most δ = 4mε; moving a step of size J by δ costs δJ² in D², summed ≤ δ·TV·Jmax; the accumulated headings
  // are off by at most 4mε·TV
  const copyTolerance = (c: Float64Array) => {
    const t = turns(c);
    const m = t.at.length + 2;
    return Math.sqrt(8 * m * EPS * t.total * t.max) + 4 * m * EPS * t.total;
  };

  test.prop([starSpec(12), fc.integer({ min: 0, max: 11 }), fc.integer({ min: -20, max: 20 }), fc.integer({ min: -1000, max: 1000 })])(
    'invariant to translation, 90° rotation, scale, start vertex, reversal, inserted collinear and repeated vertices',
    (spec, startRaw, k, shift) => {
      const a = star(spec);
      const n = a.length >> 1;
      const start = startRaw % n;
      const tol = copyTolerance(a);
      const variants: Float64Array[] = [
        a.map((v, i) => v + (i % 2 ? -shift : shift)),
        a.map((_, i) => (i % 2 ? a[i - 1] : -a[i + 1])),
        a.map((v) => v * 2 ** k),
        Float64Array.from({ length: 2 * n }, (_, i) => a[(i + 2 * start) % (2 * n)]),
        Float64Array.from({ length: 2 * n }, (_, i) => a[2 * (n - 1 - (i >> 1)) + (i % 2)]),
        Float64Array.from([...a.subarray(0, 2), (a[0] + a[2]) / 2, (a[1] + a[3]) / 2, ...a.subarray(2)]),
        Float64Array.from([...a.subarray(0, 4), ...a.subarray(2)]),
      ];
      for (const v of variants) expect(turningDistanceExact(a, v)).toBeLessThanOrEqual(tol);
    },
  );

  test.prop([starSpec(10), fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }), fc.double({ min: 0.01, max: 100, noNaN: true })])(
    'invariant to arbitrary rotation and scale, within the coordinate rounding',
    (spec, angle, scale) => {
      const a = star(spec);
      const [c, s] = [Math.cos(angle) * scale, Math.sin(angle) * scale];
      const b = a.map((_, i) => (i % 2 ? s * a[i - 1] + c * a[i] : c * a[i] - s * a[i + 1]));
      expect(turningDistanceExact(a, b)).toBeLessThanOrEqual(perturbationTolerance(a) + copyTolerance(a));
    },
  );

  // |D(a,b)² − D(b,a)²| comes only from rounding of the merged integrals: ≤ 8(m+n)ε·(TV_a + TV_b)²
  test.prop([starSpec(10), starSpec(10), starSpec(10)])('symmetric, and obeys the triangle inequality (a metric, Arkin et al. 1991 [S])', (sa, sb, sc) => {
    const [a, b, c] = [star(sa), star(sb), star(sc)];
    const slack2 = 8 * 30 * EPS * (turns(a).total + turns(b).total + turns(c).total) ** 2;
    const ab = turningDistanceExact(a, b);
    expect(Math.abs(ab ** 2 - turningDistanceExact(b, a) ** 2)).toBeLessThanOrEqual(slack2);
    expect(turningDistanceExact(a, c)).toBeLessThanOrEqual(ab + turningDistanceExact(b, c) + Math.sqrt(slack2));
  });

  test.prop([starSpec(8), starSpec(8)])("Arkin's lemma: dense shift sampling finds nothing below the best critical shift", (sa, sb) => {
    const [a, b] = [star(sa), star(sb)];
    const best2 = turningDistanceExact(a, b) ** 2;
    const [f, g] = [turningFunction(a), turningFunction(b)];
    let dense = Infinity;
    for (let k = 0; k < 3000; k++) dense = Math.min(dense, squaredDistanceAtShift(f, g, (k + 0.37) / 3000));
    const slack2 = 8 * 16 * EPS * (f.totalTurn + g.totalTurn) ** 2;
    expect(dense).toBeGreaterThanOrEqual(best2 - slack2);
    // and sampling comes close to it: D² moves by at most 2·TV_f·(TV_f + TV_g) per unit shift
    expect(dense).toBeLessThanOrEqual(best2 + (2 * f.totalTurn * (f.totalTurn + g.totalTurn)) / 6000 + slack2);
  });
});

describe('turningDistance (binned, fast)', () => {
  test('equals the exact value when every vertex lies on a bin edge: square vs 20-gon with 500 bins, 0.444288 [C]', () => {
    expect(turningDistance(SQUARE, regularPolygon(20), 500)).toBeCloseTo(turningDistanceExact(SQUARE, regularPolygon(20)), 12);
    expect(turningDistance(SQUARE, regularPolygon(20), 500)).toBeCloseTo(0.444288, 6);
  });

  // derived in turningDistanceBetween's doc: D − (rA + rB) ≤ D_N ≤ D + ‖Θ_A(· + δ) − Θ_A‖ with |δ| ≤ 1/(2N);
  // a bin of width w holding turns of total V has ‖Θ − mean‖² ≤ wV²/4, so r ≤ √(TV·V(1/N)/(4N)), and a shift
  // by δ costs ‖Θ(· + δ) − Θ‖² ≤ δ·TV·V(δ), where V(w) is the largest total turn in a window of length w
  const bounds = (a: Float64Array, b: Float64Array, n: number) => {
    const [ta, tb] = [turns(a), turns(b)];
    const r = (t: typeof ta) => Math.sqrt((t.total * windowVariation(t, 1 / n)) / (4 * n));
    const shift = Math.sqrt((ta.total * windowVariation(ta, 1 / (2 * n))) / (2 * n));
    return { below: r(ta) + r(tb), above: shift, ra: r(ta) };
  };

  test.prop([starSpec(40), starSpec(40), fc.integer({ min: 16, max: 600 })])('lies within the derived bounds around the exact distance', (sa, sb, n) => {
    const [a, b] = [star(sa), star(sb)];
    const exact = turningDistanceExact(a, b);
    const { below, above, ra } = bounds(a, b, n);
    const approx = turningDistance(a, b, n);
    expect(approx).toBeGreaterThanOrEqual(exact - below - 1e-12);
    expect(approx).toBeLessThanOrEqual(exact + above + 1e-12);
    expect(turningSignature(a, n).residual).toBeLessThanOrEqual(ra + 1e-12);
  });

  test('n-gon vs 4096-gon within the bounds, and smooth shapes are close at 512 bins', () => {
    const circle = regularPolygon(4096);
    for (const poly of [SQUARE, regularPolygon(3, 0.3)]) {
      const exact = turningDistanceExact(poly, circle);
      const { below, above } = bounds(poly, circle, 512);
      const approx = turningDistance(poly, circle);
      expect(approx).toBeGreaterThanOrEqual(exact - below - 1e-12);
      expect(approx).toBeLessThanOrEqual(exact + above + 1e-12);
    }
    // for the 50-gon the bounds are already tight: below 0.03 rad either way
    const { below, above } = bounds(regularPolygon(50, 0.1), circle, 512);
    expect(Math.max(below, above)).toBeLessThan(0.03);
  });

  test('an ellipse sampled from another start vertex, rotated and scaled: within the shift bound of 0', () => {
    const n = 1000;
    const ellipse = (phase: number, angle: number, scale: number) => {
      const c = new Float64Array(2 * n);
      for (let k = 0; k < n; k++) {
        const t = phase + (2 * Math.PI * k) / n;
        const [x, y] = [3 * Math.cos(t), 2 * Math.sin(t)];
        c[2 * k] = scale * (Math.cos(angle) * x - Math.sin(angle) * y) + 17;
        c[2 * k + 1] = scale * (Math.sin(angle) * x + Math.cos(angle) * y) - 4;
      }
      return c;
    };
    const a = ellipse(0, 0, 1);
    const b = ellipse((2 * Math.PI * 123) / n, 0.7, 2.5);
    // the two vertex lists agree only up to rounding of cos/sin and the transform
    expect(turningDistance(a, b)).toBeLessThanOrEqual(bounds(a, b, 512).above + perturbationTolerance(a) + perturbationTolerance(b));
  });

  test('zero to itself and symmetric', () => {
    const a = star([[1, 1], [0.5, 0.6], [0.7, 0.9], [1, 0.5], [0.3, 0.8]]);
    const b = regularPolygon(7, 0.2);
    expect(turningDistance(a, a)).toBe(0);
    // both orders evaluate the same N sums of squares with the terms in another order
    expect(turningDistance(a, b)).toBeCloseTo(turningDistance(b, a), 12);
  });

  test('signatures are reusable and guarded', () => {
    const sa = turningSignature(SQUARE, 64);
    const sb = turningSignature(regularPolygon(20), 64);
    expect(turningDistanceBetween(sa, sb)).toBe(turningDistance(SQUARE, regularPolygon(20), 64));
    expect(Array.from(turningSignature(SQUARE, 4).values)).toEqual(Array.from(turningFunction(SQUARE).values));
    expect(() => turningDistanceBetween(sa, turningSignature(SQUARE, 32))).toThrow('signatures differ in samples: 64 and 32.');
    expect(() => turningSignature(SQUARE, 0)).toThrow(RangeError);
    expect(() => turningSignature(SQUARE, 2.5)).toThrow(RangeError);
  });
});

// a polygon whose coordinates carry rounding of a few ulps of its size R (a transform, or cos/sin sampling):
// each coordinate off by ≤ 4ε·R moves edge directions and lengths by ≤ 16εR/ℓmin, so breakpoints move by
// δ ≤ m·16εR/ℓmin and headings by ≤ δ·TV; the step-shift cost is then √(δ·TV·Jmax) as for exact copies
function perturbationTolerance(c: Float64Array): number {
  const t = turns(c);
  const n = c.length >> 1;
  const R = Math.max(...Array.from(c, Math.abs));
  let lmin = Infinity;
  for (let i = 0; i < n; i++) lmin = Math.min(lmin, Math.hypot(c[(2 * i + 2) % (2 * n)] - c[2 * i], c[(2 * i + 3) % (2 * n)] - c[2 * i + 1]));
  const delta = (16 * n * EPS * R) / lmin;
  return Math.sqrt(delta * t.total * t.max) + delta * t.total;
}
