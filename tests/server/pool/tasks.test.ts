import { describe, expect, it } from 'vitest';
import { generateTrack, generateTrackJson } from '../../../src/core/index.js';
import { exportTrack } from '../../../src/export/index.js';
import type { ExportFormat, ExportOptions } from '../../../src/export/index.js';
import { runTask } from '../../../src/server/pool/tasks.js';

const REQUEST = { seed: 'tasks', lengthM: 600 };

describe('runTask (generate)', () => {
  it('without an export: the JSON bytes the core made, as bytes that own their buffer', async () => {
    const { output, transfer } = await runTask({ kind: 'generate', request: REQUEST });
    if (!output.ok || output.kind !== 'generate') throw new Error(JSON.stringify(output));
    const made = generateTrackJson(REQUEST);
    expect([output.format, output.mediaType, output.id, output.seed]).toEqual(['json', 'application/json', made.track.id, 'tasks']);
    expect(Buffer.from(output.bytes).equals(Buffer.from(made.bytes))).toBe(true);
    expect(transfer).toEqual([output.bytes.buffer]);
    expect(output.bytes.byteLength).toBe(output.bytes.buffer.byteLength);
  });

  it('with an export: the exporter\'s bytes, media type and file name', async () => {
    const track = generateTrack(REQUEST);
    const cases: [ExportFormat, ExportOptions, string, string][] = [
      ['glb', {}, 'model/gltf-binary', `track-${track.id.slice(0, 8)}.glb`],
      ['svg', { heat: true, widthPx: 400 }, 'image/svg+xml', `track-${track.id.slice(0, 8)}.svg`],
      ['csv', { table: 'gates' }, 'text/csv', `track-${track.id.slice(0, 8)}-gates.csv`],
      ['json', { pretty: true }, 'application/json', `track-${track.id.slice(0, 8)}.json`],
    ];
    for (const [format, options, mediaType, fileName] of cases) {
      const { output, transfer } = await runTask({ kind: 'generate', request: REQUEST, export: { format, options } });
      if (!output.ok || output.kind !== 'generate') throw new Error(JSON.stringify(output));
      expect([output.format, output.mediaType, output.fileName]).toEqual([format, mediaType, fileName]);
      const expected = await exportTrack(track, format, options);
      expect(Buffer.from(output.bytes).equals(Buffer.from(expected))).toBe(true);
      expect(transfer).toEqual([output.bytes.buffer]);
      expect(output.bytes.byteOffset === 0 && output.bytes.byteLength === output.bytes.buffer.byteLength).toBe(true);
    }
  });

  it('an infeasible request is plain data, whatever the format', async () => {
    const { output, transfer } = await runTask({ kind: 'generate', request: { seed: 1, turnBalance: 0, curvatureBudgetDeg: 900 }, export: { format: 'glb', options: {} } });
    expect(output).toMatchObject({ ok: false, error: { kind: 'infeasible', reason: 'turning_vs_balance' } });
    expect(transfer).toEqual([]);
  });

  it('an exporter that throws is an internal error, not a rejection', async () => {
    const { output } = await runTask({ kind: 'generate', request: REQUEST, export: { format: 'svg', options: { widthPx: 1 } } });
    expect(output).toMatchObject({ ok: false, error: { kind: 'internal', message: 'RangeError: widthPx must be a number from 200 to 4000, got 1' } });
  });
});
