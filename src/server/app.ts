/**
 * The HTTP service as a fastify plugin, and buildApp() that makes an instance of it without
 * listening (tests use `inject`; src/server/main.ts listens). The zod schemas of src/schema and
 * ./schemas.ts check every input and generate the OpenAPI document (GET /openapi.json, GET /docs).
 */
import fastifySwagger from '@fastify/swagger';
import fastifySwaggerUi from '@fastify/swagger-ui';
import Fastify, { type FastifyInstance, type FastifyPluginAsync } from 'fastify';
import fp from 'fastify-plugin';
import { createJsonSchemaTransform, jsonSchemaTransformObject } from 'fastify-type-provider-zod';
import sjson from 'secure-json-parse';
import { readPackageVersion } from '../version.js';
import { type AppOptions, type ResolvedAppOptions, resolveAppOptions } from './config.js';
import { handleError, handleNotFound } from './error-handler.js';
import { HttpError, unavailable } from './errors.js';
import { jsonDepthExceeds, MAX_JSON_DEPTH } from './json-depth.js';
import { TrackPool } from './pool/track-pool.js';
import { TrackCache } from './track-cache.js';
import { batchRoutes, DATASETS_TAG } from './routes/batches.js';
import { curriculumRoutes } from './routes/curricula.js';
import { distanceRoutes } from './routes/distance.js';
import { healthRoutes } from './routes/health.js';
import { paramsRoutes } from './routes/params.js';
import { presetRoutes } from './routes/presets.js';
import { schemaRoutes } from './routes/schema.js';
import { splitRoutes } from './routes/splits.js';
import { trackRoutes } from './routes/tracks.js';
import { validateRoutes } from './routes/validate.js';
import { webRoutes } from './routes/web.js';
import { DOCS_CSP, installSecurity, notFoundOptions, securityHeaders, securityScheme } from './security.js';
import { zodValidator } from './validation.js';

export type { AppOptions } from './config.js';

/** Where the interactive documentation lives. */
export const DOCS_PREFIX = '/docs';

/** What the routes share: options, version, the worker pool and the shutdown flag. */
export interface ServiceState {
  readonly options: ResolvedAppOptions;
  readonly version: string;
  /** null when the app runs without workers (documentation only). */
  readonly pool: TrackPool | null;
  /** Set when close() begins: new requests get 503 ERR_SHUTTING_DOWN. */
  shuttingDown: boolean;
  /** Answers of the track routes kept for repeats (LAPWRIGHT_CACHE_BYTES). */
  readonly cache: TrackCache;
}

declare module 'fastify' {
  interface FastifyInstance {
    lapwright: ServiceState;
  }
}

/**
 * Makes the service: a fastify instance with every route, not listening. Its worker pool starts
 * loading at once; `app.lapwright.pool.ready` resolves when it is up (GET /readyz says so too).
 * Close it with `app.close()`: in-flight requests finish, then the pool stops.
 * @example
 * const app = await buildApp({ workers: 1 });
 * const res = await app.inject({ method: 'GET', url: '/healthz' });
 * await app.close();
 */
export async function buildApp(options: AppOptions = {}): Promise<FastifyInstance> {
  const resolved = resolveAppOptions(options);
  const headers = securityHeaders(resolved);
  const app = Fastify({
    logger: resolved.logger,
    bodyLimit: resolved.bodyLimitBytes,
    // request.ip (the rate limit's key, the logs): the socket's address, or with N trusted
    // proxies in front, the address N hops back in X-Forwarded-For
    trustProxy: resolved.trustProxyHops > 0 ? (_address: string, hop: number) => hop < resolved.trustProxyHops : false,
    // our own onRequest hook answers 503 with our body and Retry-After while closing
    return503OnClosing: false,
    // seeds are path segments of up to 64 characters, URL-encoded
    routerOptions: { maxParamLength: 1024 },
    // errors the router raises before any route (a URL that does not decode) get our body and headers too
    frameworkErrors: (err, request, reply) => {
      headers(request, reply);
      return handleError(err, request, reply);
    },
  });
  await app.register(fp(lapwrightService, { name: 'lapwright', fastify: '5.x' }), resolved);
  return app;
}

/**
 * The service plugin: parsers, validation, errors, lifecycle hooks, OpenAPI, routes.
 */
