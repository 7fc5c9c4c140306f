// The built service (node dist/src/server/main.js) in its own process on a loopback port, for the
// benchmarks and the load run: spawned, then waited for until /readyz answers 200.
import { type ChildProcess, spawn } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { freePort } from './free-port.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

export interface BuiltServer {
  readonly base: string;
  readonly child: ChildProcess;
}

/**
 * Starts the built entry with `env` (PORT, HOST and LOG_LEVEL=warn added: per-request log lines
 * would be part of what is measured).
 * @param stdio 'inherit' shows the server's output; 'pipe' leaves it to the caller
 */
export async function startBuiltServer(env: NodeJS.ProcessEnv, stdio: 'inherit' | 'pipe' = 'inherit'): Promise<BuiltServer> {
  const port = await freePort();
  const child = spawn(process.execPath, ['dist/src/server/main.js'], {
    cwd: ROOT,
    env: { ...env, PORT: String(port), HOST: '127.0.0.1', LOG_LEVEL: 'warn' },
    stdio: ['ignore', stdio, stdio],
  });
  return { base: `http://127.0.0.1:${port}`, child };
}

/** Waits until GET /readyz answers 200 (every 100 ms, at most `timeoutS`) and returns its body. */
export async function waitReady(base: string, timeoutS = 30): Promise<{ workers: number; maxQueue: number }> {
  for (let i = 0; i < timeoutS * 10; i++) {
    try {
      const r = await fetch(`${base}/readyz`);
      if (r.status === 200) return (await r.json()) as { workers: number; maxQueue: number };
    } catch {
      // not listening yet
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`${base} did not become ready within ${timeoutS} s`);
}
