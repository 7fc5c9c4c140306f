/**
 * The service's knobs: defaults, allowed ranges, and how environment variables set them.
 * buildApp takes `AppOptions` (tests pass them directly); the entry reads them from the
 * environment with `readServerConfig`, which names every bad variable at once.
 */
import { availableParallelism } from 'node:os';
import { type BatchOptions, readBatchEnv } from './batch-options.js';

/** Options of buildApp; each has a default (see APP_DEFAULTS and resolveAppOptions). */
export interface AppOptions {
  /** Worker threads that run the generator; default: the machine's available parallelism. */
  readonly workers?: number;
  /** Requests that may wait for a worker before 503s begin; default: 16 per worker. */
  readonly maxQueue?: number;
  /** Time budget of one generation or validation from arrival, ms, waiting included. */
  readonly deadlineMs?: number;
  /** Largest request body, bytes (parameters). */
  readonly bodyLimitBytes?: number;
  /** Largest body of POST /v1/tracks/validate, bytes (a 20 km track is about 2 MB of JSON). */
  readonly trackBodyLimitBytes?: number;
  /** Seconds a 503 answer asks the client to wait (Retry-After). */
  readonly retryAfterS?: number;
  /** pino logger options, or false for none (the default, so tests stay quiet). */
  readonly logger?: boolean | { readonly level?: string };
  /** Start the worker pool (false: documentation only, e.g. writing openapi.json). */
  readonly startPool?: boolean;
  /** Worker entry override (tests use fixture workers). */
  readonly workerUrl?: URL;
  /** Data handed to each worker (tests). */
  readonly workerData?: Readonly<Record<string, unknown>>;
  /** Knobs of the batch routes (src/server/batch-options.ts); their defaults are filled by the routes. */
  readonly batch?: BatchOptions;
  /** Origins a browser page may call the API from (CORS); ['*'] for any; default none (CORS off). */
  readonly corsOrigins?: readonly string[];
  /** When set, every /v1 route needs `Authorization: Bearer <apiToken>` (RFC 6750); default none. */
  readonly apiToken?: string;
  /** Requests per client IP per window before 429; 0 (the default) turns rate limiting off. */
  readonly rateLimitMax?: number;
  /** Length of the rate-limit window, ms. */
  readonly rateLimitWindowMs?: number;
  /**
   * Reverse proxies in front of the server whose X-Forwarded-For entries are believed: the
   * client is the address that many hops back (for the rate limit and the logs); 0 (the
   * default): the socket's remote address, whatever the headers say.
   */
  readonly trustProxyHops?: number;
  /** Memory for answers of the track routes kept for repeats, bytes; 0 keeps none. */
  readonly cacheBytes?: number;
}

/** AppOptions with every default filled in. */
export interface ResolvedAppOptions {
  readonly workers: number;
  readonly maxQueue: number;
  readonly deadlineMs: number;
  readonly bodyLimitBytes: number;
  readonly trackBodyLimitBytes: number;
  readonly retryAfterS: number;
  readonly logger: boolean | { readonly level?: string };
  readonly startPool: boolean;
  readonly workerUrl?: URL;
  readonly workerData?: Readonly<Record<string, unknown>>;
  readonly batch?: BatchOptions;
  /** Empty: CORS off. */
  readonly corsOrigins: readonly string[];
  /** undefined: no token needed. */
  readonly apiToken: string | undefined;
  /** 0: no rate limit. */
  readonly rateLimitMax: number;
  readonly rateLimitWindowMs: number;
  /** 0: the socket's address is the client. */
  readonly trustProxyHops: number;
  /** 0: no answers kept. */
  readonly cacheBytes: number;
}

/** The listening entry's configuration: where to listen, and the app's options. */
export interface ServerConfig {
  readonly port: number;
  readonly host: string;
  readonly logLevel: string;
  /** After SIGTERM, the longest wait for in-flight requests before giving up (exit 1), ms. */
  readonly shutdownTimeoutMs: number;
  readonly app: ResolvedAppOptions;
}

/**
 * Queue length per worker when maxQueue is not set: room for a farm's clients, each with one
 * request outstanding, plus the slots of batches in flight (50 clients and a few batches on 2
 * workers reach 63 waiting in npm run load); every wait is still bounded by the deadline.
 */
export const QUEUE_PER_WORKER = 64;

/** Default values (workers and maxQueue depend on the machine; see resolveAppOptions). */
export const APP_DEFAULTS = {
  deadlineMs: 10_000,
  bodyLimitBytes: 1024 * 1024,
  trackBodyLimitBytes: 4 * 1024 * 1024,
  retryAfterS: 1,
  // off: a training farm behind one NAT address must not be throttled by surprise
  rateLimitMax: 0,
  rateLimitWindowMs: 60_000,
  // off: a header anyone can send must not decide who a client is unless a proxy sets it
  trustProxyHops: 0,
  // about 450 default tracks of JSON
  cacheBytes: 64 * 1024 * 1024,
} as const;

