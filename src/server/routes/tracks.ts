/**
 * POST /v1/tracks (parameters in a JSON body) and GET /v1/tracks/{seed} (parameters in the query
 * string, cacheable forever): one track each, generated on the worker pool. The ETag is the
 * track's id (a content hash), so If-None-Match answers 304 without the body.
 */
import { randomInt } from 'node:crypto';
import type { FastifyPluginAsync, FastifyReply, FastifyRequest } from 'fastify';
import { z } from 'zod';
import { SEED_MAX } from '../../core/index.js';
import { formatIssues, type FieldIssue } from '../../schema/issues.js';
import { trackRequestSchema, type TrackRequestBody } from '../../schema/params.js';
import { HttpError } from '../errors.js';
import { runTaskOnPool } from '../generation.js';
import { FORMAT_MEDIA_TYPES, matchesIfNoneMatch, negotiateFormat } from '../negotiate.js';
import { nestQuery, parsePathSeed } from '../query.js';
import { formatSchema, getTrackQueryDocSchema, postTrackQuerySchema, seedPathSchema, trackResponseSchema, type TrackFormat } from '../schemas.js';
import { invalidInput } from '../validation.js';
import { errorResponse, jsonResponse, OVERLOADED_503 } from './responses.js';

/** Cache-Control of GET /v1/tracks/{seed}: the same URL gives the same bytes for a generator version. */
export const CACHE_FOREVER = 'public, max-age=31536000, immutable';

const TRACK_200 = jsonResponse('The track (format lapwright.track/1). The ETag header is its id in quotes.', trackResponseSchema);
const NOT_MODIFIED_304 = z.undefined().meta({ description: 'If-None-Match matched the track\'s ETag: no body.' });
const ERRORS = {
  400: errorResponse('ERR_INVALID_PARAMS (every offending field in issues, with its path), ERR_INVALID_JSON or ERR_BAD_REQUEST.'),
  406: errorResponse('ERR_NOT_ACCEPTABLE: the format asked for (format query or Accept) is not available.'),
  422: errorResponse('ERR_INFEASIBLE (reason, hint and the last attempt\'s issues) or ERR_DEADLINE_EXCEEDED (the request needs more time than the deadline).'),
  503: OVERLOADED_503,
};

/** Track routes. */
export const trackRoutes: FastifyPluginAsync = async (app) => {
  app.post(
    '/v1/tracks',
    {
      schema: {
        tags: ['tracks'],
        summary: 'Generate one track',
        description:
          'Every parameter is optional. A seed left out is drawn at random and echoed in the track (track.seed). JSON is the only format in this version: format=svg|glb|csv or an Accept header without JSON answers 406.',
        querystring: postTrackQuerySchema,
        body: trackRequestSchema,
        response: { 200: TRACK_200, 304: NOT_MODIFIED_304, ...ERRORS, 413: errorResponse('ERR_BODY_TOO_LARGE: the body is over the size cap.'), 415: errorResponse('ERR_UNSUPPORTED_MEDIA_TYPE: the body is not application/json.') },
      },
      // no body at all means every default
      preValidation: async (request) => {
        if (request.body === undefined || request.body === null) request.body = {};
      },
    },
    async (request, reply) => {
      const query = request.query as { format?: TrackFormat };
      return answerTrack(request, reply, request.body as TrackRequestBody, query.format, false);
    },
  );

  app.get(
    '/v1/tracks/:seed',
    {
      schema: {
        tags: ['tracks'],
        summary: 'Generate one track, cacheably',
        description:
          'The same track as POST /v1/tracks with the parameters in the query string, nested ones flattened with a dot (widthM.min=8&widthM.max=12). The answer never changes for a generator version: Cache-Control: public, max-age=31536000, immutable, so a CDN or reverse proxy can serve repeats.',
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
      const query = request.query as Record<string, unknown>;
      const nested = nestQuery(query, parsePathSeed(seed));
      const issues: FieldIssue[] = [];
      let format: TrackFormat | undefined;
      if (Object.hasOwn(query, 'format')) {
        const parsed = formatSchema.safeParse(query.format);
        if (parsed.success) format = parsed.data;
        else issues.push(...formatIssues(parsed.error).map((i) => ({ ...i, path: 'format' })));
      }
      issues.push(...nested.issues);
      const parsed = trackRequestSchema.safeParse(nested.body);
      if (!parsed.success) issues.push(...formatIssues(parsed.error));
      if (issues.length > 0 || !parsed.success) throw invalidInput('ERR_INVALID_PARAMS', issues);
      return answerTrack(request, reply, parsed.data, format, true);
    },
  );
};

async function answerTrack(request: FastifyRequest, reply: FastifyReply, body: TrackRequestBody, formatQuery: TrackFormat | undefined, cacheable: boolean): Promise<FastifyReply> {
  const state = request.server.lapwright;
  reply.header('vary', 'Accept');
  const negotiated = negotiateFormat(formatQuery, request.headers.accept);
  if (negotiated.format === null) {
    throw new HttpError('ERR_NOT_ACCEPTABLE', `the Accept header ${JSON.stringify(negotiated.accept)} allows none of ${Object.values(FORMAT_MEDIA_TYPES).join(', ')}; this version answers application/json`);
  }
  if (negotiated.format !== 'json') {
    const how = formatQuery !== undefined ? `format=${formatQuery}` : `Accept: ${FORMAT_MEDIA_TYPES[negotiated.format]}`;
    throw new HttpError('ERR_NOT_ACCEPTABLE', `the ${negotiated.format} export (${how}) is not available yet: this version answers application/json only (leave out format, or send Accept: application/json)`);
  }
  // the core reads no randomness: a missing seed is drawn here and echoed in the track
  const seed = body.seed ?? randomInt(0, SEED_MAX + 1);
  const out = await runTaskOnPool(state.pool, { kind: 'generate', request: { ...body, seed } }, { deadlineMs: state.options.deadlineMs, retryAfterS: state.options.retryAfterS, log: request.log });
  const etag = `"${out.id}"`;
  reply.header('etag', etag);
  if (cacheable) reply.header('cache-control', CACHE_FOREVER);
  if (matchesIfNoneMatch(request.headers['if-none-match'], etag)) return reply.code(304).send();
  return reply.type('application/json; charset=utf-8').send(Buffer.from(out.json.buffer, out.json.byteOffset, out.json.byteLength));
}
