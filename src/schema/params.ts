/**
 * The one zod schema of a track request, shared by the HTTP server and the CLI; the OpenAPI
 * document is generated from it, so every field carries its meaning, unit, range and default.
 * Ranges and defaults come from the core's LIMITS and DEFAULTS (no number is repeated here).
 *
 * Two variants share the field definitions:
 * - `trackRequestSchema`: what a caller sends. Every field optional, unknown fields refused by
 *   name at every level, `min <= max` on ranges.
 * - `trackParamsSchema`: the resolved parameters echoed in `track.params` (every field present),
 *   tolerant of extra fields so tracks from later versions still parse.
 */
import { z } from 'zod';
import { DEFAULTS, DRIVABILITY_MODES, LIMITS, SEED_MAX, SEED_STRING_MAX_CHARS } from '../core/index.js';
import type { Seed, TrackParams, TrackRequest } from '../core/index.js';
import { type Bounds, type ErrorFn, expectedError, objectError, rangeError } from './messages.js';

/** What a caller may send: the core's request with `seed` optional (a shell draws one when it is left out). */
export type TrackRequestBody = Omit<TrackRequest, 'seed'> & { readonly seed?: Seed };

const SEED_WHAT = `an integer from 0 to ${SEED_MAX} or a string of 1 to ${SEED_STRING_MAX_CHARS} characters`;

/** Seed: an unsigned 32-bit integer or a short string. */
export const seedSchema = seed();

const METRES = 'm';
const DEGREES = 'degrees';
const NO_UNIT = '';
const MPS = 'm/s';
const MPS2 = 'm/s²';

