// Tests for src/cli/generate.ts's exports: `lapwright generate --format json|glb|svg|csv`, run
// in-process with captured streams (text and bytes), a terminal stand-in for the glb refusal,
// and files written by --out.

import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { validateBytes } from 'gltf-validator';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { generateTrack } from '../../src/core/index.js';
import type { Track } from '../../src/core/index.js';
import { trackToCsv, trackToGlb, trackToSvg } from '../../src/export/index.js';

/** A sink that keeps every chunk as bytes; `isTTY` makes it stand in for a terminal. */
function capture(isTTY?: boolean) {
  const chunks: Buffer[] = [];
  return {
    isTTY,
    chunks,
    write(chunk: string | Uint8Array, callback: (error?: Error | null) => void): boolean {
      chunks.push(typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : Buffer.from(chunk));
      callback();
      return true;
    },
  };
}

async function run(argv: string[], opts: { ttyStdout?: boolean } = {}) {
  const stdout = capture(opts.ttyStdout);
  const stderr = capture();
  const code = await runCli(argv, { stdout, stderr, stdin: Readable.from(['']) });
  const bytes = Buffer.concat(stdout.chunks);
  return { code, bytes, stdout: bytes.toString('utf8'), stderr: Buffer.concat(stderr.chunks).toString('utf8') };
}

// a short lap keeps each run quick
const ARGS = ['generate', '--seed', '7', '--set', 'lengthM=600'];
let track: Track;
let dir: string;
beforeAll(async () => {
  track = generateTrack({ seed: 7, lengthM: 600 });
  dir = await mkdtemp(join(tmpdir(), 'lapwright-generate-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('generate --format', () => {
  it('json is the default and the same bytes as before', async () => {
    const plain = await run(ARGS);
    expect(plain).toMatchObject({ code: 0, stdout: JSON.stringify(track) + '\n', stderr: '' });
    expect((await run([...ARGS, '--format', 'json'])).stdout).toBe(plain.stdout);
    expect((await run([...ARGS, '--format', 'json', '--pretty'])).stdout).toBe(JSON.stringify(track, null, 2) + '\n');
  });

  it('svg prints the drawing; --width and --heat reach it', async () => {
    expect(await run([...ARGS, '--format', 'svg'])).toMatchObject({ code: 0, stdout: trackToSvg(track), stderr: '' });
    expect((await run([...ARGS, '--format', 'svg', '--width', '600', '--heat'])).stdout).toBe(trackToSvg(track, { widthPx: 600, heat: true }));
  });

  it('csv prints the centerline table, or the gates with --table gates', async () => {
    const centerline = await run([...ARGS, '--format', 'csv']);
    expect(centerline).toMatchObject({ code: 0, stdout: trackToCsv(track), stderr: '' });
    expect(centerline.stdout.split('\n')).toHaveLength(track.centerline.points.length + 2);
    const gates = await run([...ARGS, '--format', 'csv', '--table', 'gates']);
    expect(gates.stdout).toBe(trackToCsv(track, { table: 'gates' }));
    expect(gates.stdout.split('\n')).toHaveLength(track.gates.length + 2);
  });

  it('glb goes to --out as bytes, identical to the export, and validates', async () => {
    const out = join(dir, 'track.glb');
    expect(await run([...ARGS, '--format', 'glb', '--out', out])).toMatchObject({ code: 0, stdout: '', stderr: '' });
    const bytes = await readFile(out);
    expect(bytes.equals(Buffer.from(await trackToGlb(track)))).toBe(true);
    const report = await validateBytes(new Uint8Array(bytes), { maxIssues: 0, writeTimestamp: false });
    expect([report.issues.numErrors, report.issues.numWarnings]).toEqual([0, 0]);
  });

  it('glb goes to a stdout that is not a terminal as raw bytes', async () => {
    const r = await run([...ARGS, '--format', 'glb']);
    expect(r.code).toBe(0);
    expect(r.bytes.equals(Buffer.from(await trackToGlb(track)))).toBe(true);
    expect(r.bytes.subarray(0, 4).toString('latin1')).toBe('glTF');
  });

  it('glb to a terminal is refused with exit 2 and a way out, before any work', async () => {
    const message = 'lapwright generate: refusing to write binary glb to a terminal: give --out FILE or redirect stdout (lapwright generate --format glb > track.glb)\n';
    for (const argv of [[...ARGS, '--format', 'glb'], [...ARGS, '--format', 'glb', '--out', '-']]) {
      expect(await run(argv, { ttyStdout: true })).toMatchObject({ code: 2, stdout: '', stderr: message });
    }
    // text formats and files are fine with a terminal
    expect((await run([...ARGS, '--format', 'csv', '--table', 'gates'], { ttyStdout: true })).code).toBe(0);
    const out = join(dir, 'tty.glb');
    expect((await run([...ARGS, '--format', 'glb', '--out', out], { ttyStdout: true })).code).toBe(0);
  });

  it.each([
    [['--format', 'obj'], 'lapwright generate: --format must be one of json, glb, svg, csv, got "obj"'],
    [['--format', 'json', '--table', 'gates'], 'lapwright generate: --table applies to --format csv, not json'],
    [['--table', 'gates'], 'lapwright generate: --table applies to --format csv, not json'],
    [['--format', 'glb', '--pretty'], 'lapwright generate: --pretty applies to --format json, not glb'],
    [['--format', 'csv', '--heat'], 'lapwright generate: --heat applies to --format svg, not csv'],
    [['--format', 'csv', '--table', 'corners'], 'lapwright generate: --table must be one of centerline, gates, got "corners"'],
    [['--format', 'svg', '--width', '100'], 'lapwright generate: --width must be a whole number of pixels from 200 to 4000, got "100"'],
    [['--format', 'svg', '--width', '6e2'], 'lapwright generate: --width must be a whole number of pixels from 200 to 4000, got "6e2"'],
    [['--format'], "lapwright generate: Option '--format <value>' argument missing (see lapwright generate --help)"],
  ])('%j is malformed input: exit 2 with one line', async (extra, line) => {
    expect(await run([...ARGS, ...extra])).toMatchObject({ code: 2, stdout: '', stderr: line + '\n' });
  });

  it('--help lists the formats and their options', async () => {
    const help = (await run(['generate', '--help'])).stdout;
    expect(help).toContain('[--format json|glb|svg|csv]');
    for (const flag of ['--format F', '--table T', '--width PX', '--heat', '--pretty']) expect(help).toContain(`  ${flag}`);
  });
});
