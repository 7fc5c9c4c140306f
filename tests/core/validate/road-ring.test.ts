import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { pointInPolygon } from '../../../src/core/geom/polyline.js';
import { buildGeometry } from '../../../src/core/validate/geometry.js';
import { buildRoadRing } from '../../../src/core/validate/road-ring.js';
import { mirrorTrack, stadiumTrack } from '../../helpers/synthetic-track.js';

const ccw = buildGeometry(stadiumTrack());
const cw = buildGeometry(mirrorTrack(stadiumTrack()));

// oracle: the plain O(n) winding test on both faces
function oracle(g: typeof ccw, x: number, y: number): boolean {
  const [inner, outer] = g.loopSign > 0 ? [g.left, g.right] : [g.right, g.left];
  return pointInPolygon(x, y, inner) === -1 && pointInPolygon(x, y, outer) === 1;
}

describe('road ring point location', () => {
  test.prop([fc.constantFrom(ccw, cw), fc.double({ min: -120, max: 120, noNaN: true }), fc.double({ min: -60, max: 60, noNaN: true }), fc.boolean()])(
    'scan and grid agree with pointInPolygon on both faces',
    (g, x, y, many) => {
      expect(buildRoadRing(g, many ? 1000 : 1).contains(x, y)).toBe(oracle(g, x, y));
    },
  );

  test.prop([fc.constantFrom(ccw, cw), fc.integer({ min: 0, max: 490 }), fc.constantFrom('left', 'right'), fc.boolean()])(
    'a face vertex is not inside the ring (strictly)',
    (g, i, side, many) => {
      const f = side === 'left' ? g.left : g.right;
      expect(buildRoadRing(g, many ? 1000 : 1).contains(f[2 * i], f[2 * i + 1])).toBe(false);
    },
  );

  test.prop([fc.constantFrom(ccw, cw), fc.integer({ min: 0, max: 490 }), fc.boolean()])('every centerline point is inside the ring', (g, i, many) => {
    expect(buildRoadRing(g, many ? 1000 : 1).contains(g.center[2 * i], g.center[2 * i + 1])).toBe(true);
  });
});
