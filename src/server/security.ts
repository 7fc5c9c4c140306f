/**
 * The service's security layer, installed before any route: security headers on every answer
 * (@fastify/helmet), CORS only for the origins configured (@fastify/cors), an optional API
 * token on every /v1 route (Authorization: Bearer, RFC 6750), and an optional per-client rate
 * limit (@fastify/rate-limit, 429 with Retry-After, RFC 6585 §4). Every refusal uses the
 * service's error body. docs/security.md describes the choices.
 */
import { createHash, timingSafeEqual } from 'node:crypto';
import fastifyCors from '@fastify/cors';
import fastifyHelmet, { type FastifyHelmetOptions } from '@fastify/helmet';
import fastifyRateLimit from '@fastify/rate-limit';
import helmet, { type HelmetOptions } from 'helmet';
import type { FastifyInstance, FastifyReply, FastifyRequest, preHandlerAsyncHookHandler, RouteOptions } from 'fastify';
import type { ResolvedAppOptions } from './config.js';
import { HttpError } from './errors.js';

/** Content-Security-Policy of API answers (JSON, exports, errors): they load nothing and are never framed. */
export const API_CSP = "default-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'";

/**
 * Content-Security-Policy of the interactive documentation (/docs): its scripts, styles and
 * images come from the service; Swagger UI sets inline styles and draws icons as data: images,
 * and "Try it out" calls this same origin.
 */
export const DOCS_CSP = "default-src 'none'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data:; connect-src 'self'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'";

/** Routes never rate-limited: probes of load balancers and Kubernetes must not be throttled. */
export const RATE_LIMIT_EXEMPT = ['/healthz', '/readyz'] as const;

/** Routes that need the API token when one is set: every route under this prefix. */
export const TOKEN_PREFIX = '/v1';

/** Request headers a browser page may send cross-origin (the preview page's fetches use these). */
const CORS_ALLOWED_HEADERS = ['Accept', 'Authorization', 'Content-Type', 'If-None-Match'];

/** Answer headers a cross-origin page may read. */
const CORS_EXPOSED_HEADERS = ['Content-Disposition', 'ETag', 'Retry-After', 'X-RateLimit-Limit', 'X-RateLimit-Remaining', 'X-RateLimit-Reset'];

/** How long a browser may cache a preflight answer, s (common practice, no source). */
const CORS_MAX_AGE_S = 600;

/** HSTS max-age, s: 180 days (common practice, no source); browsers heed it only over HTTPS (RFC 6797 §8.1). */
const HSTS_MAX_AGE_S = 180 * 24 * 3600;

/**
 * Installs headers, CORS, the token check and the rate limit on `app`. Call it before any route
 * is registered: the token check and the rate limit attach to routes as they are added.
 */
export async function installSecurity(app: FastifyInstance, options: ResolvedAppOptions): Promise<void> {
  // helmet's own types and the ones @fastify/helmet re-exports are the same shape from two files
  await app.register(fastifyHelmet, helmetOptions(options) as FastifyHelmetOptions);
  if (options.corsOrigins.length > 0) await installCors(app, options.corsOrigins);
  if (options.rateLimitMax > 0) await installRateLimit(app, options);
  if (options.apiToken !== undefined) installTokenCheck(app, options.apiToken);
}

/**
 * The security headers as a function of the raw request and response, for the few answers no
 * hook sees (a URL the router cannot decode goes straight to fastify's frameworkErrors).
 */
export function securityHeaders(options: ResolvedAppOptions): (request: FastifyRequest, reply: FastifyReply) => void {
  const middleware = helmet(helmetOptions(options));
  return (request, reply) => void middleware(request.raw, reply.raw, () => {});
}

