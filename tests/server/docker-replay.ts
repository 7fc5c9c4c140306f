/**
 * Replays the Dockerfile without a container daemon (`npm run docker:check`): each stage gets a
 * folder of its own standing for its filesystem root, and the Dockerfile's own instructions run
 * in order — COPY from a clean copy of the build context (.dockerignore applied) or from an
 * earlier stage, RUN in the stage's WORKDIR with its ENV — then the final stage's CMD starts on
 * a free loopback port, its HEALTHCHECK command must pass, GET /healthz must answer 200, and
 * SIGTERM must end it with exit 0.
 *
 * What it cannot show: the base image itself (this machine's Node stands in for node:20-slim,
 * so the Node majors are compared), and USER (the steps run as the current user; the check
 * only makes sure the image does not run as root).
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { cp, mkdir, mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { isAbsolute, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort } from '../helpers/free-port.js';

/** How long the started server may take to log that it listens, ms. */
const START_TIMEOUT_MS = 30_000;
/** How long the server may take to exit after SIGTERM, ms. */
const STOP_TIMEOUT_MS = 30_000;

export interface ReplayOptions {
  /** The build context (the repository root). */
  readonly contextDir: string;
  /** Progress lines. */
  readonly log: (line: string) => void;
  /** Keep the temporary folder for inspection. */
  readonly keep?: boolean;
  /** Show the output of RUN steps as they go (failures always show its end). */
  readonly echo?: boolean;
}

export interface ReplayReport {
  readonly stages: readonly string[];
  readonly steps: number;
  readonly user: string | null;
  readonly exposed: readonly string[];
  readonly healthz: unknown;
  readonly exitCode: number | null;
}

interface Instruction {
  readonly op: string;
  readonly args: string;
  readonly line: number;
}

interface Stage {
  readonly name: string;
  readonly image: string;
  readonly root: string;
  workdir: string;
  env: Record<string, string>;
  user: string | null;
  exposed: string[];
  healthcheck: string[] | null;
  cmd: string[] | null;
}

/**
 * Replays the Dockerfile in `contextDir`.
 * @throws Error naming the Dockerfile line whose step failed
 */
