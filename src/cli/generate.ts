/**
 * `lapwright generate`: flags → request body → schema → core → export (JSON, glb, SVG or CSV)
 * on stdout or --out.
 */
import { randomInt } from 'node:crypto';
import { parseArgs } from 'node:util';
import { generateTrack, SEED_MAX } from '../core/index.js';
import type { TrackRequest } from '../core/index.js';
import { CSV_TABLES, EXPORT_FORMAT_NAMES, EXPORT_FORMATS, exportTrack, isExportFormat, SVG_WIDTH_LIMITS_PX } from '../export/index.js';
import type { CsvTable, ExportFormat, ExportOptions } from '../export/index.js';
import { formatIssues } from '../schema/issues.js';
import { trackRequestSchema } from '../schema/params.js';
import { generateHelp } from './help.js';
import { type CliIo, InputError, readJson, STDIO_NAME, writeOutput, writeText } from './io.js';
import { applySet, isPlainObject, parseSeedFlag } from './overrides.js';
import { parseFlags } from './flags.js';

const OPTIONS = {
  seed: { type: 'string' },
  params: { type: 'string' },
  set: { type: 'string', multiple: true },
  out: { type: 'string' },
  format: { type: 'string' },
  table: { type: 'string' },
  pretty: { type: 'boolean' },
  width: { type: 'string' },
  heat: { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
} as const;

// which format each format-specific flag belongs to
const FORMAT_FLAGS = { table: 'csv', pretty: 'json', width: 'svg', heat: 'svg' } as const satisfies Partial<Record<keyof typeof OPTIONS, ExportFormat>>;

/**
 * Runs `generate` with the arguments after the command name.
 * @returns exit code 0; failures are thrown (InputError → 2, InfeasibleError → 3)
 */
export async function runGenerate(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseFlags(() => parseArgs({ args: [...args], options: OPTIONS, allowPositionals: true, strict: true }), 'generate');
  if (values.help) {
    await writeText(io.stdout, generateHelp());
    return 0;
  }
  if (positionals.length > 0) throw new InputError(`generate takes no file arguments, got ${JSON.stringify(positionals[0])} (parameters go in --params FILE or --set KEY=VALUE)`);
  const format = parseFormat(values.format);
  const exportOptions = parseExportOptions(format, values);
  // binary bytes would garble a terminal: refuse before any work
  const toStdout = values.out === undefined || values.out === STDIO_NAME;
  if (EXPORT_FORMATS[format].binary && toStdout && io.stdout.isTTY === true) {
    throw new InputError(`refusing to write binary ${format} to a terminal: give --out FILE or redirect stdout (lapwright generate --format ${format} > track.${EXPORT_FORMATS[format].extension})`);
  }

  const body = values.params === undefined ? {} : await readJson(values.params, io, '--params file');
  if (!isPlainObject(body)) throw invalidParams(body);
  for (const entry of values.set ?? []) applySet(body, entry);
  if (values.seed !== undefined) body.seed = parseSeedFlag(values.seed);

  const parsed = trackRequestSchema.safeParse(body);
  if (!parsed.success) throw new InputError('invalid parameters (ERR_INVALID_PARAMS)', formatIssues(parsed.error));
  // a seed left out is drawn here (the core reads no randomness) and echoed in the track
  const request: TrackRequest = { ...parsed.data, seed: parsed.data.seed ?? randomInt(0, SEED_MAX + 1) };

  const track = generateTrack(request);
  const data = await exportTrack(track, format, exportOptions);
  if (values.out === undefined) await writeText(io.stdout, data);
  else await writeOutput(values.out, data, io);
  return 0;
}

function parseFormat(flag: string | undefined): ExportFormat {
  if (flag === undefined) return 'json';
  if (!isExportFormat(flag)) throw new InputError(`--format must be one of ${EXPORT_FORMAT_NAMES.join(', ')}, got ${JSON.stringify(flag)}`);
  return flag;
}

// the chosen format's options from its flags; a flag of another format is an input error
function parseExportOptions(format: ExportFormat, values: { table?: string; pretty?: boolean; width?: string; heat?: boolean }): ExportOptions {
  for (const [flag, owner] of Object.entries(FORMAT_FLAGS)) {
    if (values[flag as keyof typeof FORMAT_FLAGS] !== undefined && owner !== format) throw new InputError(`--${flag} applies to --format ${owner}, not ${format}`);
  }
  const options: { -readonly [K in keyof ExportOptions]: ExportOptions[K] } = {};
  if (values.pretty) options.pretty = true;
  if (values.heat) options.heat = true;
  if (values.table !== undefined) {
    if (!(CSV_TABLES as readonly string[]).includes(values.table)) throw new InputError(`--table must be one of ${CSV_TABLES.join(', ')}, got ${JSON.stringify(values.table)}`);
    options.table = values.table as CsvTable;
  }
  if (values.width !== undefined) {
    const width = /^\d+$/.test(values.width) ? Number(values.width) : Number.NaN;
    if (!(width >= SVG_WIDTH_LIMITS_PX.min && width <= SVG_WIDTH_LIMITS_PX.max)) throw new InputError(`--width must be a whole number of pixels from ${SVG_WIDTH_LIMITS_PX.min} to ${SVG_WIDTH_LIMITS_PX.max}, got ${JSON.stringify(values.width)}`);
    options.widthPx = width;
  }
  return options;
}

// a --params file that is not a JSON object: let the schema word the (root) issue
function invalidParams(body: unknown): InputError {
  const parsed = trackRequestSchema.safeParse(body);
  return new InputError('invalid parameters (ERR_INVALID_PARAMS)', parsed.success ? [] : formatIssues(parsed.error));
}
