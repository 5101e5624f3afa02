import { borrowF64, giveBack } from '../internal/scratch';
import { powerOfTwoScale } from '../correlation/comoments';
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
 * Sum with Neumaier's compensation (Neumaier 1974, "Rundungsfehleranalyse einiger Verfahren zur Summation endlicher
 * Summen", Zeitschrift fuer Angewandte Mathematik und Mechanik 54:39-51): the error no longer grows with n, so the
 * result hardly depends on the order of the terms, which is what makes the diagnostics the same in any row order.
 */
function compensatedSum(n: number, term: (i: number) => number): number {
  // Generic form, for the rare per-point sums. The sums over every row are written out in lineInfluence: one function called
  // with several different closures runs them through a megamorphic call per row, and on a first new closure V8
  // throws away its optimised loop (measured: 42 ms of one 100,000-row redraw in the panel).
  let sum = 0;
  let comp = 0;
  for (let i = 0; i < n; i++) {
    const a = term(i);
    const t = sum + a;
    comp += Math.abs(sum) >= Math.abs(a) ? sum - t + a : a - t + sum;
    sum = t;
  }
  return sum + comp;
}

/** compensatedSum of v[i] / s, the same arithmetic in the same order, without a closure. */
function scaledSum(v: ArrayLike<number>, s: number): number {
  let sum = 0;
  let comp = 0;
  const n = v.length;
  for (let i = 0; i < n; i++) {
    const a = v[i] / s;
    const t = sum + a;
    comp += Math.abs(sum) >= Math.abs(a) ? sum - t + a : a - t + sum;
    sum = t;
  }
  return sum + comp;
}

/**
 * Hat values, externally studentized residuals and Cook's distances of the line y = a + b x (Cook 1977,
 * "Detection of influential observation in linear regression", Technometrics 19:15-18; Belsley, Kuh & Welsch
 * 1980, Regression Diagnostics, Wiley, ch. 2):
 *   h_i = 1/n + c_i^2 / sum c^2 with c = x - mean x,
 *   s_(i)^2 = RSS_(i) / (n - 3),  t_i = e_i / (s_(i) sqrt(1 - h_i)),
 *   D_i = e_i^2 h_i / (2 s^2 (1 - h_i)^2) with s^2 = RSS / (n - 2).
 * Closed forms for one predictor, so O(n) with no matrix work. x and the residuals are scaled by powers of two
 * before squaring; every quantity here is scale-free. Sums are compensated, so the answers do not depend on the
 * row order beyond the last digit or two.
 *
 * Two differences of nearly equal numbers are avoided where they would cost digits:
 * - RSS_(i) = RSS - e_i^2 / (1 - h_i) cancels when point i carries nearly all of the RSS (the other points lie
 *   almost on a line). There it is summed directly from the leave-one-out residuals of the other points,
 *   e_j(i) = e_j + h_ij e_i / (1 - h_i) with h_ij = 1/n + c_i c_j / sum c^2 (Belsley, Kuh & Welsch 1980, ch. 2,
 *   the deletion formulas), a sum of squares with no cancellation. At most seven points qualify (those with
 *   h_i > 1/2, or with e_i^2 > RSS / 4), so the total stays O(n).
 * - 1 - h_i for a point of high leverage (h_i > 1/2, at most three points) is taken as
 *   (n - 1)/n * Sxx_(i) / Sxx, where Sxx_(i) is the sum of squares of x about its mean without point i
 *   (an exact identity), rather than by subtracting h_i from 1.
 * @param x the predictor
 * @param residuals least-squares residuals of y on x
 * @param residualNoise rounding error to expect in each residual (same units as the residuals), e.g. a few
 *   machine epsilons of the data's magnitude: when the points other than i lie on a line to within this, t_i is
 *   +/-Infinity rather than rounding noise divided by rounding noise. 0 (the default) means exact residuals.
 * @throws StatsInputError for fewer than 3 points or a constant x.
 */
