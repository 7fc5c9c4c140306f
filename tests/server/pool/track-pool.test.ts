import { afterEach, describe, expect, it } from 'vitest';
import { DeadlineError, PoolError, TrackPool } from '../../../src/server/pool/track-pool.js';
import type { TaskOutput } from '../../../src/server/pool/protocol.js';
import { TEST_WORKER_URL } from '../helpers.js';

const pools: TrackPool[] = [];
afterEach(async () => {
  await Promise.all(pools.splice(0).map((p) => p.destroy()));
});

function pool(workers: number, maxQueue: number, workerData?: Record<string, unknown>): TrackPool {
  const p = new TrackPool({ workers, maxQueue, workerUrl: TEST_WORKER_URL, workerData });
  pools.push(p);
  return p;
}

const block = (ms: number) => ({ kind: 'generate', request: { seed: `block:${ms}` } }) as const;

function trackOf(output: TaskOutput): { id: string; seed: unknown } {
  if (!output.ok || output.kind !== 'generate') throw new Error(`expected a generated track, got ${JSON.stringify(output)}`);
  return JSON.parse(new TextDecoder().decode(output.bytes)) as { id: string; seed: unknown };
}

describe('TrackPool', () => {
  it('runs the real generator off the calling thread and returns the track as JSON bytes', async () => {
    const p = new TrackPool({ workers: 1, maxQueue: 4 });
    pools.push(p);
    await p.ready;
    expect(p.isReady).toBe(true);
    const out = await p.run({ kind: 'generate', request: { seed: 7, lengthM: 800 } }, 30_000);
    const track = trackOf(out);
    expect(out.ok && out.kind === 'generate' && out.id).toBe(track.id);
    expect(track.seed).toBe(7);
  });

  it('exports on the worker: a glb task comes back as binary glTF bytes with its media type', async () => {
    const p = new TrackPool({ workers: 1, maxQueue: 4 });
    pools.push(p);
    const out = await p.run({ kind: 'generate', request: { seed: 7, lengthM: 600 }, export: { format: 'glb', options: {} } }, 30_000);
    if (!out.ok || out.kind !== 'generate') throw new Error(JSON.stringify(out));
    expect([out.format, out.mediaType]).toEqual(['glb', 'model/gltf-binary']);
    expect(Buffer.from(out.bytes.subarray(0, 4)).toString('latin1')).toBe('glTF');
  });

  it('turns an infeasible request into plain data with reason and hint', async () => {
    const p = pool(1, 4);
    const out = await p.run({ kind: 'generate', request: { seed: 1, turnBalance: 0, curvatureBudgetDeg: 900 } }, 30_000);
    expect(out).toMatchObject({ ok: false, error: { kind: 'infeasible', reason: 'turning_vs_balance', attempts: 0, issues: [] } });
  });

  it('fails a task whose input cannot be handed to a thread, alone: the worker stays free and the next task runs', async () => {
    const p = pool(1, 4);
    await p.ready;
    // a function is not cloneable (HTML structured clone): postMessage throws a DataCloneError
    const uncloneable = { kind: 'generate', request: { seed: 1, note: () => 1 } } as unknown as Parameters<TrackPool['run']>[0];
    await expect(p.run(uncloneable, 10_000)).rejects.toMatchObject({ name: 'DataCloneError' });
    expect(p.stats()).toMatchObject({ busy: 0, queued: 0 });
    await expect(p.run(block(0), 10_000)).resolves.toMatchObject({ ok: true });
  });

  it('refuses at once when every worker is busy and the queue is full', async () => {
    const p = pool(1, 1);
    await p.ready;
    const running = p.run(block(300), 10_000);
    const waiting = p.run(block(0), 10_000);
    expect(p.stats()).toMatchObject({ workers: 1, up: 1, busy: 1, queued: 1, maxQueue: 1 });
    await expect(p.run(block(0), 10_000)).rejects.toMatchObject({ name: 'PoolError', kind: 'queue_full' });
    await expect(running).resolves.toMatchObject({ ok: true });
    await expect(waiting).resolves.toMatchObject({ ok: true });
  });

  it('a task whose deadline runs out while waiting is taken out of the queue', async () => {
    const p = pool(1, 4);
    await p.ready;
    const running = p.run(block(400), 10_000);
    const err = await p.run(block(0), 50).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DeadlineError);
    expect(err).toMatchObject({ phase: 'queued', deadlineMs: 50, ranMs: 0 });
    expect(p.stats().queued).toBe(0);
    await running;
  });

  it('a task that runs past its deadline loses its worker, and a fresh worker takes the next task', async () => {
    const p = pool(1, 4);
    await p.ready;
    const err = await p.run(block(60_000), 100).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DeadlineError);
    expect(err).toMatchObject({ phase: 'running', deadlineMs: 100 });
    // the replacement loads, then serves
    await expect(p.run(block(0), 30_000)).resolves.toMatchObject({ ok: true, id: 'blocked' });
  });

  it('a worker that dies fails its task, and the pool replaces it', async () => {
    const p = pool(1, 4);
    await p.ready;
    const err = await p.run({ kind: 'generate', request: { seed: 'crash' } }, 30_000).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(PoolError);
    expect(err).toMatchObject({ kind: 'worker_crashed' });
    expect((err as Error).message).toContain('fixture worker crashed on purpose');
    await expect(p.run(block(0), 30_000)).resolves.toMatchObject({ ok: true });
  });

  it('gives up after workers keep failing to load, and refuses work', async () => {
    const p = pool(1, 4, { failToLoad: true });
    await expect(p.ready).rejects.toThrow(/3 workers in a row stopped while loading .*fixture worker told to fail while loading/);
    expect(p.hasFailed).toBe(true);
    expect(p.isReady).toBe(false);
    await expect(p.run(block(0), 1000)).rejects.toMatchObject({ kind: 'unavailable' });
  });

  it('close() lets accepted tasks finish, then refuses new ones', async () => {
    const p = pool(1, 4);
    await p.ready;
    const running = p.run(block(200), 10_000);
    const queued = p.run(block(0), 10_000);
    const closed = p.close();
    expect(p.isClosing).toBe(true);
    expect(p.isReady).toBe(false);
    await expect(p.run(block(0), 1000)).rejects.toMatchObject({ kind: 'closed' });
    await expect(running).resolves.toMatchObject({ ok: true });
    await expect(queued).resolves.toMatchObject({ ok: true });
    await closed;
    expect(p.stats()).toMatchObject({ up: 0, busy: 0, queued: 0 });
  });

  it('rejects impossible sizes', () => {
    expect(() => new TrackPool({ workers: 0, maxQueue: 1 })).toThrow('a pool needs at least 1 worker, got 0');
    expect(() => new TrackPool({ workers: 1, maxQueue: -1 })).toThrow('maxQueue must be an integer >= 0, got -1');
  });
});
