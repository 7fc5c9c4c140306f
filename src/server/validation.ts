/**
 * How routes check their input with zod: every failure becomes one 400 that lists each
 * offending field with its path, in the words of the schema (src/schema/messages.ts).
 */
import type { FastifySchemaCompiler } from 'fastify';
import type { z } from 'zod';
import { formatIssues, type FieldIssue } from '../schema/issues.js';
import { HttpError } from './errors.js';

/** The 400 codes a route may answer malformed input with. */
export type InvalidInputCode = 'ERR_INVALID_PARAMS' | 'ERR_INVALID_TRACK';

const WHAT: Record<InvalidInputCode, string> = {
  ERR_INVALID_PARAMS: 'invalid track parameters',
  ERR_INVALID_TRACK: 'malformed track',
};

/**
 * A fastify validator compiler for zod schemas whose failures are `code` 400s.
 * @example app.setValidatorCompiler(zodValidator('ERR_INVALID_PARAMS'))
 */
// fastify types a route's compiler by the route's whole schema object; each call gets one zod schema
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function zodValidator(code: InvalidInputCode): FastifySchemaCompiler<any> {
  return ({ schema }) =>
    (data: unknown) => {
      const result = (schema as z.ZodType).safeParse(data);
      if (result.success) return { value: result.data };
      return { error: invalidInput(code, formatIssues(result.error)) };
    };
}

/**
 * The 400 for a list of offending fields.
 * @example invalidInput('ERR_INVALID_PARAMS', [{ path: 'lengthM', message: '...' }]).message // 'invalid track parameters: 1 issue, listed with its path in issues'
 */
export function invalidInput(code: InvalidInputCode, issues: readonly FieldIssue[]): HttpError {
  const n = issues.length;
  const message = `${WHAT[code]}: ${n} issue${n === 1 ? '' : 's'}, listed with ${n === 1 ? 'its path' : 'their paths'} in issues`;
  return new HttpError(code, message, { issues });
}
