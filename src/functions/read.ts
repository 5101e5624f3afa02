/**
 * Reading the ranges a cell function receives into columns for the core, by the rules of src/sheet: what counts
 * as a number (cells.ts), complete rows (pairs.ts) and blanks passed as zeros (blanks.ts). No mathematics here.
 */
import { refuseBlanksAsZeros } from '../sheet/blanks';
import { assertSameSize, CellRange, ColumnAllocator, lastNumberIndex, rangeShape, readColumns, readVector, vectorLength } from '../sheet/cells';
import { completeRows } from '../sheet/pairs';
import { StatsInputError } from '../stats/types';

/** Complete pairs read from two ranges, with the position of each pair in the range (0-based). */
export interface PairedColumns {
  x: Float64Array;
  y: Float64Array;
  /** Index within the range (0-based) of each used pair: row for a column range, column for a row range; null
   *  when every cell pairs, so pair i is cell i. */
  index: Int32Array | null;
  /** Cells in each range. */
  total: number;
  /** Pairs skipped because either cell was blank, text, boolean or an error. */
  skipped: number;
}

/**
 * Pairs two vectors already read (NaN marks a cell that does not count), refusing blanks passed as zeros.
 * @param total cells in each range (more than the vectors hold when reading stopped at the last number)
 */
export function pairVectors(xs: Float64Array, ys: Float64Array, xName: string, yName: string, total: number, alloc?: ColumnAllocator): PairedColumns {
  assertSameSize(xs.length, ys.length, xName, yName);
  refuseBlanksAsZeros([xs, ys], `${xName} and ${yName}`, 'B2:B500', true);
  const kept = completeRows([xs, ys], alloc);
  const used = kept.columns[0].length;
  return { x: kept.columns[0], y: kept.columns[1], index: kept.index, total, skipped: total - used };
}

/**
 * Pairs two ranges cell by cell (a row and a column of equal length pair up too) and keeps the complete pairs.
 * @throws StatsInputError when the ranges hold different numbers of cells.
 */
export function readPairs(xRange: CellRange, yRange: CellRange, xName = 'x', yName = 'y'): PairedColumns {
  const nx = vectorLength(xRange, xName);
  const ny = vectorLength(yRange, yName);
  assertSameSize(nx, ny, xName, yName);
  return pairVectors(readVector(xRange, xName), readVector(yRange, yName), xName, yName, nx);
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
  refuseBlanksAsZeros(vectors, names.join(', '), 'B2:D500', false);
  return completeRows(vectors).columns;
}

/** A block's columns, refusing blanks passed as zeros. `skipRows` leading rows (headers) are left out. */
export function readBlock(range: CellRange, name: string, skipRows = 0): Float64Array[] {
  const columns = readColumns(range, name, skipRows);
  refuseBlanksAsZeros(columns, name, 'B2:D500', false);
  return columns;
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
    // Rows after the last number in x or y are incomplete whatever the controls hold: read only up to there.
    const used = Math.max(lastNumberIndex(x, 'x'), lastNumberIndex(y, 'y')) + 1;
    if (used < n) {
      const cut = (r: CellRange) => r.slice(0, Math.max(used, 1));
      controlColumns = readColumns(cut(controls), 'controls');
      const all = [readVector(cut(x), 'x'), readVector(cut(y), 'y'), ...controlColumns];
      refuseBlanksAsZeros(all, 'x, y and controls', 'B2:D500', false);
      const kept = completeRows(all).columns;
      return { x: kept[0], y: kept[1], controls: kept.slice(2) };
    }
    controlColumns = readColumns(controls, 'controls');
  }
  const all = [readVector(x, 'x'), readVector(y, 'y'), ...controlColumns];
  refuseBlanksAsZeros(all, 'x, y and controls', 'B2:D500', false);
  const kept = completeRows(all).columns;
  return { x: kept[0], y: kept[1], controls: kept.slice(2) };
}
