/**
 * A fixed pool of worker threads that runs the core off the server's event loop, one task per
 * worker at a time, with a bounded queue and a deadline per task:
 *
 *   run() ──► queue (≤ maxQueue waiting) ──► idle worker ──► result
 *      │            │ deadline while waiting: DeadlineError 'queued'
 *      │            └─────────────────────── deadline while running: the worker is terminated
 *      │                                      and replaced, DeadlineError 'running'
 *      └─ queue full: PoolError 'queue_full' (at once, nothing waits)
 *
 * The deadline counts from the call to run(), so the time a caller waits is bounded whatever
 * the load. The worker entry is a compiled .js file next to this module in production; when
 * this module runs from TypeScript sources (tests, `node --import tsx`), the .ts entry is loaded
 * through tsx by dev-worker.mjs.
 */
import { performance } from 'node:perf_hooks';
import { Worker } from 'node:worker_threads';
import type { TaskInput, TaskMessage, TaskOutput, WorkerMessage } from './protocol.js';

/** Workers that fail before they ever say `ready`, in a row, after which the pool gives up. */
const MAX_STARTUP_FAILURES = 3;

export interface TrackPoolOptions {
  /** Worker threads, at least 1. */
  readonly workers: number;
  /** Tasks that may wait for a worker; more are refused at once. 0 = none wait. */
  readonly maxQueue: number;
  /** Worker entry module (.js, or .ts through tsx); default: track-worker next to this file. */
  readonly workerUrl?: URL;
  /** Extra data handed to each worker as `workerData` (test fixtures read it). */
  readonly workerData?: Readonly<Record<string, unknown>>;
}

/** Why the pool refused or lost a task. */
export type PoolErrorKind = 'queue_full' | 'closed' | 'unavailable' | 'worker_crashed';

/** The pool refused a task (full, closed, no workers) or its worker died under it. */
export class PoolError extends Error {
  readonly kind: PoolErrorKind;

  constructor(kind: PoolErrorKind, message: string) {
    super(message);
    this.name = 'PoolError';
    this.kind = kind;
  }
}

/** A task ran out of time: still waiting for a worker ('queued') or on one ('running'). */
export class DeadlineError extends Error {
  readonly phase: 'queued' | 'running';
  readonly deadlineMs: number;
  /** Time spent waiting for a worker, ms. */
  readonly waitedMs: number;
  /** Time spent on a worker, ms (0 when it never started). */
  readonly ranMs: number;

  constructor(phase: 'queued' | 'running', deadlineMs: number, waitedMs: number, ranMs: number) {
    super(`task exceeded its ${deadlineMs} ms deadline while ${phase} (waited ${Math.round(waitedMs)} ms, ran ${Math.round(ranMs)} ms)`);
    this.name = 'DeadlineError';
    this.phase = phase;
    this.deadlineMs = deadlineMs;
    this.waitedMs = waitedMs;
    this.ranMs = ranMs;
  }
}

/** Load of the pool at one moment. */
export interface PoolStats {
  /** Workers configured. */
  readonly workers: number;
  /** Workers loaded and able to take a task. */
  readonly up: number;
  readonly busy: number;
  readonly queued: number;
  readonly maxQueue: number;
}

interface Job {
  readonly taskId: number;
  readonly input: TaskInput;
  readonly deadlineMs: number;
  readonly enqueuedAt: number;
  startedAt: number;
  slot: Slot | null;
  timer: NodeJS.Timeout | null;
  readonly resolve: (output: TaskOutput) => void;
  readonly reject: (err: Error) => void;
}

interface Slot {
  readonly worker: Worker;
  up: boolean;
  job: Job | null;
  /** Terminated on purpose (deadline or close): its exit is expected. */
  retired: boolean;
  /** What the worker threw, if it stopped on an uncaught error. */
  error: Error | null;
}

/**
 * The worker pool. Lifecycle: construct (workers start loading) → `ready` → run() … → close().
 * @example
 * const pool = new TrackPool({ workers: 2, maxQueue: 32 });
 * await pool.ready;
 * const out = await pool.run({ kind: 'generate', request: { seed: 7 } }, 10_000);
 * await pool.close();
 */
export class TrackPool {
  /** Resolves once every worker has loaded; rejects if workers keep failing to start. */
  readonly ready: Promise<void>;
  private readonly options: TrackPoolOptions;
  private readonly slots = new Set<Slot>();
  private readonly queue: Job[] = [];
  private nextTaskId = 1;
  private startupFailures = 0;
  private isUp = false;
  private failure: Error | null = null;
  private closing = false;
  private drained: (() => void) | null = null;
  private resolveReady!: () => void;
  private rejectReady!: (err: Error) => void;

