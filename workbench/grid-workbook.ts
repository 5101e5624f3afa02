/**
 * The workbench's implementation of the panel's workbook interface (taskpane/workbook.ts), over the grid. It
 * answers as Excel's adapter does: addresses with their sheet ("North!B2:B49", quoted when needed), blanks read
 * as "", error cells read as their code ("#VALUE!"), table columns that follow the table as it grows.
 */
import type { ColumnSource, NumericColumnRead, RangeRead, TableInfo, Workbook } from '../taskpane/workbook';
import { cellNumber, headerText } from '../src/sheet/cells';
import { Area, formatArea, intersects, parseArea } from './a1';
import { CellValue, isErrorValue } from './cell-values';
import type { GridView } from './grid-view';
import type { TypedCell, WorkbookEditor } from './workbook-editor';
import type { TableBlock, WorkbookModel } from './workbook-model';

/** A cell as Excel's range.values gives it: blanks are "", errors their code. */
function hostValue(v: CellValue): unknown {
  if (v === null) return '';
  if (isErrorValue(v)) return v.error;
  return v;
}

export class GridWorkbook implements Workbook {
  constructor(
    private readonly model: WorkbookModel,
    private readonly editor: WorkbookEditor,
    private readonly view: GridView,
  ) {}

  async getSelection(): Promise<string> {
    return formatArea(this.view.selectionArea());
  }

  async listTables(): Promise<TableInfo[]> {
    return this.model.tables.map((t) => {
      const columns = this.headers(t);
      const numeric = columns.map((_, i) => typeof this.model.value(t.sheet, t.top + 1, t.left + i) === 'number');
      return { name: t.name, sheet: t.sheet, columns, numeric };
    });
  }

  async readColumn(source: ColumnSource): Promise<RangeRead & { header: string }> {
    if (source.kind === 'table') {
      const { table, area } = this.tableColumn(source.table, source.column, source.position);
      const header = this.headers(table)[area.left - table.left];
      return { ...this.read(area), header };
    }
    // As Excel's adapter answers: the values include the first cell, which is the header when it is text.
    const read = this.read(this.parse(source.address));
    const header = headerText(read.values[0]?.[0]) ?? read.address;
    return { ...read, header };
  }

  /** The fast path: a column's data cells straight into a Float64Array, one cell lookup each, no per-row
   *  arrays (at 100,000 rows those arrays were most of the panel's garbage). Same cells as readColumn. */
  async readColumnNumbers(source: ColumnSource): Promise<NumericColumnRead> {
    let area: Area;
    let header: string;
    if (source.kind === 'table') {
      const t = this.tableColumn(source.table, source.column, source.position);
      area = t.area;
      header = this.headers(t.table)[area.left - t.table.left];
    } else {
      area = this.parse(source.address);
      const first = headerText(this.model.value(area.sheet, area.top, area.left));
      if (first !== null) {
        header = first;
        area = { ...area, top: area.top + 1 };
      } else {
        header = formatArea(area);
      }
    }
    const n = Math.max(0, area.bottom - area.top + 1);
    const numbers = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const v = this.model.value(area.sheet, area.top + i, area.left);
      numbers[i] = cellNumber(v);
    }
    return { address: formatArea(area), sheet: area.sheet, firstRow: area.top, column: area.left, header, numbers };
  }

  async readRange(address: string): Promise<RangeRead> {
    return this.read(this.parse(address));
  }

  async watch(sources: ColumnSource[], onChange: () => void): Promise<() => void> {
    return this.model.onChange((changed) => {
      const watched = sources.map((s) => this.sourceArea(s)).filter((a): a is Area => a !== null);
      if (changed.some((c) => watched.some((w) => intersects(c, w)))) onChange();
    });
  }

  async selectRange(address: string): Promise<void> {
    this.view.select(this.parse(address), { flash: true });
  }

  async selectRow(sheet: string, row: number): Promise<void> {
    this.view.selectRow(sheet, row);
  }

  async writeCells(topLeft: string, cells: (string | number)[][]): Promise<void> {
    const area = this.parse(topLeft);
    await this.editor.write(area.sheet, area.top, area.left, cells as TypedCell[][]);
  }

  async addSheet(name: string, cells: (string | number)[][]): Promise<string> {
    const sheet = this.model.addSheet(name);
    await this.editor.write(sheet.name, 1, 1, cells as TypedCell[][]);
    this.view.showSheet(sheet.name);
    return sheet.name;
  }

  // ---- helpers -------------------------------------------------------------------------------------------

  private parse(address: string): Area {
    const area = parseArea(address, this.view.activeSheet);
    if (!area) throw new Error(`"${address}" is not a cell or range address`);
    const sheet = this.model.sheet(area.sheet);
    if (!sheet) throw new Error(`there is no sheet named ${area.sheet}`);
    area.sheet = sheet.name;
    if (area.bottom === Infinity) area.bottom = Math.max(1, this.model.usedExtent(sheet.name).rows);
    return area;
  }

  private read(area: Area): RangeRead {
    const rows = this.model.readArea(area);
    const values = isErrorValue(rows) ? [] : rows.map((r) => r.map(hostValue));
    return { address: formatArea(area), sheet: area.sheet, firstRow: area.top, firstColumn: area.left, values };
  }

  private headers(t: TableBlock): string[] {
    return this.model.tableHeaders(t);
  }

  /** A table column by name, or, when no column has that name any more (renamed), by its place at the pick. */
  private tableColumn(tableName: string, column: string, position?: number): { table: TableBlock; area: Area } {
    const table = this.model.table(tableName);
    if (!table) throw new Error(`there is no table named ${tableName}`);
    let area = this.model.tableColumnArea(table.name, column, 'data');
    const headers = this.headers(table);
    if (isErrorValue(area) && position !== undefined && position >= 0 && position < headers.length) {
      area = this.model.tableColumnArea(table.name, headers[position], 'data');
    }
    if (isErrorValue(area)) throw new Error(area.message ?? `table ${tableName} has no column "${column}"`);
    return { table, area };
  }

  private sourceArea(s: ColumnSource): Area | null {
    try {
      if (s.kind === 'table') {
        const { table, area } = this.tableColumn(s.table, s.column, s.position);
        // The header cell counts too: renaming a column changes what the panel shows.
        return { ...area, top: table.top };
      }
      return this.parse(s.address);
    } catch {
      return null;
    }
  }
}