// documentation of each field: meaning, unit, allowed range and default, in one sentence each
const DOC = {
  seed: `Root of all randomness: ${SEED_WHAT}. Default: drawn at random and echoed in the track. The same seed, parameters and generatorVersion give byte-identical tracks.`,
  lengthM: doc('Centerline length of one lap.', METRES, LIMITS.lengthM, DEFAULTS.lengthM),
  widthM: `Road width between the wall faces, metres; varies smoothly along the lap and stays inside [min, max]. Default {min: ${DEFAULTS.widthM.min}, max: ${DEFAULTS.widthM.max}}; min <= max.`,
  widthMin: doc('Narrowest road width.', METRES, LIMITS.widthM, DEFAULTS.widthM.min),
  widthMax: doc('Widest road width.', METRES, LIMITS.widthM, DEFAULTS.widthM.max),
  curvatureBudgetDeg: doc('Total absolute turning over one lap (integral of |curvature| ds), noise included. A loop whose corners all turn one way turns exactly 360 degrees.', DEGREES, LIMITS.curvatureBudgetDeg, DEFAULTS.curvatureBudgetDeg),
  turnBalance: doc('Share of corners that turn right: 0 = every corner left (counter-clockwise loop), 1 = every corner right.', NO_UNIT, LIMITS.turnBalance, DEFAULTS.turnBalance),
  cornerCount: doc('Number of corners, met exactly.', NO_UNIT, LIMITS.cornerCount, 'derived from lengthM and curvatureBudgetDeg'),
  minCornerRadiusM: doc('Tightest centerline radius allowed anywhere; must exceed half the widest road plus the wall thickness.', METRES, LIMITS.minCornerRadiusM, DEFAULTS.minCornerRadiusM),
  noise: doc('Amplitude of the smooth noise that wobbles the shape and the width; 0 = none.', NO_UNIT, LIMITS.noise, DEFAULTS.noise),
  gateSpacingM: `Gap between consecutive progress gates, metres: max on straights, shrinking towards min as the road bends harder. Default {min: ${DEFAULTS.gateSpacingM.min}, max: ${DEFAULTS.gateSpacingM.max}}; min <= max.`,
  gateSpacingMin: doc('Smallest gap between gates (in the tightest bends).', METRES, LIMITS.gateSpacingM, DEFAULTS.gateSpacingM.min),
  gateSpacingMax: doc('Largest gap between gates (on straights).', METRES, LIMITS.gateSpacingM, DEFAULTS.gateSpacingM.max),
  spawnSlots: doc('Number of start poses behind the start line, staggered and not overlapping.', NO_UNIT, LIMITS.spawnSlots, DEFAULTS.spawnSlots),
  wall: `Size of the wall solids on both sides of the road, metres. Default {heightM: ${DEFAULTS.wall.heightM}, thicknessM: ${DEFAULTS.wall.thicknessM}}.`,
  wallHeightM: doc('Wall height.', METRES, LIMITS.wall, DEFAULTS.wall.heightM),
  wallThicknessM: doc('Wall thickness.', METRES, LIMITS.wall, DEFAULTS.wall.thicknessM),
  clearanceM: doc('Gap kept between the wall solids of parts of the lap that are far apart along the track.', METRES, LIMITS.clearanceM, DEFAULTS.clearanceM),
  car: `Footprint of the car used to place non-overlapping start poses, metres. Default {lengthM: ${DEFAULTS.car.lengthM}, widthM: ${DEFAULTS.car.widthM}}.`,
  carLengthM: doc('Car length.', METRES, LIMITS.carLengthM, DEFAULTS.car.lengthM),
  carWidthM: doc('Car width.', METRES, LIMITS.carWidthM, DEFAULTS.car.widthM),
  vehicle: `The vehicle the track is checked for (README, "Drivability and difficulty"): its tightest turn (wheelbase / tan(maxSteer) + width / 2) bounds the corners, its grip and power give the speed profile, reference lap time and difficulty, and the reference drive laps the track with its footprint. Width and length default to the car's footprint.`,
  wheelbaseM: doc('Distance between the axles.', METRES, LIMITS.wheelbaseM, DEFAULTS.vehicle.wheelbaseM),
  vehicleWidthM: doc('Vehicle width (the footprint the reference drive keeps off the walls).', METRES, LIMITS.carWidthM, 'car.widthM'),
  vehicleLengthM: doc('Vehicle length (the footprint is centred midway between the axles).', METRES, LIMITS.carLengthM, 'car.lengthM'),
  maxSteerDeg: doc('Steering lock: the largest front wheel angle.', DEGREES, LIMITS.maxSteerDeg, DEFAULTS.vehicle.maxSteerDeg),
  mu: doc('Tyre-road friction coefficient: cornering speed is at most sqrt(mu * g / |curvature|).', NO_UNIT, LIMITS.mu, DEFAULTS.vehicle.mu),
  maxAccelMps2: doc('Largest forward acceleration (also capped at mu * g).', MPS2, LIMITS.maxAccelMps2, DEFAULTS.vehicle.maxAccelMps2),
  maxBrakeMps2: doc('Largest braking deceleration (also capped at mu * g).', MPS2, LIMITS.maxBrakeMps2, DEFAULTS.vehicle.maxBrakeMps2),
  topSpeedMps: doc('Top speed.', MPS, LIMITS.topSpeedMps, DEFAULTS.vehicle.topSpeedMps),
  drivability: `What to do when the vehicle cannot follow the request: "avoid" (default) keeps every corner at least as wide as the vehicle can turn (raising minCornerRadiusM where needed, said in metrics.cornerRadiusFloorM) and retries layouts the reference drive cannot lap; "refuse" answers 422 instead (reason vehicle_cannot_turn or reference_drive_failed, with the place). Default: ${DEFAULTS.drivability}.`,
  sensors: `Range sensors of the sensor check: rays spread evenly over spreadDeg about the heading, reaching lengthM, cast from the centerline every 10 m; metrics.sensorCoverage is the share of those poses where a wall is within reach on both sides. Default {count: ${DEFAULTS.sensors.count}, spreadDeg: ${DEFAULTS.sensors.spreadDeg}, lengthM: ${DEFAULTS.sensors.lengthM}}.`,
  sensorCount: doc('Number of rays.', NO_UNIT, LIMITS.sensorCount, DEFAULTS.sensors.count),
  sensorSpreadDeg: doc('Angle between the outermost rays.', DEGREES, LIMITS.sensorSpreadDeg, DEFAULTS.sensors.spreadDeg),
  sensorLengthM: doc('Reach of every ray.', METRES, LIMITS.sensorLengthM, DEFAULTS.sensors.lengthM),
} as const;

