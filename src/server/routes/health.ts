/**
 * GET /healthz (liveness: the process answers) and GET /readyz (readiness: the worker pool is
 * up and the server is not shutting down), for load balancers and Kubernetes probes.
 */
import type { FastifyPluginAsync } from 'fastify';
import { GENERATOR_VERSION } from '../../core/index.js';
import { unavailable } from '../errors.js';
import { healthSchema, readySchema } from '../schemas.js';
import { errorResponse, jsonResponse } from './responses.js';

/** Health and readiness routes. */
export const healthRoutes: FastifyPluginAsync = async (app) => {
  const state = app.lapwright;

  app.get(
    '/healthz',
    {
      schema: {
        tags: ['service'],
        summary: 'Liveness: the process is up',
        response: { 200: jsonResponse('The service answers; version and generatorVersion say what it runs.', healthSchema) },
      },
    },
    async () => ({ status: 'ok' as const, version: state.version, generatorVersion: GENERATOR_VERSION }),
  );

  app.get(
    '/readyz',
    {
      schema: {
        tags: ['service'],
        summary: 'Readiness: the worker pool is up and the server takes requests',
        response: {
          200: jsonResponse('Ready: every worker is loaded.', readySchema),
          503: errorResponse('ERR_NOT_READY while the workers load, ERR_SHUTTING_DOWN once SIGTERM arrived, ERR_UNAVAILABLE when no worker could start; with Retry-After.'),
        },
      },
    },
    async () => {
      const retry = state.options.retryAfterS;
      const pool = state.pool;
      if (pool === null) throw unavailable('ERR_NOT_READY', 'this server was started without generation workers', retry);
      const stats = pool.stats();
      if (pool.isReady) return { status: 'ready' as const, ...stats };
      if (pool.hasFailed) throw unavailable('ERR_UNAVAILABLE', 'no generation workers could be started; see the server log', retry);
      throw unavailable('ERR_NOT_READY', `the worker pool is starting (${stats.up} of ${stats.workers} workers loaded)`, retry);
    },
  );
};
