import { borrowF64, giveBack } from '../internal/scratch';
import { powerOfTwoScale } from '../correlation/comoments';
import { normalQuantile } from '../distributions';
import { fitLine, LineFit } from '../correlation/regression';
import { validAlpha } from '../options';
import { StatsInputError } from '../types';
import { breuschPagan } from './breusch-pagan';
import { CheckKey, CheckReport, CheckRow, PointDiagnostics } from './check-report';
import { dagostinoPearson } from './dagostino';
import { durbinWatson, DW_EXACT_MAX } from './durbin-watson';
import { formatNumber as num, formatP } from '../format';
import { bonferroniOutlierP, cookCutoff, lineInfluence, LineInfluence } from './influence';
import { distinctUpToThree } from '../correlation/distinct';
import { curvatureTest } from './linearity';
import { shapeMoments } from './moments';
import { SHAPIRO_WILK_MAX_N, shapiroWilk } from './shapiro-wilk';

export interface RunChecksOptions {
  /** Significance level of every check, in (0, 1); 0.05 is usual. */
  alpha: number;
  /** The sheet row of each pair, used in messages: "row 12". */
  rows?: ArrayLike<number>;
  /** Names a pair in messages (e.g. "column F" for data laid out in rows); overrides rows. Without either, pairs
   * are named by their 1-based position among the pairs: "position 5". */
  pointName?: (i: number) => string;
}

/** A leverage this close to 1 means the line must pass through that point. */
export const SETS_SLOPE_LEVERAGE = 0.99;

/** Fewest pairs for the checks built on residuals (a line through 3 points leaves 1 degree of freedom). */
const MIN_FOR_RESIDUALS = 4;

const LABELS: Record<CheckKey, string> = {
  'normal-x': 'Normal x',
  'normal-y': 'Normal y',
  'normal-residuals': 'Normal residuals',
  'straight-line': 'Straight line',
  'even-spread': 'Even spread',
  outliers: 'Outliers',
  influence: 'Influential points',
  'row-order': 'Row order',
};

const SW_TEST = 'Shapiro–Wilk W';
const K2_TEST = "D'Agostino–Pearson K²";

/** A row that could not run; the reason doubles as its meaning. */
function notTestable(key: CheckKey, test: string, reason: string): CheckRow {
  return { key, label: LABELS[key], test, statistic: null, pValue: null, verdict: 'not testable', meaning: `Not testable: ${reason}.`, reason, detail: {} };
}

/** Runs one check; a core input error becomes a not-testable row with the error's message as the reason. */
function safely(key: CheckKey, test: string, build: () => CheckRow): CheckRow {
  try {
    const row = build();
    // A statistic or p-value that came out NaN (a degenerate sample) is no answer: say so rather than show it.
    if (row.statistic !== null && Number.isNaN(row.statistic)) return notTestable(key, test, 'the test is undefined for these values');
    if (row.pValue !== null && Number.isNaN(row.pValue)) return notTestable(key, test, 'the p-value is undefined for these values');
    return row;
  } catch (e) {
    if (e instanceof StatsInputError) return notTestable(key, test, e.message);
    throw e;
  }
}

/**
 * How far rounding alone can move a residual of this fit, the same in any row order (it depends only on the
 * largest magnitudes and the slope). A fitted value a + b x_i rounds at about eps (max |y| + |b| max |x|), and the
 * slope, a ratio of sums over n rows, carries an error that grows like sqrt(n) eps (the statistical rule of thumb
 * for summation, Higham 2002, Accuracy and Stability of Numerical Algorithms, 2nd ed., SIAM, sec. 2.8), which moves
 * a residual by at most that much times |b| (max |x| + |mean x|). 16 sqrt(n) eps leaves a wide margin over both
 * while staying far below any scatter a measurement can show (about 1e-13 of the data's magnitude at 40 rows).
 */
function residualNoise(x: ArrayLike<number>, y: ArrayLike<number>, fit: LineFit): number {
  let xMax = 0;
  let yMax = 0;
  for (let i = 0; i < fit.n; i++) {
    xMax = Math.max(xMax, Math.abs(x[i]));
    yMax = Math.max(yMax, Math.abs(y[i]));
  }
  return 16 * Math.sqrt(fit.n) * Number.EPSILON * (yMax + Math.abs(fit.slope) * xMax);
}

