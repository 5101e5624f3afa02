import { centredRatio, gatherWeights, ratioOfSums, SortedColumn, weightedDeviationKth, weightedKth, weightedMad, weightedMedian } from './weighted';

/**
 * The robust coefficients, each a function of two sorted columns and row weights (see weighted.ts), so that one
 * definition serves the estimate (weights 1), every bootstrap resample (weights = multiplicities) and the
 * jackknife (one weight 0). Each returns NaN where the coefficient is undefined (a column whose spread measure is
 * 0).
 */
export type RobustStatistic = (x: SortedColumn, y: SortedColumn, w: Int32Array, total: number) => number;

/** The bend of the percentage bend correlation: the share of values allowed to lie beyond the bend, 20%. */
export const BEND = 0.2;
/** The share winsorized in each tail, 20%. */
export const WINSOR = 0.2;

/** Location and bend width of one column for the percentage bend correlation; omega 0 when undefined. */
interface Bend {
  phi: number;
  omega: number;
}

/**
 * Wilcox (1994), "The percentage bend correlation coefficient", Psychometrika 59:601-616: omega = the m-th
 * smallest |x - median|, m = floor((1 - beta) n + 0.5); with i1 (i2) the weight below median - omega (above
 * median + omega) and S the weighted sum of the values in between, phi = (omega (i2 - i1) + S)/(n - i1 - i2).
 * Read from the sorted column: the counts and the sum are over a contiguous stretch of it.
 */
function bendOf(col: SortedColumn, w: Int32Array, total: number): Bend {
  gatherWeights(col, w, true);
  const med = weightedMedian(col, total);
  const m = Math.floor((1 - BEND) * total + 0.5);
  const omega = weightedDeviationKth(col, med, m);
  if (!(omega > 0)) return { phi: NaN, omega: 0 };
  const { sorted, cum, cumValue } = col;
  const n = sorted.length;
  // The tests are (x - med)/omega against -1 and 1, as the definition reads, so rounding decides as it would
  // there; both are monotone along the sorted values, so binary searches find the stretch in between.
  let lo = 0;
  let hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((sorted[mid] - med) / omega < -1) lo = mid + 1;
    else hi = mid;
  }
  const start = lo;
  hi = n;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if ((sorted[mid] - med) / omega > 1) hi = mid;
    else lo = mid + 1;
  }
  const end = lo;
  const below = cum[start];
  const above = cum[n] - cum[end];
  const inside = cumValue[end] - cumValue[start];
  return { phi: (omega * (above - below) + inside) / (total - below - above), omega };
}

/**
 * r_pb = sum A_i B_i / sqrt(sum A_i^2 sum B_i^2), A_i = psi((x_i - phi_x)/omega_x), psi(u) = max(-1, min(1, u))
 * (Wilcox 1994), uncentred by definition; the scores are formed inside the one pass that sums them.
 */
export const percentageBend: RobustStatistic = (x, y, w, total) => {
  const bx = bendOf(x, w, total);
  const by = bendOf(y, w, total);
  if (!(bx.omega > 0) || !(by.omega > 0)) return NaN;
  return bendCorrelation(x.values, y.values, w, bx.phi, bx.omega, by.phi, by.omega);
};

/** The one pass over rows of the percentage bend correlation, with every input a local (kept small to stay fast). */
function bendCorrelation(xv: Float64Array, yv: Float64Array, w: Int32Array, px: number, ox: number, py: number, oy: number): number {
  const n = xv.length;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  // Branch-free: a row of weight 0 adds 0, and the clamps compile to min/max.
  for (let i = 0; i < n; i++) {
    const c = w[i];
    const a = Math.max(-1, Math.min(1, (xv[i] - px) / ox));
    const b = Math.max(-1, Math.min(1, (yv[i] - py) / oy));
    const ca = c * a;
    sab += ca * b;
    saa += ca * a;
    sbb += c * b * b;
  }
  return ratioOfSums(sab, saa, sbb);
}

/** Rows set to each tail's bound by 20% winsorizing: g = floor(0.2 n). */
export function winsorizedCount(n: number): number {
  return Math.floor(WINSOR * n);
}