export async function replayDockerfile(options: ReplayOptions): Promise<ReplayReport> {
  const { contextDir, log } = options;
  const instructions = parseDockerfile(await readFile(join(contextDir, 'Dockerfile'), 'utf8'));
  const work = await mkdtemp(join(tmpdir(), 'lapwright-docker-'));
  try {
    const context = join(work, 'context');
    const ignore = parseDockerignore(await readFile(join(contextDir, '.dockerignore'), 'utf8').catch(() => ''));
    await cp(contextDir, context, { recursive: true, filter: (src) => !isIgnored(relative(contextDir, src), ignore) });
    log(`context: ${contextDir} copied to ${context} (.dockerignore: ${ignore.join(', ')})`);

    const stages: Stage[] = [];
    let steps = 0;
    for (const ins of instructions) {
      const stage = stages[stages.length - 1];
      const where = `Dockerfile line ${ins.line} (${ins.op} ${ins.args.slice(0, 60)})`;
      if (ins.op === 'FROM') {
        const m = /^(\S+)(?:\s+AS\s+(\S+))?$/i.exec(ins.args);
        if (!m) throw new Error(`${where}: cannot read FROM`);
        checkBaseImage(m[1], log);
        const name = m[2] ?? String(stages.length);
        const root = join(work, 'stages', name);
        await mkdir(root, { recursive: true });
        stages.push({ name, image: m[1], root, workdir: '/', env: {}, user: null, exposed: [], healthcheck: null, cmd: null });
        log(`stage ${name} from ${m[1]}`);
        continue;
      }
      if (stage === undefined) throw new Error(`${where}: an instruction before FROM`);
      steps++;
      switch (ins.op) {
        case 'WORKDIR':
          stage.workdir = ins.args.startsWith('/') ? ins.args : join(stage.workdir, ins.args);
          await mkdir(inStage(stage, stage.workdir), { recursive: true });
          break;
        case 'ENV':
          Object.assign(stage.env, parseEnv(ins.args));
          break;
        case 'COPY':
          await copyStep(ins.args, stage, stages, context, where);
          break;
        case 'RUN': {
          const started = Date.now();
          log(`RUN ${ins.args}`);
          const { code, output } = await runStep(ins.args, stage, options.echo ?? false);
          if (code !== 0) throw new Error(`${where}: exited with ${code}:\n${output.slice(-4000)}`);
          log(`  done in ${((Date.now() - started) / 1000).toFixed(1)} s`);
          break;
        }
        case 'USER':
          stage.user = ins.args;
          break;
        case 'EXPOSE':
          stage.exposed.push(...ins.args.split(/\s+/));
          break;
        case 'HEALTHCHECK':
          stage.healthcheck = parseExecForm(ins.args.replace(/^(--\S+\s+)*CMD\s+/, ''), where);
          break;
        case 'CMD':
          stage.cmd = parseExecForm(ins.args, where);
          break;
        default:
          throw new Error(`${where}: the replay does not know ${ins.op}`);
      }
    }

    const final = stages[stages.length - 1];
    if (final.user === null || final.user === 'root' || final.user === '0') throw new Error(`the final stage must run as a non-root USER, got ${final.user ?? 'none'}`);
    if (final.cmd === null) throw new Error('the final stage has no CMD');
    if (final.healthcheck === null) throw new Error('the final stage has no HEALTHCHECK');
    const { healthz, exitCode } = await startAndStop(final, log);
    return { stages: stages.map((s) => s.name), steps, user: final.user, exposed: final.exposed, healthz, exitCode };
  } finally {
    if (options.keep) log(`kept ${work}`);
    else await rm(work, { recursive: true, force: true });
  }
}

// start CMD on a free loopback port, pass HEALTHCHECK, GET /healthz and the preview page, then SIGTERM
async function startAndStop(stage: Stage, log: (line: string) => void): Promise<{ healthz: unknown; exitCode: number | null }> {
  const port = await freePort();
  // HOST=0.0.0.0 in the image; here only loopback is ever used
  const env = { ...stage.env, PORT: String(port), HOST: '127.0.0.1' };
  const [command, ...args] = stage.cmd!;
  log(`CMD ${stage.cmd!.join(' ')} (PORT=${port}, HOST=127.0.0.1)`);
  const child = spawn(command, args, { cwd: inStage(stage, stage.workdir), env: baseEnv(env), stdio: ['ignore', 'pipe', 'pipe'] });
  let output = '';
  child.stdout!.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (output += d.toString()));
  const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
  try {
    await waitFor(() => output.includes('Server listening at'), START_TIMEOUT_MS, () => `the server did not start:\n${output}`);
    const [hcCommand, ...hcArgs] = stage.healthcheck!;
    let healthy = false;
    for (let i = 0; i < 20 && !healthy; i++) {
      healthy = (await runProcess(hcCommand, hcArgs, inStage(stage, stage.workdir), env, false)).code === 0;
      if (!healthy) await sleep(250);
    }
    if (!healthy) throw new Error(`the HEALTHCHECK command kept failing:\n${output}`);
    log('HEALTHCHECK passed');
    const res = await fetch(`http://127.0.0.1:${port}/healthz`);
    const healthz: unknown = await res.json();
    if (res.status !== 200) throw new Error(`GET /healthz answered ${res.status}`);
    log(`GET /healthz: ${res.status} ${JSON.stringify(healthz)}`);
    await checkPreviewPage(`http://127.0.0.1:${port}`, log);
    child.kill('SIGTERM');
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<'timeout'>((resolve) => (timer = setTimeout(() => resolve('timeout'), STOP_TIMEOUT_MS)));
    const exitCode = await Promise.race([exited, timeout]);
    clearTimeout(timer);
    if (exitCode === 'timeout') throw new Error(`no exit within ${STOP_TIMEOUT_MS} ms of SIGTERM:\n${output}`);
    log(`SIGTERM: exit ${exitCode}`);
    return { healthz, exitCode };
  } finally {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  }
}

