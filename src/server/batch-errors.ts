/**
 * How a batch's failures become answers: before the stream starts, an HttpError (the route
 * throws it: 422, 503, 500); after, the same error body as the stream's last line.
 */
import type { FastifyBaseLogger } from 'fastify';
import { SlotFailure } from '../batch/run-batch.js';
import { CurriculumTooFlat } from '../batch/curriculum-run.js';
import { HttpError, unavailable } from './errors.js';
import { poolErrorAnswer } from './generation.js';
import { DeadlineError, PoolError } from './pool/track-pool.js';

/** Share of the deadline a slot must have had on a worker for a timeout to be its own fault. */
const OWN_FAULT_SHARE = 0.5;

/**
 * The HttpError for anything a batch or curriculum run threw.
 * @param what the work, for messages: 'a track of this batch', 'a sample of this curriculum'
 */
export function batchFailure(err: unknown, what: string, deadlineMs: number, retryAfterS: number, log: FastifyBaseLogger): HttpError {
  if (err instanceof HttpError) return err;
  if (err instanceof SlotFailure) {
    return new HttpError('ERR_INFEASIBLE', err.message, {
      reason: err.last?.reason ?? 'no_valid_layout',
      hint:
        err.reason === 'infeasible'
          ? `${err.last?.hint ?? 'change the parameters'}; or narrow the parameter ranges to values that are feasible`
          : err.reason === 'difficulty'
            ? 'widen the difficulty band, or move the parameter ranges towards it'
            : 'lower minNovelty, or widen the parameter ranges',
      issues: [],
      attempts: err.last?.attempts ?? 0,
    });
  }
  if (err instanceof CurriculumTooFlat) return new HttpError('ERR_INFEASIBLE', err.message, { reason: 'no_valid_layout', hint: 'ask for fewer stages, or a wider from..to', issues: [], attempts: 0 });
  if (err instanceof DeadlineError) {
    if (err.phase === 'running' && err.ranMs >= OWN_FAULT_SHARE * deadlineMs) {
      log.warn({ deadlineMs, ranMs: Math.round(err.ranMs) }, 'a batch slot ran past its deadline; its worker was replaced');
      return new HttpError('ERR_DEADLINE_EXCEEDED', `making ${what} takes longer than the server's ${deadlineMs} ms deadline`, {
        reason: 'deadline_exceeded',
        hint: 'ask for shorter laps (lengthM), fewer corners or less turning, or a wider difficulty band; an operator can raise LAPWRIGHT_DEADLINE_MS',
        issues: [],
      });
    }
    return unavailable('ERR_OVERLOADED', `the server is busy: ${what} waited ${Math.round(err.waitedMs)} ms for a worker; retry after ${retryAfterS} s`, retryAfterS);
  }
  if (err instanceof PoolError) {
    if (err.kind === 'worker_crashed') log.error({ err }, `a worker stopped while making ${what}; it was replaced`);
    return poolErrorAnswer(err, retryAfterS);
  }
  log.error({ err }, 'a batch failed unexpectedly');
  return new HttpError('ERR_INTERNAL', 'Internal Server Error');
}
