/**
 * A1-style addresses as spreadsheets write them: column letters (A … XFD), 1-based rows, optional `$` anchors,
 * sheet prefixes (`North!B2:B49`, `'Live formulas'!B2`) and whole columns (`B:C`).
 * Rows and columns are 1-based throughout the workbench, like the sheet the user sees.
 */
import { columnLetters, columnNumber, MAX_COLUMNS } from '../src/functions/column-letters';

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
export const MAX_ROW = 1048576;

/** Column number (1-based) to letters, and back ("A" ↔ 1, "AB" ↔ 28; NaN for what is not a column). */
export { columnLetters, columnNumber };

/** "B2" for row 2, column 2. */
export function cellName(row: number, column: number): string {
  return columnLetters(column) + String(row);
}

/** A sheet name as it must appear before "!": quoted when it holds anything but letters, digits, _ and dots. */
export function quoteSheet(sheet: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet) && !looksLikeCell(sheet) ? sheet : `'${sheet.replace(/'/g, "''")}'`;
}

function looksLikeCell(s: string): boolean {
  const m = /^([A-Za-z]{1,3})(\d+)$/.exec(s);
  return m !== null && !Number.isNaN(columnNumber(m[1]));
}

/** Area to "Sheet!B2:C49" (or "Sheet!B2" for one cell); whole columns print as "Sheet!B:C". */
export function formatArea(a: Area, withSheet = true): string {
  const prefix = withSheet ? quoteSheet(a.sheet) + '!' : '';
  if (a.bottom === Infinity) return `${prefix}${columnLetters(a.left)}:${columnLetters(a.right)}`;
  const first = cellName(a.top, a.left);
  if (a.top === a.bottom && a.left === a.right) return prefix + first;
  return `${prefix}${first}:${cellName(a.bottom, a.right)}`;
}

/** One cell reference inside a range: "$B$2" → {row: 2, column: 2}; a bare column "B" → row undefined. */
interface RefEnd {
  row?: number;
  column: number;
}

function parseRefEnd(text: string): RefEnd | null {
  const m = /^\$?([A-Za-z]{1,3})(?:\$?(\d{1,7}))?$/.exec(text.trim());
  if (!m) return null;
  const column = columnNumber(m[1]);
  if (Number.isNaN(column)) return null;
  if (m[2] === undefined) return { column };
  const row = Number(m[2]);
  if (row < 1 || row > MAX_ROW) return null;
  return { row, column };
}

/**
 * Splits "Sheet!B2:C3" or "'It''s here'!B2" into the sheet name (unquoted, or undefined) and the cell part.
 */
export function splitSheet(address: string): { sheet?: string; cells: string } {
  const text = address.trim();
  if (text.startsWith("'")) {
    let i = 1;
    let name = '';
    while (i < text.length) {
      if (text[i] === "'") {
        if (text[i + 1] === "'") {
          name += "'";
          i += 2;
          continue;
        }
        break;
      }
      name += text[i];
      i++;
    }
    if (text[i] !== "'" || text[i + 1] !== '!') return { cells: text };
    return { sheet: name, cells: text.slice(i + 2) };
  }
  const bang = text.lastIndexOf('!');
  if (bang < 0) return { cells: text };
  return { sheet: text.slice(0, bang), cells: text.slice(bang + 1) };
}

/**
 * Parses an address into an area; `defaultSheet` is used when the address names none.
 * Returns null when the text is not an address.
 * @example parseArea("North!B2:B49", "X") // → { sheet: "North", top: 2, left: 2, bottom: 49, right: 2 }
 */
export function parseArea(address: string, defaultSheet: string): Area | null {
  const { sheet, cells } = splitSheet(address);
  const parts = cells.split(':');
  if (parts.length < 1 || parts.length > 2) return null;
  const a = parseRefEnd(parts[0]);
  const b = parts.length === 2 ? parseRefEnd(parts[1]) : a;
  if (!a || !b) return null;
  const wholeColumns = a.row === undefined && b.row === undefined;
  if (!wholeColumns && (a.row === undefined || b.row === undefined)) return null;
  if (wholeColumns && parts.length === 1) return null;
  const sheetName = sheet ?? defaultSheet;
  if (wholeColumns) {
    return { sheet: sheetName, top: 1, bottom: Infinity, left: Math.min(a.column, b.column), right: Math.max(a.column, b.column) };
  }
  return {
    sheet: sheetName,
    top: Math.min(a.row as number, b.row as number),
    bottom: Math.max(a.row as number, b.row as number),
    left: Math.min(a.column, b.column),
    right: Math.max(a.column, b.column),
  };
}

/** True when the two areas share at least one cell (sheet names compare case-insensitively, as in Excel). */
export function intersects(a: Area, b: Area): boolean {
  return (
    a.sheet.toLowerCase() === b.sheet.toLowerCase() &&
    a.top <= b.bottom &&
    b.top <= a.bottom &&
    a.left <= b.right &&
    b.left <= a.right
  );
}
