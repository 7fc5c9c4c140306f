/**
 * Plain TypeScript types of the request parameters (no zod here: the core stays pure).
 * Units: metres and degrees at the interface, as shared/DESIGN.md states.
 */

/** Root of all randomness: an unsigned 32-bit integer or a string of 1..64 characters. */
export type Seed = number | string;

/** A closed interval in metres. */
export interface RangeM {
  readonly min: number;
  readonly max: number;
}

/** Wall solid size in metres. */
export interface WallSpec {
  readonly heightM: number;
  readonly thicknessM: number;
}

/** Footprint of the car used to place non-overlapping start poses, in metres. */
export interface CarSpec {
  readonly lengthM: number;
  readonly widthM: number;
}

/** Every parameter resolved: defaults filled, derived values computed. Echoed as `track.params`. */
export interface TrackParams {
  readonly seed: Seed;
  readonly lengthM: number;
  readonly widthM: RangeM;
  readonly curvatureBudgetDeg: number;
  readonly turnBalance: number;
  readonly cornerCount: number;
  readonly minCornerRadiusM: number;
  readonly noise: number;
  readonly gateSpacingM: RangeM;
  readonly spawnSlots: number;
  readonly wall: WallSpec;
  readonly clearanceM: number;
  readonly car: CarSpec;
}

/** What a caller may send: every field optional; `seed` is required by the core itself. */
export interface TrackRequest {
  readonly seed: Seed;
  readonly lengthM?: number;
  readonly widthM?: Partial<RangeM>;
  readonly curvatureBudgetDeg?: number;
  readonly turnBalance?: number;
  readonly cornerCount?: number;
  readonly minCornerRadiusM?: number;
  readonly noise?: number;
  readonly gateSpacingM?: Partial<RangeM>;
  readonly spawnSlots?: number;
  readonly wall?: Partial<WallSpec>;
  readonly clearanceM?: number;
  readonly car?: Partial<CarSpec>;
}
