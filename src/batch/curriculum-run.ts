/**
 * A curriculum with its sample tracks: the core's stages (parameter ranges along the ladder),
 * each measured on a few calibration tracks, given a band of the difficulty figure between its
 * neighbours' (difficultyBands), and sampled as a batch that keeps its tracks inside that band.
 * So every sample of a later stage is harder, by metrics.difficulty, than every sample of an
 * earlier one; and each stage's `batch` is a ready POST /v1/batches body (its first tracks are
 * the samples).
 */
import { batchSeed, curriculumStages, difficultyBands } from '../core/index.js';
import type { BatchPlan, CurriculumStage, ManifestTrack, Seed, Split, ValueRange } from '../core/index.js';
import { runBatch, type SlotExecutor } from './run-batch.js';

/** Calibration tracks per stage: the first tracks of the stage's batch without a band. */
export const CALIBRATION_TRACKS = 5;

/** Sample tracks per stage a request may ask for. */
export const CURRICULUM_SAMPLES = { min: 1, max: 10, default: 3 } as const;

export interface CurriculumInput {
  readonly stages: number;
  readonly from?: number;
  readonly to?: number;
  readonly samples: number;
  readonly split: Split | null;
  readonly baseSeed: Seed;
}

/** A sample track of a stage: its manifest entry without the stored shape. */
export type CurriculumSample = Omit<ManifestTrack, 'shape' | 'file'>;

export interface CurriculumStageResult extends CurriculumStage {
  /** Band of metrics.difficulty the stage's tracks lie in. */
  readonly difficulty: ValueRange;
  /** Difficulty measured on the calibration tracks (median) and on the samples. */
  readonly measured: { readonly calibrationMedian: number; readonly min: number; readonly mean: number; readonly max: number };
  /** A batch body (POST /v1/batches, add count) whose first tracks are the samples. */
  readonly batch: { readonly split: Split | null; readonly baseSeed: number; readonly params: CurriculumStage['params']; readonly difficulty: ValueRange };
  readonly samples: readonly CurriculumSample[];
}

/** Two stages measured alike: they cannot be told apart by difficulty. */
export class CurriculumTooFlat extends Error {
  constructor(medians: readonly number[]) {
    super(`the stages' measured difficulties (${medians.map((m) => m.toFixed(3)).join(', ')}) do not rise at every step: ask for fewer stages or a wider from..to`);
    this.name = 'CurriculumTooFlat';
  }
}

/**
 * Builds a curriculum and its samples.
 * @param executorFor where a plan's slots run (a pool, or in-thread)
 * @param window slots in flight per stage
 * @throws {RangeError} for stages/from/to the core refuses; CurriculumTooFlat; SlotFailure and executor errors
 */
export async function buildCurriculum(input: CurriculumInput, executorFor: (plan: BatchPlan) => SlotExecutor, window: number): Promise<CurriculumStageResult[]> {
  const stages = curriculumStages(input.stages, input.from, input.to);
  const plans = stages.map((stage): BatchPlan & { baseSeed: number } => ({ baseSeed: batchSeed(input.baseSeed, stage.index, 0), split: input.split, params: stage.params, difficulty: null }));
  const calibration = await Promise.all(plans.map((plan) => firstTracks(plan, CALIBRATION_TRACKS, executorFor, window)));
  const medians = calibration.map((tracks) => median(tracks.map((t) => t.metrics.difficulty)));
  const bands = difficultyBands(medians);
  if (bands === null) throw new CurriculumTooFlat(medians);
  const samples = await Promise.all(plans.map((plan, k) => firstTracks({ ...plan, difficulty: bands[k] }, input.samples, executorFor, window)));
  return stages.map((stage, k) => {
    const d = samples[k].map((t) => t.metrics.difficulty);
    return {
      ...stage,
      difficulty: bands[k],
      measured: { calibrationMedian: medians[k], min: Math.min(...d), mean: round3(d.reduce((a, b) => a + b, 0) / d.length), max: Math.max(...d) },
      batch: { split: input.split, baseSeed: plans[k].baseSeed, params: stage.params, difficulty: bands[k] },
      samples: samples[k].map(({ shape: _shape, file: _file, ...rest }) => rest),
    };
  });
}

async function firstTracks(plan: BatchPlan, count: number, executorFor: (plan: BatchPlan) => SlotExecutor, window: number): Promise<ManifestTrack[]> {
  const run = runBatch({ indices: Array.from({ length: count }, (_, i) => i), window, minNovelty: 0, reference: [], execute: executorFor(plan) });
  const out: ManifestTrack[] = [];
  for await (const item of run.tracks) out.push(item.entry);
  return out;
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

function round3(x: number): number {
  return Math.round(x * 1000) / 1000;
}
