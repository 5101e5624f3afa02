/** The effective number of independent rows for the correlation of two series in row order. */
export interface EffectiveRows {
  n: number;
  /** N*, at most n and at least 3. */
  effective: number;
  /** Lags summed. */
  lags: number;
  /** Lag-1 autocorrelations of x and y. */
  lag1x: number;
  lag1y: number;
}

/** Most lags summed: beyond this the products of two autocorrelations of a long series are mostly noise. */
export const MAX_LAGS = 50;

/** Autocorrelation at lag j with Pyper & Peterman's small-sample factor n/(n - j) (their eq. 2). */
function autocorrelations(v: ArrayLike<number>, lags: number): Float64Array {
  const n = v.length;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += v[t];
  mean /= n;
  const d = new Float64Array(n);
  let ss = 0;
  for (let t = 0; t < n; t++) {
    d[t] = v[t] - mean;
    ss += d[t] * d[t];
  }
  const out = new Float64Array(lags + 1);
  out[0] = 1;
  if (!(ss > 0)) return out;
  // Four lags per pass over the rows: each d[t] is loaded once for four products, and the four sums are
  // independent, so the additions overlap instead of waiting on one another (a third of the time of one lag per
  // pass at 100,000 rows). Each sum still adds its products in row order.
  let j = 1;
  for (; j + 3 <= lags; j += 4) {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    const end = n - j - 3; // rows t where all four partners t + j .. t + j + 3 exist
    let t = 0;
    for (; t < end; t++) {
      const a = d[t];
      s0 += a * d[t + j];
      s1 += a * d[t + j + 1];
      s2 += a * d[t + j + 2];
      s3 += a * d[t + j + 3];
    }
    // The last rows, where only the shorter lags still have partners.
    for (; t + j < n; t++) {
      const a = d[t];
      s0 += a * d[t + j];
      if (t + j + 1 < n) s1 += a * d[t + j + 1];
      if (t + j + 2 < n) s2 += a * d[t + j + 2];
    }
    out[j] = ((n / (n - j)) * s0) / ss;
    out[j + 1] = ((n / (n - j - 1)) * s1) / ss;
    out[j + 2] = ((n / (n - j - 2)) * s2) / ss;
    out[j + 3] = ((n / (n - j - 3)) * s3) / ss;
  }
  for (; j <= lags; j++) {
    let s = 0;
    for (let t = 0; t + j < n; t++) s += d[t] * d[t + j];
    out[j] = ((n / (n - j)) * s) / ss;
  }
  return out;
}

/**
 * Effective rows for the correlation of x and y when neighbouring rows are alike (Pyper & Peterman 1998,
 * "Comparison of methods to account for autocorrelation in correlation analyses of fish data", Canadian Journal of
 * Fisheries and Aquatic Sciences 55:2127-2140, eq. 1, after Bartlett 1946 and Chelton 1984):
 *   1/N* = 1/N + (2/N) sum_{j=1}^{J} ((N - j)/N) r_xx(j) r_yy(j),
 * with r(j) the lag-j autocorrelations with the factor N/(N - j), summed to J = N/5 lags as the authors did, and
 * at most MAX_LAGS (the cap is ours: on long series the distant products add only noise, and it keeps the cost
 * O(50 N)). N* is kept within [3, N]: alternating series (negative products) are not counted as more than N rows.
 * The variance of r under independent rows is about 1/N; with dependent rows it is about 1/N*, so tests and
 * intervals use N* in place of N.
 */
export function effectiveRows(x: ArrayLike<number>, y: ArrayLike<number>): EffectiveRows {
  const n = x.length;
  const lags = Math.max(0, Math.min(Math.floor(n / 5), MAX_LAGS, n - 2));
  const ax = autocorrelations(x, lags);
  const ay = autocorrelations(y, lags);
  let sum = 0;
  for (let j = 1; j <= lags; j++) sum += ((n - j) / n) * ax[j] * ay[j];
  const inverse = 1 / n + (2 / n) * sum;
  const effective = inverse > 0 ? Math.min(n, Math.max(3, 1 / inverse)) : n;
  return { n, effective, lags, lag1x: lags >= 1 ? ax[1] : 0, lag1y: lags >= 1 ? ay[1] : 0 };
}
