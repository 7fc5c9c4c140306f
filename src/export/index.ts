/**
 * Every export of a track, by format name: what the HTTP service (`?format=` / Accept) and the
 * CLI (`generate --format`) both call. Each exporter is a pure function of the track.
 */
import type { Track } from '../core/index.js';
import { type CsvOptions, trackToCsv } from './csv.js';
import { type GlbOptions, trackToGlb } from './gltf.js';
import { type JsonOptions, trackToJson } from './json.js';
import { type SvgOptions, trackToSvg } from './svg.js';

export { CSV_HEADERS, CSV_TABLES, trackToCsv } from './csv.js';
export type { CsvOptions, CsvTable } from './csv.js';
export { GATE_DEPTH_M, gateNodeName, headingQuaternion, spawnNodeName, toGltfPosition, trackToGlb } from './gltf.js';
export type { GlbOptions } from './gltf.js';
export { trackToJson } from './json.js';
export type { JsonOptions } from './json.js';
export { renderTrackJsonSchema, TRACK_SCHEMA_FILE, trackJsonSchema } from './json-schema.js';
export { scaleBarLengthM, SVG_DEFAULT_WIDTH_PX, SVG_WIDTH_LIMITS_PX, trackToSvg } from './svg.js';
export type { SvgOptions } from './svg.js';

/** What a format is: its media type, file extension and whether its bytes are binary. */
export interface ExportFormatInfo {
  readonly mediaType: string;
  readonly extension: string;
  readonly binary: boolean;
}

/** The export formats, in the order a client is offered them. */
export const EXPORT_FORMATS = {
  json: { mediaType: 'application/json', extension: 'json', binary: false },
  glb: { mediaType: 'model/gltf-binary', extension: 'glb', binary: true },
  svg: { mediaType: 'image/svg+xml', extension: 'svg', binary: false },
  csv: { mediaType: 'text/csv', extension: 'csv', binary: false },
} as const satisfies Record<string, ExportFormatInfo>;

export type ExportFormat = keyof typeof EXPORT_FORMATS;

/** The format names, in order: json, glb, svg, csv. */
export const EXPORT_FORMAT_NAMES = Object.keys(EXPORT_FORMATS) as readonly ExportFormat[];

/** Options of every format in one object; each exporter reads only its own. */
export type ExportOptions = JsonOptions & CsvOptions & SvgOptions & GlbOptions;

/**
 * Whether a string names an export format.
 * @example isExportFormat('glb') // true
 */
export function isExportFormat(name: string): name is ExportFormat {
  return Object.hasOwn(EXPORT_FORMATS, name);
}

/**
 * Exports a track in a format: text for json, svg and csv (UTF-8, ending in a newline), bytes
 * for glb.
 * @param options the chosen format's options (pretty; table; widthPx, heat, show…; gateDepthM)
 * @throws RangeError for an unknown format or an option out of range
 * @example await exportTrack(track, 'csv', { table: 'gates' })
 */
export async function exportTrack(track: Track, format: ExportFormat, options: ExportOptions = {}): Promise<string | Uint8Array> {
  switch (format) {
    case 'json':
      return trackToJson(track, options);
    case 'glb':
      return trackToGlb(track, options);
    case 'svg':
      return trackToSvg(track, options);
    case 'csv':
      return trackToCsv(track, options);
    default:
      throw new RangeError(`format must be one of ${EXPORT_FORMAT_NAMES.join(', ')}, got ${JSON.stringify(format)}`);
  }
}

/**
 * A file name for a track's export: `track-<first 8 of the id>.<extension>`, with the CSV table
 * before the extension (`track-d68eba0e-gates.csv`).
 */
export function exportFileName(track: Track, format: ExportFormat, options: CsvOptions = {}): string {
  const stem = `track-${track.id.slice(0, 8).replace(/[^0-9A-Za-z_-]/g, '_')}`;
  const table = format === 'csv' ? `-${options.table ?? 'centerline'}` : '';
  return `${stem}${table}.${EXPORT_FORMATS[format].extension}`;
}
