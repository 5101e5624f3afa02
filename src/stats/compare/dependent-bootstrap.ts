import { bootstrapShareP, percentileBounds, replicate, ResampleSource, seededResamples } from '../bootstrap/bootstrap';
import { seedFromData } from '../bootstrap/rng';
import { correlatePrepared } from '../correlation/correlate';
import { PreparedPairs } from '../correlation/prepared';
import { replicatesFor, skippedHeldFixed, skippedRedetects, sortedColumns, statisticOnRows, SUBSAMPLE_ABOVE, usesSubsamples, weightedStatistic } from '../robust/robust';
import { normalInterval, normalPValue, SubsampleSpread, subsampleSpread } from '../bootstrap/subsample';
import { gatherWeights, weightedAverageRanks, weightedPearsonAbout } from '../robust/weighted';
import { isOrdinal, Method, METHOD_LABELS, StatsInputError } from '../types';
import { ComparisonDesign, ComparisonOptions, ComparisonResult, requireRows } from './comparison';

/** Two correlations on the same rows, as two prepared pairs of columns. */
interface SameRowsPairs {
  design: Exclude<ComparisonDesign, 'independent'>;
  first: PreparedPairs;
  second: PreparedPairs;
  /** The columns behind the seed. */
  columns: ArrayLike<number>[];
}

/**
 * The difference of two correlations measured on the same rows, for any coefficient other than Pearson (whose
 * closed forms are in shared.ts and separate.ts): the rows are resampled together, both coefficients recomputed
 * on each resample (Efron 1979), the interval is the percentile interval of the differences, and the p-value
 * twice the smaller share of differences on either side of 0 (the test that inverts that interval; Wilcox 2012,
 * section 9.4, compares dependent robust correlations this way). Resamples are seeded from the data, so the same
 * cells always give the same answer.
 */
function compareByBootstrap(pairs: SameRowsPairs, method: Method, opts: ComparisonOptions): ComparisonResult {
  if (isOrdinal(method)) throw new StatsInputError('bad-option', `comparisons of ${method} correlations are not offered: compare Spearman coefficients instead`);
  const { first, second } = pairs;
  const n = first.n;
  requireRows(n, 'the data');
  const r1 = correlatePrepared(first, { method, tail: 'both', level: opts.level, interval: 'none' }).statistic;
  const r2 = correlatePrepared(second, { method, tail: 'both', level: opts.level, interval: 'none' }).statistic;
  // Long columns: the skipped rule's set-aside rows are found once per pair and held fixed (re-finding them in
  // each of 200 resamples of 100,000 rows took 112 s; the same rule as the single coefficient's, skippedRedetects).
  const fixed = method === 'skipped' && !opts.resamples && !skippedRedetects(n) ? [skippedHeldFixed(first), skippedHeldFixed(second)] : null;
  const heldNote = fixed ? '; the set-aside rows held fixed at this size' : '';
  if (!opts.resamples && usesSubsamples(n, method)) {
    const spread = subsampleSpread(
      n,
      seedFromData(...pairs.columns),
      fixed ? (rows) => fixed[0].onRows(rows) - fixed[1].onRows(rows) : (rows) => statisticOnRows(first, method, rows) - statisticOnRows(second, method, rows),
      (v) => v,
    );
    const result = bySubsamples(pairs.design, method, r1, r2, n, n, spread, opts, 'the rows');
    if (fixed && result.interval) result.interval.method += heldNote;
    return result;
  }
  const diff = pairs.design === 'shared' && method === 'spearman' ? sharedSpearmanDifference(first, second) : null;
  const s1 = fixed ? fixed[0].weighted : weightedStatistic(first, method);
  const s2 = fixed ? fixed[1].weighted : weightedStatistic(second, method);
  const B = opts.resamples?.replicates ?? replicatesFor(2 * n, method); // two coefficients per resample
  const source: ResampleSource = opts.resamples ?? seededResamples(n, B, seedFromData(...pairs.columns));
  const values = replicate(diff ?? ((w, total) => s1(w, total) - s2(w, total)), n, source);
  const bounds = percentileBounds(values, opts.level);
  const d = r1 - r2;
  const { p, finite } = bootstrapShareP(values, opts.tail);
  if (finite === 0) throw new StatsInputError('constant', 'no resample gave both coefficients: a column is nearly constant');
  return {
    design: pairs.design, method, n, r1, r2, statistic: d, pValue: p, tail: opts.tail,
    interval: {
      lower: Math.min(bounds.lower, d), upper: Math.max(bounds.upper, d), level: opts.level, replicates: B, note: bounds.note,
      method: `percentile bootstrap of the difference, B = ${B} resamples of the rows${opts.resamples ? '' : ', seeded from the data'}${heldNote}`,
    },
    test: { name: 'z', value: NaN },
    pMethod: `bootstrap: twice the smaller share of ${finite} resampled differences on either side of 0 (${METHOD_LABELS[method].name})`,
    n1: n, n2: n, estimateCorrelation: NaN,
  };
}

