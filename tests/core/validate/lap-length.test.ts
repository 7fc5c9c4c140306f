import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, stadiumTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();

describe("rule 'length'", () => {
  test('a requested length 5% longer than the lap is reported with the bound crossed', () => {
    const t = cloneTrack(base);
    t.params.lengthM = Math.round(base.params.lengthM * 1.05);
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['length']);
    expect(r.issues[0].limit).toBeCloseTo(t.params.lengthM * 0.97, 3);
    // stadium of two 120 m straights and radius 40 m: perimeter 2L + 2πR (elementary geometry), less < 1 cm of chords
    expect(r.issues[0].actual).toBeCloseTo(240 + 80 * Math.PI, 1);
  });

  test('2.9% off still passes', () => {
    const t = cloneTrack(base);
    t.params.lengthM = base.params.lengthM * 1.029;
    expect(validateTrack(t as Track).issues).toEqual([]);
  });
});
