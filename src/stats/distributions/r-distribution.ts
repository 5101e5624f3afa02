/**
 * The exact sampling distribution of Pearson's r for n rows from a bivariate normal population with correlation
 * rho, from Hotelling's (1953) density ("New light on the correlation coefficient and its transforms", Journal of
 * the Royal Statistical Society B 15:193-232):
 *
 *   f(r) = (n - 2) G(n - 1) (1 - rho^2)^((n-1)/2) (1 - r^2)^((n-4)/2)
 *          / ( sqrt(2 pi) G(n - 1/2) (1 - rho r)^(n - 3/2) ) * 2F1(1/2, 1/2; n - 1/2; (1 + rho r)/2).
 *
 * Written here (no JavaScript library offers it). Numerically:
 * - We integrate in Fisher's z = atanh(r), where the density is close to a normal curve of width 1/sqrt(n) at
 *   every n, so one adaptive rule serves n = 4 and n = 1e9 alike. With rho = tanh(zeta), 1 - r^2 = sech^2 z,
 *   1 - rho^2 = sech^2 zeta and 1 - rho r = cosh(z - zeta) / (cosh z cosh zeta), so the density of z is
 *     g(z) = K sqrt(cosh z / cosh zeta) cosh(z - zeta)^-(n - 3/2) 2F1(1/2, 1/2; n - 1/2; (1 + rho r)/2),
 *   free of the cancellation in 1 - rho r when rho r is near 1.
 * - The constant K is not used: every probability is a ratio of two integrals of g over the same window, so
 *   errors in log-gamma differences of numbers near 1e6 cannot enter.
 * - The window zeta +/- h holds all but about e^-45 of the mass: near the mode log g falls like
 *   (n - 3/2)(z - zeta)^2 / 2, and far out it falls linearly at rate n - 2.
 */
import { integrate } from '../internal/quadrature';
import { studentTSf } from './student-t';
import { tFromR } from '../correlation/fisher';
import { StatsInputError } from '../types';
import { lnGamma } from './gamma-beta';

/** log(cosh x), accurate near 0 (via cosh x - 1 = 2 sinh^2(x/2)) and free of overflow for large |x|. */
export function logCosh(x: number): number {
  const a = Math.abs(x);
  if (a < 1) {
    const s = Math.sinh(a / 2);
    return Math.log1p(2 * s * s);
  }
  return a - Math.LN2 + Math.log1p(Math.exp(-2 * a));
}

/** 2F1(a, b; c; x) by its power series, for |x| small enough that it converges quickly (x <= 0.1 here). */
function seriesNearZero(a: number, b: number, c: number, x: number): number {
  let term = 1;
  let sum = 1;
  for (let k = 0; k < 100_000; k++) {
    term *= ((k + a) * (k + b) * x) / ((k + c) * (k + 1));
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum)) break;
  }
  return sum;
}

/** Below this c - 1 (= n - 3/2 for the density of r) the series near x = 1 needs the transformation below; above
 * it the series needs at most about a thousand terms even at x = 1 - 1e-14, and keeps full accuracy. */
const SLOW_SERIES_M = 10;

/**
 * Gauss's hypergeometric function 2F1(1/2, 1/2; c; x) for c >= 1/2 and 0 <= x < 1.
 * - By its power series: each term is the previous times (k + 1/2)^2 x / ((k + c)(k + 1)) < x, so the remainder
 *   after a term t is below t x / (1 - x); summation stops when that is under 1e-17 of the sum.
 * - For x > 0.9 with m = c - 1 below 10 and not a whole number, that series would need up to millions of terms
 *   (its terms fall only like k^-(m+1)), so it is mapped to 1 - x by the connection formula of Abramowitz & Stegun
 *   (1964), Handbook of Mathematical Functions, eq. 15.3.6, with a = b = 1/2 and c - a - b = m:
 *     2F1 = G(c) G(m) / G(c - 1/2)^2 2F1(1/2, 1/2; 1 - m; 1 - x)
 *         + (1 - x)^m G(c) G(-m) / pi 2F1(c - 1/2, c - 1/2; m + 1; 1 - x),
 *   both series in 1 - x < 0.1. (With whole-number m, which only a fractional n gives, the plain series is kept.)
 */
