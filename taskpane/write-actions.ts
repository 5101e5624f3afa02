/**
 * The panel's only two ways of writing to the workbook, each behind its own button: "Put formulas in sheet" (the
 * COVARY formulas for the current pair, beside the data) and "Write report sheet" (a new sheet of live formulas).
 * Nothing else in the panel calls Workbook.writeCells or Workbook.addSheet (test/unit/security/
 * writes-only-when-asked.test.ts holds that).
 */
import { formatBlock } from '../src/sheet/a1';
import { button, el } from './dom';
import { PANEL_TEST_IDS } from './panel-api';
import type { PairChoice } from './pair-picker';
import { dataBlock } from './pairs';
import { allBlank, ColumnRef, completePairCount, formulaBlock, FormulaOptions, formulaPlaces, reportCharts, ReportComparison, reportSheetCells, topLeftOf } from './sheet-output';
import type { Design } from './design';
import type { NumericColumnRead, ReportChartSpec, Workbook } from './workbook';

/** Past this many rows the report gets no native charts (the points would bury the picture and slow the workbook). */
const CHART_ROWS = 50000;

/** What the buttons write about: the pair as last read, and the options in force. */
export interface WriteSubject {
  reads: [NumericColumnRead, NumericColumnRead];
  choice: PairChoice;
  options: FormulaOptions;
  /** Pair B and the design of the comparison on screen, when there is one (the report carries it). */
  comparison?: { reads: [NumericColumnRead, NumericColumnRead]; choice: PairChoice; design: Design; common?: { a: 0 | 1; b: 0 | 1 } };
}

/** The two buttons and the line that says what they did. */
export function writeActions(wb: Workbook, subject: () => WriteSubject | null): HTMLElement {
  const formulasButton = button('Put formulas in sheet', PANEL_TEST_IDS.formulasButton, 'primary');
  const reportButton = button('Write report sheet', PANEL_TEST_IDS.reportButton);
  const status = el('div', { class: 'cv-inline-message', testid: PANEL_TEST_IDS.actionStatus, attrs: { role: 'status' } });

  /** Where this panel last wrote the formulas of each pair and options, so a second click does not write a copy. */
  const written = new Map<string, string>();
  const keyOf = (s: WriteSubject) => JSON.stringify([s.choice, s.options]);
  const show = async (address: string) => {
    try {
      await wb.selectRange?.(address);
    } catch {
      // Selecting is a courtesy: the status line says where the formulas are either way.
    }
  };

  const refsOf = (choice: PairChoice, reads: [NumericColumnRead, NumericColumnRead]): [ColumnRef, ColumnRef] => [
    { source: choice.x, block: dataBlock(reads[0]) },
    { source: choice.y, block: dataBlock(reads[1]) },
  ];

  async function putFormulas(): Promise<void> {
    const s = subject();
    if (!s) {
      status.textContent = 'Pick two columns first.';
      return;
    }
    const [xr, yr] = refsOf(s.choice, s.reads);
    const sheet = xr.block.sheet;
    try {
      const key = keyOf(s);
      const earlier = written.get(key);
      if (earlier) {
        // Still there (not cleared since): show them instead of writing a second copy.
        const seen = await wb.readRange(earlier);
        if (!allBlank(seen.values)) {
          await show(earlier);
          status.textContent = `The formulas for this pair are already at ${earlier} (selected). They recalculate with the sheet.`;
          return;
        }
      }
      for (const place of formulaPlaces([xr.block, yr.block])) {
        const seen = await wb.readRange(formatBlock(place));
        if (!allBlank(seen.values)) continue;
        const cells = formulaBlock(xr, yr, { x: s.reads[0].header, y: s.reads[1].header }, sheet, s.options);
        await wb.writeCells(topLeftOf(place), cells);
        const at = formatBlock({ ...place, lastRow: place.firstRow + cells.length - 1, lastColumn: place.firstColumn + Math.max(...cells.map((r) => r.length)) - 1 });
        written.set(key, at);
        await show(at);
        status.textContent = `Formulas written at ${at} (selected). They recalculate with the sheet.`;
        return;
      }
      status.textContent = 'No empty space found to the right of the data: clear a few columns there and try again.';
    } catch (e) {
      status.textContent = `Could not write the formulas: ${e instanceof Error ? e.message : String(e)}`;
    }
  }

  async function writeReport(): Promise<void> {
    const s = subject();
    if (!s) {
      status.textContent = 'Pick two columns first.';
      return;
    }
    const [xr, yr] = refsOf(s.choice, s.reads);
    try {
      const c = s.comparison;
      let compare: ReportComparison | undefined;
      if (c) {
        const [x, y] = refsOf(c.choice, c.reads);
        compare = { x, y, names: { x: c.reads[0].header, y: c.reads[1].header }, design: c.design, common: c.common };
      }
      const names = { x: s.reads[0].header, y: s.reads[1].header };
      const cells = reportSheetCells(xr, yr, names, s.options, new Date(), compare);
      const name = await wb.addSheet('Covary report', cells);
      const rows = xr.block.lastRow - xr.block.firstRow + 1;
      const charts = await addReportCharts(name, reportCharts(name, xr, yr, names, completePairCount(s.reads[0].numbers, s.reads[1].numbers), rows), rows);
      status.textContent = `Report written to the sheet "${name}"${charts}.`;
    } catch (e) {
      status.textContent = `Could not write the report sheet: ${e instanceof Error ? e.message : String(e)}`;
    }
  }

  /**
   * The report's native XY scatter charts (sheet-output.ts reportCharts), each bound to cells so it stays live:
   * y against x with Excel's linear trendline, then the residuals against the fitted values and in row order
   * from the report's RESIDUALS spill, stacked in columns M-T. Past CHART_ROWS data rows none is added. A chart
   * the host refuses does not stop the others. Returns what to add to the status line.
   */
  async function addReportCharts(sheet: string, specs: ReportChartSpec[], rows: number): Promise<string> {
    if (!wb.addChart) return '';
    if (rows > CHART_ROWS) return ` (no charts: ${rows.toLocaleString('en-US')} rows is past the ${CHART_ROWS.toLocaleString('en-US')} a chart shows well; the panel draws a sample)`;
    const failed: string[] = [];
    for (const spec of specs) {
      try {
        await wb.addChart(sheet, spec);
      } catch (e) {
        failed.push(`“${spec.title}” could not be added: ${e instanceof Error ? e.message : String(e)}`);
      }
    }
    if (failed.length === 0) {
      return specs.length > 1
        ? ', with live charts: the scatter with its straight line, and the residuals against the fitted values and in row order'
        : ', with a live scatter chart and its straight line';
    }
    const made = specs.length - failed.length;
    return `${made > 0 ? `, with ${made} of its ${specs.length} live charts` : ''} (${failed.join('; ')})`;
  }

  formulasButton.addEventListener('click', () => void putFormulas());
  reportButton.addEventListener('click', () => void writeReport());
  return el('div', {}, [el('div', { class: 'cv-row cv-wrap cv-actions' }, [formulasButton, reportButton]), status]);
}
