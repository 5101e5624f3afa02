import { selectKth, selectKthAndNext, selectKthAndPrevious } from '../internal/select';

/**
 * Bivariate outliers for the skipped correlation: Wilcox (2004), "Inferences based on a skipped correlation
 * coefficient", Journal of Applied Statistics 31:131-143, with the MAD-median rule as Rousselet & Pernet (2012),
 * "Improving standards in brain-behavior correlation analyses", Frontiers in Human Neuroscience 6:119, use it.
 *
 * The rule, as implemented here:
 * - each column is standardised by its median and MADN = MAD/0.6745 (by 1.2533 times the mean absolute deviation
 *   from the median when more than half the values are equal), so the rule does not depend on units; the centre
 *   is the pair of medians;
 * - every row (up to DIRECTIONS_ALL rows; above that the DIRECTIONS rows farthest from the centre, which is
 *   where outliers lie) gives a direction from the centre; all rows are projected on it;
 * - on each direction a row is flagged when its projected distance d exceeds median(d) + sqrt(chi^2_{0.975,2}) *
 *   (q2 - q1), q1 and q2 the ideal fourths of d (Frigge, Hoaglin & Iglewicz 1989, "Some implementations of the
 *   boxplot", American Statistician 43:50-54): Wilcox's (2012, section 6.4.9) projection method with its boxplot
 *   rule. (The MAD-median variant of the same rule, median + c MAD/0.6745, set aside about a fifth of the rows of
 *   clean normal samples of 30, since the projected distances are folded at 0; the fourths do not.)
 * - a row flagged on any direction is skipped.
 */
export const DIRECTIONS_ALL = 100;
export const DIRECTIONS = 100;
/**
 * Above this many rows each direction's median and fourths are read from every k-th row (k = ceil(n / this)),
 * evenly spread through the sheet, and only the flagging pass visits every row: quantiles of 50,000 values are
 * within about 1% of those of all of them, and the rule's cost stops growing with the directions times n.
 */
export const THRESHOLD_SAMPLE = 50000;
/** sqrt of the 0.975 quantile of chi-square with 2 df, which is -2 ln(0.025) exactly. */
const CUT = Math.sqrt(-2 * Math.log(0.025));
const MADN = 0.6744897501960817;

/**
 * The ideal fourths of `a` (which it reorders): j = floor(n/4 + 5/12), h = n/4 + 5/12 - j,
 * q1 = (1 - h) a_(j) + h a_(j+1), q2 = (1 - h) a_(n-j+1) + h a_(n-j) (order statistics 1-based).
 */
export function idealFourths(a: Float64Array): [number, number] {
  const n = a.length;
  const f = n / 4 + 5 / 12;
  const j = Math.floor(f);
  const h = f - j;
  const [lj, lj1] = selectKthAndNext(a, j - 1);
  const [uk, uk1] = selectKthAndPrevious(a, n - j);
  return [(1 - h) * lj + h * lj1, (1 - h) * uk + h * uk1];
}
/** E|Z| * sqrt(pi/2) = 1: the mean absolute deviation of a normal is sigma sqrt(2/pi); 1.2533 = sqrt(pi/2). */
const MEAN_ABS_TO_SD = 1.2533141373155003;

/** The median of `a`, which it reorders. */
function medianInPlace(a: Float64Array): number {
  const n = a.length;
  const k = (n - 1) >> 1;
  if (n % 2 === 1) return selectKth(a, k);
  const [lo, hi] = selectKthAndNext(a, k);
  return (lo + hi) / 2;
}

/** Median and a normal-consistent scale of a column, or a zero scale for a constant column. */
function centreAndScale(v: Float64Array, work: Float64Array): { centre: number; scale: number } {
  work.set(v);
  const centre = medianInPlace(work);
  for (let i = 0; i < v.length; i++) work[i] = Math.abs(v[i] - centre);
  let mean = 0;
  for (let i = 0; i < v.length; i++) mean += work[i];
  mean /= v.length;
  const mad = medianInPlace(work);
  return { centre, scale: mad > 0 ? mad / MADN : MEAN_ABS_TO_SD * mean };
}

function identity(n: number): Uint32Array {
  const out = new Uint32Array(n);
  for (let i = 0; i < n; i++) out[i] = i;
  return out;
}

/**
 * The `m` rows with the largest `norm2`, farthest first and equal distances in row order (what a stable sort of
 * the whole column would put first), found by one selection instead of sorting a million rows. Uses `work`.
 */
function farthest(norm2: Float64Array, m: number, work: Float64Array): Uint32Array {
  const n = norm2.length;
  work.set(norm2);
  const t = selectKth(work, n - m);
  const picked: number[] = [];
  for (let i = 0; i < n; i++) if (norm2[i] > t) picked.push(i);
  for (let i = 0; i < n && picked.length < m; i++) if (norm2[i] === t) picked.push(i);
  picked.sort((a, b) => norm2[b] - norm2[a] || a - b);
  return Uint32Array.from(picked);
}

