/**
 * the README's preview section keeps up with the code: every format with its media type and ETag, every
 * export option with its format, the page's endpoints, and the screenshot it shows exists.
 */
import { existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { EXPORT_FORMATS } from '../../src/export/index.js';
import { OPTION_FORMATS, TRACK_FORMATS } from '../../src/server/export-query.js';

const DOC = new URL('../../README.md', import.meta.url);

describe('README, preview page and formats over HTTP', () => {
  it('lists every format with its Accept media type and ETag, in negotiation order', async () => {
    const text = await readFile(DOC, 'utf8');
    const rows = [...text.matchAll(/^\| `(\w+)`(?: \(default\))? \| `([^`]+)` \| `[^`]+` \| `"([^`]+)"` \|/gm)].map((m) => [m[1], m[2], m[3]]);
    expect(rows).toEqual(TRACK_FORMATS.map((f) => [f, EXPORT_FORMATS[f].mediaType, f === 'json' ? '<id>' : `<id>.${EXPORT_FORMATS[f].extension}`]));
  });

  it('documents every export option with its format', async () => {
    const text = await readFile(DOC, 'utf8');
    const rows = [...text.matchAll(/^\| `(\w+)=[^`]*` \| (\w+) \|/gm)].map((m) => [m[1], m[2]]);
    expect(rows).toEqual(Object.entries(OPTION_FORMATS));
  });

  it('names the page\'s endpoints and shows the screenshot the browser test takes', async () => {
    const text = await readFile(DOC, 'utf8');
    for (const path of ['GET /', 'GET /v1/params', 'GET /v1/schema/track']) expect(text).toContain(`| \`${path}\` |`);
    const image = /!\[[^\]]+\]\(([^)]+)\)/.exec(text)?.[1];
    expect(image).toBe('examples/preview.png');
    expect(existsSync(new URL(image!, DOC))).toBe(true);
  });
});
