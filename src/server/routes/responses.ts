/**
 * OpenAPI response entries shared by the routes: a description per status and the schema of
 * the body (the error body for every error status).
 */
import type { z } from 'zod';
import { errorSchema } from '../schemas.js';

/** A documented response: its description and JSON body schema. */
export function jsonResponse(description: string, schema: z.ZodType) {
  return { description, content: { 'application/json': { schema } } };
}

/** A documented error response. */
export function errorResponse(description: string) {
  return jsonResponse(description, errorSchema);
}

/** The 503 every route that uses the worker pool may answer. */
export const OVERLOADED_503 = errorResponse('ERR_OVERLOADED (queue full, or the deadline ran out while waiting), ERR_SHUTTING_DOWN, ERR_NOT_READY, ERR_UNAVAILABLE or ERR_WORKER_CRASHED (the worker died under the request and was replaced); the Retry-After header says when to try again.');
