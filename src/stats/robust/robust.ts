import { acceleration, bcaBounds, BootstrapBounds, bootstrapShareP, indexResamples, jackknifeInfluence, percentileBounds, replicate, ResampleSource, seededResamples, WeightedStatistic } from '../bootstrap/bootstrap';
import { seedFromData } from '../bootstrap/rng';
import { normalInterval, subsampleSpread } from '../bootstrap/subsample';
import { kendallCounts, tauB } from '../correlation/kendall';
import { pFromT, tFromR } from '../correlation/fisher';
import { PreparedPairs } from '../correlation/prepared';
import { CorrelationResult, Interval, IntervalMethod, Method, RobustMethod, StatsInputError, Tail, TestStatistic } from '../types';
import { biweight, percentageBend, RobustStatistic, winsorized, winsorizedCount, BEND } from './coefficients';
import { DIRECTIONS, findSkippedRows } from './skipped';
import { gatherWeights, SortedColumn, sortedColumn, weightedAverageRanks, weightedMad, weightedMedian, weightedPearson, weightedPearsonAbout, weightedDeviationKth } from './weighted';

/**
 * Resamples per bootstrap interval: 2,000 (Efron & Tibshirani 1993, An Introduction to the Bootstrap, ch. 19,
 * advise at least 1,000 for percentile limits), fewer on long columns so that an interval costs about the same
 * at any size, never fewer than MIN_REPLICATES (at 95% the 2.5% tail then still rests on five resamples, and on
 * columns that long the interval is narrow enough that its Monte Carlo wobble, about a tenth of its half-width,
 * is a small number).
 */
export const MAX_REPLICATES = 2000;
export const MIN_REPLICATES = 200;
/** Row visits one bootstrap may spend before B drops below MAX_REPLICATES: 2,000 resamples of 5,000 rows. A row
 *  visit of a resample costs about 100 ns here, so this keeps a bootstrap near 1 s of a cell's time budget (at
 *  3e7, robust intervals took 1.1–1.5 s from 15,000 to 100,000 rows). */
const ROW_BUDGET = 1e7;
/** Exact jackknife (one row left out at a time) up to this many rows; interleaved groups above. */
export const JACKKNIFE_EXACT_MAX = 2000;
const JACKKNIFE_GROUPS = 100;
/** Kendall's tau costs O(n log n) per resample: above this many rows its interval comes from subsamples. */
export const KENDALL_BOOTSTRAP_MAX = 20000;
/** Above this many rows every bootstrap interval is replaced by one from disjoint subsamples (subsample.ts): at
 *  50,000 rows the fewest resamples (200) already cost the whole row budget. */
export const SUBSAMPLE_ABOVE = 50000;

/** True when an interval over n rows of `method` comes from subsamples rather than a bootstrap. */
export function usesSubsamples(n: number, method: Method): boolean {
  return n > SUBSAMPLE_ABOVE || (method === 'kendall' && n > KENDALL_BOOTSTRAP_MAX);
}

/** The statistic of `method` on the given rows of the prepared columns alone. */
export function statisticOnRows(prep: PreparedPairs, method: Method, rows: Uint32Array): number {
  const m = rows.length;
  const x = new Float64Array(m);
  const y = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    x[k] = prep.x[rows[k]];
    y[k] = prep.y[rows[k]];
  }
  const part = new PreparedPairs(x, y);
  return weightedStatistic(part, method)(new Int32Array(m).fill(1), m);
}
/** The skipped correlation re-finds its outliers in every resample while that costs no more than this many
 *  row-direction visits in all; above, the skipped rows are held fixed (stated in the interval's method). */
const SKIPPED_BUDGET = 3e8;

/** True when the skipped correlation's bootstrap re-finds the outliers in every resample at n rows. */
export function skippedRedetects(n: number): boolean {
  return n * Math.min(n, DIRECTIONS) * replicatesFor(n) <= SKIPPED_BUDGET;
}

