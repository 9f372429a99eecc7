import { describe, expect, it } from 'vitest';
import { DspError } from '../../src/dsp/errors';
import { createWorkerPool, isSuperseded, type WorkerLike, type WorkerRestartNotice } from '../../src/worker/pool';
import { PROTOCOL_VERSION, READY_ID, type WorkerRequest } from '../../src/worker/protocol';

/** A worker the test answers by hand: it records what it was sent and replies when told. */
class ScriptedWorker implements WorkerLike {
  onmessage: ((event: MessageEvent) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  onmessageerror: ((event: MessageEvent) => void) | null = null;
  readonly received: WorkerRequest[] = [];
  terminated = false;
  constructor(readonly index: number) {}
  postMessage(message: WorkerRequest): void {
    this.received.push(message);
  }
  terminate(): void {
    this.terminated = true;
  }
  ready(): void {
    this.onmessage?.({ data: { type: 'ready', id: READY_ID, protocolVersion: PROTOCOL_VERSION } } as MessageEvent);
  }
  /** Answers the last request with an error response carrying `message` (any answer type would do). */
  answer(message: string, id = this.received.at(-1)!.id): void {
    this.onmessage?.({ data: { type: 'error', id, protocolVersion: PROTOCOL_VERSION, code: 'INVALID_CONFIG', message } } as MessageEvent);
  }
  crash(reason: string): void {
    this.onerror?.({ message: reason, preventDefault: () => undefined } as ErrorEvent);
  }
}

function setup(size = 2, pipeline = 1) {
  const workers: ScriptedWorker[] = [];
  const notices: WorkerRestartNotice[] = [];
  const pool = createWorkerPool({
    size,
    pipeline,
    createWorker: () => {
      const worker = new ScriptedWorker(workers.length);
      workers.push(worker);
      return worker;
    },
    onRestart: (notice) => notices.push(notice),
  });
  return { pool, workers, notices };
}

/** pool.run with its promise marked as handled (the tests await only some of them). */
function runQuiet(pool: ReturnType<typeof createWorkerPool>, ...args: Parameters<ReturnType<typeof createWorkerPool>['run']>) {
  const task = pool.run(...args);
  task.result.catch(() => undefined);
  return task;
}

const generate = (tag: string) => ({ type: 'generate' as const, config: { tag } });
const tagsOf = (worker: ScriptedWorker) => worker.received.map((m) => (m.type === 'generate' ? (m.config as { tag: string }).tag : m.type));
const settled = (promise: Promise<unknown>) => promise.then((value) => ({ value }), (error: unknown) => ({ error }));

describe('worker pool', () => {
  it('starts workers on demand up to its size and queues the rest', () => {
    const { pool, workers } = setup(2);
    runQuiet(pool, generate('a'));
    expect(workers).toHaveLength(1);
    runQuiet(pool, generate('b'));
    runQuiet(pool, generate('c'));
    expect(workers).toHaveLength(2);
    expect(pool.load()).toEqual({ queued: 1, running: 2, workers: 2 });
    workers[0]!.answer('done a');
    expect(tagsOf(workers[0]!)).toEqual(['a', 'c']);
    pool.dispose();
  });

  it('rejects with the engine’s DspError and moves on to the next request', async () => {
    const { pool, workers } = setup(1);
    const first = runQuiet(pool, generate('a'));
    runQuiet(pool, generate('b'));
    workers[0]!.answer('bandwidthMHz 7 is not an LTE channel bandwidth');
    const error = await first.result.catch((e: unknown) => e);
    expect(error).toBeInstanceOf(DspError);
    expect(error).toMatchObject({ code: 'INVALID_CONFIG', message: expect.stringContaining('bandwidthMHz 7') });
    expect(tagsOf(workers[0]!)).toEqual(['a', 'b']);
    pool.dispose();
  });

  it('never sends a request its lane has superseded, and ignores a stale answer', async () => {
    const { pool, workers } = setup(1);
    const a = runQuiet(pool, generate('a'), { lane: 'generate' });
    const b = runQuiet(pool, generate('b'), { lane: 'generate' });
    const c = runQuiet(pool, generate('c'), { lane: 'generate' });
    const other = runQuiet(pool, generate('m'), { lane: 'measure' });
    expect(isSuperseded((await settled(a.result) as { error: unknown }).error)).toBe(true);
    expect(isSuperseded((await settled(b.result) as { error: unknown }).error)).toBe(true);
    workers[0]!.answer('stale a'); // the answer to "a" arrives after it was superseded
    expect(tagsOf(workers[0]!)).toEqual(['a', 'c']); // "b" was dropped in the queue
    workers[0]!.answer('c done');
    await expect(c.result).rejects.toMatchObject({ message: 'c done' });
    expect(tagsOf(workers[0]!)).toEqual(['a', 'c', 'm']); // other lanes are untouched
    workers[0]!.answer('m done');
    await expect(other.result).rejects.toMatchObject({ message: 'm done' });
    pool.dispose();
  });

  it('serves interactive requests before background ones', () => {
    const { pool, workers } = setup(1);
    runQuiet(pool, generate('block 0'), { priority: 'background' });
    runQuiet(pool, generate('block 1'), { priority: 'background' });
    runQuiet(pool, generate('edit'), { priority: 'interactive' });
    workers[0]!.answer('block 0 done');
    expect(tagsOf(workers[0]!)).toEqual(['block 0', 'edit']);
    workers[0]!.answer('edit done');
    expect(tagsOf(workers[0]!)).toEqual(['block 0', 'edit', 'block 1']);
    pool.dispose();
  });

  it('replaces a crashed worker, fails only its request and reports it', async () => {
    const { pool, workers, notices } = setup(2);
    workers.length = 0;
    const a = runQuiet(pool, generate('a'));
    const b = runQuiet(pool, generate('b'));
    workers[0]!.ready();
    workers[1]!.ready();
    workers[0]!.crash('out of memory');
    const error = await a.result.catch((e: unknown) => e);
    expect(error).toMatchObject({ code: 'INTERNAL', message: expect.stringContaining('crashed (out of memory)') });
    expect(notices).toEqual([{ reason: 'out of memory', failedRequestIds: [a.id], restartCount: 1 }]);
    expect(workers[0]!.terminated).toBe(true);
    expect(workers).toHaveLength(3); // a fresh worker took the crashed one's place
    workers[1]!.answer('b done');
    await expect(b.result).rejects.toMatchObject({ message: 'b done' });
    runQuiet(pool, generate('c'));
    expect(tagsOf(workers[1]!).concat(tagsOf(workers[2]!))).toContain('c');
    pool.dispose();
  });

  it('restarts a worker that died before it was ready only when a request needs one', () => {
    const { pool, workers, notices } = setup(1);
    runQuiet(pool, generate('a'));
    workers[0]!.crash('script failed to load');
    expect(notices).toHaveLength(1);
    expect(workers).toHaveLength(1);
    runQuiet(pool, generate('b'));
    expect(workers).toHaveLength(2);
    expect(tagsOf(workers[1]!)).toEqual(['b']);
    pool.dispose();
  });

  it('settles everything as superseded on dispose and refuses later requests', async () => {
    const { pool, workers } = setup(1);
    const running = runQuiet(pool, generate('a'));
    const queued = runQuiet(pool, generate('b'));
    pool.dispose();
    expect(isSuperseded(await running.result.catch((e: unknown) => e))).toBe(true);
    expect(isSuperseded(await queued.result.catch((e: unknown) => e))).toBe(true);
    expect(workers[0]!.terminated).toBe(true);
    expect(isSuperseded(await runQuiet(pool, generate('c')).result.catch((e: unknown) => e))).toBe(true);
  });

  it('refuses a pool without workers, or a pipeline depth below one', () => {
    expect(() => createWorkerPool({ size: 0, createWorker: () => new ScriptedWorker(0) })).toThrow(/whole number ≥ 1; got 0/);
    expect(() => createWorkerPool({ size: 1, pipeline: 0, createWorker: () => new ScriptedWorker(0) })).toThrow(/pipeline depth must be a whole number ≥ 1; got 0/);
  });
});

describe('worker pool with a pipeline', () => {
  const quick = { queueable: true } as const;

  it('sends queueable requests to busy workers, least loaded first, up to the depth', () => {
    const { pool, workers } = setup(2, 2);
    for (const tag of ['a', 'b', 'c', 'd', 'e']) runQuiet(pool, generate(tag), quick);
    // a and b start the two workers; c and d wait in their message queues; e waits in the pool.
    expect(tagsOf(workers[0]!)).toEqual(['a', 'c']);
    expect(tagsOf(workers[1]!)).toEqual(['b', 'd']);
    expect(pool.load()).toEqual({ queued: 1, running: 4, workers: 2 });
    workers[1]!.answer('b done', workers[1]!.received[0]!.id);
    expect(tagsOf(workers[1]!)).toEqual(['b', 'd', 'e']);
    pool.dispose();
  });

  it('answers each request with its own reply when a worker holds two', async () => {
    const { pool, workers } = setup(1, 2);
    const a = runQuiet(pool, generate('a'), quick);
    const b = runQuiet(pool, generate('b'), quick);
    const [idA, idB] = workers[0]!.received.map((m) => m.id);
    workers[0]!.answer('a done', idA);
    workers[0]!.answer('b done', idB);
    await expect(a.result).rejects.toMatchObject({ message: 'a done' });
    await expect(b.result).rejects.toMatchObject({ message: 'b done' });
    pool.dispose();
  });

  it('never queues behind a request that is not queueable, nor queues one that is not', () => {
    const { pool, workers } = setup(1, 2);
    runQuiet(pool, generate('long run block'), { priority: 'background' });
    runQuiet(pool, generate('edit'), quick);
    expect(tagsOf(workers[0]!)).toEqual(['long run block']);
    workers[0]!.answer('block done');
    expect(tagsOf(workers[0]!)).toEqual(['long run block', 'edit']);
    runQuiet(pool, generate('export'));
    expect(tagsOf(workers[0]!)).toEqual(['long run block', 'edit']);
    pool.dispose();
  });

  it('drops the answer of a request superseded after it was sent', async () => {
    const { pool, workers } = setup(1, 2);
    runQuiet(pool, generate('busy'), quick);
    const old = runQuiet(pool, generate('old'), { ...quick, lane: 'generate' });
    const fresh = runQuiet(pool, generate('new'), { ...quick, lane: 'generate' });
    expect(isSuperseded((await settled(old.result) as { error: unknown }).error)).toBe(true);
    const [idBusy, idOld] = workers[0]!.received.map((m) => m.id);
    workers[0]!.answer('busy done', idBusy);
    workers[0]!.answer('old done', idOld); // computed anyway: the worker had it queued
    expect(tagsOf(workers[0]!)).toEqual(['busy', 'old', 'new']);
    workers[0]!.answer('new done');
    await expect(fresh.result).rejects.toMatchObject({ message: 'new done' });
    pool.dispose();
  });

  it('fails every request a crashed worker held, saying which it was running', async () => {
    const { pool, workers, notices } = setup(1, 2);
    const a = runQuiet(pool, generate('a'), quick);
    const b = runQuiet(pool, generate('b'), quick);
    workers[0]!.ready();
    workers[0]!.crash('out of memory');
    await expect(a.result).rejects.toMatchObject({ code: 'INTERNAL', message: expect.stringContaining(`while working on request ${a.id}`) });
    await expect(b.result).rejects.toMatchObject({ code: 'INTERNAL', message: expect.stringContaining(`while holding request ${b.id}`) });
    expect(notices[0]).toMatchObject({ failedRequestIds: [a.id, b.id] });
    pool.dispose();
  });
});
