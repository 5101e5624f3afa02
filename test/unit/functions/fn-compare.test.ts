/**
 * The comparison, partial-correlation and matrix cell functions, called as Excel calls them (2-D arrays, null for
 * omitted arguments, "" for blank cells). Expected numbers come from R 4.2.2 with psych 2.2.9
 * (test/fixtures/compare/compare-r.json) and from Zou (2007) as listed in test/references.md.
 */
import { DIFF_GROUPS, DIFF_REPORTED, DIFF_SEPARATE, DIFF_SHARED, MATRIX, PARTIAL } from '../../../src/functions/fn-compare';
import { expectRel } from '../../helpers/close';
import { cellColumn, expectAbs, R } from '../stats/compare/fixtures';
import { cellError } from '../../helpers/cell-error';

const N = R.data.north;
const S = R.data.south;
const col = (v: unknown[]) => v.map((a) => [a]);
const omit = null as unknown as number;
const omitText = null as unknown as string;

function expectRow(row: unknown[][], ref: { lower: number; upper: number; p_both: number }, diff: number): void {
  expect(row.length).toBe(1);
  expect(row[0].length).toBe(4);
  const [d, lo, hi, p] = row[0] as number[];
  expectRel(d, diff, 1e-12);
  expectAbs(lo, ref.lower, 1e-9);
  expectAbs(hi, ref.upper, 1e-9);
  expectRel(p, ref.p_both, 1e-6);
}

describe('DIFF_GROUPS', () => {
  test('north against south from cells with blanks (R cor.test + psych::r.test)', () => {
    const row = DIFF_GROUPS(cellColumn(N.tenure), cellColumn(N.performance), cellColumn(S.tenure), cellColumn(S.performance));
    expectRow(row, R.groups, R.groups.r1 - R.groups.r2);
    const one = DIFF_GROUPS(cellColumn(N.tenure), cellColumn(N.performance), cellColumn(S.tenure), cellColumn(S.performance), omit, 'Positive');
    expectRel(one[0][3] as number, R.groups.p_positive, 1e-6);
  });

  test('bad input', () => {
    const x = col([1, 2, 3, 4, 5]);
    const y = col([2, 1, 4, 3, 6]);
    const few = cellError(() => DIFF_GROUPS(x, y, col([1, 2, 3]), col([3, 1, 2])));
    expect(few.code).toBe('#N/A');
    expect(few.message).toMatch(/second group has only 3 usable rows/);
    expect(cellError(() => DIFF_GROUPS(x, col([1, 2]), x, y)).message).toMatch(/x1 and y1 must hold the same number of cells/);
    expect(cellError(() => DIFF_GROUPS(x, y, x, y, 1.5)).message).toMatch(/level must be between 0 and 1/);
    expect(cellError(() => DIFF_GROUPS(x, y, x, y, omit, 'up')).message).toMatch(/tail must be one of/);
    expect(cellError(() => DIFF_GROUPS(x, col([4, 4, 4, 4, 4]), x, y)).message).toMatch(/y1 is constant/);
    expect(cellError(() => DIFF_GROUPS(x, x, x, y)).message).toMatch(/x1 and y1 lie exactly on a straight line/);
    expect(cellError(() => DIFF_GROUPS([[1, 2], [3, 4]], [[1, 2], [3, 4]], x, y)).message).toMatch(/single column or a single row/);
  });
});

describe('DIFF_SHARED', () => {
  test('performance with tenure against performance with the test score, blanks skipped (R)', () => {
    const row = DIFF_SHARED(cellColumn(N.performance), cellColumn(N.tenure), cellColumn(N.test));
    expectRow(row, R.shared, R.shared.rjk - R.shared.rjh);
    const neg = DIFF_SHARED(cellColumn(N.performance), cellColumn(N.tenure), cellColumn(N.test), 0.95, 'negative');
    expectRel(neg[0][3] as number, R.shared.p_negative, 1e-6);
  });

  test('bad input', () => {
    const c = col([1, 2, 3, 4, 5]);
    expect(cellError(() => DIFF_SHARED(c, col([1, 2, 3, 4]), c)).message).toMatch(/common, a, b must hold the same number of cells \(common has 5, a has 4\)/);
    const few = cellError(() => DIFF_SHARED(col([1, 2, 3, '', 5]), col([2, 1, '', 4, 3]), col([5, 3, 4, 1, 2])));
    expect(few.code).toBe('#N/A');
    expect(few.message).toMatch(/only 3 usable rows/);
    expect(cellError(() => DIFF_SHARED(c, col([2, 1, 4, 3, 6]), col([2, 1, 4, 3, 6]))).message).toMatch(/a and b lie exactly on a straight line/);
    expect(cellError(() => DIFF_SHARED(c, col([7, 7, 7, 7, 7]), col([2, 1, 4, 3, 6]))).message).toMatch(/a is constant/);
  });
});

