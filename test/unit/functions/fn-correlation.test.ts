/**
 * The cell functions of one correlation, called as Excel calls them (2-D arrays, null for omitted arguments).
 * Expected numbers come from R 4.2.2 cor.test on the Hollander & Wolfe (1973) data (R's ?cor.test example,
 * test/references.md) and from the R fixture in test/fixtures/correlation.
 */
import { COEF, INTERVAL, PAIRS, PVALUE, REPORTED } from '../../../src/functions/fn-correlation';
import { expectRel } from '../../helpers/close';
import { cellError } from '../../helpers/cell-error';

const HW_X = [44.4, 45.9, 41.9, 53.3, 44.7, 44.1, 50.7, 45.2, 60.1];
const HW_Y = [2.6, 3.1, 2.5, 5.0, 3.6, 4.0, 5.2, 2.8, 3.8];
const col = (v: unknown[]) => v.map((a) => [a]);
const row = (v: unknown[]) => [v];

describe('answers (R cor.test, Hollander & Wolfe data)', () => {
  test('COEF, INTERVAL, PVALUE, PAIRS with defaults', () => {
    expectRel(COEF(col(HW_X), col(HW_Y)), 0.571181557563829, 1e-9);
    const [[lo, hi]] = INTERVAL(col(HW_X), col(HW_Y), null as unknown as number, null as unknown as string);
    expectRel(lo, -0.1497426, 1e-6);
    expectRel(hi, 0.8955795, 1e-6);
    expectRel(PVALUE(col(HW_X), col(HW_Y)), 0.108173054349494, 1e-6);
    expect(PAIRS(col(HW_X), col(HW_Y))).toBe(9);
  });

  test('method and tail words, case-insensitive', () => {
    expectRel(COEF(col(HW_X), col(HW_Y), 'Kendall'), 0.4444444444444444, 1e-9);
    expectRel(COEF(col(HW_X), col(HW_Y), 'SPEARMAN'), 0.6, 1e-12);
    expectRel(PVALUE(col(HW_X), col(HW_Y), 'positive'), 0.0540865271747469, 1e-6);
    expectRel(PVALUE(col(HW_X), col(HW_Y), 'positive', 'kendall'), 0.0597194664903, 1e-9);
  });

  test('a row pairs with a column of the same length', () => {
    expectRel(COEF(row(HW_X), col(HW_Y)), 0.571181557563829, 1e-9);
  });

  test('REPORTED reproduces the raw-data interval and p from r and n', () => {
    const [[lo, hi, p]] = REPORTED(0.571181557563829, 9);
    expectRel(lo, -0.1497426, 1e-6);
    expectRel(hi, 0.8955795, 1e-6);
    expectRel(p, 0.108173054349494, 1e-6);
  });
});

describe('which cells count', () => {
  test('blank (null, ""), text, booleans and non-finite cells are skipped pairwise', () => {
    const x = [...HW_X, null, '', 'n/a', true, 5];
    const y = [...HW_Y, 3, 4, 4, 2, undefined];
    expect(PAIRS(col(x), col(y))).toBe(9);
    expectRel(COEF(col(x), col(y)), 0.571181557563829, 1e-9);
  });
  test('booleans are not numbers: TRUE/FALSE rows are skipped, as with spreadsheet statistics over ranges', () => {
    expect(PAIRS(col([1, 2, 3, true, false]), col([2, 1, 4, 1, 0]))).toBe(3);
  });
});

