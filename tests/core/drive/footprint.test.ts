// Tests for src/core/drive/footprint.ts: the car's footprint against the wall faces.

import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { footprintClearance, type FootprintClearance, type VertexReach } from '../../../src/core/drive/footprint.js';
import { buildRoadStrip, locateQuad } from '../../../src/core/drive/road-strip.js';
import { stadiumTrack } from '../../helpers/synthetic-track.js';
import { rectangle, rectangleToWalls, wallSegments } from '../../helpers/wall-distance.js';

const car = { lengthM: 4.5, widthM: 2, wheelbaseM: 2.5 };
const out = (): FootprintClearance => ({ marginM: 0, side: 0, quad: 0, exact: true });
// every wall vertex near the car is tested (floor +Infinity: the answer is always exact)
const exact: VertexReach = { window: 8, bulgeM: 0, floorM: Infinity };

describe('footprintClearance', () => {
  it('a car on the centerline of a straight keeps half the road less half its width from each wall', () => {
    const track = stadiumTrack({ straightM: 200 });
    const strip = buildRoadStrip(track);
    // rear axle at point 20 of the bottom straight, heading +x; the centre 1.25 m further on
    const [x, y] = track.centerline.points[20];
    const r = footprintClearance(strip, car, { x, y, hx: 1, hy: 0 }, 20, exact, out());
    const c = track.centerline;
    const near = [20, 21, 22, 23, 24].map((i) => Math.min(c.halfWidthLeftM[i], c.halfWidthRightM[i]) - 1);
    expect(r.marginM).toBeGreaterThan(Math.min(...near) - 0.01);
    expect(r.marginM).toBeLessThan(Math.max(...near) + 0.01);
    expect(r.exact).toBe(true);
  });

  it('a car wider than the road crosses both walls', () => {
    const track = stadiumTrack();
    const strip = buildRoadStrip(track);
    const [x, y] = track.centerline.points[5];
    expect(footprintClearance(strip, { ...car, widthM: 12 }, { x, y, hx: 1, hy: 0 }, 5, exact, out()).marginM).toBeLessThan(0);
  });

  it('on the inside of a tight corner the wall bulging between two corners of the car is caught', () => {
    // stadium with R = 8 m: the inner (left) face is a circle of radius 8 − 4.25..5.25 m. A long
    // car tangent to it with both left corners on the road still cuts the face in between.
    const track = stadiumTrack({ radiusM: 8, straightM: 60 });
    const strip = buildRoadStrip(track);
    const P = track.centerline.lengthM;
    const i = Math.round((30 + (Math.PI * 8) / 2) / (P / strip.n)); // the apex of the right half circle
    const [px, py] = track.centerline.points[i];
    // the inner face at the apex, and the car's side tangent to it 5 cm inside the face
    const hl = track.centerline.halfWidthLeftM[i];
    const h = (track.centerline.headingDeg[i] * Math.PI) / 180;
    const ux = Math.cos(h), uy = Math.sin(h), nx = -uy, ny = ux;
    const long = { lengthM: 8, widthM: 2, wheelbaseM: 4 };
    // centre so that the car's left side passes 5 cm beyond the face at the apex
    const lateral = hl - long.widthM / 2 + 0.05;
    const cx = px + nx * lateral, cy = py + ny * lateral;
    const rx = cx - ux * (long.wheelbaseM / 2), ry = cy - uy * (long.wheelbaseM / 2);
    const hint = locateQuad(strip, rx, ry, i);
    const brute = rectangleToWalls(rectangle(cx, cy, ux, uy, long.lengthM, long.widthM), wallSegments(track).walls);
    expect(brute).toBe(0);
    // the four corners alone (no wall vertex tested) see the road: the crossing is between them
    expect(footprintClearance(strip, long, { x: rx, y: ry, hx: ux, hy: uy }, hint, { window: -1, bulgeM: 0, floorM: Infinity }, out()).marginM).toBeGreaterThan(1);
    expect(footprintClearance(strip, long, { x: rx, y: ry, hx: ux, hy: uy }, hint, { window: 20, bulgeM: 0, floorM: Infinity }, out()).marginM).toBeLessThan(0);
  });

  test.prop([fc.integer({ min: 0, max: 100_000 }), fc.double({ min: -3, max: 3, noNaN: true }), fc.double({ min: -0.3, max: 0.3, noNaN: true })])(
    'equals the brute-force distance between the rectangle and every wall segment (within 2 mm), negative exactly when they meet',
    (at, lateral, yaw) => {
      const track = stadiumTrack({ radiusM: 15 });
      const strip = buildRoadStrip(track);
      const i = at % strip.n;
      const [x0, y0] = track.centerline.points[i];
      const h = (track.centerline.headingDeg[i] * Math.PI) / 180 + yaw;
      const ux = Math.cos(h), uy = Math.sin(h);
      const x = x0 - uy * lateral, y = y0 + ux * lateral;
      const r = footprintClearance(strip, car, { x, y, hx: ux, hy: uy }, locateQuad(strip, x, y, i), exact, out());
      const cx = x + ux * (car.wheelbaseM / 2), cy = y + uy * (car.wheelbaseM / 2);
      const brute = rectangleToWalls(rectangle(cx, cy, ux, uy, car.lengthM, car.widthM), wallSegments(track).walls);
      if (brute === 0) expect(r.marginM).toBeLessThan(1e-3);
      else if (brute > 2e-3) expect(Math.abs(r.marginM - brute)).toBeLessThan(2e-3);
    },
  );
});
