/**
 * GET /v1/tracks/{seed}: turns the path seed and the flattened query string
 * (`?lengthM=2400&widthM.min=8`) into the same request body POST /v1/tracks takes, so one schema
 * checks both and the messages match. Values that read as JSON numbers become numbers; anything
 * else stays a string and the schema names it.
 */
import type { FieldIssue } from '../schema/issues.js';
import { isPlainObject, readNumberText, readSeedText, setDotted, setOwn } from '../schema/dotted.js';
import { EXPORT_QUERY_KEYS } from './export-query.js';

/** Query keys that are not track parameters: how to answer (format and export options). */
const RESERVED_KEYS: ReadonlySet<string> = new Set(EXPORT_QUERY_KEYS);

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
export const parsePathSeed = readSeedText;

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
    const head = parts[0];
    if (isPlainObject(valueAt(body, parts)) || setDotted(body, parts, value) !== null) {
      issues.push({ path: head, message: `query sets ${JSON.stringify(head)} both as a value and as an object (${JSON.stringify(key)}); use the dotted keys only` });
    }
  }
  setOwn(body, 'seed', seed);
  return { body, issues };
}

// what the body holds at a dotted path, if anything
function valueAt(body: Record<string, unknown>, parts: readonly string[]): unknown {
  let node: unknown = body;
  for (const p of parts) node = isPlainObject(node) && Object.hasOwn(node, p) ? node[p] : undefined;
  return node;
}

function readValue(raw: unknown): unknown {
  return typeof raw === 'string' ? readNumberText(raw) : raw;
}
