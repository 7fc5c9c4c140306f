import { describe, expect, test } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, mirrorTrack, stadiumTrack, type MutableTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack(); // four spawns on the bottom straight (travel +x, left +y), rows 3 m apart, at ±2 m
const codes = (f: (t: MutableTrack) => void, from: Track = base): string[] => {
  const t = cloneTrack(from);
  f(t);
  return codesOf(validateTrack(t as Track));
};

describe('spawn rules', () => {
  test("a car moved 3 m to the left, through the left wall, is a 'spawn_outside' issue", () => {
    expect(codes((t) => { t.spawns[0].position = [t.spawns[0].position[0], t.spawns[0].position[1] + 3]; })).toEqual(['spawn_outside']);
  });

  test("a car moved 2 m forward, across the start line, is a 'spawn_ahead' issue", () => {
    const t = cloneTrack(base);
    t.spawns[0].position = [t.spawns[0].position[0] + 2, t.spawns[0].position[1]];
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['spawn_ahead']);
    // the nose was 1.1 m behind the line and is now 0.9 m past it
    expect(r.issues[0].actual).toBeCloseTo(0.9, 2);
  });

  test("a spawn whose s lies in the lap's first half is a 'spawn_ahead' issue", () => {
    expect(codes((t) => { t.spawns[0].s = 10; })).toEqual(['spawn_ahead']);
  });

  test("a car turned by 10° is a 'spawn_alignment' issue", () => {
    expect(codes((t) => { t.spawns[2].headingDeg += 10; })).toEqual(['spawn_alignment']);
  });

  test('a car turned by 2.9° is aligned', () => {
    expect(codes((t) => { t.spawns[2].headingDeg -= 2.9; })).toEqual([]);
  });

  test("two cars in one place are a 'spawn_overlap' issue", () => {
    const t = cloneTrack(base);
    t.spawns[1].position = [t.spawns[0].position[0] - 1, t.spawns[0].position[1]];
    const r = validateTrack(t as Track);
    expect(codesOf(r)).toEqual(['spawn_overlap']);
    expect(r.issues[0].message).toContain('spawns 0');
  });

  test('footprints that only touch do not overlap', () => {
    // spawn 2 sits 6 m behind spawn 0 in the same column: move it up to exactly one car length (4.5 m) behind
    expect(codes((t) => { t.spawns[2].position = [t.spawns[0].position[0] - 4.5, t.spawns[0].position[1]]; })).toEqual([]);
    expect(codes((t) => { t.spawns[2].position = [t.spawns[0].position[0] - 4.499, t.spawns[0].position[1]]; })).toEqual(['spawn_overlap']);
  });

  test('a rotated car overlaps where its axis-aligned box would not tell', () => {
    // two cars side by side 2.1 m apart (0.1 m gap); turning one by 30° swings its corner into the other
    expect(codes((t) => {
      t.spawns[1].position = [t.spawns[0].position[0], t.spawns[0].position[1] - 2.1];
      t.spawns[1].headingDeg = 30;
    })).toContain('spawn_overlap');
  });

  test('the mirrored grid is valid and its checks work the same way', () => {
    const cw = mirrorTrack(base);
    expect(codes(() => {}, cw)).toEqual([]);
    // on the mirrored track the left wall is towards -y
    expect(codes((t) => { t.spawns[0].position = [t.spawns[0].position[0], t.spawns[0].position[1] - 3]; }, cw)).toEqual(['spawn_outside']);
  });

  test('many spawns (grid-indexed ring) are checked the same way', () => {
    const t = stadiumTrack({ straightM: 300, radiusM: 60, spawnSlots: 40 });
    expect(validateTrack(t).issues).toEqual([]);
    expect(codes((m) => { m.spawns[37].position = [m.spawns[37].position[0], m.spawns[37].position[1] - 3]; }, t)).toEqual(['spawn_outside']);
  });
});
