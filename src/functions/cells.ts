/**
 * Cell adapter: turns what Excel passes to a custom function into plain numbers for the statistics core, and
 * turns the core's input errors into host errors with a message. No mathematics here.
 *
 * What counts as a value (documented in the README, "How cells are read"):
 * - finite numbers count;
 * - blanks (null, undefined, ""), text (also text that looks like a number), booleans and error values are
 *   skipped, pairwise: a row is used only when both its x and y cells are numbers. This follows the spreadsheet
 *   convention that TRUE/FALSE inside a range are not numbers.
 *
 * Blanks passed as 0: some desktop builds of Excel pass an empty cell to a custom function as the number 0, which
 * no function can tell from a typed 0. A long run of rows at the end of the ranges where both cells are 0 is the
 * signature of that (an over-long or whole-column reference such as B:B); such input is refused with a message
 * rather than answered with a wrong number. Shorter runs cannot be told apart from real zeros: the README says so.
 */
import { borrowF64 } from '../stats/internal/scratch';
import { StatsInputError, Tail, Method, TAILS, METHODS } from '../stats/types';

/** A range argument as the host passes it: rows of cells. */
export type CellRange = unknown[][];

/** Complete pairs read from two ranges, with the position of each pair in the range (0-based). */
export interface PairedColumns {
  x: Float64Array;
  y: Float64Array;
  /** Index within the range (0-based) of each used pair: row for a column range, column for a row range; null
   *  when every cell pairs, so pair i is cell i (saves a 4 MB array on a million complete rows). */
  index: Int32Array | null;
  /** Cells in each range. */
  total: number;
  /** Pairs skipped because either cell was blank, text, boolean or an error. */
  skipped: number;
}

/** The number in a cell, or NaN when the cell does not count (blank, text, boolean, error, non-finite). */
export function cellNumber(v: unknown): number {
  return typeof v === 'number' && Number.isFinite(v) ? v : NaN;
}

/** Length of a range that must be a single row or a single column; throws a user error otherwise. */
export function vectorLength(range: CellRange, name: string): number {
  if (!Array.isArray(range) || range.length === 0 || !Array.isArray(range[0])) {
    throw new StatsInputError('out-of-range', `${name} must be a range of cells`);
  }
  const rows = range.length;
  const cols = range[0].length;
  if (rows !== 1 && cols !== 1) {
    throw new StatsInputError('unequal-length', `${name} must be a single column or a single row (it is ${rows} x ${cols})`);
  }
  return rows === 1 ? cols : rows;
}

/**
 * Reads one single-row or single-column range into a Float64Array with NaN for cells that do not count.
 *
 * Speed (a million rows is the design size): the number test and the store are kept on one path, so a number read
 * from the host's row array is stored as it is, never boxed (merging it with other cell kinds first made V8
 * allocate a heap number per cell: 16 MB and ~40 ms per million rows); non-finite numbers are cleared in a
 * second, sequential pass. The array comes from the scratch pool (its pages already mapped); every element is
 * written.
 */
export function readVector(range: CellRange, name: string, limit = Infinity): Float64Array {
  const n = Math.min(vectorLength(range, name), limit);
  const out = borrowF64(n);
  if (range.length === 1) {
    const row = range[0];
    for (let k = 0; k < n; k++) {
      const v = row[k];
      if (typeof v === 'number') out[k] = v;
      else out[k] = NaN;
    }
  } else {
    for (let k = 0; k < n; k++) {
      const r = range[k];
      if (r !== undefined && typeof r[0] === 'number') out[k] = r[0] as number;
      else out[k] = NaN;
    }
  }
  for (let k = 0; k < n; k++) {
    const v = out[k];
    if (v - v !== 0) out[k] = NaN; // Infinity and -Infinity do not count either
  }
  return out;
}

/**
 * Index of the last cell of a single-row or single-column range that holds a number, or -1. Scans from the end
 * without copying anything: on a whole-column reference (1,048,576 rows, a few filled) the reading can then
 * stop at the data's end instead of storing a million blanks.
 */
export function lastNumberIndex(range: CellRange, name: string): number {
  const n = vectorLength(range, name);
  if (range.length === 1) {
    const row = range[0];
    for (let k = n - 1; k >= 0; k--) if (typeof row[k] === 'number') return k;
    return -1;
  }
  for (let k = n - 1; k >= 0; k--) {
    const r = range[k];
    if (r !== undefined && typeof r[0] === 'number') return k;
  }
  return -1;
}

/** Two ranges that pair cell by cell must hold the same number of cells. */
export function assertSameSize(nx: number, ny: number, xName = 'x', yName = 'y'): void {
  if (nx !== ny) {
    throw new StatsInputError('unequal-length', `${xName} and ${yName} must hold the same number of cells (${nx} and ${ny})`);
  }
}

/**
 * Pairs two ranges cell by cell (a row and a column of equal length pair up too) and keeps the complete pairs.
 * @throws StatsInputError when the ranges hold different numbers of cells.
 */
