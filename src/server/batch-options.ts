/**
 * Knobs of the training-farm routes (POST /v1/batches, POST /v1/curricula): the cap on tracks
 * per batch, the body cap (a reference manifest can be large), and how many tracks one batch
 * keeps in flight. Set through buildApp's `batch` option or the environment (BATCH_ENV_VARS).
 */
import type { EnvVar } from './config.js';

export interface BatchOptions {
  /** Most tracks one POST /v1/batches may ask for. */
  readonly maxCount?: number;
  /** Largest body of POST /v1/batches and POST /v1/tracks/distance, bytes. */
  readonly bodyLimitBytes?: number;
  /** Tracks one batch keeps in flight or finished and unsent; default 2 per worker. */
  readonly window?: number;
}

export interface ResolvedBatchOptions {
  readonly maxCount: number;
  readonly bodyLimitBytes: number;
  readonly window: number;
}

/** Defaults of the batch knobs (the window depends on the workers). */
export const BATCH_DEFAULTS = {
  maxCount: 10_000,
  // a reference manifest of 10 000 tracks with their shapes is about 15 MB of JSON
  bodyLimitBytes: 32 * 1024 * 1024,
  windowPerWorker: 2,
} as const;

/** Environment variables of the batch knobs (the README's configuration table lists them). */
export const BATCH_ENV_VARS = {
  maxCount: { name: 'LAPWRIGHT_BATCH_MAX_COUNT', meaning: 'most tracks one POST /v1/batches may ask for', defaultText: String(BATCH_DEFAULTS.maxCount), min: 1, max: 1_048_576 },
  bodyLimitBytes: { name: 'LAPWRIGHT_BATCH_BODY_LIMIT_BYTES', meaning: 'largest body of POST /v1/batches and POST /v1/tracks/distance, bytes', defaultText: `${BATCH_DEFAULTS.bodyLimitBytes} (32 MiB)`, min: 1024, max: 1024 ** 3 },
  window: { name: 'LAPWRIGHT_BATCH_WINDOW', meaning: 'tracks one batch keeps in flight or finished and unsent', defaultText: `${BATCH_DEFAULTS.windowPerWorker} x workers`, min: 1, max: 1024 },
} as const satisfies Record<keyof ResolvedBatchOptions, EnvVar>;

/**
 * Fills in the defaults.
 * @throws RangeError when a value is out of range (a programmer's mistake in the caller)
 */
export function resolveBatchOptions(options: BatchOptions | undefined, workers: number): ResolvedBatchOptions {
  const resolved: ResolvedBatchOptions = {
    maxCount: options?.maxCount ?? BATCH_DEFAULTS.maxCount,
    bodyLimitBytes: options?.bodyLimitBytes ?? BATCH_DEFAULTS.bodyLimitBytes,
    window: options?.window ?? BATCH_DEFAULTS.windowPerWorker * workers,
  };
  for (const key of Object.keys(BATCH_ENV_VARS) as (keyof ResolvedBatchOptions)[]) {
    const spec: EnvVar = BATCH_ENV_VARS[key];
    const value = resolved[key];
    if (!Number.isInteger(value) || value < (spec.min ?? 0) || value > (spec.max ?? Infinity)) throw new RangeError(`batch.${key} must be an integer from ${spec.min} to ${spec.max}, got ${value}`);
  }
  return resolved;
}

/**
 * Reads the batch knobs from the environment.
 * @param problems where a bad variable is reported (one line each)
 * @returns the options set, or undefined when none of the variables is set
 */
export function readBatchEnv(env: Readonly<Record<string, string | undefined>>, problems: string[]): BatchOptions | undefined {
  const out: Record<string, number> = {};
  for (const [key, spec] of Object.entries(BATCH_ENV_VARS) as [keyof ResolvedBatchOptions, EnvVar][]) {
    const raw = env[spec.name]?.trim();
    if (raw === undefined || raw === '') continue;
    const value = /^\d+$/.test(raw) ? Number(raw) : NaN;
    if (!Number.isSafeInteger(value) || value < (spec.min ?? 0) || value > (spec.max ?? Infinity)) problems.push(`${spec.name} must be an integer from ${spec.min} to ${spec.max}, got ${JSON.stringify(raw)}`);
    else out[key] = value;
  }
  return Object.keys(out).length === 0 ? undefined : out;
}
