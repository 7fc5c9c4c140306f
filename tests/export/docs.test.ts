// README.md keeps up with the code: every format with its media type, the CSV headers,
// the glb node names, the SVG element ids and the CLI's format flags.

import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { CSV_HEADERS, CSV_TABLES, EXPORT_FORMAT_NAMES, EXPORT_FORMATS, SVG_WIDTH_LIMITS_PX, TRACK_SCHEMA_FILE } from '../../src/export/index.js';
import { generateHelp } from '../../src/cli/help.js';

const DOC = new URL('../../README.md', import.meta.url);

describe('README.md', () => {
  it('lists every format with its media type, in the code\'s order', async () => {
    const all = await readFile(DOC, 'utf8');
    // the Exports section only (other tables share the row shape)
    const from = all.indexOf('\n## Exports');
    const doc = all.slice(from, all.indexOf('\n## ', from + 1));
    const rows = [...doc.matchAll(/^\| `(\w+)` \| `([^`]+)` \|/gm)].map((m) => [m[1], m[2]]);
    expect(rows).toEqual(EXPORT_FORMAT_NAMES.map((f) => [f, EXPORT_FORMATS[f].mediaType]));
  });

  it('shows each CSV table\'s header row, names the schema file and the SVG width limits', async () => {
    const doc = await readFile(DOC, 'utf8');
    for (const table of CSV_TABLES) expect(doc).toContain('\n' + CSV_HEADERS[table].join(',') + '\n');
    expect(doc).toContain(TRACK_SCHEMA_FILE);
    expect(doc).toContain(`${SVG_WIDTH_LIMITS_PX.min} to ${SVG_WIDTH_LIMITS_PX.max}`);
  });

  it('documents every format flag the CLI has', async () => {
    const doc = await readFile(DOC, 'utf8');
    const flags = [...generateHelp().matchAll(/^ {2}(--(?:format|pretty|table|width|heat))\b/gm)].map((m) => m[1]);
    expect(flags.sort()).toEqual(['--format', '--heat', '--pretty', '--table', '--width']);
    for (const flag of flags) expect(doc).toContain(`\`${flag}`);
  });

  it('names the glb nodes and SVG ids the exporters make', async () => {
    const doc = await readFile(DOC, 'utf8');
    for (const name of ['`road`', '`wall-left`', '`gate-0000`', '`spawn-00`', '`lw-road`', '`lw-scale-bar`']) expect(doc).toContain(name);
  });
});
