/**
 * zod schema of an uploaded track (`lapwright.track/1`, src/core/track.ts): the structural shape
 * only — types, finite numbers, [x, y] tuples, array caps and resolved params — so a malformed
 * upload is answered with 400 and the field's path. Geometry and consistency between fields
 * (simple polylines, equal per-point array lengths, spacing, the id) are left to
 * `validateTrack`, which reports them as issues. Objects tolerate extra fields: the format
 * welcomes more fields than the required ones.
 */
import { z } from 'zod';
import { TRACK_FORMAT } from '../core/index.js';
import type { Track } from '../core/index.js';
import { expectedError } from './messages.js';
import { seedSchema, trackParamsSchema } from './params.js';

/** Most entries an uploaded array may hold (a 20 km lap at 1 m spacing has 20 000 points). */
export const MAX_TRACK_ARRAY_ENTRIES = 200_000;

/** Longest string field (id, generatorVersion) of an uploaded track, characters. */
const MAX_TRACK_STRING_CHARS = 256;

const num = z.number({ error: expectedError('a finite number') });
const count = z.int({ error: expectedError('a non-negative integer') }).min(0, { error: expectedError('a non-negative integer') });
const text = z.string({ error: expectedError('a string') }).max(MAX_TRACK_STRING_CHARS, { error: expectedError(`a string of at most ${MAX_TRACK_STRING_CHARS} characters`) });
const point = z.tuple([num, num], { error: expectedError('a point [x, y] of two finite numbers') });

const points = capped(point, 'points [x, y]');
const numbers = capped(num, 'finite numbers');

const centerlineSchema = z.looseObject(
  {
    spacingM: num,
    lengthM: num,
    spline: z.looseObject(
      {
        kind: z.literal('cubic-closed', { error: expectedError('"cubic-closed"') }),
        knots: z.literal('chord-length', { error: expectedError('"chord-length"') }),
        controlPoints: points,
      },
      { error: expectedError('an object {kind, knots, controlPoints}') },
    ),
    points,
    s: numbers,
    headingDeg: numbers,
    curvature: numbers,
    halfWidthLeftM: numbers,
    halfWidthRightM: numbers,
  },
  { error: expectedError('an object (the centerline)') },
);

const wallsSchema = z.looseObject({ heightM: num, thicknessM: num, left: points, right: points }, { error: expectedError('an object {heightM, thicknessM, left, right}') });

const gateSchema = z.looseObject({ index: count, s: num, left: point, right: point, forward: point }, { error: expectedError('a gate {index, s, left, right, forward}') });

const spawnSchema = z.looseObject({ index: count, position: point, headingDeg: num, s: num, lateralM: num }, { error: expectedError('a spawn {index, position, headingDeg, s, lateralM}') });

const cornerSchema = z.looseObject(
  {
    index: count,
    direction: z.enum(['left', 'right'], { error: expectedError('"left" or "right"') }),
    angleDeg: num,
    minRadiusM: num,
    sStart: num,
    sEnd: num,
  },
  { error: expectedError('a corner {index, direction, angleDeg, minRadiusM, sStart, sEnd}') },
);

const metricsSchema = z.looseObject(
  {
    lengthM: num,
    totalTurningDeg: num,
    netTurningDeg: num,
    rightCornerShare: num,
    rightTurningShare: num,
    minRadiusM: num,
    width: z.looseObject({ min: num, max: num }, { error: expectedError('an object {min, max}') }),
    minClearanceM: num,
    cornerCount: count,
    gateCount: count,
    vehicleMinRadiusM: num,
    cornerRadiusFloorM: num,
    referenceLapTimeS: num,
    averageSpeedMps: num,
    minSpeedMps: num,
    maxSpeedMps: num,
    brakingTimeS: num,
    driveLapTimeS: num,
    maxLateralDeviationM: num,
    minWallMarginM: num,
    sensorCoverage: num,
    sensorGateCoverage: num,
    difficulty: num,
  },
  { error: expectedError('an object (the metrics)') },
);

/**
 * An uploaded track: the shape of `Track` with finite numbers, [x, y] tuples, arrays of at most
 * MAX_TRACK_ARRAY_ENTRIES entries and params as resolved (every field present).
 * @example trackSchema.safeParse(JSON.parse(text)).success
 */
export const trackSchema = z
  .looseObject(
    {
      format: z.literal(TRACK_FORMAT, { error: expectedError(JSON.stringify(TRACK_FORMAT)) }),
      id: text,
      seed: seedSchema,
      generatorVersion: text,
      params: trackParamsSchema,
      attempts: count,
      centerline: centerlineSchema,
      walls: wallsSchema,
      gates: capped(gateSchema, 'gates'),
      spawns: capped(spawnSchema, 'spawns'),
      corners: capped(cornerSchema, 'corners'),
      metrics: metricsSchema,
    },
    { error: expectedError(`a track object (format ${TRACK_FORMAT})`) },
  )
  .meta({ description: `A track in format ${TRACK_FORMAT}, as returned by POST /v1/tracks.` }) satisfies z.ZodType<Track>;

// an array of at most MAX_TRACK_ARRAY_ENTRIES items
function capped<T extends z.ZodType>(item: T, what: string) {
  const error = expectedError(`an array of at most ${MAX_TRACK_ARRAY_ENTRIES} ${what}`);
  return z.array(item, { error }).max(MAX_TRACK_ARRAY_ENTRIES, { error });
}
