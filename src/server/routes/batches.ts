/**
 * POST /v1/batches: many tracks for a training farm, streamed as newline-delimited JSON
 * (application/x-ndjson) as they are made, in index order, then the manifest as the last line.
 *
 * Back-pressure: the batch runs on the worker pool with at most `window` tracks in flight or
 * finished and waiting (src/batch/run-batch.ts), and the next line is written only once the
 * socket took the previous one (write() false → wait for 'drain'). So a client that reads slowly
 * holds at most `window` tracks in the server plus one line and the socket's buffer (16 KiB),
 * whatever the batch's size; the manifest's entries (about 2 KB per track, no geometry) are all
 * the batch keeps. A client that goes away stops the batch.
 *
 * The first track is made before the answer starts, so a batch that cannot start (infeasible
 * parameters, a busy server) is an ordinary error answer (422, 503); a later failure (the server
 * shutting down, a worker that died, a slot with no feasible draw) ends the stream with one
 * complete line {"error": {statusCode, code, ...}, "resume": {baseSeed, startIndex, lastIndex,
 * lastSeed}, "manifest": {...the tracks sent}}. Every track depends only on the request and its
 * index, so the same body with `startIndex` = resume.startIndex makes exactly the missing tracks.
 */
import { randomInt } from 'node:crypto';
import type { ServerResponse } from 'node:http';
import type { FastifyPluginAsync } from 'fastify';
import { SEED_MAX } from '../../core/index.js';
import type { Manifest, ManifestTrack, Seed } from '../../core/index.js';
import { poolExecutor } from '../../batch/executors.js';
import { type BatchJob, batchJob, finishManifest, readReference } from '../../batch/job.js';
import { type BatchTotals, runBatch, type SlotExecutor } from '../../batch/run-batch.js';
import type { SlotBytes } from '../../batch/slot-task.js';
import { type BatchBody, batchBodySchema } from '../../schema/batch.js';
import type { FieldIssue } from '../../schema/issues.js';
import type { ServiceState } from '../app.js';
import { batchFailure } from '../batch-errors.js';
import { resolveBatchOptions } from '../batch-options.js';
import { manifestSchema } from '../batch-schemas.js';
import { type ErrorBody, errorBody, type HttpError, unavailable } from '../errors.js';
import { invalidInput } from '../validation.js';
import { errorResponse, OVERLOADED_503 } from './responses.js';

/** Media type of the stream. */
export const NDJSON = 'application/x-ndjson';

/** What a server's batches hold right now and have done (tests read it; one per service). */
export interface BatchGauge {
  /** Tracks the workers finished for a batch (kept or not). */
  made: number;
  /** Lines handed to sockets (their write callback ran). */
  flushed: number;
  /** Tracks made and not yet flushed or dropped, now, over every batch. */
  held: number;
  /** The largest `held` seen. */
  maxHeld: number;
}

const GAUGES = new WeakMap<ServiceState, BatchGauge>();

/** The batch gauge of a service (`app.lapwright`). */
export function batchGauge(state: ServiceState): BatchGauge {
  let gauge = GAUGES.get(state);
  if (gauge === undefined) {
    gauge = { made: 0, flushed: 0, held: 0, maxHeld: 0 };
    GAUGES.set(state, gauge);
  }
  return gauge;
}

const FULL_JSON: SlotBytes = { format: 'json', options: {} };
const NO_BYTES: SlotBytes = { format: 'none' };