  constructor(options: TrackPoolOptions) {
    if (!Number.isInteger(options.workers) || options.workers < 1) throw new RangeError(`a pool needs at least 1 worker, got ${options.workers}`);
    if (!Number.isInteger(options.maxQueue) || options.maxQueue < 0) throw new RangeError(`maxQueue must be an integer >= 0, got ${options.maxQueue}`);
    this.options = options;
    this.ready = new Promise<void>((resolve, reject) => {
      this.resolveReady = resolve;
      this.rejectReady = reject;
    });
    // a pool nobody awaits must not crash the process with an unhandled rejection
    this.ready.catch(() => undefined);
    for (let i = 0; i < options.workers; i++) this.spawn();
  }

  /** True once every worker has loaded, until close() begins or the pool fails. */
  get isReady(): boolean {
    return this.isUp && !this.closing && this.failure === null;
  }

  /** True when workers kept failing to load: the pool takes no tasks. */
  get hasFailed(): boolean {
    return this.failure !== null;
  }

  /** True from the first close() call on. */
  get isClosing(): boolean {
    return this.closing;
  }

  /** Load figures for readiness answers and logs. */
  stats(): PoolStats {
    let up = 0;
    let busy = 0;
    for (const slot of this.slots) {
      if (slot.retired) continue;
      if (slot.up) up++;
      if (slot.job !== null) busy++;
    }
    return { workers: this.options.workers, up, busy, queued: this.queue.length, maxQueue: this.options.maxQueue };
  }

  /**
   * Runs one task on a worker.
   * @param deadlineMs time budget from now, waiting included
   * @throws (rejects) PoolError when the queue is full, the pool is closing or has no workers,
   *   or the worker died; DeadlineError when the budget runs out (the worker is replaced)
   */
  run(input: TaskInput, deadlineMs: number): Promise<TaskOutput> {
    if (this.closing) return Promise.reject(new PoolError('closed', 'the pool is shutting down'));
    if (this.failure !== null) return Promise.reject(new PoolError('unavailable', `no generation workers: ${this.failure.message}`));
    if (this.queue.length >= this.options.maxQueue && this.idleSlot() === null) {
      return Promise.reject(new PoolError('queue_full', `all ${this.options.workers} workers are busy and ${this.queue.length} tasks are waiting (the most allowed)`));
    }
    return new Promise<TaskOutput>((resolve, reject) => {
      const job: Job = { taskId: this.nextTaskId++, input, deadlineMs, enqueuedAt: performance.now(), startedAt: 0, slot: null, timer: null, resolve, reject };
      job.timer = setTimeout(() => this.expire(job), deadlineMs);
      this.queue.push(job);
      this.dispatch();
    });
  }

  /**
   * Stops taking tasks, lets every accepted task finish (each is bounded by its deadline), then
   * terminates the workers.
   */
  async close(): Promise<void> {
    this.closing = true;
    if (this.queue.length > 0 || this.busyCount() > 0) {
      await new Promise<void>((resolve) => {
        this.drained = resolve;
      });
    }
    await this.terminateAll();
  }

  /** Terminates every worker now and fails the tasks they had or were waiting for. */
  async destroy(): Promise<void> {
    this.closing = true;
    for (const job of this.queue.splice(0)) this.settle(job, new PoolError('closed', 'the pool was destroyed'));
    for (const slot of this.slots) if (slot.job !== null) this.settle(slot.job, new PoolError('closed', 'the pool was destroyed'));
    await this.terminateAll();
  }

  private spawn(): void {
    const worker = startWorker(this.options);
    const slot: Slot = { worker, up: false, job: null, retired: false, error: null };
    this.slots.add(slot);
    worker.on('message', (message: WorkerMessage) => this.onMessage(slot, message));
    // an uncaught error in the worker ends it: 'exit' follows and does the cleanup
    worker.on('error', (err) => {
      slot.error = err;
    });
    worker.on('exit', (code) => this.onExit(slot, code));
  }

  private onMessage(slot: Slot, message: WorkerMessage): void {
    if (slot.retired) return;
    if (message.type === 'ready') {
      slot.up = true;
      this.startupFailures = 0;
      if (!this.isUp && this.upCount() >= this.options.workers) {
        this.isUp = true;
        this.resolveReady();
      }
    } else {
      const job = slot.job;
      slot.job = null;
      if (job !== null && job.taskId === message.taskId) this.settle(job, null, message.output);
    }
    this.dispatch();
  }

