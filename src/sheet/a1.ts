/**
 * A1 addresses, the one parser and formatter for the whole project: the cell functions (naming sheet rows in
 * messages), the panel (what it reads and writes) and the workbench grid all go through here. Column letters
 * (A … XFD), 1-based rows, `$` anchors, sheet prefixes (`North!B2:B49`, `'North branch'!$B$2:$B$49`,
 * `'It''s here'!B2`), whole columns (`B:C`), whole rows (`2:5`) and several areas joined by commas. Pure: no
 * host, no DOM.
 */

/** The largest sheet in current Excel: 1,048,576 rows by 16,384 columns (XFD). */
export const MAX_ROWS = 1048576;
export const MAX_COLUMNS = 16384;

/** A rectangular block of cells on one sheet; rows and columns are 1-based and inclusive. */
export interface CellBlock {
  /** Sheet name, unquoted ("" when the address named none). */
  sheet: string;
  firstRow: number;
  lastRow: number;
  firstColumn: number;
  lastColumn: number;
}

/** How an area was written: cells ("B2:C9"), whole columns ("B:C") or whole rows ("2:5"). */
export type AreaSpan = 'cells' | 'columns' | 'rows';

/** A parsed area: its block and how it was written. */
export type ParsedBlock = CellBlock & { span: AreaSpan };

/**
 * Column letters for a 1-based column number: 1 → "A", 28 → "AB" (bijective base 26).
 * @throws RangeError for anything but a whole number from 1 to MAX_COLUMNS.
 */
export function columnLetters(column: number): string {
  if (!(Number.isInteger(column) && column >= 1 && column <= MAX_COLUMNS)) throw new RangeError(`no column number ${column}`);
  let s = '';
  let c = column;
  while (c > 0) {
    const r = (c - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    c = (c - 1 - r) / 26;
  }
  return s;
}

/** 1-based column number for letters: "A" → 1, "ab" → 28; NaN for anything else or past XFD. */
export function columnNumber(letters: string): number {
  if (!/^[A-Za-z]{1,3}$/.test(letters)) return NaN;
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n <= MAX_COLUMNS ? n : NaN;
}

/** "B2" for row 2, column 2. */
export function cellName(row: number, column: number): string {
  return columnLetters(column) + String(row);
}

/**
 * Whether a sheet name must be quoted before "!": anything beyond letters, digits, "_" and ".", or a name that
 * reads as something else (a cell such as "AB12", an R1C1 reference, TRUE or FALSE). Quoting a name that did not
 * need it is harmless, so the rule errs on that side.
 */
function needsQuotes(sheet: string): boolean {
  if (!/^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet)) return true;
  return /^[A-Za-z]{1,3}\d+$/.test(sheet) || /^[Rr]\d*[Cc]\d*$/.test(sheet) || /^(true|false)$/i.test(sheet);
}

/** A sheet name as it appears before "!" in a reference: 'North branch', 'It''s here', North. */
export function quoteSheet(sheet: string): string {
  return needsQuotes(sheet) ? `'${sheet.replace(/'/g, "''")}'` : sheet;
}

/**
 * Splits "Sheet!ref" into the sheet (unquoted; undefined when the text names none) and the reference. A quoted
 * name may hold "!" and doubled quotes; an unquoted one ends at the last "!".
 */
export function splitSheet(area: string): { sheet: string | undefined; ref: string } {
  const text = area.trim();
  if (text.startsWith("'")) {
    let name = '';
    let i = 1;
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
    if (text[i] === "'" && text[i + 1] === '!') return { sheet: name, ref: text.slice(i + 2) };
    return { sheet: undefined, ref: text };
  }
  const bang = text.lastIndexOf('!');
  if (bang < 0) return { sheet: undefined, ref: text };
  return { sheet: text.slice(0, bang), ref: text.slice(bang + 1) };
}

interface Corner {
  row: number | null;
  column: number | null;
}

function parseCorner(text: string): Corner | null {
  const m = /^\$?([A-Za-z]{1,3})?\$?(\d{1,7})?$/.exec(text.trim());
  if (!m || (m[1] === undefined && m[2] === undefined)) return null;
  const column = m[1] === undefined ? null : columnNumber(m[1]);
  const row = m[2] === undefined ? null : Number(m[2]);
  if (column !== null && Number.isNaN(column)) return null;
  if (row !== null && !(row >= 1 && row <= MAX_ROWS)) return null;
  return { row, column };
}