/** Relative cost of one resample per row: ranking both columns costs about twice a scored coefficient. */
const COST: Partial<Record<Method, number>> = { spearman: 2 };

/** Resamples for a bootstrap of `method` over n rows. */
export function replicatesFor(n: number, method: Method = 'pearson'): number {
  return Math.max(MIN_REPLICATES, Math.min(MAX_REPLICATES, Math.floor(ROW_BUDGET / (n * (COST[method] ?? 1)))));
}

export interface Sorted {
  x: SortedColumn;
  y: SortedColumn;
}

/** The prepared columns sorted once, as the weighted statistics read them (memoised on the prepared pairs). */
export function sortedColumns(prep: PreparedPairs): Sorted {
  return prep.memo('robust:sorted', () => ({ x: sortedColumn(prep.x, prep.sortedX.order), y: sortedColumn(prep.y, prep.sortedY.order) }));
}

/** The rows of a weighted resample written out, in row order (each row as many times as it was drawn). */
function expand(src: Float64Array, w: ArrayLike<number>, total: number, out: Float64Array = new Float64Array(total)): Float64Array {
  let k = 0;
  for (let i = 0; i < src.length; i++) for (let c = w[i]; c > 0; c--) out[k++] = src[i];
  return out;
}

const ROBUST_FNS: Record<'percentage_bend' | 'winsorized' | 'biweight', RobustStatistic> = {
  percentage_bend: percentageBend,
  winsorized,
  biweight,
};

/**
 * The skipped correlation with its set-aside rows found once, on all the rows, and held fixed: Pearson on the
 * kept rows as a function of resample weights (and, for subsamples, of a list of rows). This is what a bootstrap
 * of long columns uses where re-finding the outliers in every resample would cost more than the time budget
 * (skippedRedetects); the comparisons say so in their method text.
 */
export function skippedHeldFixed(prep: PreparedPairs): { weighted: WeightedStatistic; onRows: (rows: Uint32Array) => number } {
  const found = skippedOn(prep.x, prep.y);
  if (!found.skipped) throw new StatsInputError('constant', 'a column is constant: a correlation needs variation in both columns');
  const keep = found.skipped;
  const wk = new Int32Array(prep.n);
  return {
    weighted: (w) => {
      for (let i = 0; i < wk.length; i++) wk[i] = keep[i] ? 0 : w[i];
      return weightedPearson(prep.x, prep.y, wk);
    },
    onRows: (rows) => {
      let m = 0;
      for (let k = 0; k < rows.length; k++) if (!keep[rows[k]]) m++;
      const x = new Float64Array(m);
      const y = new Float64Array(m);
      let j = 0;
      for (let k = 0; k < rows.length; k++) {
        const i = rows[k];
        if (keep[i]) continue;
        x[j] = prep.x[i];
        y[j++] = prep.y[i];
      }
      return weightedPearson(x, y, new Int32Array(m).fill(1));
    },
  };
}

/** Pearson or Spearman of the rows the skipped rule keeps; NaN when a column is constant. */
function skippedOn(x: Float64Array, y: Float64Array): { r: number; kept: number; skipped: Uint8Array | null } {
  const found = findSkippedRows(x, y);
  if (!found) return { r: NaN, kept: 0, skipped: null };
  const w = new Int32Array(x.length);
  for (let i = 0; i < x.length; i++) w[i] = found.skipped[i] ? 0 : 1;
  return { r: weightedPearson(x, y, w), kept: x.length - found.count, skipped: found.skipped };
}

/**
 * The statistic of `method` as a function of row weights, over the prepared columns: what the bootstrap and
 * the jackknife evaluate. Classical coefficients and the three scored robust ones work on the shared sorted
 * orders in O(n) per resample; Kendall and the skipped correlation write the resample out and recompute.
 */
