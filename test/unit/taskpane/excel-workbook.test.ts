/**
 * The Excel implementation of the panel's workbook interface, against office-addin-mock's OfficeMockObject: every
 * object of the Excel object model the module touches is a mock that returns an error string for any property
 * read without load() and context.sync(), so these tests also catch a missing load or sync. The mock has no
 * collections, events or Excel.run: the world below adds them (as office-addin-mock's documentation advises).
 * Behaviour checked is Office.js's documented contract (Excel JavaScript API reference: Range.rowIndex and
 * columnIndex are 0-based; getSelectedRanges needs ExcelApi 1.9; RequestContext.runtime.enableEvents).
 */
import { OfficeMockObject } from 'office-addin-mock';

// office-addin-mock imports office-addin-manifest only for its OfficeApp enum; that package's dependency tree
// includes an ES-module-only file that jest's CommonJS runtime cannot load, so the enum is supplied here.
jest.mock('office-addin-manifest', () => ({
  OfficeApp: { Excel: 'excel', OneNote: 'onenote', Outlook: 'outlook', PowerPoint: 'powerpoint', Project: 'project', Word: 'word' },
}));
import { columnLetters, formatBlock, parseAddress } from '../../../src/sheet/a1';
import { ExcelWorkbook, payloadBytes, rowsPerBlock, sanitizeSheetName, touches, uniqueSheetName } from '../../../taskpane/excel-workbook';
import { ReadCancelled } from '../../../taskpane/workbook';

interface TableDef {
  name: string;
  sheet: string;
  headerRow: number;
  firstColumn: number;
  columns: string[];
  lastRow: number;
}

type Handler = (event: { address: string }) => Promise<void>;

/** A small workbook behind the mocks, with a log of what the module did. */
class World {
  sheets = new Map<string, unknown[][]>();
  tables: TableDef[] = [];
  selection = 'North!B1:C5';
  multiArea = true;
  created: OfficeMockObject[] = [];
  /** Charts added, as the module left them (title, axes, legend). */
  charts: { title: { text: string }; legend: { visible: boolean }; axes: { categoryAxis: { title: { text: string } }; valueAxis: { title: { text: string } } } }[] = [];
  log: string[] = [];
  events: boolean[] = [];
  writtenRanges: OfficeMockObject[] = [];
  writtenAddresses: string[] = [];
  sheetHandlers = new Map<string, Handler[]>();
  /** When set, the next context.sync() rejects with this message (as Excel reports a failed batch), once. */
  failNextSync: string | null = null;
  tableHandlers = new Map<string, Handler[]>();
  context!: OfficeMockObject;

  /** Requests made (context.sync calls that reached the host) and the largest response and request seen. */
  requests = 0;
  /** The limits enforced: Excel on the web's unless a test lowers them. */
  limits = { cells: 5_000_000, bytes: 5 * 1024 * 1024 };
  largestResponse = { cells: 0, bytes: 0 };
  largestRequest = { cells: 0, bytes: 0 };
  private counted = new Set<OfficeMockObject>();

  /**
   * Excel on the web's limits, enforced per request as the host does (Microsoft Learn, "Resource limits and
   * performance optimization for Office Add-ins", Excel add-ins: 5 MB per request or response, 5,000,000 cells
   * per read): the values loaded and the formulas written in this batch, measured as JSON. A batch over either
   * limit fails as the host fails it, with nothing read or written. (The error's code is this double's choice;
   * the module under test must recognise a refusal for size by its message as well.)
   */
  enforceRequestLimits(): void {
    this.requests++;
    const response = { cells: 0, bytes: 0 };
    const request = { cells: 0, bytes: 0 };
    const fresh: OfficeMockObject[] = [];
    for (const m of this.created) {
      if (this.counted.has(m)) continue;
      const props = (m as unknown as { _properties: Map<string, { _loaded: boolean }> })._properties;
      const loadedValues = props.get('values')?._loaded;
      const written = (m as unknown as { formulas?: unknown[][] }).formulas;
      if (loadedValues) {
        const values = (m as unknown as { _properties: Map<string, { _valueBeforeLoaded: unknown[][] }> })._properties.get('values')!._valueBeforeLoaded;
        response.cells += values.reduce((k, r) => k + r.length, 0);
        response.bytes += JSON.stringify(values).length;
        fresh.push(m);
      }
      if (Array.isArray(written)) {
        request.cells += written.reduce((k, r) => k + r.length, 0);
        request.bytes += JSON.stringify(written).length;
        fresh.push(m);
      }
    }
    const over = (x: { cells: number; bytes: number }) => x.cells > this.limits.cells || x.bytes > this.limits.bytes;
    for (const m of fresh) this.counted.add(m);
    if (over(response) || over(request)) {
      const e = new Error(`The ${over(request) ? 'request' : 'response'} payload size has exceeded the limit (Excel on the web: 5 MB, 5,000,000 cells)`);
      (e as Error & { code: string }).code = over(request) ? 'RequestPayloadSizeLimitExceeded' : 'ResponsePayloadSizeLimitExceeded';
      throw e;
    }
    if (response.bytes > this.largestResponse.bytes) this.largestResponse = response;
    if (request.bytes > this.largestRequest.bytes) this.largestRequest = request;
  }

