/**
 * What every comparison of two correlations shares: the result shape, input checks, and Zou's (2007) interval for
 * a difference built from the two single-correlation intervals.
 */
import { fisherInterval } from '../correlation/fisher';
import { coMoments } from '../correlation/comoments';
import { assertVaries, pearsonFromMoments } from '../correlation/pearson';
import { validTestOptions } from '../options';
import { Method, StatsInputError, Tail, TestResult } from '../types';
import type { ResampleSource } from '../bootstrap/bootstrap';
import type { Interval } from '../types';

/** Which study design a comparison is for. */
export type ComparisonDesign =
  /** Two correlations from different people or rows (independent groups). */
  | 'independent'
  /** r(j, k) against r(j, h) on the same rows: one variable in common. */
  | 'shared'
  /** r(j, k) against r(h, m) on the same rows: no variable in common. */
  | 'separate';

/**
 * The result of comparing two correlations r1 and r2 (a TestResult): `statistic` is r1 - r2, the tail refers to
 * r1 - r2 ("positive" tests r1 > r2), the interval is Zou's two-sided interval for r1 - r2, `pMethod` names the
 * test (e.g. "Fisher (1925) z test for independent correlations"), `method` the coefficient compared and `n` the
 * rows behind both (n1 + n2 for independent groups, the shared rows otherwise).
 */
export interface ComparisonResult extends TestResult {
  design: ComparisonDesign;
  r1: number;
  r2: number;
  /** Rows behind r1 and r2 (equal for the same-rows designs). */
  n1: number;
  n2: number;
  /** Correlation between the two estimates that the interval allowed for (0 for independent groups). */
  estimateCorrelation: number;
}

/** Options shared by the comparisons. */
export interface ComparisonOptions {
  tail: Tail;
  /** Confidence level of the two-sided interval, in (0, 1). */
  level: number;
  /** The coefficient compared; Pearson by default. */
  method?: Method;
  /** Bootstrap resamples from elsewhere (tests); by default drawn by the generator seeded from the data. */
  resamples?: ResampleSource;
}

/** The smallest sample a comparison accepts: Fisher's z needs n - 3 > 0. */
export const MIN_COMPARISON_N = 4;

/** Checks a correlation given as a number lies strictly inside (-1, 1), where Fisher's z is finite. */
export function assertOpenUnit(r: number, name: string): void {
  if (!(Math.abs(r) < 1)) {
    throw new StatsInputError('out-of-range', `${name} must lie strictly between -1 and 1 (got ${r})`);
  }
}

/** Checks a correlation given as a number lies in [-1, 1]. */
export function assertClosedUnit(r: number, name: string): void {
  if (!(Math.abs(r) <= 1)) {
    throw new StatsInputError('out-of-range', `${name} must lie between -1 and 1 (got ${r})`);
  }
}

/** Checks a sample size is a whole number of at least `min`. */
export function assertSampleSize(n: number, name: string, min = MIN_COMPARISON_N): void {
  if (!(Number.isInteger(n) && n >= min)) {
    throw new StatsInputError(
      'out-of-range',
      `${name} must be a whole number of at least ${min} (got ${n})`,
    );
  }
}

/** Checks the level and tail (the core's one validator, src/stats/options.ts). */
export function assertComparisonOptions(opts: ComparisonOptions): void {
  validTestOptions(opts);
}

/** "Fisher (1925) z test ...; Zou (2007) ...": what ran, in one line. */
export function describeComparison(r: ComparisonResult): string {
  return `${r.pMethod}; ${r.interval.method}`;
}

/** Two-sided Fisher-z interval for one Pearson r from n rows: tanh(atanh r -/+ q / sqrt(n - 3)). */
export function pearsonFisherInterval(r: number, n: number, level: number): Interval {
  return fisherInterval(r, 1 / Math.sqrt(n - 3), level, 'Fisher z, SE = 1/sqrt(n - 3)');
}

/**
 * Zou's interval for r1 - r2 from the separate intervals (l1, u1) and (l2, u2) of r1 and r2 (Zou 2007, "Toward
 * using confidence intervals to compare correlations", Psychological Methods 12:399-413, eqs. 12-13 for
 * independent groups, 15-16 for dependent ones):
 *
 *   L = r1 - r2 - sqrt((r1 - l1)^2 + (u2 - r2)^2 - 2 c (r1 - l1)(u2 - r2))
 *   U = r1 - r2 + sqrt((u1 - r1)^2 + (r2 - l2)^2 - 2 c (u1 - r1)(r2 - l2))
 *
 * where c is the correlation between the two estimates (0 for independent groups). The radicands are sums of
 * squares minus at most twice their product times |c| < 1, hence non-negative; max(0, .) guards rounding only.
 */
export function zouDifferenceInterval(
  r1: number,
  i1: Interval,
  r2: number,
  i2: Interval,
  c: number,
  level: number,
  method: string,
): Interval {
  const d = r1 - r2;
  const a = r1 - i1.lower;
  const b = i2.upper - r2;
  const e = i1.upper - r1;
  const f = r2 - i2.lower;
  const lower = d - Math.sqrt(Math.max(0, a * a + b * b - 2 * c * a * b));
  const upper = d + Math.sqrt(Math.max(0, e * e + f * f - 2 * c * e * f));
  return { lower, upper, level, method };
}

/** Requires at least 4 complete rows for a comparison; `what` names the group or the data in the message. */
export function requireRows(n: number, what: string): void {
  if (n < MIN_COMPARISON_N) {
    throw new StatsInputError(
      'too-few',
      `${what} has only ${n} usable row${n === 1 ? '' : 's'} of numbers: comparing correlations needs at least ${MIN_COMPARISON_N}`,
    );
  }
}

/**
 * Pearson's r of two columns for a comparison, refusing a constant column and |r| = 1, where Fisher's z (and so
 * every test here) is undefined. The names appear in messages. `compared` false allows |r| = 1 for a
 * correlation that only enters through the covariance of the estimates.
 */
export function comparablePearson(x: ArrayLike<number>, y: ArrayLike<number>, xName: string, yName: string, compared = true): number {
  const m = coMoments(x, y);
  assertVaries(m, xName, yName);
  const r = pearsonFromMoments(m);
  if (compared && Math.abs(r) >= 1) {
    throw new StatsInputError(
      'out-of-range',
      `${xName} and ${yName} lie exactly on a straight line (r = ${r}): comparing correlations needs |r| < 1`,
    );
  }
  return r;
}