// one configuration for @fastify/helmet and for securityHeaders
function helmetOptions(options: ResolvedAppOptions): HelmetOptions {
  return {
    contentSecurityPolicy: { useDefaults: false, directives: cspDirectives(API_CSP) },
    // the service runs behind a TLS proxy or on plain HTTP: leave sibling hosts' policy alone
    strictTransportSecurity: { maxAge: HSTS_MAX_AGE_S, includeSubDomains: false },
    xFrameOptions: { action: 'deny' },
    // a page on a configured origin may embed exports (<img src=...svg>); the API sets no cookies
    crossOriginResourcePolicy: { policy: options.corsOrigins.length > 0 ? 'cross-origin' : 'same-origin' },
  };
}

/**
 * Route options of the not-found handler: rate-limited like every route when the limit is on,
 * so probing for paths counts too.
 */
export function notFoundOptions(app: FastifyInstance, options: ResolvedAppOptions): { preHandler?: preHandlerAsyncHookHandler } {
  return options.rateLimitMax > 0 ? { preHandler: app.rateLimit() } : {};
}

/** Name of the bearer scheme in the OpenAPI document. */
export const SECURITY_SCHEME_NAME = 'bearerAuth';

const ERROR_REF = { content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } } };

/**
 * Adds the token and the rate limit to an OpenAPI document: a bearer security scheme, and on
 * every /v1 operation an optional bearer requirement (`[{bearerAuth: []}, {}]`: the token is
 * needed only when the server sets one) and the 401 and 429 answers.
 */
export function securityScheme<D extends object>(document: D): D {
  const doc = document as { paths?: Record<string, Record<string, { security?: unknown; responses?: Record<string, unknown> }>>; components?: Record<string, unknown> };
  const paths = Object.fromEntries(
    Object.entries(doc.paths ?? {}).map(([path, methods]) => {
      if (!isTokenRoute(path)) return [path, methods];
      const ops = Object.fromEntries(
        Object.entries(methods).map(([method, op]) => {
          const responses = {
            ...op.responses,
            401: { description: 'ERR_UNAUTHORIZED: the server sets LAPWRIGHT_API_TOKEN and the request did not send it as Authorization: Bearer (WWW-Authenticate says so).', ...ERROR_REF },
            429: { description: 'ERR_RATE_LIMITED: the server sets LAPWRIGHT_RATE_LIMIT_MAX and this client sent more requests in the window; the Retry-After header says when to try again.', ...ERROR_REF },
          };
          const sorted = Object.fromEntries(Object.entries(responses).sort(([a], [b]) => statusOrder(a) - statusOrder(b)));
          return [method, { ...op, security: [{ [SECURITY_SCHEME_NAME]: [] }, {}], responses: sorted }];
        }),
      );
      return [path, ops];
    }),
  );
  const securitySchemes = { [SECURITY_SCHEME_NAME]: { type: 'http', scheme: 'bearer', description: 'The API token, needed on every /v1 route only when the server sets LAPWRIGHT_API_TOKEN (RFC 6750).' } };
  return { ...document, paths, components: { ...doc.components, securitySchemes } };
}

// numeric statuses in order, anything else (default) after them
function statusOrder(key: string): number {
  return /^\d+$/.test(key) ? Number(key) : Infinity;
}

/**
 * Whether `presented` equals the token, in time that does not depend on where they differ:
 * both are hashed to 32 bytes and compared with crypto.timingSafeEqual (never ===, whose time
 * leaks the length of the common prefix).
 */
export function tokenMatches(presented: string, expectedDigest: Buffer): boolean {
  return timingSafeEqual(sha256(presented), expectedDigest);
}

/** The SHA-256 digest of a token (what tokenMatches compares with). */
export function tokenDigest(token: string): Buffer {
  return sha256(token);
}

/**
 * The Bearer credentials of an Authorization header, or undefined when it has none
 * (RFC 6750 §2.1: `Bearer` + one or more spaces + b64token; the scheme is case-insensitive,
 * RFC 9110 §11.1).
 * @example bearerToken('Bearer abc') // 'abc'
 */