/** The difference with a normal interval and test from a subsampling standard error (long columns). */
function bySubsamples(
  design: ComparisonDesign, method: Method, r1: number, r2: number, n1: number, n2: number, spread: SubsampleSpread, opts: ComparisonOptions, of: string,
): ComparisonResult {
  const d = r1 - r2;
  const b = normalInterval(d, spread.se, opts.level);
  return {
    design, method, n: design === 'independent' ? n1 + n2 : n1, r1, r2, statistic: d, pValue: normalPValue(d, spread.se, opts.tail), tail: opts.tail,
    interval: {
      lower: b.lower, upper: b.upper, level: opts.level, replicates: spread.groups,
      method: `normal interval, its standard error from ${spread.groups} random disjoint subsamples of ${of} (Politis & Romano 1994), seeded from the data`,
    },
    test: { name: 'z', value: d / spread.se },
    pMethod: `z test with a subsampling standard error (${METHOD_LABELS[method].name}; over ${SUBSAMPLE_ABOVE.toLocaleString('en-US')} rows, in place of the bootstrap)`,
    n1, n2, estimateCorrelation: design === 'independent' ? 0 : NaN,
  };
}

/** rho(common, a) - rho(common, b) per resample, ranking the common column once for both. */
function sharedSpearmanDifference(first: PreparedPairs, second: PreparedPairs): (w: Int32Array, total: number) => number {
  const p = sortedColumns(first);
  const q = sortedColumns(second);
  const n = first.n;
  const rc = new Float64Array(n);
  const ra = new Float64Array(n);
  const rb = new Float64Array(n);
  return (w, total) => {
    gatherWeights(p.x, w);
    gatherWeights(p.y, w);
    gatherWeights(q.y, w);
    weightedAverageRanks(p.x, rc);
    weightedAverageRanks(p.y, ra);
    weightedAverageRanks(q.y, rb);
    const mid = (total + 1) / 2;
    return weightedPearsonAbout(rc, ra, w, mid, mid) - weightedPearsonAbout(rc, rb, w, mid, mid);
  };
}

/** r(common, a) - r(common, b) for a coefficient without a closed-form comparison. */
export function compareSharedByBootstrap(common: ArrayLike<number>, a: ArrayLike<number>, b: ArrayLike<number>, method: Method, opts: ComparisonOptions): ComparisonResult {
  return compareByBootstrap({ design: 'shared', first: new PreparedPairs(common, a), second: new PreparedPairs(common, b), columns: [common, a, b] }, method, opts);
}

