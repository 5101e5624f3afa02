import { goldenSectionMinimum } from '../internal/golden-section';
import { powerOfTwoScale } from '../correlation/comoments';
import { normalPdf, normalSf } from '../distributions';
import { StatsInputError } from '../types';
import { residualSpaceSpectrum } from './dw-spectrum';
import { quadraticFormTails } from './quadratic-form';

/** The Durbin-Watson test of the line's residuals, in the order given. */
export interface DurbinWatsonResult {
  n: number;
  /** DW = sum (e_t - e_{t-1})^2 / sum e_t^2, between 0 and 4; about 2 when neighbouring rows are unrelated. */
  statistic: number;
  /** Two-sided p-value: 2 min(P(DW <= d), P(DW >= d)), capped at 1. */
  pValue: number;
  /** One-sided p-value for positive dependence (neighbouring rows alike): P(DW <= d). */
  pPositive: number;
  /** One-sided p-value for negative dependence (neighbouring rows alternate): P(DW >= d). */
  pNegative: number;
  /** How the p-values were computed. */
  method: string;
  /** Lag-1 autocorrelation of the residuals, about 1 - DW/2. */
  lag1: number;
}

/** Up to this many points the p-value is exact; above, an Edgeworth series with exact mean and variance. */
export const DW_EXACT_MAX = 1500;
/** Above DW_EXACT_MAX, a tail smaller than this by the Edgeworth series is recomputed by the saddle-point method. */
const FAR_TAIL = 1e-3;

/**
 * The Durbin-Watson test for dependence between neighbouring rows (Durbin & Watson 1950, 1951, "Testing for serial
 * correlation in least squares regression", Biometrika 37:409-428 and 38:159-178), for the line y = a + b x.
 * Under independent normal errors DW is a ratio of quadratic forms in the residual space:
 * DW = sum m_j z_j^2 / sum z_j^2 with m_j the n - 2 non-zero eigenvalues of M A M (M the residual projection,
 * A the first-difference matrix), so P(DW <= d) = P(sum (m_j - d) z_j^2 < 0).
 * - n <= DW_EXACT_MAX: exact. The eigenvalues come from the secular equation in O(n^2) (dw-spectrum.ts) and the
 *   tail from the saddle-point inversion of quadratic-form.ts, accurate in relative terms in either tail down to
 *   about 1e-300 (an annual series of 98 rows with DW 0.44 has P(DW <= d) near 1e-22). (R's lmtest::dwtest uses
 *   the same distribution, by Pan's procedure, Farebrother 1980, Applied Statistics 29:224-227, accurate in
 *   absolute terms only.)
 * - above: an Edgeworth series for Q = sum (m_j - d) z_j^2 (Kendall & Stuart 1977, The Advanced Theory of
 *   Statistics, vol. 1, sec. 6.18) with its exact mean and variance (Durbin & Watson 1950, sec. 3: with
 *   X = [1, x] and A1 = 0 the traces reduce to sum (x_t - x_{t-1})^2 / Sxx and |A x|^2 / Sxx, so this is O(n)) and
 *   its third and fourth cumulants from the spectrum of A, which the m_j interlace (their relative error is
 *   O(1/n)); at n = 1,500 it is within 0.03% of the exact value for p above 1e-3. A smaller tail is taken from the
 *   saddle-point approximation of Lugannani & Rice (1980) instead (dwSaddlepointTails), whose relative error stays
 *   small far into the tail.
 * @param x the predictor, in sheet order
 * @param residuals the least-squares residuals, in the same order
 * @throws StatsInputError for fewer than 4 points, a constant x, or residuals that are all zero.
 */
