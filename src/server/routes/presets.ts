/**
 * GET /v1/presets: the named difficulty presets, gentle to brutal (src/server/presets.ts).
 */
import type { FastifyPluginAsync } from 'fastify';
import { PRESETS } from '../presets.js';
import { presetsSchema } from '../schemas.js';
import { jsonResponse } from './responses.js';

/** Preset route. */
export const presetRoutes: FastifyPluginAsync = async (app) => {
  app.get(
    '/v1/presets',
    {
      schema: {
        tags: ['tracks'],
        summary: 'Named difficulty presets, easiest first',
        description: 'Each preset is a complete set of request parameters (no seed): send its params with a seed to POST /v1/tracks, or as a query string to GET /v1/tracks/{seed}.',
        response: { 200: jsonResponse('The presets, from gentle to brutal.', presetsSchema) },
      },
    },
    async (_request, reply) => {
      reply.header('cache-control', 'public, max-age=300');
      return { presets: PRESETS };
    },
  );
};