  track<T extends OfficeMockObject>(m: T): T {
    this.created.push(m);
    return m;
  }

  cell(sheet: string, r: number, c: number): unknown {
    const v = this.sheets.get(sheet)?.[r - 1]?.[c - 1];
    return v === undefined || v === null ? '' : v;
  }

  usedRows(sheet: string): number {
    return this.sheets.get(sheet)?.length ?? 0;
  }

  range(sheet: string, r1: number, c1: number, r2: number, c2: number): OfficeMockObject {
    // A whole-column range is never read here: the module must cut it to the used range first.
    const values: unknown[][] = r2 - r1 + 1 > 500000 ? [["whole column read without cutting it to the used range"]] : [];
    for (let r = r1; r <= r2 && r2 - r1 + 1 <= 500000; r++) {
      const row: unknown[] = [];
      for (let c = c1; c <= c2; c++) row.push(this.cell(sheet, r, c));
      values.push(row);
    }
    const world = this;
    const address = formatBlock({ sheet, firstRow: r1, lastRow: r2, firstColumn: c1, lastColumn: c2 });
    const m = this.track(
      new OfficeMockObject({
        address,
        values,
        rowIndex: r1 - 1,
        columnIndex: c1 - 1,
        rowCount: r2 - r1 + 1,
        columnCount: c2 - c1 + 1,
        getCell(dr: number, dc: number) {
          return world.range(sheet, r1 + dr, c1 + dc, r1 + dr, c1 + dc);
        },
        getRow(i: number) {
          return world.range(sheet, r1 + i, c1, r1 + i, c2);
        },
        getOffsetRange(dr: number, dc: number) {
          return world.range(sheet, r1 + dr, c1 + dc, r2 + dr, c2 + dc);
        },
        select() {
          world.log.push(`select ${address}`);
        },
        getResizedRange(dr: number, dc: number) {
          const grown = world.range(sheet, r1, c1, r2 + dr, c2 + dc);
          world.writtenRanges.push(grown);
          world.writtenAddresses.push(formatBlock({ sheet, firstRow: r1, lastRow: r2 + dr, firstColumn: c1, lastColumn: c2 + dc }));
          return grown;
        },
        getIntersectionOrNullObject() {
          // Intersect with the used range: rows 1..usedRows.
          return world.range(sheet, r1, c1, Math.min(r2, world.usedRows(sheet)), c2);
        },
      }),
    );
    (m as unknown as { isNullObject: boolean }).isNullObject = false;
    return m;
  }

  rangeByRef(sheet: string, ref: string): OfficeMockObject {
    const b = parseAddress(ref, sheet)![0];
    return this.range(sheet, b.firstRow, b.firstColumn, b.lastRow, b.lastColumn);
  }

