/**
 * The `lapwright` command line: argv → schema → core → stdout or a file. Runs in-process
 * (tests call `runCli` with captured streams); `bin/lapwright.js` is the only entry that
 * exits the process.
 *
 * Exit codes: 0 success, 1 unexpected error, 2 malformed input, 3 infeasible request,
 * 4 (validate) a well-formed track that breaks a guarantee, (verify) a track or file that does
 * not match its manifest. Messages go to stderr, data to
 * stdout, and no stack trace is ever printed.
 */
import { ERROR_CODES, GENERATOR_VERSION, isInfeasibleError } from '../core/index.js';
import type { InfeasibleError } from '../core/index.js';
import { runBatchCommand } from './batch.js';
import { runGenerate } from './generate.js';
import { mainHelp } from './help.js';
import { type CliIo, InputError, messageOf, writeText } from './io.js';
import { runServe } from './serve.js';
import { runValidate } from './validate.js';
import { runVerify } from './verify.js';
import { readPackageVersion } from '../version.js';

export type { CliIo, TextSink } from './io.js';
export { EXIT_TRACK_INVALID } from './validate.js';

/** Exit code of an unexpected error (a failed write, or a bug). */
export const EXIT_UNEXPECTED = 1;
/** Exit code of malformed input. */
export const EXIT_INPUT = ERROR_CODES.ERR_INVALID_PARAMS.exit;
/** Exit code of an infeasible request. */
export const EXIT_INFEASIBLE = ERROR_CODES.ERR_INFEASIBLE.exit;

/** Issues of the generator's last attempt printed under an infeasible answer, at most. */
const MAX_PRINTED_ISSUES = 20;

const COMMANDS: Record<string, (args: readonly string[], io: CliIo) => Promise<number>> = {
  generate: runGenerate,
  validate: runValidate,
  serve: runServe,
  batch: runBatchCommand,
  verify: runVerify,
};

/**
 * Runs one `lapwright` command line.
 * @param argv arguments after the program name, e.g. `['generate', '--seed', '7']`
 * @param io streams to use (process.stdout/stderr/stdin in the bin, captures in tests)
 * @returns the exit code; never throws
 * @example process.exit(await runCli(process.argv.slice(2), { stdout: process.stdout, stderr: process.stderr, stdin: process.stdin }))
 */
export async function runCli(argv: readonly string[], io: CliIo): Promise<number> {
  const [command, ...rest] = argv;
  const name = command !== undefined && Object.hasOwn(COMMANDS, command) ? `lapwright ${command}` : 'lapwright';
  try {
    return await dispatch(command, rest, io);
  } catch (err) {
    return report(err, name, io);
  }
}

async function dispatch(command: string | undefined, rest: readonly string[], io: CliIo): Promise<number> {
  if (command === undefined) {
    await writeText(io.stderr, mainHelp());
    return EXIT_INPUT;
  }
  if (command === '--help' || command === '-h' || (command === 'help' && rest.length === 0)) {
    await writeText(io.stdout, mainHelp());
    return 0;
  }
  if (command === 'help') return dispatch(rest[0], ['--help'], io);
  if (command === '--version') {
    await writeText(io.stdout, `lapwright ${await readPackageVersion()} (generatorVersion ${GENERATOR_VERSION})\n`);
    return 0;
  }
  if (Object.hasOwn(COMMANDS, command)) return COMMANDS[command](rest, io);
  if (command.startsWith('-')) throw new InputError(`unknown option ${command}; options go after the command (see lapwright --help)`);
  throw new InputError(`unknown command ${JSON.stringify(command)} (see lapwright --help)`);
}

// the one place errors become stderr lines and exit codes
async function report(err: unknown, name: string, io: CliIo): Promise<number> {
  let text: string;
  let code: number;
  if (err instanceof InputError) {
    text = [`${name}: ${err.message}`, ...err.issues.map((i) => `  ${i.path}: ${i.message}`)].join('\n');
    code = EXIT_INPUT;
  } else if (isInfeasibleError(err)) {
    text = infeasibleLines(err, name).join('\n');
    code = EXIT_INFEASIBLE;
  } else {
    text = `${name}: unexpected error: ${messageOf(err)}`;
    code = EXIT_UNEXPECTED;
  }
  try {
    await writeText(io.stderr, text + '\n');
  } catch {
    // stderr is gone: the exit code still tells
  }
  return code;
}

function infeasibleLines(err: InfeasibleError, name: string): string[] {
  const lines = [`${name}: infeasible request (ERR_INFEASIBLE, reason ${err.reason})`, err.message, `hint: ${err.hint}`];
  const issues = err.issues ?? [];
  if (issues.length > 0) {
    lines.push(`issues of the last attempt (${err.attempts} attempt${err.attempts === 1 ? '' : 's'} made):`);
    for (const issue of issues.slice(0, MAX_PRINTED_ISSUES)) lines.push(`  ${issue.code}: ${issue.message}`);
    if (issues.length > MAX_PRINTED_ISSUES) lines.push(`  ... and ${issues.length - MAX_PRINTED_ISSUES} more`);
  }
  return lines;
}
