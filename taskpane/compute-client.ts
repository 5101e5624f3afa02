/**
 * Runs the relationship analysis where it will not freeze the pane: on the main thread for ordinary sizes (at
 * 100,000 rows it takes tens of milliseconds), in a worker for very large inputs (a million rows), with a
 * fallback to the main thread when no worker can be started. Results are plain data either way.
 */
import type { PairedRows } from './pairs';
import { analyseRelationship, RedrawMemory, RelationshipFailure, RelationshipOptions, RelationshipView } from './relationship';

/** Message to the worker. */
export interface WorkerRequest {
  id: number;
  pairs: PairedRows;
  options: RelationshipOptions;
}

/** Messages from the worker. */
export type WorkerReply =
  | { id: number; kind: 'stage'; stage: string }
  | { id: number; kind: 'done'; view: RelationshipView | RelationshipFailure }
  | { id: number; kind: 'crash'; message: string };

export class ComputeClient {
  private worker: Worker | null = null;
  private broken = false;
  private nextId = 1;
  /** What the last main-thread redraw left to reuse (the worker keeps its own). */
  readonly memory = new RedrawMemory();

  constructor(
    private readonly workerUrl: string | null,
    /** Pairs from which the worker is used. */
    readonly workerThreshold: number,
  ) {}

  /** Whether this many pairs would go to the worker. */
  usesWorker(n: number): boolean {
    return n >= this.workerThreshold && this.workerUrl !== null && !this.broken && typeof Worker !== 'undefined';
  }

  async analyse(
    pairs: PairedRows,
    options: RelationshipOptions,
    onStage: (stage: string) => void,
  ): Promise<RelationshipView | RelationshipFailure> {
    if (this.usesWorker(pairs.x.length)) {
      try {
        return await this.inWorker(pairs, options, onStage);
      } catch {
        this.broken = true; // e.g. the worker script could not load: do the work here from now on
      }
    }
    if (pairs.x.length >= this.workerThreshold) {
      // Let the progress indicator paint before the long synchronous computation.
      onStage('computing');
      await new Promise((resolve) => setTimeout(resolve, 0));
    }
    return analyseRelationship(pairs, options, this.memory);
  }

  private inWorker(pairs: PairedRows, options: RelationshipOptions, onStage: (stage: string) => void): Promise<RelationshipView | RelationshipFailure> {
    if (!this.worker) this.worker = new Worker(this.workerUrl as string);
    const worker = this.worker;
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      const onMessage = (ev: MessageEvent<WorkerReply>): void => {
        const msg = ev.data;
        if (msg.id !== id) return;
        if (msg.kind === 'stage') {
          onStage(msg.stage);
          return;
        }
        worker.removeEventListener('message', onMessage);
        worker.removeEventListener('error', onError);
        if (msg.kind === 'done') resolve(msg.view);
        else reject(new Error(msg.message));
      };
      const onError = (ev: ErrorEvent): void => {
        worker.removeEventListener('message', onMessage);
        worker.removeEventListener('error', onError);
        ev.preventDefault();
        this.worker = null;
        worker.terminate();
        reject(new Error(ev.message || 'the worker could not start'));
      };
      worker.addEventListener('message', onMessage);
      worker.addEventListener('error', onError);
      onStage('sent to a background thread');
      const request: WorkerRequest = { id, pairs, options };
      worker.postMessage(request);
    });
  }

  dispose(): void {
    this.worker?.terminate();
    this.worker = null;
  }
}
