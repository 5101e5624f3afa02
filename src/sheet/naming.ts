/**
 * Names the sheet position of each pair for messages ("row 12", "column F"), from the address Excel passes with
 * @requiresParameterAddresses (e.g. "Sheet1!B2:B40", "'North branch'!$B$2:$B$40"). Without an address (unit tests,
 * hosts that do not supply one) pairs are named by their position in the range: "position 5". Pure.
 */
import { CellRange } from './cells';
import { columnLetters, MAX_COLUMNS, parseBlock } from './a1';

/** How pairs are named: `key` tells cached results with different names apart. */
export interface PointNaming {
  key: string;
  /** Name of the cell at 0-based position k within the range. */
  name: (k: number) => string;
}

/** Start of a range address: 1-based row and column of its top-left cell, or null when it cannot be read. */
export function rangeStart(address: string | undefined | null): { row: number; column: number } | null {
  if (typeof address !== 'string') return null;
  const block = parseBlock(address);
  return block ? { row: block.firstRow, column: block.firstColumn } : null;
}

/**
 * Naming for pairs read from `range` whose address is `address`: sheet rows for a column range, sheet columns for
 * a row range, positions when the address is missing or unreadable.
 */
export function pointNaming(range: CellRange, address: string | undefined | null): PointNaming {
  const start = rangeStart(address);
  if (!start) return { key: 'position', name: (k) => `position ${k + 1}` };
  const byColumns = Array.isArray(range) && range.length === 1 && Array.isArray(range[0]) && range[0].length > 1;
  // A range the host describes wrongly (wider than the sheet from that column) still gets names: positions.
  if (byColumns) {
    return { key: `column:${start.column}`, name: (k) => (start.column + k <= MAX_COLUMNS ? `column ${columnLetters(start.column + k)}` : `position ${k + 1}`) };
  }
  return { key: `row:${start.row}`, name: (k) => `row ${start.row + k}` };
}

/** Naming by the sheet row of each pair, as the panel knows them. */
export function sheetRowNaming(rows: ArrayLike<number>): PointNaming {
  return { key: 'sheet-rows', name: (i) => `row ${rows[i]}` };
}

/** How pairs are numbered in a returned column: by sheet row, by sheet column (a row range), or by position. */
export interface PointNumbering {
  by: 'row' | 'column' | 'position';
  /** Number of the cell at 0-based position k within the range: its sheet row, sheet column, or k + 1. */
  number: (k: number) => number;
}

/**
 * Numbers for pairs read from `range` whose address is `address`: sheet rows for a column range, sheet columns
 * for a row range. Only an address that describes a block of exactly the range's shape is trusted (a whole
 * column "B:B" with its 1,048,576 cells is one); anything else, or no address, gives positions 1, 2, 3 ...
 */
export function pointNumbering(range: CellRange, address: string | undefined | null): PointNumbering {
  const position: PointNumbering = { by: 'position', number: (k) => k + 1 };
  const block = typeof address === 'string' ? parseBlock(address) : null;
  if (!block || !Array.isArray(range) || range.length === 0 || !Array.isArray(range[0])) return position;
  const rows = range.length;
  const cols = range[0].length;
  if (block.lastRow - block.firstRow + 1 !== rows || block.lastColumn - block.firstColumn + 1 !== cols) return position;
  if (rows === 1 && cols > 1) return { by: 'column', number: (k) => block.firstColumn + k };
  return { by: 'row', number: (k) => block.firstRow + k };
}
