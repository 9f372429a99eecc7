/**
 * A small pool of engine workers behind the typed protocol (page side; no DSP here).
 *
 * - Each worker runs one request at a time; the pool keeps the queue, so a request that a newer one
 *   has superseded is dropped before it is ever sent. With `pipeline` > 1 a busy worker may also hold
 *   short "queueable" requests in its own message queue (behind such requests only), so it starts the next
 *   one the moment it finishes instead of waiting for the page to answer — the page may be drawing. A
 *   request superseded after it was sent runs anyway and its answer is dropped.
 * - Lanes: a request in lane L supersedes the queued and running requests of lane L (the newest
 *   configuration wins). A superseded request settles with SupersededError; a running one's answer
 *   is ignored when it comes.
 * - Priorities: interactive requests (the plots of the configuration being edited) go before
 *   background ones (Monte-Carlo blocks), so editing stays responsive during a long run.
 * - Workers start on demand, up to `size`. A worker that crashes is terminated and replaced; its
 *   request rejects with an INTERNAL DspError saying so, and `onRestart` tells the page. A worker
 *   that dies before it was ready (its script failed to load) is restarted only when needed.
 */
import { DspError } from '../dsp/errors';
import { isWorkerResponse, PROTOCOL_VERSION, type WorkerRequest, type WorkerResponse } from './protocol';

/** The part of a Worker the pool uses (a test passes a fake). */
export interface WorkerLike {
  postMessage(message: WorkerRequest, transfer: Transferable[]): void;
  terminate(): void;
  onmessage: ((event: MessageEvent) => void) | null;
  onerror: ((event: ErrorEvent) => void) | null;
  onmessageerror: ((event: MessageEvent) => void) | null;
}

/** A request without its envelope fields (the pool numbers and stamps it). */
export type RequestBody = WorkerRequest extends infer R ? (R extends WorkerRequest ? Omit<R, 'id' | 'protocolVersion'> : never) : never;

/** A successful answer (errors reject the promise). */
export type SuccessResponse = Exclude<WorkerResponse, { type: 'error' } | { type: 'ready' }>;

export type TaskPriority = 'interactive' | 'background';

export interface TaskOptions {
  /** Newest wins within a lane (e.g. "generate", "measure", "ccdf:run-3"). */
  lane?: string;
  /** Default "interactive". */
  priority?: TaskPriority;
  /** Buffers moved to the worker with the request. */
  transfer?: Transferable[];
  /**
   * A short interactive request that may wait in a busy worker's own queue, behind other such requests only
   * (when the pool's `pipeline` allows). Default false.
   */
  queueable?: boolean;
}

export interface WorkerRestartNotice {
  /** What the browser said about the crash. */
  reason: string;
  /** Requests that were running on the worker and have been rejected. */
  failedRequestIds: number[];
  /** Crashes so far in this pool. */
  restartCount: number;
}

export interface WorkerPoolOptions {
  size: number;
  /** Requests one worker may hold: the one it runs and those queued behind it (default 1: none queued). */
  pipeline?: number;
  createWorker: () => WorkerLike;
  onRestart?: (notice: WorkerRestartNotice) => void;
}

export interface WorkerPool {
  readonly size: number;
  run(body: RequestBody, options?: TaskOptions): { id: number; result: Promise<SuccessResponse> };
  /** Supersedes every queued and running request of `lane`. */
  cancelLane(lane: string): void;
  /** Requests waiting and running (for tests and the status line). */
  load(): { queued: number; running: number; workers: number };
  /** Terminates the workers; pending requests settle with SupersededError. */
  dispose(): void;
}

/** A request overtaken by a newer one (or cancelled, or disposed); not a failure to show. */
export class SupersededError extends Error {
  override readonly name = 'SupersededError';
  constructor(readonly requestId: number) {
    super(`Engine request ${requestId} was superseded by a newer request.`);
  }
}

export function isSuperseded(error: unknown): error is SupersededError {
  return error instanceof SupersededError;
}

interface Task {
  id: number;
  body: RequestBody;
  lane: string | undefined;
  priority: TaskPriority;
  queueable: boolean;
  transfer: Transferable[];
  resolve(response: SuccessResponse): void;
  reject(error: unknown): void;
  superseded: boolean;
}

interface Slot {
  worker: WorkerLike | null;
  ready: boolean;
  /** Requests sent to the worker and not yet answered, oldest (the running one) first. */
  tasks: Task[];
}

