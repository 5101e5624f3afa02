import { normalQuantile, normalSf, studentTSf } from '../distributions';
import { Interval, Tail } from '../types';

/** Fisher's z transform atanh(r) (Fisher 1915, "Frequency distribution of the values of the correlation coefficient in samples from an indefinitely large population", Biometrika 10:507-521). */
export function fisherZ(r: number): number {
  return Math.atanh(r);
}

/**
 * Two-sided interval for a correlation made on the Fisher-z scale: tanh(atanh(r) -/+ q * se), q the normal
 * quantile for `level`. |r| = 1 gives the degenerate interval [r, r].
 */
export function fisherInterval(r: number, se: number, level: number, method: string): Interval {
  const q = normalQuantile(0.5 + level / 2);
  const z = Math.atanh(r);
  let lower = Math.tanh(z - q * se);
  let upper = Math.tanh(z + q * se);
  if (!Number.isFinite(z)) {
    lower = r;
    upper = r;
  }
  // The interval always contains r; rounding at |r| near 1 must not break that.
  if (lower > r) lower = r;
  if (upper < r) upper = r;
  return { lower, upper, level, method };
}

/** p-value of a statistic with a symmetric null distribution, from its upper-tail function `sf`. */
export function pFromSymmetric(stat: number, tail: Tail, sf: (v: number) => number): number {
  if (stat === Infinity || stat === -Infinity) {
    // A perfect correlation: no tail beyond it.
    if (tail === 'both') return 0;
    return (tail === 'positive') === stat > 0 ? 0 : 1;
  }
  let p: number;
  if (tail === 'positive') p = sf(stat);
  else if (tail === 'negative') p = sf(-stat);
  else p = 2 * sf(Math.abs(stat));
  return p > 1 ? 1 : p < 0 ? 0 : p;
}

/** p-value of a standard-normal statistic for the given tail. */
export function pFromZ(z: number, tail: Tail): number {
  return pFromSymmetric(z, tail, normalSf);
}

/** p-value of a t statistic with df degrees of freedom for the given tail. */
export function pFromT(t: number, df: number, tail: Tail): number {
  return pFromSymmetric(t, tail, (v) => studentTSf(v, df));
}

/**
 * The t statistic of a correlation, t = r sqrt(df / (1 - r^2)), with 1 - r^2 formed as (1 - r)(1 + r) to keep
 * digits when |r| is near 1 (Student 1908; Fisher 1915). |r| = 1 gives +/-Infinity.
 */
export function tFromR(r: number, df: number): number {
  const oneMinus = (1 - r) * (1 + r);
  if (oneMinus <= 0) return r > 0 ? Infinity : -Infinity;
  return r * Math.sqrt(df / oneMinus);
}
