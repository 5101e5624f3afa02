/**
 * The F distribution with (d1, d2) degrees of freedom: both tails and both quantiles, accurate to about 1e-13
 * relative from p = ½ down to 1e-300. An infinite df is allowed (the limit is a scaled chi-square).
 *
 * Methods:
 * - Tails through the incomplete beta function, P(F > x) = I_w(d2/2, d1/2) with w = d2/(d2 + d1·x)
 *   (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, 26.6.2), where w and 1 − w are each formed
 *   from the ratio d1·x/d2 without a subtraction, and ln w is used where w would underflow.
 * - Quantiles: closed forms for d1 = 2 (P(F > x) = w^{d2/2}); for d1 = 1 the upper quantile is the square of
 *   the t quantile at p/2; otherwise the better of two starts — the leading term of the tail in question,
 *   I_w(a, b) ≈ w^a/(a·B(a, b)), and the chi-square limit of d1·F for large d2 — polished by Newton steps on
 *   the accurate tail (quantile-search).
 */
import { lnBeta } from './gamma-beta';
import {
  betaPowerTerm,
  betaPowerTermTinyX,
  incompleteBetaTail,
  incompleteBetaTinyX,
} from './incomplete-beta';
import { chiSquareCdf, chiSquareIsf, chiSquareQuantile, chiSquareSf } from './chi-square';
import { solveTail, TailModel } from './quantile-search';
import { studentTIsf } from './student-t';

/** Below this, I_w(a, b) = w^a/(a·B(a, b))·(1 + O(w)) to double precision, and w itself may underflow. */
const TINY_W = 1e-17;

/**
 * P(F > x) (upper = true) or P(F ≤ x) (upper = false) for finite d1, d2 > 0 and 0 < x < ∞:
 * P(F > x) = I_w(d2/2, d1/2) with w = d2/(d2 + d1x) = 1/(1 + r), r = (d1/d2)·x, and P(F ≤ x) = I_{1−w}(d1/2, d2/2).
 */
function finiteTail(x: number, d1: number, d2: number, upper: boolean): number {
  const a = d2 / 2;
  const b = d1 / 2;
  const ratio = (d1 / d2) * x;
  if (ratio > 1 / TINY_W) {
    // w < 1e-17: the upper tail is the leading term in ln w = ln(d2/d1) − ln x.
    const small = incompleteBetaTinyX(Math.log(d2 / d1) - Math.log(x), a, b);
    return upper ? small : 1 - small;
  }
  if (ratio < TINY_W) {
    // 1 − w < 1e-17: the lower tail is the leading term in ln(1 − w) = ln(d1/d2) + ln x.
    const small = incompleteBetaTinyX(Math.log(d1 / d2) + Math.log(x), b, a);
    return upper ? 1 - small : small;
  }
  if (ratio > 1) {
    const inverse = 1 / ratio;
    return incompleteBetaTail(inverse / (1 + inverse), 1 / (1 + inverse), a, b, upper);
  }
  return incompleteBetaTail(1 / (1 + ratio), ratio / (1 + ratio), a, b, upper);
}

/** x·f(x) for the F density f: w^{d2/2}(1 − w)^{d1/2}/B(d2/2, d1/2). */
function scaledDensity(x: number, d1: number, d2: number): number {
  const a = d2 / 2;
  const b = d1 / 2;
  const ratio = (d1 / d2) * x;
  if (ratio > 1 / TINY_W) return betaPowerTermTinyX(Math.log(d2 / d1) - Math.log(x), a, b);
  if (ratio < TINY_W) return betaPowerTermTinyX(Math.log(d1 / d2) + Math.log(x), b, a);
  if (ratio > 1) {
    const inverse = 1 / ratio;
    return betaPowerTerm(a, b, inverse / (1 + inverse), 1 / (1 + inverse));
  }
  return betaPowerTerm(a, b, 1 / (1 + ratio), ratio / (1 + ratio));
}

function isBadDf(df: number): boolean {
  return Number.isNaN(df) || !(df > 0);
}

function tail(x: number, d1: number, d2: number, upper: boolean): number {
  if (Number.isNaN(x) || isBadDf(d1) || isBadDf(d2)) return NaN;
  if (x <= 0) return upper ? 1 : 0;
  if (x === Infinity) return upper ? 0 : 1;
  if (d1 === Infinity && d2 === Infinity) return (x < 1) === upper ? 1 : 0;
  // d2 → ∞: F → χ²(d1)/d1.  d1 → ∞: F → d2/χ²(d2), so P(F > x) = P(χ²(d2) < d2/x).
  if (d2 === Infinity) return upper ? chiSquareSf(d1 * x, d1) : chiSquareCdf(d1 * x, d1);
  if (d1 === Infinity) return upper ? chiSquareCdf(d2 / x, d2) : chiSquareSf(d2 / x, d2);
  return finiteTail(x, d1, d2, upper);
}

