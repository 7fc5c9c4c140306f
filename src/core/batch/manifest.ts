/**
 * The manifest of a batch (format `lapwright.manifest/1`): what was asked, and for every track
 * its index, seed, draw, split, id, resolved params, metrics and stored shape — enough to make
 * every track again byte for byte, check it by its id, and test new tracks for novelty against
 * it. The HTTP batch ends with it as its last line; `lapwright batch` writes it as manifest.json
 * (adding each track's file name).
 */
import { createHash } from 'node:crypto';
import type { Seed, TrackParams } from '../params/types.js';
import { GENERATOR_VERSION } from '../rules.js';
import type { Track, TrackMetrics } from '../track.js';
import type { ParamRanges, ValueRange } from './ranges.js';
import type { Split } from './split.js';

export const MANIFEST_FORMAT = 'lapwright.manifest/1';

/** What a batch asks for, normalised (every default filled), as the manifest records it. */
export interface BatchRequest {
  readonly count: number;
  /** The split every seed must be in; null: seeds of any split. */
  readonly split: Split | null;
  readonly baseSeed: Seed;
  readonly params: ParamRanges;
  /** Band of metrics.difficulty every track lies in; null: any. */
  readonly difficulty: ValueRange | null;
  /** Smallest turning-function distance (rad) to every earlier track and reference track; 0: no novelty test. */
  readonly minNovelty: number;
  /** The reference the tracks had to be novel against: how many shapes, and a digest of them; null: none. */
  readonly reference: ReferenceSummary | null;
}

/** A reference set of shapes, summarised: `digest` is the hex sha256 of the shapes joined by newlines, in order. */
export interface ReferenceSummary {
  readonly tracks: number;
  readonly digest: string;
}

/** One track of a batch. */
export interface ManifestTrack {
  /** Position in the batch, from 0. */
  readonly index: number;
  readonly seed: Seed;
  /** Which of the slot's draws the seed is: seed = batchSeed(baseSeed, index, draw). */
  readonly draw: number;
  readonly split: Split;
  readonly id: string;
  /** Every parameter resolved: generateTrack(params) makes the track again. */
  readonly params: TrackParams;
  readonly metrics: TrackMetrics;
  /** Stored shape for novelty tests (see novelty.ts). */
  readonly shape: string;
  /** `lapwright batch` only: the track's file, beside the manifest. */
  readonly file?: string;
}

/** Draws that did not become a track. */
export interface SkippedDraws {
  /** Seeds outside the requested split (never generated). */
  readonly split: number;
  /** Tracks outside the difficulty band. */
  readonly difficulty: number;
  /** Tracks closer than minNovelty to an earlier or a reference track. */
  readonly novelty: number;
}

/** Which part of a dataset a manifest covers: shard `index` of `count` takes indices ≡ index (mod count). */
export interface ShardInfo {
  readonly index: number;
  readonly count: number;
}

export interface Manifest {
  readonly format: typeof MANIFEST_FORMAT;
  readonly generatorVersion: string;
  readonly request: BatchRequest;
  readonly split: Split | null;
  /** `lapwright batch` only: the format of the track files. */
  readonly output?: { readonly format: string };
  /** null for a whole batch. */
  readonly shard: ShardInfo | null;
  readonly tracks: readonly ManifestTrack[];
  /** Infeasible draws, redrawn with the next seed of their slot. */
  readonly redrawn: number;
  readonly skipped: SkippedDraws;
}

/**
 * Summary of a reference set of stored shapes: how many, and the hex sha256 of the shapes joined
 * by newlines, in order (so a manifest names the exact reference its tracks are novel against).
 * @example referenceSummary(trainManifest.tracks.map((t) => t.shape))
 */
export function referenceSummary(shapes: readonly string[]): ReferenceSummary {
  return { tracks: shapes.length, digest: createHash('sha256').update(shapes.join('\n')).digest('hex') };
}

