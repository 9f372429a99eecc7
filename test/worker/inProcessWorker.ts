import { createEngineDispatcher } from '../../src/worker/engineDispatch';
import type { WorkerLike } from '../../src/worker/client';
import { PROTOCOL_VERSION, READY_ID, type WorkerRequest, type WorkerResponse } from '../../src/worker/protocol';

/**
 * A WorkerLike that runs the real dispatcher (and so the real schema and engine) in this thread.
 * Messages cross by structuredClone with their transfer lists, delivered on later macrotasks, as
 * postMessage does between threads; only the thread itself is missing.
 */
export class InProcessWorker implements WorkerLike {
  onmessage: ((event: MessageEvent) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  onmessageerror: ((event: MessageEvent) => void) | null = null;
  terminated = false;
  static instances = 0;
  readonly received: WorkerRequest[] = [];
  readonly sent: WorkerResponse[] = [];
  private readonly dispatch: (data: unknown) => void;

  constructor(options: { sendReady?: boolean; protocolVersion?: number } = {}) {
    const version = options.protocolVersion ?? PROTOCOL_VERSION;
    this.dispatch = createEngineDispatcher({
      post: (message, transfer) => this.deliver({ ...message, protocolVersion: version } as WorkerResponse, transfer),
      schedule: (task) => setTimeout(task, 0),
      now: () => performance.now(),
      laneId: `in-process-${++InProcessWorker.instances}`,
    });
    if (options.sendReady ?? true) {
      this.deliver({ type: 'ready', id: READY_ID, protocolVersion: version } as WorkerResponse, []);
    }
  }

  postMessage(message: WorkerRequest, transfer: Transferable[]): void {
    if (this.terminated) return;
    const cloned = structuredClone(message, { transfer }); // throws DataCloneError like the browser
    this.received.push(cloned);
    setTimeout(() => {
      if (!this.terminated) this.dispatch(cloned);
    }, 0);
  }

  terminate(): void {
    this.terminated = true;
  }

  /** Simulates an uncaught error in the worker (what the browser reports as `error` on the Worker). */
  crash(message: string): void {
    setTimeout(() => this.onerror?.({ message, preventDefault: () => undefined } as ErrorEvent), 0);
  }

  private deliver(message: WorkerResponse, transfer: Transferable[]): void {
    const cloned = structuredClone(message, { transfer });
    setTimeout(() => {
      if (this.terminated) return;
      this.sent.push(cloned);
      this.onmessage?.({ data: cloned } as MessageEvent);
    }, 0);
  }
}
