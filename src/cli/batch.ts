/**
 * `lapwright batch`: a dataset on disk — one file per track (json, glb or svg) and manifest.json —
 * made by K worker threads. `--shard i/n` makes shard i of n of the same dataset (indices
 * i, i + n, …, files named as in the one-machine run, manifest.shard-i-of-n.json), and
 * `--merge` joins the shard manifests of a directory into the one-machine manifest.json.
 */
import { randomInt } from 'node:crypto';
import { mkdir, readdir, stat, writeFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { InfeasibleError, type Manifest, type ManifestTrack, mergeShards, SEED_MAX, type ShardInfo } from '../core/index.js';
import { inThreadExecutor, poolExecutor } from '../batch/executors.js';
import { batchJob, finishManifest, readReference } from '../batch/job.js';
import { runBatch, SlotFailure } from '../batch/run-batch.js';
import { EXPORT_FORMATS } from '../export/index.js';
import { batchBodySchema, referenceSchema } from '../schema/batch.js';
import { readNumberText } from '../schema/dotted.js';
import { formatIssues } from '../schema/issues.js';
import { TrackPool } from '../server/pool/track-pool.js';
import { parseFlags } from './flags.js';
import { batchHelp } from './help.js';
import { type CliIo, InputError, messageOf, readJson, writeText } from './io.js';
import { isPlainObject, parseSeedFlag } from './overrides.js';
import { Progress } from './progress.js';

const OPTIONS = {
  count: { type: 'string' },
  split: { type: 'string' },
  params: { type: 'string' },
  request: { type: 'string' },
  'base-seed': { type: 'string' },
  difficulty: { type: 'string' },
  'min-novelty': { type: 'string' },
  reference: { type: 'string' },
  out: { type: 'string' },
  format: { type: 'string' },
  workers: { type: 'string' },
  shard: { type: 'string' },
  merge: { type: 'boolean' },
  force: { type: 'boolean' },
  quiet: { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
} as const;

/** File formats of a dataset. */
export const BATCH_FORMATS = ['json', 'glb', 'svg'] as const;
type BatchFormat = (typeof BATCH_FORMATS)[number];

/** The manifest of a whole dataset, beside its files. */
export const MANIFEST_FILE = 'manifest.json';

/** Time one slot may take on a worker, ms: a long lap with many redraws, never a hang. */
const SLOT_DEADLINE_MS = 600_000;

/** Slots in flight per worker. */
const WINDOW_PER_WORKER = 2;

/** Shard manifest file name: manifest.shard-<i>-of-<n>.json. */
export function shardManifestFile(shard: ShardInfo): string {
  return `manifest.shard-${shard.index}-of-${shard.count}.json`;
}

/** File name of track `index` in a dataset of `count` tracks: track-000042.json (at least 6 digits). */
export function trackFileName(index: number, count: number, format: string): string {
  const digits = Math.max(6, String(count - 1).length);
  return `track-${String(index).padStart(digits, '0')}.${EXPORT_FORMATS[format as BatchFormat].extension}`;
}

/**
 * Runs `batch` with the arguments after the command name.
 * @returns exit code 0; failures are thrown (InputError → 2, InfeasibleError → 3)
 */
export async function runBatchCommand(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseFlags(() => parseArgs({ args: [...args], options: OPTIONS, allowPositionals: true, strict: true }), 'batch');
  if (values.help) {
    await writeText(io.stdout, batchHelp());
    return 0;
  }
  if (positionals.length > 0) throw new InputError(`batch takes no file arguments, got ${JSON.stringify(positionals[0])} (see lapwright batch --help)`);
  const out = values.out ?? '.';
  if (values.merge) return merge(out, io, values.quiet === true);

  // the request: --request FILE, then --params and each flag over it
  const body: Record<string, unknown> = values.request === undefined ? {} : await readObject(values.request, io, '--request file');
  if (values.params !== undefined) body.params = await readJson(values.params, io, '--params file');
  // numbers as written; the schema words any problem with the field's path
  if (values.count !== undefined) body.count = readNumberText(values.count);
  if (values.split !== undefined) body.split = values.split;
  if (values['base-seed'] !== undefined) body.baseSeed = parseSeedFlag(values['base-seed']);
  if (values.difficulty !== undefined) body.difficulty = band(values.difficulty);
  if (values['min-novelty'] !== undefined) body.minNovelty = readNumberText(values['min-novelty']);
  if (body.count === undefined) throw new InputError('--count is required (see lapwright batch --help)');
  if (Object.hasOwn(body, 'reference') || Object.hasOwn(body, 'detail')) throw new InputError('--request holds a batch body without reference or detail: give the reference with --reference FILE');
  if (Object.hasOwn(body, 'startIndex')) throw new InputError('--request holds startIndex, a field of POST /v1/batches: lapwright batch makes every index of its shard; split the work with --shard instead');
  const parsed = batchBodySchema.safeParse(body);
  if (!parsed.success) throw new InputError('invalid batch (ERR_INVALID_PARAMS)', formatIssues(parsed.error));
  const request = parsed.data;

  const format = parseFormat(values.format);
  const workers = values.workers === undefined ? availableParallelism() : wholeNumber(values.workers, '--workers', 0, 256);
  const shard = values.shard === undefined ? null : parseShard(values.shard);
  if (shard !== null && (request.minNovelty ?? 0) > 0) {
    throw new InputError('--shard cannot be used with --min-novelty: novelty within a batch is decided track by track in index order, which one machine must see whole; make novel sets on one machine with --workers');
  }
  let reference = null;
  if (values.reference !== undefined) {
    const data = referenceSchema.safeParse(await readJson(values.reference, io, '--reference file'));
    if (!data.success) throw new InputError(`--reference file ${values.reference} is not a manifest`, formatIssues(data.error));
    reference = readReference(data.data.tracks, '(root)');
    if (reference.issues.length > 0) throw new InputError(`--reference file ${values.reference} has shapes that do not decode`, reference.issues);
  }

  const manifestPath = join(out, shard === null ? MANIFEST_FILE : shardManifestFile(shard));
  await mkdir(out, { recursive: true }).catch((err: unknown) => {
    throw new InputError(`cannot create --out directory ${out}: ${messageOf(err)}`);
  });
  if (values.force !== true && (await exists(manifestPath))) throw new InputError(`${manifestPath} already exists: choose another --out directory, or give --force to write over it`);

  // the core reads no randomness: a missing base seed is drawn here and echoed in the manifest
  const job = batchJob({ ...request, baseSeed: request.baseSeed ?? randomInt(0, SEED_MAX + 1) }, reference);
  const indices: number[] = [];
  for (let i = shard?.index ?? 0; i < request.count; i += shard?.count ?? 1) indices.push(i);
  // --workers 0: no threads, every track made in this one (small runs, debugging)
  const window = Math.max(1, WINDOW_PER_WORKER * workers);
  const pool = workers === 0 ? null : new TrackPool({ workers, maxQueue: window });
  const progress = new Progress(io.stderr, indices.length, 'lapwright batch', values.quiet !== true);
  const entries: ManifestTrack[] = [];
  try {
    await pool?.ready;
    const bytes = { format, options: {} };
    const execute = pool === null ? inThreadExecutor(job.plan, bytes) : poolExecutor(pool, job.plan, bytes, SLOT_DEADLINE_MS);
    const run = runBatch({ indices, window, minNovelty: job.request.minNovelty, reference: job.reference, execute });
    for await (const { entry, bytes } of run.tracks) {
      const file = trackFileName(entry.index, request.count, format);
      await writeFile(join(out, file), bytes!).catch((err: unknown) => {
        throw new InputError(`cannot write ${join(out, file)}: ${messageOf(err)}`);
      });
      entries.push({ ...entry, file });
      await progress.tick(entries.length);
    }
    await progress.finish();
    const manifest = finishManifest(job, entries, run.totals, shard, { format });
    await writeFile(manifestPath, JSON.stringify(manifest, null, 2) + '\n');
    if (values.quiet !== true) {
      const s = progress.elapsedS();
      await writeText(
        io.stderr,
        `lapwright batch: wrote ${entries.length} ${format} track files and ${manifestPath} in ${s.toFixed(1)} s (${(entries.length / Math.max(s, 1e-9)).toFixed(1)} tracks/s, ${workers === 0 ? 'no worker threads' : `${workers} worker${workers === 1 ? '' : 's'}`}); redrawn ${run.totals.redrawn}, skipped: split ${run.totals.skippedSplit}, difficulty ${run.totals.skippedDifficulty}, novelty ${run.totals.skippedNovelty}\n`,
      );
    }
    return 0;
  } catch (err) {
    await progress.finish();
    if (err instanceof SlotFailure) {
      throw new InfeasibleError(err.last?.reason ?? 'no_valid_layout', err.message, err.reason === 'infeasible' ? (err.last?.hint ?? 'narrow the parameter ranges') : err.reason === 'difficulty' ? 'widen --difficulty, or move the parameter ranges towards it' : 'lower --min-novelty, or widen the parameter ranges');
    }
    throw err;
  } finally {
    await pool?.destroy();
  }
}

// --merge: the shard manifests of a directory → its manifest.json
async function merge(out: string, io: CliIo, quiet: boolean): Promise<number> {
  let names: string[];
  try {
    names = (await readdir(out)).filter((n) => /^manifest\.shard-\d+-of-\d+\.json$/.test(n)).sort();
  } catch (err) {
    throw new InputError(`cannot read --out directory ${out}: ${messageOf(err)}`);
  }
  if (names.length === 0) throw new InputError(`no shard manifests (manifest.shard-<i>-of-<n>.json) in ${out}`);
  const shards: Manifest[] = [];
  for (const name of names) shards.push((await readJson(join(out, name), io, 'shard manifest')) as Manifest);
  let manifest: Manifest;
  try {
    manifest = mergeShards(shards);
  } catch (err) {
    throw new InputError(`cannot merge the shard manifests in ${out}: ${messageOf(err)}`);
  }
  await writeFile(join(out, MANIFEST_FILE), JSON.stringify(manifest, null, 2) + '\n');
  if (!quiet) await writeText(io.stderr, `lapwright batch: merged ${names.length} shard manifests (${manifest.tracks.length} tracks) into ${join(out, MANIFEST_FILE)}\n`);
  return 0;
}

function parseFormat(flag: string | undefined): BatchFormat {
  if (flag === undefined) return 'json';
  if (!(BATCH_FORMATS as readonly string[]).includes(flag)) throw new InputError(`--format must be one of ${BATCH_FORMATS.join(', ')}, got ${JSON.stringify(flag)}`);
  return flag as BatchFormat;
}

/** `--shard i/n`: 0 <= i < n. */
export function parseShard(text: string): ShardInfo {
  const m = /^(\d+)\/(\d+)$/.exec(text);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!(count >= 1 && count <= 1_048_576 && index >= 0 && index < count)) {
    throw new InputError(`--shard must be i/n with 0 <= i < n (shard i of n, counted from 0, as a Kubernetes Indexed Job's JOB_COMPLETION_INDEX), got ${JSON.stringify(text)}`);
  }
  return { index, count };
}

// --difficulty MIN:MAX
function band(text: string): { min: unknown; max: unknown } {
  const parts = text.split(':');
  if (parts.length !== 2) throw new InputError(`--difficulty must be MIN:MAX (e.g. 3.5:4.2), got ${JSON.stringify(text)}`);
  return { min: number(parts[0], '--difficulty MIN'), max: number(parts[1], '--difficulty MAX') };
}

function number(text: string, flag: string): number {
  const x = /^-?\d+(\.\d+)?([eE][+-]?\d+)?$/.test(text.trim()) ? Number(text) : NaN;
  if (!Number.isFinite(x)) throw new InputError(`${flag} must be a number, got ${JSON.stringify(text)}`);
  return x;
}

function wholeNumber(text: string, flag: string, min = 1, max = Number.MAX_SAFE_INTEGER): number {
  const x = /^\d+$/.test(text) ? Number(text) : NaN;
  if (!(x >= min && x <= max)) throw new InputError(`${flag} must be a whole number from ${min}${max < Number.MAX_SAFE_INTEGER ? ` to ${max}` : ''}, got ${JSON.stringify(text)}`);
  return x;
}

async function readObject(name: string, io: CliIo, what: string): Promise<Record<string, unknown>> {
  const data = await readJson(name, io, what);
  if (!isPlainObject(data)) throw new InputError(`${what} ${name} must hold a JSON object`);
  return data;
}

async function exists(path: string): Promise<boolean> {
  try {
    await stat(path);
    return true;
  } catch {
    return false;
  }
}
