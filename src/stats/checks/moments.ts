import { powerOfTwoScale } from '../correlation/comoments';
import { StatsInputError } from '../types';

/** Shape of one column: sample skewness and excess kurtosis from the central moments. */
export interface ShapeMoments {
  n: number;
  mean: number;
  /** Sample skewness g1 = m3 / m2^(3/2) (the sqrt(b1) of D'Agostino's tests). 0 for a symmetric column. */
  skewness: number;
  /** Excess kurtosis g2 = m4 / m2^2 - 3 (b2 - 3). 0 for a normal shape, negative for flat, positive for heavy tails. */
  excessKurtosis: number;
}

/**
 * Sample skewness and excess kurtosis as moment ratios, g1 = m3/m2^1.5 and g2 = m4/m2^2 - 3, with m_k the k-th
 * central moment divided by n (Pearson 1895; the b1, b2 of D'Agostino, Belanger & D'Agostino 1990, "A suggestion
 * for using powerful and informative tests of normality", The American Statistician 44:316-321).
 *
 * Two passes over the column, scaled by a power of two first, so offsets and huge or tiny magnitudes cost no
 * accuracy; the mean is corrected by the mean deviation of the second pass (Chan, Golub & LeVeque 1983). O(n).
 * @throws StatsInputError when fewer than 3 values are given or the column is constant.
 * @example shapeMoments([1, 2, 3, 10]).skewness // 1.0437...
 */
export function shapeMoments(v: ArrayLike<number>): ShapeMoments {
  const n = v.length;
  if (n < 3) throw new StatsInputError('too-few', 'skewness and kurtosis need at least 3 values');
  const scale = powerOfTwoScale(v);
  const inv = 1 / scale;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += v[i] * inv;
  let mean = sum / n;
  let d1 = 0;
  for (let i = 0; i < n; i++) d1 += v[i] * inv - mean;
  mean += d1 / n;
  let m2 = 0, m3 = 0, m4 = 0;
  for (let i = 0; i < n; i++) {
    const d = v[i] * inv - mean;
    const d2 = d * d;
    m2 += d2;
    m3 += d2 * d;
    m4 += d2 * d2;
  }
  m2 /= n;
  m3 /= n;
  m4 /= n;
  if (!(m2 > 0)) throw new StatsInputError('constant', 'the column is constant: it has no shape to describe');
  return {
    n,
    mean: mean * scale,
    skewness: m3 / (m2 * Math.sqrt(m2)),
    excessKurtosis: m4 / (m2 * m2) - 3,
  };
}
