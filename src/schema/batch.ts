/**
 * zod schemas of the training-farm requests, shared by the HTTP service and the CLI:
 * - `paramRangesSchema`: the parameters of a batch, any numeric leaf fixed or a range {min, max}
 *   (what `--params ranges.json` holds and a batch body's `params`);
 * - `batchBodySchema`: POST /v1/batches;
 * - `referenceSchema`: a manifest used as a reference for novelty (only each track's shape is read).
 * Ranges, defaults and messages of the parameters are the request schema's own (params.ts).
 */
import { z } from 'zod';
import { MAX_BATCH_SLOTS, NOVELTY_SAMPLES, PAIR_PATHS, SPLIT_SHARES, SPLITS } from '../core/index.js';
import type { ParamRanges, Ranged } from '../core/index.js';
import { type Bounds, describeValue, expectedError, objectError, rangeError } from './messages.js';
import { seedSchema, trackRequestSchema } from './params.js';

const NO_UNIT = '';

/** Largest minNovelty a request may ask for, rad (the turning distance of real circuits is about 1.2). */
export const MAX_MIN_NOVELTY = 10;

/** The difficulty figure's scale. */
const DIFFICULTY_BOUNDS: Bounds = { min: 0, max: 10 };

/** Characters of one stored shape (base64 of NOVELTY_SAMPLES 32-bit floats). */
export const SHAPE_CHARS = Math.ceil((4 * NOVELTY_SAMPLES) / 3) * 4;

/**
 * Batch parameters: a track request without a seed (trackRequestSchema's fields, made from it so
 * the two never drift apart), each numeric leaf a number or a range {min, max} drawn per track
 * from the track's own seed. Unknown fields are refused by name. A pair (widthM, gateSpacingM)
 * whose bounds are both given must keep min's range at or below max's, so no draw can invert it.
 * @example paramRangesSchema.parse({ lengthM: { min: 800, max: 1500 }, widthM: { min: 9, max: { min: 11, max: 14 } } })
 */
export const paramRangesSchema = rangedObject(trackRequestSchema, '', ['seed'])
  .meta({
    description:
      'Parameters of every track in the batch, as for POST /v1/tracks but without a seed; each numeric field (nested ones too, such as widthM.min) is either a fixed number or a range {min, max}, drawn for each track from a stream of its own seed (continuous values rounded to 0.001; cornerCount, spawnSlots and sensors.count whole). Fields left out take their defaults.',
  }) as unknown as z.ZodType<ParamRanges>;

/** One track of a reference manifest: its stored shape (other fields are ignored). */
const referenceTrackSchema = z
  .looseObject(
    {
      shape: z
        .string({ error: expectedError(`a shape: base64 of ${NOVELTY_SAMPLES} 32-bit floats (${SHAPE_CHARS} characters)`) })
        .length(SHAPE_CHARS, { error: expectedError(`a shape of ${SHAPE_CHARS} characters (base64 of ${NOVELTY_SAMPLES} 32-bit floats)`) })
        .regex(/^[A-Za-z0-9+/]*={0,2}$/, { error: expectedError('base64 text') })
        .meta({ description: 'The track\'s stored shape, as a batch manifest records it.' }),
    },
    { error: expectedError('a manifest track with a shape') },
  )
  .meta({ description: 'A track of the reference manifest; only its shape is read.' });

/**
 * A manifest used as the reference of a novelty test: any object with `tracks`, each with its
 * stored `shape` (a batch manifest as it was written; other fields are ignored).
 */
export const referenceSchema = z
  .looseObject({ tracks: z.array(referenceTrackSchema, { error: expectedError('an array of manifest tracks') }).meta({ description: 'The reference tracks.' }) }, { error: expectedError('a manifest (an object with tracks)') })
  .meta({ description: 'A manifest (format lapwright.manifest/1) whose tracks every new track must be at least minNovelty from; only each track\'s shape is read.' });

