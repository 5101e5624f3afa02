/**
 * A small in-memory Workbook for previewing and measuring the panel outside Excel and the workbench: sheets of
 * cell values, named tables with a header row, change notifications, and a record of the rows selected and the
 * cells written.
 */
import { columnLetters, formatBlock, parseAddress } from '../../src/sheet/a1';
import type { ColumnSource, NumericColumnRead, RangeRead, TableInfo, Workbook } from '../../taskpane/workbook';

export interface MemoryTable {
  name: string;
  sheet: string;
  /** Header row (1-based) and first column (1-based); data rows run until the last row of the sheet. */
  headerRow: number;
  firstColumn: number;
  columns: string[];
}

export class MemoryWorkbook implements Workbook {
  readonly sheets = new Map<string, unknown[][]>();
  readonly tables: MemoryTable[] = [];
  selection = '';
  readonly selectedRows: { sheet: string; row: number }[] = [];
  readonly writes: { topLeft: string; cells: (string | number)[][] }[] = [];
  private listeners = new Set<() => void>();

  /** Sets one cell (1-based) and notifies watchers. */
  set(sheet: string, row: number, column: number, value: unknown): void {
    const grid = this.sheets.get(sheet);
    if (!grid) throw new Error(`no sheet ${sheet}`);
    while (grid.length < row) grid.push([]);
    grid[row - 1][column - 1] = value;
    for (const l of this.listeners) l();
  }

  async getSelection(): Promise<string> {
    return this.selection;
  }

  async listTables(): Promise<TableInfo[]> {
    return this.tables.map((t) => ({ name: t.name, sheet: t.sheet, columns: t.columns.slice() }));
  }

  async readColumn(source: ColumnSource): Promise<RangeRead & { header: string }> {
    if (source.kind === 'table') {
      const t = this.tables.find((k) => k.name === source.table);
      if (!t) throw new Error(`no table ${source.table}`);
      const c = t.columns.indexOf(source.column);
      if (c < 0) throw new Error(`no column ${source.column} in ${t.name}`);
      const last = this.sheets.get(t.sheet)!.length;
      const column = t.firstColumn + c;
      const read = await this.readRange(formatBlock({ sheet: t.sheet, firstRow: t.headerRow + 1, lastRow: last, firstColumn: column, lastColumn: column }));
      return { ...read, header: source.column };
    }
    const read = await this.readRange(source.address);
    const first = read.values[0]?.[0];
    return { ...read, header: typeof first === 'string' && first !== '' ? first : read.address };
  }

  /** Offer the numeric fast path (Workbook.readColumnNumbers); off to time the plain readColumn route. */
  numericFastPath = true;

  readColumnNumbers?: (source: ColumnSource) => Promise<NumericColumnRead> = async (source) => {
    if (!this.numericFastPath) throw new Error('numeric fast path is off');
    let sheet: string;
    let firstRow: number;
    let lastRow: number;
    let column: number;
    let header: string;
    if (source.kind === 'table') {
      const t = this.tables.find((k) => k.name === source.table);
      if (!t) throw new Error(`no table ${source.table}`);
      const c = t.columns.indexOf(source.column);
      if (c < 0) throw new Error(`no column ${source.column} in ${t.name}`);
      sheet = t.sheet;
      column = t.firstColumn + c;
      firstRow = t.headerRow + 1;
      lastRow = this.sheets.get(sheet)!.length;
      header = source.column;
    } else {
      const b = parseAddress(source.address)![0];
      sheet = b.sheet;
      column = b.firstColumn;
      firstRow = b.firstRow;
      lastRow = Math.min(b.lastRow, Math.max(b.firstRow, this.sheets.get(sheet)?.length ?? 0));
      const first = this.sheets.get(sheet)?.[firstRow - 1]?.[column - 1];
      header = typeof first === 'string' && first !== '' ? first : source.address;
      if (header !== source.address) firstRow++;
    }
    const grid = this.sheets.get(sheet) ?? [];
    const numbers = new Float64Array(Math.max(0, lastRow - firstRow + 1));
    for (let r = firstRow; r <= lastRow; r++) {
      const v = grid[r - 1]?.[column - 1];
      numbers[r - firstRow] = typeof v === 'number' && Number.isFinite(v) ? v : NaN;
    }
    const address = formatBlock({ sheet, firstRow, lastRow: Math.max(firstRow, lastRow), firstColumn: column, lastColumn: column });
    return { address, sheet, firstRow, column, header, numbers };
  };

  async readRange(address: string): Promise<RangeRead> {
    const b = parseAddress(address)?.[0];
    if (!b) throw new Error(`bad address ${address}`);
    const lastRow = Math.min(b.lastRow, Math.max(b.firstRow, this.sheets.get(b.sheet)?.length ?? 0));
    const grid = this.sheets.get(b.sheet) ?? [];
    const values: unknown[][] = new Array(Math.max(0, lastRow - b.firstRow + 1));
    for (let r = b.firstRow; r <= lastRow; r++) {
      const source = grid[r - 1];
      const row: unknown[] = new Array(b.lastColumn - b.firstColumn + 1);
      for (let c = b.firstColumn; c <= b.lastColumn; c++) {
        const v = source === undefined ? undefined : source[c - 1];
        row[c - b.firstColumn] = v === undefined || v === null ? '' : v;
      }
      values[r - b.firstRow] = row;
    }
    return { address: formatBlock({ ...b, lastRow }), sheet: b.sheet, firstRow: b.firstRow, firstColumn: b.firstColumn, values };
  }

  async watch(_sources: ColumnSource[], onChange: () => void): Promise<() => void> {
    this.listeners.add(onChange);
    return () => this.listeners.delete(onChange);
  }

  async selectRow(sheet: string, row: number): Promise<void> {
    this.selectedRows.push({ sheet, row });
    this.selection = `${sheet}!${row}:${row}`;
  }

  async writeCells(topLeft: string, cells: (string | number)[][]): Promise<void> {
    this.writes.push({ topLeft, cells });
    const b = parseAddress(topLeft)![0];
    cells.forEach((row, i) => row.forEach((v, j) => {
      const grid = this.sheets.get(b.sheet)!;
      while (grid.length < b.firstRow + i) grid.push([]);
      grid[b.firstRow + i - 1][b.firstColumn + j - 1] = v;
    }));
  }

  async addSheet(name: string, cells: (string | number)[][]): Promise<string> {
    let unique = name;
    for (let k = 2; this.sheets.has(unique); k++) unique = `${name} (${k})`;
    this.sheets.set(unique, cells.map((r) => r.slice()));
    return unique;
  }
}

/** "B" for column 2, for building addresses in previews. */
export const letter = columnLetters;
