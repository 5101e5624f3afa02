import { powerOfTwoScale } from '../comoments';
import { studentTSf } from '../distributions';
import { StatsInputError } from '../types';

/** Per-point diagnostics of a straight-line least-squares fit. NaN marks a value that is undefined. */
export interface LineInfluence {
  n: number;
  /** Hat values h_i = 1/n + (x_i - mean x)^2 / Sxx; they sum to 2. */
  leverage: Float64Array;
  /**
   * Externally studentized residuals (each point's residual over the residual SD of the fit without it).
   * NaN where the leverage is 1 (the point is fitted exactly whatever its y); +/-Infinity when the other
   * points lie exactly on a line.
   */
  studentized: Float64Array;
  /** Cook's distances; NaN where the leverage is 1. */
  cooksDistance: Float64Array;
  /** Index of the largest leverage. */
  maxLeverageIndex: number;
  /** Index of the largest |studentized residual| among the defined ones, or -1 when none is defined. */
  maxStudentizedIndex: number;
  /** Index of the largest Cook's distance among the defined ones, or -1 when none is defined. */
  maxCookIndex: number;
}

/** Leverage treated as exactly 1: the same cut R's lm.influence uses (1 - 10 machine epsilons). */
export const UNIT_LEVERAGE = 1 - 10 * Number.EPSILON;

/**
 * Hat values, externally studentized residuals and Cook's distances of the line y = a + b x (Cook 1977,
 * "Detection of influential observation in linear regression", Technometrics 19:15-18; Belsley, Kuh & Welsch
 * 1980, Regression Diagnostics, Wiley, ch. 2):
 *   h_i = 1/n + c_i^2 / sum c^2 with c = x - mean x,
 *   s_(i)^2 = (RSS - e_i^2/(1 - h_i)) / (n - 3),  t_i = e_i / (s_(i) sqrt(1 - h_i)),
 *   D_i = e_i^2 h_i / (2 s^2 (1 - h_i)^2) with s^2 = RSS / (n - 2).
 * Closed forms for one predictor, so O(n) with no matrix work. x and the residuals are scaled by powers of two
 * before squaring; every quantity here is scale-free.
 * @param x the predictor
 * @param residuals least-squares residuals of y on x
 * @throws StatsInputError for fewer than 3 points or a constant x.
 */
export function lineInfluence(x: ArrayLike<number>, residuals: ArrayLike<number>): LineInfluence {
  const n = x.length;
  if (residuals.length !== n) throw new StatsInputError('unequal-length', 'x and the residuals must have the same length');
  if (n < 3) throw new StatsInputError('too-few', 'influence diagnostics need at least 3 points');
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
  const se = powerOfTwoScale(residuals);
  const e = new Float64Array(n);
  let rss = 0;
  for (let i = 0; i < n; i++) {
    e[i] = residuals[i] / se;
    rss += e[i] * e[i];
  }
  const s2 = rss / (n - 2);
  const leverage = new Float64Array(n);
  const studentized = new Float64Array(n);
  const cooksDistance = new Float64Array(n);
  let maxLeverageIndex = 0, maxStudentizedIndex = -1, maxCookIndex = -1;
  for (let i = 0; i < n; i++) {
    const h = Math.min(1, 1 / n + (c[i] * c[i]) / cc);
    leverage[i] = h;
    if (h > leverage[maxLeverageIndex]) maxLeverageIndex = i;
    if (h >= UNIT_LEVERAGE) {
      studentized[i] = NaN;
      cooksDistance[i] = NaN;
      continue;
    }
    const oneMinusH = 1 - h;
    const ei2 = e[i] * e[i];
    const d = s2 > 0 ? (ei2 * h) / (2 * s2 * oneMinusH * oneMinusH) : NaN;
    cooksDistance[i] = d;
    if (d === d && (maxCookIndex < 0 || d > cooksDistance[maxCookIndex])) maxCookIndex = i;
    if (n < 4) {
      studentized[i] = NaN;
      continue;
    }
    const deleted = rss - ei2 / oneMinusH;
    let t: number;
    // Without point i the rest lie on a line (to rounding): its residual is infinitely many SDs out.
    if (deleted <= rss * 1e-14) t = e[i] === 0 ? NaN : e[i] > 0 ? Infinity : -Infinity;
    else t = e[i] / (Math.sqrt(deleted / (n - 3)) * Math.sqrt(oneMinusH));
    studentized[i] = t;
    if (t === t && (maxStudentizedIndex < 0 || Math.abs(t) > Math.abs(studentized[maxStudentizedIndex]))) {
      maxStudentizedIndex = i;
    }
  }
  return { n, leverage, studentized, cooksDistance, maxLeverageIndex, maxStudentizedIndex, maxCookIndex };
}

/**
 * Bonferroni-adjusted two-sided p-value of the largest externally studentized residual: min(1, n * 2 * P(T > |t|))
 * with T ~ t(n - 3) (the outlier test of Weisberg 1980, Applied Linear Regression, sec. 5.3; Cook & Weisberg 1982,
 * Residuals and Influence in Regression, sec. 2.2.4). Upper tail from the survival function.
 * @example bonferroniOutlierP(3.2, 20) // 20 * 2 * P(T_17 > 3.2), capped at 1
 */
export function bonferroniOutlierP(t: number, n: number): number {
  if (!(n >= 4)) throw new StatsInputError('too-few', 'the outlier test needs at least 4 points');
  const a = Math.abs(t);
  if (a === Infinity) return 0;
  return Math.min(1, n * 2 * studentTSf(a, n - 3));
}

/**
 * The usual yardstick for a large Cook's distance: the median of F(2, n - 2) (Cook 1977 compares D_i with the
 * percentiles of F(p, n - p); the 50% point is the common cut-off). About 0.69 (ln 2) for large n.
 * In closed form: F(2, m) has P(F <= f) = 1 - (1 + 2f/m)^(-m/2), so its median is (m/2)(2^(2/m) - 1), computed
 * with expm1 so that large m keeps its digits.
 */
export function cookCutoff(n: number): number {
  if (!(n >= 3)) throw new StatsInputError('too-few', "Cook's distance needs at least 3 points");
  const m = n - 2;
  return (m / 2) * Math.expm1((2 / m) * Math.LN2);
}
