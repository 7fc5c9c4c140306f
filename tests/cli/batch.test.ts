// Tests for src/cli/batch.ts: datasets on disk, shards, merge, progress; run in-process with captured streams.

import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { formatSeconds } from '../../src/cli/progress.js';
import { runCli } from '../../src/cli/main.js';
import { generateTrack, type Manifest, splitOf } from '../../src/core/index.js';
import { trackToSvg } from '../../src/export/index.js';

function capture(isTTY = false) {
  const sink = {
    text: '',
    isTTY,
    write(chunk: string | Uint8Array, callback: (error?: Error | null) => void): boolean {
      sink.text += typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString();
      callback();
      return true;
    },
  };
  return sink;
}

async function run(argv: string[], tty = false): Promise<{ code: number; stdout: string; stderr: string }> {
  const stdout = capture();
  const stderr = capture(tty);
  const code = await runCli(argv, { stdout, stderr, stdin: Readable.from(['']) });
  return { code, stdout: stdout.text, stderr: stderr.text };
}

let dir: string;
let ranges: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lapwright-batch-'));
  // the Larkspur sim team's short training laps
  ranges = join(dir, 'ranges.json');
  await writeFile(ranges, JSON.stringify({ lengthM: { min: 600, max: 900 }, curvatureBudgetDeg: { min: 500, max: 700 }, cornerCount: { min: 5, max: 6 } }));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

const readManifest = async (path: string) => JSON.parse(await readFile(path, 'utf8')) as Manifest;

