import { normalQuantile, normalSf } from '../distributions';
import { StatsInputError } from '../types';

/** Shapiro-Wilk W and its p-value. */
export interface ShapiroWilkResult {
  n: number;
  /** W, in (0, 1]; values near 1 are consistent with a normal shape. */
  statistic: number;
  /** Upper-tail p-value of Royston's normalizing transformation (exact for n = 3). */
  pValue: number;
}

/** Smallest and largest sample size the approximation is valid for (Royston 1995). */
export const SHAPIRO_WILK_MIN_N = 3;
export const SHAPIRO_WILK_MAX_N = 5000;

/** Polynomial c[0] + c[1] x + c[2] x^2 + ... (Horner). */
function poly(c: readonly number[], x: number): number {
  let r = 0;
  for (let i = c.length - 1; i >= 0; i--) r = r * x + c[i];
  return r;
}

// Royston (1995), AS R94, Table 1 and section 2: polynomial approximations in u = 1/sqrt(n) for the two largest
// coefficients and in n or log(n) for the mean and log-sd of the normalized statistic.
const C1 = [0, 0.221157, -0.147981, -2.07119, 4.434685, -2.706056];
const C2 = [0, 0.042981, -0.293762, -1.752461, 5.682633, -3.582633];
const C3 = [0.544, -0.39978, 0.025054, -6.714e-4];
const C4 = [1.3822, -0.77857, 0.062767, -0.0020322];
const C5 = [-1.5861, -0.31082, -0.083751, 0.0038915];
const C6 = [-0.4803, -0.082676, 0.0030302];
const G = [-2.273, 0.459];

/**
 * The Shapiro-Wilk test of normality (Shapiro & Wilk 1965, "An analysis of variance test for normality (complete
 * samples)", Biometrika 52:591-611), computed by Royston's algorithm AS R94 (Royston 1995, "Remark AS R94: A
 * remark on Algorithm AS 181: The W-test for normality", Applied Statistics 44:547-551): approximate coefficients
 * from normal scores m_i = Phi^-1((i - 3/8)/(n + 1/4)), W as the squared correlation of the ordered data with the
 * coefficients (computed as 1 - W to keep digits when W is near 1), and p from Royston's normalizing
 * transformation: log(1 - W) for n >= 12, -log(gamma - log(1 - W)) for 4 <= n <= 11, exact for n = 3.
 *
 * Written here rather than taken from a library: none of the project's JavaScript dependencies implements AS R94.
 * O(n log n) for the sort.
 * @throws StatsInputError when n < 3, n > 5000 (the approximation's range) or all values are equal.
 * @example shapiroWilk([0.11, 7.87, 4.61, 10.14, 7.95, 3.14, 0.46, 4.43, 0.21, 4.75, 0.71, 1.52, 3.24, 0.93, 0.42,
 *   4.97, 9.53, 4.55, 0.47, 6.66]) // { statistic: 0.90047..., pValue: 0.04208... }
 */
export function shapiroWilk(values: ArrayLike<number>): ShapiroWilkResult {
  const n = values.length;
  if (n < SHAPIRO_WILK_MIN_N) throw new StatsInputError('too-few', 'the Shapiro-Wilk test needs at least 3 values');
  if (n > SHAPIRO_WILK_MAX_N) {
    throw new StatsInputError('too-large', 'the Shapiro-Wilk approximation is valid for at most 5000 values');
  }
  const x = Float64Array.from(values).sort();
  const range = x[n - 1] - x[0];
  if (!(range > 0)) throw new StatsInputError('constant', 'all values are equal, so their shape cannot be tested');

  // Coefficients a[1..half] (1-based, as in the paper), antisymmetric: a_{n+1-i} = -a_i.
  const half = Math.floor(n / 2);
  const a = new Float64Array(half + 1);
  if (n === 3) {
    a[1] = Math.SQRT1_2;
  } else {
    const an25 = n + 0.25;
    let summ2 = 0;
    for (let i = 1; i <= half; i++) {
      a[i] = normalQuantile((i - 0.375) / an25);
      summ2 += a[i] * a[i];
    }
    summ2 *= 2;
    const ssumm2 = Math.sqrt(summ2);
    const rsn = 1 / Math.sqrt(n);
    const a1 = poly(C1, rsn) - a[1] / ssumm2;
    let first: number;
    let fac: number;
    if (n > 5) {
      first = 3;
      const a2 = -a[2] / ssumm2 + poly(C2, rsn);
      fac = Math.sqrt((summ2 - 2 * a[1] * a[1] - 2 * a[2] * a[2]) / (1 - 2 * a1 * a1 - 2 * a2 * a2));
      a[2] = a2;
    } else {
      first = 2;
      fac = Math.sqrt((summ2 - 2 * a[1] * a[1]) / (1 - 2 * a1 * a1));
    }
    a[1] = a1;
    for (let i = first; i <= half; i++) a[i] /= -fac;
  }

  // Coefficient of the i-th order statistic (0-based): negative in the lower half, positive in the upper half,
  // zero for the middle value of an odd sample. a[1] holds the (positive) coefficient of the extremes after the
  // sign convention of AS R94, where the lower half carries the stored sign.
  const coef = (i: number): number => {
    const j = n - 1 - i;
    if (i === j) return 0;
    return i < j ? -a[i + 1] : a[j + 1];
  };

  // W as the squared correlation between the data (scaled by the range) and the coefficients; 1 - W directly.
  let meanA = 0, meanX = 0;
  // Shifting by the smallest value first keeps the digits that a large common offset would otherwise take.
  const low = x[0];
  for (let i = 0; i < n; i++) {
    meanA += coef(i);
    meanX += (x[i] - low) / range;
  }
  meanA /= n;
  meanX /= n;
  let ssa = 0, ssx = 0, sax = 0;
  for (let i = 0; i < n; i++) {
    const da = coef(i) - meanA;
    const dx = (x[i] - low) / range - meanX;
    ssa += da * da;
    ssx += dx * dx;
    sax += da * dx;
  }
  const root = Math.sqrt(ssa * ssx);
  const w1 = ((root - sax) * (root + sax)) / (ssa * ssx);
  const w = 1 - w1;

  if (n === 3) {
    // Exact distribution for n = 3 (Shapiro & Wilk 1965): p = (6/pi)(asin(sqrt(W)) - asin(sqrt(3/4))).
    const p = (6 / Math.PI) * (Math.asin(Math.sqrt(w)) - Math.PI / 3);
    return { n, statistic: w, pValue: Math.min(1, Math.max(0, p)) };
  }
  let y = Math.log(w1);
  let m: number;
  let s: number;
  if (n <= 11) {
    const gamma = poly(G, n);
    // Beyond the transformation's support: W is so far below 1 that the p-value is negligible.
    if (y >= gamma) return { n, statistic: w, pValue: 0 };
    y = -Math.log(gamma - y);
    m = poly(C3, n);
    s = Math.exp(poly(C4, n));
  } else {
    const ln = Math.log(n);
    m = poly(C5, ln);
    s = Math.exp(poly(C6, ln));
  }
  return { n, statistic: w, pValue: normalSf((y - m) / s) };
}
