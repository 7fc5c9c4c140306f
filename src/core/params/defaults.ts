/**
 * Defaults and allowed ranges of every request parameter (shared/DESIGN.md, "Request parameters").
 * The zod schema at the shells and `resolveParams` in the core both read these, so the limits
 * live in one place.
 */

export const SEED_MAX = 4_294_967_295;
export const SEED_STRING_MAX_CHARS = 64;

export const LIMITS = {
  lengthM: { min: 300, max: 20_000 },
  widthM: { min: 3, max: 40 },
  curvatureBudgetDeg: { min: 360, max: 7200 },
  turnBalance: { min: 0, max: 1 },
  cornerCount: { min: 3, max: 80 },
  minCornerRadiusM: { min: 2, max: 1000 },
  noise: { min: 0, max: 1 },
  gateSpacingM: { min: 1, max: 200 },
  spawnSlots: { min: 1, max: 64 },
  wall: { min: 0.1, max: 10 },
  clearanceM: { min: 0, max: 20 },
  carLengthM: { min: 1, max: 20 },
  carWidthM: { min: 0.5, max: 5 },
  wheelbaseM: { min: 0.5, max: 10 },
  maxSteerDeg: { min: 5, max: 60 },
  mu: { min: 0.1, max: 3 },
  maxAccelMps2: { min: 0.5, max: 30 },
  maxBrakeMps2: { min: 0.5, max: 50 },
  topSpeedMps: { min: 5, max: 150 },
  sensorCount: { min: 1, max: 64 },
  sensorSpreadDeg: { min: 0, max: 360 },
  sensorLengthM: { min: 1, max: 500 },
} as const;

/** Values of `drivability`, the default first. */
export const DRIVABILITY_MODES = ['avoid', 'refuse'] as const;

export const DEFAULTS = {
  lengthM: 1500,
  widthM: { min: 10, max: 14 },
  curvatureBudgetDeg: 900,
  turnBalance: 0.4,
  minCornerRadiusM: 15,
  noise: 0.3,
  gateSpacingM: { min: 5, max: 25 },
  spawnSlots: 1,
  wall: { heightM: 1.2, thicknessM: 0.5 },
  // clearance kept between wall solids of parts of the lap far apart along the track
  clearanceM: 1,
  // a 2 m x 4.5 m car unless told otherwise (common practice, no source)
  car: { lengthM: 4.5, widthM: 2 },
  // a small racing car of our own (common practice, no source); width and length default to the
  // car's footprint above, so one car both starts the lap and drives it; mu 0.9: racing tyres on
  // dry asphalt (shared/REFERENCES.md)
  vehicle: { wheelbaseM: 2.5, maxSteerDeg: 30, mu: 0.9, maxAccelMps2: 6, maxBrakeMps2: 8, topSpeedMps: 60 },
  drivability: 'avoid',
  // nine rays over a half circle reaching 30 m: walls of a 40 m road seen from its middle
  sensors: { count: 9, spreadDeg: 180, lengthM: 30 },
} as const;

/**
 * Mean turning per corner used to derive cornerCount when it is not given: 1570 degrees over
 * 15 corners at the median permanent circuit of shared/DESIGN.md.
 */
export const DEGREES_PER_DERIVED_CORNER = 105;

/** Lap length each derived corner needs at least, so that short laps get fewer corners (common practice, no source). */
export const METRES_PER_DERIVED_CORNER = 40;
