/**
 * Public surface of the core (explicit exports only). Shells (server, CLI, web) import from here.
 */
export { generateTrack, generateTrackJson } from './generate.js';
export { validateTrack } from './validate/index.js';
export { assessTrack } from './drive/assess.js';
export type { Assessment } from './drive/assess.js';
export { vehicleMinRadiusM } from './params/drivability.js';
export { resolveParams, deriveCornerCount } from './params/resolve.js';
export { checkFeasibility, splitTurning } from './params/feasibility.js';
export { DEFAULTS, DRIVABILITY_MODES, LIMITS, SEED_MAX, SEED_STRING_MAX_CHARS } from './params/defaults.js';
export { GENERATOR_VERSION } from './rules.js';
export { ERROR_CODES, INFEASIBLE_REASONS, ISSUE_CODES, InfeasibleError, isInfeasibleError } from './errors.js';
export type { InfeasibleReason, Issue, IssueCode } from './errors.js';
export type { CarSpec, Drivability, RangeM, SensorSpec, Seed, TrackParams, TrackRequest, VehicleSpec, WallSpec } from './params/types.js';
export { TRACK_FORMAT } from './track.js';
export type { Centerline, Corner, Gate, Point, Spawn, SplineSpec, Track, TrackMetrics, ValidationResult, Walls } from './track.js';
export { turningDistance, turningDistanceBetween, turningDistanceExact, turningSignature } from './metrics/turning-distance.js';
export type { TurningSignature } from './metrics/turning-distance.js';
export { isSplit, SPLIT_KEY, SPLIT_SHARES, SPLITS, splitOf, splitValue } from './batch/split.js';
export type { Split } from './batch/split.js';
export { batchSeed, MAX_BATCH_SLOTS, MAX_SLOT_DRAWS } from './batch/seeds.js';
export { DRAWN_DECIMALS, INTEGER_PATHS, isValueRange, PAIR_PATHS, sampleParams } from './batch/ranges.js';
export type { ParamRanges, Rangeable, Ranged, ValueRange } from './batch/ranges.js';
export { decodeShape, distanceBelow, encodeShape, NOVELTY_SAMPLES, NoveltyIndex, shapeDistance, shapeDistanceBound } from './batch/novelty.js';
export type { Shape } from './batch/novelty.js';
export { makeManifest, MANIFEST_FORMAT, manifestTrack, mergeShards, referenceSummary } from './batch/manifest.js';
export type { BatchRequest, Manifest, ManifestTrack, ReferenceSummary, ShardInfo, SkippedDraws } from './batch/manifest.js';
export { makeSlotCandidate, MAX_SLOT_DIFFICULTY_MISSES, MAX_SLOT_REDRAWS } from './batch/slot.js';
export type { BatchPlan, SlotCandidate, SlotFailureReason, SlotOutcome, SlotSkips } from './batch/slot.js';
export { CURRICULUM_STAGES, curriculumStages, difficultyBands, MIN_LEVEL_STEP, TECHNICAL_LEVEL } from './batch/curriculum.js';
export type { CurriculumStage } from './batch/curriculum.js';
