import { coMoments, CoMoments } from './comoments';
import { borrowF64 } from '../internal/scratch';
import { clipUnit, pearsonFromMoments } from './pearson';

/** Pearson's r with each row left out in turn. */
export interface LeaveOneOut {
  /** r of all rows. */
  r: number;
  /** r without row i, for every i (NaN where a column is constant without that row). */
  without: Float64Array;
  /** The row whose removal moves r the most (a row without which a column is constant counts as moving it most),
   * and r without it (NaN for such a row). */
  most: number;
  rWithoutMost: number;
}

/**
 * Pearson's r without each row, for all n rows in O(n), by the deletion updates of the centred sums (the deletion
 * formulas of Belsley, Kuh & Welsch 1980, Regression Diagnostics, Wiley, ch. 2, for one predictor):
 *   Sxx(i) = Sxx - n/(n - 1) dx_i^2,  Syy(i) = Syy - n/(n - 1) dy_i^2,  Sxy(i) = Sxy - n/(n - 1) dx_i dy_i,
 * with dx_i, dy_i the deviations from the means of all n rows. An update cancels when row i carries most of a
 * sum (it sits far from the others); the few rows carrying over a quarter of Sxx or Syy are recomputed from the
 * other n - 1 rows directly (two-pass co-moments), so every r(i) keeps its digits.
 * @param x, y equal-length finite columns with at least 4 rows and variation in both
 * @param moments coMoments(x, y) when the caller has them (a line fit does)
 * `without` is a work array from the scratch pool: a caller done with it may give it back.
 */
export function leaveOneOut(x: ArrayLike<number>, y: ArrayLike<number>, moments?: CoMoments): LeaveOneOut {
  const n = x.length;
  const m = moments ?? coMoments(x, y);
  const r = pearsonFromMoments(m);
  const k = n / (n - 1);
  const ix = 1 / m.scaleX;
  const iy = 1 / m.scaleY;
  const without = borrowF64(n); // every element is written below
  const careful: number[] = [];
  for (let i = 0; i < n; i++) {
    // Deviations from the accurate means before scaling: x and its mean are close, so the difference is exact
    // (Sterbenz), where scaling first would round a value with a large offset.
    const dx = (x[i] - m.meanX) * ix;
    const dy = (y[i] - m.meanY) * iy;
    const cx = k * dx * dx;
    const cy = k * dy * dy;
    if (cx > m.sxx / 4 || cy > m.syy / 4) {
      careful.push(i);
      continue;
    }
    const sxx = m.sxx - cx;
    const syy = m.syy - cy;
    const sxy = m.sxy - k * dx * dy;
    without[i] = clipUnit(sxy / Math.sqrt(sxx * syy));
  }
  // At most 8 rows can each carry a quarter of one of the two sums.
  if (careful.length > 0) {
    const xs = new Float64Array(n - 1);
    const ys = new Float64Array(n - 1);
    for (const i of careful) {
      for (let j = 0, t = 0; j < n; j++) {
        if (j === i) continue;
        xs[t] = x[j];
        ys[t] = y[j];
        t++;
      }
      const mi = coMoments(xs, ys);
      without[i] = mi.sxx > 0 && mi.syy > 0 ? pearsonFromMoments(mi) : NaN;
    }
  }
  let most = 0;
  let gap = -1;
  for (let i = 0; i < n; i++) {
    const g = Number.isNaN(without[i]) ? Infinity : Math.abs(without[i] - r);
    if (g > gap) {
      gap = g;
      most = i;
    }
  }
  return { r, without, most, rWithoutMost: without[most] };
}
