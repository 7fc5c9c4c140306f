/**
 * Shared pieces of the server tests: an app with its worker pool up, and the fixture worker.
 */
import type { FastifyInstance } from 'fastify';
import { buildApp, type AppOptions } from '../../src/server/app.js';

/** The fixture worker (tests/server/fixtures/test-worker.ts): real tasks, plus block: and crash seeds. */
export const TEST_WORKER_URL = new URL('./fixtures/test-worker.ts', import.meta.url);

/**
 * An app with one worker (unless told otherwise) whose pool is up, so no test races the
 * workers' loading.
 */
export async function readyApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const app = await buildApp({ workers: 1, ...options });
  await app.lapwright.pool?.ready;
  return app;
}

/** The JSON body of an inject response. */
export function json(res: { body: string }): unknown {
  return JSON.parse(res.body);
}
