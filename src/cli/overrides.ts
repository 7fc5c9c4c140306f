/**
 * Parameter overrides on the command line: `--seed S` and `--set key=value`, merged over the
 * `--params` JSON before the schema sees the result (so unknown keys and bad values are
 * reported by the schema, with their paths, like any other input).
 */
import { describeValue } from '../schema/messages.js';
import { isPlainObject, readNumberText, readSeedText, setDotted } from '../schema/dotted.js';
import { InputError } from './io.js';

/** True for a JSON object (not null, not an array). */
export { isPlainObject };

/**
 * Reads a seed flag: digits that fit in 0..SEED_MAX are a number, anything else is a string
 * seed (so `--seed 42` and `--seed lap-42` both work; `--seed 4294967296` is the string).
 * @example parseSeedFlag('42') // 42
 */
export const parseSeedFlag = readSeedText;

/**
 * Reads a `--set` value: a JSON number becomes a number (surrounding spaces allowed), anything
 * else stays the string as typed.
 * @example parseSetValue('8') // 8
 */
export const parseSetValue = readNumberText;

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
  const blocked = setDotted(body, parts, value);
  if (blocked !== null) throw new InputError(`--set ${key}: ${blocked.at} is ${describeValue(blocked.value)}, not an object`);
}
