/**
 * zod schemas of the HTTP service's own inputs and answers (the track request and the track come
 * from src/schema). They document the API: the OpenAPI document is generated from them.
 */
import { z } from 'zod';
import { ISSUE_CODES, SEED_MAX, SEED_STRING_MAX_CHARS } from '../core/index.js';
import { trackRequestSchema } from '../schema/params.js';
import { trackSchema } from '../schema/track.js';
import { HTTP_ERRORS, type HttpErrorCode } from './errors.js';
import { exportQueryShape } from './export-query.js';

export { formatSchema, TRACK_FORMATS } from './export-query.js';
export type { TrackFormat } from './export-query.js';

/** Query string of POST /v1/tracks: only how to answer (the parameters go in the body). */
export const postTrackQuerySchema = z.strictObject(exportQueryShape);

/** Path of GET /v1/tracks/{seed}. */
export const seedPathSchema = z.strictObject({
  seed: z.string().meta({
    description: `The seed: digits that fit 0..${SEED_MAX} are the integer seed, anything else (1 to ${SEED_STRING_MAX_CHARS} characters, URL-encoded) a string seed.`,
    examples: ['42', 'heldout-007'],
  }),
});

/**
 * Query string of GET /v1/tracks/{seed}, for the documentation: every request parameter but
 * the seed, nested ones flattened with a dot (`widthM.min=8`). The route parses the query itself
 * (src/server/query.ts) and checks the result with trackRequestSchema, so the rules and the
 * messages are those of POST /v1/tracks.
 */
export const getTrackQueryDocSchema = z.strictObject({ ...flattenedRequestShape(), ...exportQueryShape });

/** One offending field of a malformed request (400). */
export const fieldIssueSchema = z
  .object({
    path: z.string().meta({ description: 'Dotted path of the field (`widthM.min`, `gates.3.left.0`), `(root)` for the whole body.' }),
    message: z.string().meta({ description: 'What was sent and what is allowed.' }),
  })
  .meta({ description: 'One offending field.' });

/** One broken guarantee, as the checker reports it. */
export const trackIssueSchema = z
  .object({
    code: z.enum(ISSUE_CODES).meta({ description: 'Machine-readable rule name.' }),
    at: z
      .object({ s: z.number().optional(), index: z.int().optional(), x: z.number().optional(), y: z.number().optional() })
      .optional()
      .meta({ description: 'Where: arc length s in metres from the start line, an index, or a point.' }),
    limit: z.number().optional().meta({ description: 'The limit the rule sets.' }),
    actual: z.number().optional().meta({ description: 'What was measured.' }),
    message: z.string(),
  })
  .meta({ description: 'One broken guarantee of a track.' });

/** Every error answer (STYLE.md §6). */
export const errorSchema = z
  .object({
    statusCode: z.int(),
    code: z.enum(Object.keys(HTTP_ERRORS) as [HttpErrorCode, ...HttpErrorCode[]]),
    error: z.string().meta({ description: 'HTTP reason phrase.' }),
    message: z.string().meta({ description: 'What went wrong and what to change.' }),
    reason: z.string().optional().meta({ description: '422: machine-readable reason (e.g. turning_vs_balance, radius_vs_width, no_valid_layout, deadline_exceeded).' }),
    hint: z.string().optional().meta({ description: '422: which parameter to change and how far.' }),
    issues: z
      .array(z.union([fieldIssueSchema, trackIssueSchema]))
      .optional()
      .meta({ description: '400: every offending field with its path. 422: issues of the generator\'s last attempt.' }),
    attempts: z.int().optional().meta({ description: '422 ERR_INFEASIBLE: layouts the generator tried.' }),
  })
  .meta({ description: 'Error answer: { statusCode, code, error, message }, plus issues for 400 and 422, and reason and hint for 422. 503 answers carry a Retry-After header.' });

/** GET /healthz. */
export const healthSchema = z.object({
  status: z.literal('ok'),
  version: z.string().meta({ description: 'Package version of the service.' }),
  generatorVersion: z.string().meta({ description: "Version of the generator's output: same seed + parameters + generatorVersion, same bytes." }),
});

/** GET /readyz when ready. */
export const readySchema = z.object({
  status: z.literal('ready'),
  workers: z.int().meta({ description: 'Generation workers configured.' }),
  up: z.int().meta({ description: 'Workers loaded and taking tasks.' }),
  busy: z.int().meta({ description: 'Workers running a task now.' }),
  queued: z.int().meta({ description: 'Requests waiting for a worker.' }),
  maxQueue: z.int().meta({ description: 'Requests that may wait before 503s begin.' }),
});

/** GET /v1/presets. */
export const presetsSchema = z.object({
  presets: z.array(
    z.object({
      name: z.string(),
      description: z.string(),
      params: trackRequestSchema.meta({ description: 'Request parameters of the preset (no seed): send them to POST /v1/tracks with a seed of your choice.' }),
    }),
  ),
});

/** POST /v1/tracks/validate. */
export const validationResultSchema = z.object({
  valid: z.boolean(),
  issues: z.array(trackIssueSchema).meta({ description: 'Every broken guarantee; empty when valid.' }),
});

/** Response schema of a track (documentation: tracks are sent as bytes made by the worker). */
export const trackResponseSchema = trackSchema;

// named components of the OpenAPI document (referenced, not repeated in every route)
registerComponent(trackSchema, 'Track');
registerComponent(trackRequestSchema, 'TrackRequest');
registerComponent(errorSchema, 'Error');
registerComponent(trackIssueSchema, 'TrackIssue');
registerComponent(fieldIssueSchema, 'FieldIssue');

/**
 * Gives a schema a component id in zod's global registry (where its description already is),
 * once: importing this module twice must not register an id twice.
 */
function registerComponent(schema: z.ZodType, id: string): void {
  const existing = z.globalRegistry.get(schema);
  if (existing?.id === id) return;
  if (z.globalRegistry._idmap.has(id)) throw new Error(`OpenAPI component id ${id} is already taken by another schema`);
  z.globalRegistry.add(schema, { ...existing, id });
}

// one entry per leaf of the request schema, nested fields as `parent.child`, seed left out
function flattenedRequestShape(): Record<string, z.ZodType> {
  const shape: Record<string, z.ZodType> = {};
  for (const [key, field] of Object.entries(trackRequestSchema.shape)) {
    if (key === 'seed') continue;
    const inner = field.unwrap();
    if (inner instanceof z.ZodObject) {
      for (const [sub, subField] of Object.entries(inner.shape as Record<string, z.ZodType>)) shape[`${key}.${sub}`] = subField;
    } else {
      shape[key] = field;
    }
  }
  return shape;
}
