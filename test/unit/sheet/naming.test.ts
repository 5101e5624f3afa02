/**
 * Naming the sheet position of a pair from the address Excel passes with @requiresParameterAddresses. Reference:
 * Excel's reference syntax as documented by Microsoft ("Overview of formulas": A1 references, whole columns,
 * quoted sheet names with doubled quotes; "Excel specifications and limits": last column XFD).
 */
import { columnLetters as columnName } from '../../../src/sheet/a1';
import { pointNaming, pointNumbering, rangeStart } from '../../../src/sheet/naming';

describe('sheet positions from an address', () => {
  test('address parsing', () => {
    expect(rangeStart('Sheet1!B2:B40')).toEqual({ row: 2, column: 2 });
    expect(rangeStart("'It''s here!'!$AB$10:$AB$99")).toEqual({ row: 10, column: 28 });
    expect(rangeStart('[Book1]Sheet1!C:C')).toEqual({ row: 1, column: 3 });
    expect(rangeStart('D7')).toEqual({ row: 7, column: 4 });
    expect(rangeStart(undefined)).toBeNull();
    expect(rangeStart('#REF!')).toBeNull();
    expect(columnName(16384)).toBe('XFD');
    expect(pointNaming([[1], [2]], 'nonsense').name(0)).toBe('position 1');
  });
});

describe('numbering pairs for a returned column (RESIDUALS)', () => {
  const column = (n: number) => Array.from({ length: n }, () => [1]);
  test('a column range: sheet rows; a row range: sheet columns', () => {
    const byRow = pointNumbering(column(39), 'Sheet1!B2:B40');
    expect([byRow.by, byRow.number(0), byRow.number(38)]).toEqual(['row', 2, 40]);
    const byColumn = pointNumbering([[1, 2, 3]], "'North branch'!$AA$7:$AC$7");
    expect([byColumn.by, byColumn.number(0), byColumn.number(2)]).toEqual(['column', 27, 29]);
  });
  test('only an address of the range\'s own shape is trusted; otherwise positions from 1', () => {
    for (const address of ['Sheet1!B2:B41', 'Sheet1!B2:C40', 'Sheet1!B:B', 'nonsense', '', undefined, null]) {
      const p = pointNumbering(column(39), address);
      expect([address, p.by, p.number(0), p.number(4)]).toEqual([address, 'position', 1, 5]);
    }
    expect(pointNumbering(column(1048576), 'Sheet1!B:B').number(9)).toBe(10);
  });
});
