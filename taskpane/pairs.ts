/**
 * Turns column reads from the workbook into complete numeric pairs, remembering each pair's sheet row so that a
 * point on a chart can lead back to its row. The rule for what counts is the cell functions' rule (see
 * src/functions/cells.ts): finite numbers count; blanks, text, TRUE/FALSE and errors are skipped pairwise. Pure.
 *
 * Everything downstream works on NumericColumnRead (a Float64Array per column, NaN for cells that do not count):
 * hosts that can supply it directly do (Workbook.readColumnNumbers); otherwise numericColumn() converts a
 * readColumn result.
 */
import { cellNumber } from '../src/functions/cells';
import type { CellBlock } from './address';
import type { ColumnSource, NumericColumnRead, RangeRead, Workbook } from './workbook';

/** One column as readColumn gives it, with its header. */
export type ColumnRead = RangeRead & { header: string };

/** Raised when columns cannot be read or paired as picked; the message is for the user. */
export class PairingError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PairingError';
  }
}

/** Where a column's numbers start: below a text header in the first cell, else at the first cell. */
export function dataStart(read: ColumnRead): number {
  const first = read.values.length > 0 ? read.values[0][0] : undefined;
  return typeof first === 'string' && first === read.header && read.header !== read.address ? 1 : 0;
}

/**
 * A readColumn result as numbers (header excluded).
 * @throws PairingError when the read is more than one column wide.
 */
export function numericColumn(read: ColumnRead): NumericColumnRead {
  const rows = read.values;
  for (const row of rows) {
    if (row.length > 1) throw new PairingError(`${read.address} is more than one column wide: pick one column for each variable.`);
  }
  const start = dataStart(read);
  const numbers = new Float64Array(Math.max(0, rows.length - start));
  for (let i = start; i < rows.length; i++) {
    const row = rows[i];
    numbers[i - start] = cellNumber(row === undefined ? undefined : row[0]);
  }
  return { address: read.address, sheet: read.sheet, firstRow: read.firstRow + start, column: read.firstColumn, header: read.header, numbers };
}

/** Reads one column as numbers, through the host's fast path when it has one. */
export async function readNumericColumn(wb: Workbook, source: ColumnSource): Promise<NumericColumnRead> {
  if (wb.readColumnNumbers) return wb.readColumnNumbers(source);
  return numericColumn(await wb.readColumn(source));
}

/** The data cells of a column as a block. */
export function dataBlock(c: NumericColumnRead): CellBlock {
  return { sheet: c.sheet, firstRow: c.firstRow, lastRow: c.firstRow + Math.max(1, c.numbers.length) - 1, firstColumn: c.column, lastColumn: c.column };
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

/**
 * Builds a PairedRows. Every PairedRows is made here, so all have one object shape: the analysis, compiled for
 * speed on the first ones it sees (the panel's warm-up rounds), then meets no other shape and is not recompiled.
 */
export function pairedRows(x: Float64Array, y: Float64Array, rows: Int32Array, sheet: string, total: number, skipped: number, xHeader: string, yHeader: string): PairedRows {
  return { x, y, rows, sheet, total, skipped, xHeader, yHeader };
}

/**
 * Pairs two columns row by row.
 * @throws PairingError when the columns sit on different sheets or rows, or their data lengths differ.
 */
export function pairColumns(xc: NumericColumnRead, yc: NumericColumnRead): PairedRows {
  const xs = xc.numbers;
  const ys = yc.numbers;
  if (xs.length !== ys.length) {
    throw new PairingError(`${xc.header} has ${xs.length} cells and ${yc.header} has ${ys.length}: pick columns of the same length.`);
  }
  if (xc.sheet !== yc.sheet || xc.firstRow !== yc.firstRow) {
    throw new PairingError(`${xc.header} and ${yc.header} start on different rows: each pair must be read from the same rows.`);
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
      rows[j] = xc.firstRow + i;
      j++;
    }
  }
  return pairedRows(x, y, rows, xc.sheet, total, total - used, xc.header, yc.header);
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
