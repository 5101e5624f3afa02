/**
 * The workbench's address and formula reading, checked against Excel's documented rules: the sheet is
 * 1,048,576 rows by 16,384 columns (last column XFD) [Microsoft, "Excel specifications and limits"]; a sheet name
 * with spaces or other characters is quoted, with ' doubled [Microsoft, "Create an external reference"]; in a
 * structured reference the characters [ ] # ' in a column name are escaped with ' and a name with spaces goes in
 * double brackets [Microsoft, "Using structured references with Excel tables"]. The General format's width of
 * 11 characters, with scientific notation beyond it, is recalled from Microsoft's "Available number formats in
 * Excel" (from memory, not checked against a copy).
 */
import { columnLetters, columnNumber, formatArea, parseArea, quoteSheet } from '../../../workbench/a1';
import { displayValue, formatGeneral } from '../../../workbench/cell-format';
import { readEntry } from '../../../workbench/cell-values';
import { FormulaSyntaxError, parseFormula, references } from '../../../workbench/formula-parser';

describe('A1 addresses', () => {
  test('column letters run A..Z, AA.., up to XFD = 16384', () => {
    expect(columnLetters(1)).toBe('A');
    expect(columnLetters(26)).toBe('Z');
    expect(columnLetters(27)).toBe('AA');
    expect(columnLetters(702)).toBe('ZZ');
    expect(columnLetters(703)).toBe('AAA');
    expect(columnLetters(16384)).toBe('XFD');
    expect(columnNumber('xfd')).toBe(16384);
    expect(columnNumber('XFE')).toBeNaN();
  });

  test('sheet names are quoted when they need it, with quotes doubled', () => {
    expect(quoteSheet('North')).toBe('North');
    expect(quoteSheet('Monthly figures')).toBe("'Monthly figures'");
    expect(quoteSheet("Staff's")).toBe("'Staff''s'");
    expect(quoteSheet('A1')).toBe("'A1'"); // would read as a cell
  });

  test('ranges, single cells, $ anchors and whole columns parse and print back', () => {
    expect(parseArea('North!$B$2:$B$49', 'X')).toEqual({ sheet: 'North', top: 2, left: 2, bottom: 49, right: 2 });
    expect(parseArea("'It''s here'!C3", 'X')).toEqual({ sheet: "It's here", top: 3, left: 3, bottom: 3, right: 3 });
    expect(parseArea('C9:B2', 'Home')).toEqual({ sheet: 'Home', top: 2, left: 2, bottom: 9, right: 3 });
    expect(parseArea('B:C', 'Home')).toEqual({ sheet: 'Home', top: 1, left: 2, bottom: Infinity, right: 3 });
    expect(parseArea('B', 'Home')).toBeNull();
    expect(parseArea('B0', 'Home')).toBeNull();
    expect(parseArea('B1048577', 'Home')).toBeNull();
    expect(formatArea({ sheet: 'Monthly figures', top: 2, left: 2, bottom: 49, right: 3 })).toBe("'Monthly figures'!B2:C49");
    expect(formatArea({ sheet: 'North', top: 5, left: 1, bottom: 5, right: 1 })).toBe('North!A5');
  });
});

