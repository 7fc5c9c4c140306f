/**
 * GET /v1/schema/track: the JSON Schema (draft 2020-12) of the track format, the same document
 * as the checked-in openapi/track.schema.json (src/export/json-schema.ts makes both).
 */
import type { FastifyPluginAsync } from 'fastify';
import { z } from 'zod';
import { TRACK_FORMAT } from '../../core/index.js';
import { trackJsonSchema } from '../../export/index.js';
import { TRACK_SCHEMA_PATH } from './tracks.js';

/** Media type of a JSON Schema document. */
export const JSON_SCHEMA_MEDIA_TYPE = 'application/schema+json';

/** Track schema route. */
export const schemaRoutes: FastifyPluginAsync = async (app) => {
  const text = `${JSON.stringify(inlineRoot(trackJsonSchema()), null, 2)}\n`;
  app.get(
    TRACK_SCHEMA_PATH,
    {
      schema: {
        tags: ['tracks'],
        summary: `JSON Schema of the track format (${TRACK_FORMAT})`,
        description: 'The JSON Schema (draft 2020-12) every track answered as JSON satisfies: types, [x, y] pairs, array caps, resolved params. Consistency between fields (array lengths, simple walls, the id) is what POST /v1/tracks/validate checks.',
        response: {
          200: { description: 'The JSON Schema document.', content: { [JSON_SCHEMA_MEDIA_TYPE]: { schema: z.record(z.string(), z.unknown()).meta({ description: 'A JSON Schema, draft 2020-12.' }) } } },
        },
      },
    },
    async (_request, reply) => {
      reply.header('cache-control', 'public, max-age=300');
      return reply.type(`${JSON_SCHEMA_MEDIA_TYPE}; charset=utf-8`).send(text);
    },
  );
};

/**
 * The schema with its root inlined. In the server the track schema also carries an OpenAPI
 * component id (src/server/schemas.ts), and zod then writes the root as `$ref` into `$defs`;
 * inlining it gives back the document `npm run schema` checks in (a test compares the bytes).
 */
export function inlineRoot(schema: Record<string, unknown>): Record<string, unknown> {
  const { $ref, $defs, ...rest } = schema as { $ref?: unknown; $defs?: Record<string, unknown> } & Record<string, unknown>;
  const name = typeof $ref === 'string' && $ref.startsWith('#/$defs/') ? $ref.slice('#/$defs/'.length) : undefined;
  if (name === undefined || $defs === undefined || !Object.hasOwn($defs, name)) return schema;
  const { [name]: root, ...others } = $defs;
  // the root refers to itself or to others only through $defs, which stay when there are others
  if (JSON.stringify(root).includes(`"#/$defs/${name}"`)) return schema;
  return { ...rest, ...(root as Record<string, unknown>), ...(Object.keys(others).length > 0 ? { $defs: others } : {}) };
}
