// Tests for src/cli/serve.ts: `lapwright serve` (help and bad input in-process; a real run in a child process).

import { spawn } from 'node:child_process';
import { Readable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

async function run(argv: string[], env: Record<string, string> = {}): Promise<{ code: number; stdout: string; stderr: string }> {
  let stdout = '';
  let stderr = '';
  const sink = (append: (s: string) => void) => ({
    write(chunk: string, callback: (error?: Error | null) => void): boolean {
      append(chunk);
      callback();
      return true;
    },
  });
  const code = await runCli(argv, { stdout: sink((s) => (stdout += s)), stderr: sink((s) => (stderr += s)), stdin: Readable.from(['']), env });
  return { code, stdout, stderr };
}

describe('lapwright serve', () => {
  it('--help lists the flags, every environment variable and the exit codes', async () => {
    const r = await run(['serve', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^Usage: lapwright serve \[--port N\] \[--host ADDRESS\]/);
    for (const name of ['PORT', 'HOST', 'LOG_LEVEL', 'LAPWRIGHT_WORKERS', 'LAPWRIGHT_MAX_QUEUE', 'LAPWRIGHT_DEADLINE_MS', 'LAPWRIGHT_BODY_LIMIT_BYTES', 'LAPWRIGHT_TRACK_BODY_LIMIT_BYTES', 'LAPWRIGHT_RETRY_AFTER_S', 'LAPWRIGHT_SHUTDOWN_TIMEOUT_MS']) {
      expect(r.stdout).toContain(`\n  ${name} `);
    }
  });

  it('exit 2 for a bad flag, an argument, or a bad variable', async () => {
    expect(await run(['serve', '--port', 'x'])).toEqual({ code: 2, stdout: '', stderr: 'lapwright serve: invalid configuration: --port / PORT must be an integer from 0 to 65535, got "x"\n' });
    expect(await run(['serve', 'now'])).toEqual({ code: 2, stdout: '', stderr: 'lapwright serve: serve takes no arguments, got "now" (see lapwright serve --help)\n' });
    expect(await run(['serve'], { LAPWRIGHT_WORKERS: 'many' })).toEqual({ code: 2, stdout: '', stderr: 'lapwright serve: invalid configuration: LAPWRIGHT_WORKERS must be an integer from 1 to 256, got "many"\n' });
    expect((await run(['serve', '--verbose'])).stderr).toBe('lapwright serve: unknown option --verbose (see lapwright serve --help)\n');
  });

  it('listens on the given port and exits 0 after SIGTERM', async () => {
    const script = "import { runCli } from './src/cli/main.ts'; process.exit(await runCli(process.argv.slice(1), { stdout: process.stdout, stderr: process.stderr, stdin: process.stdin, env: process.env }));";
    const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script, 'serve', '--port', '0', '--host', '127.0.0.1'], { cwd: ROOT, env: { ...process.env, LAPWRIGHT_WORKERS: '1' }, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d: Buffer) => (out += d.toString()));
    child.stderr.on('data', (d: Buffer) => (out += d.toString()));
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    try {
      await expect.poll(() => /Server listening at (http:\/\/127\.0\.0\.1:\d+)/.exec(out)?.[1], { timeout: 30_000 }).toBeDefined();
      const url = /Server listening at (http:\/\/127\.0\.0\.1:\d+)/.exec(out)![1];
      expect((await fetch(`${url}/healthz`)).status).toBe(200);
      child.kill('SIGTERM');
      expect(await exited).toBe(0);
      expect(out).toContain('shut down cleanly');
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL');
    }
  });
});
