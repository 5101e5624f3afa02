import { compareSeparateByBootstrap } from './dependent-bootstrap';
import {
  assertComparisonOptions,
  assertClosedUnit,
  assertOpenUnit,
  assertSampleSize,
  comparablePearson,
  ComparisonOptions,
  ComparisonResult,
  pearsonFisherInterval,
  requireRows,
  zouDifferenceInterval,
} from './comparison';
import { fisherZ, pFromZ } from '../correlation/fisher';
import { StatsInputError } from '../types';

/** The six correlations among four variables j, k, h, m measured on the same n rows; r(j, k) is compared with r(h, m). */
export interface SeparatePairsCorrelations {
  rjk: number;
  rhm: number;
  rjh: number;
  rjm: number;
  rkh: number;
  rkm: number;
  n: number;
}

/**
 * Large-sample covariance of r(j, k) and r(h, m), times n (Pearson & Filon 1898; Steiger 1980, Psychological
 * Bulletin 87:245-251, eq. 3), with the values `rjk` and `rhm` supplied by the caller (sample or pooled):
 *
 *   psi = 1/2 r_jk r_hm (r_jh^2 + r_jm^2 + r_kh^2 + r_km^2) + r_jh r_km + r_jm r_kh
 *         - (r_jk r_jh r_jm + r_jk r_kh r_km + r_jh r_kh r_hm + r_jm r_km r_hm)
 */
export function pearsonFilonPsi(rjk: number, rhm: number, c: SeparatePairsCorrelations): number {
  const { rjh, rjm, rkh, rkm } = c;
  return (
    0.5 * rjk * rhm * (rjh * rjh + rjm * rjm + rkh * rkh + rkm * rkm) +
    rjh * rkm +
    rjm * rkh -
    (rjk * rjh * rjm + rjk * rkh * rkm + rjh * rkh * rhm + rjm * rkm * rhm)
  );
}

/**
 * Compares r(j, k) with r(h, m) measured on the same rows with no variable in common: "is this pair more closely
 * linked than that pair, in the same data?".
 *
 * - p-value: Steiger's (1980) Z with the pooled correlation (Psychological Bulletin 87:245-251, eqs. 14-15):
 *     Z = sqrt(n - 3) (atanh r_jk - atanh r_hm) / sqrt(2 - 2 s),  s = psi(rbar, rbar) / (1 - rbar^2)^2,
 *   rbar = (r_jk + r_hm)/2 taking the place of both compared correlations under the null hypothesis.
 * - Interval: Zou (2007), Psychological Methods 12:399-413, from the two Fisher-z intervals and the correlation
 *   between the estimates c = psi(r_jk, r_hm) / ((1 - r_jk^2)(1 - r_hm^2)), sample values unpooled.
 *
 * The tail refers to r_jk - r_hm.
 * @throws StatsInputError when a correlation is not strictly inside (-1, 1), n < 4, or the six correlations are
 *   inconsistent (the two estimates would correlate at 1 or more).
 * @example compareSeparate({ rjk: 0.5, rhm: 0.6, rjh: 0.8, rjm: 0.5, rkh: 0.5, rkm: 0.7, n: 103 }, { tail: 'both', level: 0.95 }).test.value // -1.404975 (Steiger 1980, Case B)
 */
export function compareSeparate(c6: SeparatePairsCorrelations, opts: ComparisonOptions): ComparisonResult {
  assertComparisonOptions(opts);
  const { rjk, rhm, rjh, rjm, rkh, rkm, n } = c6;
  assertOpenUnit(rjk, 'r(j, k)');
  assertOpenUnit(rhm, 'r(h, m)');
  assertClosedUnit(rjh, 'r(j, h)');
  assertClosedUnit(rjm, 'r(j, m)');
  assertClosedUnit(rkh, 'r(k, h)');
  assertClosedUnit(rkm, 'r(k, m)');
  assertSampleSize(n, 'n');
  const rbar = (rjk + rhm) / 2;
  const pooledScale = (1 - rbar * rbar) * (1 - rbar * rbar);
  const sPooled = pearsonFilonPsi(rbar, rbar, c6) / pooledScale;
  if (!(sPooled < 1)) {
    throw new StatsInputError('out-of-range', 'these six correlations cannot all hold in one set of data');
  }
  const z = (Math.sqrt(n - 3) * (fisherZ(rjk) - fisherZ(rhm))) / Math.sqrt(2 - 2 * sPooled);
  const c = pearsonFilonPsi(rjk, rhm, c6) / ((1 - rjk * rjk) * (1 - rhm * rhm));
  if (!(Math.abs(c) < 1)) {
    throw new StatsInputError('out-of-range', 'these six correlations cannot all hold in one set of data');
  }
  const level = opts.level;
  return {
    design: 'separate',
    method: 'pearson',
    pMethod: "Steiger's (1980) Z with pooled r",
    n,
    r1: rjk,
    r2: rhm,
    statistic: rjk - rhm,
    pValue: pFromZ(z, opts.tail),
    tail: opts.tail,
    interval: zouDifferenceInterval(
      rjk,
      pearsonFisherInterval(rjk, n, level),
      rhm,
      pearsonFisherInterval(rhm, n, level),
      c,
      level,
      'Zou (2007), non-overlapping correlations, Fisher-z limits',
    ),
    test: { name: 'z', value: z },
    n1: n,
    n2: n,
    estimateCorrelation: c,
  };
}

/**
 * The same comparison from raw data: r(a, b) - r(c, d), on rows complete in all four columns.
 * @throws StatsInputError when fewer than 4 rows remain, a column is constant, or a pair lies on a straight line.
 */
export function compareSeparateSamples(
  a: ArrayLike<number>,
  b: ArrayLike<number>,
  c: ArrayLike<number>,
  d: ArrayLike<number>,
  opts: ComparisonOptions,
): ComparisonResult {
  const n = a.length;
  if (b.length !== n || c.length !== n || d.length !== n) {
    throw new StatsInputError('unequal-length', 'a, b, c and d must hold the same number of values');
  }
  requireRows(n, 'the data');
  if (opts.method !== undefined && opts.method !== 'pearson') return compareSeparateByBootstrap(a, b, c, d, opts.method, opts);
  return compareSeparate(
    {
      rjk: comparablePearson(a, b, 'a', 'b'),
      rhm: comparablePearson(c, d, 'c', 'd'),
      rjh: comparablePearson(a, c, 'a', 'c', false),
      rjm: comparablePearson(a, d, 'a', 'd', false),
      rkh: comparablePearson(b, c, 'b', 'c', false),
      rkm: comparablePearson(b, d, 'b', 'd', false),
      n,
    },
    opts,
  );
}
