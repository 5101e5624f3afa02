/** Pairing columns read from the workbook. The rule for what counts is the cell functions' documented rule
 * (src/sheet/cells.ts, src/sheet/pairs.ts): finite numbers count; blanks, text, booleans and errors are skipped pairwise. */
import { ColumnRead, completeRows, dataStart, numericColumn, pairColumns as pairNumeric, PairingError, readNumericColumn } from '../../../taskpane/pairs';
import type { NumericColumnRead, Workbook } from '../../../taskpane/workbook';

/** Pairs two readColumn results through the same conversion the panel uses. */
const pairColumns = (x: ColumnRead, y: ColumnRead) => pairNumeric(numericColumn(x), numericColumn(y));

function column(sheet: string, firstRow: number, firstColumn: number, cells: unknown[], header?: string): ColumnRead {
  const address = `${sheet}!R${firstRow}C${firstColumn}`;
  const first = cells[0];
  return {
    address,
    sheet,
    firstRow,
    firstColumn,
    values: cells.map((v) => [v]),
    header: header ?? (typeof first === 'string' && first !== '' ? first : address),
  };
}

describe('pairColumns', () => {
  test('text header in the first cell is not data; rows map to sheet rows', () => {
    const x = column('S', 1, 2, ['Hours', 1, 2, '', 4, true, 6]);
    const y = column('S', 1, 3, ['Sales', 10, 'n/a', 30, 40, 50, 60]);
    expect(dataStart(x)).toBe(1);
    const p = pairColumns(x, y);
    expect(Array.from(p.x)).toEqual([1, 4, 6]);
    expect(Array.from(p.y)).toEqual([10, 40, 60]);
    expect(Array.from(p.rows)).toEqual([2, 5, 7]);
    expect(p.total).toBe(6);
    expect(p.skipped).toBe(3);
    expect(p.xHeader).toBe('Hours');
  });

  test('table columns (header given, data only) start at their first row', () => {
    const x = column('T', 5, 1, [1, 2, 3], 'Visits');
    const y = column('T', 5, 2, [4, 5, 6], 'Spend');
    const p = pairColumns(x, y);
    expect(Array.from(p.rows)).toEqual([5, 6, 7]);
  });

  test('non-finite numbers and null do not count', () => {
    const p = pairColumns(column('S', 2, 1, [1, NaN, Infinity, null, 5]), column('S', 2, 2, [1, 2, 3, 4, 5]));
    expect(Array.from(p.x)).toEqual([1, 5]);
  });

  test('a header that merely looks like a column address still counts as a header', () => {
    const x = column('S', 1, 1, ['<img src=x onerror=alert(1)>', 1, 2, 3]);
    const y = column('S', 1, 2, ['y', 1, 2, 3]);
    const p = pairColumns(x, y);
    expect(p.xHeader).toBe('<img src=x onerror=alert(1)>');
    expect(p.x.length).toBe(3);
  });

  test('refuses different lengths, different start rows and wide reads', () => {
    expect(() => pairColumns(column('S', 2, 1, [1, 2, 3]), column('S', 2, 2, [1, 2]))).toThrow(PairingError);
    expect(() => pairColumns(column('S', 2, 1, [1, 2, 3]), column('S', 3, 2, [1, 2, 3]))).toThrow(/different rows/);
    const wide: ColumnRead = { ...column('S', 2, 1, [1, 2]), values: [[1, 2], [3, 4]] };
    expect(() => pairColumns(wide, column('S', 2, 3, [1, 2]))).toThrow(/more than one column/);
  });
});

describe('readNumericColumn', () => {
  test("uses the host's numeric fast path when it has one, else converts readColumn", async () => {
    const fast: NumericColumnRead = { address: 'S!A2:A3', sheet: 'S', firstRow: 2, column: 1, header: 'h', numbers: Float64Array.of(1, NaN) };
    const calls: string[] = [];
    const base = {
      readColumn: async () => {
        calls.push('readColumn');
        return column('S', 1, 1, ['h', 1, 'x']);
      },
    } as unknown as Workbook;
    const converted = await readNumericColumn(base, { kind: 'range', address: 'S!A1:A3' });
    expect(Array.from(converted.numbers)).toEqual([1, NaN]);
    expect(converted.firstRow).toBe(2);
    const withFast = { ...base, readColumnNumbers: async () => fast } as unknown as Workbook;
    expect(await readNumericColumn(withFast, { kind: 'range', address: 'S!A1:A3' })).toBe(fast);
    expect(calls).toEqual(['readColumn']);
  });
});

describe('completeRows', () => {
  test('keeps rows complete in every column', () => {
    const r = completeRows([Float64Array.of(1, NaN, 3, 4), Float64Array.of(1, 2, NaN, 4), Float64Array.of(1, 2, 3, 4)]);
    expect(r.skipped).toBe(2);
    expect(r.columns.map((c) => Array.from(c))).toEqual([[1, 4], [1, 4], [1, 4]]);
  });
});

test('a column with no numbers at all is named, with what to do', () => {
  const x = column('S', 1, 1, ['Workshop', 'Aldersey', 'Brockwell', '']);
  const y = column('S', 1, 2, ['Mechanics (FTE)', 1, 2, 3]);
  expect(() => pairColumns(x, y)).toThrow('“Workshop” holds no numbers (only text or blanks): pick a column of numbers.');
});

test('the skipped rows are named by their sheet rows, the first twenty of them', () => {
  const x = column('S', 1, 1, ['x', 1, '', 3, 4, 'n/a', 6]);
  const y = column('S', 1, 2, ['y', 1, 2, 3, null, 5, 6]);
  const p = pairColumns(x, y);
  expect(p.skipped).toBe(3);
  // Data from sheet row 2: rows 3 (blank x), 5 (blank y) and 6 (text x).
  expect(Array.from(p.skippedRows)).toEqual([3, 5, 6]);
  const many = column('S', 1, 1, ['x', ...Array.from({ length: 60 }, (_, i) => (i % 2 ? '' : i))]);
  const full = column('S', 1, 2, ['y', ...Array.from({ length: 60 }, (_, i) => i)]);
  const q = pairColumns(many, full);
  expect(q.skipped).toBe(30);
  expect(Array.from(q.skippedRows)).toEqual(Array.from({ length: 20 }, (_, k) => 3 + 2 * k));
});