/**
 * A track request as sent by a caller: every field optional, unknown fields refused by name
 * (nested too), ranges from the core's LIMITS, `min <= max` checked with the range's path.
 * @example trackRequestSchema.parse({ seed: 7, widthM: { min: 8 } })
 */
export const trackRequestSchema = strict(
  {
    seed: seedSchema.optional().meta({ description: DOC.seed }),
    lengthM: bounded(LIMITS.lengthM, METRES).optional().meta(meta(DOC.lengthM, DEFAULTS.lengthM)),
    widthM: requestRange(LIMITS.widthM, DOC.widthMin, DOC.widthMax).optional().meta(meta(DOC.widthM, DEFAULTS.widthM)),
    curvatureBudgetDeg: bounded(LIMITS.curvatureBudgetDeg, DEGREES).optional().meta(meta(DOC.curvatureBudgetDeg, DEFAULTS.curvatureBudgetDeg)),
    turnBalance: bounded(LIMITS.turnBalance, NO_UNIT).optional().meta(meta(DOC.turnBalance, DEFAULTS.turnBalance)),
    cornerCount: bounded(LIMITS.cornerCount, NO_UNIT, true).optional().meta({ description: DOC.cornerCount }),
    minCornerRadiusM: bounded(LIMITS.minCornerRadiusM, METRES).optional().meta(meta(DOC.minCornerRadiusM, DEFAULTS.minCornerRadiusM)),
    noise: bounded(LIMITS.noise, NO_UNIT).optional().meta(meta(DOC.noise, DEFAULTS.noise)),
    gateSpacingM: requestRange(LIMITS.gateSpacingM, DOC.gateSpacingMin, DOC.gateSpacingMax).optional().meta(meta(DOC.gateSpacingM, DEFAULTS.gateSpacingM)),
    spawnSlots: bounded(LIMITS.spawnSlots, NO_UNIT, true).optional().meta(meta(DOC.spawnSlots, DEFAULTS.spawnSlots)),
    wall: strict(
      {
        heightM: bounded(LIMITS.wall, METRES).optional().meta(meta(DOC.wallHeightM, DEFAULTS.wall.heightM)),
        thicknessM: bounded(LIMITS.wall, METRES).optional().meta(meta(DOC.wallThicknessM, DEFAULTS.wall.thicknessM)),
      },
      'an object {heightM, thicknessM} in metres',
    )
      .optional()
      .meta(meta(DOC.wall, DEFAULTS.wall)),
    clearanceM: bounded(LIMITS.clearanceM, METRES).optional().meta(meta(DOC.clearanceM, DEFAULTS.clearanceM)),
    car: strict(
      {
        lengthM: bounded(LIMITS.carLengthM, METRES).optional().meta(meta(DOC.carLengthM, DEFAULTS.car.lengthM)),
        widthM: bounded(LIMITS.carWidthM, METRES).optional().meta(meta(DOC.carWidthM, DEFAULTS.car.widthM)),
      },
      'an object {lengthM, widthM} in metres',
    )
      .optional()
      .meta(meta(DOC.car, DEFAULTS.car)),
    vehicle: strict(
      {
        wheelbaseM: bounded(LIMITS.wheelbaseM, METRES).optional().meta(meta(DOC.wheelbaseM, DEFAULTS.vehicle.wheelbaseM)),
        widthM: bounded(LIMITS.carWidthM, METRES).optional().meta({ description: DOC.vehicleWidthM }),
        lengthM: bounded(LIMITS.carLengthM, METRES).optional().meta({ description: DOC.vehicleLengthM }),
        maxSteerDeg: bounded(LIMITS.maxSteerDeg, DEGREES).optional().meta(meta(DOC.maxSteerDeg, DEFAULTS.vehicle.maxSteerDeg)),
        mu: bounded(LIMITS.mu, NO_UNIT).optional().meta(meta(DOC.mu, DEFAULTS.vehicle.mu)),
        maxAccelMps2: bounded(LIMITS.maxAccelMps2, MPS2).optional().meta(meta(DOC.maxAccelMps2, DEFAULTS.vehicle.maxAccelMps2)),
        maxBrakeMps2: bounded(LIMITS.maxBrakeMps2, MPS2).optional().meta(meta(DOC.maxBrakeMps2, DEFAULTS.vehicle.maxBrakeMps2)),
        topSpeedMps: bounded(LIMITS.topSpeedMps, MPS).optional().meta(meta(DOC.topSpeedMps, DEFAULTS.vehicle.topSpeedMps)),
      },
      'an object {wheelbaseM, widthM, lengthM, maxSteerDeg, mu, maxAccelMps2, maxBrakeMps2, topSpeedMps}',
    )
      .optional()
      .meta(meta(DOC.vehicle, DEFAULTS.vehicle)),
    drivability: drivability().optional().meta(meta(DOC.drivability, DEFAULTS.drivability)),
    sensors: strict(
      {
        count: bounded(LIMITS.sensorCount, NO_UNIT, true).optional().meta(meta(DOC.sensorCount, DEFAULTS.sensors.count)),
        spreadDeg: bounded(LIMITS.sensorSpreadDeg, DEGREES).optional().meta(meta(DOC.sensorSpreadDeg, DEFAULTS.sensors.spreadDeg)),
        lengthM: bounded(LIMITS.sensorLengthM, METRES).optional().meta(meta(DOC.sensorLengthM, DEFAULTS.sensors.lengthM)),
      },
      'an object {count, spreadDeg, lengthM}',
    )
      .optional()
      .meta(meta(DOC.sensors, DEFAULTS.sensors)),
  },
  'an object of track parameters',
).meta({ description: 'Parameters of one track; every field is optional and takes its default when left out. Lengths in metres, angles in degrees.' }) satisfies z.ZodType<TrackRequestBody>;

