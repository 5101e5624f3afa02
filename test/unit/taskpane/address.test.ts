/** Picking two columns (or one) from the address of a selection: a block two columns wide or Ctrl-picked areas. */
import { formatBlock } from '../../../src/sheet/a1';
import { oneColumnOf, twoColumnsOf } from '../../../taskpane/address';

describe('columns from a selection', () => {
  test('a block two columns wide', () => {
    const two = twoColumnsOf('Staff!B1:C49')!;
    expect(two.map((b) => formatBlock(b))).toEqual(['Staff!B1:B49', 'Staff!C1:C49']);
  });
  test('two single-column areas', () => {
    const two = twoColumnsOf('Staff!B2:B49,Staff!E2:E49')!;
    expect(two.map((b) => formatBlock(b))).toEqual(['Staff!B2:B49', 'Staff!E2:E49']);
  });
  test('anything else is refused', () => {
    expect(twoColumnsOf('Staff!B2:D49')).toBeNull();
    expect(twoColumnsOf('Staff!B2:B49')).toBeNull();
    expect(oneColumnOf('Staff!B2:B49')).not.toBeNull();
    expect(oneColumnOf('Staff!B2:C49')).toBeNull();
  });
});