/**
 * Parses one area ("North!B2:C9", "B:B", "2:5", "$B$2"); `defaultSheet` is used when it names no sheet.
 * Returns null when the text is not an A1 reference.
 * @example parseBlock("'North branch'!B2:C9") // { sheet: 'North branch', firstRow: 2, lastRow: 9, firstColumn: 2, lastColumn: 3, span: 'cells' }
 */
export function parseBlock(area: string, defaultSheet = ''): ParsedBlock | null {
  const { sheet, ref } = splitSheet(area);
  const parts = ref.split(':');
  if (parts.length > 2) return null;
  const p = parseCorner(parts[0]);
  const q = parts.length === 2 ? parseCorner(parts[1]) : p;
  if (!p || !q) return null;
  // "B:C" (whole columns) and "2:5" (whole rows) leave one dimension open on both corners, and need both corners.
  if ((p.row === null) !== (q.row === null) || (p.column === null) !== (q.column === null)) return null;
  const span: AreaSpan = p.row === null ? 'columns' : p.column === null ? 'rows' : 'cells';
  if (span !== 'cells' && parts.length === 1) return null;
  const r1 = p.row ?? 1;
  const r2 = q.row ?? MAX_ROWS;
  const c1 = p.column ?? 1;
  const c2 = q.column ?? MAX_COLUMNS;
  return {
    sheet: sheet ?? defaultSheet,
    firstRow: Math.min(r1, r2),
    lastRow: Math.max(r1, r2),
    firstColumn: Math.min(c1, c2),
    lastColumn: Math.max(c1, c2),
    span,
  };
}

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

/**
 * Parses an address with one or more areas; later areas without a sheet stay on the sheet of the earlier ones.
 * Returns null when any area is not an A1 reference.
 * @example parseAddress("North!B2:B9,D2:D9") // two blocks on North
 */
export function parseAddress(address: string, defaultSheet = ''): CellBlock[] | null {
  const areas = splitAreas(address);
  if (areas.length === 0) return null;
  const blocks: CellBlock[] = [];
  let sheet = defaultSheet;
  for (const area of areas) {
    const parsed = parseBlock(area, sheet);
    if (!parsed) return null;
    const { span: _span, ...block } = parsed;
    sheet = block.sheet;
    blocks.push(block);
  }
  return blocks;
}

export interface FormatOptions {
  /** "$B$2" anchors. */
  absolute?: boolean;
  /** Leave the sheet out even when the block has one. */
  withoutSheet?: boolean;
  /** Write a block spanning every row as whole columns ("B:C") rather than "B1:C1048576". */
  wholeColumns?: boolean;
}

/** Writes a block back as "Sheet!B2:B49" ("B2" for one cell; no sheet part when the sheet is ""). */
export function formatBlock(b: CellBlock, o: FormatOptions = {}): string {
  const d = o.absolute ? '$' : '';
  let ref: string;
  if (o.wholeColumns && b.firstRow === 1 && b.lastRow >= MAX_ROWS) {
    ref = `${d}${columnLetters(b.firstColumn)}:${d}${columnLetters(b.lastColumn)}`;
  } else {
    const tl = `${d}${columnLetters(b.firstColumn)}${d}${b.firstRow}`;
    const br = `${d}${columnLetters(b.lastColumn)}${d}${b.lastRow}`;
    ref = tl === br ? tl : `${tl}:${br}`;
  }
  return b.sheet && !o.withoutSheet ? `${quoteSheet(b.sheet)}!${ref}` : ref;
}

/** True when two blocks share at least one cell (sheet names compare case-insensitively, as in Excel). */
export function blocksIntersect(a: CellBlock, b: CellBlock): boolean {
  return (
    a.sheet.toLowerCase() === b.sheet.toLowerCase() &&
    a.firstRow <= b.lastRow &&
    b.firstRow <= a.lastRow &&
    a.firstColumn <= b.lastColumn &&
    b.firstColumn <= a.lastColumn
  );
}
