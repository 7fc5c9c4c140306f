/**
 * Every typed error and issue code of the core, in one place.
 *
 * Validators return {@link Issue}s and never throw; `generateTrack` decides whether to retry or
 * to throw {@link InfeasibleError}. Shells map `code` to HTTP status and CLI exit code.
 */

/** Machine-readable rule names of the validity checker (README "Error codes" lists them). */
export const ISSUE_CODES = [
  'structure',
  'centerline_crossing',
  'wall_crossing',
  'walls_touch',
  'wall_touches_centerline',
  'wall_nesting',
  'net_turning',
  'total_turning',
  'length',
  'width',
  'corner_count',
  'corner_mismatch',
  'turn_balance',
  'min_radius',
  'radius_vs_width',
  'clearance',
  'gate_order',
  'gate_crossing',
  'gate_endpoint',
  'gate_spacing',
  'gate_density',
  'gate_forward',
  'spawn_outside',
  'spawn_ahead',
  'spawn_alignment',
  'spawn_overlap',
] as const;

export type IssueCode = (typeof ISSUE_CODES)[number];

/**
 * One broken rule: where along the lap (`at.s` in metres from the start line, or an index),
 * what was measured and what the limit is.
 */
export interface Issue {
  readonly code: IssueCode;
  readonly at?: { readonly s?: number; readonly index?: number; readonly x?: number; readonly y?: number };
  readonly limit?: number;
  readonly actual?: number;
  readonly message: string;
}

/** Why a well-formed request cannot be met (machine-readable). */
export const INFEASIBLE_REASONS = [
  'turning_vs_balance',
  'turning_too_low',
  'corner_angle_too_large',
  'radius_vs_width',
  'corners_too_long',
  'gate_spacing_vs_length',
  'spawns_too_long',
  'spawns_too_wide',
  'vehicle_too_wide',
  'vehicle_cannot_turn',
  'reference_drive_failed',
  'no_valid_layout',
] as const;

export type InfeasibleReason = (typeof INFEASIBLE_REASONS)[number];

/** Error codes shared by every shell, with the HTTP status and CLI exit code they map to. */
export const ERROR_CODES = {
  ERR_INVALID_PARAMS: { status: 400, exit: 2 },
  ERR_INFEASIBLE: { status: 422, exit: 3 },
  ERR_INVALID_TRACK: { status: 400, exit: 2 },
} as const;

/**
 * A well-formed request that cannot be met: a closed-loop rule (Hopf's Umlaufsatz), a size rule,
 * or no valid layout within the attempt budget. Carries the reason, a hint naming the parameter
 * to change and by how much, and the issues of the last attempt when geometry was tried.
 */
export class InfeasibleError extends Error {
  readonly code = 'ERR_INFEASIBLE' as const;
  readonly reason: InfeasibleReason;
  readonly hint: string;
  readonly issues: readonly Issue[];
  readonly attempts: number;

  constructor(reason: InfeasibleReason, message: string, hint: string, issues: readonly Issue[] = [], attempts = 0) {
    super(message);
    this.name = 'InfeasibleError';
    this.reason = reason;
    this.hint = hint;
    this.issues = issues;
    this.attempts = attempts;
  }
}

/** True for the typed infeasibility error (also across realms, e.g. from a worker thread). */
export function isInfeasibleError(err: unknown): err is InfeasibleError {
  return err instanceof InfeasibleError || (typeof err === 'object' && err !== null && (err as { code?: unknown }).code === 'ERR_INFEASIBLE');
}
