import { compareSharedByBootstrap } from './dependent-bootstrap';
import {
  assertComparisonOptions,
  assertOpenUnit,
  assertSampleSize,
  comparablePearson,
  ComparisonOptions,
  ComparisonResult,
  pearsonFisherInterval,
  requireRows,
  zouDifferenceInterval,
} from './comparison';
import { pFromT } from '../correlation/fisher';
import { StatsInputError } from '../types';

/** The three correlations among a shared variable j and two others k and h, all measured on the same n rows. */
export interface SharedVariableCorrelations {
  /** r(j, k): the first correlation compared. */
  rjk: number;
  /** r(j, h): the second correlation compared. */
  rjh: number;
  /** r(k, h): the correlation between the two other variables. */
  rkh: number;
  n: number;
}

/** Determinant of the 3 x 3 correlation matrix; negative means the three values cannot come from one data set. */
export function determinant3(rjk: number, rjh: number, rkh: number): number {
  return 1 - rjk * rjk - rjh * rjh - rkh * rkh + 2 * rjk * rjh * rkh;
}

/**
 * Correlation between the estimates r(j, k) and r(j, h) in large samples (Pearson & Filon 1898, as used by Zou
 * 2007, Psychological Methods 12:399-413, example 2):
 *
 *   c = [(r_kh - r_jk r_jh / 2)(1 - r_jk^2 - r_jh^2 - r_kh^2) + r_kh^3] / [(1 - r_jk^2)(1 - r_jh^2)]
 */
export function sharedEstimateCorrelation(rjk: number, rjh: number, rkh: number): number {
  const num = (rkh - (rjk * rjh) / 2) * (1 - rjk * rjk - rjh * rjh - rkh * rkh) + rkh * rkh * rkh;
  return num / ((1 - rjk * rjk) * (1 - rjh * rjh));
}

/**
 * Compares r(j, k) with r(j, h) measured on the same rows, one variable (j) in common: "does j go with k more
 * than with h?".
 *
 * - p-value: Williams' t as given by Steiger (1980, "Tests for comparing elements of a correlation matrix",
 *   Psychological Bulletin 87:245-251, eq. 7), with n - 3 degrees of freedom:
 *     t = (r_jk - r_jh) sqrt( (n - 1)(1 + r_kh) / (2 (n - 1)/(n - 3) |R| + rbar^2 (1 - r_kh)^3) ),
 *   |R| the determinant of the 3 x 3 correlation matrix and rbar = (r_jk + r_jh)/2.
 * - Interval: Zou (2007), Psychological Methods 12:399-413, from the two Fisher-z intervals and the correlation
 *   c between the two estimates (see sharedEstimateCorrelation).
 *
 * The tail refers to r_jk - r_jh.
 * @throws StatsInputError when a correlation is not strictly inside (-1, 1), n < 4, or the three correlations
 *   are inconsistent (negative determinant).
 * @example compareShared({ rjk: 0.4, rjh: 0.5, rkh: 0.1, n: 103 }, { tail: 'both', level: 0.95 }).test.value // -0.89128 (Steiger 1980, Case A)
 */
export function compareShared(c3: SharedVariableCorrelations, opts: ComparisonOptions): ComparisonResult {
  assertComparisonOptions(opts);
  const { rjk, rjh, rkh, n } = c3;
  assertOpenUnit(rjk, 'r(j, k)');
  assertOpenUnit(rjh, 'r(j, h)');
  assertOpenUnit(rkh, 'r(k, h)');
  assertSampleSize(n, 'n');
  let det = determinant3(rjk, rjh, rkh);
  if (det < -1e-12) {
    throw new StatsInputError('out-of-range', 'these three correlations cannot all hold in one set of data (their matrix is not positive semi-definite)');
  }
  if (det < 0) det = 0; // rounding on data that are exactly collinear
  const rbar = (rjk + rjh) / 2;
  const oneMinus = 1 - rkh;
  const df = n - 3;
  // Steiger (1980), eq. 7.
  const t = (rjk - rjh) * Math.sqrt(((n - 1) * (1 + rkh)) / ((2 * (n - 1) * det) / df + rbar * rbar * oneMinus * oneMinus * oneMinus));
  const c = sharedEstimateCorrelation(rjk, rjh, rkh);
  const level = opts.level;
  return {
    design: 'shared',
    method: 'pearson',
    pMethod: "Williams' t (Steiger 1980, eq. 7)",
    n,
    r1: rjk,
    r2: rjh,
    statistic: rjk - rjh,
    pValue: pFromT(t, df, opts.tail),
    tail: opts.tail,
    interval: zouDifferenceInterval(
      rjk,
      pearsonFisherInterval(rjk, n, level),
      rjh,
      pearsonFisherInterval(rjh, n, level),
      c,
      level,
      'Zou (2007), overlapping correlations, Fisher-z limits',
    ),
    test: { name: 't', value: t, df },
    n1: n,
    n2: n,
    estimateCorrelation: c,
  };
}

/**
 * The same comparison from raw data: r(common, a) - r(common, b), on rows complete in all three columns.
 * @throws StatsInputError when fewer than 4 rows remain, a column is constant, or a pair lies on a straight line.
 */
export function compareSharedSamples(
  common: ArrayLike<number>,
  a: ArrayLike<number>,
  b: ArrayLike<number>,
  opts: ComparisonOptions,
): ComparisonResult {
  const n = common.length;
  if (a.length !== n || b.length !== n) throw new StatsInputError('unequal-length', 'common, a and b must hold the same number of values');
  requireRows(n, 'the data');
  if (opts.method !== undefined && opts.method !== 'pearson') return compareSharedByBootstrap(common, a, b, opts.method, opts);
  return compareShared(
    {
      rjk: comparablePearson(common, a, 'common', 'a'),
      rjh: comparablePearson(common, b, 'common', 'b'),
      rkh: comparablePearson(a, b, 'a', 'b'),
      n,
    },
    opts,
  );
}
