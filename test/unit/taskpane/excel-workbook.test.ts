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
import { ExcelWorkbook, sanitizeSheetName, touches, uniqueSheetName } from '../../../taskpane/excel-workbook';

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
  log: string[] = [];
  events: boolean[] = [];
  writtenRanges: OfficeMockObject[] = [];
  writtenAddresses: string[] = [];
  sheetHandlers = new Map<string, Handler[]>();
  /** When set, the next context.sync() rejects with this message (as Excel reports a failed batch), once. */
  failNextSync: string | null = null;
  tableHandlers = new Map<string, Handler[]>();
  context!: OfficeMockObject;

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
    const values: unknown[][] = r2 - r1 > 100000 ? [['whole column read without cutting it to the used range']] : [];
    for (let r = r1; r <= r2 && r2 - r1 <= 100000; r++) {
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
        columns: {
          getItem(column: string) {
            const c = t.columns.indexOf(column);
            if (c < 0) throw new Error(`ItemNotFound: ${column}`);
            return { getDataBodyRange: () => world.range(t.sheet, t.headerRow + 1, t.firstColumn + c, t.lastRow, t.firstColumn + c) };
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
    expect(await new ExcelWorkbook().listTables()).toEqual([{ name: 'NorthBranches', sheet: 'North', columns: ['Branch', 'Oven hours', 'Loaves sold'] }]);
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
