import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, mirrorTrack, stadiumTrack, type MutableTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();
const codes = (f: (t: MutableTrack) => void, from: Track = base): string[] => {
  const t = cloneTrack(from);
  f(t);
  return codesOf(validateTrack(t as Track));
};

describe('corner rules', () => {
  test("a dropped corner is a 'corner_count' issue", () => {
    expect(codes((t) => { t.corners.pop(); })).toEqual(['corner_count']);
  });

  test("turnBalance asking for a right-hand corner is a 'turn_balance' issue", () => {
    // Math.round(0.5 × 2) = 1 right-hand corner wanted, the stadium has none
    expect(codes((t) => { t.params.turnBalance = 0.5; })).toEqual(['turn_balance']);
  });

  test("a corner angle 10° off is a 'corner_mismatch' issue", () => {
    const t = cloneTrack(base);
    t.corners[1].angleDeg = 170;
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['corner_mismatch']);
    // a semicircle turns 180° (elementary geometry); chords centred on the corner ends see a little less
    expect(r.issues[0]).toMatchObject({ at: { index: 1 }, limit: 170 });
    expect(r.issues[0].actual!).toBeGreaterThan(178);
    expect(r.issues[0].actual!).toBeLessThanOrEqual(180);
  });

  test('a corner claiming the wrong direction is a mismatch (and breaks the balance)', () => {
    expect(codes((t) => { t.corners[0].direction = 'right'; })).toEqual(['corner_mismatch', 'turn_balance']);
  });

  test.each([
    ['sStart after sEnd', (t: MutableTrack) => { [t.corners[0].sStart, t.corners[0].sEnd] = [t.corners[0].sEnd, t.corners[0].sStart]; }],
    ['overlapping corners', (t: MutableTrack) => { t.corners[1].sStart = t.corners[0].sEnd - 1; }],
    ['out of order', (t: MutableTrack) => { t.corners.reverse(); }],
    ['beyond the lap', (t: MutableTrack) => { t.corners[1].sEnd = t.centerline.lengthM + 1; }],
    ['minRadiusM below the limit', (t: MutableTrack) => { t.corners[0].minRadiusM = 39.9; }],
  ])("%s is a 'corner_mismatch' issue", (_, f) => {
    expect(codes(f)).toEqual(['corner_mismatch']);
  });

  test('a clockwise corner list is checked with the loop direction', () => {
    const cw = mirrorTrack(base);
    expect(codes(() => {}, cw)).toEqual([]);
    expect(codes((t) => { t.corners[0].angleDeg = 190; }, cw)).toEqual(['corner_mismatch']);
  });
});
