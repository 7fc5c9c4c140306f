/**
 * Runs a task on the worker pool and turns every way it can end into either its output or the
 * HttpError to answer with: 422 for what the request itself asks (infeasible, or too big for
 * the deadline), 503 + Retry-After for what the server's load causes or a worker that died
 * under the task (replaced at once), 500 for a bug.
 */
import type { FastifyBaseLogger } from 'fastify';
import { HttpError, unavailable } from './errors.js';
import type { TaskInput, TaskOutput } from './pool/protocol.js';
import { DeadlineError, PoolError, type TrackPool } from './pool/track-pool.js';

/** Share of the deadline a task must have had on a worker for a timeout to be its own fault. */
const OWN_FAULT_SHARE = 0.5;

export interface RunOptions {
  readonly deadlineMs: number;
  readonly retryAfterS: number;
  readonly log: FastifyBaseLogger;
}

type Success<K extends TaskInput['kind']> = Extract<TaskOutput, { ok: true; kind: K }>;

/**
 * Runs one task with the request's deadline.
 * @param pool null when the app runs without workers (documentation only)
 * @throws HttpError ERR_INFEASIBLE / ERR_DEADLINE_EXCEEDED (422), ERR_OVERLOADED,
 *   ERR_SHUTTING_DOWN, ERR_NOT_READY, ERR_UNAVAILABLE, ERR_WORKER_CRASHED (503), ERR_INTERNAL (500)
 */
export async function runTaskOnPool<I extends TaskInput>(pool: TrackPool | null, input: I, options: RunOptions): Promise<Success<I['kind']>> {
  const { deadlineMs, retryAfterS } = options;
  if (pool === null) throw unavailable('ERR_NOT_READY', 'this server was started without generation workers', retryAfterS);
  let output: TaskOutput;
  try {
    output = await pool.run(input, deadlineMs);
  } catch (err) {
    throw fromPoolFailure(err, input, options);
  }
  if (output.ok) return output as Success<I['kind']>;
  const error = output.error;
  if (error.kind === 'infeasible') {
    throw new HttpError('ERR_INFEASIBLE', error.message, { reason: error.reason, hint: error.hint, issues: error.issues, attempts: error.attempts });
  }
  options.log.error({ task: input.kind, error: error.message, stack: error.stack }, 'the core threw an unexpected error');
  throw new HttpError('ERR_INTERNAL', 'Internal Server Error');
}

function fromPoolFailure(err: unknown, input: TaskInput, { deadlineMs, retryAfterS, log }: RunOptions): HttpError {
  if (err instanceof DeadlineError) {
    if (err.phase === 'running' && err.ranMs >= OWN_FAULT_SHARE * deadlineMs) {
      log.warn({ task: input.kind, deadlineMs, ranMs: Math.round(err.ranMs) }, 'task ran past its deadline; its worker was replaced');
      return new HttpError('ERR_DEADLINE_EXCEEDED', `${input.kind === 'generate' ? 'generating this track' : 'checking this track'} takes longer than the server's ${deadlineMs} ms deadline`, {
        reason: 'deadline_exceeded',
        hint:
          input.kind === 'generate'
            ? 'ask for less work: a shorter lap (lengthM), fewer corners (cornerCount) or less turning (curvatureBudgetDeg); an operator can raise LAPWRIGHT_DEADLINE_MS'
            : 'send a smaller track (fewer centerline points); an operator can raise LAPWRIGHT_DEADLINE_MS',
        issues: [],
      });
    }
    return unavailable('ERR_OVERLOADED', `the server is busy: this request waited ${Math.round(err.waitedMs)} ms for a worker and ran out of its ${deadlineMs} ms deadline; retry after ${retryAfterS} s`, retryAfterS);
  }
  if (err instanceof PoolError) {
    if (err.kind === 'worker_crashed') log.error({ task: input.kind, err }, 'a worker stopped while running a task; it was replaced');
    return poolErrorAnswer(err, retryAfterS);
  }
  log.error({ err }, 'unexpected pool failure');
  return new HttpError('ERR_INTERNAL', 'Internal Server Error');
}

/**
 * The 503 for a pool that cannot take work (queue full, shutting down, no workers) or whose
 * worker died under the task (the pool has replaced it, so the same request can succeed on a
 * retry; what killed the worker is logged by the caller, never shown). Shared by every route on
 * the pool.
 */
export function poolErrorAnswer(err: PoolError, retryAfterS: number): HttpError {
  switch (err.kind) {
    case 'queue_full':
      return unavailable('ERR_OVERLOADED', `the server is busy: ${err.message}; retry after ${retryAfterS} s`, retryAfterS);
    case 'closed':
      return unavailable('ERR_SHUTTING_DOWN', 'the server is shutting down; retry on another replica', retryAfterS);
    case 'unavailable':
      return unavailable('ERR_UNAVAILABLE', 'no generation workers are running on this server', retryAfterS);
    case 'worker_crashed':
      return unavailable('ERR_WORKER_CRASHED', `the worker thread making this answer stopped unexpectedly and was replaced; retry after ${retryAfterS} s`, retryAfterS);
  }
}
