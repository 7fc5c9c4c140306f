/**
 * POST /v1/tracks (parameters in a JSON body) and GET /v1/tracks/{seed} (parameters in the query
 * string, cacheable forever): one track each, generated on the worker pool and answered as JSON
 * or as an export (glb, svg, csv) made on the same worker. The ETag is the track's id (a content
 * hash), suffixed per export, so If-None-Match answers 304 without the body.
 */
import { randomInt } from 'node:crypto';
import type { FastifyPluginAsync, FastifyReply, FastifyRequest, FastifySchemaCompiler } from 'fastify';
import { z } from 'zod';
import { SEED_MAX } from '../../core/index.js';
import { EXPORT_FORMATS } from '../../export/index.js';
import { formatIssues, type FieldIssue } from '../../schema/issues.js';
import { trackRequestSchema, type TrackRequestBody } from '../../schema/params.js';
import { HttpError } from '../errors.js';
import { contentDispositionOf, contentTypeOf, entityTag, type ExportQuery, optionIssues, readExportQuery, TRACK_FORMATS } from '../export-query.js';
import { runTaskOnPool } from '../generation.js';
import { FORMAT_MEDIA_TYPES, matchesIfNoneMatch, negotiateFormat } from '../negotiate.js';
import { nestQuery, parsePathSeed } from '../query.js';
import { getTrackQueryDocSchema, postTrackQuerySchema, seedPathSchema, trackResponseSchema } from '../schemas.js';
import { invalidInput, zodValidator } from '../validation.js';
import { errorResponse, OVERLOADED_503 } from './responses.js';

/** Cache-Control of GET /v1/tracks/{seed}: the same URL gives the same bytes for a generator version. */
export const CACHE_FOREVER = 'public, max-age=31536000, immutable';

/** Where the track format's JSON Schema is served. */
export const TRACK_SCHEMA_PATH = '/v1/schema/track';

const TRACK_200 = {
  description: `The track: JSON (format lapwright.track/1, its JSON Schema at GET ${TRACK_SCHEMA_PATH}) by default, or the export asked for by the format query or the Accept header. The ETag header is the track's id in quotes for the JSON, and the id with the export's options and extension for the rest ("<id>.glb", "<id>.heat.svg", "<id>.gates.csv"). Content-Disposition names a file (track-<first 8 of the id>.<extension>).`,
  content: {
    [EXPORT_FORMATS.json.mediaType]: { schema: trackResponseSchema },
    [EXPORT_FORMATS.glb.mediaType]: { schema: z.string().meta({ description: 'glTF 2.0 binary: road surface, both wall solids, a trigger box per gate, a node per spawn (metres, +Y up).', format: 'binary' }) },
    [EXPORT_FORMATS.svg.mediaType]: { schema: z.string().meta({ description: 'A drawing of the track: road, walls, gates, spawns, direction, corner numbers, scale bar and title.' }) },
    [EXPORT_FORMATS.csv.mediaType]: { schema: z.string().meta({ description: 'One table with a header row: the centerline (one row per point) or, with table=gates, the gates.' }) },
  },
};
const NOT_MODIFIED_304 = z.undefined().meta({ description: 'If-None-Match matched the ETag of the representation asked for: no body.' });
const ERRORS = {
  400: errorResponse('ERR_INVALID_PARAMS (every offending field in issues, with its path: parameters, format, export options, an option of another format), ERR_INVALID_JSON or ERR_BAD_REQUEST.'),
  406: errorResponse('ERR_NOT_ACCEPTABLE: the Accept header allows none of the formats (and no format query was given).'),
  422: errorResponse('ERR_INFEASIBLE (reason, hint and the last attempt\'s issues) or ERR_DEADLINE_EXCEEDED (the request needs more time than the deadline).'),
  503: OVERLOADED_503,
};
const EXTERNAL_DOCS = { description: 'JSON Schema of the track format (draft 2020-12)', url: TRACK_SCHEMA_PATH };
const FORMATS_DOC = `Formats: ${TRACK_FORMATS.join(', ')}, by the format query (which wins) or the Accept header (${Object.values(FORMAT_MEDIA_TYPES).join(', ')}); export options: table (csv), heat and widthPx (svg), pretty (json).`;