export function bearerToken(header: string | undefined): string | undefined {
  const match = header === undefined ? null : /^Bearer +([A-Za-z0-9\-._~+/]+=*) *$/i.exec(header);
  return match?.[1];
}

async function installCors(app: FastifyInstance, origins: readonly string[]): Promise<void> {
  const any = origins.length === 1 && origins[0] === '*';
  await app.register(fastifyCors, {
    origin: any ? '*' : [...origins],
    methods: ['GET', 'HEAD', 'POST'],
    allowedHeaders: CORS_ALLOWED_HEADERS,
    exposedHeaders: CORS_EXPOSED_HEADERS,
    // bearer tokens, not cookies: credentialed requests are never needed
    credentials: false,
    maxAge: CORS_MAX_AGE_S,
  });
  if (any) return;
  // the answer depends on Origin: a route that sets Vary itself (Accept) must keep Origin in it
  app.addHook('onSend', async (_request, reply) => {
    const vary = String(reply.getHeader('vary') ?? '');
    if (!/(^|,)\s*origin\s*(,|$)/i.test(vary)) reply.header('vary', vary === '' ? 'Origin' : `${vary}, Origin`);
  });
}

async function installRateLimit(app: FastifyInstance, options: ResolvedAppOptions): Promise<void> {
  const windowText = formatWindow(options.rateLimitWindowMs);
  await app.register(fastifyRateLimit, {
    max: options.rateLimitMax,
    timeWindow: options.rateLimitWindowMs,
    allowList: (request: FastifyRequest) => (RATE_LIMIT_EXEMPT as readonly string[]).includes(request.routeOptions.url ?? ''),
    errorResponseBuilder: (_request, context) =>
      new HttpError('ERR_RATE_LIMITED', `more than ${context.max} request${context.max === 1 ? '' : 's'} from this client in ${windowText}: retry in ${Math.ceil(context.ttl / 1000)} s (Retry-After)`),
  });
}

// checks the token on every route under /v1, after the rate limit (so guessing is limited too)
function installTokenCheck(app: FastifyInstance, token: string): void {
  const digest = tokenDigest(token);
  const check = async (request: FastifyRequest, reply: FastifyReply): Promise<void> => {
    const presented = bearerToken(request.headers.authorization);
    if (presented !== undefined && tokenMatches(presented, digest)) return;
    // RFC 6750 §3: no error code when no credentials came; invalid_token when wrong ones did
    reply.header('www-authenticate', presented === undefined ? 'Bearer realm="lapwright"' : 'Bearer realm="lapwright", error="invalid_token"');
    const why = presented === undefined ? 'this server needs an API token: send the header Authorization: Bearer followed by the token' : 'the API token sent is not this server\'s';
    throw new HttpError('ERR_UNAUTHORIZED', why);
  };
  app.addHook('onRoute', (route: RouteOptions) => {
    if (!isTokenRoute(route.url)) return;
    const existing = route.onRequest === undefined ? [] : Array.isArray(route.onRequest) ? route.onRequest : [route.onRequest];
    route.onRequest = [...existing, check];
  });
}

/** Whether a route (by its pattern) needs the token when one is set. */
export function isTokenRoute(url: string): boolean {
  return url === TOKEN_PREFIX || url.startsWith(`${TOKEN_PREFIX}/`);
}

function sha256(text: string): Buffer {
  return createHash('sha256').update(text, 'utf8').digest();
}

// "default-src 'none'; base-uri 'none'" -> { 'default-src': ["'none'"], 'base-uri': ["'none'"] }
function cspDirectives(policy: string): Record<string, string[]> {
  return Object.fromEntries(
    policy.split(';').map((d) => {
      const [name, ...values] = d.trim().split(/\s+/);
      return [name, values];
    }),
  );
}

function formatWindow(ms: number): string {
  return ms % 60_000 === 0 ? `${ms / 60_000} min` : `${ms / 1000} s`;
}
