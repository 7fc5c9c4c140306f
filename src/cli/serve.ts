/**
 * `lapwright serve`: runs the HTTP service (src/server) until SIGTERM or SIGINT. Configuration
 * comes from the environment (PORT, HOST, LOG_LEVEL, LAPWRIGHT_*), and --port / --host override
 * the first two.
 */
import { parseArgs } from 'node:util';
import { ConfigError, readServerConfig } from '../server/config.js';
import { parseFlags } from './flags.js';
import { serveHelp } from './help.js';
import { type CliIo, InputError, writeText } from './io.js';

const OPTIONS = {
  port: { type: 'string' },
  host: { type: 'string' },
  help: { type: 'boolean', short: 'h' },
} as const;

/**
 * Runs `serve` with the arguments after the command name.
 * @returns 0 after a graceful shutdown, 1 when listening failed or the shutdown timed out
 * @throws InputError for a bad flag or environment variable (exit 2)
 */
export async function runServe(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseFlags(() => parseArgs({ args: [...args], options: OPTIONS, allowPositionals: true, strict: true }), 'serve');
  if (values.help) {
    await writeText(io.stdout, serveHelp());
    return 0;
  }
  if (positionals.length > 0) throw new InputError(`serve takes no arguments, got ${JSON.stringify(positionals[0])} (see lapwright serve --help)`);
  const env = { ...io.env };
  if (values.port !== undefined) env.PORT = values.port;
  if (values.host !== undefined) env.HOST = values.host;
  try {
    const config = readServerConfig(env);
    // fastify loads only for this command, not for every CLI run
    const { runServer } = await import('../server/server.js');
    return await runServer(config);
  } catch (err) {
    if (err instanceof ConfigError) throw new InputError(err.message.replaceAll('PORT must', '--port / PORT must').replaceAll('HOST must', '--host / HOST must'));
    throw err;
  }
}
