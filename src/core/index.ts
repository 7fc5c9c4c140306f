/**
 * Public surface of the core (explicit exports only). Shells (server, CLI, web) import from here.
 */
export { generateTrack, generateTrackJson } from './generate.js';
export { validateTrack } from './validate/index.js';
export { resolveParams, deriveCornerCount } from './params/resolve.js';
export { checkFeasibility, splitTurning } from './params/feasibility.js';
export { DEFAULTS, LIMITS, SEED_MAX, SEED_STRING_MAX_CHARS } from './params/defaults.js';
export { GENERATOR_VERSION } from './rules.js';
export { ERROR_CODES, INFEASIBLE_REASONS, ISSUE_CODES, InfeasibleError, isInfeasibleError } from './errors.js';
export type { InfeasibleReason, Issue, IssueCode } from './errors.js';
export type { CarSpec, RangeM, Seed, TrackParams, TrackRequest, WallSpec } from './params/types.js';
export { TRACK_FORMAT } from './track.js';
export type { Centerline, Corner, Gate, Point, Spawn, SplineSpec, Track, TrackMetrics, ValidationResult, Walls } from './track.js';
