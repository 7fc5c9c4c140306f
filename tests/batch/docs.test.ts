// the README's training-farm section keeps up with the code: the batch knobs, the commands' flags, the split's definition.

import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { batchHelp, verifyHelp } from '../../src/cli/help.js';
import { SPLIT_KEY, SPLIT_SHARES } from '../../src/core/index.js';
import { BATCH_ENV_VARS } from '../../src/server/batch-options.js';

const DOC = new URL('../../README.md', import.meta.url);

describe('README, training-farm workflows', () => {
  it('lists every batch environment variable with its default and meaning', async () => {
    const text = await readFile(DOC, 'utf8');
    for (const v of Object.values(BATCH_ENV_VARS)) expect(text).toContain(`| \`${v.name}\` | ${v.defaultText} | ${v.meaning} |`);
  });

  it('mentions every flag of lapwright batch and lapwright verify', async () => {
    const text = await readFile(DOC, 'utf8');
    const flags = new Set([...`${batchHelp()}${verifyHelp()}`.matchAll(/--[a-z][a-z-]+/g)].map((m) => m[0]));
    for (const flag of flags) if (flag !== '--help') expect(text, flag).toContain(flag);
  });

  it('states the split\'s key and shares', async () => {
    const text = await readFile(DOC, 'utf8');
    expect(text).toContain(`HMAC-SHA256(key "${SPLIT_KEY}", JSON.stringify(seed))`);
    expect(text).toContain(`u < ${SPLIT_SHARES.train}`);
    expect(text).toContain(`u < ${SPLIT_SHARES.train + SPLIT_SHARES.validation}`);
  });
});
