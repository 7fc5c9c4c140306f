/**
 * `lapwright generate`: flags → request body → schema → core → JSON on stdout or --out.
 */
import { randomInt } from 'node:crypto';
import { parseArgs } from 'node:util';
import { generateTrack, SEED_MAX } from '../core/index.js';
import type { TrackRequest } from '../core/index.js';
import { formatIssues } from '../schema/issues.js';
import { trackRequestSchema } from '../schema/params.js';
import { generateHelp } from './help.js';
import { type CliIo, InputError, readJson, writeOutput, writeText } from './io.js';
import { applySet, isPlainObject, parseSeedFlag } from './overrides.js';
import { parseFlags } from './flags.js';

const OPTIONS = {
  seed: { type: 'string' },
  params: { type: 'string' },
  set: { type: 'string', multiple: true },
  out: { type: 'string' },
  pretty: { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
} as const;

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

  const body = values.params === undefined ? {} : await readJson(values.params, io, '--params file');
  if (!isPlainObject(body)) throw invalidParams(body);
  for (const entry of values.set ?? []) applySet(body, entry);
  if (values.seed !== undefined) body.seed = parseSeedFlag(values.seed);

  const parsed = trackRequestSchema.safeParse(body);
  if (!parsed.success) throw new InputError('invalid parameters (ERR_INVALID_PARAMS)', formatIssues(parsed.error));
  // a seed left out is drawn here (the core reads no randomness) and echoed in the track
  const request: TrackRequest = { ...parsed.data, seed: parsed.data.seed ?? randomInt(0, SEED_MAX + 1) };

  const track = generateTrack(request);
  const text = (values.pretty ? JSON.stringify(track, null, 2) : JSON.stringify(track)) + '\n';
  if (values.out === undefined) await writeText(io.stdout, text);
  else await writeOutput(values.out, text, io);
  return 0;
}

// a --params file that is not a JSON object: let the schema word the (root) issue
function invalidParams(body: unknown): InputError {
  const parsed = trackRequestSchema.safeParse(body);
  return new InputError('invalid parameters (ERR_INVALID_PARAMS)', parsed.success ? [] : formatIssues(parsed.error));
}
