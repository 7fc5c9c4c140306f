/**
 * Parameter overrides on the command line: `--seed S` and `--set key=value`, merged over the
 * `--params` JSON before the schema sees the result (so unknown keys and bad values are
 * reported by the schema, with their paths, like any other input).
 */
import { SEED_MAX } from '../core/index.js';
import { describeValue } from '../schema/messages.js';
import { InputError } from './io.js';

/** A number as JSON writes it: `8`, `-0.5`, `1e3` (not `0x10`, `Infinity` or `.5`). */
const JSON_NUMBER = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?$/;
const DIGITS = /^\d+$/;

/**
 * Reads a seed flag: digits that fit in 0..SEED_MAX are a number, anything else is a string
 * seed (so `--seed 42` and `--seed lap-42` both work; `--seed 4294967296` is the string).
 * @example parseSeedFlag('42') // 42
 */
export function parseSeedFlag(raw: string): number | string {
  if (DIGITS.test(raw)) {
    const n = Number(raw);
    if (n <= SEED_MAX) return n;
  }
  return raw;
}

/**
 * Reads a `--set` value: a JSON number becomes a number (surrounding spaces allowed), anything
 * else stays the string as typed.
 * @example parseSetValue('8') // 8
 */
export function parseSetValue(raw: string): number | string {
  const trimmed = raw.trim();
  return JSON_NUMBER.test(trimmed) ? Number(trimmed) : raw;
}

/**
 * Applies one `--set key=value` to `body` in place: dotted keys reach nested objects
 * (`widthM.min=8`), creating them when missing; `seed` follows the `--seed` rule.
 * @throws InputError when the entry has no `=`, an empty key part, or a dotted key runs into a
 *   value that is not an object
 * @example applySet(body, 'widthM.min=8') // body.widthM.min === 8
 */
export function applySet(body: Record<string, unknown>, entry: string): void {
  const eq = entry.indexOf('=');
  if (eq <= 0) throw new InputError(`--set expects key=value (e.g. widthM.min=8), got ${JSON.stringify(entry)}`);
  const key = entry.slice(0, eq);
  const raw = entry.slice(eq + 1);
  const parts = key.split('.');
  if (parts.some((p) => p === '')) throw new InputError(`--set key ${JSON.stringify(key)} has an empty part`);
  const value = key === 'seed' ? parseSeedFlag(raw) : parseSetValue(raw);
  let target = body;
  for (let i = 0; i < parts.length - 1; i++) {
    const existing = Object.hasOwn(target, parts[i]) ? target[parts[i]] : undefined;
    if (existing === undefined) {
      const created: Record<string, unknown> = {};
      setOwn(target, parts[i], created);
      target = created;
    } else if (isPlainObject(existing)) {
      target = existing;
    } else {
      const at = parts.slice(0, i + 1).join('.');
      throw new InputError(`--set ${key}: ${at} is ${describeValue(existing)}, not an object`);
    }
  }
  setOwn(target, parts[parts.length - 1], value);
}

/** True for a JSON object (not null, not an array). */
export function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

// an own data property even for keys like __proto__, so the schema reports them as unknown fields
function setOwn(target: Record<string, unknown>, key: string, value: unknown): void {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}
