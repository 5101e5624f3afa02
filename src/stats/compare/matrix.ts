/**
 * The correlation matrix of k columns, each pair on its own complete rows (pairwise deletion), with two-sided
 * p-values adjusted across the k(k - 1)/2 distinct pairs.
 */
import { PREDICTION_BUDGET_MS } from '../budget/call-budget';
import { correlate } from '../correlation/correlate';
import { pFromT, tFromR } from '../correlation/fisher';
import { benjaminiHochbergAdjust, holmAdjust } from './p-adjust';
import { assertVaries, clipUnit, pearsonFromMoments } from '../correlation/pearson';
import { averageRanks, rankCoMoments } from '../correlation/ranks';
import { isRobust, Method, METHOD_LABELS, StatsInputError } from '../types';
import { replicatesFor, skippedRedetects } from '../robust/robust';

/** What a matrix cell can show. */
export type MatrixShow = 'coef' | 'pvalue' | 'pvalue_holm' | 'pvalue_fdr' | 'pairs';
export const MATRIX_SHOWS: readonly MatrixShow[] = ['coef', 'pvalue', 'pvalue_holm', 'pvalue_fdr', 'pairs'];

export interface CorrelationMatrix {
  k: number;
  method: Method;
  /** Column names used in messages and headers. */
  names: string[];
  /** k x k, row-major. Diagonal 1. */
  coef: Float64Array;
  /** Two-sided p-values (k x k, symmetric). Diagonal NaN: a variable is not tested against itself. */
  pValue: Float64Array;
  /** Holm (1979) adjusted p-values across the distinct pairs. Diagonal NaN. */
  pHolm: Float64Array;
  /** Benjamini & Hochberg (1995) adjusted p-values across the distinct pairs. Diagonal NaN. */
  pFdr: Float64Array;
  /** Complete rows behind each coefficient. Diagonal: the numbers in that column. */
  pairs: Float64Array;
  /** Number of distinct pairs the adjustments ran across, k(k - 1)/2. */
  tests: number;
  /** What ran. */
  pMethod: string;
}

/**
 * How long a matrix may take, and the cost model that predicts it before any work is done. Figures measured on
 * the project's 2-core machine with today's sort (internal/sort.ts: comparison sort below 64 keys, 11-bit radix
 * passes from 64), through dist/functions.js in plain node 20, best of three calls on two-decimal data, then
 * rounded up (a first call at the limit, compilation included, must stay within the budget):
 * - "linear" pairs (Pearson; Spearman on columns without gaps, ranked once per column): about 10 us per pair
 *   plus 30 ns per row (measured 29 us per pair at 1,000 rows, 104 at 5,000, 357-503 at 20,000, 832-1,007 at
 *   40,000).
 * - "sorted" pairs (Kendall; Spearman on a pair with gaps, ranked per pair): each pair sorts its rows. Below 64
 *   rows about 25 us per pair plus 0.5 us per row (measured 28-45 us); from 64 rows about 40 us plus 0.25 us per
 *   row (measured Kendall: 65 us at 256 rows, 156 at 1,000, 803 at 5,000, 3,313 at 20,000; Spearman with gaps
 *   below that).
 * First calls at the limit (plain node, same machine): Kendall 200 x 50 in 571 ms, 60 x 2,099 in 703 ms,
 * 15 x 37,935 in 813 ms; Pearson 200 x 1,341 in 457 ms, 40 x 42,401 in 729 ms.
 * Timings inside jest (or any vm context, where every global lookup is intercepted) run many times slower than in
 * plain node or a browser, so the figures come from node.
 * The budget is 1 s on that machine: a fifth of the roughly 5 s after which Excel desktop restarts an
 * unresponsive add-in, leaving room for slower computers. maxColumns keeps the answer (maxColumns^2 cells,
 * 40,000 for 200) far below the ~5 MB one custom-function call may return, and readable.
 */
export const MATRIX_LIMITS = {
  maxColumns: 200,
  // The share of a cell call's 1 s that a prediction may use, as for the other costly calls.
  budgetMs: PREDICTION_BUDGET_MS,
};

/** Predicted microseconds for one pair over `rows` rows. */
type CostKind = 'linear' | 'sorted' | 'robust' | 'skipped';

function pairMicroseconds(kind: CostKind, rows: number): number {
  if (kind === 'linear') return 10 + 0.03 * rows;
  // Two sorts and a few passes; the skipped rule projects every row on up to 100 directions, and below
  // about 750 rows re-finds its outliers in each of the bootstrap's resamples (src/stats/robust/robust.ts).
  if (kind === 'robust') return 100 + 0.8 * rows;
  if (kind === 'skipped') {
    const once = 0.02 * rows * Math.min(rows, 100);
    return 100 + (skippedRedetects(rows) ? once * (1 + replicatesFor(rows)) : once + 0.1 * rows * replicatesFor(rows));
  }
  // argsort (internal/sort.ts) sorts by comparison below 64 keys and by 11-bit radix passes from 64 on.
  return rows < 64 ? 25 + 0.5 * rows : 40 + 0.25 * rows;
}