export function durbinWatson(x: ArrayLike<number>, residuals: ArrayLike<number>): DurbinWatsonResult {
  const n = x.length;
  if (residuals.length !== n) throw new StatsInputError('unequal-length', 'x and the residuals must have the same length');
  if (n < 4) throw new StatsInputError('too-few', 'the Durbin-Watson test needs at least 4 points');
  const se = powerOfTwoScale(residuals);
  let num = 0, den = 0, lagSum = 0;
  for (let t = 0; t < n; t++) {
    const e = residuals[t] / se;
    den += e * e;
    if (t > 0) {
      const prev = residuals[t - 1] / se;
      num += (e - prev) * (e - prev);
      lagSum += e * prev;
    }
  }
  if (!(den > 0)) throw new StatsInputError('constant', 'the residuals are all zero: the points lie exactly on a line');
  const statistic = num / den;
  const lag1 = lagSum / den;
  const c = centredUnit(x);

  let pPositive: number;
  let pNegative: number;
  let method: string;
  if (n <= DW_EXACT_MAX) {
    const m = residualSpaceSpectrum(c);
    const weights = new Float64Array(m.length);
    for (let j = 0; j < m.length; j++) weights[j] = m[j] - statistic;
    const tails = quadraticFormTails(weights);
    pPositive = tails.below;
    pNegative = tails.above;
    method = 'exact (saddle-point inversion, Rice 1980)';
  } else {
    const t = dwEdgeworthTails(c, statistic);
    if (Math.min(t.below, t.above) >= FAR_TAIL) {
      pPositive = t.below;
      pNegative = t.above;
      method = 'Edgeworth series with exact mean and variance';
    } else {
      const lr = dwSaddlepointTails(c, statistic);
      pPositive = lr.below;
      pNegative = lr.above;
      method = 'saddle-point approximation (Lugannani & Rice 1980)';
    }
  }
  return {
    n,
    statistic,
    pValue: Math.min(1, 2 * Math.min(pPositive, pNegative)),
    pPositive,
    pNegative,
    method,
    lag1,
  };
}

/** x centred and divided by its norm (power-of-two scaled first, mean corrected twice): the u of dw-spectrum.ts. */
export function centredUnit(x: ArrayLike<number>): Float64Array {
  const n = x.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i];
  mean /= n;
  const c = new Float64Array(n);
  for (let i = 0; i < n; i++) c[i] = x[i] - mean;
  const sc = powerOfTwoScale(c);
  let cMean = 0;
  for (let i = 0; i < n; i++) {
    c[i] /= sc;
    cMean += c[i];
  }
  cMean /= n;
  let cc = 0;
  for (let i = 0; i < n; i++) {
    c[i] -= cMean;
    cc += c[i] * c[i];
  }
  if (!(cc > 0)) throw new StatsInputError('constant', 'x is constant, so no line can be fitted');
  const norm = Math.sqrt(cc);
  for (let i = 0; i < n; i++) c[i] /= norm;
  return c;
}

/**
 * The exact mean and variance of DW (Durbin & Watson 1950, sec. 3) for the unit vector u along the centred x:
 * tr(M A M) = 2(n - 1) - u'Au and tr((M A M)^2) = 2(3n - 4) - 2|Au|^2 + (u'Au)^2.
 */
export function dwMoments(u: ArrayLike<number>): { traceC: number; traceC2: number; mean: number; variance: number } {
  const n = u.length;
  let a = 0;
  let b = 0;
  for (let t = 0; t < n; t++) {
    const left = t > 0 ? u[t] - u[t - 1] : 0;
    const right = t < n - 1 ? u[t] - u[t + 1] : 0;
    if (t > 0) a += left * left;
    const au = left + right;
    b += au * au;
  }
  const traceC = 2 * (n - 1) - a;
  const traceC2 = 2 * (3 * n - 4) - 2 * b + a * a;
  const mean = traceC / (n - 2);
  const variance = (2 / ((n - 2) * n)) * (traceC2 - traceC * mean);
  return { traceC, traceC2, mean, variance };
}

/** The normal approximation with the exact mean and variance: P(DW <= d) and P(DW >= d). */
export function dwNormalApproximation(u: ArrayLike<number>, d: number): { below: number; above: number } {
  const { mean, variance } = dwMoments(u);
  const z = (d - mean) / Math.sqrt(variance);
  return { below: normalSf(-z), above: normalSf(z) };
}