  worksheet(name: string): OfficeMockObject {
    if (!this.sheets.has(name)) throw new Error(`ItemNotFound: ${name}`);
    const world = this;
    return this.track(
      new OfficeMockObject({
        name,
        getRange(ref: string) {
          return world.rangeByRef(name, ref);
        },
        getUsedRange() {
          return world.range(name, 1, 1, world.usedRows(name), 26);
        },
        activate() {
          world.log.push(`activate ${name}`);
        },
        charts: {
          add(type: string, source: OfficeMockObject, seriesBy: string) {
            // The range's address as the double made it (the module need not load it to pass the range on).
            const addressOf = (r: OfficeMockObject) => (r as unknown as { _properties: Map<string, { _valueBeforeLoaded: string }> })._properties.get('address')!._valueBeforeLoaded;
            world.log.push(`chart ${type} of ${addressOf(source)} by ${seriesBy} on ${name}`);
            const chart = {
              title: { text: '' },
              legend: { visible: true },
              axes: { categoryAxis: { title: { text: '' } }, valueAxis: { title: { text: '' } } },
              series: {
                getItemAt(i: number) {
                  return {
                    name: '',
                    setXAxisValues(r: OfficeMockObject) {
                      world.log.push(`series ${i} x from ${addressOf(r)}`);
                    },
                    trendlines: {
                      add(kind: string) {
                        world.log.push(`series ${i} trendline ${kind}`);
                      },
                    },
                  };
                },
              },
              setPosition(at: string, end?: string) {
                world.log.push(end === undefined ? `chart at ${at}` : `chart at ${at} to ${end}`);
              },
            };
            world.charts.push(chart);
            return chart;
          },
        },
        onChanged: {
          add(handler: Handler) {
            const list = world.sheetHandlers.get(name) ?? [];
            list.push(handler);
            world.sheetHandlers.set(name, list);
            return world.handlerResult(() => list.splice(list.indexOf(handler), 1));
          },
        },
      }),
    );
  }

  handlerResult(remove: () => void): { context: OfficeMockObject; remove: () => void } {
    return { context: this.context, remove };
  }

  table(name: string): OfficeMockObject {
    const t = this.tables.find((k) => k.name === name);
    if (!t) throw new Error(`ItemNotFound: ${name}`);
    const world = this;
    return this.track(
      new OfficeMockObject({
        name: t.name,
        worksheet: { name: t.sheet },
        getHeaderRowRange() {
          return world.range(t.sheet, t.headerRow, t.firstColumn, t.headerRow, t.firstColumn + t.columns.length - 1);
        },
        getDataBodyRange() {
          return world.range(t.sheet, t.headerRow + 1, t.firstColumn, t.lastRow, t.firstColumn + t.columns.length - 1);
        },
        columns: {
          getItem(column: string) {
            const c = t.columns.indexOf(column);
            if (c < 0) throw new Error(`ItemNotFound: ${column}`);
            return world.tableColumn(t, c);
          },
          getItemOrNullObject(column: string) {
            const c = t.columns.indexOf(column);
            return c < 0 ? world.nullColumn() : world.tableColumn(t, c);
          },
          getItemAt(c: number) {
            if (c < 0 || c >= t.columns.length) throw new Error(`ItemNotFound: column ${c}`);
            return world.tableColumn(t, c);
          },
        },
        onChanged: {
          add(handler: Handler) {
            const list = world.tableHandlers.get(name) ?? [];
            list.push(handler);
            world.tableHandlers.set(name, list);
            return world.handlerResult(() => list.splice(list.indexOf(handler), 1));
          },
        },
      }),
    );
  }

  tableColumn(t: TableDef, c: number): OfficeMockObject {
    const world = this;
    const m = this.track(
      new OfficeMockObject({
        name: t.columns[c],
        getDataBodyRange: () => world.range(t.sheet, t.headerRow + 1, t.firstColumn + c, t.lastRow, t.firstColumn + c),
      }),
    );
    (m as unknown as { isNullObject: boolean }).isNullObject = false;
    return m;
  }

  /** What getItemOrNullObject gives for a missing column: a null object whose range is a null object too. */
  nullColumn(): OfficeMockObject {
    const range = this.track(new OfficeMockObject({ address: '', rowIndex: 0, columnIndex: 0, rowCount: 0, columnCount: 0, values: [] }));
    (range as unknown as { isNullObject: boolean }).isNullObject = true;
    const m = this.track(new OfficeMockObject({ name: '', getDataBodyRange: () => range }));
    (m as unknown as { isNullObject: boolean }).isNullObject = true;
    return m;
  }