/** The API token's length bounds, characters (16: common practice for a shared secret, no source). */
export const API_TOKEN_CHARS = { min: 16, max: 512 } as const;

// RFC 6750 §2.1 b64token: what a client can send after "Bearer "
const B64TOKEN = /^[A-Za-z0-9\-._~+/]+=*$/;

/** Defaults of the listening entry. */
export const SERVER_DEFAULTS = {
  port: 8080,
  host: '127.0.0.1',
  logLevel: 'info',
  shutdownTimeoutMs: 30_000,
} as const;

const LOG_LEVELS = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const;

/** One environment variable: its name, meaning, default (as documented), and allowed range. */
export interface EnvVar {
  readonly name: string;
  readonly meaning: string;
  readonly defaultText: string;
  readonly min?: number;
  readonly max?: number;
}

/** Every environment variable the entry reads (the README's HTTP service section repeats this table). */
export const ENV_VARS = {
  port: { name: 'PORT', meaning: 'TCP port to listen on (0 = any free port)', defaultText: String(SERVER_DEFAULTS.port), min: 0, max: 65_535 },
  host: { name: 'HOST', meaning: 'address to listen on (0.0.0.0 in containers)', defaultText: SERVER_DEFAULTS.host },
  logLevel: { name: 'LOG_LEVEL', meaning: `pino log level: ${LOG_LEVELS.join(', ')}`, defaultText: SERVER_DEFAULTS.logLevel },
  workers: { name: 'LAPWRIGHT_WORKERS', meaning: 'generation worker threads', defaultText: 'available CPU cores', min: 1, max: 256 },
  maxQueue: { name: 'LAPWRIGHT_MAX_QUEUE', meaning: 'requests waiting for a worker before 503 + Retry-After', defaultText: `${QUEUE_PER_WORKER} x workers`, min: 0, max: 100_000 },
  deadlineMs: { name: 'LAPWRIGHT_DEADLINE_MS', meaning: 'time budget of one request from arrival, waiting included, ms', defaultText: String(APP_DEFAULTS.deadlineMs), min: 10, max: 600_000 },
  bodyLimitBytes: { name: 'LAPWRIGHT_BODY_LIMIT_BYTES', meaning: 'largest request body, bytes (413 above)', defaultText: `${APP_DEFAULTS.bodyLimitBytes} (1 MiB)`, min: 1024, max: 1024 ** 3 },
  trackBodyLimitBytes: { name: 'LAPWRIGHT_TRACK_BODY_LIMIT_BYTES', meaning: 'largest body of POST /v1/tracks/validate, bytes', defaultText: `${APP_DEFAULTS.trackBodyLimitBytes} (4 MiB)`, min: 1024, max: 1024 ** 3 },
  retryAfterS: { name: 'LAPWRIGHT_RETRY_AFTER_S', meaning: 'seconds a 503 asks the client to wait (Retry-After)', defaultText: String(APP_DEFAULTS.retryAfterS), min: 0, max: 3600 },
  shutdownTimeoutMs: { name: 'LAPWRIGHT_SHUTDOWN_TIMEOUT_MS', meaning: 'after SIGTERM, longest wait for in-flight requests, ms', defaultText: String(SERVER_DEFAULTS.shutdownTimeoutMs), min: 0, max: 3_600_000 },
  corsOrigins: { name: 'LAPWRIGHT_CORS_ORIGINS', meaning: 'origins a browser page may call the API from, comma-separated (such as https://sim.example.org), or * for any', defaultText: 'none (CORS off)' },
  apiToken: { name: 'LAPWRIGHT_API_TOKEN', meaning: `when set, every /v1 request must send it as Authorization: Bearer ... (401 otherwise); ${API_TOKEN_CHARS.min} to ${API_TOKEN_CHARS.max} characters of A-Z a-z 0-9 - . _ ~ + /`, defaultText: 'none (no token needed)' },
  rateLimitMax: { name: 'LAPWRIGHT_RATE_LIMIT_MAX', meaning: 'requests per client IP per window before 429 + Retry-After (/healthz and /readyz exempt); 0 = no limit', defaultText: '0 (off)', min: 0, max: 1_000_000_000 },
  cacheBytes: { name: 'LAPWRIGHT_CACHE_BYTES', meaning: 'memory for answers of the track routes kept for repeated requests with a seed (least recently used dropped first), bytes; 0 = keep none', defaultText: '67108864 (64 MiB)', min: 0, max: 64 * 1024 ** 3 },
  trustProxyHops: { name: 'LAPWRIGHT_TRUST_PROXY_HOPS', meaning: 'reverse proxies in front of the server (an ingress, a load balancer) whose X-Forwarded-For entries name the client, for the rate limit and the logs; 0 = the socket address, headers ignored', defaultText: '0 (none)', min: 0, max: 16 },
  rateLimitWindowMs: { name: 'LAPWRIGHT_RATE_LIMIT_WINDOW_MS', meaning: 'length of the rate-limit window, ms', defaultText: String(APP_DEFAULTS.rateLimitWindowMs), min: 1000, max: 86_400_000 },
} as const satisfies Record<string, EnvVar>;

