/**
 * The Workbook interface on Excel (Office.js): the one module of the panel that calls Excel. Every method is one
 * Excel.run batch with as few context.sync() round trips as the API allows (each is a message to the host).
 *
 * Notes that shaped it:
 * - Table columns are read by header through the table (columns.getItem(name).getDataBodyRange()), so a pick
 *   follows the table as rows are added.
 * - A whole-column pick ("B:B") is cut to the used range before reading: a million-row read of blanks would be
 *   slow and hit the web host's request limits.
 * - Changes are watched with table.onChanged for table columns and worksheet.onChanged (filtered to the picked
 *   columns) for ranges. Excel does not fire these for every recalculation or paste; the panel also re-reads
 *   when the user acts.
 * - Writes switch events off (context.runtime.enableEvents) so that the panel's own writes do not come back as
 *   change notifications, and switch them on again whatever happens.
 */
import { blocksIntersect, CellBlock, formatBlock, MAX_ROWS, parseAddress } from '../src/sheet/a1';
import { headerText } from '../src/sheet/cells';
import type { ColumnSource, RangeRead, TableInfo, Workbook } from './workbook';

/** Excel's rules for sheet names: at most 31 characters, none of : \ / ? * [ ], not blank. */
export function sanitizeSheetName(name: string): string {
  const cleaned = name.replace(/[:\\/?*[\]]/g, ' ').replace(/^'+|'+$/g, '').trim().slice(0, 31);
  return cleaned || 'Covary';
}

/** A name not yet used by any sheet (case-insensitive, as Excel compares): "Report", "Report (2)", ... */
export function uniqueSheetName(wanted: string, existing: string[]): string {
  const base = sanitizeSheetName(wanted);
  const taken = new Set(existing.map((n) => n.toLowerCase()));
  if (!taken.has(base.toLowerCase())) return base;
  for (let k = 2; ; k++) {
    const suffix = ` (${k})`;
    const candidate = base.slice(0, 31 - suffix.length) + suffix;
    if (!taken.has(candidate.toLowerCase())) return candidate;
  }
}

/** The reference part of an address ("B2:B49"), without its sheet. */
function localReference(b: CellBlock): string {
  return formatBlock(b, { withoutSheet: true });
}

/** Whether a change at `address` (on the watched sheet) touches a watched block's columns and rows. */
export function touches(changedAddress: string, watched: CellBlock): boolean {
  const blocks = parseAddress(changedAddress, watched.sheet);
  if (!blocks) return true; // unknown shape: better one refresh too many than a missed change
  return blocks.some((b) => blocksIntersect({ ...b, sheet: watched.sheet }, watched));
}

function headerOf(values: unknown[][], fallback: string): string {
  return headerText(values.length > 0 ? values[0][0] : undefined) ?? fallback;
}

function rectangular(cells: (string | number)[][]): (string | number)[][] {
  const width = Math.max(1, ...cells.map((r) => r.length));
  return cells.map((r) => (r.length === width ? r : [...r, ...Array<string>(width - r.length).fill('')]));
}

/** A loaded range (address, values, rowIndex, columnIndex) as the panel reads it: 1-based first row and column. */
function rangeRead(r: Excel.Range, sheet: string): RangeRead {
  return { address: r.address, sheet, firstRow: r.rowIndex + 1, firstColumn: r.columnIndex + 1, values: r.values };
}

export class ExcelWorkbook implements Workbook {
  async getSelection(): Promise<string> {
    return Excel.run(async (context) => {
      // getSelectedRanges (ExcelApi 1.9) keeps Ctrl-picked areas; older hosts only have the single range.
      if (Office.context.requirements.isSetSupported('ExcelApi', '1.9')) {
        const areas = context.workbook.getSelectedRanges();
        areas.load('address');
        await context.sync();
        return areas.address;
      }
      const range = context.workbook.getSelectedRange();
      range.load('address');
      await context.sync();
      return range.address;
    });
  }

  async listTables(): Promise<TableInfo[]> {
    return Excel.run(async (context) => {
      const tables = context.workbook.tables;
      tables.load('items/name');
      await context.sync();
      const parts = tables.items.map((t) => {
        const sheet = t.worksheet;
        sheet.load('name');
        const header = t.getHeaderRowRange();
        header.load('values');
        return { name: t.name, sheet, header };
      });
      await context.sync();
      return parts.map((p) => ({ name: p.name, sheet: p.sheet.name, columns: (p.header.values[0] ?? []).map((v) => String(v)) }));
    });
  }

