/**
 * The CLI's streams and files: reading a file or stdin, parsing JSON, writing text and waiting
 * until it is flushed (so `process.exit` right after never cuts a large track short).
 */
import { readFile, writeFile } from 'node:fs/promises';
import type { FieldIssue } from '../schema/issues.js';

/** Where text (or a binary export's bytes) goes: `process.stdout`, `process.stderr` or a test's capture. */
export interface TextSink {
  write(chunk: string | Uint8Array, callback: (error?: Error | null) => void): boolean;
  /** true when the sink is a terminal (process.stdout.isTTY); binary data is never written to one */
  readonly isTTY?: boolean;
  on?(event: 'error', listener: (error: Error) => void): unknown;
  off?(event: 'error', listener: (error: Error) => void): unknown;
}

/** Streams and environment of one CLI run. */
export interface CliIo {
  readonly stdout: TextSink;
  readonly stderr: TextSink;
  /** Read only for `-` in place of a file name. */
  readonly stdin: AsyncIterable<string | Uint8Array>;
  /** Reserved for `serve` (PORT, HOST); the other commands read no environment. */
  readonly env?: Readonly<Record<string, string | undefined>>;
}

/** Malformed input (bad flag, unreadable file, invalid JSON, schema failure): exit 2. */
export class InputError extends Error {
  /** One line per offending field, printed under the message. */
  readonly issues: readonly FieldIssue[];

  constructor(message: string, issues: readonly FieldIssue[] = []) {
    super(message);
    this.name = 'InputError';
    this.issues = issues;
  }
}

/** Name that stands for stdin (or stdout for `--out`) in place of a file. */
export const STDIO_NAME = '-';

/**
 * Reads a file (or stdin for `-`) and parses it as JSON.
 * @param what how the message names the source, e.g. `--params file`
 * @throws InputError when the source cannot be read or is not JSON
 */
export async function readJson(name: string, io: CliIo, what: string): Promise<unknown> {
  let text: string;
  try {
    text = name === STDIO_NAME ? await readAll(io.stdin) : await readFile(name, 'utf8');
  } catch (err) {
    throw new InputError(`cannot read ${what} ${quoteName(name)}: ${messageOf(err)}`);
  }
  try {
    // a byte order mark is not JSON, but editors write one
    return JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (err) {
    throw new InputError(`${what} ${quoteName(name)} is not valid JSON: ${messageOf(err)}`);
  }
}

/**
 * Writes text (UTF-8) or bytes to a file, or to stdout for `-`.
 * @throws InputError when the file cannot be written
 */
export async function writeOutput(name: string, data: string | Uint8Array, io: CliIo): Promise<void> {
  if (name === STDIO_NAME) return writeText(io.stdout, data);
  try {
    await (typeof data === 'string' ? writeFile(name, data, 'utf8') : writeFile(name, data));
  } catch (err) {
    throw new InputError(`cannot write --out file ${quoteName(name)}: ${messageOf(err)}`);
  }
}

/**
 * Writes text (or bytes) and resolves once the sink has taken it. A reader that went away
 * (EPIPE, as in `lapwright generate | head -c 100`) is not an error: there is no one left to tell.
 */
export function writeText(sink: TextSink, text: string | Uint8Array): Promise<void> {
  return new Promise((resolve, reject) => {
    const settle = (err?: Error | null): void => {
      if (err && (err as NodeJS.ErrnoException).code !== 'EPIPE') reject(err);
      else resolve();
    };
    // the stream may also emit 'error' (on the next tick), which would otherwise be uncaught
    const onError = (err: Error): void => settle(err);
    sink.on?.('error', onError);
    sink.write(text, (err) => {
      settle(err);
      setImmediate(() => sink.off?.('error', onError));
    });
  });
}

/** The message of anything thrown, without a stack. */
export function messageOf(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

async function readAll(stream: AsyncIterable<string | Uint8Array>): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : Buffer.from(chunk));
  return Buffer.concat(chunks).toString('utf8');
}

function quoteName(name: string): string {
  return name === STDIO_NAME ? '(stdin)' : name;
}
