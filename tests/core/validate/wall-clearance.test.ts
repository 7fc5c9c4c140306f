import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, stadiumTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();

describe("rule 'clearance'", () => {
  test('straights 80 m apart cannot keep 70 m between wall solids reaching ~6.5 m each', () => {
    const t = cloneTrack(base);
    t.params.clearanceM = 70;
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['clearance']);
    for (const issue of r.issues) {
      expect(issue.limit).toBe(70);
      expect(issue.actual!).toBeLessThan(70);
      // both parts are named by their lap positions
      expect(issue.message).toMatch(/^wall solids at s=[\d.]+ m and s=[\d.]+ m (are [\d.]+ m apart|overlap by [\d.]+ m), need 70 m/);
    }
  });

  test('one pinch is one issue', () => {
    const t = cloneTrack(base);
    // pull a short stretch of the top straight (and its walls) down towards the bottom one
    for (let i = 240; i <= 260; i++) {
      const dy = -68 * Math.sin((Math.PI * (i - 240)) / 20) ** 2;
      for (const line of [t.centerline.points, t.walls.left, t.walls.right]) line[i] = [line[i][0], Math.round((line[i][1] + dy) * 1e3) / 1e3];
    }
    const r = validateTrack(t as Track);
    const clearance = r.issues.filter((i) => i.code === 'clearance');
    expect(clearance).toHaveLength(1);
  });

  test('a margin the stadium keeps passes', () => {
    const t = cloneTrack(base);
    // 80 m between the straights less two reaches of at most 6.5 m
    t.params.clearanceM = 66;
    expect(validateTrack(t as Track).issues).toEqual([]);
  });

  // an uploaded track may carry any finite margin: the search must stay bounded (it once sorted
  // pairs into 4·10⁹ buckets of 0.5 m and ran for minutes)
  test('an absurd margin (1e9 m) is answered: every far pair is too close, a short list of issues', () => {
    const t = cloneTrack(base);
    t.params.clearanceM = 1e9;
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['clearance']);
    expect(r.issues.length).toBeGreaterThan(0);
    expect(r.issues.length).toBeLessThanOrEqual(8);
    for (const issue of r.issues) expect(issue.limit).toBe(1e9);
  });
});
