// Tests for src/cli/verify.ts: a dataset made again and compared, tampering caught, a test set proved disjoint from and novel against a train set.

import { mkdtemp, readFile, rm, unlink, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import type { Manifest } from '../../src/core/index.js';

function capture() {
  const sink = {
    text: '',
    write(chunk: string | Uint8Array, callback: (error?: Error | null) => void): boolean {
      sink.text += typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString();
      callback();
      return true;
    },
  };
  return sink;
}

async function run(argv: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const stdout = capture();
  const stderr = capture();
  const code = await runCli(argv, { stdout, stderr, stdin: Readable.from(['']) });
  return { code, stdout: stdout.text, stderr: stderr.text };
}

let dir: string;
let ranges: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lapwright-verify-'));
  ranges = join(dir, 'ranges.json');
  await writeFile(ranges, JSON.stringify({ lengthM: { min: 600, max: 900 }, curvatureBudgetDeg: { min: 500, max: 700 }, cornerCount: { min: 5, max: 6 } }));
  // the Larkspur sim team's train set and its held-out test set, novel against it
  const common = ['--params', ranges, '--workers', '0', '--quiet'];
  expect((await run(['batch', '--count', '4', '--split', 'train', '--base-seed', 'larkspur-train', '--out', join(dir, 'train'), ...common])).code).toBe(0);
  expect((await run(['batch', '--count', '3', '--split', 'test', '--base-seed', 'larkspur-test', '--out', join(dir, 'test'), '--min-novelty', '0.5', '--reference', join(dir, 'train', 'manifest.json'), ...common])).code).toBe(0);
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('lapwright verify', () => {
  it('an untouched dataset: every track made again matches its id and its file; exit 0', async () => {
    // on a worker thread here; the other tests make tracks in the test's own thread (--workers 0)
    expect(await run(['verify', join(dir, 'train', 'manifest.json'), '--workers', '1', '--quiet'])).toEqual({ code: 0, stdout: '', stderr: 'lapwright verify: all 4 tracks match\n' });
  });

  it('the test set is disjoint from and novel against the train set; the train set against itself is neither', async () => {
    const ok = await run(['verify', join(dir, 'test', 'manifest.json'), '--reference', join(dir, 'train', 'manifest.json'), '--workers', '0', '--quiet']);
    expect([ok.code, ok.stdout]).toEqual([0, '']);
    const self = await run(['verify', join(dir, 'train', 'manifest.json'), '--reference', join(dir, 'train', 'manifest.json'), '--min-novelty', '0.5', '--workers', '0', '--quiet']);
    expect(self.code).toBe(4);
    expect(self.stdout).toContain('track 0 (track-000000.json): seed ');
    expect(self.stdout).toContain('is also in the reference');
    expect(self.stdout).toContain('track 0 (track-000000.json): the same track is also in the reference');
    expect(self.stdout).toMatch(/track 0 \(track-000000\.json\): turning distance 0\.0000 to reference track 0 is below 0\.5/);
  });

  it('any edit is caught and named: a file changed by one character, a file missing, an id changed in the manifest', async () => {
    const out = join(dir, 'tampered');
    expect((await run(['batch', '--count', '3', '--base-seed', 'larkspur-tamper', '--out', out, '--params', ranges, '--workers', '0', '--quiet'])).code).toBe(0);
    const path = join(out, 'manifest.json');
    const manifest = JSON.parse(await readFile(path, 'utf8')) as Manifest;
    // a hand edit: one digit of one coordinate
    const file0 = join(out, 'track-000000.json');
    const text = await readFile(file0, 'utf8');
    const at = text.indexOf('"points":[[') + 12;
    await writeFile(file0, text.slice(0, at) + (text[at] === '1' ? '2' : '1') + text.slice(at + 1));
    await unlink(join(out, 'track-000001.json'));
    const edited = { ...manifest, tracks: manifest.tracks.map((t) => (t.index === 2 ? { ...t, id: '0'.repeat(64) } : t)) };
    await writeFile(path, JSON.stringify(edited, null, 2));
    const r = await run(['verify', path, '--workers', '0', '--quiet']);
    expect(r.code).toBe(4);
    const lines = r.stdout.trimEnd().split('\n');
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/^track 0 \(track-000000\.json\): file differs from the re-made track \(\d+ bytes on disk, \d+ made again\)$/);
    expect(lines[1]).toMatch(/^track 1 \(track-000001\.json\): file missing or unreadable: /);
    expect(lines[2]).toBe(`track 2 (track-000002.json): id ${'0'.repeat(64)} in the manifest, ${manifest.tracks[2].id} made again from its params`);
    expect(r.stderr).toBe('lapwright verify: 3 mismatches in 3 tracks (listed on stdout)\n');
  });

  it('params or a seed edited in the manifest are named too', async () => {
    const manifest = JSON.parse(await readFile(join(dir, 'train', 'manifest.json'), 'utf8')) as Manifest;
    const edited = { ...manifest, tracks: manifest.tracks.map((t) => (t.index === 1 ? { ...t, seed: 12345 } : t)) };
    const path = join(dir, 'train', 'edited.json');
    await writeFile(path, JSON.stringify(edited));
    const r = await run(['verify', path, '--workers', '0', '--quiet']);
    expect(r.code).toBe(4);
    expect(r.stdout).toContain('track 1 (track-000001.json): seed 12345 is not draw ');
    expect(r.stdout).toContain("track 1 (track-000001.json): params are not the batch's ranges drawn from the track's seed");
  });

  it('a file that is not a manifest is input error 2', async () => {
    const r = await run(['verify', ranges]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^lapwright verify: manifest .* is not a lapwright\.manifest\/1 manifest\n  format: /);
  });
});
