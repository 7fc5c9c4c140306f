/**
 * The query parameters that choose how a track is answered: `format` and the options of each
 * export (`table` for csv, `heat` and `widthPx` for svg, `pretty` for json). Both track routes
 * read them with the same schema, so the messages match; an option of another format than the
 * one answered is a 400, as the CLI refuses `--table` with `--format svg`.
 */
import { z } from 'zod';
import { CSV_TABLES, EXPORT_FORMATS, SVG_DEFAULT_WIDTH_PX, SVG_WIDTH_LIMITS_PX } from '../export/index.js';
import type { CsvTable, ExportFormat, ExportOptions } from '../export/index.js';
import { readNumberText } from '../schema/dotted.js';
import { formatIssues, type FieldIssue } from '../schema/issues.js';
import { expectedError, objectError, rangeError } from '../schema/messages.js';

/** Formats a track can be answered in, in the order Accept negotiation prefers them on a tie. */
export const TRACK_FORMATS = ['json', 'svg', 'glb', 'csv'] as const satisfies readonly ExportFormat[];
export type TrackFormat = (typeof TRACK_FORMATS)[number];

/** Which format each export option belongs to. */
export const OPTION_FORMATS = { table: 'csv', heat: 'svg', widthPx: 'svg', pretty: 'json' } as const satisfies Record<string, TrackFormat>;
type OptionName = keyof typeof OPTION_FORMATS;

/** Every query key that is about the answer, not the track. */
export const EXPORT_QUERY_KEYS = ['format', ...(Object.keys(OPTION_FORMATS) as OptionName[])] as const;

const BOOLEAN = 'true or false';

/** `format` query parameter. */
export const formatSchema = z.enum(TRACK_FORMATS, { error: expectedError(`one of ${TRACK_FORMATS.join(', ')}`) }).meta({
  description: `Format of the answer: json (the default, ${EXPORT_FORMATS.json.mediaType}), svg (${EXPORT_FORMATS.svg.mediaType}), glb (${EXPORT_FORMATS.glb.mediaType}) or csv (${EXPORT_FORMATS.csv.mediaType}). Takes precedence over the Accept header.`,
});

/** The export query parameters, each with its meaning, range and default (documentation and parsing). */
export const exportQueryShape = {
  format: formatSchema.optional(),
  table: z
    .enum(CSV_TABLES, { error: expectedError(`one of ${CSV_TABLES.join(', ')}`) })
    .optional()
    .meta({ description: `csv only: which table, one row per centerline point or one row per gate. Default: ${CSV_TABLES[0]}.` }),
  heat: z
    .boolean({ error: expectedError(BOOLEAN) })
    .optional()
    .meta({ description: 'svg only: colour the road by |curvature|, pale on straights to dark at the tightest allowed radius. Default: false.' }),
  widthPx: z
    .int({ error: rangeError(SVG_WIDTH_LIMITS_PX, 'px', true) })
    .min(SVG_WIDTH_LIMITS_PX.min, { error: rangeError(SVG_WIDTH_LIMITS_PX, 'px', true) })
    .max(SVG_WIDTH_LIMITS_PX.max, { error: rangeError(SVG_WIDTH_LIMITS_PX, 'px', true) })
    .optional()
    .meta({ description: `svg only: width of the drawing in pixels; the height follows the track. Allowed: ${SVG_WIDTH_LIMITS_PX.min} to ${SVG_WIDTH_LIMITS_PX.max}. Default: ${SVG_DEFAULT_WIDTH_PX}.` }),
  pretty: z
    .boolean({ error: expectedError(BOOLEAN) })
    .optional()
    .meta({ description: 'json only: indent the JSON by two spaces. Default: false (the generator\'s own bytes, one line).' }),
} as const;

const strictQuerySchema = z.strictObject(exportQueryShape, { error: objectError('a query string', [...EXPORT_QUERY_KEYS]) });
const looseQuerySchema = z.object(exportQueryShape);

/** What the query asks of the answer: the format, if named, and the export's options. */
export interface ExportQuery {
  readonly format?: TrackFormat;
  readonly options: ExportOptions;
}