export function readPairs(xRange: CellRange, yRange: CellRange, xName = 'x', yName = 'y'): PairedColumns {
  const nx = vectorLength(xRange, xName);
  const ny = vectorLength(yRange, yName);
  assertSameSize(nx, ny, xName, yName);
  return readPairsFromVectors(readVector(xRange, xName), readVector(yRange, yName), xName, yName);
}

/** Pairs two vectors already read (NaN marks a cell that does not count). */
export function readPairsFromVectors(xs: Float64Array, ys: Float64Array, xName = 'x', yName = 'y', total = xs.length): PairedColumns {
  const nx = xs.length;
  assertSameSize(nx, ys.length, xName, yName);
  refuseBlanksAsZeros(xs, ys, xName, yName);
  let used = 0;
  for (let k = 0; k < nx; k++) if (xs[k] === xs[k] && ys[k] === ys[k]) used++;
  if (used === nx) {
    // Every row pairs (the usual case): the vectors just read are the pairs; no copy, no index.
    return { x: xs, y: ys, index: null, total, skipped: total - used };
  }
  const x = new Float64Array(used);
  const y = new Float64Array(used);
  const index = new Int32Array(used);
  let j = 0;
  for (let k = 0; k < nx; k++) {
    const a = xs[k];
    const b = ys[k];
    if (a === a && b === b) {
      x[j] = a;
      y[j] = b;
      index[j] = k;
      j++;
    }
  }
  return { x, y, index, total, skipped: total - used };
}

/** Trailing rows where both cells are 0 from which the input is taken for blanks passed as zeros. */
export const ZERO_TAIL_LIMIT = 100;

/** Refuses ranges ending in ZERO_TAIL_LIMIT or more rows of (0, 0): see the note at the top of this file. */
function refuseBlanksAsZeros(xs: Float64Array, ys: Float64Array, xName: string, yName: string): void {
  const n = xs.length;
  let k = n - 1;
  while (k >= 0 && xs[k] === 0 && ys[k] === 0) k--;
  const run = n - 1 - k;
  if (run >= ZERO_TAIL_LIMIT) {
    throw new StatsInputError(
      'out-of-range',
      `the last ${run} rows of ${xName} and ${yName} are all 0: these look like empty cells that this version of Excel passes as 0. ` +
        'Pass only the filled rows (e.g. B2:B500) or a table column instead of a whole column',
    );
  }
}

/** Requires at least `min` complete pairs. */
export function requirePairs(p: PairedColumns, min = 3): void {
  if (p.x.length < min) {
    throw new StatsInputError(
      'too-few',
      `only ${p.x.length} usable pair${p.x.length === 1 ? '' : 's'} of numbers: at least ${min} are needed (blank, text and TRUE/FALSE cells are skipped)`,
    );
  }
}

/** True when an optional argument was omitted (Excel passes null; an empty referenced cell may give "" or 0 is NOT treated as omitted). */
export function omitted(v: unknown): boolean {
  return v === null || v === undefined || v === '';
}

/** An optional text option, matched case-insensitively against the allowed words. */
export function optionWord<T extends string>(v: unknown, allowed: readonly T[], fallback: T, argName: string): T {
  if (omitted(v)) return fallback;
  const s = typeof v === 'string' ? v.trim().toLowerCase() : String(v);
  const hit = allowed.find((a) => a === s);
  if (hit === undefined) {
    throw new StatsInputError('bad-option', `${argName} must be one of ${allowed.map((a) => `"${a}"`).join(', ')} (got "${String(v)}")`);
  }
  return hit;
}

export function optTail(v: unknown): Tail {
  return optionWord(v, TAILS, 'both', 'tail');
}

export function optMethod(v: unknown): Method {
  return optionWord(v, METHODS, 'pearson', 'method');
}

/** An optional number argument. */
export function optNumber(v: unknown, fallback: number, argName: string): number {
  if (omitted(v)) return fallback;
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new StatsInputError('bad-option', `${argName} must be a number`);
  return v;
}

/** The confidence level: a number strictly between 0 and 1 (95% may also be written 0.95). */
export function optLevel(v: unknown): number {
  const level = optNumber(v, 0.95, 'level');
  if (!(level > 0 && level < 1)) throw new StatsInputError('out-of-range', `level must be between 0 and 1, e.g. 0.95 (got ${level})`);
  return level;
}

/** The significance level alpha: strictly between 0 and 1, default 0.05. */
export function optAlpha(v: unknown): number {
  const alpha = optNumber(v, 0.05, 'alpha');
  if (!(alpha > 0 && alpha < 1)) throw new StatsInputError('out-of-range', `alpha must be between 0 and 1, e.g. 0.05 (got ${alpha})`);
  return alpha;
}

/** A required number argument. */
export function requiredNumber(v: unknown, argName: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new StatsInputError('bad-option', `${argName} must be a number`);
  return v;
}

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
