import { describe, expect, test } from 'vitest';
import { buildGeometry } from '../../../src/core/validate/geometry.js';
import { validateTrack } from '../../../src/core/validate/index.js';
import { createIssueSink } from '../../../src/core/validate/issue-sink.js';
import { checkNesting } from '../../../src/core/validate/nesting.js';
import type { Track } from '../../../src/core/track.js';
import { cloneTrack, codesOf, mirrorTrack, stadiumTrack } from '../../helpers/synthetic-track.js';

const base = stadiumTrack();

describe("rule 'wall_nesting'", () => {
  test('walls swapped (left outside on a counter-clockwise loop) are reported', () => {
    const t = cloneTrack(base);
    [t.walls.left, t.walls.right] = [t.walls.right, t.walls.left];
    [t.centerline.halfWidthLeftM, t.centerline.halfWidthRightM] = [t.centerline.halfWidthRightM, t.centerline.halfWidthLeftM];
    const r = validateTrack(t as Track);
    // no crossing: each face is still simple; the per-point side test of 'width' agrees, and gate ends now miss their faces
    expect(codesOf(r)).toContain('wall_nesting');
    expect(codesOf(r)).not.toContain('walls_touch');
  });

  test('a centerline outside both faces is reported', () => {
    const t = cloneTrack(base);
    t.centerline.points = t.centerline.points.map(([x, y]) => [x + 1000, y]);
    const sink = createIssueSink();
    checkNesting(buildGeometry(t as Track), sink);
    expect(sink.issues.map((i) => i.code)).toEqual(['wall_nesting']);
    expect(sink.issues[0].message).toContain('centerline must run between the walls');
  });

  test('nested faces pass on both loop directions', () => {
    for (const t of [base, mirrorTrack(base)]) {
      const sink = createIssueSink();
      checkNesting(buildGeometry(t), sink);
      expect(sink.issues).toEqual([]);
    }
  });
});
