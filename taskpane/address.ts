/**
 * A1-style addresses as the workbook hands them over ("Staff!B2:C49", "'North branch'!$B$2:$B$49", "B:B",
 * several areas joined by commas), parsed into plain blocks and written back. Pure: no host, no DOM.
 */
import { columnLetters as sharedColumnLetters, columnNumber, MAX_COLUMNS } from '../src/functions/column-letters';

/** The largest sheet in current Excel: used for whole-column and whole-row addresses. */
export const MAX_ROWS = 1048576;
export { MAX_COLUMNS };

/** A rectangular block of cells on one sheet; rows and columns are 1-based and inclusive. */
export interface CellBlock {
  /** Sheet name, unquoted ("" when the address named none). */
  sheet: string;
  firstRow: number;
  lastRow: number;
  firstColumn: number;
  lastColumn: number;
}

/** Column letters for a 1-based column number: 1 → "A", 27 → "AA". */
export function columnLetters(column: number): string {
  if (!(Number.isInteger(column) && column >= 1 && column <= MAX_COLUMNS)) throw new RangeError(`no column number ${column}`);
  return sharedColumnLetters(column);
}

/** 1-based column number for letters: "A" → 1, "AA" → 27; NaN for anything else. */
export { columnNumber };

/** Splits "a,b" at commas outside single quotes (sheet names may hold commas). */
function splitAreas(address: string): string[] {
  const parts: string[] = [];
  let quoted = false;
  let start = 0;
  for (let i = 0; i < address.length; i++) {
    const ch = address[i];
    if (ch === "'") quoted = !quoted; // a doubled '' toggles twice: still right
    else if (ch === ',' && !quoted) {
      parts.push(address.slice(start, i));
      start = i + 1;
    }
  }
  parts.push(address.slice(start));
  return parts.map((p) => p.trim()).filter((p) => p.length > 0);
}

/** Splits "Sheet!ref" into its sheet (unquoted) and reference; the last "!" outside quotes separates them. */
function splitSheet(area: string): { sheet: string; ref: string } {
  const bang = area.lastIndexOf('!');
  if (bang < 0) return { sheet: '', ref: area };
  let sheet = area.slice(0, bang);
  if (sheet.length >= 2 && sheet.startsWith("'") && sheet.endsWith("'")) sheet = sheet.slice(1, -1).replace(/''/g, "'");
  return { sheet, ref: area.slice(bang + 1) };
}

interface Corner {
  row: number | null;
  column: number | null;
}

function parseCorner(text: string): Corner | null {
  const m = /^\$?([A-Za-z]{1,3})?\$?(\d+)?$/.exec(text.trim());
  if (!m || (m[1] === undefined && m[2] === undefined)) return null;
  const column = m[1] === undefined ? null : columnNumber(m[1]);
  const row = m[2] === undefined ? null : Number(m[2]);
  if (column !== null && Number.isNaN(column)) return null;
  if (row !== null && !(row >= 1 && row <= MAX_ROWS)) return null;
  return { row, column };
}

function parseArea(area: string, defaultSheet: string): CellBlock | null {
  const { sheet, ref } = splitSheet(area);
  const [a, b, extra] = ref.split(':');
  if (extra !== undefined) return null;
  const p = parseCorner(a);
  const q = b === undefined ? p : parseCorner(b);
  if (!p || !q) return null;
  // "B:C" (whole columns) and "2:5" (whole rows) leave one dimension open on both corners.
  if ((p.row === null) !== (q.row === null) || (p.column === null) !== (q.column === null)) return null;
  const r1 = p.row ?? 1;
  const r2 = q.row ?? MAX_ROWS;
  const c1 = p.column ?? 1;
  const c2 = q.column ?? MAX_COLUMNS;
  return {
    sheet: sheet || defaultSheet,
    firstRow: Math.min(r1, r2),
    lastRow: Math.max(r1, r2),
    firstColumn: Math.min(c1, c2),
    lastColumn: Math.max(c1, c2),
  };
}

/**
 * Parses an address with one or more areas. Returns null when any area is not an A1 reference.
 * @example parseAddress("'North branch'!B2:C9") // [{ sheet: 'North branch', firstRow: 2, lastRow: 9, firstColumn: 2, lastColumn: 3 }]
 */
export function parseAddress(address: string, defaultSheet = ''): CellBlock[] | null {
  const areas = splitAreas(address);
  if (areas.length === 0) return null;
  const blocks: CellBlock[] = [];
  let sheet = defaultSheet;
  for (const area of areas) {
    const block = parseArea(area, sheet);
    if (!block) return null;
    sheet = block.sheet; // later areas without a sheet name stay on the sheet of the earlier ones
    blocks.push(block);
  }
  return blocks;
}

/** Whether a sheet name must be quoted in a reference: anything beyond letters, digits, "_" and ".", or a name that reads as a cell. */
function needsQuotes(sheet: string): boolean {
  if (!/^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet)) return true;
  return /^[A-Za-z]{1,3}\d+$/.test(sheet) || /^[Rr]\d*[Cc]\d*$/.test(sheet) || /^(true|false)$/i.test(sheet);
}

/** A sheet name as it appears before "!" in a formula. */
export function quoteSheet(sheet: string): string {
  return needsQuotes(sheet) ? `'${sheet.replace(/'/g, "''")}'` : sheet;
}

/** Writes a block back as "Sheet!B2:B49" (or "B2" for one cell; no sheet part when the sheet is ""). */
export function formatBlock(b: CellBlock, absolute = false): string {
  const d = absolute ? '$' : '';
  const tl = `${d}${columnLetters(b.firstColumn)}${d}${b.firstRow}`;
  const br = `${d}${columnLetters(b.lastColumn)}${d}${b.lastRow}`;
  const ref = tl === br ? tl : `${tl}:${br}`;
  return b.sheet ? `${quoteSheet(b.sheet)}!${ref}` : ref;
}

/** The single columns of a block, left to right. */
export function splitColumns(b: CellBlock): CellBlock[] {
  const out: CellBlock[] = [];
  for (let c = b.firstColumn; c <= b.lastColumn; c++) out.push({ ...b, firstColumn: c, lastColumn: c });
  return out;
}

/** Number of rows and columns of a block. */
export function blockSize(b: CellBlock): { rows: number; columns: number } {
  return { rows: b.lastRow - b.firstRow + 1, columns: b.lastColumn - b.firstColumn + 1 };
}

/**
 * Two single columns from a selection: a block two columns wide, or two areas one column wide each (picked with
 * Ctrl). Returns null when the selection is anything else.
 */
export function twoColumnsOf(address: string): [CellBlock, CellBlock] | null {
  const blocks = parseAddress(address);
  if (!blocks) return null;
  if (blocks.length === 1 && blockSize(blocks[0]).columns === 2) {
    const [a, b] = splitColumns(blocks[0]);
    return [a, b];
  }
  if (blocks.length === 2 && blocks.every((b) => blockSize(b).columns === 1)) return [blocks[0], blocks[1]];
  return null;
}

/** One single column from a selection, or null. */
export function oneColumnOf(address: string): CellBlock | null {
  const blocks = parseAddress(address);
  if (!blocks || blocks.length !== 1 || blockSize(blocks[0]).columns !== 1) return null;
  return blocks[0];
}
