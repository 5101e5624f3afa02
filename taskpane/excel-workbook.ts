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
 * - Excel on the web refuses a request or response over 5 MB, or a read of more than 5,000,000 cells (Microsoft
 *   Learn, "Resource limits and performance optimization for Office Add-ins", section Excel add-ins). A long
 *   column is therefore read, and a large block written, in blocks of rows sized to use at most half of either
 *   limit, from the bytes its cells have been seen to take; a block the host still refuses as too large is halved
 *   and tried again. Each block is one request, so progress is reported and a stale read is cancelled between
 *   blocks.
 */
import { blocksIntersect, CellBlock, formatBlock, MAX_ROWS, parseAddress } from '../src/sheet/a1';
import { headerText } from '../src/sheet/cells';
import { cellJsonBytes, WEB_FUNCTION_ARGUMENT_BYTES } from './host-limits';
import { ReadCancelled } from './workbook';
import type { ColumnSource, RangeRead, ReadOptions, ReportChartSpec, TableInfo, Workbook } from './workbook';

/** Excel on the web's limits per request (see the note at the top). */
export const WEB_REQUEST_LIMITS = { bytes: 5 * 1024 * 1024, cells: 5_000_000 };
/** The share of either limit one block may use: the rest covers the envelope of the response and misjudged cells. */
const BLOCK_SHARE = 0.5;
/** Bytes per cell assumed before any cell has been seen: a full-precision number with its separators
 *  ("-0.12345678901234567," is 21) and room to spare. */
export const FIRST_GUESS_BYTES = 32;

/** Rows per block for a block `columns` wide whose cells take about `bytesPerCell` bytes each. */
export function rowsPerBlock(columns: number, bytesPerCell: number): number {
  const cells = Math.min(WEB_REQUEST_LIMITS.cells * BLOCK_SHARE, (WEB_REQUEST_LIMITS.bytes * BLOCK_SHARE) / Math.max(1, bytesPerCell));
  return Math.max(1, Math.floor(cells / Math.max(1, columns)));
}

/** The bytes a block of values takes as JSON, as the host sends it (numbers as their shortest text, strings quoted
 *  and escaped, one separator per cell and per row). */
export function payloadBytes(values: unknown[][]): number {
  let bytes = 2;
  for (const row of values) {
    bytes += 3;
    for (const v of row) bytes += cellJsonBytes(v) + 1;
  }
  return bytes;
}

/** Whether a failed request was refused for its size (RichApi.Error code, or the message of older hosts). */
export function isPayloadTooLarge(e: unknown): boolean {
  const code = (e as { code?: unknown })?.code;
  const message = e instanceof Error ? e.message : String(e);
  return code === 'RequestPayloadSizeLimitExceeded' || code === 'ResponsePayloadSizeLimitExceeded' || /payload size|too large/i.test(message);
}

function throwIfCancelled(options?: ReadOptions): void {
  if (options?.signal?.aborted) throw new ReadCancelled();
}

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
  // A loop, not Math.max(...rows): spreading a quarter of a million rows into arguments overflows the stack.
  let width = 1;
  for (const r of cells) if (r.length > width) width = r.length;
  return cells.map((r) => (r.length === width ? r : [...r, ...Array<string>(width - r.length).fill('')]));
}

/** A loaded range (address, values, rowIndex, columnIndex) as the panel reads it: 1-based first row and column. */
function rangeRead(r: Excel.Range, sheet: string): RangeRead {
  return { address: r.address, sheet, firstRow: r.rowIndex + 1, firstColumn: r.columnIndex + 1, values: r.values };
}

/**
 * Writes `block` with its top-left cell at `topLeft`, in blocks of rows that stay within the web's request
 * limits: one request when it fits, as a report does.
 */
async function writeInBlocks(context: Excel.RequestContext, topLeft: Excel.Range, block: (string | number)[][]): Promise<void> {
  const columns = block[0].length;
  const seen = payloadBytes(block) / Math.max(1, block.length * columns);
  const perBlock = rowsPerBlock(columns, Math.max(seen * 1.25, 1));
  for (let done = 0; done < block.length; done += perBlock) {
    const rows = block.slice(done, done + perBlock);
    const target = done === 0 ? topLeft : topLeft.getOffsetRange(done, 0);
    target.getResizedRange(rows.length - 1, columns - 1).formulas = rows;
    await context.sync();
  }
}

