/**
 * What the two write buttons put into the workbook: the COVARY formulas for the current pair beside the data,
 * and a report sheet. Formulas (not pasted values) so the results stay live in the workbook after the panel is
 * closed. Pure: builds cell blocks and addresses; the panel writes them through the Workbook interface.
 */
import { CellBlock, formatBlock } from '../src/sheet/a1';
import type { ColumnSource, ReportChartSpec } from './workbook';
import type { Design } from './design';
import { Method, METHOD_LABELS } from '../src/stats/types';
import { Entry, formulaEntry, textEntry } from '../src/sheet/entries';

/** How one column of the pair is referred to in a formula. */
export interface ColumnRef {
  source: ColumnSource;
  /** The data cells (header excluded) as read. */
  block: CellBlock;
}

/**
 * Escapes a table column name for a structured reference: ', [, ], # are prefixed with ' (Excel's rule for
 * special characters in column specifiers).
 */
export function escapeColumnName(name: string): string {
  return name.replace(/['[\]#]/g, (c) => `'${c}`);
}

/**
 * A reference to a column for a formula written on `targetSheet`:
 * - table columns as structured references (Branches[Visits]), which follow the table as it grows, unless
 *   `a1` is asked for (hosts that do not evaluate structured references);
 * - ranges as absolute A1 references, with the sheet name only when the formula is on another sheet.
 */
export function columnReference(ref: ColumnRef, targetSheet: string, a1 = false): string {
  if (ref.source.kind === 'table' && !a1) {
    const name = ref.source.column;
    const plain = /^[A-Za-z_][A-Za-z0-9_]*$/.test(name);
    return plain ? `${ref.source.table}[${name}]` : `${ref.source.table}[[${escapeColumnName(name)}]]`;
  }
  const block = ref.block.sheet === targetSheet ? { ...ref.block, sheet: '' } : ref.block;
  return formatBlock(block, { absolute: true });
}

export interface FormulaOptions {
  method: Method;
  level: number;
  alpha: number;
  /** Use A1 references even for table columns. */
  a1?: boolean;
}

/** A text for a cell: a string literal inside a formula, doubling quotes. */
function literal(s: string): string {
  return `"${s.replace(/"/g, '""')}"`;
}

/** Six rows by two columns: labels and formulas (the interval spills one cell to the right of its formula). */
export function formulaBlock(
  x: ColumnRef,
  y: ColumnRef,
  names: { x: string; y: string },
  targetSheet: string,
  o: FormulaOptions,
): Entry[][] {
  const xr = columnReference(x, targetSheet, o.a1);
  const yr = columnReference(y, targetSheet, o.a1);
  const args = `${xr}, ${yr}`;
  const m = literal(o.method);
  const pct = `${Math.round(o.level * 1000) / 10}%`;
  return [
    [textEntry(`Covary: ${names.y} against ${names.x}`), ''],
    [textEntry(`Coefficient (${METHOD_LABELS[o.method].name})`), formulaEntry(`=COVARY.COEF(${args}, ${m})`)],
    [textEntry(`${pct} interval (lower, upper)`), formulaEntry(`=COVARY.INTERVAL(${args}, ${o.level}, ${m})`)],
    [textEntry('p-value (two-sided)'), formulaEntry(`=COVARY.PVALUE(${args}, "both", ${m})`)],
    [textEntry('Pairs used'), formulaEntry(`=COVARY.PAIRS(${args})`)],
    [textEntry('Flags'), formulaEntry(`=COVARY.FLAGS(${args}, ${o.alpha})`)],
  ];
}

/** Width of the formula block including the interval's spill cell. */
export const FORMULA_BLOCK_COLUMNS = 3;
export const FORMULA_BLOCK_ROWS = 6;

/**
 * Candidate places for the formula block: the top row of the data, starting two columns to the right of the
 * rightmost data column, then further right one step at a time. The caller takes the first empty one.
 */
export function formulaPlaces(blocks: CellBlock[], tries = 12): CellBlock[] {
  const sheet = blocks[0].sheet;
  const top = Math.min(...blocks.map((b) => b.firstRow));
  const right = Math.max(...blocks.map((b) => b.lastColumn));
  const out: CellBlock[] = [];
  for (let k = 0; k < tries; k++) {
    const first = right + 2 + k * (FORMULA_BLOCK_COLUMNS + 1);
    if (first + FORMULA_BLOCK_COLUMNS - 1 > 16384) break;
    out.push({ sheet, firstRow: Math.max(1, top - 1), lastRow: Math.max(1, top - 1) + FORMULA_BLOCK_ROWS - 1, firstColumn: first, lastColumn: first + FORMULA_BLOCK_COLUMNS - 1 });
  }
  return out;
}

/** True when every cell of a read block is blank. */
export function allBlank(values: unknown[][]): boolean {
  return values.every((row) => row.every((v) => v === null || v === undefined || v === ''));
}

