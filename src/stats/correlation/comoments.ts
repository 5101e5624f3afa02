import { StatsInputError } from '../types';

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
 * - When every value of a column is a decimal with at most 9 places (as typed into a spreadsheet), the column is
 *   read as exact integers k = x * 10^d: fl(10000000.1) then counts as the decimal 10000000.1 it was typed as, so
 *   NIST's decimal data (NumAcc4: SD 0.1 around 1e7) keep 12+ correct digits instead of the ~8 that the binary
 *   values themselves carry. A value that is not such a decimal sends the column down the binary path.
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

/** Most decimal places tried when reading a column as exact decimals. */
export const MAX_PLACES = 9;
/** 10^d for the decimal places tried (shared with residuals.ts, which reads decimals the same way). */
export const POW10 = [1, 10, 100, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9];
/** Below this many rows a column is tried as exact decimals (the sums of its integers stay exact well past it). */
export const DECIMAL_ROWS = 1e7;

/**
 * The smallest d <= 9 such that every value is the double nearest to some integer / 10^d with |integer| < 2^52,
 * or -1 when there is none. Checking Math.round(x * 10^d) / 10^d === x is exact: the division of an exactly
 * representable integer by a power of ten is correctly rounded, so equality means x is that decimal's double.
 */
export function decimalPlaces(v: ArrayLike<number>): number {
  let d = 0;
  const limit = 4503599627370496; // 2^52
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    let s = POW10[d];
    while (Math.round(x * s) / s !== x || Math.abs(x * s) >= limit) {
      d++;
      if (d > MAX_PLACES) return -1;
      s = POW10[d];
    }
  }
  return d;
}

/** Neumaier-compensated mean of v / scale (shared with residuals.ts, which centres its columns the same way). */
export function scaledMean(v: ArrayLike<number>, scale: number): number {
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
  if (n > 0 && n < DECIMAL_ROWS) {
    const dx = decimalPlaces(x);
    const dy = dx >= 0 ? decimalPlaces(y) : -1;
    if (dx >= 0 && dy >= 0) return decimalCoMoments(x, y, dx, dy);
  }
  // Both columns in each pass (the same sums as column by column, in the same order: one pass instead of two).
  let ax = 0;
  let ay = 0;
  for (let i = 0; i < n; i++) {
    const a = Math.abs(x[i]);
    const b = Math.abs(y[i]);
    if (a > ax) ax = a;
    if (b > ay) ay = b;
  }
  const scaleX = powerOfTwoScale([ax]);
  const scaleY = powerOfTwoScale([ay]);
  const ix = 1 / scaleX;
  const iy = 1 / scaleY;
  let sumX = 0, compX = 0, sumY = 0, compY = 0;
  for (let i = 0; i < n; i++) {
    const a = x[i] * ix;
    const b = y[i] * iy;
    const t = sumX + a;
    compX += Math.abs(sumX) >= Math.abs(a) ? sumX - t + a : a - t + sumX;
    sumX = t;
    const u = sumY + b;
    compY += Math.abs(sumY) >= Math.abs(b) ? sumY - u + b : b - u + sumY;
    sumY = u;
  }
  const mx = (sumX + compX) / n;
  const my = (sumY + compY) / n;
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

/**
 * Co-moments of columns read as exact decimals (see decimalPlaces). With integers k = round(x * 10^d) centred on
 * an integer near their mean, the deviations are exact; only the final sums of squares round (relative 1e-16).
 * The scale factors returned are 10^-d, so the true Sxx = sxx * scaleX^2 as in the binary path.
 */
function decimalCoMoments(x: ArrayLike<number>, y: ArrayLike<number>, dx: number, dy: number): CoMoments {
  const n = x.length;
  const sx = POW10[dx];
  const sy = POW10[dy];
  let kx = 0, ky = 0; // first pass: exact integer sums while below 2^53, else rounded (only centres them)
  for (let i = 0; i < n; i++) {
    kx += Math.round(x[i] * sx);
    ky += Math.round(y[i] * sy);
  }
  const cx = Math.round(kx / n);
  const cy = Math.round(ky / n);
  let sdx = 0, sdy = 0, sxx = 0, syy = 0, sxy = 0;
  for (let i = 0; i < n; i++) {
    const ex = Math.round(x[i] * sx) - cx;
    const ey = Math.round(y[i] * sy) - cy;
    sdx += ex;
    sdy += ey;
    sxx += ex * ex;
    syy += ey * ey;
    sxy += ex * ey;
  }
  sxx -= (sdx * sdx) / n;
  syy -= (sdy * sdy) / n;
  sxy -= (sdx * sdy) / n;
  if (sxx < 0) sxx = 0;
  if (syy < 0) syy = 0;
  // Scale the integer sums down to a moderate range so later products cannot overflow.
  const px = powerOfTwoScale([Math.sqrt(sxx) || 1]);
  const py = powerOfTwoScale([Math.sqrt(syy) || 1]);
  return {
    n,
    meanX: (cx + sdx / n) / sx,
    meanY: (cy + sdy / n) / sy,
    sxx: sxx / (px * px),
    syy: syy / (py * py),
    sxy: sxy / (px * py),
    scaleX: px / sx,
    scaleY: py / sy,
  };
}
