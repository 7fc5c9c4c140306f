/**
 * The generator: resolve and check the request, then try deterministic attempts of the pipeline
 * (candidate.ts) until the checker accepts one and the reference drive laps it; ship it with its
 * id. A layout the checker refuses is retried with the next attempt, and so is one the drive
 * cannot lap under drivability 'avoid' ('refuse' answers infeasible with the place); every stage
 * draws from its own named sub-stream of (seed, attempt), so adding a stage never shifts another
 * stage's numbers.
 */
import { createHash } from 'node:crypto';
import { buildCandidate } from './candidate.js';
import type { DriveResult } from './drive/reference-drive.js';
import { InfeasibleError, type Issue } from './errors.js';
import { jsonBytesWithSha256 } from './json-bytes.js';
import { gridLayout } from './layout/spawn.js';
import { cornerRadiusFloorM } from './params/drivability.js';
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
 * @throws InfeasibleError when the request breaks a closed-loop rule or the vehicle's limits
 *   (before any geometry), when no valid layout the reference drive can lap turns up within
 *   MAX_ATTEMPTS attempts (reason `no_valid_layout`), or, under drivability 'refuse', when the
 *   drive cannot lap the first valid layout (`reference_drive_failed`)
 * @example generateTrack({ seed: 7 }).metrics.cornerCount // 9
 */
export function generateTrack(request: TrackRequest): Track {
  return withId(generateUnsigned(request), false).track;
}

/**
 * `generateTrack`, also returning the track's JSON — exactly `JSON.stringify(track)` — as UTF-8
 * bytes, written while computing the id, so a shell that ships the bytes neither serializes the
 * track again nor makes a string of it. The bytes own their whole ArrayBuffer (transferable).
 *
 * @throws InfeasibleError as generateTrack
 * @example new TextDecoder().decode(generateTrackJson({ seed: 7 }).bytes).startsWith('{"format":') // true
 */
export function generateTrackJson(request: TrackRequest): { readonly track: Track; readonly bytes: Uint8Array } {
  const { track, bytes } = withId(generateUnsigned(request), true);
  return { track, bytes };
}

// the first track the checker accepts and the reference drive laps, with its id still empty
function generateUnsigned(request: TrackRequest): Track {
  const echo = resolveParams(request);
  const grid = gridLayout(echo);
  checkFeasibility(echo, grid.lengthM);
  const p = withRadiusFloor(echo, cornerRadiusFloorM(echo), grid.lengthM);
  const split = splitTurning(p);
  let last: readonly Issue[] = [];
  const failures = new Map<string, number>();
  for (let attempt = 0; attempt < MAX_ATTEMPTS; attempt++) {
    const candidate = buildCandidate(p, split, grid, attempt, echo);
    let stage: string = candidate.stage;
    if (candidate.track !== null) {
      const result = validateTrack(candidate.track);
      if (result.valid && candidate.drive.completed) return candidate.track;
      if (result.valid) {
        if (p.drivability === 'refuse') throw driveRefusal(candidate.drive, attempt + 1);
        stage = 'reference_drive';
      } else {
        last = result.issues;
        stage = result.issues[0].code;
      }
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
 * The track with its id — hex sha256 of the canonical JSON of every other field — and, when
 * `keepBytes`, the JSON bytes of the whole track, made by inserting the id after the leading
 * format field of that text.
 */
function withId(track: Track, keepBytes: true): { readonly track: Track; readonly bytes: Uint8Array };
function withId(track: Track, keepBytes: boolean): { readonly track: Track; readonly bytes: Uint8Array | null };
function withId(track: Track, keepBytes: boolean): { readonly track: Track; readonly bytes: Uint8Array | null } {
  const { format, id: _unused, ...rest } = track;
  const whole = { format, ...rest };
  // jsonBytesWithSha256 writes the same text as JSON.stringify, as bytes (faster on numbers);
  // text beyond ASCII (a string seed) goes through JSON.stringify
  const made = jsonBytesWithSha256(whole);
  const body = made === null ? UTF8.encode(JSON.stringify(whole)) : made.bytes;
  const id = made === null ? createHash('sha256').update(body).digest('hex') : made.sha256;
  const signed: Track = { format, id, ...rest };
  if (!keepBytes) return { track: signed, bytes: null };
  const head = UTF8.encode(`{"format":${JSON.stringify(format)},`).length;
  const idField = UTF8.encode(`"id":"${id}",`);
  const bytes = new Uint8Array(body.length + idField.length);
  bytes.set(body.subarray(0, head));
  bytes.set(idField, head);
  bytes.set(body.subarray(head), head + idField.length);
  return { track: signed, bytes };
}

const UTF8 = new TextEncoder();

// the parameters the geometry follows: minCornerRadiusM raised to the floor, whose feasibility
// is checked again with the raise named in the message
function withRadiusFloor(p: TrackParams, floorM: number, gridLengthM: number): TrackParams {
  if (floorM <= p.minCornerRadiusM) return p;
  const raised = { ...p, minCornerRadiusM: floorM };
  try {
    checkFeasibility(raised, gridLengthM);
  } catch (err) {
    if (!(err instanceof InfeasibleError)) throw err;
    const why = `minCornerRadiusM raised from ${p.minCornerRadiusM} to ${round2(floorM)} m, the tightest radius the vehicle can follow (drivability "avoid")`;
    throw new InfeasibleError(err.reason, `${err.message} (${why})`, `${err.hint}; or let the vehicle turn tighter (a larger vehicle.maxSteerDeg or a shorter vehicle.wheelbaseM)`);
  }
  return raised;
}

// the reference drive could not lap the first valid layout: where and why
function driveRefusal(d: DriveResult, attempts: number): InfeasibleError {
  const where = `s=${round2(d.atS)} m (x ${round2(d.at[0])}, y ${round2(d.at[1])})`;
  const message =
    d.failure === 'wall'
      ? `the reference drive's footprint crossed the ${d.side} wall at ${where}: the vehicle cannot lap this layout with a pure pursuit controller`
      : `the reference drive did not finish the lap in time (stuck near ${where})`;
  return new InfeasibleError(
    'reference_drive_failed',
    message,
    'widen the road (widthM.min), raise minCornerRadiusM, give the vehicle more steering lock or a narrower footprint, or set drivability to "avoid" to retry other layouts',
    [],
    attempts,
  );
}

function round2(x: number): number {
  return Math.round(x * 100) / 100;
}

function noLayoutHint(p: TrackParams, failures: Map<string, number>): string {
  const top = [...failures].sort((a, b) => b[1] - a[1])[0]?.[0] ?? 'plan';
  if (top === 'reference_drive') return `the reference drive could not lap the layouts: widen the road (widthM.min), raise minCornerRadiusM, or give the vehicle more steering lock or a narrower footprint`;
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