/** A configuration that cannot start the server; `problems` names each bad variable. */
export class ConfigError extends Error {
  readonly problems: readonly string[];

  constructor(problems: readonly string[]) {
    super(`invalid configuration: ${problems.join('; ')}`);
    this.name = 'ConfigError';
    this.problems = problems;
  }
}

/**
 * Fills in every default of AppOptions.
 * @throws RangeError when a value is out of range (a programmer's mistake in the caller)
 */
export function resolveAppOptions(options: AppOptions = {}): ResolvedAppOptions {
  const workers = options.workers ?? availableParallelism();
  const resolved: ResolvedAppOptions = {
    workers,
    maxQueue: options.maxQueue ?? QUEUE_PER_WORKER * workers,
    deadlineMs: options.deadlineMs ?? APP_DEFAULTS.deadlineMs,
    bodyLimitBytes: options.bodyLimitBytes ?? APP_DEFAULTS.bodyLimitBytes,
    trackBodyLimitBytes: options.trackBodyLimitBytes ?? APP_DEFAULTS.trackBodyLimitBytes,
    retryAfterS: options.retryAfterS ?? APP_DEFAULTS.retryAfterS,
    logger: options.logger ?? false,
    startPool: options.startPool ?? true,
    workerUrl: options.workerUrl,
    workerData: options.workerData,
    batch: options.batch,
    corsOrigins: options.corsOrigins ?? [],
    apiToken: options.apiToken,
    rateLimitMax: options.rateLimitMax ?? APP_DEFAULTS.rateLimitMax,
    rateLimitWindowMs: options.rateLimitWindowMs ?? APP_DEFAULTS.rateLimitWindowMs,
    trustProxyHops: options.trustProxyHops ?? APP_DEFAULTS.trustProxyHops,
    cacheBytes: options.cacheBytes ?? APP_DEFAULTS.cacheBytes,
  };
  for (const key of ['workers', 'maxQueue', 'deadlineMs', 'bodyLimitBytes', 'trackBodyLimitBytes', 'retryAfterS', 'rateLimitMax', 'rateLimitWindowMs', 'trustProxyHops', 'cacheBytes'] as const) {
    const spec: EnvVar = ENV_VARS[key];
    const value = resolved[key];
    if (!Number.isInteger(value) || value < (spec.min ?? 0) || value > (spec.max ?? Infinity)) {
      throw new RangeError(`${key} must be an integer from ${spec.min} to ${spec.max}, got ${value}`);
    }
  }
  const originProblem = corsOriginsProblem(resolved.corsOrigins);
  if (originProblem !== undefined) throw new RangeError(`corsOrigins: ${originProblem}`);
  const tokenProblem = resolved.apiToken === undefined ? undefined : apiTokenProblem(resolved.apiToken);
  if (tokenProblem !== undefined) throw new RangeError(`apiToken ${tokenProblem}`);
  return resolved;
}

/**
 * Splits LAPWRIGHT_CORS_ORIGINS: comma-separated, blanks around entries and empty entries dropped.
 * @example parseCorsOrigins(' https://a.example, http://localhost:5173 ') // ['https://a.example', 'http://localhost:5173']
 */
export function parseCorsOrigins(raw: string): string[] {
  return raw
    .split(',')
    .map((o) => o.trim())
    .filter((o) => o !== '');
}

/**
 * What is wrong with a list of CORS origins, or undefined when nothing is: '*' must stand alone,
 * and every other entry must be an http or https origin as a browser sends it in its Origin
 * header (RFC 6454 §6.1: scheme://host[:port], lower case, no path, no default port).
 */
export function corsOriginsProblem(origins: readonly string[]): string | undefined {
  if (origins.includes('*')) return origins.length === 1 ? undefined : `* (any origin) must stand alone, got ${JSON.stringify(origins.join(','))}`;
  const bad = origins.filter((o) => serializedOrigin(o) !== o);
  if (bad.length === 0) return undefined;
  const fixes = bad.map((o) => {
    const fixed = serializedOrigin(o);
    return fixed === undefined ? `${JSON.stringify(o)} is not an http(s) origin` : `${JSON.stringify(o)} should be ${JSON.stringify(fixed)}`;
  });
  return `each entry must be an origin scheme://host[:port] with no path, or * alone: ${fixes.join(', ')}`;
}

