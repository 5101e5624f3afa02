/**
 * The formula worker: hosts dist/functions.js exactly as Excel does. Before the bundle loads, the only host global
 * it gets is CustomFunctions with associate, Error and ErrorCode; the bundle registers its functions through
 * associate (the calls the metadata plugin appended at build). The page sends calls and gets plain values back.
 * Running in a worker also keeps a slow calculation from freezing the grid.
 */
import type { CallReply, CallRequest, ReadyMessage, WireScalar } from './function-host-protocol';

/** The error type a custom function throws: `new CustomFunctions.Error(code, message)`. */
class HostError {
  readonly code: string;
  readonly message: string;
  constructor(code: string, message?: string) {
    this.code = code;
    this.message = message ?? '';
  }
}

/** Error codes as the host defines them (the values are what a cell shows). */
const ErrorCode = {
  invalidValue: '#VALUE!',
  notAvailable: '#N/A',
  divisionByZero: '#DIV/0!',
  invalidNumber: '#NUM!',
  nullReference: '#NULL!',
  invalidName: '#NAME?',
  invalidReference: '#REF!',
};

type CellFunction = (...args: unknown[]) => unknown;

interface WorkerScope {
  CustomFunctions?: unknown;
  postMessage(message: unknown): void;
  onmessage: ((event: MessageEvent<CallRequest>) => void) | null;
}

const scope = self as unknown as WorkerScope;
const registered = new Map<string, CellFunction>();

function associate(idOrMap: string | Record<string, CellFunction>, fn?: CellFunction): void {
  if (typeof idOrMap === 'string') {
    if (typeof fn === 'function') registered.set(idOrMap.toUpperCase(), fn);
    return;
  }
  for (const [id, f] of Object.entries(idOrMap)) registered.set(id.toUpperCase(), f);
}

scope.CustomFunctions = { associate, Error: HostError, ErrorCode };

function toWireError(e: unknown): { error: string; message?: string } {
  if (e instanceof HostError) return e.message ? { error: e.code, message: e.message } : { error: e.code };
  // An exception that is not the host's error type shows as #VALUE! with no message, as in Excel.
  return { error: ErrorCode.invalidValue };
}

function toWire(v: unknown): unknown {
  if (v instanceof HostError) return toWireError(v);
  if (Array.isArray(v)) return v.map((row) => (Array.isArray(row) ? row.map((c) => toWire(c) as WireScalar) : toWire(row)));
  return v;
}

let loadError: string | undefined;
try {
  importScripts('functions.js');
} catch (e) {
  loadError = e instanceof Error ? e.message : String(e);
}
const ready: ReadyMessage = { kind: 'ready', ids: [...registered.keys()].sort(), loadError };
scope.postMessage(ready);

scope.onmessage = (event: MessageEvent<CallRequest>) => {
  const { id, functionId, args } = event.data;
  const fn = registered.get(functionId.toUpperCase());
  const reply = (r: CallReply) => scope.postMessage(r);
  if (!fn) {
    reply({ kind: 'result', id, ok: false, error: { error: ErrorCode.invalidName, message: `no function ${functionId} is registered` } });
    return;
  }
  try {
    Promise.resolve(fn(...args)).then(
      (value) => reply({ kind: 'result', id, ok: true, value: toWire(value) }),
      (e: unknown) => reply({ kind: 'result', id, ok: false, error: toWireError(e) }),
    );
  } catch (e) {
    reply({ kind: 'result', id, ok: false, error: toWireError(e) });
  }
};