/**
 * Winsorized correlation: Wilcox (1993), "Some results on a Winsorized correlation coefficient", British Journal
 * of Mathematical and Statistical Psychology 46:339-349. Each column's g = floor(0.2 n) smallest values are raised
 * to the (g+1)-th smallest and its g largest lowered to the (n-g)-th; Pearson's r of the winsorized columns.
 */
export const winsorized: RobustStatistic = (x, y, w, total) => {
  const g = winsorizedCount(total);
  gatherWeights(x, w);
  const xlo = weightedKth(x, g + 1);
  const xhi = weightedKth(x, total - g);
  gatherWeights(y, w);
  const ylo = weightedKth(y, g + 1);
  const yhi = weightedKth(y, total - g);
  return clampedPearson(x.values, y.values, w, xlo, xhi, ylo, yhi);
};

/**
 * Pearson's r of the columns clamped to [lo, hi] each, weighted, in one pass of sums about the middle of each
 * clamp range (the clamped values lie within half the range of it, so the shifted sums lose at most a digit or
 * two to cancellation, against the two passes' full cost); NaN when a clamped column is constant.
 */
function clampedPearson(xv: Float64Array, yv: Float64Array, w: Int32Array, xlo: number, xhi: number, ylo: number, yhi: number): number {
  const n = xv.length;
  const kx = (xlo + xhi) / 2;
  const ky = (ylo + yhi) / 2;
  let sw = 0;
  let sa = 0;
  let sb = 0;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    const c = w[i];
    const a = Math.max(xlo, Math.min(xhi, xv[i])) - kx;
    const b = Math.max(ylo, Math.min(yhi, yv[i])) - ky;
    const ca = c * a;
    const cb = c * b;
    sw += c;
    sa += ca;
    sb += cb;
    sab += ca * b;
    saa += ca * a;
    sbb += cb * b;
  }
  return xhi === xlo || yhi === ylo ? NaN : centredRatio(sw, sa, sb, sab, saa, sbb);
}

/**
 * Biweight midcorrelation: Wilcox (2012), Introduction to Robust Estimation and Hypothesis Testing, 3rd ed.,
 * Academic Press, section 9.3.8, after Mosteller & Tukey (1977), Data Analysis and Regression, Addison-Wesley.
 * U_i = (x_i - M_x)/(9 MAD_x), a_i = [|U_i| < 1], and r_b = biweight midcovariance / sqrt(product of
 * midvariances); the midvariances' denominators cancel in the ratio, leaving
 * sum a(x - M)(1 - U^2)^2 b(y - M)(1 - V^2)^2 / sqrt(sum a (x - M)^2 (1 - U^2)^4 * sum b (y - M)^2 (1 - V^2)^4).
 */
export const biweight: RobustStatistic = (x, y, w, total) => {
  gatherWeights(x, w);
  const mx = weightedMedian(x, total);
  const madx = weightedMad(x, mx, total);
  gatherWeights(y, w);
  const my = weightedMedian(y, total);
  const mady = weightedMad(y, my, total);
  if (!(madx > 0) || !(mady > 0)) return NaN;
  return biweightCorrelation(x.values, y.values, w, mx, 9 * madx, my, 9 * mady);
};

/** The one pass over rows of the biweight midcorrelation: scores a (x - M)(1 - U^2)^2 and their sums. */
function biweightCorrelation(xv: Float64Array, yv: Float64Array, w: Int32Array, mx: number, sx: number, my: number, sy: number): number {
  const n = xv.length;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    const c = w[i];
    const dx = xv[i] - mx;
    const ux = dx / sx;
    const tx = 1 - ux * ux;
    const a = Math.abs(ux) < 1 ? dx * tx * tx : 0;
    const dy = yv[i] - my;
    const uy = dy / sy;
    const ty = 1 - uy * uy;
    const b = Math.abs(uy) < 1 ? dy * ty * ty : 0;
    const ca = c * a;
    sab += ca * b;
    saa += ca * a;
    sbb += c * b * b;
  }
  return ratioOfSums(sab, saa, sbb);
}
