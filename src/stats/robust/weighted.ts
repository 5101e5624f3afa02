/**
 * Order statistics and moments of a column whose rows carry whole-number weights: the multiplicities of a
 * bootstrap resample (row i drawn counts[i] times), all ones for the data as they stand, and one zero for a
 * jackknife. The column is sorted once; each resample makes one pass that accumulates its weights along that
 * order (prefix sums), after which any order statistic, and any k-th smallest distance from a centre, is found by
 * binary search in O(log n) or O(log^2 n). A resample thus costs one O(n) pass per column and no sort, and every
 * value equals the one computed on the resample written out row by row.
 *
 * Written here because no package offers weighted order statistics over a shared sort; the definitions are the
 * usual ones (R's median: the mean of the two middle values for an even count).
 */

/** A column with its ascending order (row indices), its values in that order, and the current resample's sums. */
export interface SortedColumn {
  values: Float64Array;
  order: Uint32Array<ArrayBufferLike>;
  sorted: Float64Array;
  /** cum[j] = total weight of sorted positions before j (length n + 1); see gatherWeights. */
  cum: Float64Array;
  /** cumValue[j] = weighted sum of the sorted values before j, when gatherWeights was asked for it. */
  cumValue: Float64Array;
}

export function sortedColumn(values: Float64Array, order: Uint32Array<ArrayBufferLike>): SortedColumn {
  const n = values.length;
  const sorted = new Float64Array(n);
  for (let j = 0; j < n; j++) sorted[j] = values[order[j]];
  return { values, order, sorted, cum: new Float64Array(n + 1), cumValue: new Float64Array(n + 1) };
}

/** Accumulates the row weights `w` along the sorted order; call once per resample before the rest. */
export function gatherWeights(col: SortedColumn, w: Int32Array, withValues = false): void {
  const { order, cum, sorted, cumValue } = col;
  const n = order.length;
  let c = 0;
  cum[0] = 0;
  if (withValues) {
    let s = 0;
    cumValue[0] = 0;
    for (let j = 0; j < n; j++) {
      const wj = w[order[j]];
      c += wj;
      s += wj * sorted[j];
      cum[j + 1] = c;
      cumValue[j + 1] = s;
    }
  } else {
    for (let j = 0; j < n; j++) {
      c += w[order[j]];
      cum[j + 1] = c;
    }
  }
}

/** The first sorted position j (0..n) at which pred(j) holds, for a predicate false then true along the order. */
function firstWhere(lo: number, hi: number, pred: (j: number) => boolean): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (pred(mid)) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** The k-th smallest value (1-based) under the gathered weights, k between 1 and the total weight. */
export function weightedKth(col: SortedColumn, k: number): number {
  const { cum, sorted } = col;
  // First position whose cumulative weight through it reaches k.
  const j = firstWhere(0, sorted.length, (t) => cum[t + 1] >= k);
  return sorted[Math.min(j, sorted.length - 1)];
}

/** The median under the gathered weights (total weight `total`). */
export function weightedMedian(col: SortedColumn, total: number): number {
  if (total % 2 === 1) return weightedKth(col, (total + 1) / 2);
  return (weightedKth(col, total / 2) + weightedKth(col, total / 2 + 1)) / 2;
}

/**
 * The k-th smallest absolute deviation |x - centre| (1-based) under the gathered weights. The weight within d of
 * the centre, W(d), is read from the sums between two binary searches; the answer is the smallest deviation of a
 * value on either side with W >= k (a value of weight 0 cannot be the answer: W does not step there, so a
 * smaller deviation of a present value reaches k too). The comparisons are written as centre - x <= d and
 * x - centre <= d, the way the deviations themselves are computed, so ties and rounding decide consistently.
 */
export function weightedDeviationKth(col: SortedColumn, centre: number, k: number): number {
  const { cum, sorted } = col;
  const n = sorted.length;
  const p = firstWhere(0, n, (j) => sorted[j] >= centre);
  const within = (d: number): number => {
    const from = firstWhere(0, p, (j) => centre - sorted[j] <= d);
    const to = firstWhere(p, n, (j) => sorted[j] - centre > d);
    return cum[to] - cum[from];
  };
  let best = Infinity;
  // Below the centre: deviations fall as the position rises; the last position whose deviation still holds k.
  if (p > 0) {
    const last = firstWhere(0, p, (L) => within(centre - sorted[L]) < k) - 1;
    if (last >= 0) best = centre - sorted[last];
  }
  if (p < n) {
    const first = firstWhere(p, n, (U) => within(sorted[U] - centre) >= k);
    if (first < n) best = Math.min(best, sorted[first] - centre);
  }
  return best;
}