/**
 * P(Q <= 0) and P(Q >= 0) for Q = sum (m_j - d) z_j^2 by the Edgeworth series to order 1/n, with Q's exact mean
 * and variance and its third and fourth central sums taken from A's eigenvalues 2 - 2 cos(pi j / n),
 * j = 1..n-1, in closed form (sums of powers of cosines over those angles).
 */
export function dwEdgeworthTails(u: ArrayLike<number>, d: number): { below: number; above: number } {
  const n = u.length;
  const k = n - 2;
  const { traceC, traceC2 } = dwMoments(u);
  const mBar = traceC / k;
  const s2 = traceC2 - (traceC * traceC) / k; // exact sum of (m - mBar)^2
  // Over j = 1..n-1: sum cos = 0, sum cos^2 = (n - 2)/2, sum cos^3 = 0, sum cos^4 = (3n - 8)/8.
  const J = n - 1;
  const c2 = (n - 2) / 2;
  const c4 = (3 * n - 8) / 8;
  // Central moments of l = 2 - 2 cos about its mean 2 (sum cos = 0): (l - 2)^r = (-2 cos)^r.
  const lm3 = 0;
  const lm4 = (16 * c4) / J;
  const lm2 = (4 * c2) / J;
  // The m_j interlace the l_j: take their third and fourth central moments from A's, scaled to the exact variance.
  const scale = s2 / k / lm2;
  const s3 = k * lm3 * Math.pow(scale, 1.5);
  const s4 = k * lm4 * scale * scale;
  const w = mBar - d;
  const sw2 = s2 + k * w * w;
  const sw3 = s3 + 3 * w * s2 + k * w * w * w;
  const sw4 = s4 + 4 * w * s3 + 6 * w * w * s2 + k * w * w * w * w;
  const k1 = k * w;
  const k2 = 2 * sw2;
  const k3 = 8 * sw3;
  // Cumulants of sum w z^2 with z standard normal: 2^(r-1) (r-1)! sum w^r.
  const k4 = 48 * sw4;
  const g1 = k3 / Math.pow(k2, 1.5);
  const g2 = k4 / (k2 * k2);
  const z = -k1 / Math.sqrt(k2);
  const he2 = z * z - 1;
  const he3 = z * z * z - 3 * z;
  const he5 = z * z * z * z * z - 10 * z * z * z + 15 * z;
  const corr = normalPdf(z) * ((g1 / 6) * he2 + (g2 / 24) * he3 + ((g1 * g1) / 72) * he5);
  const clip = (p: number): number => (p < 0 ? 0 : p > 1 ? 1 : p);
  return { below: clip(normalSf(-z) - corr), above: clip(normalSf(z) + corr) };
}

/**
 * P(Q <= 0) and P(Q >= 0) for Q = sum (m_j - d) z_j^2 by the saddle-point approximation of Lugannani & Rice (1980,
 * "Saddle point approximation for the distribution of the sum of independent random variables", Advances in
 * Applied Probability 12:475-490), in O(n) per evaluation of the cumulant generating function and without the
 * eigenvalues: with T(s) = I - 2s(A - dI) and g(s) = u'T(s)^-1 u,
 *   K(s) = -1/2 log det(I - 2s M(A - dI)M) = -1/2 [sum_{k=1}^{n-1} log(1 - 2s(l_k - d)) + log g(s)]
 * (the determinant of a compression to u's orthogonal complement, A1 = 0 removing the constant), the sum in closed
 * form through the Chebyshev polynomial U_(n-1) (prod_{k=1}^{n-1} (x - cos(pi k/n)) = U_(n-1)(x)/2^(n-1)) and g by
 * one tridiagonal solve. The saddle point K'(s) = 0 is found by minimising K (convex) with golden sections, K'' by
 * a central difference; the relative error of the approximation is O(1/n).
 */
