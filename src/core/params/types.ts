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

/**
 * The vehicle whose drivability a track is checked for (src/core/drive): size, steering and
 * grip. Units: metres, degrees, m/s and m/s².
 */
export interface VehicleSpec {
  /** Distance between the axles, metres. */
  readonly wheelbaseM: number;
  /** Footprint width and length, metres (the footprint is centred midway between the axles). */
  readonly widthM: number;
  readonly lengthM: number;
  /** Steering lock: the largest front wheel angle, degrees. */
  readonly maxSteerDeg: number;
  /** Tyre–road friction coefficient. */
  readonly mu: number;
  /** Largest forward acceleration and braking deceleration, m/s² (grip caps both at mu·g). */
  readonly maxAccelMps2: number;
  readonly maxBrakeMps2: number;
  /** Top speed, m/s. */
  readonly topSpeedMps: number;
}

/** A fan of range sensors for the sensor check: ray count, spread between the outermost rays (degrees) and reach (metres). */
export interface SensorSpec {
  readonly count: number;
  readonly spreadDeg: number;
  readonly lengthM: number;
}

/**
 * What the generator does with corners tighter than the vehicle can follow and with layouts the
 * reference drive cannot lap: 'avoid' raises the radius floor and retries the layout; 'refuse'
 * answers infeasible, with the reason and the place.
 */
export type Drivability = 'refuse' | 'avoid';

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
  readonly vehicle: VehicleSpec;
  readonly drivability: Drivability;
  readonly sensors: SensorSpec;
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
  readonly vehicle?: Partial<VehicleSpec>;
  readonly drivability?: Drivability;
  readonly sensors?: Partial<SensorSpec>;
}
