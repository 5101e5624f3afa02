/**
 * Cell adapter for multi-column ranges and for several aligned vectors: reads what Excel passes into plain
 * columns of numbers for the statistics core, by the same rules as cells.ts (finite numbers count; blanks, text,
 * TRUE/FALSE and errors do not). No mathematics here.
 */
import { StatsInputError } from '../stats/types';
import { assertSameSize, cellNumber, CellRange, readVector, vectorLength, ZERO_TAIL_LIMIT } from './cells';

/** Rows and columns of a rectangular range; throws a user error for anything else. Reads no cell. */
export function rangeShape(range: CellRange, name: string): { rows: number; cols: number } {
  if (!Array.isArray(range) || range.length === 0 || !Array.isArray(range[0]) || range[0].length === 0) {
    throw new StatsInputError('out-of-range', `${name} must be a range of cells`);
  }
  return { rows: range.length, cols: range[0].length };
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

/** The first row of a range as column names; a blank or non-text cell becomes "column N". */
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

/**
 * Refuses columns ending in ZERO_TAIL_LIMIT or more rows that are 0 in every column: the signature of empty cells
 * that some versions of Excel pass as 0 (the same rule as for two columns in cells.ts).
 */
export function refuseZeroTail(columns: Float64Array[], what: string): void {
  if (columns.length === 0) return;
  const n = columns[0].length;
  let k = n - 1;
  while (k >= 0 && columns.every((c) => c[k] === 0)) k--;
  const run = n - 1 - k;
  if (run >= ZERO_TAIL_LIMIT) {
    throw new StatsInputError(
      'out-of-range',
      `the last ${run} rows of ${what} are all 0: these look like empty cells that this version of Excel passes as 0. ` +
        'Pass only the filled rows (e.g. B2:D500) or table columns instead of whole columns',
    );
  }
}

/** Keeps the rows where every column holds a number; returns the kept columns and their row positions. */
export function completeRows(columns: Float64Array[]): { columns: Float64Array[]; index: Int32Array } {
  const n = columns.length === 0 ? 0 : columns[0].length;
  let used = 0;
  const keep = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    let ok = 1;
    for (const c of columns) {
      const v = c[i];
      if (v !== v) {
        ok = 0;
        break;
      }
    }
    keep[i] = ok;
    used += ok;
  }
  const out = columns.map(() => new Float64Array(used));
  const index = new Int32Array(used);
  let j = 0;
  for (let i = 0; i < n; i++) {
    if (!keep[i]) continue;
    for (let c = 0; c < columns.length; c++) out[c][j] = columns[c][i];
    index[j] = i;
    j++;
  }
  return { columns: out, index };
}

/**
 * Reads several single-row or single-column ranges that describe the same rows (equal cell counts), keeping the
 * rows complete in all of them.
 * @throws StatsInputError when the ranges hold different numbers of cells.
 */
export function readAlignedVectors(ranges: CellRange[], names: string[]): Float64Array[] {
  const lengths = ranges.map((r, i) => vectorLength(r, names[i]));
  const n = lengths[0];
  const bad = lengths.findIndex((len) => len !== n);
  if (bad >= 0) {
    throw new StatsInputError(
      'unequal-length',
      `${names.join(', ')} must hold the same number of cells (${names[0]} has ${n}, ${names[bad]} has ${lengths[bad]})`,
    );
  }
  const vectors = ranges.map((r, i) => readVector(r, names[i]));
  refuseZeroTail(vectors, names.join(', '));
  return completeRows(vectors).columns;
}

/**
 * Reads x, y and a block of control columns aligned with them, keeping rows complete in all. When x is a column,
 * each column of `controls` is one control and it must have as many rows as x; when x is a single row, each row
 * of `controls` is one control and it must have as many columns as x.
 * @throws StatsInputError when x and y differ in length or the controls do not line up with them.
 */
export function readWithControls(
  x: CellRange,
  y: CellRange,
  controls: CellRange,
): { x: Float64Array; y: Float64Array; controls: Float64Array[] } {
  const n = vectorLength(x, 'x');
  const ny = vectorLength(y, 'y');
  assertSameSize(n, ny);
  const { rows, cols } = rangeShape(controls, 'controls');
  const xIsRow = x.length === 1 && n > 1;
  let controlColumns: Float64Array[];
  if (xIsRow) {
    if (cols !== n) {
      throw new StatsInputError('unequal-length', `controls must line up with x: x is a row of ${n} cells, so each control must be a row of ${n} (controls has ${cols} columns)`);
    }
    controlColumns = [];
    for (let i = 0; i < rows; i++) controlColumns.push(readVector([controls[i]], 'controls'));
  } else {
    if (rows !== n) {
      throw new StatsInputError('unequal-length', `controls must line up with x: x has ${n} rows, controls has ${rows}`);
    }
    controlColumns = readColumns(controls, 'controls');
  }
  const all = [readVector(x, 'x'), readVector(y, 'y'), ...controlColumns];
  refuseZeroTail(all, 'x, y and controls');
  const kept = completeRows(all).columns;
  return { x: kept[0], y: kept[1], controls: kept.slice(2) };
}
