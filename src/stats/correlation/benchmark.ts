/**
 * Tests of a correlation against a value other than zero, and for a correlation too small to matter: both on
 * Fisher's z scale with the same standard errors as the intervals (correlate.ts, fisherStandardError).
 */
import { normalSf } from '../distributions';
import { validAlpha, validTail } from '../options';
import { Interval, Method, StatsInputError, Tail } from '../types';
import { classicalOnly, fisherStandardError } from './correlate';
import { fisherInterval, pFromZ } from './fisher';

/** The test of rho = rho0 (a benchmark other than zero). */
export interface BenchmarkTest {
  against: number;
  z: number;
  pValue: number;
  tail: Tail;
  pMethod: string;
}

/**
 * Is the correlation different from rho0 (e.g. "is it really above the .30 that was reported?")? Fisher's (1921,
 * "On the 'probable error' of a coefficient of correlation deduced from a small sample", Metron 1:3-32) z test:
 * z = (atanh r - atanh rho0) / SE, the standard error of the method evaluated at rho0, the value under test
 * (Bonett & Wright 2000 for Spearman, Fieller, Hartley & Pearson 1957 for Kendall). The tail refers to r - rho0.
 * @throws StatsInputError when |rho0| >= 1 or n is too small for the method's standard error.
 */
export function testAgainst(r: number, n: number, method: Method, rho0: number, tail: Tail): BenchmarkTest {
  validTail(tail);
  if (!(Math.abs(rho0) < 1)) throw new StatsInputError('out-of-range', `against must lie strictly between -1 and 1 (got ${rho0})`);
  const se = fisherStandardError(classicalOnly(method, 'a test against a benchmark'), rho0, n);
  if (!Number.isFinite(se)) throw new StatsInputError('too-few', `only ${n} pairs: a test against ${rho0} needs at least ${method === 'kendall' ? 5 : 4}`);
  const z = (Math.atanh(r) - Math.atanh(rho0)) / se;
  return { against: rho0, z, pValue: pFromZ(z, tail), tail, pMethod: `Fisher z test of rho = ${rho0}` };
}

/** The equivalence test that |rho| < bound. */
export interface EquivalenceResult {
  method: Method;
  statistic: number;
  n: number;
  bound: number;
  alpha: number;
  /** The larger of the two one-sided p-values: below alpha means the correlation lies within +/- bound. */
  pValue: number;
  /** P-value of the test of rho <= -bound and of rho >= bound. */
  pLower: number;
  pUpper: number;
  /** The 1 - 2 alpha interval: inside (-bound, bound) exactly when the test succeeds. */
  interval: Interval;
  negligible: boolean;
  pMethod: string;
}

/**
 * Evidence for no relationship worth the name: two one-sided tests on Fisher's z scale that rho > -bound and
 * rho < bound (Schuirmann 1987, Journal of Pharmacokinetics and Biopharmaceutics 15:657-680; for correlations
 * Goertzen & Cribbie 2010, "Detecting a lack of association: an equivalence testing approach", British Journal of
 * Mathematical and Statistical Psychology 63:527-537, and Lakens 2017, "Equivalence tests: a practical primer for
 * t tests, correlations, and meta-analyses", Social Psychological and Personality Science 8:355-362):
 *   z_low = (atanh r + atanh bound) / SE, p_low = Q(z_low);  z_up = (atanh r - atanh bound) / SE, p_up = Q(-z_up);
 * the correlation is negligible at alpha when max(p_low, p_up) < alpha, the same as the 1 - 2 alpha interval lying
 * inside (-bound, bound). SE is the method's Fisher-z standard error at the observed r.
 * @throws StatsInputError for a bound outside (0, 1), alpha outside (0, 0.5), |r| = 1 or too few pairs.
 */
export function equivalenceTest(r: number, n: number, method: Method, bound: number, alpha: number): EquivalenceResult {
  validAlpha(alpha);
  if (!(alpha < 0.5)) throw new StatsInputError('out-of-range', `alpha must be below 0.5 for an equivalence test (got ${alpha})`);
  if (!(bound > 0 && bound < 1)) throw new StatsInputError('out-of-range', `bound must lie strictly between 0 and 1, e.g. 0.1 (got ${bound})`);
  if (!(Math.abs(r) < 1)) throw new StatsInputError('out-of-range', 'the correlation is perfect, so it cannot be negligible');
  const se = fisherStandardError(classicalOnly(method, 'an equivalence test'), r, n);
  if (!Number.isFinite(se)) throw new StatsInputError('too-few', `only ${n} pairs: an equivalence test needs at least ${method === 'kendall' ? 5 : 4}`);
  const z = Math.atanh(r);
  const b = Math.atanh(bound);
  const pLower = normalSf((z + b) / se);
  const pUpper = normalSf((b - z) / se);
  const pValue = Math.max(pLower, pUpper);
  return {
    method, statistic: r, n, bound, alpha, pValue, pLower, pUpper,
    interval: fisherInterval(r, se, 1 - 2 * alpha, `Fisher z at level 1 - 2 alpha (${Number((100 * (1 - 2 * alpha)).toPrecision(4))}%)`),
    negligible: pValue < alpha,
    pMethod: 'two one-sided Fisher z tests (TOST)',
  };
}
