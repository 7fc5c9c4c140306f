/**
 * `npm start`: the service's entry. Reads its configuration from the environment (PORT, HOST,
 * LOG_LEVEL, LAPWRIGHT_*; see src/server/config.ts), listens, and exits 0 after a graceful
 * shutdown on SIGTERM. Exit 2: bad configuration; 1: could not listen, or shutdown timed out.
 */
import { ConfigError, readServerConfig, type ServerConfig } from './config.js';
import { runServer } from './server.js';

let config: ServerConfig;
try {
  config = readServerConfig(process.env);
} catch (err) {
  if (!(err instanceof ConfigError)) throw err;
  process.stderr.write(`lapwright: ${err.message}\n`);
  process.exit(2);
}
process.exit(await runServer(config));
