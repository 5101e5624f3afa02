import { StatsInputError } from './types';

/**
 * Centred second moments of two paired columns, computed so that neither offsets nor magnitudes cost accuracy.
 *
 * - Each column is first scaled by a power of two near its largest magnitude (exact in binary floating point), so
 *   values from 1e-300 to 1e300 neither overflow nor underflow when squared.
 * - Means and sums of squares use the corrected two-pass algorithm (Chan, Golub & LeVeque 1983, "Algorithms for
 *   computing the sample variance: analysis and recommendations", The American Statistician 37:242-247): the
 *   second pass subtracts (sum of deviations)^2 / n, which removes the rounding error left in the mean. On NIST
 *   StRD NumAcc data (offsets of 1e7 with unit spread) this is exact to the last digits.
 *
 * The returned sums are on the scaled columns; `scaleX`/`scaleY` undo the scaling where a caller needs original
 * units (slope, intercept). Written here rather than taken from simple-statistics, whose one-pass
 * sampleCovariance/sampleCorrelation lose digits on large offsets.
 */
export interface CoMoments {
  n: number;
  meanX: number;
  meanY: number;
  /** Sum of squared deviations of x / scaleX (so the true Sxx = sxx * scaleX^2). */
  sxx: number;
  syy: number;
  sxy: number;
  scaleX: number;
  scaleY: number;
}

/** Largest power of two not above max |v|, or 1 when all values are 0. Power-of-two scaling is exact. */
export function powerOfTwoScale(v: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) {
    const a = Math.abs(v[i]);
    if (a > m) m = a;
  }
  if (m === 0 || !Number.isFinite(m)) return 1;
  return Math.pow(2, Math.floor(Math.log2(m)));
}

/** Neumaier-compensated mean of v / scale. */
function scaledMean(v: ArrayLike<number>, scale: number): number {
  let sum = 0;
  let comp = 0;
  const inv = 1 / scale;
  for (let i = 0; i < v.length; i++) {
    const a = v[i] * inv;
    const t = sum + a;
    comp += Math.abs(sum) >= Math.abs(a) ? sum - t + a : a - t + sum;
    sum = t;
  }
  return (sum + comp) / v.length;
}

/**
 * Co-moments of x and y (equal length, all finite).
 * @throws StatsInputError when the lengths differ.
 */
export function coMoments(x: ArrayLike<number>, y: ArrayLike<number>): CoMoments {
  const n = x.length;
  if (y.length !== n) throw new StatsInputError('unequal-length', 'x and y must hold the same number of values');
  const scaleX = powerOfTwoScale(x);
  const scaleY = powerOfTwoScale(y);
  const mx = scaledMean(x, scaleX);
  const my = scaledMean(y, scaleY);
  const ix = 1 / scaleX;
  const iy = 1 / scaleY;
  let sdx = 0, sdy = 0, sxx = 0, syy = 0, sxy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i] * ix - mx;
    const dy = y[i] * iy - my;
    sdx += dx;
    sdy += dy;
    sxx += dx * dx;
    syy += dy * dy;
    sxy += dx * dy;
  }
  // Corrected two-pass: remove the residual error of the mean (Chan, Golub & LeVeque 1983, eq. 1.7).
  sxx -= (sdx * sdx) / n;
  syy -= (sdy * sdy) / n;
  sxy -= (sdx * sdy) / n;
  if (sxx < 0) sxx = 0;
  if (syy < 0) syy = 0;
  return { n, meanX: (mx + sdx / n) * scaleX, meanY: (my + sdy / n) * scaleY, sxx, syy, sxy, scaleX, scaleY };
}