export function lineInfluence(x: ArrayLike<number>, residuals: ArrayLike<number>, residualNoise = 0): LineInfluence {
  const n = x.length;
  if (residuals.length !== n) throw new StatsInputError('unequal-length', 'x and the residuals must have the same length');
  if (n < 3) throw new StatsInputError('too-few', 'influence diagnostics need at least 3 points');
  // The plain sequence of passes (scale x, take its compensated mean, centre, scale, centre again, sum; scale the
  // residuals and sum their squares) with neighbouring passes fused: each value goes through the same operations
  // in the same order, so every sum is the same bit for bit, in 6 passes over the rows instead of 12.
  let xMax = 0;
  let eMax = 0;
  for (let i = 0; i < n; i++) {
    const a = Math.abs(x[i]);
    if (a > xMax) xMax = a;
    const b = Math.abs(residuals[i]);
    if (b > eMax) eMax = b;
  }
  const sx = powerOfTwoScale([xMax]);
  const mean = scaledSum(x, sx) / n;
  const c = borrowF64(n); // work arrays c and e go back to the scratch pool at the end
  let cMax = 0;
  for (let i = 0; i < n; i++) {
    const v = x[i] / sx - mean;
    c[i] = v;
    const a = Math.abs(v);
    if (a > cMax) cMax = a;
  }
  const sc = powerOfTwoScale([cMax]);
  // Second pass removes what rounding left of the mean (Chan, Golub & LeVeque 1983, as in comoments.ts).
  let sum = 0;
  let comp = 0;
  for (let i = 0; i < n; i++) {
    const a = c[i] / sc;
    c[i] = a;
    const t = sum + a;
    comp += Math.abs(sum) >= Math.abs(a) ? sum - t + a : a - t + sum;
    sum = t;
  }
  const cMean = (sum + comp) / n;
  let sum1 = 0, comp1 = 0, sum2 = 0, comp2 = 0;
  for (let i = 0; i < n; i++) {
    const a = c[i] - cMean;
    c[i] = a;
    const t = sum1 + a;
    comp1 += Math.abs(sum1) >= Math.abs(a) ? sum1 - t + a : a - t + sum1;
    sum1 = t;
    const b = a * a;
    const u = sum2 + b;
    comp2 += Math.abs(sum2) >= Math.abs(b) ? sum2 - u + b : b - u + sum2;
    sum2 = u;
  }
  const cSum = sum1 + comp1;
  const cc = sum2 + comp2 - (cSum * cSum) / n;
  if (!(cc > 0)) {
    giveBack(c);
    throw new StatsInputError('constant', 'x is constant, so no line can be fitted');
  }
  const se = powerOfTwoScale([eMax]);
  const e = borrowF64(n);
  let sum3 = 0, comp3 = 0;
  for (let i = 0; i < n; i++) {
    const a = residuals[i] / se;
    e[i] = a;
    const b = a * a;
    const u = sum3 + b;
    comp3 += Math.abs(sum3) >= Math.abs(b) ? sum3 - u + b : b - u + sum3;
    sum3 = u;
  }
  const rss = sum3 + comp3;
  const noise = residualNoise / se;
  const s2 = rss / (n - 2);
  // Every path below writes all three at each i.
  const leverage = borrowF64(n);
  const studentized = borrowF64(n);
  const cooksDistance = borrowF64(n);
  // Each point by the plain formulas in one tight loop, then the few points that need the careful forms below
  // (h > 1/2, or point i carrying over half the RSS) recomputed by `carefully`. Keeping those rare calls out of
  // the long loop matters: a call first reached after V8 has optimised the loop throws the optimised code away
  // and runs the rest of a 100,000-row loop in the interpreter (measured: +20-30 ms on the panel's 4th redraw).
  // The results are the same, value for value, as computing every point carefully.
  const floor0 = (n - 1) * noise * noise;
  const carefully = (i: number): void => {
    const h = leverage[i];
    if (h >= UNIT_LEVERAGE) {
      studentized[i] = NaN;
      cooksDistance[i] = NaN;
      return;
    }
    let oneMinusH = 1 - h;
    if (h > 0.5) {
      const direct = oneMinusLeverage(c, cSum, cc, i);
      if (direct > 0) oneMinusH = direct;
    }
    const ei2 = e[i] * e[i];
    cooksDistance[i] = cookOf(ei2, h, oneMinusH, s2);
    if (n < 4) {
      studentized[i] = NaN;
      return;
    }
    const dropped = ei2 / oneMinusH;
    let deleted: number;
    // What rounding alone leaves in RSS_(i): the residuals' own noise over n - 1 points, plus a few units in the
    // last place of the leave-one-out residuals when those are summed directly.
    let floor = floor0;
    if (2 * dropped > rss) {
      const a = e[i] / oneMinusH;
      const ci = c[i];
      let size = 0;
      deleted = compensatedSum(n, (j) => {
        if (j === i) return 0;
        const shift = a * (1 / n + (ci * c[j]) / cc);
        size += e[j] * e[j] + shift * shift;
        const ej = e[j] + shift;
        return ej * ej;
      });
      floor += 64 * Number.EPSILON * Number.EPSILON * size;
    } else {
      deleted = rss - dropped;
    }
    studentized[i] = studentizedOf(e[i], deleted, floor, n, oneMinusH);
  };
  if (n < 4) {
    for (let i = 0; i < n; i++) {
      leverage[i] = Math.min(1, 1 / n + (c[i] * c[i]) / cc);
      carefully(i);
    }
  } else {
    for (let i = 0; i < n; i++) {
      const h = Math.min(1, 1 / n + (c[i] * c[i]) / cc);
      leverage[i] = h;
      const oneMinusH = 1 - h;
      const ei2 = e[i] * e[i];
      cooksDistance[i] = cookOf(ei2, h, oneMinusH, s2);
      studentized[i] = studentizedOf(e[i], rss - ei2 / oneMinusH, floor0, n, oneMinusH);
    }
    for (let i = 0; i < n; i++) {
      const h = leverage[i];
      if (h > 0.5 || 2 * ((e[i] * e[i]) / (1 - h)) > rss) carefully(i);
    }
  }
  let maxLeverageIndex = 0, maxStudentizedIndex = -1, maxCookIndex = -1;
  for (let i = 0; i < n; i++) {
    if (leverage[i] > leverage[maxLeverageIndex]) maxLeverageIndex = i;
    const d = cooksDistance[i];
    if (d === d && (maxCookIndex < 0 || d > cooksDistance[maxCookIndex])) maxCookIndex = i;
    const t = studentized[i];
    if (t === t && (maxStudentizedIndex < 0 || Math.abs(t) > Math.abs(studentized[maxStudentizedIndex]))) maxStudentizedIndex = i;
  }
  giveBack(c, e);
  return { n, leverage, studentized, cooksDistance, maxLeverageIndex, maxStudentizedIndex, maxCookIndex };
}