/** Top-left address of a block, with its sheet. */
export function topLeftOf(b: CellBlock): string {
  return formatBlock({ ...b, lastRow: b.firstRow, lastColumn: b.firstColumn });
}

/** The lines of caution repeated on the report sheet. */
export const REPORT_CAUTIONS = [
  'A correlation is not evidence that one variable causes the other.',
  'Small samples, or rows selected on either variable, can give a very different correlation from the whole population.',
  'Before using this in decisions about people or money (hiring, pay, dismissal, credit, investment), check fairness and adverse-impact law where you are: local law and qualified professionals have the last word.',
  'A validity corrected for range restriction or unreliability (COVARY.CORRECTED) estimates the correlation among applicants, not a property of the people in the sheet, and is only as good as the reliabilities and SDs put in.',
];

/** Rows the CHECKS table fills on the report sheet (a header and its eight checks). */
const CHECKS_ROWS = 9;

/**
 * The report sheet: a title, the data used, the cautions, then the COVARY.REPORT summary (spilling two columns)
 * and, beside it from column D, the COVARY.CHECKS table and below that the COVARY.SENSITIVITY table (does the
 * conclusion hold); far right, the COVARY.RESIDUALS block that the residual charts read (RESIDUAL_BLOCK).
 * References carry their sheet (the report is on a new sheet). Every text is entered as text
 * (src/sheet/entries.ts), so a header that begins with "=" cannot become a formula.
 */
/** Pair B of the panel's comparison, for the report: its columns, the design and (shared) which column is common. */
export interface ReportComparison {
  x: ColumnRef;
  y: ColumnRef;
  names: { x: string; y: string };
  design: Design;
  /** For "shared": the position of the common column in pair A and in pair B. */
  common?: { a: 0 | 1; b: 0 | 1 };
}

/** Rows of the report above which the comparison may start: REPORT spills up to 24 rows from row 10. */
const COMPARISON_ROW = 36;

/**
 * The residual block of the report sheet, for its residual charts: headers in W1:Y1 and the COVARY.RESIDUALS
 * formula in W2, which spills one row per pair used (sheet row, fitted value, residual) down columns W to Y.
 * Clear of everything else on the report: the tables use A-K (REPORT A-B, CHECKS and SENSITIVITY spill from D
 * over eight columns), the comparison A-D, and the three charts M-T (REPORT_CHART_PLACES).
 */
export const RESIDUAL_BLOCK = { firstColumn: 23, headerRow: 1, formulaRow: 2 } as const;
export const RESIDUAL_HEADERS = ['Sheet row', 'Fitted value', 'Residual'] as const;

/** Where the report's three charts sit, one below the other in columns M-T (top-left and bottom-right cells). */
export const REPORT_CHART_PLACES = [
  { at: 'M2', to: 'T17' },
  { at: 'M19', to: 'T34' },
  { at: 'M36', to: 'T51' },
] as const;

/** Complete pairs of two columns as read (NaN marks a cell that does not count): the rows RESIDUALS spills. */
export function completePairCount(x: Float64Array, y: Float64Array): number {
  const n = Math.min(x.length, y.length);
  let k = 0;
  for (let i = 0; i < n; i++) if (x[i] === x[i] && y[i] === y[i]) k++;
  return k;
}

/**
 * The report sheet's cells that the RESIDUALS spill can fill, `rows` of them (the data rows: the spill has one row
 * per complete pair, never more), one address per column, with the sheet. A chart bound to them shows every
 * residual; the cells past the spill are empty and an XY scatter leaves empty cells out, so a blank filled in
 * later, which lengthens the spill, still shows.
 */
export function residualCells(sheet: string, rows: number): { rows: string; fitted: string; residuals: string } {
  const first = RESIDUAL_BLOCK.formulaRow;
  const last = first + Math.max(1, rows) - 1;
  const column = (k: number) => formatBlock({ sheet, firstRow: first, lastRow: last, firstColumn: RESIDUAL_BLOCK.firstColumn + k, lastColumn: RESIDUAL_BLOCK.firstColumn + k });
  return { rows: column(0), fitted: column(1), residuals: column(2) };
}

/**
 * The report's three native charts, each bound to cells so it stays live: y against x from the data cells with
 * the least-squares line; the residuals against the fitted values; the residuals in row order (against the sheet
 * row of each pair). The last two read the RESIDUALS spill on the report sheet `sheet`, over `dataRows` cells
 * (residualCells); with fewer than 3 pairs (RESIDUALS then answers #N/A) only the first is made.
 */
