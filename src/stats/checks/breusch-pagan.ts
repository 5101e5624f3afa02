import { borrowF64, giveBack } from '../internal/scratch';
import { coMoments, powerOfTwoScale } from '../correlation/comoments';
import { chiSquareSf } from '../distributions';
import { pearsonFromMoments } from '../correlation/pearson';
import { StatsInputError } from '../types';

/** Koenker's studentized Breusch-Pagan test with x as the only variance regressor. */
export interface SpreadTest {
  n: number;
  /** n R^2 of the squared residuals on x; approximately chi-square with 1 df when the spread is even. */
  statistic: number;
  df: 1;
  pValue: number;
  /** Whether the squared residuals grow ("widens") or shrink ("narrows") as x grows. */
  trend: 'widens' | 'narrows';
}

/**
 * Does the scatter around the line stay even across x? The Breusch-Pagan test (Breusch & Pagan 1979,
 * Econometrica 47:1287-1294) in Koenker's studentized form (Koenker 1981, "A note on studentizing a test for
 * heteroscedasticity", Journal of Econometrics 17:107-112): n R^2 from regressing the squared residuals on x,
 * referred to chi-square with 1 df. Studentizing drops the original test's reliance on normal errors.
 *
 * With one regressor, R^2 is the squared Pearson correlation of e^2 with x, computed from centred co-moments;
 * residuals are first scaled by a power of two so that squaring neither overflows nor underflows. O(n).
 * @param x the predictor
 * @param residuals least-squares residuals of y on x
 * @throws StatsInputError for fewer than 4 points, or when the squared residuals are all equal (no scatter to
 *   compare, e.g. all points on the line).
 */
export function breuschPagan(x: ArrayLike<number>, residuals: ArrayLike<number>): SpreadTest {
  const n = x.length;
  if (residuals.length !== n) throw new StatsInputError('unequal-length', 'x and the residuals must have the same length');
  if (n < 4) throw new StatsInputError('too-few', 'testing the spread needs at least 4 points');
  const scale = powerOfTwoScale(residuals);
  const squared = borrowF64(n);
  for (let i = 0; i < n; i++) {
    const e = residuals[i] / scale;
    squared[i] = e * e;
  }
  const m = coMoments(x, squared);
  giveBack(squared);
  if (!(m.sxx > 0)) throw new StatsInputError('constant', 'x is constant, so the spread cannot be compared across it');
  if (!(m.syy > 0)) throw new StatsInputError('constant', 'the residuals are all the same size, so there is no spread to compare');
  const r = pearsonFromMoments(m);
  const statistic = n * r * r;
  return { n, statistic, df: 1, pValue: chiSquareSf(statistic, 1), trend: r >= 0 ? 'widens' : 'narrows' };
}
