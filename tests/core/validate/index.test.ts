import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { polylineLength } from '../../../src/core/geom/polyline.js';
import { ISSUE_CODES } from '../../../src/core/errors.js';
import { validateTrack } from '../../../src/core/validate/index.js';
import { MAX_ISSUES_PER_RULE } from '../../../src/core/validate/issue-sink.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, mirrorTrack, moveTrack, stadiumPerimeter, stadiumTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();

describe('validateTrack on the synthetic stadium', () => {
  test('the fixture has the stadium perimeter 2L + 2πR', () => {
    // stadium of two 120 m straights and two semicircles of radius 40 m: perimeter 2L + 2πR (elementary geometry);
    // the 1 m chords of the arcs fall short by n·c³/(24R²) < 1 cm, and rounding to 1 mm adds < 0.5 m over 491 points
    const flat = new Float64Array(base.centerline.points.flat());
    expect(stadiumPerimeter(120, 40)).toBeCloseTo(240 + 80 * Math.PI, 12);
    expect(Math.abs(polylineLength(flat, true) - (240 + 80 * Math.PI))).toBeLessThan(0.01);
  });

  test('a counter-clockwise stadium with all corners left is valid', () => {
    expect(validateTrack(base)).toEqual({ valid: true, issues: [] });
  });

  test('its mirror image (clockwise, turnBalance 1) is valid', () => {
    const mirrored = mirrorTrack(base);
    expect(mirrored.params.turnBalance).toBe(1);
    expect(validateTrack(mirrored)).toEqual({ valid: true, issues: [] });
  });

  test('other sizes and spacings are valid too', () => {
    for (const opts of [{ straightM: 30, radiusM: 20 }, { straightM: 400, radiusM: 90, spacingM: 2 }, { straightM: 200, radiusM: 60, spacingM: 0.5, spawnSlots: 12 }]) {
      expect(validateTrack(stadiumTrack(opts)).issues).toEqual([]);
    }
  });

  test.prop([fc.integer({ min: 0, max: 3 }), fc.integer({ min: -10_000, max: 10_000 }), fc.integer({ min: -10_000, max: 10_000 })])(
    'rigid quarter turns and integer shifts keep it valid',
    (q, dx, dy) => {
      expect(validateTrack(moveTrack(base, q, dx, dy)).issues).toEqual([]);
      expect(validateTrack(moveTrack(mirrorTrack(base), q, dx, dy)).issues).toEqual([]);
    },
  );

  test('valid is exactly "no issues", and every code is a known one', () => {
    const t = cloneTrack(base);
    t.params.lengthM *= 2;
    t.params.curvatureBudgetDeg = 900;
    const r = validateTrack(t as Track);
    expect(r.valid).toBe(false);
    expect(codesOf(r)).toEqual(['length', 'total_turning']);
    for (const issue of r.issues) expect(ISSUE_CODES).toContain(issue.code);
  });

  test('issue messages name the value and the limit', () => {
    const t = cloneTrack(base);
    t.centerline.curvature[341] = 0.05; // radius 20 m on the top straight
    t.params.gateSpacingM.min = 1; // keep the spacing law from flagging the tighter spot
    const [issue] = validateTrack(t as Track).issues.filter((i) => i.code === 'min_radius');
    expect(issue).toMatchObject({ code: 'min_radius', at: { index: 341, s: t.centerline.s[341] }, limit: 40, actual: 20 });
    expect(issue.message).toBe(`radius 20 m < 40 m at s=${t.centerline.s[341]} m (shipped curvature 0.05 1/m)`);
  });

  test(`at most ${MAX_ISSUES_PER_RULE} issues per rule`, () => {
    const t = cloneTrack(base);
    // every other point too tight: one stretch per point
    for (let i = 0; i < t.centerline.curvature.length; i += 2) t.centerline.curvature[i] = 1;
    const r = validateTrack(t as Track);
    const byCode = new Map<string, number>();
    for (const i of r.issues) byCode.set(i.code, (byCode.get(i.code) ?? 0) + 1);
    expect(byCode.get('min_radius')).toBe(MAX_ISSUES_PER_RULE);
    for (const count of byCode.values()) expect(count).toBeLessThanOrEqual(MAX_ISSUES_PER_RULE);
  });
});
