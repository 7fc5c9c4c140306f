/**
 * `lapwright verify manifest.json`: makes every track of a manifest again and checks, for each,
 * that its seed is the batch's (base seed, index, draw), in the split; that its params are the
 * batch's ranges drawn from that seed; that the re-made track has the manifest's id and shape;
 * that the file beside the manifest holds exactly the re-made bytes; that it lies in the
 * difficulty band and is novel enough. With `--reference FILE` it also checks that no seed or id
 * is shared with the reference and that every track is at least minNovelty (or --min-novelty)
 * from every reference track. Every mismatch is one line on stdout; exit 4 if there is any.
 */
import { readFile } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { dirname, join } from 'node:path';
import { parseArgs } from 'node:util';
import { batchSeed, decodeShape, GENERATOR_VERSION, type Manifest, type ManifestTrack, NoveltyIndex, referenceSummary, resolveParams, sampleParams, type Shape, splitOf } from '../core/index.js';
import { formatIssues } from '../schema/issues.js';
import { manifestSchema } from '../server/batch-schemas.js';
import { TrackPool } from '../server/pool/track-pool.js';
import { type RemakeTaskInput, runRemakeTask, type SlotBytes } from '../batch/slot-task.js';
import type { TaskOutput } from '../server/pool/protocol.js';
import { BATCH_FORMATS } from './batch.js';
import { parseFlags } from './flags.js';
import { verifyHelp } from './help.js';
import { type CliIo, InputError, messageOf, readJson, writeText } from './io.js';
import { Progress } from './progress.js';

/** Exit code of `verify` when any track does not match. */
export const EXIT_MISMATCH = 4;

/** Time one re-make may take on a worker, ms. */
const REMAKE_DEADLINE_MS = 600_000;