export function weightedStatistic(prep: PreparedPairs, method: Method): WeightedStatistic {
  const n = prep.n;
  switch (method) {
    case 'pearson': {
      const { meanX, meanY } = prep.moments;
      return (w) => weightedPearsonAbout(prep.x, prep.y, w, meanX, meanY);
    }
    case 'spearman': {
      const s = sortedColumns(prep);
      const ra = new Float64Array(n);
      const rb = new Float64Array(n);
      return (w, total) => {
        gatherWeights(s.x, w);
        gatherWeights(s.y, w);
        const mid = (total + 1) / 2;
        return weightedPearsonAbout(weightedAverageRanks(s.x, ra), weightedAverageRanks(s.y, rb), w, mid, mid);
      };
    }
    case 'kendall':
      return (w, total) => {
        const x = expand(prep.x, w, total);
        const y = expand(prep.y, w, total);
        return tauB(kendallCounts(x, y));
      };
    case 'percentage_bend':
    case 'winsorized':
    case 'biweight': {
      const s = sortedColumns(prep);
      const fn = ROBUST_FNS[method];
      return (w, total) => fn(s.x, s.y, w, total);
    }
    case 'skipped':
      return (w, total) => skippedOn(expand(prep.x, w, total), expand(prep.y, w, total)).r;
    default:
      throw new StatsInputError('bad-option', `no bootstrap is defined for ${method}`);
  }
}

export interface BootstrapOptions {
  level: number;
  kind: 'percentile' | 'bca';
  /** Resamples from elsewhere (the tests pass R's indices); by default drawn by the generator seeded from the data. */
  resamples?: ResampleSource;
  /** Replicates done so far, every 64. */
  onProgress?: (done: number, of: number) => void;
}

export interface BootstrapInterval extends Interval {
  replicates: number;
  /** The replicates themselves (for a p-value from the bootstrap distribution, or a plot). */
  values: Float64Array;
}

const KIND_WORDS: Record<'percentile' | 'bca', string> = { percentile: 'percentile bootstrap', bca: 'BCa bootstrap (Efron 1987)' };

/** A bootstrap interval for `method` on the prepared rows; `t0` is the estimate on all rows. */
export function bootstrapInterval(prep: PreparedPairs, method: Method, t0: number, opts: BootstrapOptions): BootstrapInterval {
  const n = prep.n;
  if (!opts.resamples && usesSubsamples(n, method)) {
    const spread = subsampleSpread(n, seedFromData(prep.x, prep.y), (rows) => statisticOnRows(prep, method, rows), (v) => Math.atanh(Math.max(-1 + 1e-15, Math.min(1 - 1e-15, v))));
    const z0 = Math.atanh(t0);
    const b = normalInterval(z0, spread.se, opts.level);
    return {
      lower: Math.min(t0, Math.tanh(b.lower)), upper: Math.max(t0, Math.tanh(b.upper)), level: opts.level, replicates: spread.groups, values: new Float64Array(0),
      method: `normal interval on Fisher's z, its standard error from ${spread.groups} random disjoint subsamples of ${spread.size.toLocaleString('en-US')} rows (Politis & Romano 1994), seeded from the data: at ${n.toLocaleString('en-US')} rows this stands in for the ${opts.kind === 'bca' ? 'BCa' : 'percentile'} bootstrap`,
    };
  }
  const stat = weightedStatistic(prep, method);
  const B = opts.resamples?.replicates ?? replicatesFor(n, method);
  const source = opts.resamples ?? seededResamples(n, B, seedFromData(prep.x, prep.y));
  const values = replicate(stat, n, source, opts.onProgress ? (d) => opts.onProgress?.(d, B) : undefined);
  let bounds: BootstrapBounds;
  let how = `${KIND_WORDS[opts.kind]}, B = ${B} resamples of the rows${opts.resamples ? '' : ', seeded from the data'}`;
  if (opts.kind === 'bca') {
    const groups = n <= JACKKNIFE_EXACT_MAX ? n : JACKKNIFE_GROUPS;
    if (groups < n) how += `; acceleration from a jackknife over ${groups} groups of rows`;
    bounds = bcaBounds(values, t0, jackknifeInfluence(stat, n, t0, groups), opts.level);
  } else {
    bounds = percentileBounds(values, opts.level);
  }
  let lower = bounds.lower;
  let upper = bounds.upper;
  if (lower > t0) lower = t0;
  if (upper < t0) upper = t0;
  return { lower, upper, level: opts.level, method: how, note: bounds.note, replicates: B, values };
}

