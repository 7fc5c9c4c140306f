/**
 * The one place errors become answers (STYLE.md §6). Our own HttpErrors carry their code; the
 * few fastify errors a client can cause (body too large, not JSON, wrong media type) are mapped
 * to our codes; anything else is a bug: logged with its stack, answered 500 'Internal Server
 * Error' with no detail.
 */
import type { FastifyError, FastifyReply, FastifyRequest } from 'fastify';
import { errorBody, HttpError } from './errors.js';

/** fastify's own error codes that a client's request can cause, and ours for each. */
const FASTIFY_CLIENT_ERRORS: Readonly<Record<string, (err: FastifyError, request: FastifyRequest) => HttpError>> = {
  FST_ERR_CTP_BODY_TOO_LARGE: (_err, request) => {
    const limit = request.routeOptions.bodyLimit ?? 0;
    return new HttpError('ERR_BODY_TOO_LARGE', `request body is larger than the ${limit}-byte limit (${formatBytes(limit)}) of ${request.method} ${request.routeOptions.url ?? request.url}`);
  },
  FST_ERR_CTP_INVALID_MEDIA_TYPE: (_err, request) =>
    new HttpError('ERR_UNSUPPORTED_MEDIA_TYPE', `request body of type ${JSON.stringify(request.headers['content-type'] ?? '')} is not accepted: send JSON with Content-Type: application/json`),
  FST_ERR_CTP_INVALID_CONTENT_LENGTH: () => new HttpError('ERR_BAD_REQUEST', 'Content-Length does not match the body that was sent'),
};

/**
 * fastify error handler: sends the error body with its status (and Retry-After on 503s).
 */
export function handleError(err: FastifyError, request: FastifyRequest, reply: FastifyReply): FastifyReply {
  const answer = toHttpError(err, request);
  if (answer.statusCode >= 500 && answer.code === 'ERR_INTERNAL') request.log.error({ err }, 'unexpected error');
  else request.log.info({ code: answer.code, statusCode: answer.statusCode }, answer.message);
  for (const [name, value] of Object.entries(answer.headers)) reply.header(name, value);
  return reply.code(answer.statusCode).type('application/json; charset=utf-8').send(answer.body());
}

/** 404 for any route that does not exist. */
export function handleNotFound(request: FastifyRequest, reply: FastifyReply): FastifyReply {
  const url = request.url.length > 200 ? `${request.url.slice(0, 200)}...` : request.url;
  const body = errorBody('ERR_NOT_FOUND', `no route ${request.method} ${url}; GET /openapi.json lists the endpoints`);
  return reply.code(404).type('application/json; charset=utf-8').send(body);
}

function toHttpError(err: FastifyError, request: FastifyRequest): HttpError {
  if (err instanceof HttpError) return err;
  const mapped = err.code !== undefined && Object.hasOwn(FASTIFY_CLIENT_ERRORS, err.code) ? FASTIFY_CLIENT_ERRORS[err.code] : undefined;
  if (mapped !== undefined) return mapped(err, request);
  // other fastify errors of the client's making (a malformed URL, say) keep their message
  if (typeof err.statusCode === 'number' && err.statusCode >= 400 && err.statusCode < 500 && typeof err.code === 'string' && err.code.startsWith('FST_')) {
    return new HttpError('ERR_BAD_REQUEST', err.message);
  }
  return new HttpError('ERR_INTERNAL', 'Internal Server Error');
}

function formatBytes(n: number): string {
  if (n >= 1024 * 1024 && n % (1024 * 1024) === 0) return `${n / (1024 * 1024)} MiB`;
  if (n >= 1024 && n % 1024 === 0) return `${n / 1024} KiB`;
  return `${n} bytes`;
}