  install(): void {
    const world = this;
    this.context = new OfficeMockObject({
      workbook: {
        getSelectedRanges() {
          if (!world.multiArea) throw new Error('ApiNotFound');
          return world.track(new OfficeMockObject({ address: world.selection }));
        },
        getSelectedRange() {
          return world.track(new OfficeMockObject({ address: world.selection.split(',')[0] }));
        },
        tables: {
          load() {
            const items = world.tables.map((t) => {
              const m = world.table(t.name);
              m.load('name');
              return m;
            });
            (this as unknown as { items: OfficeMockObject[] }).items = items;
          },
          getItem(name: string) {
            return world.table(name);
          },
        },
        worksheets: {
          load() {
            const items = [...world.sheets.keys()].map((n) => {
              const m = world.worksheet(n);
              m.load('name');
              return m;
            });
            (this as unknown as { items: OfficeMockObject[] }).items = items;
          },
          getItem(name: string) {
            return world.worksheet(name);
          },
          getActiveWorksheet() {
            return world.worksheet([...world.sheets.keys()][0]);
          },
          add(name: string) {
            world.sheets.set(name, []);
            world.log.push(`add ${name}`);
            return world.worksheet(name);
          },
        },
      },
      async sync() {
        const failure = world.failNextSync;
        world.failNextSync = null;
        if (failure) throw new Error(failure);
        world.enforceRequestLimits();
        for (const m of world.created) await m.sync();
      },
    });
    // The runtime's enableEvents is write-only here: record every switch.
    (this.context as unknown as { runtime: object }).runtime = {
      set enableEvents(v: boolean) {
        world.events.push(v);
      },
    };
    const g = globalThis as unknown as { Excel: unknown; Office: unknown };
    g.Excel = {
      run: async (a: unknown, b?: (ctx: unknown) => Promise<unknown>) => (typeof a === 'function' ? (a as (ctx: unknown) => Promise<unknown>)(world.context) : b!(world.context)),
    };
    g.Office = { context: { requirements: { isSetSupported: () => world.multiArea } } };
  }
}

function demoWorld(): World {
  const w = new World();
  w.sheets.set('North', [
    ['Branch', 'Oven hours', 'Loaves sold'],
    ['A', 41, 210],
    ['B', 55, 260],
    ['C', '', 230],
    ['D', 60, 275],
  ]);
  w.sheets.set('South shops', [
    ['Hours', 'Sales'],
    [1, 2],
    [3, 4],
  ]);
  w.tables.push({ name: 'NorthBranches', sheet: 'North', headerRow: 1, firstColumn: 1, columns: ['Branch', 'Oven hours', 'Loaves sold'], lastRow: 5 });
  w.install();
  return w;
}

