// Tests for src/core/drive/road-strip.ts: the road as a strip of quads between the wall faces.

import { fc, test } from '@fast-check/vitest';
import { describe, expect, it } from 'vitest';
import { buildRoadStrip, leftFaceDistance, locateQuad, rightFaceDistance } from '../../../src/core/drive/road-strip.js';
import { moveTrack, stadiumTrack } from '../../helpers/synthetic-track.js';
import { pointSegment, wallSegments } from '../../helpers/wall-distance.js';

const track = stadiumTrack();
const strip = buildRoadStrip(track);
const n = strip.n;

describe('buildRoadStrip', () => {
  it('one quad per centerline point; faces must have one vertex per point', () => {
    expect(n).toBe(track.centerline.points.length);
    expect(() => buildRoadStrip({ ...track, walls: { ...track.walls, left: track.walls.left.slice(1) } })).toThrow(RangeError);
  });
});

describe('locateQuad', () => {
  it('the middle of every centerline segment lies in its own quad, found from hints up to 10 quads away', () => {
    const C = strip.center;
    for (let i = 0; i < n; i++) {
      const k = (i + 1) % n;
      const x = (C[2 * i] + C[2 * k]) / 2, y = (C[2 * i + 1] + C[2 * k + 1]) / 2;
      for (const hint of [i, (i + 10) % n, (i - 10 + n) % n]) expect(locateQuad(strip, x, y, hint)).toBe(i);
    }
  });

  it('a point far off the road is not located', () => {
    expect(locateQuad(strip, 5000, 5000, 0)).toBe(-1);
  });
});

describe('face distances', () => {
  it('at a centerline point the faces lie a half width away, on the road side', () => {
    const c = track.centerline;
    for (let i = 0; i < n; i += 7) {
      const [x, y] = c.points[i];
      // the face segment from vertex i to i + 1 is a chord: on the arcs it passes within (1 m)² / 8R of vertex i's circle
      expect(leftFaceDistance(strip, i, x, y)).toBeCloseTo(c.halfWidthLeftM[i], 2);
      expect(rightFaceDistance(strip, i, x, y)).toBeCloseTo(c.halfWidthRightM[i], 2);
    }
  });

  test.prop([fc.integer({ min: 0, max: 10_000 }), fc.double({ min: -8, max: 8, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), fc.integer({ min: 0, max: 3 })])(
    'equal the brute-force distance to the nearest wall segment (sign: on the road or beyond the wall), under quarter turns and shifts',
    (at, lateral, along, turns) => {
      const moved = moveTrack(track, turns, 1000 * turns, -500);
      const s = buildRoadStrip(moved);
      const i = at % n, k = (i + 1) % n;
      const C = s.center;
      const cx = C[2 * i] + along * (C[2 * k] - C[2 * i]), cy = C[2 * i + 1] + along * (C[2 * k + 1] - C[2 * i + 1]);
      const tx = C[2 * k] - C[2 * i], ty = C[2 * k + 1] - C[2 * i + 1], len = Math.hypot(tx, ty);
      const x = cx - (ty / len) * lateral, y = cy + (tx / len) * lateral;
      const j = locateQuad(s, x, y, i);
      expect(j).toBeGreaterThanOrEqual(0);
      const d = Math.min(leftFaceDistance(s, j, x, y), rightFaceDistance(s, j, x, y));
      // the faces of the stadium are chords of circles, so the nearest segment is the quad's own
      const { walls } = wallSegments(moved);
      const brute = Math.min(...walls.map((w) => pointSegment(x, y, w)));
      expect(Math.abs(Math.abs(d) - brute)).toBeLessThan(2e-3);
      const onRoad = lateral < Math.min(moved.centerline.halfWidthLeftM[i], moved.centerline.halfWidthLeftM[k]) - 0.01 && -lateral < Math.min(moved.centerline.halfWidthRightM[i], moved.centerline.halfWidthRightM[k]) - 0.01;
      const beyond = lateral > Math.max(moved.centerline.halfWidthLeftM[i], moved.centerline.halfWidthLeftM[k]) + 0.01 || -lateral > Math.max(moved.centerline.halfWidthRightM[i], moved.centerline.halfWidthRightM[k]) + 0.01;
      if (onRoad) expect(d).toBeGreaterThan(0);
      if (beyond) expect(d).toBeLessThan(0);
    },
  );
});