export function createWorkerPool(options: WorkerPoolOptions): WorkerPool {
  if (!Number.isInteger(options.size) || options.size < 1) {
    throw new DspError('INVALID_CONFIG', `Worker pool size must be a whole number ≥ 1; got ${options.size}.`);
  }
  const pipeline = options.pipeline ?? 1;
  if (!Number.isInteger(pipeline) || pipeline < 1) {
    throw new DspError('INVALID_CONFIG', `Worker pool pipeline depth must be a whole number ≥ 1; got ${pipeline}.`);
  }
  const slots: Slot[] = [];
  const queue: Task[] = [];
  let nextId = 1;
  let restartCount = 0;
  let disposed = false;

  const failProtocol = (slot: Slot, message: string) => {
    const task = slot.tasks.shift();
    task?.reject(new DspError('INTERNAL', message));
  };

  const onMessage = (slot: Slot, data: unknown): void => {
    if (!isWorkerResponse(data)) return failProtocol(slot, 'The engine worker sent a message the page does not understand.');
    if (data.protocolVersion !== PROTOCOL_VERSION) {
      return failProtocol(
        slot,
        `The engine worker speaks protocol v${String(data.protocolVersion)} but the page speaks v${PROTOCOL_VERSION}; reload the page.`,
      );
    }
    if (data.type === 'ready') {
      slot.ready = true;
      return;
    }
    const index = slot.tasks.findIndex((t) => t.id === data.id);
    if (index < 0) return; // an answer nobody waits for any more
    const task = slot.tasks.splice(index, 1)[0]!;
    if (!task.superseded) {
      if (data.type === 'error') task.reject(new DspError(data.code, data.message, data.details));
      else task.resolve(data);
    }
    pump();
  };

  const onCrash = (slot: Slot, reason: string): void => {
    const wasReady = slot.ready;
    slot.worker?.terminate();
    slot.worker = null;
    slot.ready = false;
    restartCount += 1;
    const failedRequestIds: number[] = [];
    slot.tasks.splice(0, slot.tasks.length).forEach((task, position) => {
      failedRequestIds.push(task.id);
      if (task.superseded) return;
      const doing = position === 0 ? 'while working on' : 'while holding';
      task.reject(
        new DspError('INTERNAL', `The engine worker crashed (${reason}) ${doing} request ${task.id}. A fresh worker has been started; run the request again.`),
      );
    });
    // A worker that was never ready would fail again at once: start the next one only when a request needs it.
    if (wasReady) startWorker(slot);
    options.onRestart?.({ reason, failedRequestIds, restartCount });
    pump();
  };

  function startWorker(slot: Slot): WorkerLike {
    const worker = options.createWorker();
    worker.onmessage = (event) => onMessage(slot, event.data);
    worker.onerror = (event) => {
      event.preventDefault?.();
      onCrash(slot, event.message || 'the worker script failed or threw outside a request');
    };
    worker.onmessageerror = () => failProtocol(slot, 'A message from the engine worker could not be read (structured clone failed).');
    slot.worker = worker;
    return worker;
  }

  const nextIndex = (): number => {
    const index = queue.findIndex((task) => task.priority === 'interactive');
    return index >= 0 ? index : 0;
  };

  /** Where the next request goes: an idle worker, a new one, or (pipelining) the least-loaded worker holding only queueable ones. */
  const slotFor = (task: Task): Slot | undefined => {
    let slot = slots.find((s) => s.tasks.length === 0 && s.worker !== null);
    if (slot === undefined && slots.length < options.size) {
      slot = { worker: null, ready: false, tasks: [] };
      slots.push(slot);
    }
    slot ??= slots.find((s) => s.tasks.length === 0);
    if (slot !== undefined || !task.queueable) return slot;
    const open = slots.filter((s) => s.worker !== null && s.tasks.length < pipeline && s.tasks.every((t) => t.queueable));
    return open.sort((a, b) => a.tasks.length - b.tasks.length)[0];
  };

  function pump(): void {
    if (disposed) return;
    while (queue.length > 0) {
      const index = nextIndex();
      const slot = slotFor(queue[index]!);
      if (slot === undefined) return;
      const task = queue.splice(index, 1)[0]!;
      const worker = slot.worker ?? startWorker(slot);
      slot.tasks.push(task);
      try {
        worker.postMessage({ ...task.body, id: task.id, protocolVersion: PROTOCOL_VERSION } as WorkerRequest, task.transfer);
      } catch (error) {
        slot.tasks.splice(slot.tasks.indexOf(task), 1);
        const reason = error instanceof Error ? error.message : String(error);
        task.reject(new DspError('INVALID_CONFIG', `The request could not be sent to the engine: it must be plain JSON data (${reason}).`));
      }
    }
  }

  const supersede = (task: Task): void => {
    if (task.superseded) return;
    task.superseded = true;
    task.reject(new SupersededError(task.id));
  };

  const cancelLane = (lane: string): void => {
    for (let i = queue.length - 1; i >= 0; i--) {
      const task = queue[i]!;
      if (task.lane === lane) {
        queue.splice(i, 1);
        supersede(task);
      }
    }
    for (const slot of slots) for (const task of slot.tasks) if (task.lane === lane) supersede(task);
  };

  const run = (body: RequestBody, taskOptions: TaskOptions = {}): { id: number; result: Promise<SuccessResponse> } => {
    const id = nextId++;
    if (disposed) return { id, result: Promise.reject(new SupersededError(id)) };
    if (taskOptions.lane !== undefined) cancelLane(taskOptions.lane);
    const result = new Promise<SuccessResponse>((resolve, reject) => {
      queue.push({
        id,
        body,
        lane: taskOptions.lane,
        priority: taskOptions.priority ?? 'interactive',
        queueable: (taskOptions.queueable ?? false) && (taskOptions.priority ?? 'interactive') === 'interactive',
        transfer: taskOptions.transfer ?? [],
        resolve,
        reject,
        superseded: false,
      });
    });
    pump();
    return { id, result };
  };

  const dispose = (): void => {
    disposed = true;
    for (const task of queue.splice(0, queue.length)) supersede(task);
    for (const slot of slots) {
      for (const task of slot.tasks.splice(0, slot.tasks.length)) supersede(task);
      slot.worker?.terminate();
      slot.worker = null;
    }
  };

  const load = () => ({
    queued: queue.length,
    running: slots.reduce((n, slot) => n + slot.tasks.length, 0),
    workers: slots.filter((slot) => slot.worker !== null).length,
  });

  return { size: options.size, run, cancelLane, load, dispose };
}