const OPTIONS = {
  reference: { type: 'string' },
  'min-novelty': { type: 'string' },
  workers: { type: 'string' },
  quiet: { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
} as const;

/**
 * Runs `verify` with the arguments after the command name.
 * @returns 0 when everything matches, 4 otherwise; malformed input is thrown as InputError (exit 2)
 */
export async function runVerify(args: readonly string[], io: CliIo): Promise<number> {
  const { values, positionals } = parseFlags(() => parseArgs({ args: [...args], options: OPTIONS, allowPositionals: true, strict: true }), 'verify');
  if (values.help) {
    await writeText(io.stdout, verifyHelp());
    return 0;
  }
  if (positionals.length !== 1) throw new InputError(`verify takes one manifest file, got ${positionals.length} (see lapwright verify --help)`);
  const path = positionals[0];
  const manifest = await readManifest(path, io, 'manifest');
  const reference = values.reference === undefined ? null : await readManifest(values.reference, io, '--reference manifest');
  const minNovelty = values['min-novelty'] === undefined ? manifest.request.minNovelty : Number(values['min-novelty']);
  if (!(minNovelty >= 0)) throw new InputError(`--min-novelty must be a number >= 0, got ${JSON.stringify(values['min-novelty'])}`);
  const workers = values.workers === undefined ? availableParallelism() : Number(values.workers);
  if (!(Number.isInteger(workers) && workers >= 0 && workers <= 256)) throw new InputError(`--workers must be a whole number from 0 to 256, got ${JSON.stringify(values.workers)}`);

  // every mismatch with the index it belongs to (-1: the manifest), listed in index order
  const problems: { at: number; text: string }[] = [];
  const say = (t: ManifestTrack | null, what: string) => problems.push(t === null ? { at: -1, text: what } : { at: t.index, text: `track ${t.index}${t.file ? ` (${t.file})` : ''}: ${what}` });
  if (manifest.generatorVersion !== GENERATOR_VERSION) {
    say(null, `manifest: made by generatorVersion ${manifest.generatorVersion}; this is ${GENERATOR_VERSION}, whose tracks differ: verify with that version`);
    return report(problems, manifest, io);
  }
  checkIndices(manifest, say);

  const format = manifest.output?.format;
  const bytes: SlotBytes = format !== undefined && (BATCH_FORMATS as readonly string[]).includes(format) ? { format: format as (typeof BATCH_FORMATS)[number], options: {} } : { format: 'none' };
  // --workers 0: every track made again in this thread
  const pool = workers === 0 ? null : new TrackPool({ workers, maxQueue: 2 * workers });
  const remake: Remake = pool === null ? async (input) => (await runRemakeTask(input)).output : (input) => pool.run(input, REMAKE_DEADLINE_MS);
  const progress = new Progress(io.stderr, manifest.tracks.length, 'lapwright verify', values.quiet !== true);
  try {
    await pool?.ready;
    let done = 0;
    // a few tracks at a time: each re-made track's bytes are compared and dropped
    const queue = [...manifest.tracks];
    const lanes = Array.from({ length: Math.max(1, 2 * workers) }, async () => {
      for (let t = queue.shift(); t !== undefined; t = queue.shift()) {
        await checkTrack(t, manifest, dirname(path), bytes, remake, say);
        await progress.tick(++done);
      }
    });
    await Promise.all(lanes);
    await progress.finish();
  } finally {
    await pool?.destroy();
  }
  checkNovelty(manifest, reference, minNovelty, say);
  return report(problems, manifest, io);
}

/** Makes a track again: on a worker, or in this thread (an infeasible one throws there). */
type Remake = (input: RemakeTaskInput) => Promise<TaskOutput>;

async function checkTrack(t: ManifestTrack, m: Manifest, dir: string, bytes: SlotBytes, remake: Remake, say: (t: ManifestTrack, what: string) => void): Promise<void> {
  const r = m.request;
  if (t.draw < 0 || t.draw >= 4096 || batchSeed(r.baseSeed, t.index, t.draw) !== t.seed) say(t, `seed ${JSON.stringify(t.seed)} is not draw ${t.draw} of track ${t.index} of base seed ${JSON.stringify(r.baseSeed)}`);
  if (splitOf(t.seed) !== t.split) say(t, `seed ${JSON.stringify(t.seed)} is in split ${splitOf(t.seed)}, the manifest says ${t.split}`);
  if (r.split !== null && t.split !== r.split) say(t, `split ${t.split} is not the batch's split ${r.split}`);
  if (JSON.stringify(resolveParams(sampleParams(r.params, t.seed))) !== JSON.stringify(t.params)) say(t, 'params are not the batch\'s ranges drawn from the track\'s seed');
  if (r.difficulty !== null && !(t.metrics.difficulty >= r.difficulty.min && t.metrics.difficulty <= r.difficulty.max)) say(t, `difficulty ${t.metrics.difficulty} is outside the band ${r.difficulty.min}..${r.difficulty.max}`);
  let out;
  try {
    out = await remake({ kind: 'remake', request: t.params, bytes });
  } catch (err) {
    say(t, `could not be made again: ${messageOf(err)}`);
    return;
  }
  if (!out.ok) {
    say(t, `could not be made again: ${out.error.message}`);
    return;
  }
  if (out.kind !== 'remake') return;
  if (out.id !== t.id) say(t, `id ${t.id} in the manifest, ${out.id} made again from its params`);
  if (out.shape !== t.shape) say(t, 'shape in the manifest differs from the re-made track\'s');
  if (t.file === undefined || out.bytes === null) return;
  let file: Buffer;
  try {
    file = await readFile(join(dir, t.file));
  } catch (err) {
    say(t, `file missing or unreadable: ${messageOf(err)}`);
    return;
  }
  if (!file.equals(Buffer.from(out.bytes.buffer, out.bytes.byteOffset, out.bytes.byteLength))) say(t, `file differs from the re-made track (${file.length} bytes on disk, ${out.bytes.byteLength} made again)`);
}

// every index of the batch (or of the shard) once
function checkIndices(m: Manifest, say: (t: ManifestTrack | null, what: string) => void): void {
  const expected = new Set<number>();
  for (let i = m.shard?.index ?? 0; i < m.request.count; i += m.shard?.count ?? 1) expected.add(i);
  const seen = new Set<number>();
  for (const t of m.tracks) {
    if (seen.has(t.index)) say(t, 'index given twice');
    else if (!expected.has(t.index)) say(t, `index not part of this ${m.shard === null ? 'batch' : 'shard'}`);
    seen.add(t.index);
  }
  const missing = [...expected].filter((i) => !seen.has(i));
  if (missing.length > 0) say(null, `manifest: ${missing.length} track${missing.length === 1 ? '' : 's'} missing (index ${missing.slice(0, 10).join(', ')}${missing.length > 10 ? ', …' : ''})`);
  const seeds = new Map<string, number>();
  for (const t of m.tracks) {
    const key = JSON.stringify(t.seed);
    if (seeds.has(key)) say(t, `seed ${key} is also track ${seeds.get(key)}'s`);
    seeds.set(key, t.index);
  }
}

// novelty within the batch (each track against the ones before it) and against the reference
function checkNovelty(m: Manifest, reference: Manifest | null, minNovelty: number, say: (t: ManifestTrack | null, what: string) => void): void {
  const shape = (t: ManifestTrack): Shape | null => {
    try {
      return decodeShape(t.shape);
    } catch {
      return null;
    }
  };
  if (reference !== null) {
    if (m.request.reference !== null && JSON.stringify(referenceSummary(reference.tracks.map((t) => t.shape))) !== JSON.stringify(m.request.reference)) say(null, 'manifest: its reference is not the --reference manifest (count or digest of the shapes differ)');
    const seeds = new Set(reference.tracks.map((t) => JSON.stringify(t.seed)));
    const ids = new Set(reference.tracks.map((t) => t.id));
    for (const t of m.tracks) {
      if (seeds.has(JSON.stringify(t.seed))) say(t, `seed ${JSON.stringify(t.seed)} is also in the reference`);
      if (ids.has(t.id)) say(t, 'the same track is also in the reference');
    }
  }
  if (!(minNovelty > 0)) return;
  const index = new NoveltyIndex();
  const owners: string[] = [];
  for (const r of reference?.tracks ?? []) {
    const s = shape(r);
    if (s !== null) {
      index.add(s);
      owners.push(`reference track ${r.index}`);
    }
  }
  const inBatch = m.request.minNovelty > 0;
  for (const t of [...m.tracks].sort((a, b) => a.index - b.index)) {
    const s = shape(t);
    if (s === null) continue;
    const hit = index.findWithin(s, minNovelty);
    if (hit !== null) say(t, `turning distance ${hit.distance.toFixed(4)} to ${owners[hit.index]} is below ${minNovelty}`);
    if (inBatch) {
      index.add(s);
      owners.push(`track ${t.index}`);
    }
  }
}

async function report(problems: readonly { at: number; text: string }[], m: Manifest, io: CliIo): Promise<number> {
  if (problems.length > 0) await writeText(io.stdout, [...problems].sort((a, b) => a.at - b.at).map((p) => p.text).join('\n') + '\n');
  const n = m.tracks.length;
  await writeText(io.stderr, problems.length === 0 ? `lapwright verify: all ${n} tracks match\n` : `lapwright verify: ${problems.length} mismatch${problems.length === 1 ? '' : 'es'} in ${n} tracks (listed on stdout)\n`);
  return problems.length === 0 ? 0 : EXIT_MISMATCH;
}

async function readManifest(path: string, io: CliIo, what: string): Promise<Manifest> {
  const data = await readJson(path, io, what);
  const parsed = manifestSchema.safeParse(data);
  if (!parsed.success) throw new InputError(`${what} ${path} is not a lapwright.manifest/1 manifest`, formatIssues(parsed.error));
  return data as Manifest;
}
