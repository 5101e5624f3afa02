/**
 * Planning for the test of "no correlation" (the t test of Pearson's r with n - 2 df): power, sample size and the
 * smallest detectable correlation.
 *
 * Primary method, "exact": the test's critical r comes from the t distribution, and the chance of passing it
 * comes from the exact sampling distribution of r under a bivariate normal population (Hotelling 1953, Journal
 * of the Royal Statistical Society B 15:193-232; see r-distribution.ts).
 *
 * Beside it, "fisher-z": the usual approximation that treats atanh(r) as normal with mean
 * atanh(rho) + rho / (2(n - 1)) and variance 1/(n - 3) (Fisher 1921, "On the probable error of a coefficient of
 * correlation deduced from a small sample", Metron 1:3-32; the same formula as Cohen 1988, Statistical Power
 * Analysis for the Behavioral Sciences, 2nd ed., ch. 3, and R's pwr::pwr.r.test). It is quick and close, but
 * its normal tail is a little off for small n, so its sample sizes can differ from the exact ones by one or two
 * rows (85 against 84 for rho = .3, alpha = .05 two-sided, power .8).
 *
 * Tails: "both" tests rho != 0 (power counts both rejection regions), "positive" tests rho > 0, "negative"
 * rho < 0.
 */
import { correlationTail } from '../distributions/r-distribution';
import { normalCdf, studentTQuantile } from '../distributions';
import { validAlpha, validPower, validTail } from '../options';
import { StatsInputError, Tail } from '../types';

export type PlanningMethod = 'exact' | 'fisher-z';

export interface PlanningOptions {
  /** Significance level of the test, in (0, 1). */
  alpha: number;
  tail: Tail;
  /** "exact" (default) or the "fisher-z" approximation. */
  method?: PlanningMethod;
}

/** A planning answer, saying what ran. */
export interface PlanningResult {
  /** The true correlation planned for (for detectable: the answer). */
  rho: number;
  /** Rows (for sampleSize: the answer). */
  n: number;
  /** The power at rho and n (for power: the answer; for sampleSize: the power actually reached). */
  power: number;
  alpha: number;
  tail: Tail;
  /** Which computation ran, typed; `basis` says it in words. */
  method: PlanningMethod;
  basis: string;
}

const METHOD_TEXT: Record<PlanningMethod, string> = {
  exact: 'exact distribution of r under a bivariate normal (Hotelling 1953), t-test critical value',
  'fisher-z': 'Fisher-z normal approximation with bias term rho/(2(n - 1)), t-test critical value',
};

/** The largest n the planning functions search to. */
export const MAX_PLANNING_N = 1e9;
/** The smallest n: the t test of r needs n - 2 >= 2 degrees of freedom and Fisher's z needs n - 3 > 0. */
export const MIN_PLANNING_N = 4;

function checkOptions(opts: PlanningOptions): PlanningMethod {
  validAlpha(opts.alpha);
  validTail(opts.tail);
  return opts.method ?? 'exact';
}

function checkRho(rho: number): void {
  if (!(Math.abs(rho) < 1)) throw new StatsInputError('out-of-range', `r must lie strictly between -1 and 1 (got ${rho})`);
}

function checkN(n: number): void {
  if (!(Number.isInteger(n) && n >= MIN_PLANNING_N && n <= MAX_PLANNING_N)) {
    throw new StatsInputError(
      'out-of-range',
      `n must be a whole number of rows from ${MIN_PLANNING_N} to ${MAX_PLANNING_N.toLocaleString('en-US')} (got ${n})`,
    );
  }
}

/**
 * The critical |r| of the t test with n - 2 df at significance alpha: rc = t / sqrt(t^2 + n - 2), t the upper
 * alpha/2 (two-sided) or alpha (one-sided) point of t. Taken as minus the lower quantile, which keeps digits for
 * small alpha.
 * @example criticalCorrelation(10, 0.05, 'both') // 0.6319...
 */
export function criticalCorrelation(n: number, alpha: number, tail: Tail): number {
  const df = n - 2;
  const t = -studentTQuantile(tail === 'both' ? alpha / 2 : alpha, df);
  return t / Math.sqrt(t * t + df);
}

