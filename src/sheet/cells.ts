/**
 * What counts as a number in a cell, and how a range of cells becomes a column of numbers: the one rule for the
 * cell functions and the panel alike (documented in the README, "How cells are read").
 *
 * - Finite numbers count.
 * - Blanks (null, undefined, ""), text (also text that looks like a number), booleans and error values do not:
 *   they become NaN, and a row is used only when every column it pairs with holds a number (see pairs.ts). This
 *   follows the spreadsheet convention that TRUE/FALSE inside a range are not numbers.
 *
 * Pure: no host, no DOM. Errors are the core's StatsInputError, with messages for a spreadsheet user.
 */
import { StatsInputError } from '../stats/types';

/** A range as a host passes it: rows of cells. */
export type CellRange = unknown[][];

/** Makes the Float64Array a reading fills; every element is written, so a recycled array will do. */
export type ColumnAllocator = (n: number) => Float64Array;

const fresh: ColumnAllocator = (n) => new Float64Array(n);

/** The number in a cell, or NaN when the cell does not count (blank, text, boolean, error, non-finite). */
export function cellNumber(v: unknown): number {
  return typeof v === 'number' && Number.isFinite(v) ? v : NaN;
}

/** The header a column's first cell gives: its text when it holds non-blank text, else null. */
export function headerText(first: unknown): string | null {
  return typeof first === 'string' && first.trim() !== '' ? first : null;
}

/** The error for an argument that is not a range: a missing one says so (the usual slip is a forgotten range). */
function notARange(range: unknown, name: string): StatsInputError {
  if (range === undefined || range === null) return new StatsInputError('out-of-range', `${name} is missing: give a range of cells for it`);
  return new StatsInputError('out-of-range', `${name} must be a range of cells`);
}

/** Rows and columns of a rectangular range; throws a user error for anything else. Reads no cell. */
export function rangeShape(range: CellRange, name: string): { rows: number; cols: number } {
  if (!Array.isArray(range) || range.length === 0 || !Array.isArray(range[0]) || range[0].length === 0) {
    throw notARange(range, name);
  }
  return { rows: range.length, cols: range[0].length };
}

/** Length of a range that must be a single row or a single column; throws a user error otherwise. */
export function vectorLength(range: CellRange, name: string): number {
  if (!Array.isArray(range) || range.length === 0 || !Array.isArray(range[0])) {
    throw notARange(range, name);
  }
  const rows = range.length;
  const cols = range[0].length;
  if (rows !== 1 && cols !== 1) {
    throw new StatsInputError('unequal-length', `${name} must be a single column or a single row (it is ${rows} x ${cols})`);
  }
  return rows === 1 ? cols : rows;
}

/** Two ranges that pair cell by cell must hold the same number of cells. */
export function assertSameSize(nx: number, ny: number, xName = 'x', yName = 'y'): void {
  if (nx !== ny) {
    throw new StatsInputError('unequal-length', `${xName} and ${yName} must hold the same number of cells (${nx} and ${ny})`);
  }
}

export interface VectorReadOptions {
  /** Cells to leave out at the start (a header). */
  from?: number;
  /** Read at most this many cells (after `from`). */
  limit?: number;
  /** Where the column is made (default: a new array). */
  alloc?: ColumnAllocator;
}

/**
 * Reads one single-row or single-column range into a Float64Array with NaN for cells that do not count.
 *
 * Speed (a million rows is the design size): the number test and the store are kept on one path, so a number read
 * from the host's row array is stored as it is, never boxed (merging it with other cell kinds first made V8
 * allocate a heap number per cell: 16 MB and ~40 ms per million rows); non-finite numbers are cleared in a
 * second, sequential pass.
 */
export function readVector(range: CellRange, name: string, o: VectorReadOptions = {}): Float64Array {
  const from = o.from ?? 0;
  const n = Math.max(0, Math.min(vectorLength(range, name) - from, o.limit ?? Infinity));
  const out = (o.alloc ?? fresh)(n);
  if (range.length === 1) {
    const row = range[0];
    for (let k = 0; k < n; k++) {
      const v = row[k + from];
      if (typeof v === 'number') out[k] = v;
      else out[k] = NaN;
    }
  } else {
    for (let k = 0; k < n; k++) {
      const r = range[k + from];
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

/**
 * Rows of a block up to its last row holding a number in any column (from row `skipRows` on), scanning from the
 * end: a whole-column reference with 1,000 filled rows counts 1,000, so size limits and reads follow the data,
 * not the 1,048,576 rows of the reference. Rows past the data can only hold blanks or text, which no
 * correlation counts.
 */
export function filledRowCount(range: CellRange, skipRows = 0): number {
  for (let i = range.length - 1; i >= skipRows; i--) {
    const row = range[i];
    if (!Array.isArray(row)) continue;
    for (let j = 0; j < row.length; j++) if (typeof row[j] === 'number') return i + 1 - skipRows;
  }
  return 0;
}

/** Columns of a range, in order, with NaN where a cell does not count. `skipRows` leading rows are left out. */
export function readColumns(range: CellRange, name: string, skipRows = 0): Float64Array[] {
  const { rows, cols } = rangeShape(range, name);
  const out: Float64Array[] = [];
  for (let j = 0; j < cols; j++) out.push(new Float64Array(Math.max(0, rows - skipRows)));
  for (let i = skipRows; i < rows; i++) {
    const row = range[i];
    if (!Array.isArray(row) || row.length !== cols) throw new StatsInputError('unequal-length', `${name} must be a rectangular range`);
    for (let j = 0; j < cols; j++) out[j][i - skipRows] = cellNumber(row[j]);
  }
  return out;
}

/** The first row of a range as column names; a blank or non-text cell becomes "column N" (a number its digits). */
export function readHeaderRow(range: CellRange, name: string): string[] {
  const { cols } = rangeShape(range, name);
  const names: string[] = [];
  for (let j = 0; j < cols; j++) {
    const v = range[0][j];
    const text = typeof v === 'string' ? v.trim() : typeof v === 'number' && Number.isFinite(v) ? String(v) : '';
    names.push(text === '' ? `column ${j + 1}` : text);
  }
  return names;
}
