/**
 * Fitted values and residuals of the least-squares straight line of y on x, one per pair, for a residual plot.
 *
 * Ordinary least squares (Legendre 1805, "Nouvelles méthodes pour la détermination des orbites des comètes",
 * appendix; Gauss 1809, "Theoria motus corporum coelestium", book II, section III): the slope is
 * b = Σ(x − x̄)(y − ȳ) / Σ(x − x̄)², the line passes through (x̄, ȳ), and the residual of pair i is
 * e_i = y_i − (a + b·x_i).
 *
 * Computed on deviations from the means, never on the raw values, so an offset in x or y costs no accuracy:
 * - fitted_i = ȳ + b·(x_i − x̄) and e_i = (y_i − ȳ) − b·(x_i − x̄); with x near 1e9 and y near 1e9 the
 *   residuals keep their own relative accuracy instead of the 1e-7 absolute of a difference of two values
 *   near 1e9;
 * - a column whose values are all decimals of at most 9 places (as typed into a sheet) is centred as exact
 *   integers k = x·10^d, the reading comoments.ts uses: 1000000123.45 counts as the decimal typed, and its
 *   deviation from the mean is exact up to one rounding;
 * - other columns are centred in binary with the corrected two-pass mean (Chan, Golub & LeVeque 1983, The
 *   American Statistician 37:242-247);
 * - each column's deviations are scaled by a power of two near their largest magnitude (exact), so values from
 *   1e-300 to 1e300 neither overflow nor underflow: the slope is formed in those units, and the fitted values
 *   and residuals, which lie within the range of y, come back finite even where b itself, in original units,
 *   would not be (x near 1e-300 with y near 1e300).
 *
 * Pure and host-free. Allocates the two result arrays and nothing else of size n.
 */
import { DECIMAL_ROWS, decimalPlaces, POW10, powerOfTwoScale, scaledMean } from './comoments';
import { StatsInputError } from '../types';

/** The straight line's fitted values and residuals, pair by pair. */
export interface LineResiduals {
  n: number;
  /** Slope and intercept in original units; ±Infinity where the units of x and y are more than 1e308 apart. */
  slope: number;
  intercept: number;
  meanX: number;
  meanY: number;
  /** a + b·x_i for each pair, in the input's order. */
  fitted: Float64Array;
  /** y_i − (a + b·x_i) for each pair, in the input's order. */
  residuals: Float64Array;
}

/** A column's mean and its deviations from it, in units of `scale` (deviation_i = out[i] * scale). */
interface Centred {
  mean: number;
  scale: number;
}

/** Divides the deviations by a power of two near their largest magnitude (exact) and returns that factor. */
function rescale(out: Float64Array): number {
  const p = powerOfTwoScale(out);
  if (p !== 1) {
    const inv = 1 / p;
    for (let i = 0; i < out.length; i++) out[i] *= inv;
  }
  return p;
}

/** Writes the deviations of v from its mean into `out`, scaled (see Centred). */
function centre(v: ArrayLike<number>, out: Float64Array): Centred {
  const n = v.length;
  const d = n < DECIMAL_ROWS ? decimalPlaces(v) : -1;
  if (d >= 0) {
    // Exact integers k_i = v_i * 10^d; centred on an integer near their mean, so k_i - c is exact, and the
    // remaining fraction s/n of the mean is taken off once.
    const s10 = POW10[d];
    let total = 0;
    for (let i = 0; i < n; i++) total += Math.round(v[i] * s10);
    const c = Math.round(total / n);
    let s = 0;
    for (let i = 0; i < n; i++) {
      const e = Math.round(v[i] * s10) - c;
      out[i] = e;
      s += e;
    }
    const shift = s / n;
    for (let i = 0; i < n; i++) out[i] -= shift;
    const p = rescale(out);
    return { mean: (c + shift) / s10, scale: p / s10 };
  }
  const scale = powerOfTwoScale(v);
  const inv = 1 / scale;
  const m = scaledMean(v, scale);
  let s = 0;
  for (let i = 0; i < n; i++) {
    const e = v[i] * inv - m;
    out[i] = e;
    s += e;
  }
  // Corrected two-pass: the rounding left in the mean is taken off every deviation (Chan, Golub & LeVeque 1983).
  const shift = s / n;
  for (let i = 0; i < n; i++) out[i] -= shift;
  const p = rescale(out);
  return { mean: (m + shift) * scale, scale: scale * p };
}

/**
 * Fitted values and residuals of the ordinary least-squares line of y on x (Legendre 1805; Gauss 1809), from
 * centred, scaled deviations (see the note at the top). A constant y is allowed (every residual is 0).
 * @param x finite numbers
 * @param y finite numbers, as many as x
 * @throws StatsInputError when the lengths differ, there are fewer than 3 pairs, or x is constant.
 * @example lineResiduals([1, 2, 3], [2, 4, 7]).residuals // Float64Array [0.1666…, -0.3333…, 0.1666…]
 */
export function lineResiduals(x: ArrayLike<number>, y: ArrayLike<number>): LineResiduals {
  const n = x.length;
  if (y.length !== n) throw new StatsInputError('unequal-length', 'x and y must hold the same number of values');
  if (n < 3) {
    throw new StatsInputError('too-few', `only ${n} usable pair${n === 1 ? '' : 's'} of numbers: residuals of a straight line need at least 3`);
  }
  const ux = new Float64Array(n);
  const uy = new Float64Array(n);
  const cx = centre(x, ux);
  const cy = centre(y, uy);
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += ux[i] * ux[i];
    sxy += ux[i] * uy[i];
  }
  if (!(sxx > 0)) throw new StatsInputError('constant', 'x is constant: a straight line through the points needs x to vary');
  const b = sxy / sxx; // in scaled units: dimensionless and of moderate size
  // ux becomes the fitted values, uy the residuals (no further arrays).
  for (let i = 0; i < n; i++) {
    const along = b * ux[i];
    ux[i] = cy.mean + cy.scale * along;
    uy[i] = cy.scale * (uy[i] - along);
  }
  const slope = b * (cy.scale / cx.scale);
  return { n, slope, intercept: cy.mean - slope * cx.mean, meanX: cx.mean, meanY: cy.mean, fitted: ux, residuals: uy };
}
