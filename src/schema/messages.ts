/**
 * Error messages the schemas attach to each field: they name the value that was sent and the
 * range that is allowed, so a 400 body or a CLI line says what to change without a lookup.
 * zod passes the raw input only to these message builders (it strips `input` from finished
 * issues), which is why the wording is made here and not in `formatIssues`.
 */
import type { z } from 'zod';

/** An interval of allowed values (same shape as the core's LIMITS entries). */
export interface Bounds {
  readonly min: number;
  readonly max: number;
}

/** Longest rendering of a string value inside a message, characters. */
const MAX_SHOWN_CHARS = 40;

/** zod error function: receives the raw issue (with `input`) and returns the message. */
export type ErrorFn = (issue: z.core.$ZodRawIssue) => string;

/**
 * Message for a number (or integer) field outside its range or of the wrong type:
 * `expected a number from 300 to 20000 m, got 250`.
 * @param unit appended after the range ('m', 'degrees'), or '' for plain numbers
 */
export function rangeError(bounds: Bounds, unit: string, integer = false): ErrorFn {
  const what = `${integer ? 'an integer' : 'a number'} from ${bounds.min} to ${bounds.max}${unit ? ` ${unit}` : ''}`;
  return (issue) => `expected ${what}, got ${describeValue(issue.input)}`;
}

/** Message for a field with a fixed wording of what is expected: `expected <what>, got <value>`. */
export function expectedError(what: string): ErrorFn {
  return (issue) => `expected ${what}, got ${describeValue(issue.input)}`;
}

/**
 * Message for an object field: wrong type, or fields it does not know. The unknown-field
 * message ends with `; allowed fields: a, b` so `formatIssues` can repeat that list per field.
 */
export function objectError(what: string, allowed: readonly string[]): ErrorFn {
  return (issue) => {
    if (issue.code === 'unrecognized_keys') {
      const keys = (issue as { keys?: readonly string[] }).keys ?? [];
      return `unknown field${keys.length === 1 ? '' : 's'} ${keys.map((k) => JSON.stringify(k)).join(', ')}${ALLOWED_FIELDS}${allowed.join(', ')}`;
    }
    return `expected ${what}, got ${describeValue(issue.input)}`;
  };
}

/** Separator between the unknown fields and the allowed ones in an unrecognized-keys message. */
export const ALLOWED_FIELDS = '; allowed fields: ';

/**
 * Short human rendering of a JSON value for messages: numbers as written, strings quoted
 * (long ones cut), `an object`, `an array of 3 items`, `nothing` for a missing field.
 */
export function describeValue(value: unknown): string {
  if (value === undefined) return 'nothing';
  if (value === null) return 'null';
  if (typeof value === 'number' || typeof value === 'boolean' || typeof value === 'bigint') return String(value);
  if (typeof value === 'string') {
    if (value.length <= MAX_SHOWN_CHARS) return JSON.stringify(value);
    return `${JSON.stringify(value.slice(0, MAX_SHOWN_CHARS))}... (${value.length} characters)`;
  }
  if (Array.isArray(value)) return `an array of ${value.length} item${value.length === 1 ? '' : 's'}`;
  if (typeof value === 'object') return 'an object';
  return typeof value;
}