describe('formulas', () => {
  test('a call with ranges, a sheet-qualified range, text, a number, TRUE and an omitted argument', () => {
    const node = parseFormula(`=COVARY.COEF(B2:B49, 'Other sheet'!C2:C49, "say ""hi""", -0.5e1, TRUE, )`, 'North');
    expect(node.kind).toBe('call');
    if (node.kind !== 'call') return;
    expect(node.name).toBe('COVARY.COEF');
    expect(node.args.map((a) => a.kind)).toEqual(['ref', 'ref', 'literal', 'literal', 'literal', 'omitted']);
    expect(node.args[0]).toMatchObject({ area: { sheet: 'North', top: 2, bottom: 49, left: 2, right: 2 } });
    expect(node.args[1]).toMatchObject({ area: { sheet: 'Other sheet', left: 3 } });
    expect(node.args[2]).toEqual({ kind: 'literal', value: 'say "hi"' });
    expect(node.args[3]).toEqual({ kind: 'literal', value: -5 });
    expect(node.args[4]).toEqual({ kind: 'literal', value: true });
  });

  test('array constants: commas separate columns, semicolons rows', () => {
    expect(parseFormula('=F({1,2;3,4})', 'S')).toEqual({ kind: 'call', name: 'F', args: [{ kind: 'array', rows: [[1, 2], [3, 4]] }] });
    expect(() => parseFormula('=F({1,2;3})', 'S')).toThrow(FormulaSyntaxError);
  });

  test("structured references: plain, bracketed with spaces, #Data, and ' escapes", () => {
    const node = parseFormula("=F(Shops[Visits], Shops[[Floor area m²]], Shops[[#Data],[Rent]], Shops[[Cost '[£']]])", 'S');
    expect(references(node).map((r) => (r.kind === 'tableref' ? `${r.table}|${r.column}|${r.part}` : r.text))).toEqual([
      'Shops|Visits|data',
      'Shops|Floor area m²|data',
      'Shops|Rent|data',
      'Shops|Cost [£]|data',
    ]);
  });

  test('unreadable formulas throw a syntax error with a position', () => {
    expect(() => parseFormula('=COVARY.COEF(B2:B9', 'S')).toThrow(/closing/);
    expect(() => parseFormula('=COVARY.COEF(B2:B9))', 'S')).toThrow(/unexpected/);
    expect(() => parseFormula('="open', 'S')).toThrow(/closing "/);
    expect(() => parseFormula('=COVARY.COEF(B2 B9)', 'S')).toThrow(FormulaSyntaxError);
  });
});

describe('typed entries and how values read', () => {
  test('numbers, TRUE/FALSE, formulas and text are told apart; markup stays text', () => {
    expect(readEntry('42')).toEqual({ kind: 'value', value: 42 });
    expect(readEntry(' -1.5e3 ')).toEqual({ kind: 'value', value: -1500 });
    expect(readEntry('true')).toEqual({ kind: 'value', value: true });
    expect(readEntry('=COVARY.PAIRS(A1:A3, B1:B3)')).toEqual({ kind: 'formula', text: '=COVARY.PAIRS(A1:A3, B1:B3)' });
    expect(readEntry('<img src=x onerror=alert(1)>')).toEqual({ kind: 'value', value: '<img src=x onerror=alert(1)>' });
    expect(readEntry('')).toEqual({ kind: 'value', value: null });
  });

  test('percent, currency and thousands separators become numbers as Excel (en-US) reads them; odd shapes stay text', () => {
    // Excel: typing 5% stores 0.05, $1,234.50 stores 1234.5, 1,234 stores 1234 (recalled from using Excel).
    expect(readEntry('5%')).toEqual({ kind: 'value', value: 0.05 });
    expect(readEntry('-2.5%')).toEqual({ kind: 'value', value: -0.025 });
    expect(readEntry('$5')).toEqual({ kind: 'value', value: 5 });
    expect(readEntry('$1,234.50')).toEqual({ kind: 'value', value: 1234.5 });
    expect(readEntry('-€5')).toEqual({ kind: 'value', value: -5 });
    expect(readEntry('1,234')).toEqual({ kind: 'value', value: 1234 });
    for (const text of ['12,34', '$', '%', '5%%', '1,2345', '$$5', 'N05']) expect(readEntry(text)).toEqual({ kind: 'value', value: text });
  });

  test("a leading apostrophe keeps the rest as text, as in Excel (how the panel writes every text)", () => {
    expect(readEntry("'=HYPERLINK(\"x\")")).toEqual({ kind: 'value', value: '=HYPERLINK("x")' });
    expect(readEntry("'42")).toEqual({ kind: 'value', value: '42' });
    expect(readEntry("''x")).toEqual({ kind: 'value', value: "'x" });
  });

  test('General format: at most 11 characters, scientific notation beyond', () => {
    expect(formatGeneral(0.930437663913561)).toBe('0.930437664');
    expect(formatGeneral(48)).toBe('48');
    expect(formatGeneral(1.1035946152879797e-21)).toBe('1.1036E-21');
    expect(formatGeneral(123456789012)).toBe('1.2346E+11');
    expect(formatGeneral(-0.000012345)).toBe('-1.2345E-05');
    expect(formatGeneral(0.000436069)).toBe('0.000436069');
    expect(displayValue({ error: '#VALUE!', message: 'y is constant' })).toEqual({ text: '#VALUE!', kind: 'error', title: 'y is constant' });
    expect(displayValue(false)).toEqual({ text: 'FALSE', kind: 'boolean' });
  });
});