describe('ExcelWorkbook on office-addin-mock', () => {
  test('getSelection keeps Ctrl-picked areas, and falls back to one range before ExcelApi 1.9', async () => {
    const w = demoWorld();
    w.selection = 'North!B1:B5,North!C1:C5';
    expect(await new ExcelWorkbook().getSelection()).toBe('North!B1:B5,North!C1:C5');
    w.multiArea = false;
    expect(await new ExcelWorkbook().getSelection()).toBe('North!B1:B5');
  });

  test('listTables names each table, its sheet and its headers', async () => {
    demoWorld();
    expect(await new ExcelWorkbook().listTables()).toEqual([
      { name: 'NorthBranches', sheet: 'North', columns: ['Branch', 'Oven hours', 'Loaves sold'], numeric: [false, true, true] },
    ]);
  });

  test('a renamed table column is found at its place and read under its new name; without a place it is an error', async () => {
    const w = demoWorld();
    w.tables[0].columns[1] = 'Oven hours (weekly)';
    w.sheets.get('North')![0][1] = 'Oven hours (weekly)';
    const read = await new ExcelWorkbook().readColumn({ kind: 'table', table: 'NorthBranches', column: 'Oven hours', position: 1 });
    expect(read.header).toBe('Oven hours (weekly)');
    expect(read.values).toEqual([[41], [55], [''], [60]]);
    await expect(new ExcelWorkbook().readColumn({ kind: 'table', table: 'NorthBranches', column: 'Oven hours' })).rejects.toThrow('table NorthBranches has no column "Oven hours"');
  });

  test('a table column is read by header through its data body (rowIndex/columnIndex are 0-based)', async () => {
    demoWorld();
    const read = await new ExcelWorkbook().readColumn({ kind: 'table', table: 'NorthBranches', column: 'Loaves sold' });
    expect(read).toEqual({ address: 'North!C2:C5', sheet: 'North', firstRow: 2, firstColumn: 3, values: [[210], [260], [230], [275]], header: 'Loaves sold' });
  });

  test('the table pick follows growth: a row added to the table is read next time', async () => {
    const w = demoWorld();
    w.sheets.get('North')!.push(['E', 47, 220]);
    w.tables[0].lastRow = 6;
    const read = await new ExcelWorkbook().readColumn({ kind: 'table', table: 'NorthBranches', column: 'Oven hours' });
    expect(read.values).toHaveLength(5);
    expect(read.address).toBe('North!B2:B6');
  });

  test('a range read takes its header from a text first cell; a quoted sheet name works', async () => {
    demoWorld();
    const wb = new ExcelWorkbook();
    const a = await wb.readColumn({ kind: 'range', address: 'North!B1:B5' });
    expect(a.header).toBe('Oven hours');
    expect(a.firstRow).toBe(1);
    expect(a.values[3]).toEqual(['']);
    const b = await wb.readColumn({ kind: 'range', address: "'South shops'!B2:B3" });
    expect(b.header).toBe("'South shops'!B2:B3");
    expect(b.values).toEqual([[2], [4]]);
  });

  test('a whole-column pick is cut to the used range', async () => {
    demoWorld();
    const read = await new ExcelWorkbook().readRange('North!C:C');
    expect(read.values).toHaveLength(5);
    expect(read.address).toBe('North!C1:C5');
  });

  test('watch: table changes and changes in watched columns notify; other cells do not; stop removes handlers', async () => {
    const w = demoWorld();
    let calls = 0;
    const stop = await new ExcelWorkbook().watch(
      [{ kind: 'table', table: 'NorthBranches', column: 'Oven hours' }, { kind: 'range', address: "'South shops'!B2:B3" }],
      () => calls++,
    );
    await w.tableHandlers.get('NorthBranches')![0]({ address: 'B3' });
    await w.sheetHandlers.get('South shops')![0]({ address: 'B3' });
    await w.sheetHandlers.get('South shops')![0]({ address: 'D9' });
    expect(calls).toBe(2);
    stop();
    await new Promise((r) => setTimeout(r, 0));
    expect(w.tableHandlers.get('NorthBranches')).toHaveLength(0);
    expect(w.sheetHandlers.get('South shops')).toHaveLength(0);
  });

  test('selectRow activates the sheet and selects the whole row', async () => {
    const w = demoWorld();
    await new ExcelWorkbook().selectRow('North', 4);
    expect(w.log).toEqual(['activate North', 'select North!A4:XFD4']);
  });

  test('writeCells writes formulas as a rectangle with events off, then on again', async () => {
    const w = demoWorld();
    await new ExcelWorkbook().writeCells('North!E1', [['Covary', ''], ['r', '=COVARY.COEF($B$2:$B$5, $C$2:$C$5)'], ['pairs']]);
    const target = w.writtenRanges[0] as unknown as { formulas: unknown };
    expect(w.writtenAddresses[0]).toBe('North!E1:F3');
    expect(target.formulas).toEqual([['Covary', ''], ['r', '=COVARY.COEF($B$2:$B$5, $C$2:$C$5)'], ['pairs', '']]);
    expect(w.events).toEqual([false, true]);
  });

  test('events are switched on again when a write fails', async () => {
    const w = demoWorld();
    // Excel reports a failed batch at sync, after events were switched off (e.g. a protected sheet).
    w.failNextSync = 'AccessDenied: the sheet is protected';
    await expect(new ExcelWorkbook().writeCells('North!E1', [['x']])).rejects.toThrow(/AccessDenied/);
    expect(w.events).toEqual([false, true]);
  });

  test('addChart adds a native XY scatter bound to the data cells, with a linear trendline and titled axes', async () => {
    const w = demoWorld();
    w.sheets.set('Covary report', []);
    await new ExcelWorkbook().addChart('Covary report', {
      title: 'Loaves sold against Oven hours', x: 'North!B2:B5', y: 'North!C2:C5', xTitle: 'Oven hours', yTitle: 'Loaves sold', at: 'M2', trendline: true,
    });
    expect(w.log).toEqual([
      'chart XYScatter of North!C2:C5 by Columns on Covary report',
      'series 0 x from North!B2:B5',
      'series 0 trendline Linear',
      'chart at M2',
    ]);
    expect(w.charts[0].title.text).toBe('Loaves sold against Oven hours');
    expect(w.charts[0].legend.visible).toBe(false);
    expect([w.charts[0].axes.categoryAxis.title.text, w.charts[0].axes.valueAxis.title.text]).toEqual(['Oven hours', 'Loaves sold']);
  });

  test('addChart binds a residual chart to the report\'s own cells: no trendline, placed from its top-left to its bottom-right cell', async () => {
    const w = demoWorld();
    w.sheets.set('Covary report', []);
    await new ExcelWorkbook().addChart('Covary report', {
      title: 'Residuals of Loaves sold against the fitted values', x: "'Covary report'!X2:X5", y: "'Covary report'!Y2:Y5",
      xTitle: 'Fitted Loaves sold', yTitle: 'Residual', at: 'M19', to: 'T34', trendline: false,
    });
    expect(w.log).toEqual([
      "chart XYScatter of 'Covary report'!Y2:Y5 by Columns on Covary report",
      "series 0 x from 'Covary report'!X2:X5",
      'chart at M19 to T34',
    ]);
    expect([w.charts[0].title.text, w.charts[0].axes.categoryAxis.title.text, w.charts[0].axes.valueAxis.title.text]).toEqual([
      'Residuals of Loaves sold against the fitted values', 'Fitted Loaves sold', 'Residual',
    ]);
  });

  test('addChart refuses a corner cell it cannot read, before touching the workbook', async () => {
    const w = demoWorld();
    w.sheets.set('Covary report', []);
    await expect(new ExcelWorkbook().addChart('Covary report', {
      title: 't', x: 'North!B2:B5', y: 'North!C2:C5', xTitle: 'x', yTitle: 'y', at: 'M2', to: 'not a cell', trendline: false,
    })).rejects.toThrow(/not a cell for the chart's corner/);
    expect(w.log).toEqual([]);
  });

  test('addSheet picks an unused name, writes from A1 and shows the sheet', async () => {
    const w = demoWorld();
    w.sheets.set('Covary report', []);
    const name = await new ExcelWorkbook().addSheet('Covary report', [['Covary report'], ['=COVARY.REPORT(North!$B$2:$B$5, North!$C$2:$C$5)', '', '', 'x']]);
    expect(name).toBe('Covary report (2)');
    expect(w.log).toContain('add Covary report (2)');
    expect(w.log).toContain('activate Covary report (2)');
    expect(w.writtenAddresses[0]).toBe(`'Covary report (2)'!A1:${columnLetters(4)}2`);
    expect((w.writtenRanges[0] as unknown as { formulas: unknown[][] }).formulas[1][3]).toBe('x');
    expect(w.events).toEqual([false, true]);
  });
});

describe('helpers', () => {
  test('sheet names follow Excel rules: no : \\ / ? * [ ], at most 31 characters', () => {
    expect(sanitizeSheetName('Q1/Q2 [draft]*?')).toBe('Q1 Q2  draft');
    expect(sanitizeSheetName('x'.repeat(40))).toHaveLength(31);
    expect(sanitizeSheetName('  ')).toBe('Covary');
  });
  test('unique names compare case-insensitively and stay within 31 characters', () => {
    expect(uniqueSheetName('Report', ['report', 'Report (2)'])).toBe('Report (3)');
    expect(uniqueSheetName('y'.repeat(31), ['y'.repeat(31)])).toBe(`${'y'.repeat(27)} (2)`);
  });
  test('touches: a change overlapping the watched block', () => {
    const b = parseAddress('S!B2:B49')![0];
    expect(touches('B10', b)).toBe(true);
    expect(touches('A1:C1', b)).toBe(false);
    expect(touches('A1:C5', b)).toBe(true);
    expect(touches('D2:D49', b)).toBe(false);
  });
});

describe('long columns in blocks within the web host\'s request limits (the double fails any request over them)', () => {
  const ROWS = 1_000_000;
  let seed = 99;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  function bigWorld(): { w: World; column: number[] } {
    const w = new World();
    const column = Array.from({ length: ROWS }, () => rnd() * 1000 - 300); // full-precision doubles, ~18 digits
    w.sheets.set('Big', [['Basket value'], ...column.map((v) => [v])]);
    w.tables.push({ name: 'Baskets', sheet: 'Big', headerRow: 1, firstColumn: 1, columns: ['Basket value'], lastRow: ROWS + 1 });
    w.install();
    return { w, column };
  }

  test('the double refuses a one-request read of a million full-precision numbers', async () => {
    const { w } = bigWorld();
    const body = w.range('Big', 2, 1, 400001, 1); // 400,000 numbers in one load: about 8 MB of JSON
    body.load('values');
    await expect((w.context as unknown as { sync(): Promise<void> }).sync()).rejects.toThrow(/payload size has exceeded the limit/);
  });

  test.each([
    ['a table column', { kind: 'table', table: 'Baskets', column: 'Basket value' } as const],
    ['a range', { kind: 'range', address: 'Big!A1:A1000001' } as const],
    ['a whole column', { kind: 'range', address: 'Big!A:A' } as const],
  ])('%s of 1,000,000 rows is read whole, request by request, with progress', async (_label, source) => {
    const { w, column } = bigWorld();
    const progress: number[] = [];
    const read = await new ExcelWorkbook().readColumn(source, { onProgress: (done, total) => progress.push(done / total) });
    const data = source.kind === 'table' ? read.values : read.values.slice(1);
    expect(data).toHaveLength(ROWS);
    expect(data[0][0]).toBe(column[0]);
    expect(data[ROWS - 1][0]).toBe(column[ROWS - 1]);
    expect(data[123457][0]).toBe(column[123457]);
    expect(w.requests).toBeGreaterThan(10);
    expect(w.largestResponse.bytes).toBeLessThanOrEqual(5 * 1024 * 1024);
    expect(progress.length).toBeGreaterThan(5);
    expect(progress[progress.length - 1]).toBe(1);
    for (let i = 1; i < progress.length; i++) expect(progress[i]).toBeGreaterThan(progress[i - 1]);
  });

  test('long text cells shrink the blocks as they are seen; a block refused for size is halved and tried again', async () => {
    const w = new World();
    const note = 'checked by the regional office, see the monthly review for the full account of this basket '.repeat(3);
    w.sheets.set('Notes', [['Note'], ...Array.from({ length: 60000 }, (_, i) => [`${i} ${note}`])]);
    w.limits = { cells: 5_000_000, bytes: 2 * 1024 * 1024 }; // a stricter host: the first guess is too large for it
    w.install();
    const read = await new ExcelWorkbook().readRange('Notes!A2:A60001');
    expect(read.values).toHaveLength(60000);
    expect(read.values[59999][0]).toBe(`59999 ${note}`);
    expect(w.largestResponse.bytes).toBeLessThanOrEqual(2 * 1024 * 1024);
  });

  test('an aborted read stops before its next request and says it was cancelled', async () => {
    const { w } = bigWorld();
    const stop = new AbortController();
    const reading = new ExcelWorkbook().readColumn({ kind: 'table', table: 'Baskets', column: 'Basket value' }, {
      signal: stop.signal,
      onProgress: (done) => {
        if (done > 200000) stop.abort();
      },
    });
    await expect(reading).rejects.toBeInstanceOf(ReadCancelled);
    expect(w.requests).toBeLessThan(8);
  });

  test('a large block is written in pieces, each within the limits', async () => {
    const w = new World();
    w.sheets.set('Out', []);
    w.install();
    const block = Array.from({ length: 250000 }, (_, i) => [i * 1.0000001, `row ${i}`]);
    await new ExcelWorkbook().writeCells('Out!A1', block);
    const written = w.writtenRanges.map((r) => (r as unknown as { formulas: unknown[][] }).formulas).filter(Array.isArray);
    expect(written.length).toBeGreaterThan(1);
    expect(written.flat().length).toBe(250000);
    expect(written[written.length - 1][written[written.length - 1].length - 1]).toEqual([249999 * 1.0000001, 'row 249999']);
    expect(w.largestRequest.bytes).toBeLessThanOrEqual(5 * 1024 * 1024);
    expect(w.writtenAddresses[1]).toBe(`Out!A${1 + written[0].length}:B${written[0].length + written[1].length}`);
  });

  test('block sizes: from the cells\' JSON bytes, half of either limit', () => {
    expect(rowsPerBlock(1, 32)).toBe(Math.floor((5 * 1024 * 1024 * 0.5) / 32));
    expect(rowsPerBlock(4, 32)).toBe(Math.floor((5 * 1024 * 1024 * 0.5) / 32 / 4));
    expect(rowsPerBlock(1, 0.1)).toBe(2_500_000);
    // An estimate from above of the JSON the host sends (never below it, within a few bytes per row).
    const block = [[1.5, 'a"b'], [null as unknown as number, true as unknown as number], [-0.12345678901234567, '']];
    const json = JSON.stringify(block).length;
    expect(payloadBytes(block)).toBeGreaterThanOrEqual(json);
    expect(payloadBytes(block)).toBeLessThanOrEqual(json + 4 * block.length);
  });
});
