/** Where the relationship analysis runs: the main thread below the threshold, a worker above it, and the main
 * thread again when no worker can start. A stand-in Worker runs the worker's own message handler in-process. */
import { ComputeClient, WorkerReply, WorkerRequest } from '../../../taskpane/compute-client';
import { analyseRelationship, isFailure } from '../../../taskpane/relationship';
import type { PairedRows } from '../../../taskpane/pairs';

type Listener = (ev: { data: WorkerReply; message?: string; preventDefault?: () => void }) => void;

class InProcessWorker {
  static created = 0;
  static failToStart = false;
  private listeners: Record<string, Listener[]> = { message: [], error: [] };
  constructor(readonly url: string) {
    InProcessWorker.created++;
  }
  addEventListener(type: 'message' | 'error', fn: Listener): void {
    this.listeners[type].push(fn);
  }
  removeEventListener(type: 'message' | 'error', fn: Listener): void {
    this.listeners[type] = this.listeners[type].filter((f) => f !== fn);
  }
  postMessage(req: WorkerRequest): void {
    setTimeout(() => {
      if (InProcessWorker.failToStart) {
        for (const fn of [...this.listeners.error]) fn({ data: undefined as unknown as WorkerReply, message: 'could not load', preventDefault: () => undefined });
        return;
      }
      const send = (data: WorkerReply): void => this.listeners.message.slice().forEach((fn) => fn({ data }));
      send({ id: req.id, kind: 'stage', stage: 'computing' });
      send({ id: req.id, kind: 'done', view: analyseRelationship(req.pairs, req.options) });
    }, 0);
  }
  terminate(): void {}
}

function pairs(n: number): PairedRows {
  const x = Float64Array.from({ length: n }, (_, i) => i % 17);
  const y = Float64Array.from({ length: n }, (_, i) => (i % 17) * 2 + (i % 5));
  return { x, y, rows: Int32Array.from({ length: n }, (_, i) => i + 2), sheet: 'S', total: n, skipped: 0, xHeader: 'x', yHeader: 'y', skippedRows: new Int32Array(0) };
}

const opts = { method: 'pearson' as const, level: 0.95, alpha: 0.05, drawLimit: 500 };

beforeEach(() => {
  (globalThis as unknown as { Worker: unknown }).Worker = InProcessWorker;
  InProcessWorker.created = 0;
  InProcessWorker.failToStart = false;
});
afterAll(() => {
  delete (globalThis as unknown as { Worker?: unknown }).Worker;
});

test('below the threshold the main thread computes (no worker started)', async () => {
  const client = new ComputeClient('panel-worker.js', 1000);
  const v = await client.analyse(pairs(200), opts, () => undefined);
  expect(isFailure(v)).toBe(false);
  expect(InProcessWorker.created).toBe(0);
});

test('above the threshold the worker computes and reports its stage; the result equals the main-thread one', async () => {
  const client = new ComputeClient('panel-worker.js', 1000);
  const stages: string[] = [];
  const v = await client.analyse(pairs(3000), opts, (s) => stages.push(s));
  expect(InProcessWorker.created).toBe(1);
  expect(stages).toContain('computing');
  const direct = analyseRelationship(pairs(3000), opts);
  if (isFailure(v) || isFailure(direct)) throw new Error('unexpected failure');
  expect(v.correlation.statistic).toBe(direct.correlation.statistic);
  expect(Array.from(v.drawn.rows)).toEqual(Array.from(direct.drawn.rows));
});

test('a worker that cannot start falls back to the main thread, and is not tried again', async () => {
  InProcessWorker.failToStart = true;
  const client = new ComputeClient('missing.js', 1000);
  const v = await client.analyse(pairs(3000), opts, () => undefined);
  expect(isFailure(v)).toBe(false);
  expect(client.usesWorker(3000)).toBe(false);
});

test('no worker URL: always the main thread', async () => {
  const client = new ComputeClient(null, 10);
  expect(client.usesWorker(1e6)).toBe(false);
});