  private onExit(slot: Slot, code: number): void {
    this.slots.delete(slot);
    if (slot.retired) return;
    const cause = slot.error?.message ?? `exit code ${code}`;
    if (slot.job !== null) {
      const job = slot.job;
      slot.job = null;
      this.settle(job, new PoolError('worker_crashed', `the worker running this task stopped (${cause})`));
    }
    if (this.closing) return this.checkDrained();
    if (!slot.up && ++this.startupFailures >= MAX_STARTUP_FAILURES) return this.fail(new Error(`${MAX_STARTUP_FAILURES} workers in a row stopped while loading (${cause})`));
    this.spawn();
  }

  // every worker failed to load: refuse all work from now on
  private fail(err: Error): void {
    this.failure = err;
    this.rejectReady(err);
    for (const job of this.queue.splice(0)) this.settle(job, new PoolError('unavailable', `no generation workers: ${err.message}`));
    void this.terminateAll();
  }

  private dispatch(): void {
    while (this.queue.length > 0) {
      const slot = this.idleSlot();
      if (slot === null) return;
      const job = this.queue.shift()!;
      job.slot = slot;
      job.startedAt = performance.now();
      slot.job = job;
      const message: TaskMessage = { taskId: job.taskId, input: job.input };
      try {
        slot.worker.postMessage(message);
      } catch (err) {
        // the input cannot be handed to a thread (not cloneable, or too deep to clone): this task
        // fails alone, and the worker, which never saw it, stays free for the next one
        slot.job = null;
        job.slot = null;
        this.settle(job, err instanceof Error ? err : new Error(String(err)));
      }
    }
  }

  private expire(job: Job): void {
    job.timer = null;
    const now = performance.now();
    const slot = job.slot;
    if (slot === null) {
      const at = this.queue.indexOf(job);
      if (at >= 0) this.queue.splice(at, 1);
      this.settle(job, new DeadlineError('queued', job.deadlineMs, now - job.enqueuedAt, 0));
      return;
    }
    // the core cannot be interrupted: stop the thread and put a fresh one in its place
    slot.retired = true;
    slot.job = null;
    this.slots.delete(slot);
    void slot.worker.terminate();
    this.settle(job, new DeadlineError('running', job.deadlineMs, job.startedAt - job.enqueuedAt, now - job.startedAt));
    if (!this.closing || this.queue.length > 0) this.spawn();
    this.dispatch();
  }

  private settle(job: Job, err: Error | null, output?: TaskOutput): void {
    if (job.timer !== null) clearTimeout(job.timer);
    job.timer = null;
    if (err !== null) job.reject(err);
    else job.resolve(output!);
    this.checkDrained();
  }

  private checkDrained(): void {
    if (this.closing && this.drained !== null && this.queue.length === 0 && this.busyCount() === 0) {
      const done = this.drained;
      this.drained = null;
      done();
    }
  }

  private idleSlot(): Slot | null {
    for (const slot of this.slots) if (slot.up && !slot.retired && slot.job === null) return slot;
    return null;
  }

  private upCount(): number {
    let n = 0;
    for (const slot of this.slots) if (slot.up && !slot.retired) n++;
    return n;
  }

  private busyCount(): number {
    let n = 0;
    for (const slot of this.slots) if (slot.job !== null) n++;
    return n;
  }

  private async terminateAll(): Promise<void> {
    const all = [...this.slots];
    for (const slot of all) slot.retired = true;
    this.slots.clear();
    await Promise.all(all.map((slot) => slot.worker.terminate()));
  }
}

// the compiled worker runs as is; a .ts entry goes through tsx (see dev-worker.mjs)
function startWorker(options: TrackPoolOptions): Worker {
  const entry = options.workerUrl ?? defaultWorkerUrl();
  const data = { ...options.workerData, lapwrightEntry: entry.href };
  if (entry.pathname.endsWith('.ts')) return new Worker(new URL('./dev-worker.mjs', import.meta.url), { workerData: data });
  return new Worker(entry, { workerData: data });
}

/** The worker entry next to this module: track-worker.js when built, track-worker.ts in sources. */
export function defaultWorkerUrl(): URL {
  const ext = import.meta.url.endsWith('.ts') ? '.ts' : '.js';
  return new URL(`./track-worker${ext}`, import.meta.url);
}
