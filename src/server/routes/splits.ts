/**
 * GET /v1/splits/{seed}: which held-out split a seed belongs to (train, validation or test), a
 * pure function of the seed (src/core/batch/split.ts). Cacheable forever.
 */
import type { FastifyPluginAsync } from 'fastify';
import { SEED_STRING_MAX_CHARS, SPLIT_SHARES, splitOf, splitValue } from '../../core/index.js';
import { readSeedText } from '../../schema/dotted.js';
import { splitAnswerSchema, splitPathSchema } from '../batch-schemas.js';
import { invalidInput } from '../validation.js';
import { CACHE_FOREVER } from './tracks.js';
import { errorResponse, jsonResponse } from './responses.js';

/** Split route. */
export const splitRoutes: FastifyPluginAsync = async (app) => {
  app.get(
    '/v1/splits/:seed',
    {
      schema: {
        tags: ['datasets'],
        summary: 'Which held-out split a seed is in',
        description: `train, validation or test, by a keyed hash of the seed with shares ${SPLIT_SHARES.train}/${SPLIT_SHARES.validation}/${SPLIT_SHARES.test}: the same answer for every parameter set and generator version, so a batch for train never holds a test seed. Cacheable forever.`,
        params: splitPathSchema,
        response: { 200: jsonResponse('The seed\'s split.', splitAnswerSchema), 400: errorResponse('ERR_INVALID_PARAMS: the seed is longer than 64 characters.') },
      },
    },
    async (request, reply) => {
      const seed = readSeedText((request.params as { seed: string }).seed);
      if (typeof seed === 'string' && seed.length > SEED_STRING_MAX_CHARS) {
        throw invalidInput('ERR_INVALID_PARAMS', [{ path: 'seed', message: `expected an integer seed or a string of 1 to ${SEED_STRING_MAX_CHARS} characters, got ${seed.length} characters` }]);
      }
      reply.header('cache-control', CACHE_FOREVER);
      return { seed, split: splitOf(seed), value: splitValue(seed), shares: SPLIT_SHARES };
    },
  );
};
