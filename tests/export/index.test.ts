// Tests for src/export/index.ts: the format table and the dispatcher the HTTP service and the
// CLI share.

import { describe, expect, it } from 'vitest';
import { EXPORT_FORMAT_NAMES, EXPORT_FORMATS, exportFileName, exportTrack, isExportFormat, trackToCsv, trackToGlb, trackToJson, trackToSvg } from '../../src/export/index.js';
import type { ExportFormat } from '../../src/export/index.js';
import { stadiumTrack } from '../helpers/synthetic-track.js';

describe('EXPORT_FORMATS', () => {
  it('json, glb, svg and csv with their registered media types', () => {
    expect(EXPORT_FORMAT_NAMES).toEqual(['json', 'glb', 'svg', 'csv']);
    expect(Object.fromEntries(EXPORT_FORMAT_NAMES.map((f) => [f, EXPORT_FORMATS[f].mediaType]))).toEqual({
      json: 'application/json',
      glb: 'model/gltf-binary',
      svg: 'image/svg+xml',
      csv: 'text/csv',
    });
    expect(EXPORT_FORMAT_NAMES.filter((f) => EXPORT_FORMATS[f].binary)).toEqual(['glb']);
  });

  it('isExportFormat knows exactly the four names', () => {
    expect(EXPORT_FORMAT_NAMES.every(isExportFormat)).toBe(true);
    for (const name of ['gltf', 'JSON', 'toString', '__proto__', '']) expect(isExportFormat(name)).toBe(false);
  });
});

describe('exportTrack', () => {
  const track = stadiumTrack();

  it('hands each format and its options to its exporter', async () => {
    expect(await exportTrack(track, 'json', { pretty: true })).toBe(trackToJson(track, { pretty: true }));
    expect(await exportTrack(track, 'svg', { widthPx: 640, heat: true })).toBe(trackToSvg(track, { widthPx: 640, heat: true }));
    expect(await exportTrack(track, 'csv', { table: 'gates' })).toBe(trackToCsv(track, { table: 'gates' }));
    expect(await exportTrack(track, 'csv')).toBe(trackToCsv(track));
    const glb = await exportTrack(track, 'glb', { gateDepthM: 0.2 });
    expect(glb).toBeInstanceOf(Uint8Array);
    expect(Buffer.from(glb as Uint8Array).equals(Buffer.from(await trackToGlb(track, { gateDepthM: 0.2 })))).toBe(true);
  });

  it('text formats end in a newline', async () => {
    for (const format of ['json', 'svg', 'csv'] as const) expect((await exportTrack(track, format)) as string).toMatch(/\n$/);
  });

  it('an unknown format is refused with the list of formats', async () => {
    await expect(exportTrack(track, 'obj' as ExportFormat)).rejects.toThrow(new RangeError('format must be one of json, glb, svg, csv, got "obj"'));
  });
});

describe('exportFileName', () => {
  it('names the file after the id, with the CSV table', () => {
    const track = { ...stadiumTrack(), id: 'd68eba0e2f' };
    expect(exportFileName(track, 'glb')).toBe('track-d68eba0e.glb');
    expect(exportFileName(track, 'csv')).toBe('track-d68eba0e-centerline.csv');
    expect(exportFileName(track, 'csv', { table: 'gates' })).toBe('track-d68eba0e-gates.csv');
    // an uploaded track's id may hold anything: only letters, digits, - and _ reach the name
    expect(exportFileName({ ...track, id: '../x y' }, 'svg')).toBe('track-___x_y.svg');
  });
});
