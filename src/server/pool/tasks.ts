/**
 * The work a generation worker does, as a plain function (so tests can call it in-thread):
 * run the core, turn the track into the bytes of the format asked for (JSON, or an export) off
 * the server thread, and turn the core's typed errors into plain data.
 */
import { generateTrackJson, isInfeasibleError, validateTrack } from '../../core/index.js';
import type { Track } from '../../core/index.js';
import { EXPORT_FORMATS, exportFileName, exportTrack } from '../../export/index.js';
import { runDistanceTask, runRemakeTask, runSlotTask } from '../../batch/slot-task.js';
import type { ExportRequest, TaskInput, TaskOutput } from './protocol.js';

const ENCODER = new TextEncoder();

/** The JSON the core makes, as it is. */
const PLAIN_JSON: ExportRequest = { format: 'json', options: {} };

/**
 * Runs one task; never rejects.
 * @returns the output and the buffers to transfer with it (the answer's bytes)
 */
export async function runTask(input: TaskInput): Promise<{ output: TaskOutput; transfer: ArrayBuffer[] }> {
  try {
    if (input.kind === 'generate') {
      const made = generateTrackJson(input.request);
      const track = made.track;
      const { format, options } = input.export ?? PLAIN_JSON;
      // the default JSON is the bytes the core wrote for the id: no second serialization
      const data = format === 'json' && options.pretty !== true ? made.bytes : await exportTrack(track, format, options);
      const bytes = ownBuffer(typeof data === 'string' ? ENCODER.encode(data) : data);
      const output: TaskOutput = { ok: true, kind: 'generate', id: track.id, seed: track.seed, format, mediaType: EXPORT_FORMATS[format].mediaType, fileName: exportFileName(track, format, options), bytes };
      return { output, transfer: [bytes.buffer as ArrayBuffer] };
    }
    if (input.kind === 'batch-slot') return await runSlotTask(input);
    if (input.kind === 'remake') return await runRemakeTask(input);
    if (input.kind === 'distance') return runDistanceTask(input);
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

// bytes that own their whole ArrayBuffer, so transferring it moves nothing else (a view into a
// shared or pooled buffer is copied first)
function ownBuffer(bytes: Uint8Array): Uint8Array {
  const whole = bytes.byteOffset === 0 && bytes.byteLength === bytes.buffer.byteLength && bytes.buffer instanceof ArrayBuffer;
  return whole ? bytes : bytes.slice();
}
