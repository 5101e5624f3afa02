/**
 * Turns column reads from the workbook into complete numeric pairs, remembering each pair's sheet row so that a
 * point on a chart can lead back to its row. The rule for what counts is the cell functions' rule (see
 * src/functions/cells.ts): finite numbers count; blanks, text, TRUE/FALSE and errors are skipped pairwise. Pure.
 */
import type { RangeRead } from './workbook';

/** One column as read, with its header. */
export type ColumnRead = RangeRead & { header: string };

/** Where a column's numbers start: below a text header in the first cell, else at the first cell. */
export function dataStart(read: ColumnRead): number {
  const first = read.values.length > 0 ? read.values[0][0] : undefined;
  return typeof first === 'string' && first === read.header && read.header !== read.address ? 1 : 0;
}

/** The number in a cell, or NaN when the cell does not count. */
export function cellNumber(v: unknown): number {
  return typeof v === 'number' && Number.isFinite(v) ? v : NaN;
}

/** One column's numbers (NaN where a cell does not count), from its data start. */
export function columnNumbers(read: ColumnRead): Float64Array {
  const start = dataStart(read);
  const rows = read.values;
  const out = new Float64Array(Math.max(0, rows.length - start));
  for (let i = start; i < rows.length; i++) {
    const row = rows[i];
    out[i - start] = cellNumber(row === undefined ? undefined : row[0]);
  }
  return out;
}

/** Complete pairs with the sheet row of each. */
export interface PairedRows {
  x: Float64Array;
  y: Float64Array;
  /** Sheet row (1-based) of each pair. */
  rows: Int32Array;
  sheet: string;
  /** Data cells in each column (header excluded). */
  total: number;
  /** Rows skipped because either cell was not a number. */
  skipped: number;
  xHeader: string;
  yHeader: string;
}

/** Raised when two columns cannot be paired; the message is for the user. */
export class PairingError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PairingError';
  }
}

/**
 * Pairs two columns row by row.
 * @throws PairingError when a read is wider than one column, the columns sit on different sheets or rows, or
 *   their data lengths differ.
 */
export function pairColumns(xRead: ColumnRead, yRead: ColumnRead): PairedRows {
  for (const r of [xRead, yRead]) {
    if (r.values.some((row) => row.length > 1)) throw new PairingError(`${r.address} is more than one column wide: pick one column for each variable.`);
  }
  const xs = columnNumbers(xRead);
  const ys = columnNumbers(yRead);
  const xFirst = xRead.firstRow + dataStart(xRead);
  const yFirst = yRead.firstRow + dataStart(yRead);
  if (xs.length !== ys.length) {
    throw new PairingError(`${xRead.header} has ${xs.length} cells and ${yRead.header} has ${ys.length}: pick columns of the same length.`);
  }
  if (xRead.sheet !== yRead.sheet || xFirst !== yFirst) {
    throw new PairingError(`${xRead.header} and ${yRead.header} start on different rows: each pair must be read from the same rows.`);
  }
  const total = xs.length;
  let used = 0;
  for (let i = 0; i < total; i++) if (xs[i] === xs[i] && ys[i] === ys[i]) used++;
  const x = new Float64Array(used);
  const y = new Float64Array(used);
  const rows = new Int32Array(used);
  let j = 0;
  for (let i = 0; i < total; i++) {
    if (xs[i] === xs[i] && ys[i] === ys[i]) {
      x[j] = xs[i];
      y[j] = ys[i];
      rows[j] = xFirst + i;
      j++;
    }
  }
  return { x, y, rows, sheet: xRead.sheet, total, skipped: total - used, xHeader: xRead.header, yHeader: yRead.header };
}

/**
 * Rows complete in every one of several same-length columns (the same-rows comparisons need each row to hold all
 * the numbers). Returns the columns restricted to those rows.
 */
export function completeRows(columns: Float64Array[]): { columns: Float64Array[]; skipped: number } {
  const n = columns[0].length;
  if (columns.some((c) => c.length !== n)) throw new PairingError('The columns have different lengths: pick columns on the same rows.');
  const keep: number[] = [];
  for (let i = 0; i < n; i++) if (columns.every((c) => c[i] === c[i])) keep.push(i);
  return { columns: columns.map((c) => Float64Array.from(keep, (i) => c[i])), skipped: n - keep.length };
}
