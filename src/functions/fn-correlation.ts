/**
 * Cell functions for one correlation: the coefficient, its interval, its p-value, the pairs used, and the check
 * of a correlation reported elsewhere. Thin adapter: read cells, call the core, shape the answer.
 */
import { checkReported, correlatePrepared } from '../stats/correlation/correlate';
import { CellRange } from '../sheet/cells';
import { CorrelationResult, StatsInputError } from '../stats/types';
import { testAgainst } from '../stats/correlation/benchmark';
import { optClassicalMethod, optInterval, optLevel, optMethod, optNumber, optTail, requiredNumber } from './args';
import { guard } from './errors';
import { requirePairs } from './read';
import { sharedPairs } from './shared-pairs';

function run(x: CellRange, y: CellRange, method: unknown, tail: unknown, level: unknown, interval: unknown = null, need: 'all' | 'coefficient' = 'all'): CorrelationResult {
  const chosen = optInterval(interval);
  const opts = { method: optMethod(method), tail: optTail(tail), level: optLevel(level), interval: need === 'coefficient' ? 'none' as const : chosen };
  const { pairs, prepared } = sharedPairs(x, y);
  requirePairs(pairs, 3);
  return correlatePrepared(prepared, opts);
}

/**
 * The correlation between two columns of numbers. Rows where either cell is blank, text or TRUE/FALSE are skipped.
 * @customfunction COEF
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [method] "pearson" (default, straight line), "spearman" (rank order), "kendall" (rank agreement); resisting outliers: "percentage_bend", "winsorized", "biweight" or "skipped" (sets outlying rows aside); for rating-scale items: "polychoric" (both columns) or "polyserial" (one column).
 * @returns The coefficient, between -1 and 1.
 */
export function COEF(x: any[][], y: any[][], method?: string): number {
  return guard(() => run(x, y, method, null, null, null, 'coefficient').statistic);
}

/**
 * The confidence interval for the correlation between two columns: the range of true correlations the data are consistent with.
 * @customfunction INTERVAL
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [level] Confidence level between 0 and 1, default 0.95 (95%).
 * @param [method] "pearson" (default, straight line), "spearman" (rank order), "kendall" (rank agreement); resisting outliers: "percentage_bend", "winsorized", "biweight" or "skipped" (sets outlying rows aside); for rating-scale items: "polychoric" (both columns) or "polyserial" (one column).
 * @param [interval] How the interval is made: "fisher" (default for Pearson, Spearman and Kendall: Fisher's z), "bca" (bias-corrected and accelerated bootstrap, for data the checks say Fisher's z does not suit) or "percentile" (percentile bootstrap, the default for the outlier-resisting coefficients). Bootstraps resample the rows 2,000 times (fewer on very long columns), seeded from the data, so the same cells always give the same interval.
 * @returns One row of two cells: lower bound, upper bound.
 */
export function INTERVAL(x: any[][], y: any[][], level?: number, method?: string, interval?: string): number[][] {
  return guard(() => {
    const res = run(x, y, method, null, level, interval);
    if (!Number.isFinite(res.interval.lower)) {
      const need = res.method === 'kendall' ? 5 : 4;
      if (res.n < need) throw new StatsInputError('too-few', `only ${res.n} usable pairs: an interval needs at least ${need}`);
      throw new StatsInputError('too-few', `no interval: ${res.interval.note ?? 'the data give none'}`);
    }
    return [[res.interval.lower, res.interval.upper]];
  });
}

/**
 * The p-value for the correlation between two columns: how often data at least this far from "no correlation" (or from the benchmark given as against) would turn up by chance if the true correlation were that value.
 * @customfunction PVALUE
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [tail] "both" (default: any difference), "positive" (only a correlation above the benchmark counts) or "negative".
 * @param [method] "pearson" (default, straight line), "spearman" (rank order), "kendall" (rank agreement); resisting outliers: "percentage_bend", "winsorized", "biweight" or "skipped" (sets outlying rows aside); for rating-scale items: "polychoric" (both columns) or "polyserial" (one column).
 * @param [against] The correlation to test against, strictly between -1 and 1; default 0. Other values use Fisher's z test (for example 0.3 asks whether the correlation really exceeds a reported .30).
 * @returns The p-value, between 0 and 1.
 */
export function PVALUE(x: any[][], y: any[][], tail?: string, method?: string, against?: number): number {
  return guard(() => {
    const rho0 = optNumber(against, 0, 'against');
    const res = run(x, y, method, tail, null, null, 'coefficient');
    if (rho0 === 0) return res.pValue;
    return testAgainst(res.statistic, res.n, res.method, rho0, res.tail).pValue;
  });
}

/**
 * The number of complete pairs used: rows where both cells hold numbers.
 * @customfunction PAIRS
 * @param x First column (or row).
 * @param y Second column (or row), the same size as x.
 * @returns The count of rows used by COEF, INTERVAL and PVALUE.
 */
export function PAIRS(x: any[][], y: any[][]): number {
  return guard(() => sharedPairs(x, y).pairs.x.length);
}

/**
 * Checks a correlation reported elsewhere (a paper, a slide, a vendor) from just r and the number of pairs: its confidence interval and p-value.
 * @customfunction REPORTED
 * @param r The reported correlation, strictly between -1 and 1.
 * @param n The number of pairs it was computed from, at least 4.
 * @param [level] Confidence level between 0 and 1, default 0.95.
 * @param [tail] "both" (default), "positive" or "negative".
 * @param [method] Which coefficient was reported: "pearson" (default), "spearman" or "kendall".
 * @param [against] The correlation the p-value tests against, strictly between -1 and 1; default 0 (Fisher's z test for other values).
 * @returns One row: lower bound, upper bound, p-value.
 */
export function REPORTED(r: number, n: number, level?: number, tail?: string, method?: string, against?: number): number[][] {
  return guard(() => {
    const rho0 = optNumber(against, 0, 'against');
    const res = checkReported(requiredNumber(r, 'r'), requiredNumber(n, 'n'), {
      method: optClassicalMethod(method), tail: optTail(tail), level: optLevel(level),
    });
    const p = rho0 === 0 ? res.pValue : testAgainst(res.statistic, res.n, res.method, rho0, res.tail).pValue;
    return [[res.interval.lower, res.interval.upper, p]];
  });
}