/** D_i = e_i^2 h_i / (2 s^2 (1 - h_i)^2); undefined (NaN) when the points lie exactly on the line (s^2 = 0). */
function cookOf(ei2: number, h: number, oneMinusH: number, s2: number): number {
  return s2 > 0 ? (ei2 * h) / (2 * s2 * oneMinusH * oneMinusH) : NaN;
}

/** t_i = e_i / (s_(i) sqrt(1 - h_i)); infinite when, without point i, the rest lie on a line to rounding. */
function studentizedOf(ei: number, deleted: number, floor: number, n: number, oneMinusH: number): number {
  if (!(deleted > floor)) return ei === 0 ? NaN : ei > 0 ? Infinity : -Infinity;
  return ei / (Math.sqrt(deleted / (n - 3)) * Math.sqrt(oneMinusH));
}

/**
 * 1 - h_i for a point of high leverage, without subtracting h_i from 1: (n - 1)/n * Sxx_(i) / Sxx, with Sxx_(i)
 * the corrected two-pass sum of squares of the centred x about their mean without point i. O(n).
 * @param c centred x (summing to cSum, which rounding leaves near 0); cc their sum of squares
 */
function oneMinusLeverage(c: Float64Array, cSum: number, cc: number, i: number): number {
  const n = c.length;
  const m = (cSum - c[i]) / (n - 1);
  const dev = compensatedSum(n, (j) => (j === i ? 0 : c[j] - m));
  const ss = compensatedSum(n, (j) => (j === i ? 0 : (c[j] - m) * (c[j] - m))) - (dev * dev) / (n - 1);
  return ((n - 1) / n) * (ss / cc);
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
