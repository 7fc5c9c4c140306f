import { describe, expect, it } from 'vitest';
import { BATCH_ENV_VARS, readBatchEnv, resolveBatchOptions } from '../../src/server/batch-options.js';
import { ConfigError, readServerConfig } from '../../src/server/config.js';

describe('batch options', () => {
  it('default: 10 000 tracks per batch, 32 MiB bodies, two tracks in flight per worker', () => {
    expect(resolveBatchOptions(undefined, 3)).toEqual({ maxCount: 10_000, bodyLimitBytes: 33_554_432, window: 6 });
    expect(readServerConfig({}).app.batch).toBeUndefined();
  });

  it('reads LAPWRIGHT_BATCH_* variables, and names bad ones with the others', () => {
    expect(readServerConfig({ LAPWRIGHT_BATCH_MAX_COUNT: '500', LAPWRIGHT_BATCH_WINDOW: '3' }).app.batch).toEqual({ maxCount: 500, window: 3 });
    const problems: string[] = [];
    expect(readBatchEnv({ LAPWRIGHT_BATCH_MAX_COUNT: '0' }, problems)).toBeUndefined();
    expect(problems).toEqual(['LAPWRIGHT_BATCH_MAX_COUNT must be an integer from 1 to 1048576, got "0"']);
    expect(() => readServerConfig({ LAPWRIGHT_BATCH_BODY_LIMIT_BYTES: 'lots' })).toThrow(ConfigError);
    expect(Object.values(BATCH_ENV_VARS).map((v) => v.name)).toEqual(['LAPWRIGHT_BATCH_MAX_COUNT', 'LAPWRIGHT_BATCH_BODY_LIMIT_BYTES', 'LAPWRIGHT_BATCH_WINDOW']);
  });

  it('refuses values out of range (a caller\'s mistake)', () => {
    expect(() => resolveBatchOptions({ window: 0 }, 2)).toThrow('batch.window must be an integer from 1 to 1024, got 0');
  });
});
