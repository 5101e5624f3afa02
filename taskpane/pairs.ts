/**
 * Turns column reads from the workbook into complete numeric pairs, remembering each pair's sheet row so that a
 * point on a chart can lead back to its row. What counts as a number and which rows are complete are the rules
 * the cell functions use too (src/sheet/cells.ts, src/sheet/pairs.ts): finite numbers count; blanks, text,
 * TRUE/FALSE and errors are skipped pairwise. Pure.
 *
 * Everything downstream works on NumericColumnRead (a Float64Array per column, NaN for cells that do not count):
 * hosts that can supply it directly do (Workbook.readColumnNumbers); otherwise numericColumn() converts a
 * readColumn result.
 */
import type { CellBlock } from '../src/sheet/a1';
import { readVector } from '../src/sheet/cells';
import { completeRows as completeSheetRows } from '../src/sheet/pairs';
import type { ColumnSource, NumericColumnRead, RangeRead, ReadOptions, Workbook } from './workbook';

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
  const numbers = rows.length === 0 ? new Float64Array(0) : readVector(rows, read.address, { from: start });
  return { address: read.address, sheet: read.sheet, firstRow: read.firstRow + start, column: read.firstColumn, header: read.header, numbers };
}

/** Reads one column as numbers, through the host's fast path when it has one. */
export async function readNumericColumn(wb: Workbook, source: ColumnSource, options?: ReadOptions): Promise<NumericColumnRead> {
  if (wb.readColumnNumbers) return wb.readColumnNumbers(source, options);
  return numericColumn(await wb.readColumn(source, options));
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
  /** Sheet rows of the first SKIPPED_LISTED skipped rows, in order (the panel lists them). */
  skippedRows: Int32Array;
}

/** How many skipped rows the panel names (the count is always given in full). */
export const SKIPPED_LISTED = 20;

/**
 * Builds a PairedRows. Every PairedRows is made here, so all have one object shape: the analysis, compiled for
 * speed on the first ones it sees (the panel's warm-up rounds), then meets no other shape and is not recompiled.
 */
export function pairedRows(x: Float64Array, y: Float64Array, rows: Int32Array, sheet: string, total: number, skipped: number, xHeader: string, yHeader: string, skippedRows: Int32Array = new Int32Array(0)): PairedRows {
  return { x, y, rows, sheet, total, skipped, xHeader, yHeader, skippedRows };
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
  const kept = completeSheetRows([xs, ys]);
  if (kept.columns[0].length < 3) {
    // Say why, column by column: a label column (names, months) picked by mistake is the usual cause.
    const numbers = (v: Float64Array) => {
      let k = 0;
      for (let i = 0; i < v.length; i++) if (v[i] === v[i]) k++;
      return k;
    };
    const empty = [xc, yc].filter((c) => numbers(c.numbers) === 0).map((c) => `“${c.header}”`);
    if (empty.length > 0) {
      throw new PairingError(`${empty.join(' and ')} ${empty.length === 1 ? 'holds' : 'hold'} no numbers (only text or blanks): pick ${empty.length === 1 ? 'a column' : 'columns'} of numbers.`);
    }
  }
  const [x, y] = kept.columns;
  const rows = new Int32Array(x.length);
  for (let j = 0; j < rows.length; j++) rows[j] = xc.firstRow + (kept.index ? kept.index[j] : j);
  const skippedRows = new Int32Array(Math.min(SKIPPED_LISTED, kept.skipped));
  for (let i = 0, k = 0, j = 0; i < total && k < skippedRows.length; i++) {
    // kept.index lists the kept positions in order; a position not among them was skipped.
    if (kept.index && j < kept.index.length && kept.index[j] === i) j++;
    else if (kept.index) skippedRows[k++] = xc.firstRow + i;
  }
  return pairedRows(x, y, rows, xc.sheet, total, kept.skipped, xc.header, yc.header, skippedRows);
}

/**
 * Rows complete in every one of several same-length columns (the same-rows comparisons need each row to hold all
 * the numbers). Returns the columns restricted to those rows.
 */
export function completeRows(columns: Float64Array[]): { columns: Float64Array[]; skipped: number } {
  const n = columns[0].length;
  if (columns.some((c) => c.length !== n)) throw new PairingError('The columns have different lengths: pick columns on the same rows.');
  const kept = completeSheetRows(columns);
  return { columns: kept.columns, skipped: kept.skipped };
}
