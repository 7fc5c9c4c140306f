import { availableParallelism } from 'node:os';
import { describe, expect, it } from 'vitest';
import { ConfigError, readServerConfig, resolveAppOptions } from '../../src/server/config.js';

describe('readServerConfig', () => {
  it('defaults: 127.0.0.1:8080, a worker per core, 64 queue places per worker, 10 s deadline, 1 MiB bodies, no proxy trusted', () => {
    const workers = availableParallelism();
    expect(readServerConfig({})).toEqual({
      port: 8080,
      host: '127.0.0.1',
      logLevel: 'info',
      shutdownTimeoutMs: 30_000,
      app: {
        workers,
        maxQueue: 64 * workers,
        deadlineMs: 10_000,
        bodyLimitBytes: 1_048_576,
        trackBodyLimitBytes: 4_194_304,
        retryAfterS: 1,
        logger: { level: 'info' },
        startPool: true,
        workerUrl: undefined,
        workerData: undefined,
        corsOrigins: [],
        apiToken: undefined,
        rateLimitMax: 0,
        rateLimitWindowMs: 60_000,
        trustProxyHops: 0,
        cacheBytes: 67_108_864,
      },
    });
  });

  it('reads every variable; empty ones take the default', () => {
    const config = readServerConfig({
      PORT: '0',
      HOST: '0.0.0.0',
      LOG_LEVEL: 'warn',
      LAPWRIGHT_WORKERS: '2',
      LAPWRIGHT_MAX_QUEUE: '5',
      LAPWRIGHT_DEADLINE_MS: '2500',
      LAPWRIGHT_BODY_LIMIT_BYTES: '2048',
      LAPWRIGHT_TRACK_BODY_LIMIT_BYTES: '',
      LAPWRIGHT_RETRY_AFTER_S: '3',
      LAPWRIGHT_SHUTDOWN_TIMEOUT_MS: '1000',
    });
    expect(config).toMatchObject({ port: 0, host: '0.0.0.0', logLevel: 'warn', shutdownTimeoutMs: 1000 });
    expect(config.app).toMatchObject({ workers: 2, maxQueue: 5, deadlineMs: 2500, bodyLimitBytes: 2048, trackBodyLimitBytes: 4_194_304, retryAfterS: 3 });
  });

  it('names every bad variable at once', () => {
    let error: unknown;
    try {
      readServerConfig({ PORT: '80a', LAPWRIGHT_WORKERS: '0', LOG_LEVEL: 'loud', LAPWRIGHT_DEADLINE_MS: '1e4' });
    } catch (err) {
      error = err;
    }
    expect(error).toBeInstanceOf(ConfigError);
    expect((error as ConfigError).problems).toEqual([
      'PORT must be an integer from 0 to 65535, got "80a"',
      'LOG_LEVEL must be one of fatal, error, warn, info, debug, trace, silent, got "loud"',
      'LAPWRIGHT_WORKERS must be an integer from 1 to 256, got "0"',
      'LAPWRIGHT_DEADLINE_MS must be an integer from 10 to 600000, got "1e4"',
    ]);
  });
});

describe('resolveAppOptions', () => {
  it('refuses values out of range (a caller\'s mistake)', () => {
    expect(() => resolveAppOptions({ workers: 0 })).toThrow('workers must be an integer from 1 to 256, got 0');
    expect(() => resolveAppOptions({ deadlineMs: 1.5 })).toThrow('deadlineMs must be an integer from 10 to 600000, got 1.5');
  });
});
