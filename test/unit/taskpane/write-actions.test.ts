/**
 * The "Write report sheet" button end to end against a recording workbook: the cells it writes (addSheet) and
 * the native charts it adds (addChart), with their bound addresses. The residual charts must read exactly the
 * cells the report's COVARY.RESIDUALS formula spills into: the formula's cell is found from the chart's address,
 * and the spill's length is what RESIDUALS itself answers on the same cells. The unit tests run without a
 * browser, so the few DOM calls the panel's buttons make (src: taskpane/dom.ts) go to a small stand-in.
 */
import { parseAddress } from '../../../src/sheet/a1';
import { RESIDUALS } from '../../../src/functions/fn-residuals';
import { clearSharedPairs } from '../../../src/functions/shared-pairs';
import { PANEL_TEST_IDS } from '../../../taskpane/panel-api';
import { writeActions, WriteSubject } from '../../../taskpane/write-actions';
import type { NumericColumnRead, ReportChartSpec, Workbook } from '../../../taskpane/workbook';

/** The DOM the buttons use: elements with attributes, children, text and click listeners. */
class StandIn {
  className = '';
  textContent = '';
  readonly attributes = new Map<string, string>();
  readonly children: StandIn[] = [];
  private readonly listeners: (() => void)[] = [];
  constructor(readonly tag: string) {}
  setAttribute(k: string, v: string): void {
    this.attributes.set(k, v);
  }
  appendChild(c: StandIn): StandIn {
    this.children.push(c);
    return c;
  }
  addEventListener(type: string, fn: () => void): void {
    if (type === 'click') this.listeners.push(fn);
  }
  click(): void {
    for (const fn of this.listeners) fn();
  }
  find(testid: string): StandIn | undefined {
    if (this.attributes.get('data-testid') === testid) return this;
    for (const c of this.children) {
      const hit = c.find(testid);
      if (hit) return hit;
    }
    return undefined;
  }
}

beforeAll(() => {
  (globalThis as unknown as { document: unknown }).document = { createElement: (tag: string) => new StandIn(tag) };
});
afterAll(() => {
  delete (globalThis as unknown as { document?: unknown }).document;
});
beforeEach(() => clearSharedPairs());

/** A workbook that records what the button writes; nothing else may be called. */
class Recorder implements Workbook {
  sheets: { name: string; cells: (string | number)[][] }[] = [];
  charts: { sheet: string; spec: ReportChartSpec }[] = [];
  constructor(private readonly refuse: (spec: ReportChartSpec) => string | null = () => null) {}
  private unused(): never {
    throw new Error('the report button must not call this');
  }
  getSelection(): Promise<string> {
    return this.unused();
  }
  listTables(): never {
    return this.unused();
  }
  readColumn(): never {
    return this.unused();
  }
  readRange(): never {
    return this.unused();
  }
  watch(): never {
    return this.unused();
  }
  selectRow(): never {
    return this.unused();
  }
  writeCells(): never {
    return this.unused();
  }
  async addSheet(name: string, cells: (string | number)[][]): Promise<string> {
    const unique = `${name} (2)`; // as if a "Covary report" were there already
    this.sheets.push({ name: unique, cells });
    return unique;
  }
  async addChart(sheet: string, spec: ReportChartSpec): Promise<void> {
    const refusal = this.refuse(spec);
    if (refusal) throw new Error(refusal);
    this.charts.push({ sheet, spec });
  }
}

/** A column of North from row 2 under its header in row 1, as the panel reads it (NaN: blank or text). */
function read(column: number, header: string, values: number[]): NumericColumnRead {
  const letter = String.fromCharCode(64 + column);
  return { address: `North!${letter}2:${letter}${values.length + 1}`, sheet: 'North', firstRow: 2, column, header, numbers: Float64Array.from(values) };
}

const X = [4.5, 5.1, NaN, 6.3, 6.8, 7.4, 8.0, 8.2, NaN, 9.1, 9.9, 10.4, 11.0, 11.8];
const Y = [31, 35, 36, 38, 44, NaN, 47, 52, 50, 55, 57, 61, 60, 66];

function subject(x: number[], y: number[]): WriteSubject {
  return {
    reads: [read(2, 'Oven hours', x), read(3, 'Loaves sold', y)],
    choice: { x: { kind: 'range', address: `North!B1:B${x.length + 1}` }, y: { kind: 'range', address: `North!C1:C${y.length + 1}` } },
    options: { method: 'pearson', level: 0.95, alpha: 0.05 },
  };
}

/** Clicks "Write report sheet" and waits for its status line. */
async function writeReport(wb: Workbook, s: WriteSubject): Promise<string> {
  const root = writeActions(wb, () => s) as unknown as StandIn;
  root.find(PANEL_TEST_IDS.reportButton)!.click();
  const status = root.find(PANEL_TEST_IDS.actionStatus)!;
  for (let i = 0; i < 100 && status.textContent === ''; i++) await new Promise((r) => setImmediate(r));
  return status.textContent;
}

