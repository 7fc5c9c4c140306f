/**
 * POST /v1/tracks/validate: checks an uploaded track (one a designer edited by hand, say) with
 * the same checker the generator runs. A malformed body is a 400 that names every bad field; a
 * well-formed track that breaks a guarantee is a 200 with `valid: false` and the issues.
 */
import type { FastifyPluginAsync } from 'fastify';
import { trackSchema } from '../../schema/track.js';
import { runTaskOnPool } from '../generation.js';
import { validationResultSchema } from '../schemas.js';
import { zodValidator } from '../validation.js';
import { errorResponse, jsonResponse, OVERLOADED_503 } from './responses.js';

/** Validation route. */
export const validateRoutes: FastifyPluginAsync = async (app) => {
  const state = app.lapwright;
  app.post(
    '/v1/tracks/validate',
    {
      bodyLimit: state.options.trackBodyLimitBytes,
      validatorCompiler: zodValidator('ERR_INVALID_TRACK'),
      schema: {
        tags: ['tracks'],
        summary: 'Check a track against every guarantee',
        description: 'Runs the checker the generator uses on the uploaded track. valid: false lists each broken guarantee with where it is (arc length s in metres from the start line).',
        body: trackSchema,
        response: {
          200: jsonResponse('The verdict: valid, and every broken guarantee.', validationResultSchema),
          400: errorResponse('ERR_INVALID_TRACK (every malformed field in issues, with its path) or ERR_INVALID_JSON.'),
          413: errorResponse('ERR_BODY_TOO_LARGE: the track is over the upload cap (LAPWRIGHT_TRACK_BODY_LIMIT_BYTES).'),
          415: errorResponse('ERR_UNSUPPORTED_MEDIA_TYPE: the body is not application/json.'),
          422: errorResponse('ERR_DEADLINE_EXCEEDED: checking the track takes longer than the deadline.'),
          503: OVERLOADED_503,
        },
      },
    },
    async (request) => {
      const out = await runTaskOnPool(state.pool, { kind: 'validate', track: request.body }, { deadlineMs: state.options.deadlineMs, retryAfterS: state.options.retryAfterS, log: request.log });
      return { valid: out.valid, issues: out.issues };
    },
  );
};
