/**
 * Student's t distribution: both tails and both quantiles, accurate to about 1e-13 relative from p = ½ down to
 * 1e-300, for any df > 0 (df = Infinity is the standard normal).
 *
 * Methods:
 * - Tails through the incomplete beta function, P(T > t) = ½·I_x(df/2, ½) with x = df/(df + t²)
 *   (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, formula 26.7.1), where x and 1 − x are each
 *   formed from t²/df without a subtraction, and neither overflows for huge t.
 * - Quantiles: closed forms for df = 1 (Cauchy) and df = 2; otherwise the better of two starts — the
 *   Cornish–Fisher expansion of t in terms of the normal quantile (Fisher & Cornish 1960, "The percentile points
 *   of distributions having known cumulants", Technometrics 2(2):209–225; A&S 26.7.5) and the power-law tail
 *   P(T > t) ≈ x^{df/2}/(df·B(df/2, ½)) — polished by Newton steps on the accurate upper tail (quantile-search).
 */
import { lnBeta } from './gamma-beta';
import { betaPowerTerm, betaPowerTermTinyX, incompleteBetaTail, incompleteBetaTinyX } from './incomplete-beta';
import { normalIsf, normalSf } from './normal';
import { solveTail, TailModel } from './quantile-search';

/** Below this x = df/(df + t²), I_x(df/2, ½) = x^{df/2}/(…)·(1 + O(x)) to double precision; x may underflow. */
const TINY_X = 1e-17;

/**
 * 2·P(T > |t|) for finite t and finite df > 0 is I_x(df/2, ½); this returns I_x (lower = true) or
 * I_{1−x}(½, df/2) = 1 − I_x (lower = false), with x = df/(df + t²) and 1 − x = t²/(df + t²) both computed
 * from a ratio, never by subtraction. For huge |t| it works with ln x, which stays finite where x underflows
 * (df = 1, t = 1e200 has P(T > t) = 3.2e-201 although x = 1e-400).
 */
function betaTailOfT(t: number, df: number, lower: boolean): number {
  const square = t * t;
  if (square > df / TINY_X) {
    const small = incompleteBetaTinyX(Math.log(df) - 2 * Math.log(Math.abs(t)), df / 2, 0.5);
    return lower ? small : 1 - small;
  }
  if (square > df) {
    const inverseRatio = df / square;
    return incompleteBetaTail(inverseRatio / (1 + inverseRatio), 1 / (1 + inverseRatio), df / 2, 0.5, lower);
  }
  const ratio = square / df;
  return incompleteBetaTail(1 / (1 + ratio), ratio / (1 + ratio), df / 2, 0.5, lower);
}

/** |t|·f(|t|) for the t density f, = x^{df/2}(1 − x)^{½}/B(df/2, ½) (see betaTailOfT for x). */
function scaledDensityOfT(t: number, df: number): number {
  const square = t * t;
  if (square > df / TINY_X) return betaPowerTermTinyX(Math.log(df) - 2 * Math.log(Math.abs(t)), df / 2, 0.5);
  if (square > df) {
    const inverseRatio = df / square;
    return betaPowerTerm(df / 2, 0.5, inverseRatio / (1 + inverseRatio), 1 / (1 + inverseRatio));
  }
  const ratio = square / df;
  return betaPowerTerm(df / 2, 0.5, 1 / (1 + ratio), ratio / (1 + ratio));
}

function isBadDf(df: number): boolean {
  return Number.isNaN(df) || !(df > 0);
}

/**
 * Upper tail P(T > t) of Student's t with df degrees of freedom, computed directly (not as 1 − cdf).
 * df = Infinity gives the normal tail; NaN for NaN input or df ≤ 0.
 * @example studentTSf(2.22813885198627, 10) // 0.025
 */
export function studentTSf(t: number, df: number): number {
  if (Number.isNaN(t) || isBadDf(df)) return NaN;
  if (df === Infinity) return normalSf(t);
  if (t === Infinity) return 0;
  if (t === -Infinity) return 1;
  if (t === 0) return 0.5;
  if (t > 0) return 0.5 * betaTailOfT(t, df, true);
  // P(T > −|t|) = 1 − ½I_x = ½ + ½(1 − I_x), the complement taken directly.
  return 0.5 + 0.5 * betaTailOfT(t, df, false);
}

/**
 * Lower tail P(T ≤ t) of Student's t (the mirror image of studentTSf, equally accurate for t ≪ 0).
 * @example studentTCdf(-2.22813885198627, 10) // 0.025
 */
export function studentTCdf(t: number, df: number): number {
  return studentTSf(-t, df);
}

/** Fisher & Cornish (1960) expansion of the t quantile in powers of 1/df around the normal quantile z (A&S 26.7.5). */
function cornishFisherT(z: number, df: number): number {
  const z2 = z * z;
  const g1 = (z * (z2 + 1)) / 4;
  const g2 = (z * ((5 * z2 + 16) * z2 + 3)) / 96;
  const g3 = (z * (((3 * z2 + 19) * z2 + 17) * z2 - 15)) / 384;
  const g4 = (z * ((((79 * z2 + 776) * z2 + 1482) * z2 - 1920) * z2 - 945)) / 92160;
  return z + (g1 + (g2 + (g3 + g4 / df) / df) / df) / df;
}

/** t with P(T > t) = p for 0 < p < ½, finite df > 0. */
function upperQuantileBelowHalf(p: number, df: number): number {
  if (df === 1) return p <= 0.25 ? 1 / Math.tan(Math.PI * p) : Math.tan(Math.PI * (0.5 - p));
  if (df === 2) return (1 - 2 * p) / Math.sqrt(2 * p * (1 - p));
  const a = df / 2;
  const model: TailModel = {
    upper: true,
    tail: (t) => 0.5 * betaTailOfT(t, df, true),
    scaledDensity: (t) => scaledDensityOfT(t, df),
  };
  const z = normalIsf(p);
  const fromNormal = cornishFisherT(z, df);
  // Power-law tail: ½·x^a/(a·B(a, ½)) = p, then t = √(df(1 − x)/x).
  const x = Math.exp((Math.log(2 * p * a) + lnBeta(a, 0.5)) / a);
  const fromTail = x < 1 ? Math.sqrt((df * (1 - x)) / x) : undefined;
  return solveTail(model, p, fromNormal > 0 ? fromNormal : z, fromTail);
}

/**
 * Upper-tail quantile of Student's t: the t with P(T > t) = p, accurate also for tiny p (1e-300).
 * Returns +Infinity for p = 0, −Infinity for p = 1, and NaN for p outside [0, 1], NaN input or df ≤ 0.
 * @example studentTIsf(0.025, 10) // 2.22813885198627
 */
export function studentTIsf(p: number, df: number): number {
  if (Number.isNaN(p) || isBadDf(df) || p < 0 || p > 1) return NaN;
  if (p === 0) return Infinity;
  if (p === 1) return -Infinity;
  if (p === 0.5) return 0;
  if (df === Infinity) return normalIsf(p);
  if (p > 0.5) return -upperQuantileBelowHalf(1 - p, df); // 1 − p is exact here
  return upperQuantileBelowHalf(p, df);
}

/**
 * Lower-tail quantile of Student's t: the t with P(T ≤ t) = p (by symmetry, −studentTIsf(p, df)).
 * @example studentTQuantile(0.975, 10) // 2.22813885198627
 */
export function studentTQuantile(p: number, df: number): number {
  const t = studentTIsf(p, df);
  return t === 0 ? 0 : -t;
}