/** Track routes. */
export const trackRoutes: FastifyPluginAsync = async (app) => {
  const bodyValidator = zodValidator('ERR_INVALID_PARAMS');
  app.post(
    '/v1/tracks',
    {
      schema: {
        tags: ['tracks'],
        summary: 'Generate one track',
        description: `Every parameter is optional. A seed left out is drawn at random and echoed in the track (track.seed). ${FORMATS_DOC}`,
        externalDocs: EXTERNAL_DOCS,
        querystring: postTrackQuerySchema,
        body: trackRequestSchema,
        response: { 200: TRACK_200, 304: NOT_MODIFIED_304, ...ERRORS, 413: errorResponse('ERR_BODY_TOO_LARGE: the body is over the size cap.'), 415: errorResponse('ERR_UNSUPPORTED_MEDIA_TYPE: the body is not application/json.') },
      },
      // the body is checked by its schema; the query is read by the handler, with the body's issues
      validatorCompiler: ((route) => (route.httpPart === 'body' ? bodyValidator(route) : (data: unknown) => ({ value: data }))) as FastifySchemaCompiler<unknown>,
      // no body at all means every default
      preValidation: async (request) => {
        if (request.body === undefined || request.body === null) request.body = {};
      },
    },
    async (request, reply) => {
      const { query, issues } = readExportQuery(request.query as Record<string, unknown>, true);
      if (issues.length > 0) throw invalidInput('ERR_INVALID_PARAMS', issues);
      return answerTrack(request, reply, request.body as TrackRequestBody, query, false);
    },
  );

  app.get(
    '/v1/tracks/:seed',
    {
      schema: {
        tags: ['tracks'],
        summary: 'Generate one track, cacheably',
        description: `The same track as POST /v1/tracks with the parameters in the query string, nested ones flattened with a dot (widthM.min=8&widthM.max=12). The answer never changes for a generator version: Cache-Control: public, max-age=31536000, immutable, so a CDN or reverse proxy can serve repeats. ${FORMATS_DOC}`,
        externalDocs: EXTERNAL_DOCS,
        params: seedPathSchema,
        querystring: getTrackQueryDocSchema,
        response: { 200: TRACK_200, 304: NOT_MODIFIED_304, ...ERRORS },
      },
      // the schemas above document the route; the handler parses path and query together so
      // that one 400 lists every offending field, in the words of POST /v1/tracks
      validatorCompiler: () => (data) => ({ value: data }),
    },
    async (request, reply) => {
      const { seed } = request.params as { seed: string };
      const raw = request.query as Record<string, unknown>;
      const exported = readExportQuery(raw, false);
      const nested = nestQuery(raw, parsePathSeed(seed));
      const issues: FieldIssue[] = [...exported.issues, ...nested.issues];
      const parsed = trackRequestSchema.safeParse(nested.body);
      if (!parsed.success) issues.push(...formatIssues(parsed.error));
      if (issues.length > 0 || !parsed.success) throw invalidInput('ERR_INVALID_PARAMS', issues);
      return answerTrack(request, reply, parsed.data, exported.query, true);
    },
  );
};

async function answerTrack(request: FastifyRequest, reply: FastifyReply, body: TrackRequestBody, asked: ExportQuery, cacheable: boolean): Promise<FastifyReply> {
  const state = request.server.lapwright;
  reply.header('vary', 'Accept');
  const negotiated = negotiateFormat(asked.format, request.headers.accept);
  if (negotiated.format === null) {
    throw new HttpError(
      'ERR_NOT_ACCEPTABLE',
      `the Accept header ${JSON.stringify(negotiated.accept)} allows none of ${Object.values(FORMAT_MEDIA_TYPES).join(', ')}; send one of them, or name the format in the query (format=${TRACK_FORMATS.join('|')})`,
    );
  }
  const format = negotiated.format;
  const misplaced = optionIssues(format, asked.options);
  if (misplaced.length > 0) throw invalidInput('ERR_INVALID_PARAMS', misplaced);
  // the core reads no randomness: a missing seed is drawn here and echoed in the track
  const seed = body.seed ?? randomInt(0, SEED_MAX + 1);
  const input = { kind: 'generate', request: { ...body, seed }, export: { format, options: asked.options } } as const;
  // a request with its seed is answered the same way every time: a repeat comes from the cache
  // (the parsed body has its keys in the schema's order, so equal requests give equal keys)
  const key = body.seed === undefined ? null : JSON.stringify([input.request, format, asked.options]);
  let out = key === null ? undefined : state.cache.get(key);
  if (out === undefined) {
    const made = await runTaskOnPool(state.pool, input, { deadlineMs: state.options.deadlineMs, retryAfterS: state.options.retryAfterS, log: request.log });
    out = { id: made.id, bytes: made.bytes, fileName: made.fileName };
    if (key !== null) state.cache.set(key, out);
  }
  const etag = entityTag(out.id, format, asked.options);
  reply.header('etag', etag);
  if (cacheable) reply.header('cache-control', CACHE_FOREVER);
  if (matchesIfNoneMatch(request.headers['if-none-match'], etag)) return reply.code(304).send();
  reply.header('content-disposition', contentDispositionOf(format, out.fileName));
  return reply.type(contentTypeOf(format)).send(Buffer.from(out.bytes.buffer, out.bytes.byteOffset, out.bytes.byteLength));
}
