// Tests for the planner's repair step (plan.ts pushApart) and the collision it acts on
// (macro-check.ts macroCollision): a lap whose outline comes too close to itself is pushed
// apart while it still closes at its length and every straight keeps its minimum.

import { describe, expect, it } from 'vitest';
import { solveStraights } from '../../../src/core/centerline/closure.js';
import { drawCornerShape, SHAPE_INTERVALS } from '../../../src/core/centerline/corner-shape.js';
import { macroCollision, macroOverlap } from '../../../src/core/centerline/macro-check.js';
import { PLAN_STEP_M, pushApart } from '../../../src/core/centerline/plan.js';
import type { PlannedCorner } from '../../../src/core/centerline/plan-types.js';
import { cornerDisplacement } from '../../../src/core/centerline/trace.js';
import { MIN_STRAIGHT_M } from '../../../src/core/params/feasibility.js';
import { stream } from '../../../src/core/random/streams.js';

// a plain corner profile (no noise), drawn once from a fixed stream
const constant = drawCornerShape(stream(1, 0, 'plan'), 'constant', new Float64Array(SHAPE_INTERVALS + 1), 0);

// four left corners of 90° (radius 20 m): a rectangle whose straights the test chooses
function rectangle() {
  const corners: PlannedCorner[] = [];
  for (let i = 0; i < 4; i++) {
    const angleRad = Math.PI / 2, peakCurvature = 1 / 20;
    corners.push({ sign: 1, angleRad, peakCurvature, lengthM: angleRad / (peakCurvature * constant.mean), shape: constant });
  }
  const n = corners.length;
  const local = new Float64Array(4 * n);
  const cosH = new Float64Array(n), sinH = new Float64Array(n);
  let h = 0, rx = 0, ry = 0;
  for (let i = 0; i < n; i++) {
    const [mx, my, dx, dy] = cornerDisplacement(corners[i], PLAN_STEP_M);
    local.set([mx, my, dx, dy], 4 * i);
    const c = Math.cos(h), s = Math.sin(h);
    rx -= c * dx - s * dy;
    ry -= s * dx + c * dy;
    h += corners[i].angleRad;
    cosH[i] = Math.cos(h);
    sinH[i] = Math.sin(h);
  }
  return { corners, local, cosH, sinH, rx, ry };
}

function closureError(r: ReturnType<typeof rectangle>, d: Float64Array): number {
  let x = -r.rx, y = -r.ry;
  for (let i = 0; i < d.length; i++) (x += d[i] * r.cosH[i]), (y += d[i] * r.sinH[i]);
  return Math.hypot(x, y);
}

// a 400 m by 45 m rectangle (two corners of radius 20 m and 5 m of straight across), closed by
// the solve: its long sides are 45 m apart
function thinLap() {
  const r = rectangle();
  const total = 2 * 400 + 2 * 5;
  const wish = Float64Array.from([5, 400, 5, 400]);
  const weight = wish.map((w) => Math.max(w, 5));
  const lo = new Float64Array(4).fill(MIN_STRAIGHT_M);
  const d = solveStraights(r.cosH, r.sinH, wish, weight, lo, r.rx, r.ry, total);
  return { r, total, weight, lo, d };
}

describe('pushApart', () => {
  it('parts a long, thin lap whose sides come too close, keeping closure, length and the straight minimum', () => {
    // the long sides are 45 m apart, less than the 60 m required
    const { r, total, weight, lo, d: first } = thinLap();
    const required = 60;
    expect(first).not.toBeNull();
    let d = first!;
    const hit = macroCollision(r.corners, r.local, d, required, 20);
    expect(hit).not.toBeNull();
    expect(hit!.a).toBeLessThan(hit!.b);
    expect(hit!.distanceM).toBeLessThan(required);
    for (let step = 0; step < 3; step++) {
      const h = macroCollision(r.corners, r.local, d, required, 20);
      if (h === null) break;
      d = pushApart(r.cosH, r.sinH, d, h, weight, lo, r.rx, r.ry, total, 1.1 * required - h.distanceM)!;
      expect(d).not.toBeNull();
    }
    expect(macroOverlap(r.corners, r.local, d, required, 20)).toBe(false);
    expect(closureError(r, d)).toBeLessThan(1e-6);
    expect(d.reduce((a, b) => a + b, 0)).toBeCloseTo(total, 6);
    for (const x of d) expect(x).toBeGreaterThanOrEqual(MIN_STRAIGHT_M - 1e-9);
  });

  it('leaves the lap as it is when the pair cannot be parted (no gain along the ascent)', () => {
    const { r, total, weight, lo, d } = thinLap();
    // a direction perpendicular to every straight's effect: nothing to gain, so no step is taken
    const hit = { a: 0, b: 6, ta: 0, tb: 0, nx: 0, ny: 0, distanceM: 5 };
    expect(pushApart(r.cosH, r.sinH, d!, hit, weight, lo, r.rx, r.ry, total, 30)).toBeNull();
  });
});

describe('macroCollision', () => {
  it('finds a pair exactly when macroOverlap does, with a unit direction', () => {
    const { r, d: solved } = thinLap();
    const d = solved!;
    for (const required of [10, 30, 60]) {
      const hit = macroCollision(r.corners, r.local, d, required, 20);
      expect(hit !== null).toBe(macroOverlap(r.corners, r.local, d, required, 20));
      if (hit !== null) expect(Math.hypot(hit.nx, hit.ny)).toBeCloseTo(1, 9);
    }
  });
});