/** Words for the robust coefficients' names, as results carry them. */
const NAMES = { percentage_bend: 'percentage bend', winsorized: 'winsorized', biweight: 'biweight midcorrelation', skipped: 'skipped Pearson' } as const;

function unitOnes(n: number): Int32Array {
  return new Int32Array(n).fill(1);
}

/** Which column makes a scored robust coefficient undefined, in words. */
function undefinedReason(method: 'percentage_bend' | 'winsorized' | 'biweight', s: Sorted, n: number): string {
  const w = unitOnes(n);
  for (const [col, label] of [[s.x, 'x'], [s.y, 'y']] as const) {
    gatherWeights(col, w);
    const med = weightedMedian(col, n);
    if (method === 'percentage_bend' && !(weightedDeviationKth(col, med, Math.floor((1 - BEND) * n + 0.5)) > 0)) {
      return `the percentage bend correlation is undefined: ${Math.round((1 - BEND) * 100)}% or more of ${label} share one value`;
    }
    if (method === 'biweight' && !(weightedMad(col, med, n) > 0)) {
      return `the biweight midcorrelation is undefined: half or more of ${label} share one value`;
    }
  }
  return 'the winsorized correlation is undefined: after pulling in 20% of each tail a column is constant';
}

export interface RobustOptions {
  method: RobustMethod;
  tail: Tail;
  level: number;
  /** 'none' when only the coefficient and its p-value are wanted (a matrix, a sensitivity row). */
  interval?: IntervalMethod | 'none';
  resamples?: ResampleSource;
  onProgress?: (done: number, of: number) => void;
}

/**
 * A robust correlation with its test and a bootstrap interval.
 * - percentage bend and biweight: t = r sqrt((n - 2)/(1 - r^2)) on n - 2 df (Wilcox 1994; Wilcox 2012, 9.3.8);
 * - winsorized: the same t on h - 2 df, h = n - 2g the rows left unwinsorized (Wilcox 1993);
 * - skipped: Pearson on the kept rows; its p-value is read from the bootstrap distribution (twice the smaller
 *   share of resamples on either side of 0) while the outliers can be re-found in each resample, since a t test
 *   on the kept rows ignores that they were chosen (Wilcox 2004 shows it is then too liberal); on longer columns
 *   the skipped rows are held fixed and the t test on the kept rows is used, said in pMethod.
 * Intervals: percentile bootstrap (Wilcox's advice for these coefficients) unless BCa is asked for.
 * @throws StatsInputError for fewer than 5 rows, an undefined coefficient, or a Fisher interval (these have none).
 */