/**
 * Per column and row: reading a cell the host passed as a fresh one-cell array (with the collections its
 * garbage costs), and ranking a gapless column once for Spearman. Measured on a cold call over fresh host arrays
 * at 1,000,000 rows on the two-core bench machine (4 columns: Pearson 0.63-0.99 s, Spearman 1.0-1.1 s; see
 * docs/performance.md).
 */
const READ_US_PER_CELL = 0.2;
const RANK_US_PER_CELL = 0.1;

/**
 * Predicted milliseconds for the given numbers of linear and sorted pairs over `rows` rows of `columns` columns,
 * `rankedColumns` of which are ranked once up front.
 */
export function predictedMatrixMs(linearPairs: number, sortedPairs: number, rows: number, columns: number, rankedColumns = 0): number {
  return (linearPairs * pairMicroseconds('linear', rows) + sortedPairs * pairMicroseconds('sorted', rows) + cellMicroseconds(columns, rankedColumns, rows)) / 1e3;
}

/** Microseconds for reading every cell and ranking `rankedColumns` columns once. */
function cellMicroseconds(columns: number, rankedColumns: number, rows: number): number {
  return columns * rows * READ_US_PER_CELL + rankedColumns * rows * RANK_US_PER_CELL;
}

/** Predicted milliseconds of a whole matrix of one cost kind. */
function matrixMs(columns: number, rows: number, method: Method, kind: CostKind): number {
  const pairs = (columns * (columns - 1)) / 2;
  return (pairs * pairMicroseconds(kind, rows) + cellMicroseconds(columns, method === 'spearman' ? columns : 0, rows)) / 1e3;
}

function tooLarge(columns: number, rows: number, method: Method, kind: CostKind): StatsInputError {
  // Largest row count within budget for this many columns (cost rises with rows: bisection).
  let lo = 0;
  let hi = rows;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (matrixMs(columns, mid, method, kind) <= MATRIX_LIMITS.budgetMs) lo = mid;
    else hi = mid;
  }
  const name = METHOD_LABELS[method].name;
  return new StatsInputError(
    'too-large',
    `a ${name} matrix of ${columns} columns and ${rows.toLocaleString('en-US')} rows is too much to compute promptly: ` +
      (lo >= 3 ? `with ${columns} columns use at most ${lo.toLocaleString('en-US')} rows, or fewer columns` : 'use fewer columns'),
  );
}

/**
 * Refuses, before any cell is read, a matrix too large to answer promptly. Looks only at the dimensions and
 * assumes the cheapest case (Spearman on columns without gaps); correlationMatrix checks again once it knows
 * where the gaps are.
 * @throws StatsInputError('too-large') saying how far the request may go.
 */
export function assertMatrixFits(columns: number, rows: number, method: Method): void {
  if (columns > MATRIX_LIMITS.maxColumns) {
    throw new StatsInputError(
      'too-large',
      `${columns.toLocaleString('en-US')} columns is too many for one matrix: at most ${MATRIX_LIMITS.maxColumns} (select fewer columns)`,
    );
  }
  const kind = costKind(method);
  if (matrixMs(columns, rows, method, kind) > MATRIX_LIMITS.budgetMs) throw tooLarge(columns, rows, method, kind);
}

function costKind(method: Method): CostKind {
  if (method === 'kendall') return 'sorted';
  if (method === 'skipped') return 'skipped';
  if (isRobust(method)) return 'robust';
  return 'linear';
}

/** Pearson-type p-value text per method, for the result's pMethod. */
const P_METHOD: Record<Method, string> = {
  pearson: 't test, df = n - 2, two-sided',
  spearman: 't approximation, df = n - 2, two-sided',
  kendall: 'exact null distribution of S without ties and n < 50, else normal approximation; two-sided',
  percentage_bend: 't test, df = n - 2, two-sided (Wilcox 1994)',
  winsorized: 't test, df = n - 2g - 2, two-sided (Wilcox 1993)',
  biweight: 't test, df = n - 2, two-sided',
  skipped: 'bootstrap share of resamples beyond 0 with outliers re-found in each (t test on kept rows above about 750 rows), two-sided',
  polychoric: 'likelihood-ratio test of rho = 0, two-sided',
  polyserial: 'likelihood-ratio test of rho = 0, two-sided',
};

/** One pair's coefficient and two-sided p-value. */
interface PairAnswer {
  r: number;
  p: number;
}

/**
 * Spearman's coefficient and p-value from ranks, the same computation as correlate's Spearman branch (Pearson's
 * r of average ranks, t approximation with n - 2 df); used so that a column without gaps is ranked once, not once
 * per pair. test/unit/stats/compare/matrix.test.ts holds the two paths equal.
 */
