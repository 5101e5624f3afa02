/**
 * Naming the sheet position of a pair from the address Excel passes with @requiresParameterAddresses. Reference:
 * Excel's reference syntax as documented by Microsoft ("Overview of formulas": A1 references, whole columns,
 * quoted sheet names with doubled quotes; "Excel specifications and limits": last column XFD).
 */
import { columnLetters as columnName } from '../../../src/sheet/a1';
import { pointNaming, rangeStart } from '../../../src/sheet/naming';

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
