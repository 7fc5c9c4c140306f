import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Point, Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, stadiumTrack, type MutableTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();
const n = base.centerline.points.length;
const mutated = (f: (t: MutableTrack) => void): Track => {
  const t = cloneTrack(base);
  f(t);
  return t as Track;
};
/** Unit left normal at point i, from the shipped neighbours. */
function leftNormal(t: Track, i: number): [number, number] {
  const p = t.centerline.points;
  const a = p[(i + n - 1) % n], b = p[(i + 1) % n];
  const dx = b[0] - a[0], dy = b[1] - a[1], len = Math.hypot(dx, dy);
  return [-dy / len, dx / len];
}
const offset = (p: Point, nrm: [number, number], d: number): [number, number] => [p[0] + d * nrm[0], p[1] + d * nrm[1]];

describe('crossing rules', () => {
  test("a figure-eight centerline is a 'centerline_crossing'", () => {
    // lemniscate of Gerono (x, y) = (a cos t, a sin t cos t): a closed curve through its own centre twice
    const r = validateTrack(mutated((t) => {
      t.centerline.points = t.centerline.points.map((_, i) => {
        const u = (2 * Math.PI * i) / n;
        return [Math.round(150e3 * Math.cos(u)) / 1e3, Math.round(150e3 * Math.sin(u) * Math.cos(u)) / 1e3];
      });
    }));
    expect(codesOf(r)).toContain('centerline_crossing');
    const issue = r.issues.find((i) => i.code === 'centerline_crossing')!;
    // the self crossing is at the origin
    expect(Math.hypot(issue.at!.x!, issue.at!.y!)).toBeLessThan(1);
  });

  test("two left-wall vertices in swapped order are a 'wall_crossing'", () => {
    const r = validateTrack(mutated((t) => {
      const w = t.walls.left;
      [w[100], w[101]] = [w[101], w[100]];
    }));
    // the swapped vertices also sit off their half widths
    expect(codesOf(r)).toEqual(['wall_crossing', 'width']);
  });

  test("a left-wall vertex pushed across the right wall is a 'walls_touch'", () => {
    const r = validateTrack(mutated((t) => {
      const i = 250;
      t.walls.left[i] = offset(t.centerline.points[i], leftNormal(t, i), -(t.centerline.halfWidthRightM[i] + 1));
    }));
    expect(codesOf(r)).toContain('walls_touch');
    expect(codesOf(r)).toContain('wall_touches_centerline');
  });

  test("a left-wall vertex pushed just across the centerline is a 'wall_touches_centerline'", () => {
    const r = validateTrack(mutated((t) => {
      const i = 250;
      t.walls.left[i] = offset(t.centerline.points[i], leftNormal(t, i), -0.5);
    }));
    expect(codesOf(r)).toEqual(['wall_touches_centerline', 'width']);
  });

  test('a wall vertex exactly on the centerline touches it (touching counts)', () => {
    const r = validateTrack(mutated((t) => {
      const p = t.centerline.points;
      // on the top straight the centerline is exactly horizontal: put the vertex on the segment 250 -> 251
      t.walls.left[250] = [(p[250][0] + p[251][0]) / 2, p[250][1]];
    }));
    expect(codesOf(r)).toContain('wall_touches_centerline');
  });
});