export function reportCharts(sheet: string, x: ColumnRef, y: ColumnRef, names: { x: string; y: string }, pairs: number, dataRows = pairs): ReportChartSpec[] {
  const place = (k: number) => ({ at: REPORT_CHART_PLACES[k].at, to: REPORT_CHART_PLACES[k].to });
  const specs: ReportChartSpec[] = [
    { title: `${names.y} against ${names.x}`, x: formatBlock(x.block), y: formatBlock(y.block), xTitle: names.x, yTitle: names.y, ...place(0), trendline: true },
  ];
  if (pairs < 3) return specs;
  const cells = residualCells(sheet, Math.max(pairs, dataRows));
  specs.push(
    { title: `Residuals of ${names.y} against the fitted values`, x: cells.fitted, y: cells.residuals, xTitle: `Fitted ${names.y}`, yTitle: 'Residual', ...place(1), trendline: false },
    { title: `Residuals of ${names.y} in row order`, x: cells.rows, y: cells.residuals, xTitle: `Sheet row (${x.block.sheet})`, yTitle: 'Residual', ...place(2), trendline: false },
  );
  return specs;
}

export function reportSheetCells(x: ColumnRef, y: ColumnRef, names: { x: string; y: string }, o: FormulaOptions, writtenAt: Date, compare?: ReportComparison): Entry[][] {
  const xr = columnReference(x, '', o.a1);
  const yr = columnReference(y, '', o.a1);
  const args = `${xr}, ${yr}`;
  // Columns A-D, out to the residual block's last column (the cells between are written blank).
  const width = RESIDUAL_BLOCK.firstColumn + RESIDUAL_HEADERS.length - 1;
  const row = (...cells: Entry[]): Entry[] => [...cells, ...Array(width - cells.length).fill('')];
  const t = textEntry;
  const rows: Entry[][] = [
    row(t('Covary report')),
    // The names alone in B2 and B3 (REPORT's reading names the columns from them), the cells beside them.
    row(t('x'), t(names.x), t(formatBlock(x.block))),
    row(t('y'), t(names.y), t(formatBlock(y.block))),
    row(t('Written'), t(writtenAt.toISOString().replace('T', ' ').slice(0, 16) + ' UTC')),
    ...REPORT_CAUTIONS.map((c, i) => row(t(i === 0 ? 'Cautions' : ''), t(c))),
    row(),
    row(t('Summary'), '', '', t('Assumption checks')),
    row(formulaEntry(`=COVARY.REPORT(${args}, ${o.level}, ${literal(o.method)}, "", $B$2, $B$3)`), '', '', formulaEntry(`=COVARY.CHECKS(${args}, ${o.alpha})`)),
    ...Array.from({ length: CHECKS_ROWS }, () => row()),
    row('', '', '', t('Does the conclusion hold?')),
    row('', '', '', formulaEntry(`=COVARY.SENSITIVITY(${args}, ${o.level}, ${literal(o.method)})`)),
  ];
  // The residual block (RESIDUAL_BLOCK): headers, then the formula whose spill the residual charts read.
  const put = (r: number, entries: Entry[]) => entries.forEach((e, k) => (rows[r - 1][RESIDUAL_BLOCK.firstColumn - 1 + k] = e));
  put(RESIDUAL_BLOCK.headerRow, RESIDUAL_HEADERS.map((h) => t(h)));
  put(RESIDUAL_BLOCK.formulaRow, [formulaEntry(`=COVARY.RESIDUALS(${args})`)]);
  if (!compare) return rows;
  while (rows.length < COMPARISON_ROW - 1) rows.push(row());
  const a = [xr, yr];
  const b = [columnReference(compare.x, '', o.a1), columnReference(compare.y, '', o.a1)];
  const m = literal(o.method);
  let formula: string;
  let what: string;
  if (compare.design === 'independent') {
    formula = `=COVARY.DIFF_GROUPS(${a[0]}, ${a[1]}, ${b[0]}, ${b[1]}, ${o.level}, "both", ${m})`;
    what = 'two separate groups (different rows)';
  } else if (compare.design === 'shared' && compare.common) {
    const ia = compare.common.a;
    const ib = compare.common.b;
    formula = `=COVARY.DIFF_SHARED(${a[ia]}, ${a[1 - ia]}, ${b[1 - ib]}, ${o.level}, "both", ${m})`;
    what = 'the same rows, one column in common';
  } else {
    formula = `=COVARY.DIFF_SEPARATE(${a[0]}, ${a[1]}, ${b[0]}, ${b[1]}, ${o.level}, "both", ${m})`;
    what = 'the same rows, four different columns';
  }
  rows.push(
    row(t('Comparison'), t(`Pair A (${names.y} with ${names.x}) against pair B (${compare.names.y} with ${compare.names.x}, ${formatBlock(compare.x.block)} and ${formatBlock(compare.y.block)}): ${what}`)),
    row(t('A − B'), t('lower'), t('upper'), t('p-value')),
    row(formulaEntry(formula)),
  );
  return rows;
}