describe('bad input: host errors with messages a spreadsheet user understands', () => {
  test('unequal sizes', () => {
    const e = cellError(() => COEF(col([1, 2, 3]), col([1, 2])));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toMatch(/same number of cells \(3 and 2\)/);
  });
  test('a block that is neither a row nor a column', () => {
    expect(cellError(() => COEF([[1, 2], [3, 4]], [[1, 2], [3, 4]])).message).toMatch(/single column or a single row/);
  });
  test('fewer than 3 usable pairs gives #N/A', () => {
    const e = cellError(() => COEF(col([1, 2, null]), col([1, 2, 3])));
    expect(e.code).toBe('#N/A');
    expect(e.message).toMatch(/only 2 usable pairs/);
  });
  test('a constant column', () => {
    expect(cellError(() => COEF(col([1, 1, 1, 1]), col([1, 2, 3, 4]))).message).toBe('x is constant: a correlation needs variation in both columns');
    expect(cellError(() => PVALUE(col([1, 2, 3, 4]), col([7, 7, 7, 7]))).message).toMatch(/^y is constant/);
  });
  test('unknown method or tail', () => {
    expect(cellError(() => COEF(col(HW_X), col(HW_Y), 'pearsn')).message).toMatch(/method must be one of "pearson", "spearman", "kendall"/);
    expect(cellError(() => PVALUE(col(HW_X), col(HW_Y), 'up')).message).toMatch(/tail must be one of "both", "positive", "negative"/);
  });
  test('level outside (0, 1)', () => {
    expect(cellError(() => INTERVAL(col(HW_X), col(HW_Y), 95)).message).toMatch(/level must be between 0 and 1/);
    expect(cellError(() => INTERVAL(col(HW_X), col(HW_Y), 0)).message).toMatch(/level must be between 0 and 1/);
    expect(cellError(() => REPORTED(0.3, 50, 1)).message).toMatch(/level must be between 0 and 1/);
  });
  test('REPORTED: |r| >= 1 or n < 4', () => {
    expect(cellError(() => REPORTED(1, 30)).message).toMatch(/r must lie strictly between -1 and 1/);
    expect(cellError(() => REPORTED(-1.2, 30)).message).toMatch(/r must lie strictly between -1 and 1/);
    expect(cellError(() => REPORTED(0.5, 3)).message).toMatch(/n must be a whole number of at least 4/);
    expect(cellError(() => REPORTED(0.5, 10.5)).message).toMatch(/n must be a whole number/);
  });
  test('an interval needs 4 pairs (5 for Kendall)', () => {
    expect(cellError(() => INTERVAL(col([1, 2, 3]), col([1, 3, 2]))).message).toMatch(/an interval needs at least 4/);
    expect(cellError(() => INTERVAL(col([1, 2, 3, 4]), col([1, 3, 2, 4]), 0.95, 'kendall')).message).toMatch(/at least 5/);
  });
  test('perfect correlation: r = 1, p = 0, interval [1, 1], no NaN or Infinity', () => {
    expect(COEF(col([1, 2, 3, 4]), col([2, 4, 6, 8]))).toBe(1);
    expect(PVALUE(col([1, 2, 3, 4]), col([2, 4, 6, 8]))).toBe(0);
    expect(INTERVAL(col([1, 2, 3, 4]), col([2, 4, 6, 8]))).toEqual([[1, 1]]);
  });
});

describe('blanks that a host passes as 0', () => {
  test('a whole-column reference whose empty tail arrives as zeros is refused with a message, not answered', () => {
    const x = [...HW_X, ...new Array(5000).fill(0)];
    const y = [...HW_Y, ...new Array(5000).fill(0)];
    const e = cellError(() => COEF(col(x), col(y)));
    expect(e.code).toBe('#VALUE!');
    expect(e.message).toMatch(/last 5000 rows of x and y are all 0: these look like empty cells/);
  });
  test('the same tail as null (Excel on the web) is simply skipped', () => {
    const x = [...HW_X, ...new Array(5000).fill(null)];
    const y = [...HW_Y, ...new Array(5000).fill(null)];
    expectRel(COEF(col(x), col(y)), 0.571181557563829, 1e-9);
  });
  test('a few genuine (0, 0) rows still count', () => {
    expect(PAIRS(col([...HW_X, 0, 0]), col([...HW_Y, 0, 0]))).toBe(11);
  });
});
