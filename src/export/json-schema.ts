/**
 * The JSON Schema (draft 2020-12) of the track format `lapwright.track/1`, made from the zod
 * schema that checks uploaded tracks (src/schema/track.ts), so the two never disagree on shape:
 * types, finite numbers, [x, y] pairs, array caps and resolved params. Consistency between
 * fields (equal array lengths, simple polylines, the id) is the checker's job
 * (`validateTrack`), as it is for uploads.
 */
import { z } from 'zod';
import { TRACK_FORMAT } from '../core/index.js';
import { trackSchema } from '../schema/track.js';

/** Where the schema is checked in, relative to the repository root (`npm run schema` writes it). */
export const TRACK_SCHEMA_FILE = 'openapi/track.schema.json';

/**
 * The track format's JSON Schema, draft 2020-12.
 * @returns a fresh plain object (safe to modify)
 * @example new Ajv2020().compile(trackJsonSchema())(JSON.parse(text))
 */
export function trackJsonSchema(): Record<string, unknown> {
  const generated = z.toJSONSchema(trackSchema, { target: 'draft-2020-12' }) as Record<string, unknown>;
  const { $schema, ...rest } = generated;
  return { $schema, title: `lapwright track (${TRACK_FORMAT})`, ...rest };
}

/** The schema as the checked-in file holds it: two-space JSON and a final newline. */
export function renderTrackJsonSchema(): string {
  return JSON.stringify(trackJsonSchema(), null, 2) + '\n';
}