  async readColumn(source: ColumnSource): Promise<RangeRead & { header: string }> {
    if (source.kind === 'table') {
      return Excel.run(async (context) => {
        const table = context.workbook.tables.getItem(source.table);
        const body = table.columns.getItem(source.column).getDataBodyRange();
        body.load('address,values,rowIndex,columnIndex');
        const sheet = table.worksheet;
        sheet.load('name');
        await context.sync();
        return { ...rangeRead(body, sheet.name), header: source.column };
      });
    }
    const read = await this.readRange(source.address);
    return { ...read, header: headerOf(read.values, read.address) };
  }

  async readRange(address: string): Promise<RangeRead> {
    const blocks = parseAddress(address);
    if (!blocks || blocks.length !== 1) throw new Error(`${address} is not one block of cells`);
    const block = blocks[0];
    return Excel.run(async (context) => {
      const sheet = block.sheet ? context.workbook.worksheets.getItem(block.sheet) : context.workbook.worksheets.getActiveWorksheet();
      sheet.load('name');
      let range = sheet.getRange(localReference(block));
      if (block.lastRow - block.firstRow + 1 >= MAX_ROWS / 2) {
        // Whole columns: read only the part in use.
        range = range.getIntersectionOrNullObject(sheet.getUsedRange(true));
      }
      range.load('address,values,rowIndex,columnIndex');
      await context.sync();
      if (range.isNullObject) {
        return { address, sheet: sheet.name, firstRow: block.firstRow, firstColumn: block.firstColumn, values: [] };
      }
      return rangeRead(range, sheet.name);
    });
  }

  async watch(sources: ColumnSource[], onChange: () => void): Promise<() => void> {
    const tables = [...new Set(sources.flatMap((s) => (s.kind === 'table' ? [s.table] : [])))];
    const watchedBlocks = sources.flatMap((s) => (s.kind === 'range' ? parseAddress(s.address) ?? [] : []));
    const sheets = [...new Set(watchedBlocks.map((b) => b.sheet))];
    const handlers = await Excel.run(async (context) => {
      const results: OfficeExtension.EventHandlerResult<Excel.TableChangedEventArgs | Excel.WorksheetChangedEventArgs>[] = [];
      for (const name of tables) {
        results.push(
          context.workbook.tables.getItem(name).onChanged.add(async () => {
            onChange();
          }),
        );
      }
      for (const sheetName of sheets) {
        const mine = watchedBlocks.filter((b) => b.sheet === sheetName);
        const sheet = sheetName ? context.workbook.worksheets.getItem(sheetName) : context.workbook.worksheets.getActiveWorksheet();
        results.push(
          sheet.onChanged.add(async (event: Excel.WorksheetChangedEventArgs) => {
            if (mine.some((b) => touches(event.address, b))) onChange();
          }),
        );
      }
      await context.sync();
      return results;
    });
    let stopped = false;
    return () => {
      if (stopped) return;
      stopped = true;
      for (const h of handlers) {
        void Excel.run(h.context, async (context) => {
          h.remove();
          await context.sync();
        }).catch(() => undefined); // the handler may already be gone (add-in reloaded): nothing to undo
      }
    };
  }

  async selectRow(sheetName: string, row: number): Promise<void> {
    await Excel.run(async (context) => {
      const sheet = context.workbook.worksheets.getItem(sheetName);
      sheet.activate();
      sheet.getRange(`${row}:${row}`).select();
      await context.sync();
    });
  }

  async writeCells(topLeft: string, cells: (string | number)[][]): Promise<void> {
    const blocks = parseAddress(topLeft);
    if (!blocks || blocks.length !== 1) throw new Error(`${topLeft} is not a cell address`);
    const at = blocks[0];
    const block = rectangular(cells);
    await Excel.run(async (context) => {
      const sheet = at.sheet ? context.workbook.worksheets.getItem(at.sheet) : context.workbook.worksheets.getActiveWorksheet();
      context.runtime.enableEvents = false;
      try {
        const range = sheet.getRange(formatBlock({ ...at, lastRow: at.firstRow, lastColumn: at.firstColumn }, { withoutSheet: true })).getResizedRange(block.length - 1, block[0].length - 1);
        range.formulas = block;
        await context.sync();
      } finally {
        context.runtime.enableEvents = true;
        await context.sync();
      }
    });
  }

  async addSheet(name: string, cells: (string | number)[][]): Promise<string> {
    const block = rectangular(cells);
    return Excel.run(async (context) => {
      const sheets = context.workbook.worksheets;
      sheets.load('items/name');
      await context.sync();
      const unique = uniqueSheetName(name, sheets.items.map((s) => s.name));
      context.runtime.enableEvents = false;
      try {
        const sheet = sheets.add(unique);
        if (block.length > 0) sheet.getRange('A1').getResizedRange(block.length - 1, block[0].length - 1).formulas = block;
        sheet.activate();
        await context.sync();
      } finally {
        context.runtime.enableEvents = true;
        await context.sync();
      }
      return unique;
    });
  }
}

