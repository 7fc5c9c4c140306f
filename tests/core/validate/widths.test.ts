import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, stadiumTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();

describe("rule 'width'", () => {
  test('a half width that disagrees with the wall geometry is reported', () => {
    const t = cloneTrack(base);
    t.centerline.halfWidthLeftM[200] = Math.round(t.centerline.halfWidthLeftM[200] * 1.1 * 1e3) / 1e3;
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['width']);
    expect(r.issues).toHaveLength(1);
    expect(r.issues[0]).toMatchObject({ at: { index: 200 } });
    expect(r.issues[0].message).toContain('left wall is');
  });

  test('a wall vertex moved by 3 mm along the road is within tolerance, by 3 mm outwards is not', () => {
    const along = cloneTrack(base);
    along.walls.left[250] = [along.walls.left[250][0] - 0.003, along.walls.left[250][1]]; // top straight runs along -x
    expect(validateTrack(along as Track).issues).toEqual([]);
    const out = cloneTrack(base);
    out.walls.left[250] = [out.walls.left[250][0], out.walls.left[250][1] - 0.003]; // left of travel on the top straight is -y
    expect(codesOf(validateTrack(out as Track))).toEqual(['width']);
  });

  test('a road narrower than params.widthM.min is reported once per stretch', () => {
    const t = cloneTrack(base);
    t.params.widthM = { min: 11, max: 14 };
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['width']);
    for (const issue of r.issues) {
      expect(issue.limit).toBe(11);
      expect(issue.actual!).toBeLessThan(11);
    }
    // widths (4.75 + 0.5 sin 2πu) + (5.75 − 0.25 cos 4πu) m dip below 11 m in a few stretches of the lap
    expect(r.issues.length).toBeGreaterThanOrEqual(1);
    expect(r.issues.length).toBeLessThanOrEqual(3);
  });

  test('a road wider than params.widthM.max is reported', () => {
    const t = cloneTrack(base);
    t.params.widthM = { min: 10, max: 11 };
    expect(codesOf(validateTrack(t as Track))).toEqual(['width']);
  });
});
