/**
 * GET /v1/params: every request parameter with its unit, range, default and meaning, plus the
 * seed's rules, the formats and the export options, so a client (the preview page) can build a
 * form without repeating a number.
 */
import type { FastifyPluginAsync } from 'fastify';
import { describeParams, paramsDocSchema } from '../params-doc.js';
import { jsonResponse } from './responses.js';

/** Parameter description route. */
export const paramsRoutes: FastifyPluginAsync = async (app) => {
  const doc = describeParams();
  app.get(
    '/v1/params',
    {
      schema: {
        tags: ['tracks'],
        summary: 'Every request parameter: unit, allowed range, default, meaning',
        description: 'The request parameters flattened to dotted names (widthM.min), as GET /v1/tracks/{seed} takes them in its query string; units are m (metres), deg (degrees) or none. Also the seed\'s rules, the answer formats and the options of each export.',
        response: { 200: jsonResponse('The parameters, in the order of the request schema.', paramsDocSchema) },
      },
    },
    async (_request, reply) => {
      reply.header('cache-control', 'public, max-age=300');
      return doc;
    },
  );
};