/**
 * Reads `range` in blocks of rows that stay within the web's request limits (see the note at the top): its shape
 * first, then one request per block, the block size following the bytes the cells were seen to take. Null when
 * the range is a null object (a whole-column pick on an empty sheet). Loads the sheet's name on the way.
 * @throws ReadCancelled when options.signal is aborted between blocks.
 */
async function readInBlocks(context: Excel.RequestContext, range: Excel.Range, sheet: Excel.Worksheet, options?: ReadOptions): Promise<RangeRead | null> {
  sheet.load('name');
  range.load('address,rowIndex,columnIndex,rowCount,columnCount');
  await context.sync();
  if (range.isNullObject) return null;
  const rows = range.rowCount;
  const columns = range.columnCount;
  const values: unknown[][] = [];
  let perBlock = rowsPerBlock(columns, FIRST_GUESS_BYTES);
  const several = rows > perBlock;
  for (let done = 0; done < rows; ) {
    throwIfCancelled(options);
    const take = Math.min(perBlock, rows - done);
    const part = range.getCell(done, 0).getResizedRange(take - 1, columns - 1);
    part.load('values');
    try {
      await context.sync();
    } catch (e) {
      if (take > 1 && isPayloadTooLarge(e)) {
        perBlock = Math.max(1, take >> 1);
        continue;
      }
      throw e;
    }
    const got = part.values;
    for (let i = 0; i < got.length; i++) values.push(got[i]);
    done += take;
    // The next block sized from what these cells took, with a quarter to spare (never above the first guess
    // for cells smaller than it, so one block of short numbers does not make the next one huge).
    const seen = payloadBytes(got) / Math.max(1, take * columns);
    perBlock = rowsPerBlock(columns, Math.max(seen * 1.25, Math.min(FIRST_GUESS_BYTES, seen * 2)));
    if (several) options?.onProgress?.(done, rows);
  }
  throwIfCancelled(options);
  return { address: range.address, sheet: sheet.name, firstRow: range.rowIndex + 1, firstColumn: range.columnIndex + 1, values };
}