// the preview page and every asset it links to are in the image (npm run build copies src/web)
async function checkPreviewPage(base: string, log: (line: string) => void): Promise<void> {
  const page = await fetch(`${base}/`);
  const html = await page.text();
  if (page.status !== 200 || !(page.headers.get('content-type') ?? '').startsWith('text/html')) throw new Error(`GET / answered ${page.status} ${page.headers.get('content-type')}`);
  const assets = [...html.matchAll(/(?:src|href)="(\/assets\/[^"]+)"/g)].map((m) => m[1]);
  if (assets.length === 0) throw new Error('GET / links to no asset under /assets/');
  for (const asset of assets) {
    const res = await fetch(`${base}${asset}`);
    await res.arrayBuffer();
    if (res.status !== 200) throw new Error(`GET ${asset} answered ${res.status}`);
  }
  log(`GET / and its assets (${assets.join(', ')}): 200`);
}

async function copyStep(args: string, stage: Stage, stages: readonly Stage[], context: string, where: string): Promise<void> {
  const words = args.split(/\s+/);
  let from: Stage | null = null;
  while (words[0]?.startsWith('--')) {
    const flag = words.shift()!;
    if (flag.startsWith('--from=')) {
      const name = flag.slice('--from='.length);
      from = stages.find((s) => s.name === name) ?? null;
      if (from === null) throw new Error(`${where}: no stage ${name}`);
    } else if (!flag.startsWith('--chown=') && !flag.startsWith('--chmod=')) {
      throw new Error(`${where}: the replay does not know ${flag}`);
    }
  }
  const dest = words.pop()!;
  const destPath = inStage(stage, dest.startsWith('/') ? dest : join(stage.workdir, dest));
  for (const src of words) {
    const srcPath = from === null ? join(context, src) : inStage(from, src.startsWith('/') ? src : join(from.workdir, src));
    const target = dest.endsWith('/') ? join(destPath, src.split('/').pop()!) : destPath;
    await cp(srcPath, target, { recursive: true }).catch((err: Error) => {
      throw new Error(`${where}: ${err.message}`);
    });
  }
}

function runStep(command: string, stage: Stage, echo: boolean): Promise<{ code: number | null; output: string }> {
  const exec = command.trimStart().startsWith('[') ? parseExecForm(command, 'RUN') : ['sh', '-c', command];
  return runProcess(exec[0], exec.slice(1), inStage(stage, stage.workdir), stage.env, echo);
}

function runProcess(command: string, args: readonly string[], cwd: string, env: Record<string, string>, echo: boolean): Promise<{ code: number | null; output: string }> {
  return new Promise((resolve) => {
    let output = '';
    const child: ChildProcess = spawn(command, args, { cwd, env: baseEnv(env), stdio: ['ignore', 'pipe', 'pipe'] });
    const take = (d: Buffer): void => {
      output += d.toString();
      if (echo) process.stdout.write(d);
    };
    child.stdout!.on('data', take);
    child.stderr!.on('data', take);
    child.on('error', (err) => resolve({ code: -1, output: err.message }));
    child.on('close', (code) => resolve({ code, output }));
  });
}

// what a container sees: the Dockerfile's ENV over a minimal environment (npm may use its cache)
function baseEnv(env: Record<string, string>): Record<string, string> {
  const keep = ['PATH', 'HOME', 'TMPDIR', 'LANG', 'npm_config_cache'];
  const base: Record<string, string> = { npm_config_prefer_offline: 'true', npm_config_update_notifier: 'false' };
  for (const k of keep) if (process.env[k] !== undefined) base[k] = process.env[k]!;
  return { ...base, ...env };
}

