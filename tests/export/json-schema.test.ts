// Tests for src/export/json-schema.ts: the track format's JSON Schema, checked with a
// general-purpose validator (ajv, draft 2020-12): every generated track passes, mangled tracks
// fail where the zod schema fails, and the checked-in openapi/track.schema.json is current.

import { readFile } from 'node:fs/promises';
import { Ajv2020 } from 'ajv/dist/2020.js';
import { describe, expect, it } from 'vitest';
import type { Track } from '../../src/core/index.js';
import { renderTrackJsonSchema, TRACK_SCHEMA_FILE, trackJsonSchema } from '../../src/export/json-schema.js';
import { MAX_TRACK_ARRAY_ENTRIES, trackSchema } from '../../src/schema/track.js';
import { exportTrack, exportTracks } from '../helpers/export-tracks.js';
import { cloneTrack, type MutableTrack } from '../helpers/synthetic-track.js';

const REPO_ROOT = new URL('../../', import.meta.url);

// strict mode: ajv refuses unknown keywords and loose tuples, so the schema is clean 2020-12
const validate = new Ajv2020({ allErrors: true, strict: true }).compile(trackJsonSchema());

/** A track as a JSON client sees it. */
const asJson = (track: Track): Record<string, unknown> => JSON.parse(JSON.stringify(track)) as Record<string, unknown>;

describe('track JSON Schema', () => {
  it('is draft 2020-12 with a title, and the checked-in file is current (run npm run schema when this fails)', async () => {
    const schema = trackJsonSchema();
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(schema.title).toBe('lapwright track (lapwright.track/1)');
    const checkedIn = await readFile(new URL(TRACK_SCHEMA_FILE, REPO_ROOT), 'utf8');
    expect(checkedIn === renderTrackJsonSchema(), `${TRACK_SCHEMA_FILE} is stale: run npm run schema and commit the result`).toBe(true);
  });

  it.each(exportTracks())('the %s track validates', (_name, track) => {
    const ok = validate(asJson(track));
    expect(validate.errors ?? []).toEqual([]);
    expect(ok).toBe(true);
  });

  // each mangling breaks the shape; the JSON Schema and the zod schema agree that it does
  const MANGLED: [string, (t: MutableTrack & Record<string, unknown>) => void, string][] = [
    ['format of another version', (t) => void ((t as { format: string }).format = 'lapwright.track/2'), '/format'],
    ['no centerline', (t) => void delete (t as Partial<MutableTrack>).centerline, ''],
    ['a point of three numbers', (t) => void ((t.centerline.points as number[][])[3] = [1, 2, 3]), '/centerline/points/3'],
    ['a number as text', (t) => void ((t.centerline.curvature as unknown[])[5] = '0.01'), '/centerline/curvature/5'],
    ['a negative gate index', (t) => void (t.gates[2].index = -1), '/gates/2/index'],
    ['a fractional corner count', (t) => void (t.metrics.cornerCount = 2.5), '/metrics/cornerCount'],
    ['a corner turning up', (t) => void ((t.corners[0] as { direction: string }).direction = 'up'), '/corners/0/direction'],
    ['a seed of 65 characters', (t) => void (t.seed = 'x'.repeat(65)), '/seed'],
    ['params out of range', (t) => void (t.params.lengthM = 50), '/params/lengthM'],
    ['walls as a list', (t) => void ((t as Record<string, unknown>).walls = []), '/walls'],
    ['too many points', (t) => void (t.centerline.points = Array.from({ length: MAX_TRACK_ARRAY_ENTRIES + 1 }, () => [0, 0])), '/centerline/points'],
  ];

  it.each(MANGLED)('%s fails, at its path, as it fails the zod schema', (_what, mangle, path) => {
    const track = cloneTrack(exportTrack('kart')) as MutableTrack & Record<string, unknown>;
    mangle(track);
    const json = JSON.parse(JSON.stringify(track)) as unknown;
    expect(validate(json)).toBe(false);
    expect(validate.errors?.map((e) => e.instancePath)).toContain(path);
    expect(trackSchema.safeParse(json).success).toBe(false);
  });

  it('extra fields are welcome, as in the zod schema', () => {
    const track = { ...asJson(exportTrack('kart')), notes: 'hand-tuned', metrics: { ...exportTrack('kart').metrics, lapRecordS: 61.2 } };
    expect(validate(track)).toBe(true);
    expect(trackSchema.safeParse(track).success).toBe(true);
  });
});
