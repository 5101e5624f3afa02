/**
 * How a cell function fails: one host error with a message, never a raw exception, NaN or Infinity. The core's
 * input errors become #N/A (too few rows) or #VALUE! (anything else), as custom functions can only carry a
 * message on those two.
 */
import { StatsInputError } from '../stats/types';

interface HostErrorCtor {
  new (code: string, message?: string): object;
}
interface HostGlobal {
  CustomFunctions?: { Error: HostErrorCtor; ErrorCode: { invalidValue: string; notAvailable: string } };
}

/** Error thrown when no CustomFunctions host is present (unit tests importing the functions directly). */
export class CellError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = 'CellError';
    this.code = code;
  }
}

/** Builds the host's error: #N/A for "not enough data", #VALUE! for everything else, both with a message. */
export function hostError(kind: 'invalidValue' | 'notAvailable', message: string): Error {
  const host = (globalThis as unknown as HostGlobal).CustomFunctions;
  if (host && host.Error && host.ErrorCode) return new host.Error(host.ErrorCode[kind], message) as Error;
  return new CellError(kind === 'notAvailable' ? '#N/A' : '#VALUE!', message);
}

/** Maps any exception to one host error with a message; nothing raw reaches a cell. */
export function toHostError(e: unknown): Error {
  if (e instanceof StatsInputError) return hostError(e.code === 'too-few' ? 'notAvailable' : 'invalidValue', e.message);
  const host = (globalThis as unknown as HostGlobal).CustomFunctions;
  if (host && e instanceof host.Error) return e as Error;
  if (e instanceof CellError) return e;
  const detail = e instanceof Error ? e.message : String(e);
  return hostError('invalidValue', `Covary could not compute this: ${detail}`);
}

/** Refuses NaN or Infinity anywhere in an answer. */
function assertFinite(v: unknown): void {
  if (typeof v === 'number' && !Number.isFinite(v)) {
    throw new StatsInputError('out-of-range', 'the result is not a finite number for these data');
  }
  if (Array.isArray(v)) for (const item of v) assertFinite(item);
}

/** Runs a cell function body: checks the answer is finite and turns every exception into one host error. */
export function guard<T>(body: () => T): T {
  try {
    const out = body();
    assertFinite(out);
    return out;
  } catch (e) {
    throw toHostError(e);
  }
}

/** A number for a cell, or "" where there is none (a null in a returned array would show as 0). */
export function cellValue(v: number | null): number | string {
  return v === null || !Number.isFinite(v) ? '' : v;
}
