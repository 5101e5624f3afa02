/**
 * Names the sheet position of each pair for messages ("row 12", "column F"), from the address Excel passes with
 * @requiresParameterAddresses (e.g. "Sheet1!B2:B40", "'North branch'!$B$2:$B$40"). Without an address (unit tests,
 * hosts that do not supply one) pairs are named by their position in the range: "position 5".
 */
import { CellRange } from './cells';
import { columnLetters } from './column-letters';

/** Start of a range address: 1-based row and column of its top-left cell, or null when it cannot be read. */
export function rangeStart(address: string | undefined | null): { row: number; column: number } | null {
  if (typeof address !== 'string') return null;
  // The sheet name (possibly quoted, possibly holding "!") ends at the last "!".
  const cells = address.slice(address.lastIndexOf('!') + 1);
  // "B2:B40" starts at B2; a whole-column address "B:B" starts at row 1.
  const m = /^\$?([A-Za-z]{1,3})(?:\$?(\d{1,7})|(?=:))/.exec(cells);
  if (!m) return null;
  let column = 0;
  for (const ch of m[1].toUpperCase()) column = column * 26 + (ch.charCodeAt(0) - 64);
  const row = m[2] === undefined ? 1 : Number(m[2]);
  if (!(row >= 1 && column >= 1)) return null;
  return { row, column };
}

/** Column letters for a 1-based column number: 1 -> "A", 28 -> "AB". */
export function columnName(column: number): string {
  return columnLetters(column);
}

/** How pairs are named: `key` tells cached results with different names apart. */
export interface PointNaming {
  key: string;
  /** Name of the cell at 0-based position k within the range. */
  name: (k: number) => string;
}

/**
 * Naming for pairs read from `range` whose address is `address`: sheet rows for a column range, sheet columns for
 * a row range, positions when the address is missing or unreadable.
 */
export function pointNaming(range: CellRange, address: string | undefined | null): PointNaming {
  const start = rangeStart(address);
  if (!start) return { key: 'position', name: (k) => `position ${k + 1}` };
  const byColumns = Array.isArray(range) && range.length === 1 && Array.isArray(range[0]) && range[0].length > 1;
  if (byColumns) return { key: `column:${start.column}`, name: (k) => `column ${columnName(start.column + k)}` };
  return { key: `row:${start.row}`, name: (k) => `row ${start.row + k}` };
}
