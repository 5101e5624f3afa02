import { borrowF64 } from '../internal/scratch';
import { coMoments, CoMoments } from './comoments';
import { assertVaries } from './pearson';

/** Least-squares straight line y = intercept + slope * x, with what the diagnostics need. */
export interface LineFit {
  n: number;
  slope: number;
  intercept: number;
  meanX: number;
  meanY: number;
  /** Sum of squared deviations of x, in original units (may overflow to Infinity for |x| near 1e300). */
  sxx: number;
  fitted: Float64Array;
  residuals: Float64Array;
  /** Residual sum of squares. */
  rss: number;
  /** The co-moments the line was fitted from (for callers that need them too, such as leaveOneOut). */
  moments: CoMoments;
}

/**
 * Ordinary least squares of y on x (Legendre 1805; Gauss 1809), computed from centred co-moments.
 * @throws StatsInputError when x or y is constant.
 * @example fitLine([1, 2, 3], [2, 4, 7]).slope // 2.5
 */
export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>): LineFit {
  const m = coMoments(x, y);
  assertVaries(m);
  const slope = (m.sxy / m.sxx) * (m.scaleY / m.scaleX);
  const intercept = m.meanY - slope * m.meanX;
  const n = m.n;
  const fitted = borrowF64(n); // both written in full below
  const residuals = borrowF64(n);
  let rss = 0;
  for (let i = 0; i < n; i++) {
    // Centred form keeps the fitted values accurate when x carries a large offset.
    const f = m.meanY + slope * (x[i] - m.meanX);
    fitted[i] = f;
    const e = y[i] - f;
    residuals[i] = e;
    rss += e * e;
  }
  return { n, slope, intercept, meanX: m.meanX, meanY: m.meanY, sxx: m.sxx * m.scaleX * m.scaleX, fitted, residuals, rss, moments: m };
}