/** Chance that Fisher's z exceeds zc when atanh(r) ~ N(zeta + rho/(2(n - 1)), 1/(n - 3)) (see module notes). */
function fisherZUpper(zc: number, rho: number, n: number): number {
  const mean = Math.atanh(rho) + rho / (2 * (n - 1));
  return normalCdf((mean - zc) * Math.sqrt(n - 3));
}

/** Power without input checks, any real n >= 4. */
function powerAt(rho: number, n: number, alpha: number, tail: Tail, method: PlanningMethod): number {
  const rc = criticalCorrelation(n, alpha, tail);
  if (method === 'fisher-z') {
    const zc = Math.atanh(rc);
    const up = fisherZUpper(zc, rho, n);
    const down = fisherZUpper(zc, -rho, n); // P(z < -zc) by symmetry
    return tail === 'positive' ? up : tail === 'negative' ? down : up + down;
  }
  const up = tail === 'negative' ? 0 : correlationTail(rc, rho, n, 'upper');
  const down = tail === 'positive' ? 0 : correlationTail(-rc, rho, n, 'lower');
  const p = up + down;
  return p > 1 ? 1 : p;
}

/**
 * The power of the test of no correlation: the chance of a significant result with n rows when the true
 * correlation is rho.
 * @throws StatsInputError when |rho| >= 1, n is not a whole number in [4, 1e9] or alpha is outside (0, 1).
 * @example correlationPower(0.3, 84, { alpha: 0.05, tail: 'both' }).power // about 0.80
 */
export function correlationPower(rho: number, n: number, opts: PlanningOptions): PlanningResult {
  const method = checkOptions(opts);
  checkRho(rho);
  checkN(n);
  return { rho, n, power: powerAt(rho, n, opts.alpha, opts.tail, method), alpha: opts.alpha, tail: opts.tail, method, basis: METHOD_TEXT[method] };
}

/** rho folded to the side the tail tests; throws when that side cannot be reached. */
function effectiveRho(rho: number, tail: Tail): number {
  if (rho === 0) throw new StatsInputError('out-of-range', 'r must not be 0: no sample size detects a correlation of zero');
  if (tail === 'positive' && rho < 0) {
    throw new StatsInputError('out-of-range', `a test for a positive correlation cannot detect r = ${rho}: use tail "negative" or "both"`);
  }
  if (tail === 'negative' && rho > 0) {
    throw new StatsInputError('out-of-range', `a test for a negative correlation cannot detect r = ${rho}: use tail "positive" or "both"`);
  }
  return tail === 'both' ? Math.abs(rho) : rho;
}

/**
 * The real n at which the Fisher-z power equals the target, as R's pwr::pwr.r.test reports it (not rounded up).
 * Bisection on log n over [4, 1e9].
 */
export function sampleSizeFisherZ(rho: number, power: number, opts: PlanningOptions): number {
  checkOptions(opts);
  checkRho(rho);
  validPower(power);
  const r = effectiveRho(rho, opts.tail);
  const f = (n: number): number => powerAt(r, n, opts.alpha, opts.tail, 'fisher-z') - power;
  if (f(MIN_PLANNING_N) >= 0) return MIN_PLANNING_N;
  if (f(MAX_PLANNING_N) < 0) throw tooManyRows(rho);
  let lo = Math.log(MIN_PLANNING_N);
  let hi = Math.log(MAX_PLANNING_N);
  for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
    const mid = (lo + hi) / 2;
    if (f(Math.exp(mid)) < 0) lo = mid;
    else hi = mid;
  }
  return Math.exp(hi);
}

function tooManyRows(rho: number): StatsInputError {
  return new StatsInputError('out-of-range', `detecting r = ${rho} would need more than ${MAX_PLANNING_N.toLocaleString('en-US')} rows`);
}

/**
 * The smallest whole number of rows whose power reaches the target, by the chosen method. The search starts at
 * the Fisher-z answer and brackets the exact one by doubling steps, then bisects over whole numbers.
 * @throws StatsInputError when rho is 0, on the side the tail does not test, |rho| >= 1, or the answer would
 *   exceed 1e9 rows.
 * @example sampleSizeForCorrelation(0.3, 0.8, { alpha: 0.05, tail: 'both' }).n // 84
 */