export const lapwrightService: FastifyPluginAsync<ResolvedAppOptions> = async (app, options) => {
  const pool = options.startPool ? new TrackPool({ workers: options.workers, maxQueue: options.maxQueue, workerUrl: options.workerUrl, workerData: options.workerData }) : null;
  const state: ServiceState = { options, version: await readPackageVersion(), pool, shuttingDown: false, cache: new TrackCache(options.cacheBytes) };
  app.decorate('lapwright', state);
  if (pool !== null) {
    pool.ready.then(
      () => app.log.info({ workers: options.workers }, 'worker pool is up'),
      (err: Error) => app.log.error({ err }, 'worker pool failed to start'),
    );
  }

  // headers, CORS, token and rate limit come first: the last two attach to routes as they are added
  await installSecurity(app, options);
  installParsers(app);
  app.setValidatorCompiler(zodValidator('ERR_INVALID_PARAMS'));
  // answers are plain JSON; their zod schemas document them (and the tests check them)
  app.setSerializerCompiler(() => (data) => JSON.stringify(data));
  app.setErrorHandler(handleError);
  app.setNotFoundHandler(notFoundOptions(app, options), handleNotFound);
  installLifecycle(app, state);

  await app.register(fastifySwagger, {
    openapi: {
      openapi: '3.1.0',
      info: {
        title: 'lapwright',
        version: state.version,
        description: `Closed racing tracks for training driving agents in simulation: seeded, validated, reproducible (same seed, parameters and generatorVersion, same bytes). Errors answer { statusCode, code, error, message }, plus issues for 400 and 422, reason and hint for 422, and a Retry-After header on 503. Tracks come as JSON (JSON Schema at GET /v1/schema/track) or exported as glb, svg or csv. A preview page for people, outside this document, is at GET /. Generated layouts are for simulation and games only.`,
      },
      servers: [{ url: '/', description: 'the server this document came from (relative, so /docs can try requests wherever the service runs)' }],
      tags: [
        { name: 'tracks', description: 'Generate and check tracks' },
        { name: 'service', description: 'Health, readiness and documentation' },
        DATASETS_TAG,
      ],
    },
    transform: createJsonSchemaTransform({ skipList: [] }),
    transformObject: (document) => securityScheme(pruneComponents(jsonSchemaTransformObject(document))),
  });

  await app.register(healthRoutes);
  await app.register(trackRoutes);
  await app.register(validateRoutes);
  await app.register(presetRoutes);
  await app.register(paramsRoutes);
  await app.register(schemaRoutes);
  // training-farm workflows: batches, held-out splits, novelty, curricula
  await app.register(batchRoutes);
  await app.register(splitRoutes);
  await app.register(distanceRoutes);
  await app.register(curriculumRoutes);

  app.get('/openapi.json', { schema: { hide: true } }, async (_request, reply) => reply.type('application/json; charset=utf-8').send(app.swagger()));
  // the UI and its assets ship inside the package: /docs works with no network
  await app.register(fastifySwaggerUi, { routePrefix: DOCS_PREFIX, uiConfig: { url: '/openapi.json', deepLinking: true }, staticCSP: DOCS_CSP });
  // the preview page (GET /) and its assets, from src/web
  await app.register(webRoutes);
};

// JSON only, parsed safely (no __proto__ or constructor.prototype keys, no deep nesting); text/plain is refused
function installParsers(app: FastifyInstance): void {
  app.removeAllContentTypeParsers();
  app.addContentTypeParser('application/json', { parseAs: 'string' }, (_request, body, done) => {
    const text = body as string;
    if (text.length === 0) return done(emptyBody(), undefined);
    if (jsonDepthExceeds(text, MAX_JSON_DEPTH)) return done(tooDeep(), undefined);
    try {
      done(null, sjson.parse(text, { protoAction: 'error', constructorAction: 'error' }));
    } catch (err) {
      const why = err instanceof Error ? err.message : String(err);
      done(new HttpError('ERR_INVALID_JSON', `request body is not valid JSON: ${why}`, { issues: [{ path: '(root)', message: `not valid JSON: ${why}` }] }), undefined);
    }
  });
}

// components come in input and output variants (TrackInput, Track); keep the ones referenced
function pruneComponents<D extends object>(document: D): D {
  const schemas = (document as { components?: { schemas?: Record<string, unknown> } }).components?.schemas ?? {};
  const used = new Set<string>();
  const visit = (value: unknown): void => {
    if (Array.isArray(value)) return value.forEach(visit);
    if (value === null || typeof value !== 'object') return;
    for (const [key, child] of Object.entries(value)) {
      if (key === '$ref' && typeof child === 'string') {
        const name = child.replace('#/components/schemas/', '');
        if (!used.has(name)) {
          used.add(name);
          visit(schemas[name]);
        }
      } else {
        visit(child);
      }
    }
  };
  visit({ ...document, components: undefined });
  const kept = Object.fromEntries(Object.entries(schemas).filter(([name]) => used.has(name)));
  const components = (document as { components?: object }).components;
  return { ...document, components: { ...components, schemas: kept } };
}

function tooDeep(): HttpError {
  const message = `nests arrays and objects more than ${MAX_JSON_DEPTH} levels deep`;
  return new HttpError('ERR_INVALID_JSON', `request body ${message}; a whole track nests 5`, { issues: [{ path: '(root)', message }] });
}

function emptyBody(): HttpError {
  return new HttpError('ERR_INVALID_JSON', 'request body is empty but Content-Type is application/json: send a JSON object ({} for all defaults)', {
    issues: [{ path: '(root)', message: 'expected a JSON object, got nothing' }],
  });
}

// shutdown: refuse new requests with 503 and close connections after each answer
function installLifecycle(app: FastifyInstance, state: ServiceState): void {
  app.addHook('onRequest', async (_request, reply) => {
    if (!state.shuttingDown) return;
    reply.header('connection', 'close');
    throw unavailable('ERR_SHUTTING_DOWN', 'the server is shutting down; retry on another replica', state.options.retryAfterS);
  });
  app.addHook('onSend', async (_request, reply) => {
    if (state.shuttingDown) reply.header('connection', 'close');
  });
  app.addHook('preClose', async () => {
    state.shuttingDown = true;
  });
  app.addHook('onClose', async () => {
    await state.pool?.close();
  });
}
