/**
 * The work a generation worker does, as a plain function (so tests can call it in-thread):
 * run the core, serialize the track to JSON bytes off the server thread, and turn the core's
 * typed errors into plain data.
 */
import { generateTrackJson, isInfeasibleError, validateTrack } from '../../core/index.js';
import type { Track } from '../../core/index.js';
import type { TaskInput, TaskOutput } from './protocol.js';

const ENCODER = new TextEncoder();

/**
 * Runs one task; never throws.
 * @returns the output and the buffers to transfer with it (the track's JSON bytes)
 */
export function runTask(input: TaskInput): { output: TaskOutput; transfer: ArrayBuffer[] } {
  try {
    if (input.kind === 'generate') {
      // the core hands back the JSON it made for the id: no second serialization
      const made = generateTrackJson(input.request);
      const track = made.track;
      const json = ENCODER.encode(made.json);
      return { output: { ok: true, kind: 'generate', id: track.id, seed: track.seed, json }, transfer: [json.buffer as ArrayBuffer] };
    }
    // the server checked the shape with trackSchema; the checker takes it from here
    const result = validateTrack(input.track as Track);
    return { output: { ok: true, kind: 'validate', valid: result.valid, issues: result.issues }, transfer: [] };
  } catch (err) {
    if (isInfeasibleError(err)) {
      const { reason, message, hint, issues, attempts } = err;
      return { output: { ok: false, error: { kind: 'infeasible', reason, message, hint, issues: issues ?? [], attempts: attempts ?? 0 } }, transfer: [] };
    }
    const e = err instanceof Error ? err : new Error(String(err));
    return { output: { ok: false, error: { kind: 'internal', message: `${e.name}: ${e.message}`, stack: e.stack } }, transfer: [] };
  }
}
