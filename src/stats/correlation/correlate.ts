import { distinctUpToThree } from './distinct';
import { exactDiscordantTails, KendallCounts, tauB, varianceOfS } from './kendall';
import { assertValuesVary, assertVaries, clipUnit, pearsonFromMoments } from './pearson';
import { PreparedPairs } from './prepared';
import { fisherInterval, pFromT, pFromZ, tFromR } from './fisher';
import { validTestOptions } from '../options';
import { SPEARMAN_EDGEWORTH_MAX_N, spearmanTails } from './spearman-exact';
import { ClassicalMethod, CoefficientName, CorrelationResult, Interval, IntervalMethod, isClassical, isRobust, Method, METHOD_LABELS, StatsInputError, Tail, TestResult, TestStatistic } from '../types';
import type { ResampleSource } from '../bootstrap/bootstrap';
import { bootstrapInterval, correlateRobust } from '../robust/robust';
import { correlateOrdinal } from '../ordinal/correlate-ordinal';

export interface CorrelateOptions {
  method: Method;
  tail: Tail;
  /** Confidence level of the two-sided interval, in (0, 1). */
  level: number;
  /** How the interval is made: Fisher z by default for the classical coefficients, the percentile bootstrap for the robust ones. */
  interval?: IntervalMethod | 'none';
  /** Bootstrap resamples from elsewhere (tests); by default drawn by the generator seeded from the data. */
  resamples?: ResampleSource;
  /** Bootstrap progress: replicates done of all. */
  onProgress?: (done: number, of: number) => void;
}

/** A method that needs only r and n for its interval and test: a classical one, else a clear error. */
export function classicalOnly(method: Method, what: string): ClassicalMethod {
  if (isClassical(method)) return method;
  throw new StatsInputError('bad-option', `${what} works from r and n with Fisher's z, which holds for Pearson, Spearman and Kendall only, not for ${METHOD_LABELS[method].name.toLowerCase()}`);
}

/** Pearson on two-valued columns is the point-biserial (one column two-valued) or phi (both) coefficient. */
export function pearsonName(x: ArrayLike<number>, y: ArrayLike<number>): CoefficientName {
  const bx = distinctUpToThree(x) === 2;
  const by = distinctUpToThree(y) === 2;
  if (bx && by) return 'phi';
  if (bx || by) return 'point-biserial';
  return 'Pearson';
}

/** Fisher-z standard errors by method; NaN when n is too small for the interval. */
export function fisherStandardError(method: ClassicalMethod, r: number, n: number): number {
  switch (method) {
    case 'pearson':
      // Fisher (1921), Metron 1:3-32: var(atanh r) ~ 1/(n - 3).
      return n > 3 ? 1 / Math.sqrt(n - 3) : NaN;
    case 'spearman':
      // Bonett & Wright (2000), "Sample size requirements for estimating Pearson, Kendall and Spearman
      // correlations", Psychometrika 65:23-28.
      return n > 3 ? Math.sqrt((1 + (r * r) / 2) / (n - 3)) : NaN;
    case 'kendall':
      // Fieller, Hartley & Pearson (1957), "Tests for rank correlation coefficients. I", Biometrika 44:470-481.
      return n > 4 ? Math.sqrt(0.437 / (n - 4)) : NaN;
  }
}

const INTERVAL_METHOD: Record<ClassicalMethod, string> = {
  pearson: 'Fisher z, SE = 1/sqrt(n - 3)',
  spearman: 'Fisher z, SE = sqrt((1 + r^2/2)/(n - 3)) (Bonett & Wright 2000)',
  kendall: 'Fisher z, SE = sqrt(0.437/(n - 4)) (Fieller, Hartley & Pearson 1957)',
};

/**
 * The two-sided interval, or NaN bounds with a note saying why: n too small for the method's standard error, or
 * ranks that agree (or disagree) perfectly, where the Fisher-z interval of a rank coefficient would have zero
 * width, which no sample of rankings can justify (the exact p-value still says how unlikely such agreement is).
 */
export function correlationInterval(method: ClassicalMethod, r: number, n: number, level: number): Interval {
  const se = fisherStandardError(method, r, n);
  if (!Number.isFinite(se)) {
    return { lower: NaN, upper: NaN, level, method: INTERVAL_METHOD[method], note: `an interval needs at least ${method === 'kendall' ? 5 : 4} pairs` };
  }
  if (method !== 'pearson' && Math.abs(r) === 1) {
    return {
      lower: NaN, upper: NaN, level, method: INTERVAL_METHOD[method],
      note: `the ranks ${r > 0 ? 'agree' : 'disagree'} perfectly, so the rank interval would have zero width; no interval is given (the p-value is exact)`,
    };
  }
  return fisherInterval(r, se, level, INTERVAL_METHOD[method]);
}

