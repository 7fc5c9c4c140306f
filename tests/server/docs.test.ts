/**
 * the README's HTTP service section keeps up with the code: every error code with its status, every
 * environment variable, every preset with its parameters.
 */
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { ENV_VARS } from '../../src/server/config.js';
import { HTTP_ERRORS } from '../../src/server/errors.js';
import { PRESETS } from '../../src/server/presets.js';

const DOC = new URL('../../README.md', import.meta.url);

describe('README, HTTP service', () => {
  it('lists every error code with its status and meaning', async () => {
    const text = await readFile(DOC, 'utf8');
    for (const [code, { status, meaning }] of Object.entries(HTTP_ERRORS)) expect(text).toContain(`| ${status} | \`${code}\` | ${meaning} |`);
  });

  it('lists every environment variable with its default and meaning', async () => {
    const text = await readFile(DOC, 'utf8');
    for (const v of Object.values(ENV_VARS)) expect(text).toContain(`| \`${v.name}\` | ${v.defaultText} | ${v.meaning} |`);
  });

  it('lists every preset with its parameters and description', async () => {
    const text = await readFile(DOC, 'utf8');
    for (const { name, description, params: p } of PRESETS) {
      expect(text).toContain(`| \`${name}\` | ${p.lengthM} | ${p.widthM?.min}–${p.widthM?.max} | ${p.curvatureBudgetDeg} | ${p.turnBalance} | ${p.cornerCount} | ${p.minCornerRadiusM} | ${p.noise} | ${description} |`);
    }
  });
});
