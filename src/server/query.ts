/**
 * GET /v1/tracks/{seed}: turns the path seed and the flattened query string
 * (`?lengthM=2400&widthM.min=8`) into the same request body POST /v1/tracks takes, so one schema
 * checks both and the messages match. Values that read as JSON numbers become numbers; anything
 * else stays a string and the schema names it.
 */
import { SEED_MAX } from '../core/index.js';
import type { FieldIssue } from '../schema/issues.js';

/** A number as JSON writes it: `8`, `-0.5`, `1e3` (not `0x10`, `Infinity` or `.5`). */
const JSON_NUMBER = /^-?(0|[1-9]\d*)(\.\d+)?([eE][+-]?\d+)?$/;
const DIGITS = /^\d+$/;

/** Query keys that are not track parameters. */
const RESERVED_KEYS = new Set(['format']);

/** The body built from a path and query, and the problems that the schema cannot see. */
export interface NestedQuery {
  readonly body: Record<string, unknown>;
  /** Conflicts of the flattening itself (e.g. `widthM=8&widthM.min=8`), with paths. */
  readonly issues: readonly FieldIssue[];
}

/**
 * Reads a seed from the URL path: digits that fit 0..SEED_MAX are the integer seed, anything
 * else is a string seed (so `/v1/tracks/42` and `/v1/tracks/heldout-42` both work).
 * @example parsePathSeed('42') // 42
 */
export function parsePathSeed(raw: string): number | string {
  if (DIGITS.test(raw)) {
    const n = Number(raw);
    if (n <= SEED_MAX) return n;
  }
  return raw;
}

/**
 * Builds a request body from a flattened query string and the path seed.
 * @param query the parsed query string (fastify gives a string per key, or an array of strings for a repeated key)
 * @example nestQuery({ 'widthM.min': '8', lengthM: '2400' }, 7).body // { widthM: { min: 8 }, lengthM: 2400, seed: 7 }
 */
export function nestQuery(query: Readonly<Record<string, unknown>>, seed: number | string): NestedQuery {
  const body: Record<string, unknown> = {};
  const issues: FieldIssue[] = [];
  for (const [key, raw] of Object.entries(query)) {
    if (RESERVED_KEYS.has(key)) continue;
    if (key === 'seed') {
      issues.push({ path: 'seed', message: 'the seed goes in the path (/v1/tracks/{seed}), not in the query string' });
      continue;
    }
    const parts = key.split('.');
    if (parts.some((p) => p === '')) {
      issues.push({ path: key, message: `query key ${JSON.stringify(key)} has an empty part; nested fields are written parent.child (widthM.min=8)` });
      continue;
    }
    const value = Array.isArray(raw) ? raw.map(readValue) : readValue(raw);
    let target = body;
    let conflict = false;
    for (let i = 0; i < parts.length - 1 && !conflict; i++) {
      const existing = Object.hasOwn(target, parts[i]) ? target[parts[i]] : undefined;
      if (existing === undefined) {
        const created: Record<string, unknown> = {};
        setOwn(target, parts[i], created);
        target = created;
      } else if (isPlainObject(existing)) {
        target = existing;
      } else {
        conflict = true;
      }
    }
    const last = parts[parts.length - 1];
    if (!conflict && Object.hasOwn(target, last) && isPlainObject(target[last])) conflict = true;
    if (conflict) {
      issues.push({ path: parts[0], message: `query sets ${JSON.stringify(parts[0])} both as a value and as an object (${JSON.stringify(key)}); use the dotted keys only` });
      continue;
    }
    setOwn(target, last, value);
  }
  setOwn(body, 'seed', seed);
  return { body, issues };
}

function readValue(raw: unknown): unknown {
  if (typeof raw !== 'string') return raw;
  const trimmed = raw.trim();
  return JSON_NUMBER.test(trimmed) ? Number(trimmed) : raw;
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

// an own data property even for keys like __proto__, so the schema reports them as unknown fields
function setOwn(target: Record<string, unknown>, key: string, value: unknown): void {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}
