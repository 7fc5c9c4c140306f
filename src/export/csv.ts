/**
 * A track as CSV tables for notebooks and spreadsheets: the centerline (one row per point) or
 * the gates (one row per gate). A header row, comma separated, `\n` line ends, and every number
 * exactly as the JSON track ships it (JavaScript's shortest round-trip form), so parsing a cell
 * gives back the track's number bit for bit.
 *
 * Axes as in the track: x right, y up, metres; headings in degrees counter-clockwise from +x;
 * curvature in 1/m, positive turning left.
 */
import type { Track } from '../core/index.js';

/** The tables a track exports to. */
export const CSV_TABLES = ['centerline', 'gates'] as const;
export type CsvTable = (typeof CSV_TABLES)[number];

/** Options of the CSV export. */
export interface CsvOptions {
  /** Which table: 'centerline' (default) or 'gates'. */
  readonly table?: CsvTable;
}

/** Header row of each table. */
export const CSV_HEADERS: Readonly<Record<CsvTable, readonly string[]>> = {
  centerline: ['s', 'x', 'y', 'heading_deg', 'curvature', 'half_width_left_m', 'half_width_right_m'],
  gates: ['index', 's', 'left_x', 'left_y', 'right_x', 'right_y', 'forward_x', 'forward_y'],
};

/**
 * Writes one table of a track as CSV. Pure: reads only the track.
 * @returns the CSV text (media type text/csv), header row first, each row ended by `\n`
 * @throws RangeError for an unknown table
 * @example trackToCsv(generateTrack({ seed: 1 }), { table: 'gates' }).split('\n')[0] // 'index,s,left_x,left_y,right_x,right_y,forward_x,forward_y'
 */
export function trackToCsv(track: Track, options: CsvOptions = {}): string {
  const table = options.table ?? 'centerline';
  const rows: (readonly number[])[] = [];
  if (table === 'centerline') {
    const c = track.centerline;
    for (let i = 0; i < c.points.length; i++) rows.push([c.s[i], c.points[i][0], c.points[i][1], c.headingDeg[i], c.curvature[i], c.halfWidthLeftM[i], c.halfWidthRightM[i]]);
  } else if (table === 'gates') {
    for (const g of track.gates) rows.push([g.index, g.s, g.left[0], g.left[1], g.right[0], g.right[1], g.forward[0], g.forward[1]]);
  } else {
    throw new RangeError(`table must be one of ${CSV_TABLES.join(', ')}, got ${JSON.stringify(table)}`);
  }
  const lines = [CSV_HEADERS[table].join(','), ...rows.map((row) => row.map(cell).join(','))];
  return lines.join('\n') + '\n';
}

// the number as JSON writes it (shortest round trip, -0 as 0); a value JSON cannot hold stays empty
function cell(x: number): string {
  return Number.isFinite(x) ? JSON.stringify(x) : '';
}
