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
import { classicalOnly, correlate, correlationInterval, fisherStandardError } from '../correlation/correlate';
import { isRobust, METHOD_LABELS, StatsInputError } from '../types';
import { compareIndependentByBootstrap } from './dependent-bootstrap';

const RANK_SE_SOURCE = {
  spearman: 'Bonett & Wright (2000) standard error',
  kendall: 'Fieller, Hartley & Pearson (1957) standard error',
} as const;

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
  const method = classicalOnly(opts.method ?? 'pearson', 'comparing correlations from r and n');
  if (method !== 'pearson') return compareIndependentRank(r1, n1, r2, n2, method, opts);
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
 * Two Spearman or two Kendall coefficients from independent groups, on Fisher's z scale with each coefficient's
 * own standard error: Spearman's sqrt((1 + rho^2/2)/(n - 3)) (Bonett & Wright 2000, Psychometrika 65:23-28) and
 * Kendall's sqrt(0.437/(n - 4)) (Fieller, Hartley & Pearson 1957, Biometrika 44:470-481):
 *   z = (atanh r1 - atanh r2) / sqrt(se1^2 + se2^2),
 * and Zou's (2007) interval from the two coefficients' own Fisher-z limits, with c = 0.
 */
function compareIndependentRank(r1: number, n1: number, r2: number, n2: number, method: 'spearman' | 'kendall', opts: ComparisonOptions): ComparisonResult {
  const min = method === 'kendall' ? 5 : 4;
  assertSampleSize(n1, 'n1', min);
  assertSampleSize(n2, 'n2', min);
  const se1 = fisherStandardError(method, r1, n1);
  const se2 = fisherStandardError(method, r2, n2);
  const z = (fisherZ(r1) - fisherZ(r2)) / Math.sqrt(se1 * se1 + se2 * se2);
  const i1 = correlationInterval(method, r1, n1, opts.level);
  const i2 = correlationInterval(method, r2, n2, opts.level);
  return {
    design: 'independent', method, n: n1 + n2, r1, r2, statistic: r1 - r2,
    pMethod: `z test for independent ${METHOD_LABELS[method].name} coefficients on Fisher's z scale, ${RANK_SE_SOURCE[method]}`,
    pValue: pFromZ(z, opts.tail), tail: opts.tail,
    interval: zouDifferenceInterval(r1, i1, r2, i2, 0, opts.level, `Zou (2007), independent groups, ${METHOD_LABELS[method].name} Fisher-z limits (${RANK_SE_SOURCE[method]})`),
    test: { name: 'z', value: z }, n1, n2, estimateCorrelation: 0,
  };
}

/** A group's coefficient for a comparison: defined, and short of +/-1 where Fisher's z is finite. */
function groupCoefficient(x: ArrayLike<number>, y: ArrayLike<number>, method: 'spearman' | 'kendall', xName: string, yName: string): number {
  const r = correlate(x, y, { method, tail: 'both', level: 0.95, interval: 'none' }).statistic;
  if (Math.abs(r) >= 1) {
    throw new StatsInputError('out-of-range', `the ranks of ${xName} and ${yName} agree perfectly (${METHOD_LABELS[method].symbol} = ${r}): comparing correlations needs values short of +/-1`);
  }
  return r;
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
  if (opts.method !== undefined && isRobust(opts.method)) return compareIndependentByBootstrap(x1, y1, x2, y2, opts.method, opts);
  const method = classicalOnly(opts.method ?? 'pearson', 'comparing two groups');
  if (method !== 'pearson') {
    return compareIndependent(groupCoefficient(x1, y1, method, 'x1', 'y1'), x1.length, groupCoefficient(x2, y2, method, 'x2', 'y2'), x2.length, opts);
  }
  const r1 = comparablePearson(x1, y1, 'x1', 'y1');
  const r2 = comparablePearson(x2, y2, 'x2', 'y2');
  return compareIndependent(r1, x1.length, r2, x2.length, opts);
}
