import type { CornerShape } from './corner-shape.js';

/** One planned corner: direction, turning, tightest curvature and the profile between. */
export interface PlannedCorner {
  /** +1 turns left (counter-clockwise), -1 right. */
  readonly sign: 1 | -1;
  /** Absolute turning of the corner, radians. */
  readonly angleRad: number;
  /** Peak |curvature|, 1/m: the corner's tightest radius is its inverse. */
  readonly peakCurvature: number;
  /** Centerline length of the corner, metres: angle / (peak * shape mean). */
  readonly lengthM: number;
  readonly shape: CornerShape;
}

/**
 * A closed lap as alternating corners and straights: corner 0, straight 0, corner 1, ...,
 * straight n-1 back to corner 0. Heading 0 at the start of corner 0; the loop turns
 * `loopSign` * 2π in all.
 */
export interface Plan {
  readonly corners: readonly PlannedCorner[];
  /** Straight after corner i, metres. */
  readonly straights: Float64Array;
  readonly loopSign: 1 | -1;
  /** Total length, metres. */
  readonly lengthM: number;
}