/** Batch route. */
export const batchRoutes: FastifyPluginAsync = async (app) => {
  const state = app.lapwright;
  const limits = resolveBatchOptions(state.options.batch, state.options.workers);
  app.post(
    '/v1/batches',
    {
      bodyLimit: limits.bodyLimitBytes,
      schema: {
        tags: ['datasets'],
        summary: 'Stream a batch of tracks (NDJSON), then its manifest',
        description: `One line per track, in index order, as it is made: the track itself (detail full, the same bytes as POST /v1/tracks) or its manifest entry (detail summary); the last line is the manifest (format lapwright.manifest/1). If the batch fails after it started (the server shutting down, a worker that died, a later track with no feasible draw), the last line is {"error": {...the error body}, "resume": {baseSeed, startIndex, lastIndex, lastSeed}, "manifest": {...the manifest of the tracks sent}}: the same body with that baseSeed and startIndex makes the rest. Every track's seed lies in the requested split; every numeric parameter may be a range {min, max}, drawn from the track's own seed; infeasible draws are redrawn with the next seed and counted. At most ${limits.maxCount} tracks per request on this server.`,
        body: batchBodySchema,
        response: {
          200: { description: 'Newline-delimited JSON: one line per track, then the manifest.', content: { [NDJSON]: { schema: manifestSchema } } },
          400: errorResponse('ERR_INVALID_PARAMS (every offending field in issues, with its path; count over the server\'s cap; startIndex not below count; a reference shape that does not decode) or ERR_INVALID_JSON.'),
          413: errorResponse('ERR_BODY_TOO_LARGE: the body (with its reference manifest) is over LAPWRIGHT_BATCH_BODY_LIMIT_BYTES.'),
          415: errorResponse('ERR_UNSUPPORTED_MEDIA_TYPE: the body is not application/json.'),
          422: errorResponse('ERR_INFEASIBLE: the first track found no feasible draw (reason and hint of the last one), no draw inside the difficulty band, or none novel enough; ERR_DEADLINE_EXCEEDED.'),
          503: OVERLOADED_503,
        },
      },
    },
    async (request, reply) => {
      const body = request.body as BatchBody;
      const issues: FieldIssue[] = [];
      if (body.count > limits.maxCount) issues.push({ path: 'count', message: `expected at most ${limits.maxCount} tracks per request on this server, got ${body.count}: ask in several batches (count and a different baseSeed each), or make large datasets with lapwright batch` });
      const startIndex = body.startIndex ?? 0;
      if (startIndex >= body.count) issues.push({ path: 'startIndex', message: `expected a track index below count (${body.count}), got ${startIndex}: a batch resumes at the index after the last track it sent` });
      const reference = body.reference === undefined ? null : readReference(body.reference.tracks, 'reference');
      if (reference !== null) issues.push(...reference.issues);
      if (issues.length > 0) throw invalidInput('ERR_INVALID_PARAMS', issues);
      if (state.pool === null) throw unavailable('ERR_NOT_READY', 'this server was started without generation workers', state.options.retryAfterS);

      // the core reads no randomness: a missing base seed is drawn here and echoed in the manifest
      const job = batchJob({ ...body, baseSeed: body.baseSeed ?? randomInt(0, SEED_MAX + 1) }, reference);
      const held = new HeldCount(batchGauge(state));
      const execute = held.counting(poolExecutor(state.pool, job.plan, body.detail === 'summary' ? NO_BYTES : FULL_JSON, state.options.deadlineMs));
      const run = runBatch({ indices: Array.from({ length: body.count - startIndex }, (_, i) => startIndex + i), window: limits.window, minNovelty: job.request.minNovelty, reference: job.reference, execute });
      const fail = (err: unknown) => batchFailure(err, 'a track of this batch', state.options.deadlineMs, state.options.retryAfterS, request.log);
      const pull = async () => {
        const next = await run.tracks.next();
        held.dropped(run.totals.skippedNovelty);
        return next;
      };

      // the first track decides between an ordinary error answer and a stream
      let next: Awaited<ReturnType<typeof pull>>;
      try {
        next = await pull();
      } catch (err) {
        await run.tracks.return(undefined);
        held.release();
        throw fail(err);
      }

      reply.hijack();
      const res = reply.raw;
      const headers: Record<string, string> = { 'content-type': `${NDJSON}; charset=utf-8`, 'cache-control': 'no-store', 'x-content-type-options': 'nosniff' };
      if (state.shuttingDown) headers.connection = 'close';
      res.writeHead(200, headers);
      const entries: ManifestTrack[] = [];
      // the run's counts up to the last track handed out (a failing slot's draws are not the stream's)
      let totals: BatchTotals = { ...run.totals };
      let gone = false;
      res.on('close', () => {
        gone = !res.writableFinished;
      });
      try {
        while (!next.done && !gone) {
          const { entry, bytes } = next.value;
          entries.push(entry);
          totals = { ...run.totals };
          await writeLine(res, bytes ?? Buffer.from(JSON.stringify(entry) + '\n'), held, () => gone);
          if (gone) break;
          if (state.shuttingDown) throw unavailable('ERR_SHUTTING_DOWN', `the server is shutting down after ${entries.length} of ${body.count - startIndex} tracks; ask for the rest on another replica (resume.startIndex)`, state.options.retryAfterS);
          next = await pull();
        }
        if (gone) request.log.info({ written: entries.length, count: body.count }, 'batch client went away');
        else {
          res.end(JSON.stringify(finishManifest(job, entries, run.totals, null)) + '\n');
          request.log.info({ tracks: entries.length, redrawn: run.totals.redrawn, skippedSplit: run.totals.skippedSplit, skippedNovelty: run.totals.skippedNovelty }, 'batch sent');
        }
      } catch (err) {
        const answer = fail(err);
        request.log.warn({ code: answer.code, written: entries.length }, `batch stopped: ${answer.message}`);
        if (!gone) res.end(JSON.stringify(interruptedLine(answer, job, entries, totals, startIndex)) + '\n');
      } finally {
        // stop asking the pool for more; tracks still on a worker finish and are dropped
        await run.tracks.return(undefined);
        held.release();
      }
    },
  );
};

