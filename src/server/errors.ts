/**
 * Every error code the HTTP service answers with, its status, and the one body shape
 * (STYLE.md §6): `{ statusCode, code, error, message }`, plus `issues` for 400 and 422 and
 * `reason` and `hint` for 422. The core's codes (ERR_INVALID_PARAMS, ERR_INFEASIBLE,
 * ERR_INVALID_TRACK) keep the statuses the core gives them; the rest are the service's own.
 */
import { STATUS_CODES } from 'node:http';
import { ERROR_CODES } from '../core/index.js';
import type { Issue } from '../core/index.js';
import type { FieldIssue } from '../schema/issues.js';

/** Code → HTTP status, with what each means (the README's HTTP service section lists the same table). */
export const HTTP_ERRORS = {
  ERR_INVALID_PARAMS: { status: ERROR_CODES.ERR_INVALID_PARAMS.status, meaning: 'track parameters, seed or query string malformed: every offending field is listed in issues' },
  ERR_INVALID_TRACK: { status: ERROR_CODES.ERR_INVALID_TRACK.status, meaning: 'uploaded track malformed (wrong types, missing fields): every offending field is listed in issues' },
  ERR_INVALID_JSON: { status: 400, meaning: 'request body is not JSON, or nests arrays and objects more than 64 levels deep' },
  ERR_BAD_REQUEST: { status: 400, meaning: 'request malformed at the HTTP level (bad Content-Length, URL encoding)' },
  ERR_UNAUTHORIZED: { status: 401, meaning: 'the server has an API token and the request did not send it as Authorization: Bearer ... (or sent another)' },
  ERR_NOT_FOUND: { status: 404, meaning: 'no such route' },
  ERR_NOT_ACCEPTABLE: { status: 406, meaning: 'the Accept header allows none of the formats (JSON, glb, SVG, CSV)' },
  ERR_BODY_TOO_LARGE: { status: 413, meaning: 'request body over the size cap' },
  ERR_UNSUPPORTED_MEDIA_TYPE: { status: 415, meaning: 'request body is not application/json' },
  ERR_RATE_LIMITED: { status: 429, meaning: 'this client sent more requests in the rate-limit window than the server allows: retry after Retry-After seconds' },
  ERR_INFEASIBLE: { status: ERROR_CODES.ERR_INFEASIBLE.status, meaning: 'well-formed parameters that no valid track meets: reason, hint and the last attempt\'s issues' },
  ERR_DEADLINE_EXCEEDED: { status: 422, meaning: 'the request alone needs more time than the deadline: ask for less (shorter lap, fewer corners)' },
  ERR_INTERNAL: { status: 500, meaning: 'a bug: logged on the server, never caused by input' },
  ERR_OVERLOADED: { status: 503, meaning: 'too many requests waiting for a worker: retry after Retry-After seconds' },
  ERR_NOT_READY: { status: 503, meaning: 'the worker pool is still starting (readiness)' },
  ERR_SHUTTING_DOWN: { status: 503, meaning: 'the server is draining after SIGTERM: retry on another replica' },
  ERR_UNAVAILABLE: { status: 503, meaning: 'no generation workers could be started' },
  ERR_WORKER_CRASHED: { status: 503, meaning: 'the worker thread making this answer stopped unexpectedly and was replaced: retry after Retry-After seconds' },
} as const;

export type HttpErrorCode = keyof typeof HTTP_ERRORS;

/** Extra fields of an error body. */
export interface ErrorExtras {
  /** 400: every offending field; 422: the issues of the generator's last attempt. */
  readonly issues?: readonly (FieldIssue | Issue)[];
  /** 422: machine-readable reason. */
  readonly reason?: string;
  /** 422: what to change. */
  readonly hint?: string;
  /** 422 ERR_INFEASIBLE: attempts the generator made. */
  readonly attempts?: number;
}

/** The JSON body of every error answer. */
export interface ErrorBody extends ErrorExtras {
  readonly statusCode: number;
  readonly code: HttpErrorCode;
  readonly error: string;
  readonly message: string;
}

/** An error that becomes exactly one answer: status from the code, body from errorBody. */
export class HttpError extends Error {
  readonly code: HttpErrorCode;
  readonly statusCode: number;
  readonly extras: ErrorExtras;
  /** Response headers to set (Retry-After). */
  readonly headers: Readonly<Record<string, string>>;

  constructor(code: HttpErrorCode, message: string, extras: ErrorExtras = {}, headers: Readonly<Record<string, string>> = {}) {
    super(message);
    this.name = 'HttpError';
    this.code = code;
    this.statusCode = HTTP_ERRORS[code].status;
    this.extras = extras;
    this.headers = headers;
  }

  /** The body to send. */
  body(): ErrorBody {
    return errorBody(this.code, this.message, this.extras);
  }
}

/**
 * Builds an error body: status and reason phrase from the code, then the extras in a fixed
 * order (reason, hint, issues, attempts).
 * @example errorBody('ERR_NOT_FOUND', 'no route GET /x') // { statusCode: 404, code: 'ERR_NOT_FOUND', error: 'Not Found', message: 'no route GET /x' }
 */
export function errorBody(code: HttpErrorCode, message: string, extras: ErrorExtras = {}): ErrorBody {
  const statusCode = HTTP_ERRORS[code].status;
  const body: ErrorBody = { statusCode, code, error: STATUS_CODES[statusCode] ?? 'Error', message };
  const out: Record<string, unknown> = { ...body };
  if (extras.reason !== undefined) out.reason = extras.reason;
  if (extras.hint !== undefined) out.hint = extras.hint;
  if (extras.issues !== undefined) out.issues = extras.issues;
  if (extras.attempts !== undefined) out.attempts = extras.attempts;
  return out as unknown as ErrorBody;
}

/** A 503 with Retry-After. */
export function unavailable(code: 'ERR_OVERLOADED' | 'ERR_NOT_READY' | 'ERR_SHUTTING_DOWN' | 'ERR_UNAVAILABLE' | 'ERR_WORKER_CRASHED', message: string, retryAfterS: number): HttpError {
  return new HttpError(code, message, {}, { 'retry-after': String(retryAfterS) });
}
