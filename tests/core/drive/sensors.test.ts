// Tests for src/core/drive/sensors.ts: the share of poses whose sensors see both walls.

import { describe, expect, it } from 'vitest';
import { castRay, gateCells } from '../../../src/core/drive/ray-cast.js';
import { buildRoadStrip } from '../../../src/core/drive/road-strip.js';
import { SENSOR_POSE_STEP_M, sensorCoverage } from '../../../src/core/drive/sensors.js';
import { stadiumTrack } from '../../helpers/synthetic-track.js';
import { rayHit, wallSegments } from '../../helpers/wall-distance.js';

const track = stadiumTrack();
const strip = buildRoadStrip(track);
const headings = track.centerline.headingDeg.map((d) => (d * Math.PI) / 180);
const coverage = (count: number, spreadDeg: number, lengthM: number) => sensorCoverage(strip, headings, track.gates, { count, spreadDeg, lengthM });

describe('sensorCoverage', () => {
  it('poses every 10 m along the lap', () => {
    expect(coverage(9, 180, 30).poses).toBe(Math.ceil(strip.n / Math.round(SENSOR_POSE_STEP_M / strip.spacingM)));
  });

  it('rays that reach past the half widths see both walls everywhere; rays shorter than every half width see none', () => {
    // the stadium's half widths lie in [4.25, 6] m
    expect(coverage(9, 180, 30).wallsBothSides).toBe(1);
    expect(coverage(9, 180, 4).wallsBothSides).toBe(0);
  });

  it('rays straight ahead count for neither side: one ray, or any count with no spread', () => {
    expect(coverage(1, 180, 30).wallsBothSides).toBe(0);
    expect(coverage(9, 0, 500).wallsBothSides).toBe(0);
  });

  it('a fan reaching 5.75 m covers the poses with a wall that near on both sides (brute-force cast against every wall segment)', () => {
    const { walls } = wallSegments(track);
    const stride = Math.round(SENSOR_POSE_STEP_M / strip.spacingM);
    const fan = [-90, -45, 0, 45, 90].map((d) => (d * Math.PI) / 180);
    let poses = 0, covered = 0;
    for (let i = 0; i < strip.n; i += stride) {
      poses++;
      const [x, y] = track.centerline.points[i];
      const sees = fan.map((a) => rayHit(x, y, Math.cos(headings[i] + a), Math.sin(headings[i] + a), walls) <= 5.75);
      if ((sees[0] || sees[1]) && (sees[3] || sees[4])) covered++;
    }
    expect(covered).toBeGreaterThan(0);
    expect(covered).toBeLessThan(poses);
    expect(coverage(5, 180, 5.75).wallsBothSides).toBeCloseTo(covered / poses, 12);
  });

  it('gates within reach: every pose sees one with 30 m rays (gates at most 25 m apart)', () => {
    expect(coverage(9, 180, 30).gateInSight).toBe(1);
    // a ray straight along the road from a pose meets the next gate ahead, at its distance
    const [x, y] = track.centerline.points[3];
    const r = castRay(strip, 3, x, y, Math.cos(headings[3]), Math.sin(headings[3]), 30, gateCells(strip, track.gates), { wallM: 0, wallSide: 0, gateM: 0 });
    const next = track.gates.find((g) => g.s > track.centerline.s[3])!;
    expect(r.gateM).toBeCloseTo(next.s - track.centerline.s[3], 2);
  });
});
