// Tests for src/core/centerline/plan.ts and trace.ts: the turning is planned, not hoped for.

import { describe, expect, it } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import { planLap, plannedMinRadiusM, PLAN_STEP_M } from '../../../src/core/centerline/plan.js';
import { tracePlan } from '../../../src/core/centerline/trace.js';
import { MIN_STRAIGHT_M, splitTurning } from '../../../src/core/params/feasibility.js';
import { resolveParams } from '../../../src/core/params/resolve.js';
import type { TrackRequest } from '../../../src/core/params/types.js';
import { loopNoise } from '../../../src/core/random/noise.js';
import { stream } from '../../../src/core/random/streams.js';

function plan(request: TrackRequest) {
  const p = resolveParams(request);
  const split = splitTurning(p);
  return { p, split, plan: planLap(p, split, stream(p.seed, 0, 'plan'), loopNoise(stream(p.seed, 0, 'shape-noise'), 50)) };
}

const realistic = fc.record({
  seed: fc.integer({ min: 0, max: 2 ** 32 - 1 }),
  lengthM: fc.integer({ min: 800, max: 6000 }),
  cornerCount: fc.integer({ min: 4, max: 24 }),
  turnBalance: fc.double({ min: 0.1, max: 0.5, noNaN: true }),
  noise: fc.double({ min: 0, max: 1, noNaN: true }),
});

describe('planLap', () => {
  test.prop([realistic], { numRuns: 60 })(
    'each direction turns its exact share and the loop turns ±360° (Hopf, Umlaufsatz, 1935)',
    (r) => {
      const budget = 360 + r.cornerCount * 60;
      const { p, split, plan: lap } = plan({ ...r, curvatureBudgetDeg: budget });
      if (lap === null || split.leftCount === 0 || split.rightCount === 0) return; // one-way draws need budget 360; failed attempts are retried
      let left = 0, right = 0, leftCount = 0;
      for (const c of lap.corners) {
        if (c.sign > 0) {
          left += c.angleRad;
          leftCount++;
        } else right += c.angleRad;
      }
      const deg = 180 / Math.PI;
      expect(lap.corners.length).toBe(p.cornerCount);
      expect(p.cornerCount - leftCount).toBe(Math.round(p.turnBalance * p.cornerCount));
      expect((left + right) * deg).toBeCloseTo(budget, 9);
      expect(Math.abs(left - right) * deg).toBeCloseTo(360, 9);
      expect(Math.sign(left - right)).toBe(split.loopSign === 0 ? lap.loopSign : split.loopSign);
    },
  );

  test.prop([realistic], { numRuns: 40 })('the traced lap closes: ends where it starts, heading ±2π, length exact', (r) => {
    const { p, plan: lap } = plan({ ...r, curvatureBudgetDeg: 360 + r.cornerCount * 50 });
    if (lap === null) return;
    const trace = tracePlan(lap, PLAN_STEP_M);
    expect(Math.hypot(trace.endX, trace.endY)).toBeLessThan(1e-6);
    expect(Math.abs(trace.endHeading - lap.loopSign * 2 * Math.PI)).toBeLessThan(1e-9);
    let length = 0;
    for (const c of lap.corners) length += c.lengthM;
    for (const d of lap.straights) {
      expect(d).toBeGreaterThanOrEqual(MIN_STRAIGHT_M - 1e-9);
      length += d;
    }
    expect(length).toBeCloseTo(p.lengthM, 6);
    // no corner is planned tighter than the limit plus the planner's margin
    for (const c of lap.corners) expect(1 / c.peakCurvature).toBeGreaterThanOrEqual(plannedMinRadiusM(p.minCornerRadiusM) - 1e-9);
  });

  it('an all-left request plans a counter-clockwise loop of left corners turning 360°', () => {
    const { plan: lap } = plan({ seed: 11, turnBalance: 0, curvatureBudgetDeg: 360, cornerCount: 4, lengthM: 2000 });
    expect(lap).not.toBeNull();
    expect(lap!.loopSign).toBe(1);
    expect(lap!.corners.every((c) => c.sign === 1)).toBe(true);
  });

  it('a tie between directions draws the loop direction and gives it the +360°', () => {
    for (let seed = 0; seed < 8; seed++) {
      const { plan: lap } = plan({ seed, turnBalance: 0.5, cornerCount: 10, curvatureBudgetDeg: 1200, lengthM: 3000 });
      if (lap === null) continue;
      let net = 0;
      for (const c of lap.corners) net += c.sign * c.angleRad;
      expect(net).toBeCloseTo(lap.loopSign * 2 * Math.PI, 9);
    }
  });
});
