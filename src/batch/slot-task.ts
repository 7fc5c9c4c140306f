/**
 * The work a generation worker does for a batch, as plain functions (tests call them in-thread):
 * make one slot's candidate (makeSlotCandidate) and hand back its manifest entry and, when asked,
 * the track's bytes in a format; or measure the turning distance between two outlines. Everything
 * here crosses a thread boundary by structured clone, so it is plain data.
 */
import { encodeShape, generateTrackJson, makeSlotCandidate, manifestTrack, turningDistance, turningDistanceExact } from '../core/index.js';
import type { BatchPlan, InfeasibleReason, ManifestTrack, SlotFailureReason, SlotSkips, Track, TrackRequest } from '../core/index.js';
import { type ExportFormat, type ExportOptions, exportTrack } from '../export/index.js';

/** What a slot task returns besides the manifest entry: nothing, or the track's bytes in a format. */
export type SlotBytes = { readonly format: 'none' } | { readonly format: ExportFormat; readonly options: ExportOptions };

/** Make slot `index` of a batch from draw `from` on. */
export interface SlotTaskInput {
  readonly kind: 'batch-slot';
  readonly plan: BatchPlan;
  readonly index: number;
  readonly from: number;
  readonly bytes: SlotBytes;
}

/** Make a track again from its recorded parameters (to verify a manifest): its id, shape and bytes. */
export interface RemakeTaskInput {
  readonly kind: 'remake';
  readonly request: TrackRequest;
  readonly bytes: SlotBytes;
}

/** The turning-function distance between two closed outlines (flat [x0, y0, x1, y1, …]). */
export interface DistanceTaskInput {
  readonly kind: 'distance';
  readonly a: Float64Array;
  readonly b: Float64Array;
  /** 'exact': over every vertex alignment; 'binned': on `samples` bins of arc length. */
  readonly method: 'exact' | 'binned';
  readonly samples: number;
}

/** An infeasible draw's error, as plain data. */
export interface SlotInfeasible {
  readonly reason: InfeasibleReason;
  readonly message: string;
  readonly hint: string;
  readonly attempts: number;
}

/** How a slot ended, with the draws it skipped on the way. */
export type SlotResult =
  | (SlotSkips & {
      readonly ok: true;
      readonly entry: ManifestTrack;
      /** The track in the format asked for (JSON: exactly the text generate writes, with its newline); null for 'none'. */
      readonly bytes: Uint8Array | null;
    })
  | (SlotSkips & {
      readonly ok: false;
      readonly index: number;
      readonly reason: SlotFailureReason;
      readonly last: SlotInfeasible | null;
    });

export interface SlotTaskOutput {
  readonly ok: true;
  readonly kind: 'batch-slot';
  readonly result: SlotResult;
}

export interface RemakeTaskOutput {
  readonly ok: true;
  readonly kind: 'remake';
  readonly id: string;
  readonly shape: string;
  readonly bytes: Uint8Array | null;
}

export interface DistanceTaskOutput {
  readonly ok: true;
  readonly kind: 'distance';
  readonly distance: number;
}

const ENCODER = new TextEncoder();

/**
 * Makes one slot's candidate.
 * @throws whatever the core throws besides InfeasibleError (a bug): the worker reports it
 */
export async function runSlotTask(input: SlotTaskInput): Promise<{ output: SlotTaskOutput; transfer: ArrayBuffer[] }> {
  const outcome = makeSlotCandidate(input.plan, input.index, input.from);
  if (!outcome.ok) {
    const last = outcome.last === null ? null : { reason: outcome.last.reason, message: outcome.last.message, hint: outcome.last.hint, attempts: outcome.last.attempts };
    const result: SlotResult = { ok: false, index: outcome.index, reason: outcome.reason, last, skippedSplit: outcome.skippedSplit, redrawn: outcome.redrawn, skippedDifficulty: outcome.skippedDifficulty };
    return { output: { ok: true, kind: 'batch-slot', result }, transfer: [] };
  }
  const { candidate } = outcome;
  const entry = manifestTrack(candidate.track, { index: candidate.index, draw: candidate.draw, split: candidate.split, shape: candidate.shape });
  const bytes = await bytesOf(candidate.track, candidate.json, input.bytes);
  const result: SlotResult = { ok: true, entry, bytes, skippedSplit: outcome.skippedSplit, redrawn: outcome.redrawn, skippedDifficulty: outcome.skippedDifficulty };
  return { output: { ok: true, kind: 'batch-slot', result }, transfer: bytes === null ? [] : [bytes.buffer as ArrayBuffer] };
}

/**
 * Makes a track again from its recorded parameters.
 * @throws InfeasibleError when the parameters no longer make a track (the worker reports it)
 */
export async function runRemakeTask(input: RemakeTaskInput): Promise<{ output: RemakeTaskOutput; transfer: ArrayBuffer[] }> {
  const { track, bytes: json } = generateTrackJson(input.request);
  const bytes = await bytesOf(track, json, input.bytes);
  const output: RemakeTaskOutput = { ok: true, kind: 'remake', id: track.id, shape: encodeShape(track.centerline.points), bytes };
  return { output, transfer: bytes === null ? [] : [bytes.buffer as ArrayBuffer] };
}

/**
 * Measures a turning-function distance (rad).
 * @throws {RangeError} for a degenerate outline (caught by the worker's task runner)
 */
export function runDistanceTask(input: DistanceTaskInput): { output: DistanceTaskOutput; transfer: ArrayBuffer[] } {
  const distance = input.method === 'exact' ? turningDistanceExact(input.a, input.b) : turningDistance(input.a, input.b, input.samples);
  return { output: { ok: true, kind: 'distance', distance }, transfer: [] };
}

// the track in the format asked for; the default JSON is the bytes the core wrote for the id (no
// second serialization) with the newline every JSON export ends in
async function bytesOf(track: Track, json: Uint8Array, asked: SlotBytes): Promise<Uint8Array | null> {
  if (asked.format === 'none') return null;
  const { format, options } = asked;
  if (format === 'json' && options.pretty !== true) {
    const line = new Uint8Array(json.length + 1);
    line.set(json);
    line[json.length] = 0x0a;
    return line;
  }
  const data = await exportTrack(track, format, options);
  return typeof data === 'string' ? ENCODER.encode(data) : ownBuffer(data);
}

// bytes that own their whole ArrayBuffer, so transferring it moves nothing else
function ownBuffer(bytes: Uint8Array): Uint8Array {
  const whole = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength && bytes.buffer instanceof ArrayBuffer;
  return whole ? bytes : bytes.slice();
}