export function hypergeometricHalves(c: number, x: number): number {
  const m = c - 1;
  if (x > 0.9 && m < SLOW_SERIES_M && Math.abs(m - Math.round(m)) > 1e-6) {
    const y = 1 - x;
    const first = Math.exp(lnGamma(c) + lnGamma(m) - 2 * lnGamma(c - 0.5)) * seriesNearZero(0.5, 0.5, 1 - m, y);
    // G(-m) = -pi / (sin(pi m) G(1 + m)) (reflection), so G(c) G(-m) / pi = -G(c) / (sin(pi m) G(1 + m)).
    const coef = -Math.exp(lnGamma(c) - lnGamma(1 + m)) / Math.sin(Math.PI * m);
    return first + Math.pow(y, m) * coef * seriesNearZero(c - 0.5, c - 0.5, m + 1, y);
  }
  let term = 1;
  let sum = 1;
  const tailFactor = x / (1 - x);
  for (let k = 0; k < 10_000_000; k++) {
    term *= ((k + 0.5) * (k + 0.5) * x) / ((k + c) * (k + 1));
    sum += term;
    if (term * tailFactor < 1e-17 * sum) break;
  }
  return sum;
}

/** log of g(z) / K: the density of z = atanh(r) up to a constant. */
function logDensityOfZ(z: number, zeta: number, rho: number, n: number): number {
  const x = (1 + rho * Math.tanh(z)) / 2;
  return 0.5 * (logCosh(z) - logCosh(zeta)) - (n - 1.5) * logCosh(z - zeta) + Math.log(hypergeometricHalves(n - 0.5, x));
}

/** Half-width, in z, of the window that holds all but about e^-45 of the mass. */
function windowHalfWidth(n: number): number {
  return Math.sqrt(100 / (n - 1.5)) + 50 / (n - 2);
}

const REL_TOL = 1e-13;

/**
 * P(r >= rc) ("upper") or P(r <= rc) ("lower") for Pearson's r from n rows (n >= 4, any real n) of a bivariate
 * normal population with correlation rho (|rho| < 1). Under rho = 0 the distribution is that of the t test
 * (Student 1908; Fisher 1915), which is used directly.
 * @example correlationTail(0.2, 0.3, 84, 'upper') // 0.83643..., the chance that r >= 0.2 when rho = 0.3, n = 84
 */
export function correlationTail(rc: number, rho: number, n: number, side: 'upper' | 'lower'): number {
  if (!(n >= 4)) throw new StatsInputError('too-few', `n must be at least 4 (got ${n})`);
  if (!(Math.abs(rho) < 1)) throw new StatsInputError('out-of-range', `the true correlation must lie strictly between -1 and 1 (got ${rho})`);
  if (rc >= 1) return side === 'upper' ? 0 : 1;
  if (rc <= -1) return side === 'upper' ? 1 : 0;
  if (rho === 0) {
    const df = n - 2;
    const t = tFromR(rc, df);
    return side === 'upper' ? studentTSf(t, df) : studentTSf(-t, df);
  }
  const zeta = Math.atanh(rho);
  const zc = Math.atanh(rc);
  const h = windowHalfWidth(n);
  const lo = zeta - h;
  const hi = zeta + h;
  // Shift by the log density at the centre so the integrand is O(1) there, whatever n.
  const shift = logDensityOfZ(zeta, zeta, rho, n);
  const g = (z: number): number => Math.exp(logDensityOfZ(z, zeta, rho, n) - shift);
  const left = integrate(g, lo, zeta, { absTol: 0, relTol: REL_TOL });
  const right = integrate(g, zeta, hi, { absTol: 0, relTol: REL_TOL });
  const total = left + right;
  const absTol = 1e-16 * total;
  // The requested tail, integrated directly (never 1 - the other side, which would lose a small tail).
  let mass: number;
  if (side === 'upper') {
    if (zc >= hi) return 0;
    mass = zc <= zeta
      ? integrate(g, Math.max(zc, lo), zeta, { absTol, relTol: REL_TOL }) + right
      : integrate(g, zc, hi, { absTol, relTol: REL_TOL });
  } else {
    if (zc <= lo) return 0;
    mass = zc >= zeta
      ? left + integrate(g, zeta, Math.min(zc, hi), { absTol, relTol: REL_TOL })
      : integrate(g, lo, zc, { absTol, relTol: REL_TOL });
  }
  const p = mass / total;
  return p > 1 ? 1 : p;
}
