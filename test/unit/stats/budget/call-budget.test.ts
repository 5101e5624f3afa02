/**
 * The time budget of the costly cell functions: past the rows that fit, the call is refused before the work,
 * with the rows that would fit and what to use instead; within them it runs. The per-row costs are this
 * project's own measurements (docs/performance.md, from test/unit/properties/support/time-budget-child.js at
 * 1,000,000 rows), so this checks the rule's arithmetic and wiring, not a reference value.
 */
import { assertWithinBudget, rowsWithinBudget } from '../../../../src/stats/budget/call-budget';
import { StatsInputError } from '../../../../src/stats/types';
import { DIFF_GROUPS, DIFF_SHARED } from '../../../../src/functions/fn-compare';
import { REPORT } from '../../../../src/functions/fn-checks';

beforeAll(() => {
  class HostError {
    constructor(public code: string, public message: string) {}
  }
  (globalThis as any).CustomFunctions = { Error: HostError, ErrorCode: { invalidValue: '#VALUE!', notAvailable: '#N/A', invalidNumber: '#NUM!', divisionByZero: '#DIV/0!', nullReference: '#NULL!' } };
});

test('the rows that fit: a round figure per call, none for a Pearson comparison', () => {
  expect(rowsWithinBudget('comparison', 'spearman')).toBe(700000);
  expect(rowsWithinBudget('comparison', 'skipped')).toBe(700000);
  expect(rowsWithinBudget('comparison', 'pearson')).toBe(Infinity);
  expect(rowsWithinBudget('sensitivity', 'pearson')).toBe(560000);
  expect(rowsWithinBudget('report', 'kendall')).toBe(600000);
});

test('refused past the limit with the rows that fit and the ways on; answered at the limit', () => {
  expect(() => assertWithinBudget('report', 'pearson', 600000, 600000)).not.toThrow();
  let err: unknown;
  try {
    assertWithinBudget('report', 'pearson', 1_000_000, 1_000_000);
  } catch (e) {
    err = e;
  }
  expect(err).toBeInstanceOf(StatsInputError);
  expect((err as StatsInputError).code).toBe('too-large');
  expect((err as Error).message).toBe(
    'the full report (the checks, the alternatives and the verdict) on 1,000,000 rows would take about 1.4 s, more than a cell function may take (1 s, so the workbook is not held up): up to 600,000 rows fit. Use a shorter range (a random sample of the rows), use COEF, INTERVAL and CHECKS, which answer at this length, or the Covary panel, which reads and computes any length in the background',
  );
  // Two coefficients on the same rows count twice: 350,000 rows fit a comparison that shares a column.
  expect(() => assertWithinBudget('comparison', 'kendall', 2 * 350000, 350000)).not.toThrow();
  expect(() => assertWithinBudget('comparison', 'kendall', 2 * 360000, 360000)).toThrow(/comparing two Kendall correlations on 360,000 rows .* up to 350,000 rows fit\. .*compare by "pearson"/);
  expect(() => assertWithinBudget('comparison', 'pearson', 2e7, 1e7)).not.toThrow();
});

const column = (n: number, f: (i: number) => number) => Array.from({ length: n }, (_, i) => [f(i)]);

test('the cell functions refuse before the work, and a Pearson comparison of the same rows is answered', () => {
  const n = 400000;
  const c = column(n, (i) => (i * 7919) % 1000);
  const a = column(n, (i) => ((i * 7919) % 1000) + ((i * 104729) % 300));
  const b = column(n, (i) => (i * 15485863) % 977);
  expect(() => DIFF_SHARED(c, a, b, undefined, undefined, 'spearman')).toThrow(/comparing two Spearman correlations on 400,000 rows .* up to 350,000 rows fit/);
  expect(() => DIFF_GROUPS(c, a, b, c, undefined, undefined, 'winsorized')).toThrow(/on 800,000 rows .* up to 700,000 rows fit/);
  const row = DIFF_SHARED(c, a, b) as number[][];
  expect(row[0]).toHaveLength(4);
  expect(row[0][0]).toBeGreaterThan(0.5);
  expect(() => REPORT(column(700000, (i) => i % 97), column(700000, (i) => (i * 31) % 89))).toThrow(/full report .* on 700,000 rows .* up to 600,000 rows fit/);
});

test('a partial correlation counts every column it reads: three controls fit 650,000 rows, one control any sheet', () => {
  expect(() => assertWithinBudget('partial', 'pearson', 5 * 650000, 650000)).not.toThrow();
  expect(() => assertWithinBudget('partial', 'pearson', 5 * 1_000_000, 1_000_000)).toThrow(
    /^a partial correlation with 3 control columns on 1,000,000 rows would take about 1\.3 s, .* up to 650,000 rows fit\. Use a shorter range \(a random sample of the rows\), fewer control columns, or the Covary panel/,
  );
  expect(() => assertWithinBudget('partial', 'pearson', 3 * 1_048_576, 1_048_576)).not.toThrow();
});