/** Where a batch cut short stopped, and how to ask for the rest. */
export interface ResumePoint {
  /** The batch's base seed (drawn by the server when the request had none). */
  readonly baseSeed: Seed;
  /** The first index not sent: send the same body with this startIndex (and this baseSeed). */
  readonly startIndex: number;
  /** Index and seed of the last track sent; null when none was. */
  readonly lastIndex: number | null;
  readonly lastSeed: Seed | null;
}

/**
 * The last line of a batch that failed after its first line: the error body, where to resume,
 * and the manifest of the tracks sent (their entries, so that a client of detail full has draws
 * and shapes too, and the counts of their draws).
 */
export function interruptedLine(answer: HttpError, job: BatchJob, sent: readonly ManifestTrack[], totals: BatchTotals, startIndex: number): { error: ErrorBody; resume: ResumePoint; manifest: Manifest } {
  const last = sent.at(-1);
  return {
    error: errorBody(answer.code, answer.message, answer.extras),
    resume: { baseSeed: job.request.baseSeed, startIndex: startIndex + sent.length, lastIndex: last?.index ?? null, lastSeed: last?.seed ?? null },
    manifest: finishManifest(job, sent, totals, null),
  };
}

/**
 * Tracks of one batch that the server holds: made by a worker and not yet handed to the socket
 * (a line's write callback) nor dropped (novelty); added into the service's gauge.
 */
class HeldCount {
  private held = 0;
  private droppedSoFar = 0;
  private released = false;

  constructor(private readonly gauge: BatchGauge) {}

  /** The executor, counting each track a worker hands back. */
  counting(execute: SlotExecutor): SlotExecutor {
    return async (index, from) => {
      const result = await execute(index, from);
      if (result.ok) {
        this.gauge.made++;
        this.add(1);
      }
      return result;
    };
  }

  /** A line reached the socket (or failed to, once the client is gone). */
  flushed(): void {
    if (this.released) return;
    this.gauge.flushed++;
    this.add(-1);
  }

  /** The run has dropped `total` tracks for novelty so far. */
  dropped(total: number): void {
    this.add(this.droppedSoFar - total);
    this.droppedSoFar = total;
  }

  /** The batch is over: whatever it still held is garbage now. */
  release(): void {
    this.add(-this.held);
    this.released = true;
  }

  private add(n: number): void {
    if (this.released) return;
    this.held += n;
    this.gauge.held += n;
    if (this.gauge.held > this.gauge.maxHeld) this.gauge.maxHeld = this.gauge.held;
  }
}

// one line: write, then wait until the socket takes more (or the client is gone)
async function writeLine(res: ServerResponse, line: Uint8Array, held: HeldCount, isGone: () => boolean): Promise<void> {
  const ok = res.write(line, () => held.flushed());
  if (ok || isGone()) return;
  // listeners removed as soon as either fires: a batch waits once per line
  await new Promise<void>((resolve) => {
    const done = (): void => {
      res.off('drain', done);
      res.off('close', done);
      resolve();
    };
    res.on('drain', done);
    res.on('close', done);
  });
}

/** The OpenAPI tag of the training-farm routes. */
export const DATASETS_TAG = { name: 'datasets', description: 'Batches, held-out splits, novelty and curricula for training farms' };
