/**
 * zod schemas of the training-farm routes' inputs and answers: splits, distances, batches (the
 * manifest) and curricula. They document the API (the OpenAPI document is made from them); the
 * request bodies of batches come from src/schema/batch.ts.
 */
import { z } from 'zod';
import { CURRICULUM_STAGES, MANIFEST_FORMAT, NOVELTY_SAMPLES, SEED_MAX, SEED_STRING_MAX_CHARS, SPLIT_KEY, SPLIT_SHARES, SPLITS, TECHNICAL_LEVEL } from '../core/index.js';
import { CURRICULUM_SAMPLES } from '../batch/curriculum-run.js';
import { paramRangesSchema } from '../schema/batch.js';
import { expectedError, rangeError } from '../schema/messages.js';
import { seedSchema, trackParamsSchema } from '../schema/params.js';
import { trackSchema } from '../schema/track.js';

const splitEnum = z.enum(SPLITS);

/** Path of GET /v1/splits/{seed}. */
export const splitPathSchema = z.strictObject({
  seed: z.string().meta({
    description: `The seed: digits that fit 0..${SEED_MAX} are the integer seed, anything else (1 to ${SEED_STRING_MAX_CHARS} characters, URL-encoded) a string seed.`,
    examples: ['42', 'larkspur-heldout-0042'],
  }),
});

/** GET /v1/splits/{seed}. */
export const splitAnswerSchema = z.object({
  seed: seedSchema,
  split: splitEnum.meta({ description: 'The split the seed belongs to, forever.' }),
  value: z.number().meta({ description: `u in [0, 1): the first 48 bits of HMAC-SHA256(key "${SPLIT_KEY}", JSON of the seed) over 2^48.` }),
  shares: z.object({ train: z.number(), validation: z.number(), test: z.number() }).meta({ description: `Shares of the splits: train below ${SPLIT_SHARES.train}, validation below ${SPLIT_SHARES.train + SPLIT_SHARES.validation}, test above.` }),
});

const pointsSchema = z
  .array(z.tuple([z.number(), z.number()]), { error: expectedError('an array of [x, y] points') })
  .min(3, { error: expectedError('at least 3 points') })
  .max(200_000, { error: expectedError('at most 200000 points') });

/** An outline to compare: a closed polygon's points, or a track (its centerline is compared). */
const outlineSchema = z
  .union([
    z.strictObject({ points: pointsSchema.meta({ description: 'Vertices [x, y] of a closed polygon, in order; the closing edge is implied.' }) }),
    z.looseObject({ centerline: z.looseObject({ points: pointsSchema }) }).meta({ description: 'A track (format lapwright.track/1): its centerline is compared; other fields are not read.' }),
  ], { error: expectedError('an object {points: [[x, y], ...]} or a track') })
  .meta({ description: 'A closed outline: {points} or a track.' });

export const DISTANCE_METHODS = ['auto', 'exact', 'binned'] as const;

/** POST /v1/tracks/distance. */
export const distanceBodySchema = z.strictObject(
  {
    a: outlineSchema,
    b: outlineSchema,
    method: z
      .enum(DISTANCE_METHODS, { error: expectedError(`one of ${DISTANCE_METHODS.join(', ')}`) })
      .optional()
      .meta({ description: `exact: over every alignment of vertices (Arkin et al. 1991), for polygons of up to a few thousand vertex pairs; binned: on ${NOVELTY_SAMPLES} (or samples) equal steps of arc length, what minNovelty uses; auto (default): exact when it is cheap, else binned.`, default: 'auto' }),
    samples: z
      .int({ error: rangeError({ min: 16, max: 4096 }, '', true) })
      .min(16, { error: rangeError({ min: 16, max: 4096 }, '', true) })
      .max(4096, { error: rangeError({ min: 16, max: 4096 }, '', true) })
      .optional()
      .meta({ description: `Bins of the binned method. Default ${NOVELTY_SAMPLES}, as batches use.`, default: NOVELTY_SAMPLES }),
  },
  { error: expectedError('an object {a, b, method, samples}') },
);

export const distanceAnswerSchema = z.object({
  distance: z.number().meta({ description: 'Turning-function distance, rad: 0 for the same shape at any position, rotation, start point and scale.' }),
  method: z.enum(['exact', 'binned']),
  samples: z.int().nullable().meta({ description: 'Bins of the binned method; null for exact.' }),
});

const metricsSchema = trackSchema.shape.metrics;

/** One track of a manifest. */
export const manifestTrackSchema = z.object({
  index: z.int().meta({ description: 'Position in the batch, from 0.' }),
  seed: seedSchema,
  draw: z.int().meta({ description: 'Which of the slot\'s draws the seed is.' }),
  split: splitEnum,
  id: z.string().meta({ description: 'The track\'s id (hex sha256 of its content).' }),
  params: trackParamsSchema,
  metrics: metricsSchema,
  shape: z.string().meta({ description: `Stored shape for novelty tests: base64 of ${NOVELTY_SAMPLES} 32-bit floats.` }),
  file: z.string().optional().meta({ description: 'lapwright batch only: the track\'s file beside the manifest.' }),
});