/** +1 or -1 when the two rankings are identical or exactly reversed (rounding must not leave 0.9999999999999999), else null. */
function perfectRanks(rx: Float64Array, ry: Float64Array): number | null {
  const n = rx.length;
  let same = true;
  let reversed = true;
  for (let i = 0; i < n && (same || reversed); i++) {
    if (rx[i] !== ry[i]) same = false;
    if (rx[i] !== n + 1 - ry[i]) reversed = false;
  }
  return same ? 1 : reversed ? -1 : null;
}

/** Sum of squared rank differences, and whether either column has ties (average ranks then lower the sum of squares). */
function spearmanS(rx: Float64Array, ry: Float64Array): { s: number; ties: boolean } {
  const n = rx.length;
  let s = 0;
  let qx = 0;
  let qy = 0;
  for (let i = 0; i < n; i++) {
    const d = rx[i] - ry[i];
    s += d * d;
    qx += rx[i] * rx[i];
    qy += ry[i] * ry[i];
  }
  // Without ties the ranks are 1..n, whose squares sum to n(n + 1)(2n + 1)/6; these sums are exact below 2^53.
  const full = (n * (n + 1) * (2 * n + 1)) / 6;
  return { s, ties: qx !== full || qy !== full };
}

/**
 * Spearman's p-value: without ties and up to SPEARMAN_EDGEWORTH_MAX_N rows, from the null distribution of S
 * (spearman-exact.ts; two-sided as twice the smaller tail, on the side of S's mean); otherwise the t approximation
 * with n - 2 df.
 */
function spearmanPValue(prep: PreparedPairs, r: number, tail: Tail): { p: number; test: TestStatistic; pMethod: string } {
  const n = prep.n;
  if (n <= SPEARMAN_EDGEWORTH_MAX_N) {
    const { s, ties } = spearmanS(prep.ranksX, prep.ranksY);
    if (!ties) {
      const t = spearmanTails(n, s);
      const p = tail === 'positive' ? t.positive : tail === 'negative' ? t.negative : Math.min(1, 2 * (s > (n * n * n - n) / 6 ? t.negative : t.positive));
      return { p, test: { name: 'S', value: s }, pMethod: t.method };
    }
  }
  return { ...spearmanTApproximation(r, n, tail), pMethod: `t approximation, df = n - 2 (${n > SPEARMAN_EDGEWORTH_MAX_N ? `over ${SPEARMAN_EDGEWORTH_MAX_N} rows` : 'ties'})` };
}

/** Spearman's p by the t approximation t = rho sqrt((n - 2)/(1 - rho^2)), n - 2 df: used with ties or beyond 1,290 rows. */
export function spearmanTApproximation(r: number, n: number, tail: Tail): { p: number; test: TestStatistic } {
  const df = n - 2;
  const t = tFromR(r, df);
  return { p: pFromT(t, df, tail), test: { name: 't', value: t, df } };
}

/** Kendall's p-value: exact null distribution without ties for n < 50, else normal approximation of S. */
export function kendallPValue(c: KendallCounts, tail: Tail): { p: number; test: TestStatistic; pMethod: string } {
  const noTies = c.tiedX === 0 && c.tiedY === 0;
  if (noTies && c.n < 50) {
    const { lower, upper } = exactDiscordantTails(c.n, c.discordant);
    // Few discordant pairs = positive association.
    let p: number;
    if (tail === 'positive') p = lower;
    else if (tail === 'negative') p = upper;
    else p = Math.min(1, 2 * Math.min(lower, upper));
    return { p, test: { name: 'S', value: c.s }, pMethod: 'exact null distribution of S (no ties, n < 50)' };
  }
  const v = varianceOfS(c);
  const z = v > 0 ? c.s / Math.sqrt(v) : 0;
  return {
    p: pFromZ(z, tail),
    test: { name: 'z', value: z },
    pMethod: 'normal approximation of S with tie-corrected variance, no continuity correction',
  };
}

/**
 * Correlation of two equal-length finite columns with its p-value and Fisher-z interval.
 * - Pearson (named point-biserial or phi on two-valued columns): t test with n - 2 df.
 * - Spearman (Spearman 1904, Am. J. Psychol. 15:72-101): Pearson on average ranks; t approximation, n - 2 df.
 * - Kendall tau-b: see kendallPValue.
 * @throws StatsInputError for fewer than 3 pairs or a constant column.
 * @example correlate(x, y, { method: 'pearson', tail: 'both', level: 0.95 }).statistic
 */