export class ExcelWorkbook implements Workbook {
  /** About 5 MB per call on Excel on the web (Office.context.platform "OfficeOnline"); none known on desktop. */
  functionArgumentLimit(): number | null {
    const platform = typeof Office !== 'undefined' ? (Office.context as { platform?: unknown } | undefined)?.platform : undefined;
    return String(platform) === 'OfficeOnline' ? WEB_FUNCTION_ARGUMENT_BYTES : null;
  }

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
        // The first data row tells number columns from text ones (the picker's defaults skip text).
        const first = t.getDataBodyRange().getRow(0);
        first.load('values');
        return { name: t.name, sheet, header, first };
      });
      await context.sync();
      return parts.map((p) => ({
        name: p.name,
        sheet: p.sheet.name,
        columns: (p.header.values[0] ?? []).map((v) => String(v)),
        numeric: (p.first.values[0] ?? []).map((v) => typeof v === 'number'),
      }));
    });
  }

  async readColumn(source: ColumnSource, options?: ReadOptions): Promise<RangeRead & { header: string }> {
    if (source.kind === 'table') {
      return Excel.run(async (context) => {
        const table = context.workbook.tables.getItem(source.table);
        const sheet = table.worksheet;
        // By name; a column renamed since the pick is found at its place, and the read carries its new name.
        let column = table.columns.getItemOrNullObject(source.column);
        column.load('name');
        let read = await readInBlocks(context, column.getDataBodyRange(), sheet, options);
        if (column.isNullObject) {
          if (source.position === undefined) throw new Error(`table ${source.table} has no column "${source.column}"`);
          column = table.columns.getItemAt(source.position);
          column.load('name');
          read = await readInBlocks(context, column.getDataBodyRange(), sheet, options);
        }
        return { ...read!, header: column.name };
      });
    }
    const read = await this.readRange(source.address, options);
    return { ...read, header: headerOf(read.values, read.address) };
  }

  async readRange(address: string, options?: ReadOptions): Promise<RangeRead> {
    const blocks = parseAddress(address);
    if (!blocks || blocks.length !== 1) throw new Error(`${address} is not one block of cells`);
    const block = blocks[0];
    return Excel.run(async (context) => {
      const sheet = block.sheet ? context.workbook.worksheets.getItem(block.sheet) : context.workbook.worksheets.getActiveWorksheet();
      let range = sheet.getRange(localReference(block));
      const rows = block.lastRow - block.firstRow + 1;
      const columns = block.lastColumn - block.firstColumn + 1;
      if (rows >= MAX_ROWS / 2) {
        // Whole columns: read only the part in use.
        range = range.getIntersectionOrNullObject(sheet.getUsedRange(true));
      } else if (rows <= rowsPerBlock(columns, FIRST_GUESS_BYTES)) {
        // Small enough for one request unless its cells hold long text: one round trip, as before, and the
        // blocks only if the host refuses it for its size.
        sheet.load('name');
        range.load('address,values,rowIndex,columnIndex');
        try {
          await context.sync();
          return rangeRead(range, sheet.name);
        } catch (e) {
          if (!isPayloadTooLarge(e)) throw e;
          range = sheet.getRange(localReference(block));
        }
      }
      const read = await readInBlocks(context, range, sheet, options);
      return read ?? { address, sheet: sheet.name, firstRow: block.firstRow, firstColumn: block.firstColumn, values: [] };
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

  /**
   * A native XY scatter of spec.y against spec.x, bound to the data cells (so it follows edits), with Excel's
   * linear trendline when asked, titled axes and no legend (one series). Enum values are passed as their strings
   * ("XYScatter", "Columns", "Linear"), which Office.js accepts (ExcelApi 1.7 for setXAxisValues and trendlines).
   */
  async addChart(sheetName: string, spec: ReportChartSpec): Promise<void> {
    const xb = parseAddress(spec.x);
    const yb = parseAddress(spec.y);
    const at = parseAddress(spec.at, sheetName);
    const to = spec.to === undefined ? undefined : parseAddress(spec.to, sheetName);
    if (!xb || xb.length !== 1 || !yb || yb.length !== 1 || !at || at.length !== 1) throw new Error('a chart needs one block for x, one for y and a cell to sit on');
    if (to !== undefined && (!to || to.length !== 1)) throw new Error(`${spec.to} is not a cell for the chart's corner`);
    await Excel.run(async (context) => {
      const book = context.workbook.worksheets;
      const sheet = book.getItem(sheetName);
      const rangeOf = (b: CellBlock) => (b.sheet ? book.getItem(b.sheet) : book.getActiveWorksheet()).getRange(localReference(b));
      const chart = sheet.charts.add('XYScatter', rangeOf(yb[0]), 'Columns');
      chart.title.text = spec.title;
      chart.legend.visible = false;
      const series = chart.series.getItemAt(0);
      series.name = spec.yTitle;
      series.setXAxisValues(rangeOf(xb[0]));
      if (spec.trendline) series.trendlines.add('Linear');
      chart.axes.categoryAxis.title.text = spec.xTitle;
      chart.axes.valueAxis.title.text = spec.yTitle;
      if (to) chart.setPosition(localReference(at[0]), localReference(to[0]));
      else chart.setPosition(localReference(at[0]));
      await context.sync();
    });
  }

  async selectRange(address: string): Promise<void> {
    const blocks = parseAddress(address);
    if (!blocks || blocks.length !== 1) throw new Error(`${address} is not one block of cells`);
    const block = blocks[0];
    await Excel.run(async (context) => {
      const sheet = block.sheet ? context.workbook.worksheets.getItem(block.sheet) : context.workbook.worksheets.getActiveWorksheet();
      sheet.activate();
      // Range.select brings the block into view in Excel.
      sheet.getRange(localReference(block)).select();
      await context.sync();
    });
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
        const topLeft = sheet.getRange(formatBlock({ ...at, lastRow: at.firstRow, lastColumn: at.firstColumn }, { withoutSheet: true }));
        await writeInBlocks(context, topLeft, block);
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
        if (block.length > 0) await writeInBlocks(context, sheet.getRange('A1'), block);
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