/** The manifest (last line of a batch). */
export const manifestSchema = z
  .object({
    format: z.literal(MANIFEST_FORMAT),
    generatorVersion: z.string(),
    request: z.object({
      count: z.int(),
      split: splitEnum.nullable(),
      baseSeed: seedSchema,
      params: paramRangesSchema,
      difficulty: z.object({ min: z.number(), max: z.number() }).nullable(),
      minNovelty: z.number(),
      reference: z.object({ tracks: z.int(), digest: z.string() }).nullable().meta({ description: 'The reference: how many shapes, and the hex sha256 of the shapes joined by newlines.' }),
    }),
    split: splitEnum.nullable(),
    output: z.object({ format: z.string() }).optional().meta({ description: 'lapwright batch only: the format of the track files beside the manifest.' }),
    shard: z.object({ index: z.int(), count: z.int() }).nullable().meta({ description: 'lapwright batch --shard i/n only: shard index of count (it holds the indices i, i + n, ...); null for a whole batch.' }),
    tracks: z.array(manifestTrackSchema),
    redrawn: z.int().meta({ description: 'Infeasible draws, redrawn with the slot\'s next seed.' }),
    skipped: z.object({
      split: z.int().meta({ description: 'Seeds outside the split (never generated).' }),
      difficulty: z.int().meta({ description: 'Tracks outside the difficulty band.' }),
      novelty: z.int().meta({ description: 'Tracks closer than minNovelty to an earlier or a reference track.' }),
    }),
  })
  .meta({ description: `The batch's manifest (format ${MANIFEST_FORMAT}): enough to make every track again and check it by its id.` });

/** POST /v1/curricula. */
export const curriculumBodySchema = z.strictObject(
  {
    stages: z
      .int({ error: rangeError(CURRICULUM_STAGES, '', true) })
      .min(CURRICULUM_STAGES.min, { error: rangeError(CURRICULUM_STAGES, '', true) })
      .max(CURRICULUM_STAGES.max, { error: rangeError(CURRICULUM_STAGES, '', true) })
      .meta({ description: 'Number of stages.' }),
    from: level().meta({ description: 'Level of the first stage on the ladder, 0 (a gentle loop whose corners all turn left) to 1 (narrow, busy circuits). Default 0.', default: 0 }),
    to: level().meta({ description: `Level of the last stage, above from. Default ${TECHNICAL_LEVEL} (technical circuits).`, default: TECHNICAL_LEVEL }),
    samples: z
      .int({ error: rangeError(CURRICULUM_SAMPLES, '', true) })
      .min(CURRICULUM_SAMPLES.min, { error: rangeError(CURRICULUM_SAMPLES, '', true) })
      .max(CURRICULUM_SAMPLES.max, { error: rangeError(CURRICULUM_SAMPLES, '', true) })
      .optional()
      .meta({ description: 'Sample tracks per stage.', default: CURRICULUM_SAMPLES.default }),
    split: splitEnum.optional().meta({ description: 'Split of the sample seeds (and of each stage\'s batch). Default train.', default: 'train' }),
    baseSeed: seedSchema.optional().meta({ description: 'Root of the stages\' batch seeds. Default 0, so the same request gives the same curriculum.', default: 0 }),
  },
  { error: expectedError('an object {stages, from, to, samples, split, baseSeed}') },
);

const sampleSchema = manifestTrackSchema.omit({ shape: true, file: true });

export const curriculumAnswerSchema = z.object({
  generatorVersion: z.string(),
  request: z.object({ stages: z.int(), from: z.number(), to: z.number(), samples: z.int(), split: splitEnum, baseSeed: seedSchema }),
  stages: z.array(
    z.object({
      index: z.int(),
      kind: z.enum(['loop-left', 'loop-right', 'mixed']),
      description: z.string(),
      level: z.number(),
      params: paramRangesSchema,
      difficulty: z.object({ min: z.number(), max: z.number() }).meta({ description: 'Band of metrics.difficulty the stage\'s tracks lie in; bands rise and do not overlap.' }),
      measured: z.object({ calibrationMedian: z.number(), min: z.number(), mean: z.number(), max: z.number() }),
      batch: z.object({ split: splitEnum.nullable(), baseSeed: z.int(), params: paramRangesSchema, difficulty: z.object({ min: z.number(), max: z.number() }) }).meta({ description: 'A POST /v1/batches body for the stage (add count): its first tracks are the samples.' }),
      samples: z.array(sampleSchema),
    }),
  ),
});

function level() {
  const error = rangeError({ min: 0, max: 1 }, '');
  return z.number({ error }).min(0, { error }).max(1, { error }).optional();
}
