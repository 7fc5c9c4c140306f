/**
 * Messages between the server thread and its generation workers. Everything here crosses a
 * thread boundary by structured clone, so it is plain data (no classes, no functions).
 */
import type { Issue, InfeasibleReason, Seed, TrackRequest } from '../../core/index.js';
import type { ExportFormat, ExportOptions } from '../../export/index.js';
import type { DistanceTaskInput, DistanceTaskOutput, RemakeTaskInput, RemakeTaskOutput, SlotTaskInput, SlotTaskOutput } from '../../batch/slot-task.js';

/** How a generated track is to be answered: an export format and its options (checked by the server). */
export interface ExportRequest {
  readonly format: ExportFormat;
  readonly options: ExportOptions;
}

/**
 * Work a worker can do: generate one track (as JSON, or exported when `export` says so), check
 * one uploaded track, make one slot of a batch, make a manifest's track again, or measure a
 * turning distance (the last three: src/batch/slot-task.ts).
 */
export type TaskInput =
  | { readonly kind: 'generate'; readonly request: TrackRequest; readonly export?: ExportRequest }
  | { readonly kind: 'validate'; readonly track: unknown }
  | SlotTaskInput
  | RemakeTaskInput
  | DistanceTaskInput;

/** The typed infeasibility error of the core, as plain data. */
export interface InfeasibleData {
  readonly kind: 'infeasible';
  readonly reason: InfeasibleReason;
  readonly message: string;
  readonly hint: string;
  readonly issues: readonly Issue[];
  readonly attempts: number;
}

/** Anything else the core threw (a bug): logged by the server, never shown to a client. */
export interface InternalData {
  readonly kind: 'internal';
  readonly message: string;
  readonly stack?: string;
}

/** A generated track, as the bytes of the format asked for (transferred, not copied). */
export interface GeneratedData {
  readonly ok: true;
  readonly kind: 'generate';
  readonly id: string;
  readonly seed: Seed;
  readonly format: ExportFormat;
  /** The format's media type, e.g. model/gltf-binary. */
  readonly mediaType: string;
  /** A file name for the bytes, e.g. track-d68eba0e.glb. */
  readonly fileName: string;
  /** JSON, SVG and CSV as UTF-8 text; glb as binary glTF. */
  readonly bytes: Uint8Array;
}

/** What a task yields. */
export type TaskOutput =
  | GeneratedData
  | { readonly ok: true; readonly kind: 'validate'; readonly valid: boolean; readonly issues: readonly Issue[] }
  | SlotTaskOutput
  | RemakeTaskOutput
  | DistanceTaskOutput
  | { readonly ok: false; readonly error: InfeasibleData | InternalData };

/** Server → worker. */
export interface TaskMessage {
  readonly taskId: number;
  readonly input: TaskInput;
}

/** Worker → server: `ready` once its modules are loaded, then one `result` per task. */
export type WorkerMessage = { readonly type: 'ready' } | { readonly type: 'result'; readonly taskId: number; readonly output: TaskOutput };