export function dwSaddlepointTails(u: ArrayLike<number>, d: number): { below: number; above: number } {
  const n = u.length;
  const K = (s: number): number => -0.5 * (chebyshevLogSum(n, s, d) + Math.log(quadraticInverse(u, s, d)));
  // The strip where T(s) stays positive definite (l_k in [0, 4]): (-1/(2d), 1/(2(4 - d))).
  const lo = (-1 / (2 * d)) * (1 - 1e-9);
  const hi = (1 / (2 * (4 - d))) * (1 - 1e-9);
  // Golden-section minimisation of the convex K.
  const sHat = goldenSectionMinimum(K, lo, hi, (p, q) => q - p <= 1e-13 * Math.max(Math.abs(p), Math.abs(q)));
  const kHat = K(sHat);
  const h = 1e-4 * Math.min(Math.abs(sHat) + 1e-6, sHat - lo, hi - sHat);
  const k2 = (K(sHat + h) - 2 * kHat + K(sHat - h)) / (h * h);
  const w = Math.sign(sHat) * Math.sqrt(Math.max(0, -2 * kHat));
  const v = sHat * Math.sqrt(k2);
  if (!(Math.abs(w) > 1e-6)) return dwEdgeworthTails(u, d); // at the mean: the series is exact enough there
  const correction = normalPdf(w) * (1 / v - 1 / w);
  const clip = (p: number): number => (p < 0 ? 0 : p > 1 ? 1 : p);
  return { below: clip(normalSf(-w) - correction), above: clip(normalSf(w) + correction) };
}

/**
 * sum_{k=1}^{n-1} log(1 - 2s(l_k - d)) with l_k = 2 - 2 cos(pi k/n), in closed form: each factor is
 * a + 4s cos(pi k/n) with a = 1 + 2sd - 4s, so the product is |4s|^(n-1) prod (x - cos(pi k/n)) with
 * x = a/(4|s|) > 1, = |4s|^(n-1) U_(n-1)(x) / 2^(n-1), and U_(n-1)(cosh t) = sinh(nt)/sinh(t).
 */
function chebyshevLogSum(n: number, s: number, d: number): number {
  if (s === 0) return 0;
  const abs4s = 4 * Math.abs(s);
  // x - 1 = (a - 4|s|)/(4|s|): for s < 0 that is (1 + 2sd)/(4|s|), for s > 0 (1 + 2sd - 8s)/(4|s|).
  const xm1 = (s < 0 ? 1 + 2 * s * d : 1 + 2 * s * d - 8 * s) / abs4s;
  const t = Math.log1p(xm1 + Math.sqrt(xm1 * (xm1 + 2))); // acosh(1 + xm1)
  // log(sinh(nt)/sinh(t)) = (n - 1) t + log((1 - e^(-2nt)) / (1 - e^(-2t))), the last ratio by expm1 for small t.
  const ratio = -Math.expm1(-2 * n * t) / -Math.expm1(-2 * t);
  return (n - 1) * Math.log(abs4s / 2) + (n - 1) * t + Math.log(ratio);
}

/** u' T(s)^-1 u for T(s) = I - 2s(A - dI), tridiagonal, by one forward and one backward sweep (Thomas algorithm). */
function quadraticInverse(u: ArrayLike<number>, s: number, d: number): number {
  const n = u.length;
  const off = 2 * s; // T's off-diagonal: -2s times A's -1
  const diag = (i: number): number => 1 + 2 * s * d - 2 * s * (i === 0 || i === n - 1 ? 1 : 2);
  const cp = new Float64Array(n);
  const gp = new Float64Array(n);
  let piv = diag(0);
  cp[0] = off / piv;
  gp[0] = u[0] / piv;
  for (let i = 1; i < n; i++) {
    piv = diag(i) - off * cp[i - 1];
    cp[i] = off / piv;
    gp[i] = (u[i] - off * gp[i - 1]) / piv;
  }
  let y = gp[n - 1];
  let sum = u[n - 1] * y;
  for (let i = n - 2; i >= 0; i--) {
    y = gp[i] - cp[i] * y;
    sum += u[i] * y;
  }
  return sum;
}