/** The entry written at a cell of the report (parsed from a chart's address), or undefined outside the block. */
function entryAt(cells: (string | number)[][], row: number, column: number): string | number | undefined {
  return cells[row - 1]?.[column - 1];
}

describe('Write report sheet: three live charts bound to the cells they plot', () => {
  test('the scatter reads the data; the residual charts read the RESIDUALS spill, over as many rows as the data', async () => {
    const wb = new Recorder();
    const status = await writeReport(wb, subject(X, Y));
    expect(wb.sheets.map((s) => s.name)).toEqual(['Covary report (2)']);
    const cells = wb.sheets[0].cells;
    expect(wb.charts.map((c) => c.sheet)).toEqual(['Covary report (2)', 'Covary report (2)', 'Covary report (2)']);
    const [scatter, againstFitted, inRowOrder] = wb.charts.map((c) => c.spec);
    expect([scatter.x, scatter.y, scatter.trendline]).toEqual(['North!B2:B15', 'North!C2:C15', true]);

    // What RESIDUALS answers on these cells, as Excel would call it from the report: 11 complete pairs.
    const column = (v: number[]) => v.map((a) => [Number.isNaN(a) ? '' : a]);
    const spill = RESIDUALS(column(X), column(Y), { parameterAddresses: ['North!B2:B15', 'North!C2:C15'] } as unknown as CustomFunctions.Invocation);
    expect(spill.length).toBe(11);

    const blockOf = (a: string) => parseAddress(a)![0];
    const rowsCells = blockOf(inRowOrder.x);
    const fittedCells = blockOf(againstFitted.x);
    const residualCells = blockOf(againstFitted.y);
    expect(blockOf(inRowOrder.y)).toEqual(residualCells);
    // As many rows as the data (14): the spill (11 now) fills the first of them, and a blank filled in later,
    // which lengthens the spill, stays within them.
    for (const b of [rowsCells, fittedCells, residualCells]) {
      expect([b.sheet, b.firstRow, b.lastRow - b.firstRow + 1, b.lastColumn - b.firstColumn]).toEqual(['Covary report (2)', rowsCells.firstRow, X.length, 0]);
    }
    expect(spill.length).toBeLessThanOrEqual(X.length);
    // The formula sits in the first cell the row-order chart reads; the fitted and residual columns are the next
    // two, left blank for the spill, with the headers above all three.
    expect(entryAt(cells, rowsCells.firstRow, rowsCells.firstColumn)).toBe('=COVARY.RESIDUALS(North!$B$2:$B$15, North!$C$2:$C$15)');
    expect([fittedCells.firstColumn, residualCells.firstColumn]).toEqual([rowsCells.firstColumn + 1, rowsCells.firstColumn + 2]);
    expect([entryAt(cells, fittedCells.firstRow, fittedCells.firstColumn), entryAt(cells, residualCells.firstRow, residualCells.firstColumn)]).toEqual(['', '']);
    expect([0, 1, 2].map((k) => entryAt(cells, rowsCells.firstRow - 1, rowsCells.firstColumn + k))).toEqual(["'Sheet row", "'Fitted value", "'Residual"]);

    expect([againstFitted.trendline, inRowOrder.trendline]).toEqual([false, false]);
    expect([againstFitted.xTitle, againstFitted.yTitle, inRowOrder.xTitle, inRowOrder.yTitle]).toEqual(['Fitted Loaves sold', 'Residual', 'Sheet row (North)', 'Residual']);
    expect(wb.charts.map((c) => [c.spec.at, c.spec.to])).toEqual([['M2', 'T17'], ['M19', 'T34'], ['M36', 'T51']]);
    expect(status).toBe('Report written to the sheet "Covary report (2)", with live charts: the scatter with its straight line, and the residuals against the fitted values and in row order.');
  });

  test(`past 50,000 rows no chart is added, and the RESIDUALS formula is still written`, async () => {
    const n = 50001;
    const x = Array.from({ length: n }, (_, i) => i % 97);
    const y = Array.from({ length: n }, (_, i) => (i * 7) % 101);
    const wb = new Recorder();
    const status = await writeReport(wb, subject(x, y));
    expect(wb.charts).toEqual([]);
    expect(status).toBe('Report written to the sheet "Covary report (2)" (no charts: 50,001 rows is past the 50,000 a chart shows well; the panel draws a sample).');
    expect(wb.sheets[0].cells.flat().filter((e) => String(e).startsWith('=COVARY.RESIDUALS'))).toEqual(['=COVARY.RESIDUALS(North!$B$2:$B$50002, North!$C$2:$C$50002)']);
  });

  test('a chart the host refuses does not stop the others, and the status line says which', async () => {
    const wb = new Recorder((spec) => (spec.title.includes('against the fitted values') ? 'the chart limit was reached' : null));
    const status = await writeReport(wb, subject(X, Y));
    expect(wb.charts.map((c) => c.spec.title)).toEqual(['Loaves sold against Oven hours', 'Residuals of Loaves sold in row order']);
    expect(status).toBe('Report written to the sheet "Covary report (2)", with 2 of its 3 live charts (“Residuals of Loaves sold against the fitted values” could not be added: the chart limit was reached).');
  });
});