describe('DIFF_SEPARATE', () => {
  test('tenure-performance against test-training, blanks skipped (R)', () => {
    const row = DIFF_SEPARATE(cellColumn(N.tenure), cellColumn(N.performance), cellColumn(N.test), cellColumn(N.training));
    expectRow(row, R.separate, R.separate.rjk - R.separate.rhm);
  });

  test('bad input', () => {
    const a = col([1, 2, 3, 4, 5]);
    const b = col([2, 1, 4, 3, 6]);
    expect(cellError(() => DIFF_SEPARATE(a, b, a, col([1, 2, 3]))).message).toMatch(/d has 3/);
    expect(cellError(() => DIFF_SEPARATE(col([1, 2, 3]), col([2, 1, 3]), col([3, 1, 2]), col([1, 3, 2]))).code).toBe('#N/A');
    expect(cellError(() => DIFF_SEPARATE(a, b, col([1, 1, 1, 1, 1]), b)).message).toMatch(/c is constant/);
  });
});

describe('DIFF_REPORTED', () => {
  test('Zou (2007) example 1 (.49, 145) against (.36, 87) -> (-.087, .359); R for the digits', () => {
    // [printed: Zou 2007 via cocor tests, test/references.md] and R (compare-r.json, published.zou_independent)
    const ref = R.published.zou_independent;
    const row = DIFF_REPORTED(0.49, 145, 0.36, 87);
    expectRow(row, ref, 0.49 - 0.36);
    expectAbs(row[0][1] as number, -0.087, 0.0005);
    expectAbs(row[0][2] as number, 0.359, 0.0005);
    const ninety = DIFF_REPORTED(0.49, 145, 0.36, 87, 0.9, 'both');
    expectAbs(ninety[0][1] as number, R.published.zou_independent_90.lower, 1e-9);
  });

  test('bad input', () => {
    expect(cellError(() => DIFF_REPORTED(1, 50, 0.3, 50)).message).toMatch(/r1 must lie strictly between -1 and 1/);
    expect(cellError(() => DIFF_REPORTED(0.2, 3, 0.3, 50)).message).toMatch(/n1 must be a whole number of at least 4/);
    expect(cellError(() => DIFF_REPORTED(0.2, 30.5, 0.3, 50)).message).toMatch(/n1 must be a whole number/);
    expect(cellError(() => DIFF_REPORTED(0.2, 'ten' as unknown as number, 0.3, 50)).message).toMatch(/n1 must be a number/);
    expect(cellError(() => DIFF_REPORTED(null as unknown as number, 30, 0.3, 50)).message).toMatch(/r1 must be a number/);
    expect(cellError(() => DIFF_REPORTED(0.2, 30, 0.3, 50, 0)).code).toBe('#VALUE!');
  });
});

describe('PARTIAL', () => {
  test('tenure and performance controlling for seniority, and for seniority and training (R residuals)', () => {
    const one = PARTIAL(cellColumn(N.tenure), cellColumn(N.performance), cellColumn(N.seniority));
    const ref1 = R.partial.one;
    expectRel(one[0][0] as number, ref1.r, 1e-9);
    expectAbs(one[0][1] as number, ref1.lower, 1e-9);
    expectAbs(one[0][2] as number, ref1.upper, 1e-9);
    expectRel(one[0][3] as number, ref1.p_both, 1e-6);
    const two = PARTIAL(
      cellColumn(N.tenure),
      cellColumn(N.performance),
      N.seniority.map((s, i) => [s === null ? '' : s, N.training[i] === null ? '' : N.training[i]]),
      omit,
      'positive',
    );
    expectRel(two[0][0] as number, R.partial.two.r, 1e-9);
    expectRel(two[0][3] as number, R.partial.two.p_positive, 1e-6);
  });

  test('row-oriented data: x and y as rows, each control a row', () => {
    const row = (v: (number | null)[]) => [v.map((a) => (a === null ? '' : a))];
    const res = PARTIAL(row(N.tenure), row(N.performance), [N.seniority, N.training].map((v) => v.map((a) => (a === null ? '' : a))));
    expectRel(res[0][0] as number, R.partial.two.r, 1e-9);
    expectRel(PARTIAL(row(N.tenure), row(N.performance), row(N.seniority))[0][0] as number, R.partial.one.r, 1e-9);
  });

  test('bad input', () => {
    const x = col([1, 2, 3, 4, 5, 6]);
    const y = col([2, 1, 4, 3, 6, 5]);
    expect(cellError(() => PARTIAL(x, y, col([1, 2, 3, 4, 5]))).message).toMatch(/controls must line up with x: x has 6 rows, controls has 5/);
    expect(cellError(() => PARTIAL([[1, 2, 3, 4, 5, 6]], [[2, 1, 4, 3, 6, 5]], [[1, 2, 3]])).message).toMatch(/each control must be a row of 6/);
    expect(cellError(() => PARTIAL(x, col([1, 2]), x)).message).toMatch(/x and y must hold the same number of cells/);
    const few = cellError(() => PARTIAL(col([1, 2, 3, 4, 5]), col([2, 1, 4, 3, 5]), [[1, 2], [2, 1], [3, 3], [1, 2], [5, 2]]));
    expect(few.code).toBe('#N/A');
    expect(few.message).toMatch(/with 2 control columns a partial correlation needs at least 6/);
    expect(cellError(() => PARTIAL(x, y, col([3, 3, 3, 3, 3, 3]))).message).toMatch(/control column is constant/);
    expect(cellError(() => PARTIAL(x, y, col([2, 4, 6, 8, 10, 12]))).message).toMatch(/x is fully explained by the controls/);
    expect(cellError(() => PARTIAL(x, y, x, 95)).message).toMatch(/level must be between 0 and 1/);
    expect(cellError(() => PARTIAL(x, y, [] as unknown as any[][])).message).toMatch(/controls must be a range of cells/);
  });
});

