/**
 * POST /v1/curricula: stages that ramp difficulty, from a gentle loop whose corners all turn one
 * way, through a loop the other way, to mixed technical circuits. Each stage comes with
 * parameter ranges, a band of the difficulty figure, sample tracks made on the worker pool (every
 * sample of a later stage harder than every sample of an earlier one) and a ready batch body.
 */
import type { FastifyPluginAsync } from 'fastify';
import { GENERATOR_VERSION, TECHNICAL_LEVEL } from '../../core/index.js';
import type { Seed, Split } from '../../core/index.js';
import { buildCurriculum, CURRICULUM_SAMPLES } from '../../batch/curriculum-run.js';
import { poolExecutor } from '../../batch/executors.js';
import { batchFailure } from '../batch-errors.js';
import { resolveBatchOptions } from '../batch-options.js';
import { curriculumAnswerSchema, curriculumBodySchema } from '../batch-schemas.js';
import { unavailable } from '../errors.js';
import { invalidInput } from '../validation.js';
import { errorResponse, jsonResponse, OVERLOADED_503 } from './responses.js';

/** Curriculum route. */
export const curriculumRoutes: FastifyPluginAsync = async (app) => {
  const state = app.lapwright;
  const limits = resolveBatchOptions(state.options.batch, state.options.workers);
  app.post(
    '/v1/curricula',
    {
      schema: {
        tags: ['datasets'],
        summary: 'A curriculum: stages of rising difficulty, with sample tracks',
        description: `Levels run from 0 (a wide loop whose corners all turn left) through a loop the other way (0.15 to 0.3) to mixed circuits (technical at ${TECHNICAL_LEVEL}, narrow and busy at 1). Each stage's difficulty band is set between its neighbours' measured difficulties, and its samples (and any batch with its batch body) lie inside it, so the difficulty figure rises from stage to stage.`,
        body: curriculumBodySchema,
        response: {
          200: jsonResponse('The stages, easiest first.', curriculumAnswerSchema),
          400: errorResponse('ERR_INVALID_PARAMS: every offending field, or stages closer than the ladder can tell apart (at most so many stages between from and to).'),
          422: errorResponse('ERR_INFEASIBLE: two stages measured alike (ask for fewer stages), or a stage found no sample inside its band; ERR_DEADLINE_EXCEEDED.'),
          503: OVERLOADED_503,
        },
      },
    },
    async (request) => {
      const body = request.body as { stages: number; from?: number; to?: number; samples?: number; split?: Split; baseSeed?: Seed };
      const input = { stages: body.stages, from: body.from ?? 0, to: body.to ?? TECHNICAL_LEVEL, samples: body.samples ?? CURRICULUM_SAMPLES.default, split: body.split ?? 'train', baseSeed: body.baseSeed ?? 0 };
      if (!(input.from < input.to)) throw invalidInput('ERR_INVALID_PARAMS', [{ path: 'to', message: `expected a level above from (${input.from}), got ${input.to}` }]);
      const pool = state.pool;
      if (pool === null) throw unavailable('ERR_NOT_READY', 'this server was started without generation workers', state.options.retryAfterS);
      try {
        const stages = await buildCurriculum(input, (plan) => poolExecutor(pool, plan, { format: 'none' }, state.options.deadlineMs), limits.window);
        return { generatorVersion: GENERATOR_VERSION, request: input, stages };
      } catch (err) {
        if (err instanceof RangeError) throw invalidInput('ERR_INVALID_PARAMS', [{ path: 'stages', message: err.message }]);
        throw batchFailure(err, 'a sample of this curriculum', state.options.deadlineMs, state.options.retryAfterS, request.log);
      }
    },
  );
};
