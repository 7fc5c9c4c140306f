/**
 * Runs the service until a signal: listen, then on SIGTERM (or SIGINT) stop taking requests,
 * let the in-flight ones finish, stop the worker pool, and report the exit code. Used by
 * src/server/main.ts and `lapwright serve`.
 */
import type { FastifyInstance } from 'fastify';
import { buildApp } from './app.js';
import type { ServerConfig } from './config.js';

/** Signals that start a graceful shutdown. */
export const SHUTDOWN_SIGNALS = ['SIGTERM', 'SIGINT'] as const;

/** A listening server. */
export interface StartedServer {
  readonly app: FastifyInstance;
  /** First address it listens on, e.g. http://127.0.0.1:8080. */
  readonly url: string;
}

/**
 * Builds the app and listens on config.host:config.port.
 * @throws when the port cannot be bound (the app is closed first)
 */
export async function startServer(config: ServerConfig): Promise<StartedServer> {
  const app = await buildApp({ ...config.app, logger: { level: config.logLevel } });
  try {
    const url = await app.listen({ port: config.port, host: config.host });
    return { app, url };
  } catch (err) {
    await app.close();
    throw err;
  }
}

/**
 * Listens until SIGTERM or SIGINT, then shuts down gracefully.
 * @returns 0 after a clean shutdown; 1 when in-flight work did not finish within
 *   config.shutdownTimeoutMs, or the server could not start
 */
export async function runServer(config: ServerConfig): Promise<number> {
  let started: StartedServer;
  try {
    started = await startServer(config);
  } catch (err) {
    process.stderr.write(`lapwright serve: cannot listen on ${config.host}:${config.port}: ${err instanceof Error ? err.message : String(err)}\n`);
    return 1;
  }
  const { app } = started;
  const signal = await new Promise<NodeJS.Signals>((resolve) => {
    for (const name of SHUTDOWN_SIGNALS) process.once(name, () => resolve(name));
  });
  // a second signal while draining is answered by the timeout, not by dying mid-answer
  for (const name of SHUTDOWN_SIGNALS) process.on(name, () => app.log.warn({ signal: name }, 'already shutting down'));
  app.log.info({ signal, shutdownTimeoutMs: config.shutdownTimeoutMs }, 'shutting down: finishing in-flight requests');
  let timer: NodeJS.Timeout | undefined;
  const timedOut = new Promise<number>((resolve) => {
    timer = setTimeout(() => {
      app.log.error({ shutdownTimeoutMs: config.shutdownTimeoutMs }, 'in-flight requests did not finish in time; exiting');
      resolve(1);
    }, config.shutdownTimeoutMs);
  });
  const code = await Promise.race([app.close().then(() => 0), timedOut]);
  clearTimeout(timer);
  if (code === 0) app.log.info('shut down cleanly');
  return code;
}