describe('MATRIX', () => {
  const names = ['tenure', 'test', 'performance', 'seniority', 'training'] as const;
  const block = N.tenure.map((_, i) => names.map((c) => (N[c][i] === null ? '' : N[c][i])));
  const withHeader = [[...names], ...block];

  test('coefficients with headers (R cor.test, pairwise-complete rows)', () => {
    const out = MATRIX(withHeader, 'pearson', 'coef', true);
    expect(out.length).toBe(6);
    expect(out[0]).toEqual(['', ...names]);
    for (let i = 0; i < 5; i++) {
      expect(out[i + 1][0]).toBe(names[i]);
      for (let j = 0; j < 5; j++) expectRel(out[i + 1][j + 1] as number, R.matrix.pearson.coef[i][j], 1e-9);
    }
  });

  test.each([
    ['pvalue', 'p'],
    ['pvalue_holm', 'holm'],
    ['pvalue_fdr', 'fdr'],
  ] as const)('show "%s" with the empty-looking diagonal (R p.adjust)', (show, key) => {
    for (const method of ['pearson', 'spearman', 'kendall'] as const) {
      const out = MATRIX(block, method, show);
      expect(out.length).toBe(5);
      for (let i = 0; i < 5; i++) {
        for (let j = 0; j < 5; j++) {
          if (i === j) expect(out[i][j]).toBe('');
          else expectRel(out[i][j] as number, R.matrix[method][key][i][j] as number, 1e-6, `${method} ${show} [${i},${j}]`);
        }
      }
    }
  });

  test('show "pairs": rows used per pair, numbers in the column on the diagonal (R)', () => {
    const out = MATRIX(block, omitText, 'PAIRS');
    expect(out).toEqual(R.matrix.pearson.pairs);
  });

  test('nothing null in any answer (a null would show as 0)', () => {
    for (const show of ['coef', 'pvalue', 'pvalue_holm', 'pvalue_fdr', 'pairs']) {
      for (const row of MATRIX(withHeader, 'spearman', show, true)) for (const v of row) expect(v === null || v === undefined).toBe(false);
    }
  });

  test('bad input', () => {
    expect(cellError(() => MATRIX(block, 'pearson', 'r')).message).toMatch(/show must be one of "coef", "pvalue", "pvalue_holm", "pvalue_fdr", "pairs"/);
    expect(cellError(() => MATRIX(block, 'tau')).message).toMatch(/method must be one of/);
    expect(cellError(() => MATRIX(block, omitText, omitText, 'yes' as unknown as boolean)).message).toMatch(/headers must be TRUE or FALSE/);
    expect(cellError(() => MATRIX(col([1, 2, 3, 4]))).message).toMatch(/at least 2 columns/);
    const sparse = [[1, ''], [2, ''], [3, 5], [4, 6]];
    const few = cellError(() => MATRIX(sparse));
    expect(few.code).toBe('#N/A');
    expect(few.message).toMatch(/column 1 and column 2 share only 2 rows/);
    expect(cellError(() => MATRIX([['a', 'b'], [1, 3], [2, 3], [3, 3]], omitText, omitText, true)).message).toMatch(/a and b: one of them is constant/);
    const zeros = [[1, 2], [2, 1], [3, 4], ...Array.from({ length: 120 }, () => [0, 0])];
    expect(cellError(() => MATRIX(zeros)).message).toMatch(/last 120 rows of data are all 0/);
    expect(cellError(() => MATRIX([[1, 2], [3]])).message).toMatch(/rectangular/);
  });
});
