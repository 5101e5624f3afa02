/**
 * The page's side of the formula worker: starts formula-worker.js (which loads functions.js in a bare context),
 * waits until it has registered the functions, and sends calls one message at a time.
 */
import type { CallReply, CallRequest, ReadyMessage, WorkerMessage } from './function-host-protocol';

/** How long one call may take before its cell shows an error (Excel restarts an add-in stuck for ~5 s). */
const CALL_TIMEOUT_MS = 20000;

export class FunctionHost {
  private readonly worker: Worker;
  private nextId = 1;
  private readonly waiting = new Map<number, (reply: CallReply) => void>();
  /** Resolves once functions.js has loaded in the worker, with the ids it registered. */
  readonly ready: Promise<ReadyMessage>;

  constructor(workerUrl = 'formula-worker.js') {
    this.worker = new Worker(workerUrl);
    let resolveReady: (m: ReadyMessage) => void = () => undefined;
    this.ready = new Promise<ReadyMessage>((resolve) => {
      resolveReady = resolve;
    });
    this.worker.onmessage = (event: MessageEvent<WorkerMessage>) => {
      const msg = event.data;
      if (msg.kind === 'ready') {
        resolveReady(msg);
        return;
      }
      const done = this.waiting.get(msg.id);
      if (done) {
        this.waiting.delete(msg.id);
        done(msg);
      }
    };
    this.worker.onerror = (event: ErrorEvent) => {
      resolveReady({ kind: 'ready', ids: [], loadError: event.message || 'the formula worker failed to start' });
    };
  }

  /** Calls a registered function by id with arguments already shaped as the host passes them. */
  call(functionId: string, args: unknown[]): Promise<CallReply> {
    const id = this.nextId++;
    const request: CallRequest = { id, functionId, args };
    return new Promise<CallReply>((resolve) => {
      const timer = setTimeout(() => {
        this.waiting.delete(id);
        resolve({ kind: 'result', id, ok: false, error: { error: '#VALUE!', message: `the calculation took longer than ${CALL_TIMEOUT_MS / 1000} s` } });
      }, CALL_TIMEOUT_MS);
      this.waiting.set(id, (reply) => {
        clearTimeout(timer);
        resolve(reply);
      });
      this.worker.postMessage(request);
    });
  }
}
