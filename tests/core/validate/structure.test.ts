import { fc, test } from '@fast-check/vitest';
import { describe, expect } from 'vitest';
import { validateTrack } from '../../../src/core/validate/index.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, stadiumTrack, type MutableTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();
const check = (t: unknown) => validateTrack(t as Track);
const mutated = (f: (t: MutableTrack) => void): unknown => {
  const t = cloneTrack(base);
  f(t);
  return t;
};

describe("rule 'structure'", () => {
  test('a NaN coordinate is reported alone (the other rules do not run)', () => {
    const r = check(mutated((t) => { t.centerline.points[17] = [NaN, 3]; }));
    expect(r.valid).toBe(false);
    expect(codesOf(r)).toEqual(['structure']);
    expect(r.issues[0]).toMatchObject({ at: { index: 17 } });
    expect(r.issues[0].message).toContain('centerline.points[17]');
  });

  test.each([
    ['infinite wall coordinate', (t: MutableTrack) => { t.walls.left[3] = [Infinity, 0]; }],
    ['huge coordinate', (t: MutableTrack) => { t.walls.right[3] = [1e300, 0]; }],
    ['s shorter than points', (t: MutableTrack) => { t.centerline.s.pop(); }],
    ['right wall longer than points', (t: MutableTrack) => { t.walls.right.push([0, 0]); }],
    ['half width missing', (t: MutableTrack) => { (t.centerline as { halfWidthLeftM?: unknown }).halfWidthLeftM = undefined; }],
    ['curvature as text', (t: MutableTrack) => { (t.centerline.curvature as unknown[])[4] = '0.1'; }],
    ['empty points', (t: MutableTrack) => { t.centerline.points = []; }],
    ['fewer than 8 points', (t: MutableTrack) => {
      for (const k of ['points', 's', 'headingDeg', 'curvature', 'halfWidthLeftM', 'halfWidthRightM'] as const) t.centerline[k].length = 7;
      t.walls.left.length = 7;
      t.walls.right.length = 7;
    }],
    ['no gates', (t: MutableTrack) => { t.gates = []; }],
    ['a gate without forward', (t: MutableTrack) => { (t.gates[2] as { forward?: unknown }).forward = null; }],
    ['spawn count differs from spawnSlots', (t: MutableTrack) => { t.spawns.pop(); }],
    ['spacing 0', (t: MutableTrack) => { t.centerline.spacingM = 0; }],
    ['s not increasing', (t: MutableTrack) => { t.centerline.s[10] = t.centerline.s[9]; }],
    ['s not starting at 0', (t: MutableTrack) => { t.centerline.s[0] = 0.5; }],
    ['repeated centerline point', (t: MutableTrack) => { t.centerline.points[11] = t.centerline.points[10]; }],
    ['corner with an unknown direction', (t: MutableTrack) => { (t.corners[0] as { direction: string }).direction = 'up'; }],
    ['params missing', (t: MutableTrack) => { (t as { params?: unknown }).params = undefined; }],
    ['minCornerRadiusM 0', (t: MutableTrack) => { t.params.minCornerRadiusM = 0; }],
    ['metrics missing', (t: MutableTrack) => { (t as { metrics?: unknown }).metrics = undefined; }],
  ])('%s is a structure issue', (_, f) => {
    const r = check(mutated(f));
    expect(codesOf(r)).toEqual(['structure']);
  });

  test.each([null, undefined, 0, 'track', [], {}, { centerline: {} }, { centerline: { points: 'abc' }, walls: {}, params: {} }])(
    '%j is a structure issue',
    (input) => {
      expect(codesOf(check(input))).toEqual(['structure']);
    },
  );

  test('a huge broken upload yields a short list', () => {
    const t = cloneTrack(base);
    t.centerline.s = t.centerline.s.map(() => NaN);
    expect(check(t).issues.length).toBeLessThanOrEqual(8);
  });

  test.prop([fc.anything()])('never throws on anything', (input) => {
    const r = check(input);
    expect(r.valid).toBe(false);
    expect(codesOf(r)).toEqual(['structure']);
  });

  // replace one field anywhere in a valid track with an arbitrary value: the checker must answer, not throw
  const paths: string[][] = [];
  const walk = (v: unknown, path: string[], depth: number): void => {
    paths.push(path);
    if (depth === 0 || v === null || typeof v !== 'object') return;
    const keys = Object.keys(v);
    for (const k of Array.isArray(v) ? keys.filter((_, i) => i < 3 || i === keys.length - 1) : keys) {
      walk((v as Record<string, unknown>)[k], [...path, k], depth - 1);
    }
  };
  walk(base, [], 4);
  // the base track with the field at `path` replaced, checked: an answer, well formed, and never
  // the last-resort catch in validateTrack
  const expectAnsweredWith = (path: string[], value: unknown): void => {
    const t = cloneTrack(base) as unknown as Record<string, unknown>;
    let o = t;
    for (const k of path.slice(0, -1)) o = o[k] as Record<string, unknown>;
    o[path[path.length - 1]] = value;
    const r = check(t);
    expect(r.valid).toBe(r.issues.length === 0);
    for (const issue of r.issues) expect(typeof issue.message).toBe('string');
    expect(r.issues.map((i) => i.message).join('\n')).not.toContain('could not be checked');
  };
  test.prop([fc.constantFrom(...paths.filter((p) => p.length > 0)), fc.oneof(fc.anything(), fc.double(), fc.constant([]), fc.constant([NaN, NaN]))])(
    "never throws when any field is replaced by garbage",
    (path, value) => expectAnsweredWith(path, value),
  );

  // the random draws above rarely hit the numbers that strain a rule's arithmetic (a margin of
  // 1e9 m once made the clearance search run for minutes): every field, each edge value
  test('every field replaced by each of 18 edge numbers: answered, issues well formed', () => {
    const values = [5e-324, 1e-320, 1e-300, 1e-12, 1e-9, 1e-6, 1e308, -1e308, 1e15, 1e9, 999999999, -999999999, -0, 2 ** 31, 2 ** 53, -1, 0.5, 3];
    for (const path of paths.filter((p) => p.length > 0)) for (const value of values) expectAnsweredWith(path, value);
  });
});