describe('lapwright batch', () => {
  it('writes one file per track and manifest.json; each file is the track of its manifest entry; plain progress lines off a terminal', async () => {
    const out = join(dir, 'single');
    const r = await run(['batch', '--count', '5', '--split', 'test', '--params', ranges, '--base-seed', 'larkspur-night-2', '--out', out, '--workers', '1']);
    expect(r.code).toBe(0);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^lapwright batch: 1\/5 tracks \(20%\), [\d.]+ tracks\/s, ETA /);
    expect(r.stderr).toMatch(/lapwright batch: 5\/5 tracks \(100%\), [\d.]+ tracks\/s, ETA 0 s\n/);
    expect(r.stderr).toMatch(/lapwright batch: wrote 5 json track files and .*manifest\.json in [\d.]+ s \([\d.]+ tracks\/s, 1 worker\); redrawn \d+, skipped: split \d+, difficulty 0, novelty 0\n$/);
    expect((await readdir(out)).sort()).toEqual(['manifest.json', 'track-000000.json', 'track-000001.json', 'track-000002.json', 'track-000003.json', 'track-000004.json']);
    const manifest = await readManifest(join(out, 'manifest.json'));
    expect(manifest).toMatchObject({ format: 'lapwright.manifest/1', split: 'test', output: { format: 'json' }, shard: null, request: { count: 5, baseSeed: 'larkspur-night-2' } });
    for (const entry of manifest.tracks) {
      const text = await readFile(join(out, entry.file!), 'utf8');
      const track = JSON.parse(text);
      expect(track.id).toBe(entry.id);
      expect(splitOf(track.seed)).toBe('test');
      // the file is exactly what generate writes for the recorded params
      expect(text).toBe(JSON.stringify(generateTrack(entry.params)) + '\n');
    }
  });

  it('--shard i/n on n runs, then --merge: the same files and the same manifest.json, byte for byte, as the one-machine run', async () => {
    const out = join(dir, 'sharded');
    for (const shard of ['0/3', '1/3', '2/3']) {
      expect((await run(['batch', '--count', '5', '--split', 'test', '--params', ranges, '--base-seed', 'larkspur-night-2', '--out', out, '--workers', '0', '--shard', shard, '--quiet'])).code).toBe(0);
    }
    const shard1 = await readManifest(join(out, 'manifest.shard-1-of-3.json'));
    expect(shard1.tracks.map((t) => t.index)).toEqual([1, 4]);
    expect(shard1.shard).toEqual({ index: 1, count: 3 });
    const merged = await run(['batch', '--merge', '--out', out]);
    expect([merged.code, merged.stderr]).toEqual([0, `lapwright batch: merged 3 shard manifests (5 tracks) into ${join(out, 'manifest.json')}\n`]);
    const single = join(dir, 'single');
    expect(await readFile(join(out, 'manifest.json'), 'utf8')).toBe(await readFile(join(single, 'manifest.json'), 'utf8'));
    for (const name of (await readdir(single)).filter((n) => n.startsWith('track-'))) {
      expect((await readFile(join(out, name))).equals(await readFile(join(single, name)))).toBe(true);
    }
  });

  it('--format svg writes drawings of the same tracks; a terminal gets a redrawn bar', async () => {
    const out = join(dir, 'svg');
    const r = await run(['batch', '--count', '2', '--params', ranges, '--base-seed', 5, '--out', out, '--workers', '0', '--format', 'svg'].map(String), true);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/^\rlapwright batch \[#*\.*\] \d\/2 tracks/);
    const manifest = await readManifest(join(out, 'manifest.json'));
    expect(manifest.tracks.map((t) => t.file)).toEqual(['track-000000.svg', 'track-000001.svg']);
    expect(await readFile(join(out, 'track-000001.svg'), 'utf8')).toBe(trackToSvg(generateTrack(manifest.tracks[1].params)));
  });

  it('input errors exit 2 with one line each', async () => {
    const cases: [string[], string][] = [
      [['batch'], 'lapwright batch: --count is required (see lapwright batch --help)'],
      [['batch', '--count', '3', '--shard', '3/3'], 'lapwright batch: --shard must be i/n with 0 <= i < n (shard i of n, counted from 0, as a Kubernetes Indexed Job\'s JOB_COMPLETION_INDEX), got "3/3"'],
      [['batch', '--count', '3', '--shard', '0/2', '--min-novelty', '0.3'], 'lapwright batch: --shard cannot be used with --min-novelty: novelty within a batch is decided track by track in index order, which one machine must see whole; make novel sets on one machine with --workers'],
      [['batch', '--count', '3', '--format', 'csv'], 'lapwright batch: --format must be one of json, glb, svg, got "csv"'],
      [['batch', '--count', '3', '--out', join(dir, 'single')], `lapwright batch: ${join(dir, 'single', 'manifest.json')} already exists: choose another --out directory, or give --force to write over it`],
    ];
    for (const [argv, line] of cases) expect(await run(argv)).toEqual({ code: 2, stdout: '', stderr: `${line}\n` });
    const bad = await run(['batch', '--count', '0', '--split', 'holdout']);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toBe('lapwright batch: invalid batch (ERR_INVALID_PARAMS)\n  count: expected an integer from 1 to 1048576, got 0\n  split: expected one of train, validation, test, got "holdout"\n');
  });

  it('parameters that are never feasible exit 3 with the reason and hint', async () => {
    const params = join(dir, 'one-way.json');
    await writeFile(params, JSON.stringify({ turnBalance: 0, curvatureBudgetDeg: 900, cornerCount: 9 }));
    const r = await run(['batch', '--count', '2', '--params', params, '--out', join(dir, 'never'), '--workers', '0', '--quiet']);
    expect(r.code).toBe(3);
    expect(r.stderr.split('\n')[0]).toBe('lapwright batch: infeasible request (ERR_INFEASIBLE, reason turning_vs_balance)');
  });
});

describe('formatSeconds', () => {
  it('reads as seconds, minutes or hours', () => {
    expect([formatSeconds(7.4), formatSeconds(59.6), formatSeconds(192), formatSeconds(3900), formatSeconds(Infinity)]).toEqual(['7 s', '1 min 00 s', '3 min 12 s', '1 h 05 min', '?']);
  });
});