/** How much of each track a batch line carries. */
export const BATCH_DETAILS = ['full', 'summary'] as const;
export type BatchDetail = (typeof BATCH_DETAILS)[number];

/** Body of POST /v1/batches (count is checked against the server's cap by the route). */
export const batchBodySchema = strict(
  {
    count: z
      .int({ error: rangeError({ min: 1, max: MAX_BATCH_SLOTS }, NO_UNIT, true) })
      .min(1, { error: rangeError({ min: 1, max: MAX_BATCH_SLOTS }, NO_UNIT, true) })
      .max(MAX_BATCH_SLOTS, { error: rangeError({ min: 1, max: MAX_BATCH_SLOTS }, NO_UNIT, true) })
      .meta({ description: 'Number of tracks. A server caps it per request (10000 by default; LAPWRIGHT_BATCH_MAX_COUNT).' }),
    split: z
      .enum(SPLITS, { error: expectedError(`one of ${SPLITS.join(', ')}`) })
      .optional()
      .meta({ description: `Take only seeds of this split (train ${SPLIT_SHARES.train}, validation ${SPLIT_SHARES.validation}, test ${SPLIT_SHARES.test} of all seeds; GET /v1/splits/{seed}). Left out: seeds of any split.` }),
    baseSeed: seedSchema.optional().meta({ description: 'Root seed of the batch: every track seed derives from it, the track index and a draw number. Default: drawn at random and echoed in the manifest.' }),
    params: paramRangesSchema.optional(),
    difficulty: strict(
      {
        min: z.number({ error: rangeError(DIFFICULTY_BOUNDS, NO_UNIT) }).min(0, { error: rangeError(DIFFICULTY_BOUNDS, NO_UNIT) }).max(10, { error: rangeError(DIFFICULTY_BOUNDS, NO_UNIT) }),
        max: z.number({ error: rangeError(DIFFICULTY_BOUNDS, NO_UNIT) }).min(0, { error: rangeError(DIFFICULTY_BOUNDS, NO_UNIT) }).max(10, { error: rangeError(DIFFICULTY_BOUNDS, NO_UNIT) }),
      },
      'a band {min, max} of the difficulty figure',
    )
      .refine((r) => r.min <= r.max, { error: (issue) => minAboveMax(issue.input) })
      .optional()
      .meta({ description: 'Keep only tracks whose metrics.difficulty (0..10) lies in [min, max]; the others are skipped and counted (a curriculum stage gives its band). Left out: any difficulty.' }),
    minNovelty: z
      .number({ error: rangeError({ min: 0, max: MAX_MIN_NOVELTY }, 'rad') })
      .min(0, { error: rangeError({ min: 0, max: MAX_MIN_NOVELTY }, 'rad') })
      .max(MAX_MIN_NOVELTY, { error: rangeError({ min: 0, max: MAX_MIN_NOVELTY }, 'rad') })
      .optional()
      .meta({ description: 'Skip any candidate whose turning-function distance (rad, as POST /v1/tracks/distance measures it with method binned) to an earlier track of the batch or to a reference track is below this. Default 0: no test.', default: 0 }),
    reference: referenceSchema.optional(),
    detail: z
      .enum(BATCH_DETAILS, { error: expectedError(`one of ${BATCH_DETAILS.join(', ')}`) })
      .optional()
      .meta({ description: 'full (default): each line is a whole track, the same bytes as POST /v1/tracks; summary: each line is the track\'s manifest entry (index, seed, draw, split, id, params, metrics, shape) without the geometry.', default: 'full' }),
    startIndex: z
      .int({ error: rangeError({ min: 0, max: MAX_BATCH_SLOTS - 1 }, NO_UNIT, true) })
      .min(0, { error: rangeError({ min: 0, max: MAX_BATCH_SLOTS - 1 }, NO_UNIT, true) })
      .max(MAX_BATCH_SLOTS - 1, { error: rangeError({ min: 0, max: MAX_BATCH_SLOTS - 1 }, NO_UNIT, true) })
      .optional()
      .meta({
        description:
          'First track index to make, below count (default 0). Resumes a batch that was cut short: send the same body with its baseSeed and startIndex from the stream\'s last line (resume.startIndex); the lines then cover tracks startIndex .. count − 1, each the same as in the uninterrupted batch. With minNovelty, also add the tracks already received to reference, so that later tracks are tested against them as before.',
        default: 0,
      }),
  },
  'an object {count, split, baseSeed, params, difficulty, minNovelty, reference, detail, startIndex}',
).meta({ description: 'A batch of tracks for a training farm.' });