/** r(a, b) - r(c, d) for a coefficient without a closed-form comparison. */
export function compareSeparateByBootstrap(a: ArrayLike<number>, b: ArrayLike<number>, c: ArrayLike<number>, d: ArrayLike<number>, method: Method, opts: ComparisonOptions): ComparisonResult {
  return compareByBootstrap({ design: 'separate', first: new PreparedPairs(a, b), second: new PreparedPairs(c, d), columns: [a, b, c, d] }, method, opts);
}

/**
 * Two robust coefficients from independent groups: each group resampled on its own (Efron 1979), the difference
 * recomputed B times; the percentile interval of the differences and twice the smaller share on either side of 0
 * (Wilcox 2012, section 9.4, compares two independent correlations by this percentile bootstrap). Seeds come from
 * each group's data.
 */
export function compareIndependentByBootstrap(
  x1: ArrayLike<number>, y1: ArrayLike<number>, x2: ArrayLike<number>, y2: ArrayLike<number>, method: Method, opts: ComparisonOptions,
): ComparisonResult {
  if (isOrdinal(method)) throw new StatsInputError('bad-option', `comparisons of ${method} correlations are not offered: compare Spearman coefficients instead`);
  const g1 = new PreparedPairs(x1, y1);
  const g2 = new PreparedPairs(x2, y2);
  const n1 = g1.n;
  const n2 = g2.n;
  const r1 = correlatePrepared(g1, { method, tail: 'both', level: opts.level, interval: 'none' }).statistic;
  const r2 = correlatePrepared(g2, { method, tail: 'both', level: opts.level, interval: 'none' }).statistic;
  // As for dependent pairs: on long columns the skipped rule's set-aside rows are found once per group and held.
  const fixed = method === 'skipped' && !skippedRedetects(n1 + n2) ? [skippedHeldFixed(g1), skippedHeldFixed(g2)] : null;
  const heldNote = fixed ? '; the set-aside rows held fixed at this size' : '';
  if (usesSubsamples(n1 + n2, method)) {
    // Each group's own spread; independent groups add their variances.
    const s1 = subsampleSpread(n1, seedFromData(x1, y1), fixed ? fixed[0].onRows : (rows) => statisticOnRows(g1, method, rows), (v) => v);
    const s2 = subsampleSpread(n2, seedFromData(x2, y2), fixed ? fixed[1].onRows : (rows) => statisticOnRows(g2, method, rows), (v) => v);
    const spread = { se: Math.hypot(s1.se, s2.se), groups: Math.min(s1.groups, s2.groups), size: Math.min(s1.size, s2.size) };
    const result = bySubsamples('independent', method, r1, r2, n1, n2, spread, opts, 'each group');
    if (fixed && result.interval) result.interval.method += heldNote;
    return result;
  }
  const B = replicatesFor(n1 + n2, method);
  const t1 = replicate(fixed ? fixed[0].weighted : weightedStatistic(g1, method), n1, seededResamples(n1, B, seedFromData(x1, y1)));
  const t2 = replicate(fixed ? fixed[1].weighted : weightedStatistic(g2, method), n2, seededResamples(n2, B, seedFromData(x2, y2)));
  const values = new Float64Array(B);
  for (let b = 0; b < B; b++) values[b] = t1[b] - t2[b];
  const bounds = percentileBounds(values, opts.level);
  const d = r1 - r2;
  const { p, finite } = bootstrapShareP(values, opts.tail);
  return {
    design: 'independent', method, n: n1 + n2, r1, r2, statistic: d, pValue: p, tail: opts.tail,
    interval: {
      lower: Math.min(bounds.lower, d), upper: Math.max(bounds.upper, d), level: opts.level, replicates: B, note: bounds.note,
      method: `percentile bootstrap of the difference, B = ${B} resamples of each group, seeded from the data${heldNote}`,
    },
    test: { name: 'z', value: NaN },
    pMethod: `bootstrap: twice the smaller share of ${finite} resampled differences on either side of 0 (${METHOD_LABELS[method].name})`,
    n1, n2, estimateCorrelation: 0,
  };
}