export function correlateRobust(prep: PreparedPairs, opts: RobustOptions): CorrelationResult {
  const { method, tail, level } = opts;
  const n = prep.n;
  const kind = opts.interval ?? 'percentile';
  if (kind === 'fisher') {
    throw new StatsInputError('bad-option', `the ${NAMES[method]} correlation has no Fisher-z interval: ask for "percentile" or "bca"`);
  }
  if (n < 5) throw new StatsInputError('too-few', `only ${n} usable pairs: the robust coefficients need at least 5`);
  const boot: BootstrapOptions = { level, kind: kind === 'none' ? 'percentile' : kind, resamples: opts.resamples, onProgress: opts.onProgress };
  if (method === 'skipped') return skippedResult(prep, tail, boot);
  const s = sortedColumns(prep);
  const r = ROBUST_FNS[method](s.x, s.y, unitOnes(n), n);
  if (Number.isNaN(r)) throw new StatsInputError('constant', undefinedReason(method, s, n));
  const df = method === 'winsorized' ? n - 2 * winsorizedCount(n) - 2 : n - 2;
  if (df < 1) throw new StatsInputError('too-few', `only ${n} usable pairs: too few for the winsorized correlation's test`);
  const t = tFromR(r, df);
  const shown: Interval = kind === 'none'
    ? { lower: NaN, upper: NaN, level, method: 'not computed', note: 'only the coefficient and its test were asked for' }
    : withoutValues(bootstrapInterval(prep, method, r, boot));
  return {
    method, name: NAMES[method], statistic: r, pValue: pFromT(t, df, tail), tail, interval: shown, n,
    test: { name: 't', value: t, df },
    pMethod: method === 'winsorized' ? 't test, df = n - 2g - 2 (g = rows winsorized in each tail)' : 't test, df = n - 2',
  };
}

function skippedResult(prep: PreparedPairs, tail: Tail, boot: BootstrapOptions): CorrelationResult {
  const n = prep.n;
  const found = skippedOn(prep.x, prep.y);
  if (!found.skipped) throw new StatsInputError('constant', 'a column is constant: a correlation needs variation in both columns');
  if (found.kept < 5) throw new StatsInputError('too-few', `the skipped correlation set aside ${n - found.kept} of ${n} rows, leaving too few to correlate`);
  if (Number.isNaN(found.r)) throw new StatsInputError('constant', 'after setting aside the outlying rows a column is constant');
  const skippedRows: number[] = [];
  for (let i = 0; i < n; i++) if (found.skipped[i]) skippedRows.push(i);
  const r = found.r;
  const redetect = skippedRedetects(n) || boot.resamples !== undefined;
  const setAside = `${skippedRows.length} of ${n} rows set aside as bivariate outliers (projection rule)`;
  if (redetect) {
    const interval = bootstrapInterval(prep, 'skipped', r, boot);
    const { values, ...shown } = interval;
    const { p, finite } = bootstrapShareP(values, tail);
    const test: TestStatistic = { name: 'z', value: NaN };
    return {
      method: 'skipped', name: 'skipped Pearson', statistic: r, pValue: p, tail, interval: { ...shown, method: `${shown.method}; outliers re-found in every resample` }, n,
      test, pMethod: `bootstrap: share of ${finite} resamples on the far side of 0 (outliers re-found in each)`, skippedRows, note: setAside,
    };
  }
  // Long columns: the set-aside rows are held fixed; the kept rows are bootstrapped as they stand.
  // Copied by index into typed arrays (a typed array's filter gathers the kept values in a boxed list first: at
  // a million rows that is some 200 MB of short-lived heap and a full collection of the host's row arrays).
  const keptX = new Float64Array(n - skippedRows.length);
  const keptY = new Float64Array(n - skippedRows.length);
  for (let i = 0, j = 0; i < n; i++) {
    if (found.skipped[i]) continue;
    keptX[j] = prep.x[i];
    keptY[j++] = prep.y[i];
  }
  const kept = new PreparedPairs(keptX, keptY);
  const m = kept.n;
  const df = m - 2;
  const t = tFromR(r, df);
  const interval = bootstrapInterval(kept, 'pearson', r, boot);
  const { values: _v, ...shown } = interval;
  return {
    method: 'skipped', name: 'skipped Pearson', statistic: r, pValue: pFromT(t, df, tail), tail,
    interval: { ...shown, method: `${shown.method}, of the ${m} kept rows (the set-aside rows held fixed at this size)` }, n,
    test: { name: 't', value: t, df }, pMethod: 't test on the kept rows, df = kept - 2 (the set-aside rows held fixed at this size)', skippedRows, note: setAside,
  };
}

function withoutValues(b: BootstrapInterval): Interval {
  const { values: _values, ...shown } = b;
  return shown;
}

export { acceleration, indexResamples };