export type BatchBody = z.infer<typeof batchBodySchema>;

// a strict object whose unknown-field message lists the fields it knows
function strict<S extends z.core.$ZodLooseShape>(shape: S, what: string) {
  return z.strictObject(shape, { error: objectError(what, Object.keys(shape)) });
}

// the ranged twin of a strict object of the request schema: numbers become number-or-range,
// objects recurse, anything else (enums) stays as it is
function rangedObject(source: z.ZodObject, prefix: string, omit: readonly string[] = []) {
  const shape: Record<string, z.ZodType> = {};
  for (const [key, field] of Object.entries(source.shape as Record<string, z.ZodType>)) {
    if (omit.includes(key)) continue;
    const path = prefix === '' ? key : `${prefix}.${key}`;
    const inner = field instanceof z.ZodOptional ? (field.unwrap() as z.ZodType) : field;
    const description = field.description ?? inner.description ?? '';
    if (inner instanceof z.ZodNumber) shape[key] = ranged(inner, description);
    else if (inner instanceof z.ZodObject) shape[key] = rangedChild(inner, path, description);
    else shape[key] = field;
  }
  return strict(shape, prefix === '' ? 'an object of batch parameters' : `an object {${Object.keys(shape).join(', ')}}`);
}

function rangedChild(inner: z.ZodObject, path: string, description: string) {
  const object = rangedObject(inner, path);
  const checked = PAIR_PATHS.includes(path) ? object.superRefine((r, ctx) => pairCheck(r as { min?: Ranged; max?: Ranged }, ctx)) : object;
  return checked.optional().meta({ description: `${description} Each numeric field may be a range {min, max}.` });
}

// a number as the request schema checks it, or a range {min, max} of such numbers with min <= max
function ranged(single: z.ZodNumber, description: string) {
  const integer = single.isInt === true;
  const what = `${integer ? 'an integer' : 'a number'} from ${single.minValue} to ${single.maxValue}, or a range {min, max} of them`;
  const range = strict({ min: single, max: single }, 'a range {min, max}').refine((r) => r.min <= r.max, { error: (issue) => minAboveMax(issue.input) });
  return z
    .union([single, range], { error: (issue) => `expected ${what}, got ${describeValue(issue.input)}` })
    .optional()
    .meta({ description: `${description} A fixed value or a range {min, max}${integer ? ' (whole numbers are drawn)' : ''}.` });
}

// widthM / gateSpacingM: min's range must not reach above max's
function pairCheck(r: { min?: Ranged; max?: Ranged }, ctx: z.RefinementCtx): void {
  if (r.min === undefined || r.max === undefined) return;
  const highestMin = upper(r.min);
  const lowestMax = lower(r.max);
  if (highestMin > lowestMax) {
    ctx.addIssue({ code: 'custom', message: `min can be drawn as high as ${highestMin} m and max as low as ${lowestMax} m: keep min's range at or below max's so that no track gets min > max` });
  }
}

function upper(r: Ranged): number {
  return typeof r === 'number' ? r : r.max;
}

function lower(r: Ranged): number {
  return typeof r === 'number' ? r : r.min;
}

function minAboveMax(input: unknown): string {
  const r = input as { min: number; max: number };
  return `range min ${r.min} is greater than its max ${r.max}`;
}
