import { normalQuantile, normalSf } from '../distributions';
import { Xoshiro128 } from './rng';

/**
 * A standard error from disjoint subsamples, for columns too long to bootstrap promptly: the rows are dealt at
 * random (seeded from the data) into G groups of m = floor(n/G) rows, the statistic is computed on each, and
 * for a statistic whose error shrinks as 1/sqrt(n) the spread of the G values, times sqrt(m/n), estimates the
 * standard error at n: Politis & Romano (1994), "Large sample confidence regions based on subsamples under
 * minimal assumptions", Annals of Statistics 22:2031-2050; Carlstein (1986), Annals of Statistics 14:1171-1179.
 * The work is G statistics on m rows, so one pass's worth in all, where a bootstrap needs hundreds of passes;
 * at the sizes it is used for (over 50,000 rows) the sampling distribution of every coefficient here is close
 * to normal on Fisher's z scale, which is what the interval assumes.
 */
export const SUBSAMPLE_GROUPS = 200;

/** The rows dealt into groups: group g holds rows perm[g*m .. (g+1)*m - 1]. */
export function dealRows(n: number, groups: number, seed: number): { perm: Uint32Array; size: number } {
  const perm = new Uint32Array(n);
  for (let i = 0; i < n; i++) perm[i] = i;
  const rng = new Xoshiro128(seed);
  // Fisher-Yates (Knuth 1969, The Art of Computer Programming 2, Algorithm P).
  for (let i = n - 1; i > 0; i--) {
    const j = rng.below(i + 1);
    const t = perm[i];
    perm[i] = perm[j];
    perm[j] = t;
  }
  return { perm, size: Math.floor(n / groups) };
}

export interface SubsampleSpread {
  /** Standard error at n of the transformed statistic. */
  se: number;
  groups: number;
  size: number;
}

/**
 * The standard error at n of `transform(statistic)`, from `groups` disjoint random subsamples; `evaluate(rows)`
 * computes the statistic on the given rows (NaN values are left out).
 */
export function subsampleSpread(
  n: number, seed: number, evaluate: (rows: Uint32Array) => number, transform: (v: number) => number, groups = SUBSAMPLE_GROUPS,
): SubsampleSpread {
  const { perm, size } = dealRows(n, groups, seed);
  let count = 0;
  let mean = 0;
  let m2 = 0;
  for (let g = 0; g < groups; g++) {
    const v = transform(evaluate(perm.subarray(g * size, (g + 1) * size)));
    if (!Number.isFinite(v)) continue;
    // Welford (1962), Technometrics 4:419-420.
    count++;
    const d = v - mean;
    mean += d / count;
    m2 += d * (v - mean);
  }
  const sd = count > 1 ? Math.sqrt(m2 / (count - 1)) : NaN;
  return { se: sd * Math.sqrt(size / n), groups: count, size };
}

/** Two-sided normal interval est -/+ q se and the p-value of est = 0 on the given scale. */
export function normalInterval(est: number, se: number, level: number): { lower: number; upper: number } {
  const q = normalQuantile(0.5 + level / 2);
  return { lower: est - q * se, upper: est + q * se };
}

export function normalPValue(est: number, se: number, tail: 'both' | 'positive' | 'negative'): number {
  const z = est / se;
  if (tail === 'positive') return normalSf(z);
  if (tail === 'negative') return normalSf(-z);
  return Math.min(1, 2 * normalSf(Math.abs(z)));
}