function spearmanFromRanks(rx: ArrayLike<number>, ry: ArrayLike<number>): PairAnswer {
  const m = rankCoMoments(rx, ry);
  assertVaries(m);
  const r = clipUnit(pearsonFromMoments(m));
  const df = rx.length - 2;
  return { r, p: pFromT(tFromR(r, df), df, 'both') };
}

/**
 * The matrix. `columns` hold NaN where a cell does not count; each pair uses the rows where both are numbers.
 * - Coefficients and p-values as for one correlation (see correlate: t test for Pearson, t approximation for
 *   Spearman, exact or normal for Kendall), always two-sided.
 * - Adjusted p-values: Holm (1979) and Benjamini & Hochberg (1995) across the k(k - 1)/2 distinct pairs.
 * @throws StatsInputError for fewer than 2 columns, a matrix too large (see assertMatrixFits), or a pair with
 *   fewer than 3 shared rows or a column constant on its shared rows (the message names both columns).
 */
export function correlationMatrix(columns: ArrayLike<number>[], method: Method, names?: string[]): CorrelationMatrix {
  const k = columns.length;
  if (k < 2) throw new StatsInputError('too-few', 'a correlation matrix needs at least 2 columns');
  const rows = columns[0].length;
  if (columns.some((c) => c.length !== rows)) throw new StatsInputError('unequal-length', 'every column must hold the same number of rows');
  assertMatrixFits(k, rows, method);
  const label = names ?? columns.map((_, i) => `column ${i + 1}`);
  const coef = new Float64Array(k * k);
  const pValue = new Float64Array(k * k).fill(NaN);
  const pHolm = new Float64Array(k * k).fill(NaN);
  const pFdr = new Float64Array(k * k).fill(NaN);
  const pairs = new Float64Array(k * k);
  const tests = (k * (k - 1)) / 2;
  let gapless = 0;
  for (let i = 0; i < k; i++) {
    let count = 0;
    for (let r = 0; r < rows; r++) if (columns[i][r] === columns[i][r]) count++;
    coef[i * k + i] = 1;
    pairs[i * k + i] = count;
    if (count === rows) gapless++;
  }
  // Now that the gaps are known: Spearman pairs with a gap are ranked per pair and cost like Kendall.
  if (method === 'spearman') {
    const linearPairs = (gapless * (gapless - 1)) / 2;
    if (predictedMatrixMs(linearPairs, tests - linearPairs, rows, k, gapless) > MATRIX_LIMITS.budgetMs) {
      throw tooLarge(k, rows, method, 'sorted');
    }
  }
  const ranks: (Float64Array | null)[] = columns.map((c, i) =>
    method === 'spearman' && pairs[i * k + i] === rows ? averageRanks(c) : null,
  );
  const raw = new Float64Array(tests);
  const bufX = new Float64Array(rows);
  const bufY = new Float64Array(rows);
  let t = 0;
  for (let i = 0; i < k; i++) {
    const a = columns[i];
    for (let j = i + 1; j < k; j++) {
      const b = columns[j];
      let answer: PairAnswer;
      let m = rows;
      try {
        const ra = ranks[i];
        const rb = ranks[j];
        if (ra && rb) {
          answer = spearmanFromRanks(ra, rb);
        } else {
          m = 0;
          for (let r = 0; r < rows; r++) {
            const u = a[r];
            const v = b[r];
            if (u === u && v === v) {
              bufX[m] = u;
              bufY[m] = v;
              m++;
            }
          }
          if (m < 3) {
            throw new StatsInputError(
              'too-few',
              `${label[i]} and ${label[j]} share only ${m} row${m === 1 ? '' : 's'} with numbers in both: each pair needs at least 3`,
            );
          }
          const x = bufX.subarray(0, m);
          const y = bufY.subarray(0, m);
          const res = correlate(x, y, { method, tail: 'both', level: 0.95, interval: 'none' });
          answer = { r: res.statistic, p: res.pValue };
        }
      } catch (e) {
        if (e instanceof StatsInputError && e.code === 'constant') {
          throw new StatsInputError('constant', `${label[i]} and ${label[j]}: one of them is constant on the rows they share, so they have no correlation`);
        }
        throw e;
      }
      coef[i * k + j] = coef[j * k + i] = answer.r;
      pValue[i * k + j] = pValue[j * k + i] = answer.p;
      pairs[i * k + j] = pairs[j * k + i] = m;
      raw[t++] = answer.p;
    }
  }
  const holm = holmAdjust(raw);
  const fdr = benjaminiHochbergAdjust(raw);
  t = 0;
  for (let i = 0; i < k; i++) {
    for (let j = i + 1; j < k; j++) {
      pHolm[i * k + j] = pHolm[j * k + i] = holm[t];
      pFdr[i * k + j] = pFdr[j * k + i] = fdr[t];
      t++;
    }
  }
  return { k, method, names: label, coef, pValue, pHolm, pFdr, pairs, tests, pMethod: P_METHOD[method] };
}
