// Tests for src/export/csv.ts: one row per centerline point or gate under a header, and every
// cell parses back to the track's number exactly.

import { describe, expect, it } from 'vitest';
import type { Track } from '../../src/core/index.js';
import { CSV_HEADERS, trackToCsv } from '../../src/export/csv.js';
import { exportTracks } from '../helpers/export-tracks.js';
import { cloneTrack, stadiumTrack } from '../helpers/synthetic-track.js';

/** Splits CSV text into rows of cells (the export quotes nothing: every cell is a number). */
function parseCsv(text: string): string[][] {
  expect(text.endsWith('\n')).toBe(true);
  expect(text).not.toContain('\r');
  return text
    .slice(0, -1)
    .split('\n')
    .map((line) => line.split(','));
}

describe.each([...exportTracks(), ['stadium', stadiumTrack()] as [string, Track]])('csv of the %s track', (_name, track) => {
  it('centerline: header, then one row per point whose cells are the track numbers exactly', () => {
    const rows = parseCsv(trackToCsv(track, { table: 'centerline' }));
    expect(rows).toHaveLength(track.centerline.points.length + 1);
    expect(rows[0]).toEqual(['s', 'x', 'y', 'heading_deg', 'curvature', 'half_width_left_m', 'half_width_right_m']);
    const c = track.centerline;
    const expected = c.points.map((p, i) => [c.s[i], p[0], p[1], c.headingDeg[i], c.curvature[i], c.halfWidthLeftM[i], c.halfWidthRightM[i]]);
    // Object.is: bit-for-bit (and -0 would not pass as 0)
    rows.slice(1).forEach((row, i) => row.forEach((cell, k) => expect(Object.is(Number(cell), expected[i][k]) || (cell === '0' && expected[i][k] === 0), `row ${i + 1} column ${k}`).toBe(true)));
  });

  it('gates: header, then one row per gate in order, exact', () => {
    const rows = parseCsv(trackToCsv(track, { table: 'gates' }));
    expect(rows).toHaveLength(track.gates.length + 1);
    expect(rows[0]).toEqual([...CSV_HEADERS.gates]);
    expect(rows.slice(1).map((row) => row.map(Number))).toEqual(track.gates.map((g) => [g.index, g.s, ...g.left, ...g.right, ...g.forward].map((v) => v + 0)));
  });

  it('every cell is a plain number, written as JSON writes it', () => {
    const text = trackToCsv(track);
    for (const cell of text.split(/[,\n]/).slice(7, -1)) expect(cell).toMatch(/^-?\d+(\.\d+)?(e[-+]\d+)?$/);
    expect(text).toBe(trackToCsv(track, { table: 'centerline' }));
  });
});

describe('csv export', () => {
  it('an unknown table is refused', () => {
    expect(() => trackToCsv(stadiumTrack(), { table: 'corners' as 'gates' })).toThrow(new RangeError('table must be one of centerline, gates, got "corners"'));
  });

  it('tiny and huge numbers keep their exponent form and parse back exactly', () => {
    const track = cloneTrack(stadiumTrack());
    track.centerline.curvature[0] = 1.5e-7;
    track.centerline.points[0] = [123456789012.25, -0.000001];
    const row = trackToCsv(track as Track).split('\n')[1];
    expect(row).toBe(`0,123456789012.25,-0.000001,${track.centerline.headingDeg[0]},1.5e-7,${track.centerline.halfWidthLeftM[0]},${track.centerline.halfWidthRightM[0]}`);
  });
});