/**
 * The manifest entry of a track made by a batch.
 * @example manifestTrack(track, { index: 0, draw: 2, split: 'train', shape })
 */
export function manifestTrack(track: Track, at: { readonly index: number; readonly draw: number; readonly split: Split; readonly shape: string; readonly file?: string }): ManifestTrack {
  const entry: ManifestTrack = { index: at.index, seed: track.seed, draw: at.draw, split: at.split, id: track.id, params: track.params, metrics: track.metrics, shape: at.shape };
  return at.file === undefined ? entry : { ...entry, file: at.file };
}

/**
 * A manifest in its canonical key order.
 */
export function makeManifest(parts: {
  readonly request: BatchRequest;
  readonly output?: { readonly format: string };
  readonly shard: ShardInfo | null;
  readonly tracks: readonly ManifestTrack[];
  readonly redrawn: number;
  readonly skipped: SkippedDraws;
}): Manifest {
  const head = { format: MANIFEST_FORMAT, generatorVersion: GENERATOR_VERSION, request: parts.request, split: parts.request.split } as const;
  const tail = { shard: parts.shard, tracks: parts.tracks, redrawn: parts.redrawn, skipped: { split: parts.skipped.split, difficulty: parts.skipped.difficulty, novelty: parts.skipped.novelty } };
  return parts.output === undefined ? { ...head, ...tail } : { ...head, output: parts.output, ...tail };
}

/**
 * The manifest of the whole dataset from the manifests of all its shards: tracks in index order,
 * counts added. Equal, byte for byte once serialized, to the manifest of the one-machine run.
 * @throws {RangeError} when the manifests are not the n shards of one batch (different requests,
 *   generator versions or formats, a shard missing or repeated)
 */
export function mergeShards(shards: readonly Manifest[]): Manifest {
  if (shards.length === 0) throw new RangeError('no shard manifests to merge.');
  const first = shards[0];
  const n = first.shard?.count ?? 0;
  const request = JSON.stringify(first.request);
  const seen = new Set<number>();
  for (const m of shards) {
    if (m.shard === null) throw new RangeError('a manifest without shard info is a whole batch, not a shard.');
    if (m.shard.count !== n) throw new RangeError(`shards of ${n} and of ${m.shard.count} cannot be merged.`);
    if (JSON.stringify(m.request) !== request) throw new RangeError(`shard ${m.shard.index}/${n} has a different request than shard ${first.shard?.index}/${n}.`);
    if (m.generatorVersion !== first.generatorVersion) throw new RangeError(`shard ${m.shard.index}/${n} has generatorVersion ${m.generatorVersion}, shard ${first.shard?.index}/${n} has ${first.generatorVersion}.`);
    if (m.output?.format !== first.output?.format) throw new RangeError(`shard ${m.shard.index}/${n} wrote ${m.output?.format} files, shard ${first.shard?.index}/${n} wrote ${first.output?.format}.`);
    if (seen.has(m.shard.index)) throw new RangeError(`shard ${m.shard.index}/${n} is given twice.`);
    seen.add(m.shard.index);
  }
  const missing = Array.from({ length: n }, (_, i) => i).filter((i) => !seen.has(i));
  if (missing.length > 0) throw new RangeError(`missing shard${missing.length === 1 ? '' : 's'} ${missing.map((i) => `${i}/${n}`).join(', ')}.`);
  const tracks = shards.flatMap((m) => m.tracks).sort((a, b) => a.index - b.index);
  const sum = (f: (m: Manifest) => number): number => shards.reduce((s, m) => s + f(m), 0);
  return makeManifest({
    request: first.request,
    output: first.output,
    shard: null,
    tracks,
    redrawn: sum((m) => m.redrawn),
    skipped: { split: sum((m) => m.skipped.split), difficulty: sum((m) => m.skipped.difficulty), novelty: sum((m) => m.skipped.novelty) },
  });
}
