/**
 * The generator: resolve and check the request, then try deterministic attempts of the pipeline
 * (candidate.ts) until the checker accepts one; ship it with its id. A layout the checker refuses
 * is retried with the next attempt; every stage draws from its own named sub-stream of
 * (seed, attempt), so adding a stage never shifts another stage's numbers.
 */
import { createHash } from 'node:crypto';
import { buildCandidate } from './candidate.js';
import { InfeasibleError, type Issue } from './errors.js';
import { gridLayout } from './layout/spawn.js';
import { checkFeasibility, splitTurning } from './params/feasibility.js';
import { resolveParams } from './params/resolve.js';
import type { TrackParams, TrackRequest } from './params/types.js';
import type { Track } from './track.js';
import { validateTrack } from './validate/index.js';

/** Deterministic attempts before a request is refused as infeasible. */
export const MAX_ATTEMPTS = 64;

/**
 * Generates the track for a request: same request, same generatorVersion → the same bytes.
 *
 * @param request difficulty parameters and seed (metres, degrees); missing fields take defaults
 * @returns a track every guarantee of shared/DESIGN.md holds for, checked on its shipped numbers
 * @throws InfeasibleError when the request breaks a closed-loop rule (before any geometry) or no
 *   valid layout turns up within MAX_ATTEMPTS attempts (reason `no_valid_layout`)
 * @example generateTrack({ seed: 7 }).metrics.cornerCount // 9
 */
export function generateTrack(request: TrackRequest): Track {
  return generateTrackJson(request).track;
}

/**
 * `generateTrack`, also returning the track's JSON text — exactly `JSON.stringify(track)` — made
 * while computing the id, so a shell that ships the bytes need not serialize the track again.
 *
 * @throws InfeasibleError as generateTrack
 */
export function generateTrackJson(request: TrackRequest): { readonly track: Track; readonly json: string } {
  const p = resolveParams(request);
  const grid = gridLayout(p);
  checkFeasibility(p, grid.lengthM);
  const split = splitTurning(p);
  let last: readonly Issue[] = [];
  const failures = new Map<string, number>();
  for (let attempt = 0; attempt < MAX_ATTEMPTS; attempt++) {
    const candidate = buildCandidate(p, split, grid, attempt);
    let stage: string = candidate.stage;
    if (candidate.track !== null) {
      const result = validateTrack(candidate.track);
      if (result.valid) return withId(candidate.track);
      last = result.issues;
      stage = result.issues[0].code;
    }
    failures.set(stage, (failures.get(stage) ?? 0) + 1);
  }
  throw new InfeasibleError(
    'no_valid_layout',
    `no valid layout within ${MAX_ATTEMPTS} attempts (refused at: ${[...failures].map(([k, v]) => `${k} ${v}`).join(', ')})`,
    noLayoutHint(p, failures),
    last,
    MAX_ATTEMPTS,
  );
}

/**
 * The track with its id — hex sha256 of the canonical JSON of every other field — and the JSON
 * of the whole track, made by inserting the id after the leading format field of that text.
 */
export function withId(track: Track): { readonly track: Track; readonly json: string } {
  const { format, id: _unused, ...rest } = track;
  const body = JSON.stringify({ format, ...rest });
  const id = createHash('sha256').update(body).digest('hex');
  const head = `{"format":${JSON.stringify(format)},`;
  return { track: { format, id, ...rest }, json: `${head}"id":"${id}",${body.slice(head.length)}` };
}

function noLayoutHint(p: TrackParams, failures: Map<string, number>): string {
  const top = [...failures].sort((a, b) => b[1] - a[1])[0]?.[0] ?? 'plan';
  if (top === 'clearance') return `give the layout more room: raise lengthM (e.g. to ${Math.ceil(p.lengthM * 1.3)}), lower cornerCount or curvatureBudgetDeg, or narrow widthM`;
  if (top === 'min_radius') return `raise lengthM or lower minCornerRadiusM, so that corners need not sit at the radius limit`;
  if (top === 'gates') return `widen gateSpacingM`;
  // few corners against the loop's direction carrying a large share: each is a spiral hairpin
  const split = splitTurning(p);
  const minority = Math.min(split.leftCount, split.rightCount);
  const minorityMean = minority > 0 ? Math.min(split.leftTurningDeg, split.rightTurningDeg) / minority : 0;
  if (minorityMean > 150) {
    return `the ${minority} corners against the loop's direction must turn ${Math.round(minorityMean)} degrees each: move turnBalance towards 0.5 or lower curvatureBudgetDeg, or raise lengthM`;
  }
  return `raise lengthM (e.g. to ${Math.ceil(p.lengthM * 1.3)}), or lower cornerCount or curvatureBudgetDeg`;
}
