/**
 * Messages between the server thread and its generation workers. Everything here crosses a
 * thread boundary by structured clone, so it is plain data (no classes, no functions).
 */
import type { Issue, InfeasibleReason, Seed, TrackRequest } from '../../core/index.js';

/** Work a worker can do: generate one track, or check one uploaded track. */
export type TaskInput = { readonly kind: 'generate'; readonly request: TrackRequest } | { readonly kind: 'validate'; readonly track: unknown };

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

/** What a task yields. A generated track travels as UTF-8 JSON bytes (transferred, not copied). */
export type TaskOutput =
  | { readonly ok: true; readonly kind: 'generate'; readonly id: string; readonly seed: Seed; readonly json: Uint8Array }
  | { readonly ok: true; readonly kind: 'validate'; readonly valid: boolean; readonly issues: readonly Issue[] }
  | { readonly ok: false; readonly error: InfeasibleData | InternalData };

/** Server → worker. */
export interface TaskMessage {
  readonly taskId: number;
  readonly input: TaskInput;
}

/** Worker → server: `ready` once its modules are loaded, then one `result` per task. */
export type WorkerMessage = { readonly type: 'ready' } | { readonly type: 'result'; readonly taskId: number; readonly output: TaskOutput };
