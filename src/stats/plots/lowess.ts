/**
 * LOWESS: robust locally weighted straight-line smoothing of a scatterplot.
 *
 * Cleveland, W. S. (1979), "Robust locally weighted regression and smoothing scatterplots", Journal of the
 * American Statistical Association 74(368):829-836; the computing shortcuts (the `delta` skip with linear
 * interpolation, ties on the right taken into a neighbourhood, weights cut at 0.001 and 0.999 of the radius)
 * follow Cleveland (1981), "LOWESS: a program for smoothing scatterplots by robust locally weighted regression",
 * The American Statistician 35(1):54, whose published program R's lowess() also implements. With the same
 * defaults the values therefore agree with R's lowess() to rounding.
 *
 * Cost: for each point actually fitted, O(k) work on its k = round-down(span * n) nearest neighbours; with
 * delta > 0 only points at least delta apart in x are fitted (others are interpolated), so the usual
 * delta = 1% of the x range fits at most about 100 points per pass. Robustness weights need a median of |e|
 * per pass: a selection, O(n) on average.
 *
 * Written here (not taken from a library) because neither jstat nor simple-statistics offers a smoother.
 */
import { argsort } from '../internal/sort';
import { StatsInputError } from '../types';
import { selectKth } from '../internal/select';

export interface LowessOptions {
  /** Fraction of the points in each local fit (Cleveland's f), in (0, 1]; default 2/3. */
  span?: number;
  /** Robustness passes after the first fit (Cleveland's t); default 3. */
  iterations?: number;
  /** Points closer than delta (in x units) to the last fitted point are interpolated; default 1% of the x range. */
  delta?: number;
}

/** The smooth: x ascending (ties kept, in the input order), y the smoothed value at each x. */
export interface LowessCurve {
  x: Float64Array;
  y: Float64Array;
}

const cube = (v: number): number => v * v * v;

/**
 * One locally weighted straight-line fit at `at`, over sorted x[left..right] (extended right over ties).
 * Tricube weights in distance / radius, times the robustness weights when given (Cleveland 1979, section 2).
 * Returns NaN when every weight is zero (the caller then keeps the observed y).
 */
function localFit(
  x: Float64Array,
  y: Float64Array,
  at: number,
  left: number,
  right: number,
  robust: Float64Array | null,
  w: Float64Array,
  range: number,
): number {
  const n = x.length;
  const radius = Math.max(at - x[left], x[right] - at);
  const outer = 0.999 * radius;
  const inner = 0.001 * radius;
  let total = 0;
  let j = left;
  for (; j < n; j++) {
    const d = Math.abs(x[j] - at);
    if (d <= outer) {
      let wj = d <= inner ? 1 : cube(1 - cube(d / radius));
      if (robust) wj *= robust[j];
      w[j] = wj;
      total += wj;
    } else if (x[j] > at) {
      break;
    } else {
      w[j] = 0;
    }
  }
  const last = j - 1; // may pass `right` when x ties continue to the right
  if (!(total > 0)) return NaN;
  for (let k = left; k <= last; k++) w[k] /= total;
  if (radius > 0) {
    // Weighted straight line, written about the weighted centre of x so that the slope term vanishes there.
    let centre = 0;
    for (let k = left; k <= last; k++) centre += w[k] * x[k];
    let spread = 0;
    for (let k = left; k <= last; k++) spread += w[k] * (x[k] - centre) * (x[k] - centre);
    // Only fit a slope when the neighbourhood is spread out enough for one to mean something.
    if (Math.sqrt(spread) > 0.001 * range) {
      const b = (at - centre) / spread;
      for (let k = left; k <= last; k++) w[k] *= b * (x[k] - centre) + 1;
    }
  }
  let fit = 0;
  for (let k = left; k <= last; k++) fit += w[k] * y[k];
  return fit;
}

