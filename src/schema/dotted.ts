/**
 * Parameters written as text with dotted keys (`widthM.min=8`), as the CLI's `--set` and the
 * HTTP query string of GET /v1/tracks/{seed} take them: reading a value, reading a seed, and
 * setting a nested field, before the request schema checks the result.
 */
import { SEED_MAX } from '../core/index.js';

/** A number as JSON writes it: `8`, `-0.5`, `1e3` (not `0x10`, `Infinity` or `.5`). */
const JSON_NUMBER = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?$/;
const DIGITS = /^\d+$/;

/**
 * Reads a seed written as text: digits that fit in 0..SEED_MAX are a number, anything else is a
 * string seed (so `42` and `lap-42` both work; `4294967296` is the string).
 * @example readSeedText('42') // 42
 */
export function readSeedText(raw: string): number | string {
  if (DIGITS.test(raw)) {
    const n = Number(raw);
    if (n <= SEED_MAX) return n;
  }
  return raw;
}

/**
 * Reads a value written as text: a JSON number becomes a number (surrounding spaces allowed),
 * anything else stays the string as written, for the schema to name.
 * @example readNumberText('8') // 8
 */
export function readNumberText(raw: string): number | string {
  const trimmed = raw.trim();
  return JSON_NUMBER.test(trimmed) ? Number(trimmed) : raw;
}

/**
 * Sets `value` at the dotted path `parts` inside `target`, creating the objects on the way.
 * Keys like `__proto__` become plain own fields, so the schema refuses them by name.
 * @returns null once set; or, when a part on the way holds a value that is not an object, that
 *   part's dotted path and value (nothing is set then)
 * @example setDotted(body, ['widthM', 'min'], 8) // body.widthM.min === 8
 */
export function setDotted(target: Record<string, unknown>, parts: readonly string[], value: unknown): { at: string; value: unknown } | null {
  let node = target;
  for (let i = 0; i < parts.length - 1; i++) {
    const existing = Object.hasOwn(node, parts[i]) ? node[parts[i]] : undefined;
    if (existing === undefined) {
      const created: Record<string, unknown> = {};
      setOwn(node, parts[i], created);
      node = created;
    } else if (isPlainObject(existing)) {
      node = existing;
    } else {
      return { at: parts.slice(0, i + 1).join('.'), value: existing };
    }
  }
  setOwn(node, parts[parts.length - 1], value);
  return null;
}

/** True for a JSON object (not null, not an array). */
export function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Defines an own data property, even for keys like `__proto__`. */
export function setOwn(target: Record<string, unknown>, key: string, value: unknown): void {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}