/**
 * True when every residual is within rounding of zero: the points lie exactly on the line. Judged against one
 * noise level for all rows (not row by row against each value, where a zero y with a fitted value of rounding size
 * would count as off the line in one row order and on it in another).
 */
function liesOnLine(fit: LineFit, noise: number): boolean {
  for (let i = 0; i < fit.n; i++) {
    if (Math.abs(fit.residuals[i]) > noise) return false;
  }
  return true;
}

const ON_LINE = 'the points lie exactly on a straight line, so nothing is left over to test';
const tooFew = (min: number): string => `too few rows: this check needs at least ${min} pairs`;

/** Normality of one column (x, y or the residuals): Shapiro-Wilk up to 5000 values, K^2 above. */
function normalityRow(
  key: 'normal-x' | 'normal-y' | 'normal-residuals',
  values: ArrayLike<number>,
  alpha: number,
  minN: number,
): CheckRow {
  const n = values.length;
  const test = n > SHAPIRO_WILK_MAX_N ? K2_TEST : SW_TEST;
  const [subject, verb] =
    key === 'normal-x' ? ['the x values', 'depart'] : key === 'normal-y' ? ['the y values', 'depart'] : ['the scatter around the line', 'departs'];
  const short = key === 'normal-x' ? 'x' : key === 'normal-y' ? 'y' : 'residuals';
  if (n < minN) return notTestable(key, test, tooFew(minN));
  if (key !== 'normal-residuals' && distinctUpToThree(values) === 2) {
    return notTestable(key, test, `${short} takes only two values (two groups), so a normal shape does not apply`);
  }
  return safely(key, test, () => {
    const shape = shapeMoments(values);
    const res = n > SHAPIRO_WILK_MAX_N ? dagostinoPearson(values) : shapiroWilk(values);
    const flagged = res.pValue < alpha;
    const shapeWords = `skewness ${num(shape.skewness)}, excess kurtosis ${num(shape.excessKurtosis)}`;
    let meaning: string;
    if (!flagged) {
      meaning = `No clear sign that ${subject} ${verb} from a normal shape (${shapeWords}).`;
    } else if (n > SHAPIRO_WILK_MAX_N) {
      meaning = `${cap(subject)} ${verb} from a normal shape (${shapeWords}); with ${n} rows even slight departures are detected, so judge by the skewness and kurtosis.`;
    } else {
      meaning = `${cap(subject)} ${verb} from a normal shape (${shapeWords}), which can make Pearson's p-value and interval inaccurate; rank coefficients do not need a normal shape.`;
    }
    return {
      key, label: LABELS[key], test, statistic: res.statistic, pValue: res.pValue, verdict: flagged ? 'flag' : 'ok', meaning,
      flag: flagged ? `${short} not normal` : undefined,
      detail: { skewness: shape.skewness, excessKurtosis: shape.excessKurtosis, n },
    };
  });
}

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/**
 * Runs all eight assumption checks of a straight-line correlation once, for the cell functions and the panel:
 * 1-3. normality of x, y and the residuals (Shapiro-Wilk, Royston 1995, for 3 <= n <= 5000; D'Agostino-Pearson K^2,
 *      D'Agostino, Belanger & D'Agostino 1990, above), with skewness and excess kurtosis;
 * 4.   straight-line form (F test for adding x^2, equal to RESET with squared fitted values);
 * 5.   even spread (Breusch-Pagan, Koenker's studentized form);
 * 6.   outliers (largest externally studentized residual, Bonferroni p);
 * 7.   influence (largest Cook's distance against the median of F(2, n - 2); or a point of leverage >= 0.99 that
 *      sets the slope on its own);
 * 8.   dependence on row order (Durbin-Watson, one-sided for neighbouring rows alike).
 * A check that cannot run says why in its own row; one failing check never stops the others. Everything is O(n)
 * except Shapiro-Wilk's sort (n <= 5000) and the exact Durbin-Watson distribution (n < 100).
 * @param x the predictor column (finite numbers, pairs in sheet order)
 * @param y the outcome column
 * @throws StatsInputError when the columns differ in length, hold fewer than 3 pairs or a non-finite value, a
 *   column is constant (no correlation exists to check), or alpha is outside (0, 1).
 * @example runChecks(x, y, { alpha: 0.05 }).flags // e.g. ["curved"]
 */