/**
 * What is wrong with an API token, or undefined when nothing is: RFC 6750 §2.1 b64token
 * characters, API_TOKEN_CHARS long.
 */
export function apiTokenProblem(token: string): string | undefined {
  const { min, max } = API_TOKEN_CHARS;
  if (token.length < min || token.length > max) return `must be ${min} to ${max} characters long, got ${token.length} (make one with: openssl rand -hex 32)`;
  if (!B64TOKEN.test(token)) return 'may hold only A-Z a-z 0-9 - . _ ~ + / (and = at the end), as a Bearer token must (RFC 6750 §2.1)';
  return undefined;
}

// the origin a browser would send for this text, or undefined when it is not an http(s) URL
function serializedOrigin(text: string): string | undefined {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    return undefined;
  }
  return url.protocol === 'http:' || url.protocol === 'https:' ? url.origin : undefined;
}

/**
 * Reads the server's configuration from environment variables (ENV_VARS); unset or empty
 * variables take their defaults.
 * @throws ConfigError naming every variable that is not a valid value
 * @example readServerConfig({ PORT: '9000', LAPWRIGHT_WORKERS: '2' }).app.workers // 2
 */
export function readServerConfig(env: Readonly<Record<string, string | undefined>>): ServerConfig {
  const problems: string[] = [];
  const int = (spec: EnvVar): number | undefined => {
    const raw = env[spec.name]?.trim();
    if (raw === undefined || raw === '') return undefined;
    const value = /^\d+$/.test(raw) ? Number(raw) : NaN;
    if (!Number.isSafeInteger(value) || value < (spec.min ?? 0) || value > (spec.max ?? Infinity)) {
      problems.push(`${spec.name} must be an integer from ${spec.min} to ${spec.max}, got ${JSON.stringify(raw)}`);
      return undefined;
    }
    return value;
  };
  const port = int(ENV_VARS.port) ?? SERVER_DEFAULTS.port;
  const host = env[ENV_VARS.host.name]?.trim() || SERVER_DEFAULTS.host;
  const logLevel = env[ENV_VARS.logLevel.name]?.trim() || SERVER_DEFAULTS.logLevel;
  if (!(LOG_LEVELS as readonly string[]).includes(logLevel)) problems.push(`${ENV_VARS.logLevel.name} must be one of ${LOG_LEVELS.join(', ')}, got ${JSON.stringify(logLevel)}`);
  const shutdownTimeoutMs = int(ENV_VARS.shutdownTimeoutMs) ?? SERVER_DEFAULTS.shutdownTimeoutMs;
  const corsRaw = env[ENV_VARS.corsOrigins.name]?.trim();
  const corsOrigins = corsRaw === undefined || corsRaw === '' ? undefined : parseCorsOrigins(corsRaw);
  const corsProblem = corsOrigins === undefined ? undefined : corsOriginsProblem(corsOrigins);
  if (corsProblem !== undefined) problems.push(`${ENV_VARS.corsOrigins.name}: ${corsProblem}`);
  // the token is a secret: a problem names its length or characters, never its value
  const tokenRaw = env[ENV_VARS.apiToken.name]?.trim();
  const apiToken = tokenRaw === undefined || tokenRaw === '' ? undefined : tokenRaw;
  const tokenProblem = apiToken === undefined ? undefined : apiTokenProblem(apiToken);
  if (tokenProblem !== undefined) problems.push(`${ENV_VARS.apiToken.name} ${tokenProblem}`);
  const options: AppOptions = {
    workers: int(ENV_VARS.workers),
    maxQueue: int(ENV_VARS.maxQueue),
    deadlineMs: int(ENV_VARS.deadlineMs),
    bodyLimitBytes: int(ENV_VARS.bodyLimitBytes),
    trackBodyLimitBytes: int(ENV_VARS.trackBodyLimitBytes),
    retryAfterS: int(ENV_VARS.retryAfterS),
    logger: { level: logLevel },
    batch: readBatchEnv(env, problems),
    corsOrigins: corsProblem === undefined ? corsOrigins : undefined,
    apiToken: tokenProblem === undefined ? apiToken : undefined,
    rateLimitMax: int(ENV_VARS.rateLimitMax),
    rateLimitWindowMs: int(ENV_VARS.rateLimitWindowMs),
    trustProxyHops: int(ENV_VARS.trustProxyHops),
    cacheBytes: int(ENV_VARS.cacheBytes),
  };
  if (problems.length > 0) throw new ConfigError(problems);
  return { port, host, logLevel, shutdownTimeoutMs, app: resolveAppOptions(options) };
}