/**
 * The median and the ideal fourths of `a` (which it reorders), the same numbers as medianInPlace and
 * idealFourths: once the median is selected, the lower fourth lies in the lower half and the upper in the upper
 * half, so each is selected within its half only (half the work of selecting it in the whole array).
 */
function medianAndFourths(a: Float64Array): [number, number, number] {
  const n = a.length;
  if (n < 16) {
    const md = medianInPlace(a);
    const [q1, q2] = idealFourths(a);
    return [md, q1, q2];
  }
  const k = (n - 1) >> 1;
  let md: number;
  if (n % 2 === 1) md = selectKth(a, k);
  else {
    const [lo, hi] = selectKthAndNext(a, k);
    md = (lo + hi) / 2;
  }
  const f = n / 4 + 5 / 12;
  const j = Math.floor(f);
  const h = f - j;
  // a[0..k] are the k + 1 smallest values, a[k+1..n-1] the rest; order statistic j (1-based) and its successor
  // lie in the first stretch, n - j + 1 and its predecessor in the second (j <= k and n - j - 1 > k for n >= 16).
  const [lj, lj1] = selectKthAndNext(a, j - 1, 0, k);
  const [uk, uk1] = selectKthAndPrevious(a, n - j, k + 1, n - 1);
  return [md, (1 - h) * lj + h * lj1, (1 - h) * uk + h * uk1];
}

export interface SkippedRows {
  /** 1 for a skipped row, 0 for a kept one. */
  skipped: Uint8Array;
  count: number;
  /** Directions examined. */
  directions: number;
}

/**
 * Flags the bivariate outliers of (x, y) by the rule above. O(n * directions) time.
 * @returns null when a column is constant (no scale).
 */
export function findSkippedRows(x: Float64Array, y: Float64Array): SkippedRows | null {
  const n = x.length;
  const work = new Float64Array(n);
  const sx = centreAndScale(x, work);
  const sy = centreAndScale(y, work);
  if (!(sx.scale > 0) || !(sy.scale > 0)) return null;
  const u = new Float64Array(n);
  const v = new Float64Array(n);
  const norm2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    u[i] = (x[i] - sx.centre) / sx.scale;
    v[i] = (y[i] - sy.centre) / sy.scale;
    norm2[i] = u[i] * u[i] + v[i] * v[i];
  }
  const dirs = n <= DIRECTIONS_ALL ? identity(n) : farthest(norm2, DIRECTIONS, work);
  const skipped = new Uint8Array(n);
  const stride = n > THRESHOLD_SAMPLE ? Math.ceil(n / THRESHOLD_SAMPLE) : 1;
  const m = Math.ceil(n / stride);
  const sample = new Float64Array(m);
  // Each direction's limit first; then only rows far enough from the centre to pass the lowest limit are
  // projected on every direction. A row's projected distance is at most its distance from the centre
  // (Cauchy-Schwarz), so no other row can be flagged; the margin covers rounding, and each candidate is tested
  // with the same expression as before, so the set of flagged rows is exactly that of testing every row.
  const du = new Float64Array(dirs.length);
  const dv = new Float64Array(dirs.length);
  const dl = new Float64Array(dirs.length);
  const dlimit = new Float64Array(dirs.length);
  let used = 0;
  let lowest = Infinity;
  for (let k = 0; k < dirs.length; k++) {
    const i = dirs[k];
    if (!(norm2[i] > 0)) continue;
    const len = Math.sqrt(norm2[i]);
    const ui = u[i];
    const vi = v[i];
    for (let j = 0, t = 0; j < n; j += stride, t++) sample[t] = Math.abs(u[j] * ui + v[j] * vi) / len;
    const [md, q1, q2] = medianAndFourths(sample);
    const limit = md + CUT * (q2 - q1);
    du[used] = ui;
    dv[used] = vi;
    dl[used] = len;
    dlimit[used] = limit;
    used++;
    if (limit < lowest) lowest = limit;
  }
  const reach = lowest * lowest * (1 - 1e-9);
  for (let j = 0; j < n; j++) {
    if (!(norm2[j] > reach)) continue;
    const uj = u[j];
    const vj = v[j];
    for (let k = 0; k < used; k++) {
      if (Math.abs(uj * du[k] + vj * dv[k]) / dl[k] > dlimit[k]) {
        skipped[j] = 1;
        break;
      }
    }
  }
  let count = 0;
  for (let j = 0; j < n; j++) count += skipped[j];
  return { skipped, count, directions: used };
}