export function runChecks(xIn: ArrayLike<number>, yIn: ArrayLike<number>, opts: RunChecksOptions): CheckReport {
  // One array type throughout keeps every loop below monomorphic (mixing plain arrays and typed arrays in the same
  // functions makes V8's element access many times slower on a million rows).
  const x = xIn instanceof Float64Array ? xIn : Float64Array.from(xIn);
  const y = yIn instanceof Float64Array ? yIn : Float64Array.from(yIn);
  const n = x.length;
  const { alpha } = opts;
  if (y.length !== n) throw new StatsInputError('unequal-length', 'x and y must hold the same number of values');
  validAlpha(alpha);
  if (n < 3) throw new StatsInputError('too-few', `only ${n} usable pair${n === 1 ? '' : 's'}: the checks need at least 3`);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i])) {
      throw new StatsInputError('out-of-range', 'every value must be a finite number');
    }
  }
  if (opts.rows && opts.rows.length !== n) throw new StatsInputError('unequal-length', 'rows must name every pair');
  const rows = opts.rows;
  const where = opts.pointName ?? ((i: number): string => (rows ? `row ${rows[i]}` : `position ${i + 1}`));

  // Every check is free of units, so all of them run on x and y scaled by powers of two (exact) to magnitudes
  // near 1: columns in units 1e300 apart then cost nothing, where the slope in original units would overflow and
  // take the residuals with it. Only the line and the per-point arrays are given back in original units.
  const scaleX = powerOfTwoScale(x);
  const scaleY = powerOfTwoScale(y);
  const xs = scaleX === 1 ? x : scaledCopy(x, scaleX);
  const ys = scaleY === 1 ? y : scaledCopy(y, scaleY);
  const fit = fitLine(xs, ys);
  const noise = residualNoise(xs, ys, fit);
  const onLine = liesOnLine(fit, noise);
  const infl = lineInfluence(xs, fit.residuals, noise);

  const checks: CheckRow[] = [
    normalityRow('normal-x', xs, alpha, 3),
    normalityRow('normal-y', ys, alpha, 3),
    onLine
      ? notTestable('normal-residuals', n > SHAPIRO_WILK_MAX_N ? K2_TEST : SW_TEST, ON_LINE)
      : normalityRow('normal-residuals', fit.residuals, alpha, MIN_FOR_RESIDUALS),
    straightLineRow(xs, fit, onLine, alpha),
    evenSpreadRow(xs, fit, onLine, alpha),
    outlierRow(infl, onLine, alpha, where),
    influenceRow(infl, onLine, where),
    rowOrderRow(xs, fit, onLine, alpha),
  ];

  const points = pointDiagnostics(fit, infl, onLine, alpha);
  if (scaleY !== 1) {
    for (let i = 0; i < n; i++) {
      points.fitted[i] *= scaleY;
      points.residuals[i] *= scaleY;
    }
  }
  giveBack(xs !== x ? xs : null, ys !== y ? ys : null); // nothing kept refers to the scaled copies
  const flags: string[] = [];
  let notTestableCount = 0;
  for (const row of checks) {
    if (row.verdict === 'flag' && row.flag) flags.push(row.flag);
    if (row.verdict === 'not testable') notTestableCount++;
  }
  return {
    n,
    alpha,
    line: { slope: (fit.slope * scaleY) / scaleX, intercept: fit.intercept * scaleY, rss: fit.rss * scaleY * scaleY },
    checks,
    flags,
    notTestable: notTestableCount,
    points,
  };
}

/** v / scale in a work array from the scratch pool (the caller gives it back). */
function scaledCopy(v: Float64Array, scale: number): Float64Array {
  const out = borrowF64(v.length);
  const inv = 1 / scale; // exact: scale is a power of two
  for (let i = 0; i < v.length; i++) out[i] = v[i] * inv;
  return out;
}

