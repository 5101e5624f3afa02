import { powerOfTwoScale } from '../correlation/comoments';
import { normalSf } from '../distributions';
import { StatsInputError } from '../types';
import { quadraticFormTails } from './imhof';
import { symmetricEigenvalues } from '../internal/symmetric-eigenvalues';

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

/** Below this many points the p-value is exact (eigenvalues + Imhof); from it on, the normal approximation. */
export const DW_EXACT_BELOW = 100;

/**
 * The Durbin-Watson test for dependence between neighbouring rows (Durbin & Watson 1950, 1951, "Testing for serial
 * correlation in least squares regression", Biometrika 37:409-428 and 38:159-178), for the line y = a + b x.
 * Under independent normal errors DW is a ratio of quadratic forms in the residual space:
 * DW = sum lambda_j z_j^2 / sum z_j^2 with lambda_j the n - 2 non-zero eigenvalues of M A M (M the residual
 * projection, A the first-difference matrix).
 * - n < 100: exact. The eigenvalues come from Jacobi's method and P(DW <= d) = P(sum (lambda_j - d) z_j^2 < 0)
 *   from Imhof's (1961) inversion formula. (R's lmtest::dwtest uses the same distribution, evaluated by Pan's
 *   procedure, Farebrother 1980, Applied Statistics 29:224-227.)
 * - n >= 100: normal approximation with the exact mean and variance of DW (Durbin & Watson 1950, sec. 3):
 *   E = P/(n - 2), Var = 2 (Q - P E) / ((n - 2) n), with P = 2(n - 1) - tr(X'AX (X'X)^-1) and
 *   Q = 2(3n - 4) - 2 tr((AX)'AX (X'X)^-1) + tr((X'AX (X'X)^-1)^2). With X = [1, x] and A1 = 0 the traces reduce
 *   to sum (x_t - x_{t-1})^2 / Sxx and |A x|^2 / Sxx, so this is O(n).
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

  // Centred, scaled x: what the residual projection needs.
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

  let pPositive: number;
  let pNegative: number;
  let method: string;
  if (n < DW_EXACT_BELOW) {
    const lambda = residualSpaceEigenvalues(c, cc);
    const weights = new Float64Array(lambda.length);
    for (let j = 0; j < lambda.length; j++) weights[j] = lambda[j] - statistic;
    const tails = quadraticFormTails(weights);
    pPositive = tails.below;
    pNegative = tails.above;
    method = 'exact (Imhof 1961)';
  } else {
    // A c, the first-difference matrix applied to x (A annihilates constants, so c and x give the same).
    let diffSq = 0, aSq = 0;
    for (let t = 0; t < n; t++) {
      const left = t > 0 ? c[t] - c[t - 1] : 0;
      const right = t < n - 1 ? c[t] - c[t + 1] : 0;
      if (t > 0) diffSq += left * left;
      const ac = left + right;
      aSq += ac * ac;
    }
    const a = diffSq / cc;
    const b = aSq / cc;
    const P = 2 * (n - 1) - a;
    const Q = 2 * (3 * n - 4) - 2 * b + a * a;
    const dMean = P / (n - 2);
    const dVar = (2 / ((n - 2) * n)) * (Q - P * dMean);
    const z = (statistic - dMean) / Math.sqrt(dVar);
    pPositive = normalSf(-z);
    pNegative = normalSf(z);
    method = 'normal approximation with exact mean and variance';
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

/**
 * The n - 2 largest eigenvalues of M A M, where M = I - 11'/n - cc'/(c'c) projects onto the residual space of the
 * line and A is the first-difference matrix (tridiagonal: 1, 2, ..., 2, 1 on the diagonal, -1 beside it). With
 * u = c/|c| and v = A u (A1 = 0): M A M = A - u v' - v u' + (u'v) u u'. The other two eigenvalues are 0.
 */
function residualSpaceEigenvalues(c: Float64Array, cc: number): Float64Array {
  const n = c.length;
  const norm = Math.sqrt(cc);
  const u = new Float64Array(n);
  for (let i = 0; i < n; i++) u[i] = c[i] / norm;
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    if (i > 0) s += u[i] - u[i - 1];
    if (i < n - 1) s += u[i] - u[i + 1];
    v[i] = s;
  }
  let uv = 0;
  for (let i = 0; i < n; i++) uv += u[i] * v[i];
  const m = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      let aij = 0;
      if (i === j) aij = i === 0 || i === n - 1 ? 1 : 2;
      else if (j === i + 1) aij = -1;
      m[i * n + j] = aij - u[i] * v[j] - v[i] * u[j] + uv * u[i] * u[j];
    }
  }
  return symmetricEigenvalues(m, n).subarray(0, n - 2);
}