/**
 * Reads the export parameters of a query string (text as fastify parses it: a string per key,
 * an array for a repeated key).
 * @param strict refuse every other key by name (POST /v1/tracks, whose parameters go in the
 *   body); otherwise other keys are left to the caller (GET /v1/tracks/{seed})
 * @example readExportQuery({ format: 'svg', heat: 'true' }, true).query // { format: 'svg', options: { heat: true } }
 */
export function readExportQuery(query: Readonly<Record<string, unknown>>, strict: boolean): { query: ExportQuery; issues: FieldIssue[] } {
  const input: Record<string, unknown> = {};
  for (const [key, raw] of Object.entries(query)) {
    if (!strict && !(EXPORT_QUERY_KEYS as readonly string[]).includes(key)) continue;
    Object.defineProperty(input, key, { value: readText(key, raw), enumerable: true, writable: true, configurable: true });
  }
  const parsed = (strict ? strictQuerySchema : looseQuerySchema).safeParse(input);
  if (!parsed.success) return { query: { options: {} }, issues: formatIssues(parsed.error) };
  const { format, ...rest } = parsed.data;
  const options: { -readonly [K in keyof ExportOptions]: ExportOptions[K] } = {};
  if (rest.table !== undefined) options.table = rest.table as CsvTable;
  if (rest.heat !== undefined) options.heat = rest.heat;
  if (rest.widthPx !== undefined) options.widthPx = rest.widthPx;
  if (rest.pretty !== undefined) options.pretty = rest.pretty;
  return { query: format === undefined ? { options } : { format, options }, issues: [] };
}

/**
 * The options given for another format than the one answered, one issue each.
 * @example optionIssues('svg', { table: 'gates' }) // [{ path: 'table', message: 'table is an option of the csv export; this answer is svg' }]
 */
export function optionIssues(format: TrackFormat, options: ExportOptions): FieldIssue[] {
  const issues: FieldIssue[] = [];
  for (const [name, owner] of Object.entries(OPTION_FORMATS) as [OptionName, TrackFormat][]) {
    if (options[name] !== undefined && owner !== format) issues.push({ path: name, message: `${name} is an option of the ${owner} export; this answer is ${format} (add format=${owner})` });
  }
  return issues;
}

/**
 * The entity tag of one representation of a track: the track's id for the default JSON, and the
 * id with the options that change the bytes and the format's extension for the rest
 * (`"<id>.glb"`, `"<id>.heat.svg"`, `"<id>.gates.csv"`), so caches never mix formats and
 * If-None-Match works per format.
 * @example entityTag('ab12', 'svg', { heat: true, widthPx: 600 }) // '"ab12.heat.w600.svg"'
 */
export function entityTag(id: string, format: TrackFormat, options: ExportOptions): string {
  const parts = [id];
  if (format === 'json' && options.pretty === true) parts.push('pretty');
  if (format === 'svg' && options.heat === true) parts.push('heat');
  if (format === 'svg' && options.widthPx !== undefined && options.widthPx !== SVG_DEFAULT_WIDTH_PX) parts.push(`w${options.widthPx}`);
  if (format === 'csv' && options.table !== undefined && options.table !== CSV_TABLES[0]) parts.push(options.table);
  if (format !== 'json') parts.push(EXPORT_FORMATS[format].extension);
  else if (parts.length > 1) parts.push(EXPORT_FORMATS.json.extension);
  return `"${parts.join('.')}"`;
}

/** The Content-Type of a format's answer: text formats say their charset. */
export function contentTypeOf(format: TrackFormat): string {
  const info = EXPORT_FORMATS[format];
  return info.binary ? info.mediaType : `${info.mediaType}; charset=utf-8`;
}

/**
 * The Content-Disposition of a format's answer: a browser shows JSON and SVG, and saves glb and
 * CSV; either way under the file name.
 */
export function contentDispositionOf(format: TrackFormat, fileName: string): string {
  const how = format === 'json' || format === 'svg' ? 'inline' : 'attachment';
  return `${how}; filename="${fileName.replace(/["\\]/g, '_')}"`;
}

// booleans and numbers arrive as text
function readText(key: string, raw: unknown): unknown {
  if (Array.isArray(raw)) return raw.map((r) => readText(key, r));
  if (typeof raw !== 'string') return raw;
  if (key === 'heat' || key === 'pretty') return raw === 'true' ? true : raw === 'false' ? false : raw;
  if (key === 'widthPx') return readNumberText(raw);
  return raw;
}