/**
 * The resolved parameters a track echoes as `params`: every field required, same ranges as the
 * request; extra fields are tolerated (a later version may add some).
 */
export const trackParamsSchema = z
  .looseObject(
    {
      seed: seedSchema.meta({ description: DOC.seed }),
      lengthM: bounded(LIMITS.lengthM, METRES).meta({ description: DOC.lengthM }),
      widthM: resolvedRange(LIMITS.widthM, DOC.widthMin, DOC.widthMax).meta({ description: DOC.widthM }),
      curvatureBudgetDeg: bounded(LIMITS.curvatureBudgetDeg, DEGREES).meta({ description: DOC.curvatureBudgetDeg }),
      turnBalance: bounded(LIMITS.turnBalance, NO_UNIT).meta({ description: DOC.turnBalance }),
      cornerCount: bounded(LIMITS.cornerCount, NO_UNIT, true).meta({ description: DOC.cornerCount }),
      minCornerRadiusM: bounded(LIMITS.minCornerRadiusM, METRES).meta({ description: DOC.minCornerRadiusM }),
      noise: bounded(LIMITS.noise, NO_UNIT).meta({ description: DOC.noise }),
      gateSpacingM: resolvedRange(LIMITS.gateSpacingM, DOC.gateSpacingMin, DOC.gateSpacingMax).meta({ description: DOC.gateSpacingM }),
      spawnSlots: bounded(LIMITS.spawnSlots, NO_UNIT, true).meta({ description: DOC.spawnSlots }),
      wall: z
        .looseObject(
          {
            heightM: bounded(LIMITS.wall, METRES).meta({ description: DOC.wallHeightM }),
            thicknessM: bounded(LIMITS.wall, METRES).meta({ description: DOC.wallThicknessM }),
          },
          { error: expectedError('an object {heightM, thicknessM} in metres') },
        )
        .meta({ description: DOC.wall }),
      clearanceM: bounded(LIMITS.clearanceM, METRES).meta({ description: DOC.clearanceM }),
      car: z
        .looseObject(
          {
            lengthM: bounded(LIMITS.carLengthM, METRES).meta({ description: DOC.carLengthM }),
            widthM: bounded(LIMITS.carWidthM, METRES).meta({ description: DOC.carWidthM }),
          },
          { error: expectedError('an object {lengthM, widthM} in metres') },
        )
        .meta({ description: DOC.car }),
      vehicle: z
        .looseObject(
          {
            wheelbaseM: bounded(LIMITS.wheelbaseM, METRES).meta({ description: DOC.wheelbaseM }),
            widthM: bounded(LIMITS.carWidthM, METRES).meta({ description: DOC.vehicleWidthM }),
            lengthM: bounded(LIMITS.carLengthM, METRES).meta({ description: DOC.vehicleLengthM }),
            maxSteerDeg: bounded(LIMITS.maxSteerDeg, DEGREES).meta({ description: DOC.maxSteerDeg }),
            mu: bounded(LIMITS.mu, NO_UNIT).meta({ description: DOC.mu }),
            maxAccelMps2: bounded(LIMITS.maxAccelMps2, MPS2).meta({ description: DOC.maxAccelMps2 }),
            maxBrakeMps2: bounded(LIMITS.maxBrakeMps2, MPS2).meta({ description: DOC.maxBrakeMps2 }),
            topSpeedMps: bounded(LIMITS.topSpeedMps, MPS).meta({ description: DOC.topSpeedMps }),
          },
          { error: expectedError('an object {wheelbaseM, widthM, lengthM, maxSteerDeg, mu, maxAccelMps2, maxBrakeMps2, topSpeedMps}') },
        )
        .meta({ description: DOC.vehicle }),
      drivability: drivability().meta({ description: DOC.drivability }),
      sensors: z
        .looseObject(
          {
            count: bounded(LIMITS.sensorCount, NO_UNIT, true).meta({ description: DOC.sensorCount }),
            spreadDeg: bounded(LIMITS.sensorSpreadDeg, DEGREES).meta({ description: DOC.sensorSpreadDeg }),
            lengthM: bounded(LIMITS.sensorLengthM, METRES).meta({ description: DOC.sensorLengthM }),
          },
          { error: expectedError('an object {count, spreadDeg, lengthM}') },
        )
        .meta({ description: DOC.sensors }),
    },
    { error: expectedError('an object of resolved track parameters') },
  )
  .meta({ description: 'Every parameter resolved: defaults filled and cornerCount derived.' }) satisfies z.ZodType<TrackParams>;

