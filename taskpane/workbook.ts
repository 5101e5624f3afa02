/**
 * The small workbook interface the panel talks to. Two implementations: excel-workbook.ts (Office.js, inside
 * Excel) and the workbench's grid (workbench/). Rendering never calls a host directly: only through this.
 *
 * Addresses are A1-style with a sheet, e.g. "Staff!B2:B49". Row numbers are sheet rows (1-based).
 *
 * Changes (additive; existing implementations keep working unchanged):
 * - readColumnNumbers (optional): a column's data cells as a Float64Array, for hosts that hold their cells in a
 *   form that gives numbers without building one JavaScript array per row. At 100,000 rows those per-row arrays
 *   are most of the garbage a redraw makes (the collector copying them dominated the redraw time); the panel
 *   uses this method when present and readColumn otherwise.
 * - ReadOptions (optional on every read): progress for reads made in several requests, and a signal that cancels
 *   a read once it is stale (the panel cancels the read of a previous refresh when cells change again).
 * - ReportChartSpec.to (optional): the chart's bottom-right cell, so the report's charts can be stacked.
 */

/** A rectangular block of cells read from the workbook. */
export interface RangeRead {
  /** Full address with sheet, e.g. "Staff!B2:B49". */
  address: string;
  sheet: string;
  /** First sheet row (1-based) and first column (1-based) of the block. */
  firstRow: number;
  firstColumn: number;
  /** Cell values as the host gives them: numbers, strings, booleans, null or "" for blanks. */
  values: unknown[][];
}

/** A named table (Excel table, or a block of the workbench with a header row). */
export interface TableInfo {
  name: string;
  sheet: string;
  columns: string[];
  /** Optional: whether each column's first data cell holds a number (the picker's defaults skip text columns). */
  numeric?: boolean[];
}

/** A column picked by the user: either a fixed range or a table column that follows the table as it grows. */
export type ColumnSource =
  | { kind: 'range'; address: string }
  | {
      kind: 'table';
      table: string;
      column: string;
      /** The column's place in the table (0-based) when it was picked: a column renamed since is found there,
       *  and the read's header gives its new name. */
      position?: number;
    };

/** A column's data cells as numbers: the fast path of Workbook.readColumnNumbers. */
export interface NumericColumnRead {
  /** Address of the data cells (header excluded), with sheet. */
  address: string;
  sheet: string;
  /** Sheet row (1-based) of numbers[0], and the column (1-based). */
  firstRow: number;
  column: number;
  /** The header: the table column's name, the text of a range's first cell, or else the address. */
  header: string;
  /** One entry per data cell in sheet order: the cell's value when it is a finite number, else NaN (blank, text,
   *  TRUE/FALSE, error: the same cells readColumn's caller would skip). */
  numbers: Float64Array;
}

/** How a long read reports and stops. */
export interface ReadOptions {
  /** Called after each block with the rows read so far and the rows in all. Not called for a one-request read. */
  onProgress?: (doneRows: number, totalRows: number) => void;
  /** When aborted, the read stops before its next request and rejects with ReadCancelled. */
  signal?: AbortSignal;
}

/** A read stopped by its signal: nothing of it is used. */
export class ReadCancelled extends Error {
  constructor() {
    super('the read was cancelled: the cells changed again before it finished');
    this.name = 'ReadCancelled';
  }
}

/** A native XY scatter chart for the report sheet: y against x bound to cells (the data, or the report's own
 *  formula cells), so it stays live with them. */
export interface ReportChartSpec {
  title: string;
  /** The cells of x and y (same length), with their sheet, e.g. "North!B2:B49". */
  x: string;
  y: string;
  xTitle: string;
  yTitle: string;
  /** The cell the chart's top-left corner sits on, on the report sheet, e.g. "F2". */
  at: string;
  /** Optional: the cell its bottom-right corner sits on, e.g. "M17" (several charts then cannot overlap);
   *  omitted, the host's default size. */
  to?: string;
  /** Adds the least-squares straight line (Excel's linear trendline). */
  trendline: boolean;
}

export interface Workbook {
  /** Address of the current selection (may span several columns). */
  getSelection(): Promise<string>;
  /** Tables with a header row, for picking columns by header. */
  listTables(): Promise<TableInfo[]>;
  /** Reads a column source; for a range the header is the first cell when it is text, else the address. */
  readColumn(source: ColumnSource, options?: ReadOptions): Promise<RangeRead & { header: string }>;
  /** Optional fast path for readColumn (see the note at the top). For a range, a text first cell is the header
   *  and not data, exactly as with readColumn. */
  readColumnNumbers?(source: ColumnSource, options?: ReadOptions): Promise<NumericColumnRead>;
  /** Reads any range by address. */
  readRange(address: string, options?: ReadOptions): Promise<RangeRead>;
  /** Calls onChange (possibly many times; the caller debounces) when any watched source may have changed.
   *  Returns a function that stops watching. */
  watch(sources: ColumnSource[], onChange: () => void): Promise<() => void>;
  /** Optional: selects a block and brings it into view (after a write, so the user sees what was written). */
  selectRange?(address: string): Promise<void>;
  /** Selects a whole sheet row (1-based) so the user sees it. */
  selectRow(sheet: string, row: number): Promise<void>;
  /** Writes values or formulas ("=COVARY.COEF(...)") into a block starting at the top-left cell address. */
  writeCells(topLeft: string, cells: (string | number)[][]): Promise<void>;
  /** Optional: the bytes of arguments the host passes a cell function per call, or null when it sets no known
   *  limit (host-limits.ts). */
  functionArgumentLimit?(): number | null;
  /** Optional: adds a native chart to a sheet (hosts that draw charts; the workbench does not). */
  addChart?(sheet: string, spec: ReportChartSpec): Promise<void>;
  /** Adds a new sheet (a unique name derived from `name`) holding the given cells; returns its name. */
  addSheet(name: string, cells: (string | number)[][]): Promise<string>;
}