/** The median absolute deviation from `centre`, unscaled (R's mad(x, constant = 1)), under the gathered weights. */
export function weightedMad(col: SortedColumn, centre: number, total: number): number {
  if (total % 2 === 1) return weightedDeviationKth(col, centre, (total + 1) / 2);
  return (weightedDeviationKth(col, centre, total / 2) + weightedDeviationKth(col, centre, total / 2 + 1)) / 2;
}

/** Pearson's r of two weighted columns, two-pass (means first), clipped to [-1, 1]; NaN when either is constant. */
export function weightedPearson(a: Float64Array, b: Float64Array, w: Int32Array): number {
  const n = a.length;
  let sw = 0;
  let sa = 0;
  let sb = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    if (wi === 0) continue;
    sw += wi;
    sa += wi * a[i];
    sb += wi * b[i];
  }
  const ma = sa / sw;
  const mb = sb / sw;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    const wi = w[i];
    if (wi === 0) continue;
    const da = a[i] - ma;
    const db = b[i] - mb;
    sab += wi * da * db;
    saa += wi * da * da;
    sbb += wi * db * db;
  }
  return ratioOfSums(sab, saa, sbb);
}

/** r = sab / sqrt(saa sbb) from sums of products, clipped to [-1, 1]; NaN when either sum of squares is 0. */
export function ratioOfSums(sab: number, saa: number, sbb: number): number {
  if (!(saa > 0) || !(sbb > 0)) return NaN;
  const r = sab / Math.sqrt(saa * sbb);
  return r > 1 ? 1 : r < -1 ? -1 : r;
}

/** Pearson's r from weighted sums about fixed centres: the centring corrections applied, then ratioOfSums. */
export function centredRatio(sw: number, sa: number, sb: number, sab: number, saa: number, sbb: number): number {
  return ratioOfSums(sab - (sa * sb) / sw, saa - (sa * sa) / sw, sbb - (sb * sb) / sw);
}

/**
 * Pearson's r of two weighted columns in one pass of sums about fixed centres ka, kb (the full data's means for a
 * resample, the exact mean rank (N + 1)/2 for ranks): with the centres near the means the corrections
 * (sum of deviations)^2 / N are tiny, so nothing is lost to cancellation (Chan, Golub & LeVeque 1983, "Algorithms
 * for computing the sample variance", American Statistician 37:242-247, the shifted-data formula). NaN when
 * either column is constant.
 */
export function weightedPearsonAbout(a: Float64Array, b: Float64Array, w: Int32Array, ka: number, kb: number): number {
  const n = a.length;
  let sw = 0;
  let sa = 0;
  let sb = 0;
  let sab = 0;
  let saa = 0;
  let sbb = 0;
  for (let i = 0; i < n; i++) {
    const c = w[i];
    if (c === 0) continue;
    const da = a[i] - ka;
    const db = b[i] - kb;
    const cda = c * da;
    const cdb = c * db;
    sw += c;
    sa += cda;
    sb += cdb;
    sab += cda * db;
    saa += cda * da;
    sbb += cdb * db;
  }
  return centredRatio(sw, sa, sb, sab, saa, sbb);
}

/**
 * Average ranks under the gathered weights written into `out` by row (rows of weight 0 get NaN): a row drawn c
 * times holds c tied places, so its rank is the mean of those places and of any equal values' places, as R's
 * rank() gives on the written-out resample.
 */
export function weightedAverageRanks(col: SortedColumn, out: Float64Array): Float64Array {
  const { sorted, cum, order } = col;
  const n = sorted.length;
  let j = 0;
  while (j < n) {
    const v = sorted[j];
    const before = cum[j];
    if (j + 1 === n || sorted[j + 1] !== v) {
      // A value of its own (the usual case): its c copies hold places before + 1 .. before + c.
      const c = cum[j + 1] - before;
      out[order[j]] = c > 0 ? before + (c + 1) / 2 : NaN;
      j++;
      continue;
    }
    let end = j + 1;
    while (end < n && sorted[end] === v) end++;
    const c = cum[end] - before;
    const rank = before + (c + 1) / 2;
    for (let t = j; t < end; t++) out[order[t]] = cum[t + 1] > cum[t] ? rank : NaN;
    j = end;
  }
  return out;
}
