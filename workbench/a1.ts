/**
 * The workbench grid's view of A1 addresses: an Area is a block of cells in grid terms (top, left, bottom, right;
 * bottom is Infinity for whole columns, which grow with the sheet). Parsing, formatting, quoting and column letters
 * are the project's one set of address rules (src/sheet/a1.ts); this module only converts. Whole rows ("2:5")
 * are not grid areas here: the workbench refuses them.
 */
import { blocksIntersect, CellBlock, cellName, columnLetters, columnNumber, formatBlock, MAX_COLUMNS, MAX_ROWS, parseBlock, quoteSheet } from '../src/sheet/a1';

/** A rectangle of cells on one sheet (inclusive bounds, 1-based). `bottom` is Infinity for whole columns. */
export interface Area {
  sheet: string;
  top: number;
  left: number;
  bottom: number;
  right: number;
}

/** The widest sheet a spreadsheet allows (XFD), so a typo cannot create a million-column grid. */
export const MAX_COLUMN = MAX_COLUMNS;
export const MAX_ROW = MAX_ROWS;

export { cellName, columnLetters, columnNumber, quoteSheet };

function blockOf(a: Area): CellBlock {
  return { sheet: a.sheet, firstRow: a.top, lastRow: a.bottom === Infinity ? MAX_ROWS : a.bottom, firstColumn: a.left, lastColumn: a.right };
}

/** Area to "Sheet!B2:C49" (or "Sheet!B2" for one cell); whole columns print as "Sheet!B:C". */
export function formatArea(a: Area, withSheet = true): string {
  const b = blockOf(a);
  return formatBlock(withSheet ? b : { ...b, sheet: '' }, { wholeColumns: a.bottom === Infinity });
}

/**
 * Parses an address into an area; `defaultSheet` is used when the address names none. Returns null when the
 * text is not an address of cells or whole columns.
 * @example parseArea("North!B2:B49", "X") // → { sheet: "North", top: 2, left: 2, bottom: 49, right: 2 }
 */
export function parseArea(address: string, defaultSheet: string): Area | null {
  const b = parseBlock(address, defaultSheet);
  if (!b || b.span === 'rows') return null;
  return { sheet: b.sheet, top: b.firstRow, left: b.firstColumn, bottom: b.span === 'columns' ? Infinity : b.lastRow, right: b.lastColumn };
}

/** True when the two areas share at least one cell (sheet names compare case-insensitively, as in Excel). */
export function intersects(a: Area, b: Area): boolean {
  return blocksIntersect(blockOf(a), blockOf(b));
}
