import { describe, expect, test } from 'vitest';
import { buildGeometry, measureStride, wrapAngle } from '../../../src/core/validate/geometry.js';
import { headingAt, pointAt, segmentAt } from '../../../src/core/validate/measure.js';
import { mirrorTrack, stadiumPose, stadiumTrack } from '../../helpers/synthetic-track.js';

const track = stadiumTrack();
const g = buildGeometry(track);
const DEG = 180 / Math.PI;

describe('measuring by lap position', () => {
  test('wrapAngle maps into (-π, π]', () => {
    expect(wrapAngle(Math.PI)).toBe(Math.PI);
    expect(wrapAngle(-Math.PI)).toBeCloseTo(Math.PI, 15);
    expect(wrapAngle(3 * Math.PI + 0.5)).toBeCloseTo(-Math.PI + 0.5, 12);
    expect(wrapAngle(-7)).toBeCloseTo(-7 + 2 * Math.PI, 12);
  });

  test('measureStride spans about MEASURE_CHORD_M and keeps three decimated vertices', () => {
    expect(measureStride(1, 1500)).toBe(3);
    expect(measureStride(0.5, 1500)).toBe(6);
    expect(measureStride(5, 1500)).toBe(1);
    expect(measureStride(0.1, 10)).toBe(3);
  });

  test('segmentAt finds the segment holding s, wrapping around the lap', () => {
    expect(segmentAt(g, 0)).toBe(0);
    expect(segmentAt(g, g.s[7])).toBe(7);
    expect(segmentAt(g, g.s[7] - 1e-9)).toBe(6);
    expect(segmentAt(g, g.lapM - 1e-9)).toBe(g.n - 1);
    expect(segmentAt(g, g.lapM)).toBe(0);
    expect(segmentAt(g, -0.5)).toBe(g.n - 1);
  });

  test('points and headings at s follow the analytic stadium', () => {
    // stadium pose in closed form (elementary geometry): the chord-based heading agrees within 0.05°
    const out = new Float64Array(2);
    // (away from the joints of straight and arc, where a chord centred on s averages both)
    for (const s of [0, 30.25, 100, 183, 250.5, 380, 480]) {
      const p = stadiumPose(120, 40, s);
      pointAt(g, s, out);
      expect(Math.hypot(out[0] - p.x, out[1] - p.y)).toBeLessThan(0.02);
      expect(Math.abs(wrapAngle(headingAt(g, s) - p.headingRad)) * DEG).toBeLessThan(0.05);
    }
  });

  test('headingAt is unwrapped: one lap adds the net turning', () => {
    expect(headingAt(g, 100 + g.lapM) - headingAt(g, 100)).toBeCloseTo(2 * Math.PI, 9);
    const m = buildGeometry(mirrorTrack(track));
    expect(headingAt(m, 100 + m.lapM) - headingAt(m, 100)).toBeCloseTo(-2 * Math.PI, 9);
    // a semicircle turns by π between its ends (corner 0: s from 60 to 60 + 40π)
    expect((headingAt(g, 60 + 40 * Math.PI) - headingAt(g, 60)) * DEG).toBeGreaterThan(178);
  });
});
