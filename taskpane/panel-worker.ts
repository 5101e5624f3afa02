/**
 * The panel's background thread (dist/panel-worker.js): runs analyseRelationship for very large inputs so the
 * pane stays responsive. No DOM, no host: numbers in, plain data out.
 */
import type { WorkerReply, WorkerRequest } from './compute-client';
import { analyseRelationship, isFailure, RedrawMemory } from './relationship';

interface WorkerScope {
  addEventListener(type: 'message', fn: (ev: MessageEvent<WorkerRequest>) => void): void;
  postMessage(message: WorkerReply, transfer?: Transferable[]): void;
}
const scope = self as unknown as WorkerScope;
/** This thread's own reuse between redraws of the same pair. */
const memory = new RedrawMemory();

scope.addEventListener('message', (ev) => {
  const { id, pairs, options } = ev.data;
  try {
    scope.postMessage({ id, kind: 'stage', stage: 'computing' });
    const view = analyseRelationship(pairs, options, memory);
    const transfer: Transferable[] = [];
    if (!isFailure(view)) {
      for (const arr of Object.values(view.drawn)) transfer.push((arr as Float64Array).buffer);
      if (view.smooth) transfer.push(view.smooth.x.buffer, view.smooth.y.buffer);
    }
    scope.postMessage({ id, kind: 'done', view }, transfer);
  } catch (e) {
    scope.postMessage({ id, kind: 'crash', message: e instanceof Error ? e.message : String(e) });
  }
});
