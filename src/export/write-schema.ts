/**
 * `npm run schema`: writes the track format's JSON Schema to openapi/track.schema.json (or the
 * path given).
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { renderTrackJsonSchema, TRACK_SCHEMA_FILE } from './json-schema.js';

const target = resolve(process.argv[2] ?? TRACK_SCHEMA_FILE);
await mkdir(dirname(target), { recursive: true });
await writeFile(target, renderTrackJsonSchema(), 'utf8');
process.stdout.write(`wrote ${target}\n`);