/** One pass of local fits over all sorted points, with delta skipping and interpolation. */
function smoothPass(
  x: Float64Array,
  y: Float64Array,
  neighbours: number,
  delta: number,
  robust: Float64Array | null,
  out: Float64Array,
  w: Float64Array,
): void {
  const n = x.length;
  const range = x[n - 1] - x[0];
  let left = 0;
  let right = neighbours - 1;
  let last = -1; // last point actually fitted
  let i = 0;
  for (;;) {
    // Slide the window right while that makes the neighbourhood radius at x[i] no larger.
    while (right < n - 1 && x[i] - x[left] > x[right + 1] - x[i]) {
      left++;
      right++;
    }
    const fit = localFit(x, y, x[i], left, right, robust, w, range);
    out[i] = Number.isNaN(fit) ? y[i] : fit;
    if (last < i - 1) {
      const span = x[i] - x[last];
      for (let j = last + 1; j < i; j++) {
        const a = (x[j] - x[last]) / span;
        out[j] = a * out[i] + (1 - a) * out[last];
      }
    }
    last = i;
    // Skip points within delta of the one just fitted; tied x values copy its fit.
    const cut = x[last] + delta;
    let next = last + 1;
    for (; next < n; next++) {
      if (x[next] > cut) break;
      if (x[next] === x[last]) {
        out[next] = out[last];
        last = next;
      }
    }
    i = Math.max(last + 1, next - 1);
    if (last >= n - 1) break;
  }
}

/**
 * Smooths y against x by LOWESS (Cleveland 1979). Inputs are complete pairs of finite numbers.
 * @throws StatsInputError when x and y differ in length, hold non-finite values, or the options are out of range.
 * @example lowess([1, 2, 3, 4, 5], [2, 4, 5, 4, 5]).y // smoothed values at x = 1..5 in ascending x
 */
export function lowess(xIn: ArrayLike<number>, yIn: ArrayLike<number>, options: LowessOptions = {}): LowessCurve {
  const n = xIn.length;
  if (yIn.length !== n) throw new StatsInputError('unequal-length', 'x and y must hold the same number of values');
  const span = options.span ?? 2 / 3;
  const iterations = options.iterations ?? 3;
  if (!(span > 0 && span <= 1)) throw new StatsInputError('bad-option', `the smoothing span must be in (0, 1] (got ${span})`);
  if (!(Number.isInteger(iterations) && iterations >= 0)) {
    throw new StatsInputError('bad-option', `robustness iterations must be a whole number of at least 0 (got ${iterations})`);
  }
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(xIn[i]) || !Number.isFinite(yIn[i])) throw new StatsInputError('bad-option', 'lowess needs finite numbers');
  }
  const order = argsort(xIn);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    x[i] = xIn[order[i]];
    y[i] = yIn[order[i]];
  }
  const out = new Float64Array(n);
  if (n === 0) return { x, y: out };
  if (n === 1) {
    out[0] = y[0];
    return { x, y: out };
  }
  const delta = options.delta ?? 0.01 * (x[n - 1] - x[0]);
  if (!(delta >= 0)) throw new StatsInputError('bad-option', `delta must be 0 or more (got ${delta})`);
  // At least two and at most n points per local fit; 1e-7 absorbs rounding in span * n.
  const neighbours = Math.max(2, Math.min(n, Math.floor(span * n + 1e-7)));
  const w = new Float64Array(n);
  const absResiduals = new Float64Array(n);
  let robust: Float64Array | null = null;
  for (let pass = 0; pass <= iterations; pass++) {
    smoothPass(x, y, neighbours, delta, robust, out, w);
    if (pass === iterations) break;
    let meanAbs = 0;
    for (let i = 0; i < n; i++) {
      absResiduals[i] = Math.abs(y[i] - out[i]);
      meanAbs += absResiduals[i];
    }
    meanAbs /= n;
    // Six times the median absolute residual (Cleveland 1979, eq. 2.6), the bisquare's scale.
    const scratch = absResiduals.slice();
    const m1 = n >>> 1;
    const sixMedian = n % 2 === 0 ? 3 * (selectKth(scratch, m1) + selectKth(scratch, n - m1 - 1)) : 6 * selectKth(scratch, m1);
    if (sixMedian < 1e-7 * meanAbs) break; // residuals effectively zero: the fit is exact
    const c9 = 0.999 * sixMedian;
    const c1 = 0.001 * sixMedian;
    if (!robust) robust = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const r = absResiduals[i];
      robust[i] = r <= c1 ? 1 : r <= c9 ? (1 - (r / sixMedian) ** 2) ** 2 : 0;
    }
  }
  return { x, y: out };
}