function inStage(stage: Stage, path: string): string {
  return join(stage.root, isAbsolute(path) ? path.slice(1) : path);
}

function checkBaseImage(image: string, log: (line: string) => void): void {
  const m = /^node:(\d+)/.exec(image);
  if (!m) throw new Error(`the replay stands this machine's Node in for ${image}; it only knows node:<major> images`);
  const here = process.versions.node.split('.')[0];
  if (m[1] !== here) throw new Error(`the Dockerfile builds on Node ${m[1]} but this machine runs Node ${here}: the replay would not show the image works`);
  log(`base image ${image}: standing in with this machine's Node ${process.versions.node}`);
}

/** Instructions with continuation lines joined and comments dropped. */
export function parseDockerfile(text: string): Instruction[] {
  const out: Instruction[] = [];
  let pending = '';
  let start = 0;
  text.split('\n').forEach((raw, i) => {
    const line = raw.trimEnd();
    if (pending === '' && (line.trim() === '' || line.trim().startsWith('#'))) return;
    if (pending === '') start = i + 1;
    if (line.endsWith('\\')) {
      pending += `${line.slice(0, -1)} `;
      return;
    }
    const full = (pending + line).trim();
    pending = '';
    const space = full.search(/\s/);
    out.push({ op: full.slice(0, space).toUpperCase(), args: full.slice(space + 1).trim(), line: start });
  });
  return out;
}

function parseExecForm(args: string, where: string): string[] {
  let parsed: unknown;
  try {
    parsed = JSON.parse(args);
  } catch {
    throw new Error(`${where}: expected the exec form ["cmd", "arg", ...], got ${args}`);
  }
  if (!Array.isArray(parsed) || parsed.length === 0 || !parsed.every((a) => typeof a === 'string')) throw new Error(`${where}: expected a JSON array of strings`);
  return parsed as string[];
}

function parseEnv(args: string): Record<string, string> {
  const out: Record<string, string> = {};
  if (!args.includes('=')) {
    const [key, ...rest] = args.split(/\s+/);
    out[key] = rest.join(' ');
    return out;
  }
  for (const pair of args.split(/\s+/)) {
    const eq = pair.indexOf('=');
    out[pair.slice(0, eq)] = pair.slice(eq + 1).replace(/^"(.*)"$/, '$1');
  }
  return out;
}

function parseDockerignore(text: string): string[] {
  return text
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '' && !l.startsWith('#'));
}

// a pattern matches the path or any folder above it; * stands for any characters but /
function isIgnored(path: string, patterns: readonly string[]): boolean {
  if (path === '') return false;
  const parts = path.split('/');
  return patterns.some((pattern) => {
    const re = new RegExp(`^${pattern.replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*\*/g, '\u0000').replace(/\*/g, '[^/]*').replace(/\u0000/g, '.*')}$`);
    for (let i = 1; i <= parts.length; i++) if (re.test(parts.slice(0, i).join('/'))) return true;
    return false;
  });
}

async function waitFor(condition: () => boolean, timeoutMs: number, message: () => string): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!condition()) {
    if (Date.now() > end) throw new Error(message());
    await sleep(100);
  }
}

function sleep(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

// `npm run docker:check`
if (process.argv[1] !== undefined && fileURLToPath(import.meta.url) === process.argv[1]) {
  const contextDir = fileURLToPath(new URL('../../', import.meta.url));
  const started = Date.now();
  replayDockerfile({ contextDir, log: (line) => process.stdout.write(`docker:check ${line}\n`), keep: process.env.KEEP_DOCKER_REPLAY === '1', echo: true }).then(
    (report) => {
      process.stdout.write(`docker:check passed in ${((Date.now() - started) / 1000).toFixed(0)} s: ${JSON.stringify(report)}\n`);
    },
    (err: Error) => {
      process.stderr.write(`docker:check failed: ${err.message}\n`);
      process.exitCode = 1;
    },
  );
}

