/**
 * A batch as the shells run it: the normalised request the manifest records, the plan every slot
 * shares, the decoded reference shapes, and which slot indices to make (all, or one shard's).
 */
import { decodeShape, makeManifest, referenceSummary } from '../core/index.js';
import type { BatchPlan, BatchRequest, Manifest, ManifestTrack, ParamRanges, Seed, Shape, ShardInfo, Split, ValueRange } from '../core/index.js';
import type { FieldIssue } from '../schema/issues.js';
import type { BatchTotals } from './run-batch.js';

/** What a shell has parsed from a request or from flags; baseSeed already chosen. */
export interface BatchInput {
  readonly count: number;
  readonly split?: Split;
  readonly baseSeed: Seed;
  readonly params?: ParamRanges;
  readonly difficulty?: ValueRange;
  readonly minNovelty?: number;
}

export interface BatchJob {
  readonly request: BatchRequest;
  readonly plan: BatchPlan;
  /** Decoded reference shapes (empty without a reference). */
  readonly reference: readonly Shape[];
}

/**
 * The job of a batch.
 * @param referenceShapes stored shapes of the reference manifest's tracks, already decoded (see
 *   readReference), or null without a reference
 */
export function batchJob(input: BatchInput, reference: { readonly shapes: readonly string[]; readonly decoded: readonly Shape[] } | null): BatchJob {
  const request: BatchRequest = {
    count: input.count,
    split: input.split ?? null,
    baseSeed: input.baseSeed,
    params: input.params ?? {},
    difficulty: input.difficulty ?? null,
    minNovelty: input.minNovelty ?? 0,
    reference: reference === null ? null : referenceSummary(reference.shapes),
  };
  const plan: BatchPlan = { baseSeed: request.baseSeed, split: request.split, params: request.params, difficulty: request.difficulty };
  return { request, plan, reference: reference?.decoded ?? [] };
}

/**
 * Decodes the shapes of a reference manifest's tracks.
 * @param at dotted path of the reference in the input, for issue paths (`reference`, or `(root)` for a file)
 * @returns the shapes and their decoded form, or the issues of the shapes that do not decode
 */
export function readReference(tracks: readonly { readonly shape: string }[], at: string): { shapes: string[]; decoded: Shape[]; issues: FieldIssue[] } {
  const shapes: string[] = [];
  const decoded: Shape[] = [];
  const issues: FieldIssue[] = [];
  tracks.forEach((t, i) => {
    try {
      decoded.push(decodeShape(t.shape));
      shapes.push(t.shape);
    } catch (err) {
      issues.push({ path: `${at === '(root)' ? '' : `${at}.`}tracks.${i}.shape`, message: err instanceof Error ? err.message : String(err) });
    }
  });
  return { shapes, decoded, issues };
}

/**
 * The slot indices a run makes: 0 .. count − 1, or shard i of n: i, i + n, i + 2n, … (so the n
 * shards together make every index exactly once).
 */
export function slotIndices(count: number, shard: ShardInfo | null): number[] {
  const out: number[] = [];
  const start = shard?.index ?? 0;
  const step = shard?.count ?? 1;
  for (let i = start; i < count; i += step) out.push(i);
  return out;
}

/** The manifest of a finished run. */
export function finishManifest(job: BatchJob, tracks: readonly ManifestTrack[], totals: BatchTotals, shard: ShardInfo | null, output?: { readonly format: string }): Manifest {
  return makeManifest({
    request: job.request,
    output,
    shard,
    tracks,
    redrawn: totals.redrawn,
    skipped: { split: totals.skippedSplit, difficulty: totals.skippedDifficulty, novelty: totals.skippedNovelty },
  });
}
