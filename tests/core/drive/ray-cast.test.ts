// Tests for src/core/drive/ray-cast.ts: rays marched through the road strip.

import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { castRay, gateCells, type RayHit } from '../../../src/core/drive/ray-cast.js';
import { buildRoadStrip } from '../../../src/core/drive/road-strip.js';
import { stadiumTrack } from '../../helpers/synthetic-track.js';
import { rayHit, wallSegments } from '../../helpers/wall-distance.js';

const track = stadiumTrack();
const strip = buildRoadStrip(track);
const cells = gateCells(strip, track.gates);
const { walls, gates } = wallSegments(track);
const hit = (): RayHit => ({ wallM: Infinity, wallSide: 0, gateM: Infinity });

describe('castRay', () => {
  it('sideways from the centerline on a straight: the walls a half width away, left and right', () => {
    // point 10 of the bottom straight (heading +x): left is +y, right is -y
    const [x, y] = track.centerline.points[10];
    const left = castRay(strip, 10, x, y, 0, 1, 30, null, hit());
    expect(left.wallM).toBeCloseTo(track.centerline.halfWidthLeftM[10], 3);
    expect(left.wallSide).toBe(1);
    const right = castRay(strip, 10, x, y, 0, -1, 30, null, hit());
    expect(right.wallM).toBeCloseTo(track.centerline.halfWidthRightM[10], 3);
    expect(right.wallSide).toBe(-1);
  });

  it('a ray shorter than the way to the wall meets nothing', () => {
    const [x, y] = track.centerline.points[10];
    const r = castRay(strip, 10, x, y, 0, 1, 2, cells, hit());
    expect(r.wallM).toBe(Infinity);
    expect(r.wallSide).toBe(0);
  });

  it('straight ahead along the bottom straight: the outer wall of the half circle, sqrt(ρ² − R²) past its start', () => {
    // circle of radius ρ = R + right half width about (L/2, 0) met by the line y = -R (elementary geometry)
    const [x, y] = track.centerline.points[0];
    const r = castRay(strip, 0, x, y, 1, 0, 200, null, hit());
    expect(r.wallSide).toBe(-1);
    // the right half width of the stadium lies in [5.5, 6] m
    const R = 40, L = 120;
    expect(r.wallM).toBeGreaterThan(L / 2 + Math.sqrt((R + 5.5) ** 2 - R * R) - 0.05);
    expect(r.wallM).toBeLessThan(L / 2 + Math.sqrt((R + 6) ** 2 - R * R) + 0.05);
  });

  it('a gate just past a rung whose rounded lap position points at the quad before is still met', () => {
    // regression: the stadium's spacing ships rounded (1.001 m), so the gate at s = 427.321 m
    // computes to quad 426 while it lies in quad 427, 3.6 cm ahead of point 427
    const i = 75550 % strip.n;
    const [x, y] = track.centerline.points[i];
    const r = castRay(strip, i, x, y, 1, 0, 1, cells, hit());
    expect(r.gateM).toBeCloseTo(rayHit(x, y, 1, 0, gates), 9);
  });

  test.prop([fc.integer({ min: 0, max: 100_000 }), fc.double({ min: -Math.PI, max: Math.PI, noNaN: true }), fc.double({ min: 1, max: 150, noNaN: true })])(
    'the first wall and the first gate agree with a brute-force cast against every segment',
    (at, angle, length) => {
      const i = at % strip.n;
      const [x, y] = track.centerline.points[i];
      const dx = Math.cos(angle), dy = Math.sin(angle);
      const r = castRay(strip, i, x, y, dx, dy, length, cells, hit());
      const wall = rayHit(x, y, dx, dy, walls);
      const gate = rayHit(x, y, dx, dy, gates);
      if (wall <= length) expect(r.wallM).toBeCloseTo(wall, 9);
      else expect(r.wallM).toBe(Infinity);
      // a gate counts only before the ray leaves the road
      if (gate <= Math.min(length, wall)) expect(r.gateM).toBeCloseTo(gate, 9);
      else expect(r.gateM).toBe(Infinity);
    },
  );
});

describe('gateCells', () => {
  it('every gate is listed in the quad of its lap position and the two beside it', () => {
    const { first } = cells;
    expect(first[strip.n]).toBe(3 * track.gates.length);
    for (const g of track.gates) {
      const q = Math.floor(g.s / strip.spacingM);
      expect(first[q + 1] - first[q]).toBeGreaterThan(0);
    }
  });
});
