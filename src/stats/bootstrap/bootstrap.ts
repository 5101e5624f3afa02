import { normalCdf, normalQuantile } from '../distributions';
import { Xoshiro128 } from './rng';

/**
 * The nonparametric bootstrap (Efron 1979, "Bootstrap methods: another look at the jackknife", Annals of
 * Statistics 7:1-26) over rows, with the percentile and BCa intervals as Davison & Hinkley (1997), Bootstrap
 * Methods and their Application, Cambridge University Press, ch. 5, define them, and as R's boot package computes
 * them (boot.ci types "perc" and "bca"; the tests feed both the same resample indices).
 *
 * A statistic is a function of row weights (see src/stats/robust/weighted.ts): weights 1 for the data, the
 * multiplicities of a resample, or one weight 0 for the jackknife.
 */
export type WeightedStatistic = (w: Int32Array, total: number) => number;

/** Where the resamples come from: the data-seeded generator, or (in the tests) indices exported from R. */
export interface ResampleSource {
  readonly replicates: number;
  /** Writes resample b's multiplicities into `counts` (length n); b runs 0, 1, ... in order. */
  fill(b: number, counts: Int32Array): void;
}

/** Resamples drawn by the seeded generator: n rows uniformly with replacement, B times. */
export function seededResamples(n: number, replicates: number, seed: number): ResampleSource {
  const rng = new Xoshiro128(seed);
  return {
    replicates,
    fill(_b, counts) {
      counts.fill(0);
      rng.fillCounts(counts, n, n);
    },
  };
}

/** Resamples given as row indices, one array per resample (base 1 as R's boot.array writes them, or base 0). */
export function indexResamples(indices: ArrayLike<number>[], base: 0 | 1): ResampleSource {
  return {
    replicates: indices.length,
    fill(b, counts) {
      counts.fill(0);
      const row = indices[b];
      for (let k = 0; k < row.length; k++) counts[row[k] - base]++;
    },
  };
}

/** The statistic on every resample; NaN replicates (a degenerate resample) are kept as NaN. */
export function replicate(stat: WeightedStatistic, n: number, source: ResampleSource, onProgress?: (done: number) => void): Float64Array {
  const out = new Float64Array(source.replicates);
  const counts = new Int32Array(n);
  for (let b = 0; b < source.replicates; b++) {
    source.fill(b, counts);
    out[b] = stat(counts, n);
    if (onProgress && (b & 63) === 63) onProgress(b + 1);
  }
  return out;
}

/**
 * Interpolated order statistics of the finite replicates at probabilities `alpha`: boot's norm.inter (Davison &
 * Hinkley 1997, eq. 5.8). With R finite replicates and rk = (R + 1) alpha, k = trunc(rk): an integer rk takes the
 * k-th smallest; k = 0 the smallest and k = R the largest (extreme order statistics); otherwise the value is
 * interpolated between the k-th and (k+1)-th on the normal-quantile scale of k/(R+1) and (k+1)/(R+1).
 */
export function normalInterpolatedQuantiles(replicates: Float64Array, alpha: number[]): { values: number[]; extreme: boolean } {
  const t = replicates.filter((v) => Number.isFinite(v)).sort();
  const R = t.length;
  let extreme = false;
  const values = alpha.map((a) => {
    const rk = (R + 1) * a;
    const k = Math.trunc(rk);
    if (!(rk > 1 && rk < R)) extreme = true;
    if (k === rk && k >= 1 && k <= R) return t[k - 1];
    if (k <= 0) return t[0];
    if (k >= R) return t[R - 1];
    const z = normalQuantile(a);
    const zk = normalQuantile(k / (R + 1));
    const zk1 = normalQuantile((k + 1) / (R + 1));
    const tk = t[k - 1];
    const tk1 = t[k];
    return tk + ((z - zk) / (zk1 - zk)) * (tk1 - tk);
  });
  return { values, extreme };
}

/** The two tail probabilities of a two-sided interval, computed as boot.ci does: (1 -/+ level)/2. */
function tailProbabilities(level: number): [number, number] {
  return [(1 - level) / 2, (1 + level) / 2];
}

export interface BootstrapBounds {
  lower: number;
  upper: number;
  /** Set when an endpoint rests on the most extreme replicate, or when BCa could not be formed. */
  note?: string;
}

