import { describe, expect, it } from 'vitest';
import { CURRICULUM_STAGES, curriculumStages, difficultyBands, MIN_LEVEL_STEP, TECHNICAL_LEVEL } from '../../../src/core/batch/curriculum.js';
import { isValueRange, type Ranged } from '../../../src/core/batch/ranges.js';
import { paramRangesSchema } from '../../../src/schema/batch.js';

const lo = (r: Ranged | undefined): number => (r === undefined ? NaN : isValueRange(r) ? r.min : r);
const hi = (r: Ranged | undefined) => (r === undefined ? NaN : isValueRange(r) ? r.max : r);

describe('curriculumStages', () => {
  it('goes from a loop turning left, through a loop turning right, to mixed circuits', () => {
    const stages = curriculumStages(5);
    expect(stages.map((s) => s.kind)).toEqual(['loop-left', 'loop-right', 'mixed', 'mixed', 'mixed']);
    expect(stages.map((s) => s.level)).toEqual([0, 0.1875, 0.375, 0.5625, TECHNICAL_LEVEL]);
    expect(stages[0].params).toMatchObject({ curvatureBudgetDeg: 360, turnBalance: 0 });
    expect(stages[1].params).toMatchObject({ curvatureBudgetDeg: 360, turnBalance: 1 });
  });

  it('every stage\'s params are valid batch parameters, and stages never share a level\'s ranges', () => {
    for (const [n, from, to] of [[5, 0, TECHNICAL_LEVEL], [10, 0, 1], [2, 0.3, 0.4], [4, 0.5, 1]] as const) {
      const stages = curriculumStages(n, from, to);
      for (const s of stages) expect(paramRangesSchema.safeParse(s.params).success).toBe(true);
      for (let k = 1; k < stages.length; k++) {
        const [a, b] = [stages[k - 1].params, stages[k].params];
        // harder along the ladder: tighter, narrower, more turning per metre (mixed stages)
        expect(hi(b.minCornerRadiusM)).toBeLessThanOrEqual(lo(a.minCornerRadiusM));
        expect(hi(b.widthM?.max)).toBeLessThanOrEqual(lo(a.widthM?.max));
        const density = (p: typeof a) => (lo(p.curvatureBudgetDeg) + hi(p.curvatureBudgetDeg)) / (lo(p.lengthM) + hi(p.lengthM));
        expect(density(b)).toBeGreaterThan(density(a));
      }
    }
  });

  it('refuses bad stage counts, levels, and stages closer than MIN_LEVEL_STEP', () => {
    expect(() => curriculumStages(CURRICULUM_STAGES.max + 1, 0, 1)).toThrow(RangeError);
    expect(() => curriculumStages(1)).toThrow(RangeError);
    expect(() => curriculumStages(3, 0.5, 0.5)).toThrow('must be below');
    expect(() => curriculumStages(3, -0.1, 0.5)).toThrow(RangeError);
    expect(() => curriculumStages(4, 0, 2 * MIN_LEVEL_STEP)).toThrow('ask for at most 3 stages');
  });
});

describe('difficultyBands', () => {
  it('puts inner edges halfway between medians, off the 3-decimal grid, from 0 to 10', () => {
    expect(difficultyBands([3.3, 3.9, 4.6])).toEqual([
      { min: 0, max: 3.6005 },
      { min: 3.6005, max: 4.2505 },
      { min: 4.2505, max: 10 },
    ]);
  });

  it('refuses medians that do not rise strictly', () => {
    expect(difficultyBands([3.3, 3.3, 4])).toBeNull();
    expect(difficultyBands([4, 3.9])).toBeNull();
  });
});
