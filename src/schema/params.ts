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
import { DEFAULTS, LIMITS, SEED_MAX, SEED_STRING_MAX_CHARS } from '../core/index.js';
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
  const u = unit === METRES ? 'metres' : unit || 'none';
  return `${meaning} Unit: ${u}. Allowed: ${bounds.min} to ${bounds.max}. Default: ${dflt}.`;
}

function meta(description: string, dflt: unknown): { description: string; default: unknown } {
  return { description, default: dflt };
}
