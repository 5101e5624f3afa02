import { CoMoments } from './comoments';
import { StatsInputError } from '../types';

/** Clip a coefficient to [-1, 1]: rounding can push |r| a hair past 1 on perfectly linear data. */
export function clipUnit(r: number): number {
  return r > 1 ? 1 : r < -1 ? -1 : r;
}

/** Whether some value differs from the first (a scan that stops at the first difference; -0 equals 0). */
function varies(v: ArrayLike<number>): boolean {
  const first = v[0];
  for (let i = 1; i < v.length; i++) if (v[i] !== first) return true;
  return false;
}

/**
 * Checks both columns vary, from the values themselves: for the rank coefficients, which need no co-moments (on
 * varying data the scan stops within the first rows). Same messages as assertVaries.
 */
export function assertValuesVary(x: ArrayLike<number>, y: ArrayLike<number>, xName = 'x', yName = 'y'): void {
  if (!varies(x)) throw new StatsInputError('constant', `${xName} is constant: a correlation needs variation in both columns`);
  if (!varies(y)) throw new StatsInputError('constant', `${yName} is constant: a correlation needs variation in both columns`);
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
