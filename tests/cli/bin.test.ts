// Tests for bin/lapwright.js: the real process (build, bin, pipes, exit codes), not just runCli.
// The build goes to a temporary folder laid out like the package, so the repository's dist/ is untouched.

import { spawnSync } from 'node:child_process';
import { copyFile, mkdir, mkdtemp, rm, stat, symlink } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateTrack } from '../../src/core/index.js';

const REPO = resolve(import.meta.dirname, '../..');
let pkgDir: string;

beforeAll(async () => {
  pkgDir = await mkdtemp(join(tmpdir(), 'lapwright-bin-'));
  // the build may report type errors of unrelated work in progress; it still emits, and the tests below say whether the CLI runs
  const build = spawnSync(process.execPath, [join(REPO, 'node_modules/typescript/bin/tsc'), '-p', join(REPO, 'tsconfig.build.json'), '--outDir', join(pkgDir, 'dist')], { encoding: 'utf8' });
  await stat(join(pkgDir, 'dist/src/cli/main.js')).catch(() => {
    throw new Error(`build did not emit dist/src/cli/main.js:\n${build.stdout}${build.stderr}`);
  });
  await mkdir(join(pkgDir, 'bin'));
  await copyFile(join(REPO, 'bin/lapwright.js'), join(pkgDir, 'bin/lapwright.js'));
  await copyFile(join(REPO, 'package.json'), join(pkgDir, 'package.json'));
  await symlink(join(REPO, 'node_modules'), join(pkgDir, 'node_modules'), 'dir');
});

afterAll(async () => {
  await rm(pkgDir, { recursive: true, force: true });
});

function lapwright(args: string[], input?: string) {
  const r = spawnSync(process.execPath, [join(pkgDir, 'bin/lapwright.js'), ...args], { input, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('bin/lapwright.js', () => {
  it('--version exits 0 with the version on stdout', () => {
    const r = lapwright(['--version']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^lapwright \d+\.\d+\.\d+ \(generatorVersion [^)]+\)\n$/);
  });

  it('a bad flag exits 2 with one line on stderr', () => {
    expect(lapwright(['generate', '--colour'])).toEqual({ code: 2, stdout: '', stderr: 'lapwright generate: unknown option --colour (see lapwright generate --help)\n' });
  });

  it('an infeasible request exits 3', () => {
    const r = lapwright(['generate', '--set', 'turnBalance=0']);
    expect(r.code).toBe(3);
    expect(r.stderr).toMatch(/^lapwright generate: infeasible request \(ERR_INFEASIBLE, reason turning_vs_balance\)\n.*\nhint: /);
  });

  it('a whole track goes through the stdout pipe (process.exit does not cut it) and validates from stdin', () => {
    const generated = lapwright(['generate', '--seed', '7']);
    expect(generated.code).toBe(0);
    expect(generated.stdout).toBe(JSON.stringify(generateTrack({ seed: 7 })) + '\n');
    expect(lapwright(['validate', '-'], generated.stdout)).toEqual({ code: 0, stdout: '{"valid":true,"issues":[]}\n', stderr: '' });
  });

  it('a glb goes through the stdout pipe as raw bytes (GLB header: magic, version 2, total length)', () => {
    const r = spawnSync(process.execPath, [join(pkgDir, 'bin/lapwright.js'), 'generate', '--seed', '7', '--set', 'lengthM=600', '--format', 'glb'], { maxBuffer: 64 * 1024 * 1024 });
    expect(r.status).toBe(0);
    expect(r.stdout.subarray(0, 4).toString('latin1')).toBe('glTF');
    expect(r.stdout.readUInt32LE(4)).toBe(2);
    expect(r.stdout.readUInt32LE(8)).toBe(r.stdout.length);
  });

  // util-linux's script(1) gives the command a pseudo-terminal as stdout
  const hasScript = spawnSync('script', ['--version']).status === 0;
  it.skipIf(!hasScript)('a glb to a terminal is refused: exit 2 and the message, no bytes', () => {
    const command = [process.execPath, join(pkgDir, 'bin/lapwright.js'), 'generate', '--seed', '7', '--format', 'glb'].map((a) => `'${a}'`).join(' ');
    const r = spawnSync('script', ['-qec', command, '/dev/null'], { encoding: 'utf8', input: '' });
    expect(r.status).toBe(2);
    expect(r.stdout.replace(/\r/g, '')).toBe('lapwright generate: refusing to write binary glb to a terminal: give --out FILE or redirect stdout (lapwright generate --format glb > track.glb)\n');
  });
});
