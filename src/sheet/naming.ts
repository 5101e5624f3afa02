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