/** Percentile interval (Efron 1979; Davison & Hinkley 1997, eq. 5.18): boot.ci(type = "perc"). */
export function percentileBounds(replicates: Float64Array, level: number): BootstrapBounds {
  const { values, extreme } = normalInterpolatedQuantiles(replicates, tailProbabilities(level));
  return { lower: values[0], upper: values[1], note: extreme ? EXTREME_NOTE : undefined };
}

const EXTREME_NOTE = 'an endpoint is the most extreme resample: more resamples would be needed at this level';

/**
 * Jackknife influence values L_i = (n - 1)(t0 - t_(-i)), centred on the estimate t0 as boot's
 * empinf(type = "jack") centres them; with `groups` < n, rows are left out in `groups` interleaved groups (row i
 * in group i mod groups) and L is formed over groups, the grouped jackknife that keeps BCa's acceleration
 * affordable on long columns.
 */
export function jackknifeInfluence(stat: WeightedStatistic, n: number, t0: number, groups = n): Float64Array {
  const g = Math.min(groups, n);
  const w = new Int32Array(n).fill(1);
  const t = new Float64Array(g);
  for (let j = 0; j < g; j++) {
    for (let i = j; i < n; i += g) w[i] = 0;
    let left = 0;
    for (let i = j; i < n; i += g) left++;
    t[j] = stat(w, n - left);
    for (let i = j; i < n; i += g) w[i] = 1;
  }
  const L = new Float64Array(g);
  for (let j = 0; j < g; j++) L[j] = (g - 1) * (t0 - t[j]);
  return L;
}

/** BCa's acceleration from influence values: a = sum L^3 / (6 (sum L^2)^(3/2)) (Efron 1987, eq. 6.7). */
export function acceleration(L: Float64Array): number {
  let s2 = 0;
  let s3 = 0;
  for (let i = 0; i < L.length; i++) {
    s2 += L[i] * L[i];
    s3 += L[i] * L[i] * L[i];
  }
  return s3 / (6 * Math.pow(s2, 1.5));
}

/**
 * Bias-corrected and accelerated interval: Efron (1987), "Better bootstrap confidence intervals", JASA
 * 82:171-185; boot.ci(type = "bca"). w = qnorm(share of replicates strictly below t0), adjusted tail
 * probabilities pnorm(w + (w + z_a)/(1 - a (w + z_a))), then the interpolated quantiles above.
 */
export function bcaBounds(replicates: Float64Array, t0: number, L: Float64Array, level: number): BootstrapBounds {
  let finite = 0;
  let below = 0;
  for (let b = 0; b < replicates.length; b++) {
    const v = replicates[b];
    if (!Number.isFinite(v)) continue;
    finite++;
    if (v < t0) below++;
  }
  const w = normalQuantile(below / finite);
  const a = acceleration(L);
  if (!Number.isFinite(w) || !Number.isFinite(a)) {
    return { lower: NaN, upper: NaN, note: Number.isFinite(w) ? 'the jackknife shows no variation, so the BCa acceleration is undefined' : 'every resample lies on one side of the estimate, so the BCa bias correction is infinite' };
  }
  const adjusted = tailProbabilities(level).map((p) => {
    const z = normalQuantile(p);
    return normalCdf(w + (w + z) / (1 - a * (w + z)));
  });
  const { values, extreme } = normalInterpolatedQuantiles(replicates, adjusted);
  return { lower: values[0], upper: values[1], note: extreme ? EXTREME_NOTE : undefined };
}

/** Twice the smaller share of replicates on either side of 0 (two-sided), or the one share a tail asks for. */
export function bootstrapShareP(values: Float64Array, tail: 'both' | 'positive' | 'negative'): { p: number; finite: number } {
  let atOrBelow = 0;
  let atOrAbove = 0;
  let finite = 0;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    finite++;
    if (v <= 0) atOrBelow++;
    if (v >= 0) atOrAbove++;
  }
  const lower = atOrBelow / finite;
  const upper = atOrAbove / finite;
  const p = tail === 'positive' ? lower : tail === 'negative' ? upper : Math.min(1, 2 * Math.min(lower, upper));
  return { p, finite };
}

