import { describe, expect, it } from 'vitest';
import { EXPORT_FORMAT_NAMES } from '../../src/export/index.js';
import { contentDispositionOf, contentTypeOf, entityTag, EXPORT_QUERY_KEYS, optionIssues, readExportQuery, TRACK_FORMATS } from '../../src/server/export-query.js';

describe('TRACK_FORMATS', () => {
  it('are exactly the export formats (json first, so it wins Accept ties)', () => {
    expect([...TRACK_FORMATS].sort()).toEqual([...EXPORT_FORMAT_NAMES].sort());
    expect(TRACK_FORMATS[0]).toBe('json');
    expect(EXPORT_QUERY_KEYS).toEqual(['format', 'table', 'heat', 'widthPx', 'pretty']);
  });
});

describe('readExportQuery', () => {
  it('reads booleans and numbers written as text', () => {
    expect(readExportQuery({ format: 'svg', heat: 'true', widthPx: '600' }, true)).toEqual({ query: { format: 'svg', options: { heat: true, widthPx: 600 } }, issues: [] });
    expect(readExportQuery({ format: 'csv', table: 'gates' }, true)).toEqual({ query: { format: 'csv', options: { table: 'gates' } }, issues: [] });
    expect(readExportQuery({ pretty: 'false' }, true)).toEqual({ query: { options: { pretty: false } }, issues: [] });
    expect(readExportQuery({}, true)).toEqual({ query: { options: {} }, issues: [] });
  });

  it('names every bad value, in the words of the schema', () => {
    expect(readExportQuery({ format: 'png', heat: 'TRUE', widthPx: '640.5', table: ['gates', 'gates'], pretty: '' }, true).issues).toEqual([
      { path: 'format', message: 'expected one of json, svg, glb, csv, got "png"' },
      { path: 'table', message: 'expected one of centerline, gates, got an array of 2 items' },
      { path: 'heat', message: 'expected true or false, got "TRUE"' },
      { path: 'widthPx', message: 'expected an integer from 200 to 4000 px, got 640.5' },
      { path: 'pretty', message: 'expected true or false, got ""' },
    ]);
  });

  it('strict: any other key is refused by name; loose: other keys are left alone', () => {
    expect(readExportQuery({ lengthM: '900', format: 'glb' }, true).issues).toEqual([{ path: 'lengthM', message: 'unknown field "lengthM"; allowed fields: format, table, heat, widthPx, pretty' }]);
    expect(readExportQuery({ lengthM: '900', format: 'glb' }, false)).toEqual({ query: { format: 'glb', options: {} }, issues: [] });
  });

  it('a key like __proto__ stays a plain field and is refused', () => {
    const query = JSON.parse('{"__proto__": "x"}') as Record<string, unknown>;
    expect(readExportQuery(query, true).issues).toEqual([{ path: '__proto__', message: 'unknown field "__proto__"; allowed fields: format, table, heat, widthPx, pretty' }]);
    expect(({} as Record<string, unknown>).x).toBeUndefined();
  });
});

describe('optionIssues', () => {
  it('an option belongs to one format', () => {
    expect(optionIssues('csv', { table: 'gates' })).toEqual([]);
    expect(optionIssues('svg', { heat: true, widthPx: 300 })).toEqual([]);
    expect(optionIssues('json', { pretty: true })).toEqual([]);
    expect(optionIssues('glb', { table: 'gates', heat: false })).toEqual([
      { path: 'table', message: 'table is an option of the csv export; this answer is glb (add format=csv)' },
      { path: 'heat', message: 'heat is an option of the svg export; this answer is glb (add format=svg)' },
    ]);
  });
});

describe('entityTag', () => {
  it('the id for the default JSON; id, the options that change the bytes, and the extension for the rest', () => {
    expect(entityTag('ab', 'json', {})).toBe('"ab"');
    expect(entityTag('ab', 'json', { pretty: false })).toBe('"ab"');
    expect(entityTag('ab', 'json', { pretty: true })).toBe('"ab.pretty.json"');
    expect(entityTag('ab', 'glb', {})).toBe('"ab.glb"');
    expect(entityTag('ab', 'svg', {})).toBe('"ab.svg"');
    // the default width gives the default bytes, so the same tag
    expect(entityTag('ab', 'svg', { widthPx: 800, heat: false })).toBe('"ab.svg"');
    expect(entityTag('ab', 'svg', { widthPx: 600, heat: true })).toBe('"ab.heat.w600.svg"');
    expect(entityTag('ab', 'csv', { table: 'centerline' })).toBe('"ab.csv"');
    expect(entityTag('ab', 'csv', { table: 'gates' })).toBe('"ab.gates.csv"');
  });
});

describe('content headers', () => {
  it('text formats say their charset; browsers show JSON and SVG and save glb and CSV', () => {
    expect(TRACK_FORMATS.map(contentTypeOf)).toEqual(['application/json; charset=utf-8', 'image/svg+xml; charset=utf-8', 'model/gltf-binary', 'text/csv; charset=utf-8']);
    expect(contentDispositionOf('svg', 'track-ab.svg')).toBe('inline; filename="track-ab.svg"');
    expect(contentDispositionOf('glb', 'track-ab.glb')).toBe('attachment; filename="track-ab.glb"');
    expect(contentDispositionOf('csv', 'a"b\\c.csv')).toBe('attachment; filename="a_b_c.csv"');
  });
});
