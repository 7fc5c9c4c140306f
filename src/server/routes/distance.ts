/**
 * POST /v1/tracks/distance: the turning-function distance (Arkin et al. 1991) between two closed
 * outlines — polygons or tracks' centerlines — which ignores position, rotation, start point and
 * scale. Exact over every vertex alignment when that is cheap, else on bins of arc length (what
 * batches use for minNovelty). Runs on the worker pool.
 */
import type { FastifyPluginAsync } from 'fastify';
import { NOVELTY_SAMPLES, turningSignature } from '../../core/index.js';
import type { FieldIssue } from '../../schema/issues.js';
import { batchFailure } from '../batch-errors.js';
import { resolveBatchOptions } from '../batch-options.js';
import { distanceAnswerSchema, distanceBodySchema } from '../batch-schemas.js';
import { unavailable } from '../errors.js';
import { invalidInput } from '../validation.js';
import { errorResponse, jsonResponse, OVERLOADED_503 } from './responses.js';

/** Largest m·n·(m + n) (vertices m and n) the auto method computes exactly: about a second of work. */
export const EXACT_MAX_WORK = 2e8;

type Outline = { readonly points: readonly (readonly [number, number])[] } | { readonly centerline: { readonly points: readonly (readonly [number, number])[] } };

/** Distance route. */
export const distanceRoutes: FastifyPluginAsync = async (app) => {
  const state = app.lapwright;
  const limits = resolveBatchOptions(state.options.batch, state.options.workers);
  app.post(
    '/v1/tracks/distance',
    {
      bodyLimit: limits.bodyLimitBytes,
      schema: {
        tags: ['datasets'],
        summary: 'Turning-function distance between two outlines',
        description: `0 for the same shape at any position, rotation, start point and scale; larger for shapes that turn differently (rad). a and b are each {points: [[x, y], ...]} (a closed polygon) or a track (its centerline). The binned method with ${NOVELTY_SAMPLES} samples is the measure batches use for minNovelty.`,
        body: distanceBodySchema,
        response: {
          200: jsonResponse('The distance.', distanceAnswerSchema),
          400: errorResponse('ERR_INVALID_PARAMS: a malformed outline, or one that is degenerate (no area, or not turning once around).'),
          413: errorResponse('ERR_BODY_TOO_LARGE: over LAPWRIGHT_BATCH_BODY_LIMIT_BYTES.'),
          422: errorResponse('ERR_DEADLINE_EXCEEDED: the exact method on these outlines takes longer than the deadline: ask for method binned.'),
          503: OVERLOADED_503,
        },
      },
    },
    async (request) => {
      const body = request.body as { a: Outline; b: Outline; method?: 'auto' | 'exact' | 'binned'; samples?: number };
      const a = flat(body.a);
      const b = flat(body.b);
      const issues: FieldIssue[] = [];
      for (const [name, coords] of [['a', a], ['b', b]] as const) {
        try {
          turningSignature(coords, 1);
        } catch (err) {
          issues.push({ path: name, message: `not a closed outline the turning function is defined for: ${err instanceof Error ? err.message : String(err)}` });
        }
      }
      if (issues.length > 0) throw invalidInput('ERR_INVALID_PARAMS', issues);
      const m = a.length / 2;
      const n = b.length / 2;
      const method = body.method === 'exact' || (body.method !== 'binned' && m * n * (m + n) <= EXACT_MAX_WORK) ? 'exact' : 'binned';
      const samples = body.samples ?? NOVELTY_SAMPLES;
      if (state.pool === null) throw unavailable('ERR_NOT_READY', 'this server was started without generation workers', state.options.retryAfterS);
      let distance: number;
      try {
        const out = await state.pool.run({ kind: 'distance', a, b, method, samples }, state.options.deadlineMs);
        if (!out.ok || out.kind !== 'distance') throw new Error(out.ok ? `unexpected answer ${out.kind}` : out.error.message);
        distance = out.distance;
      } catch (err) {
        throw batchFailure(err, 'this distance', state.options.deadlineMs, state.options.retryAfterS, request.log);
      }
      return { distance, method, samples: method === 'binned' ? samples : null };
    },
  );
};

function flat(outline: Outline): Float64Array {
  const points = 'points' in outline ? outline.points : outline.centerline.points;
  const out = new Float64Array(2 * points.length);
  points.forEach(([x, y], i) => {
    out[2 * i] = x;
    out[2 * i + 1] = y;
  });
  return out;
}