function straightLineRow(x: ArrayLike<number>, fit: LineFit, onLine: boolean, alpha: number): CheckRow {
  const key = 'straight-line';
  const test = 'F test for adding x² (RESET)';
  if (fit.n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (distinctUpToThree(x) < 3) return notTestable(key, test, 'x takes only two values, so curvature cannot be tested');
  if (onLine) return notTestable(key, test, ON_LINE);
  return safely(key, test, () => {
    const t = curvatureTest(x, fit.residuals);
    const detail = { df1: t.df1, df2: t.df2 };
    if (t.statistic === Infinity) {
      return {
        key, label: LABELS[key], test, statistic: null, pValue: 0, verdict: 'flag',
        meaning: 'The points lie exactly on a curve, not a straight line, so r describes the relationship only in part.',
        flag: 'curved', detail,
      };
    }
    const flagged = t.pValue < alpha;
    const meaning = flagged
      ? `The points bend ${t.bend}ward away from the straight line (${formatP(t.pValue)}), so r describes the relationship only in part.`
      : 'No sign of a curve: a straight line describes the pattern.';
    return {
      key, label: LABELS[key], test, statistic: t.statistic, pValue: t.pValue, verdict: flagged ? 'flag' : 'ok', meaning,
      flag: flagged ? 'curved' : undefined, detail,
    };
  });
}

function evenSpreadRow(x: ArrayLike<number>, fit: LineFit, onLine: boolean, alpha: number): CheckRow {
  const key = 'even-spread';
  const test = 'Breusch–Pagan (Koenker), n·R²';
  if (fit.n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (onLine) return notTestable(key, test, ON_LINE);
  return safely(key, test, () => {
    const t = breuschPagan(x, fit.residuals);
    const flagged = t.pValue < alpha;
    const meaning = flagged
      ? `The scatter around the line ${t.trend} as x grows, so Pearson's p-value and interval may be inaccurate.`
      : 'The scatter around the line is about as wide for small x as for large x.';
    return {
      key, label: LABELS[key], test, statistic: t.statistic, pValue: t.pValue, verdict: flagged ? 'flag' : 'ok', meaning,
      flag: flagged ? 'uneven spread' : undefined, detail: { df: t.df },
    };
  });
}

function outlierRow(infl: LineInfluence, onLine: boolean, alpha: number, where: (i: number) => string): CheckRow {
  const key = 'outliers';
  const test = 'Largest studentized residual, Bonferroni';
  const n = infl.n;
  if (n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (onLine) return notTestable(key, test, ON_LINE);
  const i = infl.maxStudentizedIndex;
  if (i < 0) return notTestable(key, test, 'no point has a studentized residual');
  return safely(key, test, () => {
    const t = infl.studentized[i];
    const p = bonferroniOutlierP(t, n);
    const detail = { df: n - 3 };
    if (!Number.isFinite(t)) {
      return {
        key, label: LABELS[key], test, statistic: null, pValue: 0, verdict: 'flag', point: i, place: where(i),
        meaning: `${cap(where(i))} is off the straight line on which all the other points lie exactly.`,
        flag: `outlier at ${where(i)}`, detail,
      };
    }
    const flagged = p < alpha;
    const meaning = flagged
      ? `${cap(where(i))} lies far from the line (studentized residual ${num(t)}), further than chance explains even allowing for ${n} rows.`
      : `No point stands out: the largest studentized residual, ${num(t)} at ${where(i)}, is within what chance gives for ${n} rows.`;
    return {
      key, label: LABELS[key], test, statistic: t, pValue: p, verdict: flagged ? 'flag' : 'ok', meaning, point: i, place: where(i),
      flag: flagged ? `outlier at ${where(i)}` : undefined, detail,
    };
  });
}

function influenceRow(infl: LineInfluence, onLine: boolean, where: (i: number) => string): CheckRow {
  const key = 'influence';
  const n = infl.n;
  const h = infl.maxLeverageIndex;
  if (infl.leverage[h] >= SETS_SLOPE_LEVERAGE) {
    return {
      key, label: LABELS[key], test: 'Leverage (hat value)', statistic: infl.leverage[h], pValue: null, verdict: 'flag', point: h, place: where(h),
      meaning: `${cap(where(h))} sets the slope on its own: its x is so far from the others (leverage ${num(infl.leverage[h])}) that the line must pass through it, and its Cook's distance is undefined.`,
      flag: `one point sets the slope (${where(h)})`,
      detail: { leverage: infl.leverage[h] },
    };
  }
  const test = "Cook's distance";
  if (onLine) return notTestable(key, test, ON_LINE);
  const i = infl.maxCookIndex;
  if (i < 0) return notTestable(key, test, "no point has a Cook's distance");
  return safely(key, test, () => {
    const d = infl.cooksDistance[i];
    const cutoff = cookCutoff(n);
    const flagged = d > cutoff;
    const ref = `the median of F(2, ${n - 2})`;
    const meaning = flagged
      ? `${cap(where(i))} moves the line a lot: its Cook's distance, ${num(d)}, exceeds ${num(cutoff)} (${ref}).`
      : `No single point moves the line much: the largest Cook's distance, ${num(d)} at ${where(i)}, is below ${num(cutoff)} (${ref}).`;
    return {
      key, label: LABELS[key], test, statistic: d, pValue: null, verdict: flagged ? 'flag' : 'ok', meaning, point: i, place: where(i),
      flag: flagged ? `influential point at ${where(i)}` : undefined,
      detail: { cutoff, leverage: infl.leverage[i] },
    };
  });
}

function rowOrderRow(x: ArrayLike<number>, fit: LineFit, onLine: boolean, alpha: number): CheckRow {
  const key = 'row-order';
  const exact = fit.n <= DW_EXACT_MAX;
  const test = `Durbin–Watson, one-sided, ${exact ? 'exact' : 'saddle-point or Edgeworth approximation'}`;
  if (fit.n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (onLine) return notTestable(key, test, ON_LINE);
  return safely(key, test, () => {
    const t = durbinWatson(x, fit.residuals);
    const flagged = t.pPositive < alpha;
    const meaning = flagged
      ? `Neighbouring rows are more alike than chance would make them (lag-1 residual correlation ${num(t.lag1)}), as in monthly or weekly series, so the p-value and interval of r are too optimistic.`
      : `Neighbouring rows are no more alike than chance would make them (Durbin–Watson ${num(t.statistic)}; about 2 means no dependence).`;
    return {
      key, label: LABELS[key], test, statistic: t.statistic, pValue: t.pPositive, verdict: flagged ? 'flag' : 'ok', meaning,
      flag: flagged ? 'neighbouring rows alike' : undefined,
      detail: { lag1: t.lag1, pTwoSided: t.pValue, pNegative: t.pNegative },
    };
  });
}

/** Per-point arrays and the flagged points. Outlier p-values are computed only for candidates (see below). */
function pointDiagnostics(fit: LineFit, infl: LineInfluence, onLine: boolean, alpha: number): PointDiagnostics {
  const n = fit.n;
  const outliers: number[] = [];
  const influential: number[] = [];
  let setsSlope = -1;
  if (infl.leverage[infl.maxLeverageIndex] >= SETS_SLOPE_LEVERAGE) setsSlope = infl.maxLeverageIndex;
  if (!onLine && n >= MIN_FOR_RESIDUALS) {
    // P(T > t) >= P(Z > t) for t > 0, so a Bonferroni p below alpha needs |t| above the normal quantile of
    // alpha/(2n): only those few points need the t tail (a million rows stay O(n)). Slightly widened for rounding.
    const zCut = 0.999 * normalQuantile(1 - alpha / (2 * n));
    for (let i = 0; i < n; i++) {
      const t = infl.studentized[i];
      if (t === t && Math.abs(t) > zCut && bonferroniOutlierP(t, n) < alpha) outliers.push(i);
    }
    const cutoff = cookCutoff(n);
    for (let i = 0; i < n; i++) if (infl.cooksDistance[i] > cutoff) influential.push(i);
  }
  const all = new Set<number>([...outliers, ...influential]);
  if (setsSlope >= 0) all.add(setsSlope);
  return {
    fitted: fit.fitted,
    residuals: fit.residuals,
    studentized: infl.studentized,
    leverage: infl.leverage,
    cooksDistance: infl.cooksDistance,
    outliers,
    influential,
    setsSlope,
    flagged: [...all].sort((a, b) => a - b),
  };
}