/**
 * Upper tail P(F > x) of the F distribution, computed directly (not as 1 − cdf). x ≤ 0 gives 1.
 * NaN for NaN input or a df ≤ 0.
 * @example fSf(4.96460274373071, 1, 10) // 0.05
 */
export function fSf(x: number, d1: number, d2: number): number {
  return tail(x, d1, d2, true);
}

/**
 * Lower tail P(F ≤ x) of the F distribution, accurate also when small. x ≤ 0 gives 0.
 * @example fCdf(4.96460274373071, 1, 10) // 0.95
 */
export function fCdf(x: number, d1: number, d2: number): number {
  return tail(x, d1, d2, false);
}

/** The x with P(F > x) = p (upper = true) or P(F ≤ x) = p (upper = false), for 0 < p ≤ ½, finite d1, d2. */
function quantileOfSmallTail(p: number, d1: number, d2: number, upper: boolean): number {
  const a = d2 / 2;
  const b = d1 / 2;
  if (d1 === 2) {
    // P(F > x) = w^a: w = p^{1/a} (upper) or (1 − p)^{1/a} (lower), and x = (d2/2)(1/w − 1).
    return a * Math.expm1(-(upper ? Math.log(p) : Math.log1p(-p)) / a);
  }
  if (d1 === 1 && upper) {
    const t = studentTIsf(p / 2, d2);
    return t * t;
  }
  const model: TailModel = {
    upper,
    tail: (x) => finiteTail(x, d1, d2, upper),
    scaledDensity: (x) => scaledDensity(x, d1, d2),
  };
  const logBeta = lnBeta(a, b);
  let fromTail: number;
  if (upper) {
    // I_w(a, b) ≈ w^a/(a·B(a, b)) = p, then x = (d2/d1)(1/w − 1).
    const logW = Math.min((Math.log(p) + Math.log(a) + logBeta) / a, 0);
    fromTail = (d2 / d1) * Math.expm1(-logW);
  } else {
    // I_{1−w}(b, a) ≈ (1 − w)^b/(b·B(a, b)) = p, then x = (d2/d1)/(1/(1 − w) − 1).
    const logV = Math.min((Math.log(p) + Math.log(b) + logBeta) / b, 0);
    fromTail = d2 / d1 / Math.expm1(-logV);
  }
  // For large d2, d1·F is nearly χ²(d1).
  const fromChiSquare = (upper ? chiSquareIsf(p, d1) : chiSquareQuantile(p, d1)) / d1;
  return solveTail(model, p, fromTail, fromChiSquare);
}

function quantile(p: number, d1: number, d2: number, upper: boolean): number {
  if (Number.isNaN(p) || isBadDf(d1) || isBadDf(d2) || p < 0 || p > 1) return NaN;
  // The x at which the asked-for tail equals p; p = 0 or 1 sits at an end of the support.
  if (p === 0) return upper ? Infinity : 0;
  if (p === 1) return upper ? 0 : Infinity;
  if (d1 === Infinity && d2 === Infinity) return 1;
  if (d2 === Infinity) return (upper ? chiSquareIsf(p, d1) : chiSquareQuantile(p, d1)) / d1;
  if (d1 === Infinity) return d2 / (upper ? chiSquareQuantile(p, d2) : chiSquareIsf(p, d2));
  // Solve in the smaller tail; 1 − p is exact for p > ½.
  return p <= 0.5 ? quantileOfSmallTail(p, d1, d2, upper) : quantileOfSmallTail(1 - p, d1, d2, !upper);
}

/**
 * Lower-tail quantile of the F distribution: the x with P(F ≤ x) = p.
 * Returns 0 for p = 0, +Infinity for p = 1, NaN for p outside [0, 1], NaN input or a df ≤ 0.
 * @example fQuantile(0.95, 1, 10) // 4.96460274373071
 */
export function fQuantile(p: number, d1: number, d2: number): number {
  return quantile(p, d1, d2, false);
}

/**
 * Upper-tail quantile of the F distribution: the x with P(F > x) = p, accurate also for tiny p.
 * Returns +Infinity for p = 0, 0 for p = 1, NaN for p outside [0, 1], NaN input or a df ≤ 0.
 * @example fIsf(0.05, 1, 10) // 4.96460274373071
 */
export function fIsf(p: number, d1: number, d2: number): number {
  return quantile(p, d1, d2, true);
}