export function correlate(x: ArrayLike<number>, y: ArrayLike<number>, opts: CorrelateOptions): CorrelationResult {
  if (y.length !== x.length) throw new StatsInputError('unequal-length', 'x and y must hold the same number of values');
  return correlatePrepared(new PreparedPairs(x, y), opts);
}

/** As correlate, on prepared columns whose ranks, counts and moments are shared with other callers. */
export function correlatePrepared(prep: PreparedPairs, opts: CorrelateOptions): CorrelationResult {
  const { method, tail, level } = validTestOptions(opts);
  if (isRobust(method)) return correlateRobust(prep, { ...opts, method });
  if (!isClassical(method)) return correlateOrdinal(prep, { ...opts, method });
  const result = correlateClassical(prep, method, tail, level);
  const kind = opts.interval ?? 'fisher';
  if (kind === 'fisher' || kind === 'none') return result;
  const boot = bootstrapInterval(prep, method, result.statistic, { level, kind, resamples: opts.resamples, onProgress: opts.onProgress });
  const { values: _values, ...interval } = boot;
  return { ...result, interval };
}

function correlateClassical(prep: PreparedPairs, method: ClassicalMethod, tail: Tail, level: number): CorrelationResult {
  const { x, y, n } = prep;
  if (n < 3) throw new StatsInputError('too-few', `only ${n} usable pairs: at least 3 are needed`);
  if (method === 'kendall') {
    assertValuesVary(x, y);
    const c = prep.kendall;
    const r = tauB(c);
    const pv = kendallPValue(c, tail);
    return {
      method, name: 'Kendall tau-b', statistic: r, pValue: pv.p, tail,
      interval: correlationInterval(method, r, n, level), n, test: pv.test, pMethod: pv.pMethod,
    };
  }
  let r: number;
  let name: CoefficientName;
  if (method === 'spearman') {
    assertValuesVary(x, y);
    const m = prep.rankMoments;
    assertVaries(m);
    r = perfectRanks(prep.ranksX, prep.ranksY) ?? pearsonFromMoments(m);
    name = 'Spearman';
  } else {
    const m = prep.moments;
    assertVaries(m);
    r = pearsonFromMoments(m);
    name = pearsonName(x, y);
  }
  r = clipUnit(r);
  if (method === 'spearman') {
    const pv = spearmanPValue(prep, r, tail);
    return { method, name, statistic: r, pValue: pv.p, tail, interval: correlationInterval(method, r, n, level), n, test: pv.test, pMethod: pv.pMethod };
  }
  const df = n - 2;
  const t = tFromR(r, df);
  return {
    method, name, statistic: r, pValue: pFromT(t, df, tail), tail,
    interval: correlationInterval(method, r, n, level), n,
    test: { name: 't', value: t, df },
    pMethod: 't test, df = n - 2',
  };
}

/** Interval and p-value for a correlation reported elsewhere, from r and n alone (`statistic` is that r). */
export type ReportedResult = TestResult;

/**
 * Checks a reported correlation from r and n only: the same interval and test the raw data would give, with
 * Kendall's p from the normal approximation without ties, var(tau) = 2(2n + 5)/(9n(n - 1)) (Kendall 1938).
 * @throws StatsInputError when |r| >= 1 or n < 4 (n < 5 for Kendall, whose interval needs n - 4 > 0).
 */
export function checkReported(r: number, n: number, opts: CorrelateOptions): ReportedResult {
  const { tail, level } = validTestOptions(opts);
  const method = classicalOnly(opts.method, 'checking a reported correlation');
  if (!(Math.abs(r) < 1)) throw new StatsInputError('out-of-range', `r must lie strictly between -1 and 1 (got ${r})`);
  if (!(n >= 4) || !Number.isInteger(n)) throw new StatsInputError('out-of-range', `n must be a whole number of at least 4 (got ${n})`);
  if (method === 'kendall' && n < 5) throw new StatsInputError('out-of-range', 'n must be at least 5 for Kendall\'s interval');
  const interval = correlationInterval(method, r, n, level);
  if (method === 'kendall') {
    const z = (3 * r * Math.sqrt(n * (n - 1))) / Math.sqrt(2 * (2 * n + 5));
    return { method, statistic: r, n, interval, pValue: pFromZ(z, tail), tail, test: { name: 'z', value: z }, pMethod: 'normal approximation, no ties assumed' };
  }
  const df = n - 2;
  const t = tFromR(r, df);
  return {
    method, statistic: r, n, interval, pValue: pFromT(t, df, tail), tail, test: { name: 't', value: t, df },
    pMethod: method === 'spearman' ? 't approximation, df = n - 2' : 't test, df = n - 2',
  };
}
