import {
  assertComparisonOptions,
  assertOpenUnit,
  assertSampleSize,
  ComparisonOptions,
  ComparisonResult,
  comparablePearson,
  pearsonFisherInterval,
  requireRows,
  zouDifferenceInterval,
} from './comparison';
import { fisherZ, pFromZ } from '../correlation/fisher';

/**
 * Compares two Pearson correlations from independent groups (different people or rows), given r and n of each.
 *
 * - p-value: Fisher's z test, z = (atanh r1 - atanh r2) / sqrt(1/(n1 - 3) + 1/(n2 - 3)) (Fisher 1925,
 *   Statistical Methods for Research Workers, Oliver & Boyd, section 35).
 * - Interval: Zou (2007), Psychological Methods 12:399-413, from the two Fisher-z intervals with c = 0.
 *
 * The tail refers to r1 - r2: "positive" tests r1 > r2.
 * @throws StatsInputError when |r| >= 1 or a group has fewer than 4 rows.
 * @example compareIndependent(0.4, 100, 0.5, 100, { tail: 'both', level: 0.95 }).test.value // -0.8751012342 (Fisher's z)
 */
export function compareIndependent(
  r1: number,
  n1: number,
  r2: number,
  n2: number,
  opts: ComparisonOptions,
): ComparisonResult {
  assertComparisonOptions(opts);
  assertOpenUnit(r1, 'r1');
  assertOpenUnit(r2, 'r2');
  assertSampleSize(n1, 'n1');
  assertSampleSize(n2, 'n2');
  const se = Math.sqrt(1 / (n1 - 3) + 1 / (n2 - 3));
  const z = (fisherZ(r1) - fisherZ(r2)) / se;
  const i1 = pearsonFisherInterval(r1, n1, opts.level);
  const i2 = pearsonFisherInterval(r2, n2, opts.level);
  return {
    design: 'independent',
    method: 'pearson',
    pMethod: 'Fisher (1925) z test for independent correlations',
    n: n1 + n2,
    r1,
    r2,
    statistic: r1 - r2,
    pValue: pFromZ(z, opts.tail),
    tail: opts.tail,
    interval: zouDifferenceInterval(r1, i1, r2, i2, 0, opts.level, 'Zou (2007), independent groups, Fisher-z limits'),
    test: { name: 'z', value: z },
    n1,
    n2,
    estimateCorrelation: 0,
  };
}

/**
 * The same comparison from raw data: r1 = r(x1, y1) in one group, r2 = r(x2, y2) in the other. Inputs are the
 * complete pairs of each group (equal-length, finite).
 * @throws StatsInputError when a group has fewer than 4 pairs or a constant column.
 */
export function compareIndependentSamples(
  x1: ArrayLike<number>,
  y1: ArrayLike<number>,
  x2: ArrayLike<number>,
  y2: ArrayLike<number>,
  opts: ComparisonOptions,
): ComparisonResult {
  requireRows(x1.length, 'the first group');
  requireRows(x2.length, 'the second group');
  const r1 = comparablePearson(x1, y1, 'x1', 'y1');
  const r2 = comparablePearson(x2, y2, 'x2', 'y2');
  return compareIndependent(r1, x1.length, r2, x2.length, opts);
}
