/**
 * `lapwright validate`: a track file (or stdin) → shape check → checker → {valid, issues}.
 */
import { parseArgs } from 'node:util';
import { validateTrack } from '../core/index.js';
import { formatIssues } from '../schema/issues.js';
import { trackSchema } from '../schema/track.js';
import { parseFlags } from './flags.js';
import { validateHelp } from './help.js';
import { type CliIo, InputError, readJson, writeText } from './io.js';

/** Exit code of `validate` when the track is well-formed but breaks a guarantee. */
export const EXIT_TRACK_INVALID = 4;

const OPTIONS = {
  pretty: { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
} as const;

/**
 * Runs `validate` with the arguments after the command name.
 * @returns 0 when the track is valid, 4 when it breaks a guarantee; malformed input is thrown
 *   as InputError (exit 2)
 */
export async function runValidate(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseFlags(() => parseArgs({ args: [...args], options: OPTIONS, allowPositionals: true, strict: true }), 'validate');
  if (values.help) {
    await writeText(io.stdout, validateHelp());
    return 0;
  }
  if (positionals.length !== 1) throw new InputError(`validate takes one track file (or - for stdin), got ${positionals.length} (see lapwright validate --help)`);

  const data = await readJson(positionals[0], io, 'track file');
  const parsed = trackSchema.safeParse(data);
  if (!parsed.success) throw new InputError('malformed track (ERR_INVALID_TRACK)', formatIssues(parsed.error));

  const result = validateTrack(parsed.data);
  const out = { valid: result.valid, issues: result.issues };
  await writeText(io.stdout, (values.pretty ? JSON.stringify(out, null, 2) : JSON.stringify(out)) + '\n');
  return result.valid ? 0 : EXIT_TRACK_INVALID;
}
