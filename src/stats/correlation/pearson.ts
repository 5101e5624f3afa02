import { coMoments, CoMoments } from './comoments';
import { StatsInputError } from '../types';

/** Clip a coefficient to [-1, 1]: rounding can push |r| a hair past 1 on perfectly linear data. */
export function clipUnit(r: number): number {
  return r > 1 ? 1 : r < -1 ? -1 : r;
}

/** Checks both columns vary; the message names the column. */
export function assertVaries(m: CoMoments, xName = 'x', yName = 'y'): void {
  if (!(m.sxx > 0)) throw new StatsInputError('constant', `${xName} is constant: a correlation needs variation in both columns`);
  if (!(m.syy > 0)) throw new StatsInputError('constant', `${yName} is constant: a correlation needs variation in both columns`);
}

/** Pearson's r from co-moments (Pearson 1896, Phil. Trans. R. Soc. A 187:253-318), clipped to [-1, 1]. */
export function pearsonFromMoments(m: CoMoments): number {
  const prod = m.sxx * m.syy;
  // One rounding in the product and one in the root; the split form only where the product would leave range.
  const denom = prod > 1e-300 && prod < 1e300 ? Math.sqrt(prod) : Math.sqrt(m.sxx) * Math.sqrt(m.syy);
  return clipUnit(m.sxy / denom);
}

/**
 * Pearson product-moment correlation of two equal-length finite columns.
 * @throws StatsInputError when a column is constant or the lengths differ.
 * @example pearson([1, 2, 3, 4], [0, 1, 0.5, 1]) // 0.6741998624632421
 */
export function pearson(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const m = coMoments(x, y);
  assertVaries(m);
  return pearsonFromMoments(m);
}
