/**
 * A1 address parsing. Reference: Excel's reference syntax as documented by Microsoft ("Overview of formulas":
 * A1 references, whole columns "H:J", whole rows "5:10", 3-D references 'Sheet name'!A1 with quotes around
 * names holding spaces, a quote inside a name doubled) and "Excel specifications and limits" (1,048,576 rows,
 * 16,384 columns, last column XFD).
 */
import { columnLetters, columnNumber, formatBlock, parseAddress, quoteSheet, MAX_COLUMNS, MAX_ROWS } from '../../../src/sheet/a1';

describe('column letters (Excel specifications: last column XFD = 16,384)', () => {
  test.each([
    [1, 'A'], [26, 'Z'], [27, 'AA'], [52, 'AZ'], [53, 'BA'], [702, 'ZZ'], [703, 'AAA'], [16384, 'XFD'],
  ])('%i <-> %s', (n, letters) => {
    expect(columnLetters(n)).toBe(letters);
    expect(columnNumber(letters)).toBe(n);
    expect(columnNumber(letters.toLowerCase())).toBe(n);
  });
  test('beyond XFD or malformed is rejected', () => {
    expect(columnNumber('XFE')).toBeNaN();
    expect(columnNumber('A1')).toBeNaN();
    expect(() => columnLetters(0)).toThrow();
    expect(() => columnLetters(MAX_COLUMNS + 1)).toThrow();
  });
});

describe('parseAddress', () => {
  test('sheet and block, absolute markers ignored', () => {
    expect(parseAddress('Staff!$B$2:$C$49')).toEqual([{ sheet: 'Staff', firstRow: 2, lastRow: 49, firstColumn: 2, lastColumn: 3 }]);
  });
  test('quoted sheet name with a space, a doubled quote and a comma', () => {
    expect(parseAddress("'North, Jo''s shops'!B2:B9")).toEqual([{ sheet: "North, Jo's shops", firstRow: 2, lastRow: 9, firstColumn: 2, lastColumn: 2 }]);
  });
  test('one cell, reversed corners, no sheet', () => {
    expect(parseAddress('D7')).toEqual([{ sheet: '', firstRow: 7, lastRow: 7, firstColumn: 4, lastColumn: 4 }]);
    expect(parseAddress('C9:B2', 'S')).toEqual([{ sheet: 'S', firstRow: 2, lastRow: 9, firstColumn: 2, lastColumn: 3 }]);
  });
  test('whole columns and whole rows span the sheet limits', () => {
    expect(parseAddress('Data!B:C')).toEqual([{ sheet: 'Data', firstRow: 1, lastRow: MAX_ROWS, firstColumn: 2, lastColumn: 3 }]);
    expect(parseAddress('Data!5:5')).toEqual([{ sheet: 'Data', firstRow: 5, lastRow: 5, firstColumn: 1, lastColumn: MAX_COLUMNS }]);
  });
  test('several areas (Ctrl selection); later areas inherit the sheet', () => {
    expect(parseAddress('Staff!B2:B9, Staff!D2:D9')).toHaveLength(2);
    expect(parseAddress('Staff!B2:B9,D2:D9')![1].sheet).toBe('Staff');
  });
  test('malformed addresses give null', () => {
    for (const bad of ['', 'Staff!', 'B2:C3:D4', 'B0', 'B1048577', 'B:3', '#REF!', 'Staff!B2:']) expect(parseAddress(bad)).toBeNull();
  });
});

describe('formatBlock and quoting', () => {
  test('plain names stay bare; names with spaces, quotes, or that read as cells are quoted', () => {
    expect(quoteSheet('Staff')).toBe('Staff');
    expect(quoteSheet('North branch')).toBe("'North branch'");
    expect(quoteSheet("Jo's")).toBe("'Jo''s'");
    expect(quoteSheet('AB12')).toBe("'AB12'");
    expect(quoteSheet('R1C1')).toBe("'R1C1'");
    expect(quoteSheet('2024')).toBe("'2024'");
  });
  test('round trip', () => {
    for (const a of ["'North branch'!B2:B49", 'Staff!C3', 'Staff!$B$2:$B$9']) {
      const b = parseAddress(a)![0];
      expect(parseAddress(formatBlock(b))![0]).toEqual(b);
    }
    expect(formatBlock(parseAddress('Staff!B2:B9')![0], { absolute: true })).toBe('Staff!$B$2:$B$9');
  });
});