export function sampleSizeForCorrelation(rho: number, power: number, opts: PlanningOptions): PlanningResult {
  const method = checkOptions(opts);
  checkRho(rho);
  validPower(power);
  const r = effectiveRho(rho, opts.tail);
  const pw = (n: number): number => powerAt(r, n, opts.alpha, opts.tail, method);
  const done = (n: number, p: number): PlanningResult => ({ rho, n, power: p, alpha: opts.alpha, tail: opts.tail, method, basis: METHOD_TEXT[method] });
  const p4 = pw(MIN_PLANNING_N);
  if (p4 >= power) return done(MIN_PLANNING_N, p4);
  const start = Math.min(MAX_PLANNING_N, Math.max(MIN_PLANNING_N + 1, Math.ceil(sampleSizeFisherZ(rho, power, opts))));
  // Invariant once bracketed: pw(lo) < power <= pw(hi).
  let lo: number;
  let hi: number;
  let pHi: number;
  const pStart = pw(start);
  if (pStart >= power) {
    hi = start;
    pHi = pStart;
    let step = 1;
    lo = Math.max(MIN_PLANNING_N, hi - step);
    for (;;) {
      const pLo = lo === MIN_PLANNING_N ? p4 : pw(lo);
      if (pLo < power) break;
      hi = lo;
      pHi = pLo;
      if (lo === MIN_PLANNING_N) return done(hi, pHi);
      step *= 2;
      lo = Math.max(MIN_PLANNING_N, hi - step);
    }
  } else {
    lo = start;
    let step = 1;
    for (;;) {
      hi = Math.min(MAX_PLANNING_N, lo + step);
      pHi = pw(hi);
      if (pHi >= power) break;
      if (hi === MAX_PLANNING_N) throw tooManyRows(rho);
      lo = hi;
      step *= 2;
    }
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    const p = pw(mid);
    if (p >= power) {
      hi = mid;
      pHi = p;
    } else lo = mid;
  }
  return done(hi, pHi);
}

/**
 * The smallest true correlation that n rows detect with the target power, by the chosen method: a magnitude for
 * tails "both" and "positive", a negative value for tail "negative" (so that feeding it back into
 * correlationPower gives the target). Found on atanh(rho) to 1e-12 by the Illinois method.
 * @throws StatsInputError when n is not a whole number in [4, 1e9], or power or alpha is outside (0, 1).
 * @example detectableCorrelation(84, 0.8, { alpha: 0.05, tail: 'both' }).rho // about 0.30
 */
export function detectableCorrelation(n: number, power: number, opts: PlanningOptions): PlanningResult {
  const method = checkOptions(opts);
  checkN(n);
  validPower(power);
  const sign = opts.tail === 'negative' ? -1 : 1;
  const pw = (z: number): number => powerAt(sign * Math.tanh(z), n, opts.alpha, opts.tail, method);
  const done = (rho: number, p: number): PlanningResult => ({ rho, n, power: p, alpha: opts.alpha, tail: opts.tail, method, basis: METHOD_TEXT[method] });
  const p0 = pw(0);
  if (p0 >= power) return done(0, p0);
  // Bracket in z = atanh(rho): power rises with |rho|; z = 20 is rho = 1 - 8e-18, i.e. 1 in double precision.
  let lo = 0;
  let flo = p0 - power;
  let hi = 0.5;
  let fhi = pw(hi) - power;
  while (fhi < 0) {
    lo = hi;
    flo = fhi;
    hi *= 2;
    if (hi > 20) throw new StatsInputError('out-of-range', `no correlation below 1 reaches power ${power} with ${n} rows`);
    fhi = pw(hi) - power;
  }
  // Illinois method (Dowell & Jarratt 1971, BIT 11:168-174): regula falsi that halves the stale end's value, so
  // both ends close in superlinearly; about 8 evaluations instead of bisection's 40. Invariant f(lo) < 0 <= f(hi).
  let stale = 0;
  for (let i = 0; i < 200 && hi - lo > 1e-12; i++) {
    let mid = (lo * fhi - hi * flo) / (fhi - flo);
    if (!(mid > lo && mid < hi)) mid = (lo + hi) / 2;
    const fm = pw(mid) - power;
    if (fm >= 0) {
      hi = mid;
      fhi = fm;
      if (stale === 1) flo /= 2;
      stale = 1;
    } else {
      lo = mid;
      flo = fm;
      if (stale === -1) fhi /= 2;
      stale = -1;
    }
    if (fm >= 0 && fm < 1e-13) break;
  }
  const rho = sign * Math.tanh(hi);
  return done(rho, pw(hi));
}
