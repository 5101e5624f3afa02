/**
 * Messages between the page and the formula worker that hosts dist/functions.js. Values cross as plain data:
 * a thrown or returned CustomFunctions.Error becomes { error, message }, the way a cell shows it.
 */

/** A value as it crosses the worker boundary. */
export type WireScalar = number | string | boolean | null | { error: string; message?: string };
export type WireValue = WireScalar | WireScalar[][] | unknown;

/** Page → worker: call one registered function. */
export interface CallRequest {
  id: number;
  functionId: string;
  args: unknown[];
}

/** Worker → page: the worker loaded functions.js (or failed to), listing the ids it registered. */
export interface ReadyMessage {
  kind: 'ready';
  ids: string[];
  loadError?: string;
}

/** Worker → page: the answer to one call. */
export type CallReply =
  | { kind: 'result'; id: number; ok: true; value: WireValue }
  | { kind: 'result'; id: number; ok: false; error: { error: string; message?: string } };

export type WorkerMessage = ReadyMessage | CallReply;