// a strict object whose unknown-field message lists the fields it knows
function strict<S extends z.core.$ZodLooseShape>(shape: S, what: string) {
  return z.strictObject(shape, { error: objectError(what, Object.keys(shape)) });
}

function seed() {
  const error: ErrorFn = expectedError(SEED_WHAT);
  return z.union([z.int({ error }).min(0, { error }).max(SEED_MAX, { error }), z.string({ error }).min(1, { error }).max(SEED_STRING_MAX_CHARS, { error })], { error });
}

function drivability() {
  const error = expectedError(DRIVABILITY_MODES.map((m) => `"${m}"`).join(' or '));
  return z.enum(DRIVABILITY_MODES, { error });
}

function bounded(bounds: Bounds, unit: string, integer = false) {
  const error = rangeError(bounds, unit, integer);
  return (integer ? z.int({ error }) : z.number({ error })).min(bounds.min, { error }).max(bounds.max, { error });
}

function requestRange(bounds: Bounds, minDoc: string, maxDoc: string) {
  return strict(
    {
      min: bounded(bounds, METRES).optional().meta({ description: minDoc }),
      max: bounded(bounds, METRES).optional().meta({ description: maxDoc }),
    },
    'an object {min, max} in metres',
  ).refine((r) => r.min === undefined || r.max === undefined || r.min <= r.max, { error: minAboveMax });
}

function resolvedRange(bounds: Bounds, minDoc: string, maxDoc: string) {
  return z
    .looseObject(
      {
        min: bounded(bounds, METRES).meta({ description: minDoc }),
        max: bounded(bounds, METRES).meta({ description: maxDoc }),
      },
      { error: expectedError('an object {min, max} in metres') },
    )
    .refine((r) => r.min <= r.max, { error: minAboveMax });
}

function minAboveMax(issue: z.core.$ZodRawIssue): string {
  const r = issue.input as { min: number; max: number };
  return `min ${r.min} m is greater than max ${r.max} m`;
}

function doc(meaning: string, unit: string, bounds: Bounds, dflt: number | string): string {
  const u = unit === METRES ? 'metres' : unit === MPS ? 'metres per second' : unit === MPS2 ? 'metres per second squared' : unit || 'none';
  return `${meaning} Unit: ${u}. Allowed: ${bounds.min} to ${bounds.max}. Default: ${dflt}.`;
}

function meta(description: string, dflt: unknown): { description: string; default: unknown } {
  return { description, default: dflt };
}
