import type { Plan } from './plan-types.js';
import type { Trace } from './trace.js';

/** Gap kept between the start line and the next corner, metres (common practice, no source). */
export const START_LINE_BEFORE_CORNER_M = 30;

/**
 * Lap position (trace coordinates) of the start line: on the longest straight, with the grid
 * of `gridLengthM` behind it on the same straight where it fits, and the line well before the
 * straight's end so that the first gates are not at a corner entry.
 */
export function chooseStartS(plan: Plan, trace: Trace, gridLengthM: number): number {
  let best = 0;
  for (let i = 1; i < plan.straights.length; i++) if (plan.straights[i] > plan.straights[best]) best = i;
  const length = plan.straights[best];
  const from = trace.s[trace.cornerEnd[best]];
  // the line sits after the grid, leaving a share of the rest before the next corner
  const room = length - gridLengthM;
  const offset = room > 0 ? gridLengthM + Math.min(0.6 * room, Math.max(0, room - START_LINE_BEFORE_CORNER_M)) : 0.5 * length;
  return from + offset;
}
