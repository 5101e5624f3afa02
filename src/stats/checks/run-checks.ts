import { borrowF64, giveBack } from '../internal/scratch';
import { powerOfTwoScale } from '../correlation/comoments';
import { normalQuantile } from '../distributions';
import { fitLine, LineFit } from '../correlation/regression';
import { effectiveRows, EffectiveRows } from '../correlation/effective-n';
import { leaveOneOut, LeaveOneOut } from '../correlation/leave-one-out';
import { distinctUpToThree } from '../correlation/distinct';
import { fisherInterval } from '../correlation/fisher';
import { validAlpha } from '../options';
import { typeSevenQuantiles } from '../plots/order-stats';
import { StatsInputError } from '../types';
import { formatNumber as num, formatP } from '../format';
import { breuschPagan } from './breusch-pagan';
import { CheckEffect, CheckKey, CheckReport, CheckRow, PointDiagnostics } from './check-report';
import { dagostinoPearson } from './dagostino';
import { durbinWatson, DW_EXACT_MAX } from './durbin-watson';
import { bonferroniOutlierP, cookCutoff, lineInfluence, LineInfluence } from './influence';
import { curvatureTest, CurvatureTest } from './linearity';
import { shapeMoments } from './moments';
import { SHAPIRO_WILK_MAX_N, shapiroWilk } from './shapiro-wilk';
import {
  coverageWith,
  CURVE_F2_LIMIT,
  Direction,
  directionOf,
  judge,
  ROWS_TO_SEE,
  SE_INFLATION_LIMIT,
  SHAPE_LIMITS,
  SINGLE_ROW_LIMIT,
  tooFewWords,
} from './verdict';

export interface RunChecksOptions {
  /** Significance level of every check, in (0, 1); 0.05 is usual. The conclusion the checks protect is read from
   * the two-sided interval at level 1 - alpha. */
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

const SEE_RULE = (key: CheckKey): string => `at least ${ROWS_TO_SEE[key]} rows to rule it out (power 0.8 at alpha 0.05, test/fixtures/power/check-power.R)`;

/** The rule each verdict applies, with its source (shown beside the verdict). */
const THRESHOLDS: Record<CheckKey, string> = {
  'normal-x': `problem when the test finds it and |skewness| ≥ ${SHAPE_LIMITS.skewness} or excess kurtosis ≥ ${SHAPE_LIMITS.excessKurtosis} (West, Finch & Curran 1995), not explained by the flagged rows; ${SEE_RULE('normal-x')}`,
  'normal-y': `problem when the test finds it and |skewness| ≥ ${SHAPE_LIMITS.skewness} or excess kurtosis ≥ ${SHAPE_LIMITS.excessKurtosis} (West, Finch & Curran 1995), not explained by the flagged rows; ${SEE_RULE('normal-y')}`,
  'normal-residuals': `problem when the test finds it and |skewness| ≥ ${SHAPE_LIMITS.skewness} or excess kurtosis ≥ ${SHAPE_LIMITS.excessKurtosis} (West, Finch & Curran 1995), not explained by the flagged rows; ${SEE_RULE('normal-residuals')}`,
  'straight-line': `problem when the test finds a curve with f² ≥ ${CURVE_F2_LIMIT} (Cohen 1988, medium); ${SEE_RULE('straight-line')}`,
  'even-spread': `problem when the test finds it and the spread-robust standard error (HC3) exceeds the usual one by ×${num(SE_INFLATION_LIMIT)} or more, so a 95% interval would cover under 90%; ${SEE_RULE('even-spread')}`,
  outliers: `problem when the test finds it and leaving that row out moves r by ${SINGLE_ROW_LIMIT} or more (Cohen 1988, a small correlation) or changes the conclusion; ${SEE_RULE('outliers')}`,
  influence: `problem when one row sets the slope or leaving one row out changes the conclusion; slight when a row's Cook's distance exceeds the median of F(2, n − 2) or it moves r by ${SINGLE_ROW_LIMIT} or more`,
  'row-order': `problem when the test finds it and the effective rows (Pyper & Peterman 1998) are so few that standard errors grow by ×${num(SE_INFLATION_LIMIT)} or more (a 95% interval would cover under 90%); ${SEE_RULE('row-order')}`,
};

/** A row that could not run; the reason doubles as its meaning. */
function notTestable(key: CheckKey, test: string, reason: string): CheckRow {
  return {
    key, label: LABELS[key], test, statistic: null, pValue: null, verdict: 'not testable', detected: null, effect: null,
    threshold: THRESHOLDS[key], meaning: `Not testable: ${reason}.`, reason, detail: {},
  };
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
 * largest magnitudes and the slope). A fitted value mean(y) + b (x_i - mean(x)) rounds at about eps (max |y| + |b|
 * max |x - mean(x)|), plus |b| times the rounding of mean(x) (one unit in its last place, the same in every row), and the
 * slope, a ratio of sums over n rows, carries an error that grows like sqrt(n) eps (the statistical rule of thumb
 * for summation, Higham 2002, Accuracy and Stability of Numerical Algorithms, 2nd ed., SIAM, sec. 2.8), which moves
 * a residual by at most that much times |b| max |x - mean(x)|. 16 sqrt(n) eps leaves a wide margin over both
 * while staying far below any scatter a measurement can show (about 1e-13 of the data's magnitude at 40 rows).
 */
function residualNoise(x: ArrayLike<number>, y: ArrayLike<number>, fit: LineFit): number {
  let xDev = 0;
  let yMax = 0;
  for (let i = 0; i < fit.n; i++) {
    xDev = Math.max(xDev, Math.abs(x[i] - fit.meanX));
    yMax = Math.max(yMax, Math.abs(y[i]));
  }
  // The fitted values are formed about the mean of x (fitLine), so rounding scales with the spread of x, not with
  // its offset; the offset enters once, through the rounding of the mean itself, which shifts every residual alike.
  const b = Math.abs(fit.slope);
  return 16 * Math.sqrt(fit.n) * Number.EPSILON * (yMax + b * xDev) + 2 * Number.EPSILON * b * Math.abs(fit.meanX);
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

function cap(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** What the checks share about the data beyond the fit: which rows are flagged, and r without each row. */
interface Context {
  n: number;
  alpha: number;
  level: number;
  where: (i: number) => string;
  flagged: number[];
  loo: LeaveOneOut | null;
  /** The conclusion of all rows (Pearson, Fisher z at `level`). */
  direction: Direction;
}

/** The conclusion of r from m rows at the context's level. */
function directionAt(r: number, m: number, level: number): Direction {
  if (!(m > 3) || !Number.isFinite(r)) return 'none';
  if (Math.abs(r) >= 1) return r > 0 ? 'positive' : 'negative';
  const i = fisherInterval(r, 1 / Math.sqrt(m - 3), level, '');
  return directionOf(i.lower, i.upper);
}

const DIRECTION_WORDS: Record<Direction, string> = {
  positive: 'a positive correlation',
  negative: 'a negative correlation',
  none: 'no clear correlation',
};

/** Normality of one column (x, y or the residuals): Shapiro-Wilk up to 5000 values, K^2 above. */
function normalityRow(key: 'normal-x' | 'normal-y' | 'normal-residuals', values: Float64Array, ctx: Context, minN: number): CheckRow {
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
    const res = n > SHAPIRO_WILK_MAX_N ? dagostinoPearson(values, shape) : shapiroWilk(values);
    const detected = res.pValue < ctx.alpha;
    const severity = (s: { skewness: number; excessKurtosis: number }): number =>
      Math.max(Math.abs(s.skewness) / SHAPE_LIMITS.skewness, s.excessKurtosis / SHAPE_LIMITS.excessKurtosis);
    const shapeWords = `skewness ${num(shape.skewness)}, excess kurtosis ${num(shape.excessKurtosis)}`;
    const effect: CheckEffect = { label: 'shape', value: severity(shape), text: shapeWords };
    // A shape made by a few flagged rows (one wild value in 100,000, say) is the outlier checks' business: judged
    // on the other rows, it may be close to normal.
    let fromFlagged = false;
    if (detected && effect.value >= 1 && ctx.flagged.length > 0 && ctx.flagged.length <= n / 10 && n - ctx.flagged.length >= 3) {
      const rest = new Float64Array(n - ctx.flagged.length);
      let f = 0;
      for (let i = 0, t = 0; i < n; i++) {
        if (f < ctx.flagged.length && ctx.flagged[f] === i) {
          f++;
          continue;
        }
        rest[t++] = values[i];
      }
      try {
        fromFlagged = severity(shapeMoments(rest)) < 1;
      } catch {
        fromFlagged = false;
      }
    }
    const verdict = judge(key, detected, effect.value >= 1 && !fromFlagged, n);
    let meaning: string;
    if (verdict === 'problem') {
      meaning = `${cap(subject)} ${verb} strongly from a normal shape (${shapeWords}), which makes Pearson's p-value and interval unreliable; rank coefficients do not need a normal shape.`;
    } else if (verdict === 'slight') {
      meaning = fromFlagged
        ? `${cap(subject)} ${verb} from a normal shape (${shapeWords}), but only because of the flagged rows (see Outliers and Influential points): without them the shape is close to normal.`
        : `${cap(subject)} ${verb} slightly from a normal shape (${shapeWords}): ${n > 1000 ? `with ${n} rows even slight departures are detected, and` : 'detectable, but'} one this small does not matter for r.`;
    } else if (verdict === 'too few rows') {
      meaning = `No sign that ${subject} ${verb} from a normal shape (${shapeWords}), but ${tooFewWords(key, n)}; judge by the plots.`;
    } else {
      meaning = `No clear sign that ${subject} ${verb} from a normal shape (${shapeWords}).`;
    }
    return {
      key, label: LABELS[key], test, statistic: res.statistic, pValue: res.pValue, verdict, detected, effect, threshold: THRESHOLDS[key], meaning,
      flag: verdict === 'problem' || verdict === 'slight' ? `${short} not normal` : undefined,
      detail: { skewness: shape.skewness, excessKurtosis: shape.excessKurtosis, n, fromFlaggedRows: fromFlagged ? 1 : 0 },
    };
  });
}

/**
 * Runs all eight assumption checks of a straight-line correlation once, for the cell functions and the panel,
 * and judges each by what it does to the conclusion (verdict.ts):
 * 1-3. normality of x, y and the residuals (Shapiro-Wilk, Royston 1995, for 3 <= n <= 5000; D'Agostino-Pearson K^2,
 *      D'Agostino, Belanger & D'Agostino 1990, above), with skewness and excess kurtosis as the effect;
 * 4.   straight-line form (F test for adding x^2, equal to RESET with squared fitted values), effect f^2;
 * 5.   even spread (Breusch-Pagan, Koenker's studentized form), effect the residual spread ratio between the top and
 *      bottom thirds of x and the HC3 standard error against the usual one (MacKinnon & White 1985);
 * 6.   outliers (largest externally studentized residual, Bonferroni p), effect the change in r without that row;
 * 7.   influence (the row whose removal moves r most, Cook's distance against the median of F(2, n - 2), or a
 *      point of leverage >= 0.99 that sets the slope on its own);
 * 8.   dependence on row order (Durbin-Watson, one-sided for neighbouring rows alike), effect the effective rows.
 * A check that cannot run says why in its own row; one failing check never stops the others. Everything is O(n)
 * except Shapiro-Wilk's sort (n <= 5000), the exact Durbin-Watson spectrum (n <= 1,500, O(n^2)) and the
 * effective rows (O(50 n)).
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
  const points = pointDiagnostics(fit, infl, onLine, alpha);
  const level = 1 - alpha;
  const loo = n >= MIN_FOR_RESIDUALS && !onLine ? leaveOneOut(xs, ys, fit.moments) : null;
  const ctx: Context = {
    n, alpha, level, where, flagged: points.flagged, loo,
    direction: loo ? directionAt(loo.r, n, level) : 'none',
  };
  const dependence = n >= 5 ? effectiveRows(xs, ys) : null;
  // x's thirds (even spread) and quartiles (outliers) from one copy of x, on first use.
  let cuts: ReturnType<XCuts> | undefined;
  const xCuts: XCuts = () => {
    if (!cuts) {
      const [q1, t1, t2, q3] = typeSevenQuantiles(xs, [0.25, 1 / 3, 2 / 3, 0.75]);
      cuts = { quartiles: [q1, q3], lowThird: t1, highThird: t2 };
    }
    return cuts;
  };

  const checks: CheckRow[] = [
    normalityRow('normal-x', xs, ctx, 3),
    normalityRow('normal-y', ys, ctx, 3),
    onLine
      ? notTestable('normal-residuals', n > SHAPIRO_WILK_MAX_N ? K2_TEST : SW_TEST, ON_LINE)
      : normalityRow('normal-residuals', fit.residuals, ctx, MIN_FOR_RESIDUALS),
    straightLineRow(xs, fit, onLine, ctx, scaleX),
    evenSpreadRow(xs, fit, infl, onLine, ctx, xCuts),
    outlierRow(xs, ys, infl, onLine, ctx, xCuts),
    influenceRow(infl, onLine, ctx),
    rowOrderRow(xs, fit, onLine, ctx, dependence),
  ];

  if (scaleY !== 1) {
    for (let i = 0; i < n; i++) {
      points.fitted[i] *= scaleY;
      points.residuals[i] *= scaleY;
    }
  }
  // Nothing kept refers to the scaled copies, nor to r without each row (the report keeps three numbers of it).
  giveBack(xs !== x ? xs : null, ys !== y ? ys : null, loo ? loo.without : null);
  const flags: string[] = [];
  const minor: string[] = [];
  let notTestableCount = 0;
  let tooFewCount = 0;
  for (const row of checks) {
    if (row.verdict === 'problem' && row.flag) flags.push(row.flag);
    if (row.verdict === 'slight' && row.flag) minor.push(row.flag);
    if (row.verdict === 'not testable') notTestableCount++;
    if (row.verdict === 'too few rows') tooFewCount++;
  }
  return {
    n,
    alpha,
    line: { slope: (fit.slope * scaleY) / scaleX, intercept: fit.intercept * scaleY, rss: fit.rss * scaleY * scaleY },
    checks,
    flags,
    minor,
    tooFew: tooFewCount,
    notTestable: notTestableCount,
    leaveOneOut: loo ? { r: loo.r, most: loo.most, rWithoutMost: loo.rWithoutMost } : null,
    effectiveRows: dependence,
    points,
  };
}

/** x's quartiles and thirds (type 7), computed once when a check first asks. */
type XCuts = () => { quartiles: [number, number]; lowThird: number; highThird: number };

/** v / scale in a work array from the scratch pool (the caller gives it back). */
function scaledCopy(v: Float64Array, scale: number): Float64Array {
  const out = borrowF64(v.length);
  const inv = 1 / scale; // exact: scale is a power of two
  for (let i = 0; i < v.length; i++) out[i] = v[i] * inv;
  return out;
}

/**
 * Where the least-squares parabola through the points turns (its slope zero), in x's units, when that lies
 * within x's range; NaN otherwise. The curvature test gives the parabola fitted to the line's residuals, so the
 * quadratic in x has slope b + linear + 2 square (x - centre).
 */
function turningPoint(x: Float64Array, fit: LineFit, q: CurvatureTest['quadratic']): number {
  if (!(q.square !== 0 && Number.isFinite(q.square))) return NaN;
  const at = q.centre - (fit.slope + q.linear) / (2 * q.square);
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < x.length; i++) {
    if (x[i] < lo) lo = x[i];
    if (x[i] > hi) hi = x[i];
  }
  return at > lo && at < hi ? at : NaN;
}

function straightLineRow(x: Float64Array, fit: LineFit, onLine: boolean, ctx: Context, scaleX: number): CheckRow {
  const key = 'straight-line';
  const test = 'F test for adding x² (RESET)';
  if (fit.n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (distinctUpToThree(x) < 3) return notTestable(key, test, 'x takes only two values, so curvature cannot be tested');
  if (onLine) return notTestable(key, test, ON_LINE);
  return safely(key, test, () => {
    const t = curvatureTest(x, fit.residuals);
    const detail: Record<string, number> = { df1: t.df1, df2: t.df2 };
    // A curve that matters may turn back within the data: where, in x's own units (see verdict/turn.ts).
    const turn = (): void => {
      const at = turningPoint(x, fit, t.quadratic);
      if (at === at) detail.turnAt = at * scaleX;
    };
    const base = { key, label: LABELS[key], test, threshold: THRESHOLDS[key] } as const;
    if (t.statistic === Infinity) {
      turn();
      return {
        ...base, statistic: null, pValue: 0, verdict: 'problem', detected: true,
        effect: { label: 'curve', value: Infinity, text: 'the points lie exactly on a curve' },
        meaning: 'The points lie exactly on a curve, not a straight line, so r describes the relationship only in part.',
        flag: 'curved', detail,
      };
    }
    // F = (RSS_line - RSS_quad) / (RSS_quad / df2), so f^2 = (RSS_line - RSS_quad) / RSS_quad = F / df2.
    const f2 = t.statistic / t.df2;
    const share = f2 / (1 + f2); // the part of the line's residual variation the curve takes up
    const detected = t.pValue < ctx.alpha;
    const verdict = judge(key, detected, f2 >= CURVE_F2_LIMIT, fit.n);
    const effect: CheckEffect = { label: 'curve', value: f2, text: `a curve takes up ${num(100 * share)}% of the scatter around the line (f² = ${num(f2)})` };
    if (verdict === 'problem') turn();
    const meaning =
      verdict === 'problem'
        ? `The points bend ${t.bend}ward away from the straight line (${formatP(t.pValue)}; ${effect.text}), so r describes the relationship only in part.`
        : verdict === 'slight'
          ? `A slight bend ${t.bend}ward (${formatP(t.pValue)}), but ${effect.text}: a straight line still describes the pattern.`
          : verdict === 'too few rows'
            ? `No sign of a curve, but ${tooFewWords(key, fit.n)}; look at the scatter and the smooth.`
            : 'No sign of a curve: a straight line describes the pattern.';
    return { ...base, statistic: t.statistic, pValue: t.pValue, verdict, detected, effect, meaning, flag: detected ? 'curved' : undefined, detail: { ...detail, f2 } };
  });
}

/**
 * The residual spread in the top third of x over that in the bottom third (the larger over the smaller, and
 * which end is wider), and the HC3 standard error of the slope over the usual one (MacKinnon & White 1985,
 * "Some heteroskedasticity-consistent covariance matrix estimators with improved finite sample properties",
 * Journal of Econometrics 29:305-325): var_HC3(b) = sum c_i^2 e_i^2 / (1 - h_i)^2 / (sum c^2)^2 against
 * s^2 / sum c^2. The t test of r is the t test of the slope, so the ratio says how far Pearson's p and interval
 * are off.
 */
function spreadEffect(x: Float64Array, fit: LineFit, infl: LineInfluence, cuts: XCuts): { ratio: number; wider: 'top' | 'bottom'; seRatio: number } {
  const n = fit.n;
  const { lowThird: lowCut, highThird: highCut } = cuts();
  let lowSum = 0, lowCount = 0, highSum = 0, highCount = 0;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i];
  mean /= n;
  let cc = 0, hc = 0;
  for (let i = 0; i < n; i++) {
    const e = fit.residuals[i];
    if (x[i] <= lowCut) {
      lowSum += e * e;
      lowCount++;
    }
    if (x[i] >= highCut) {
      highSum += e * e;
      highCount++;
    }
    const c = x[i] - mean;
    cc += c * c;
    const h = infl.leverage[i];
    if (h < 1 - 1e-12) {
      const t = (c * e) / (1 - h);
      hc += t * t;
    }
  }
  const low = lowCount > 0 ? Math.sqrt(lowSum / lowCount) : NaN;
  const high = highCount > 0 ? Math.sqrt(highSum / highCount) : NaN;
  const wider = high >= low ? 'top' : 'bottom';
  const ratio = high >= low ? high / low : low / high;
  const s2 = fit.rss / (n - 2);
  const seRatio = Math.sqrt(hc / (cc * cc) / (s2 / cc));
  return { ratio, wider, seRatio };
}

function evenSpreadRow(x: Float64Array, fit: LineFit, infl: LineInfluence, onLine: boolean, ctx: Context, cuts: XCuts): CheckRow {
  const key = 'even-spread';
  const test = 'Breusch–Pagan (Koenker), n·R²';
  if (fit.n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (onLine) return notTestable(key, test, ON_LINE);
  return safely(key, test, () => {
    const t = breuschPagan(x, fit.residuals);
    const detected = t.pValue < ctx.alpha;
    const s = spreadEffect(x, fit, infl, cuts);
    const serious = s.seRatio >= SE_INFLATION_LIMIT;
    const verdict = judge(key, detected, serious, fit.n);
    const ratioText = Number.isFinite(s.ratio) ? `the scatter is ${num(s.ratio)} times as wide in the ${s.wider} third of x as in the ${s.wider === 'top' ? 'bottom' : 'top'}` : 'the scatter differs between the ends of x';
    const effect: CheckEffect = { label: 'spread', value: s.seRatio, text: `${ratioText}; the spread-robust standard error is ×${num(s.seRatio)} the usual one` };
    const meaning =
      verdict === 'problem'
        ? `The scatter around the line ${t.trend} as x grows (${ratioText}): Pearson's standard error is ${num(s.seRatio)} times too small, so its 95% interval covers the truth only about ${Math.round(100 * coverageWith(s.seRatio))}% of the time.`
        : verdict === 'slight'
          ? `The scatter ${t.trend} a little as x grows (${ratioText}), but it moves the standard error by a factor of only ${num(s.seRatio)}: Pearson's p-value and interval hold.`
          : verdict === 'too few rows'
            ? `No clear sign of uneven scatter (${ratioText}), but ${tooFewWords(key, fit.n)}.`
            : 'The scatter around the line is about as wide for small x as for large x.';
    return {
      key, label: LABELS[key], test, statistic: t.statistic, pValue: t.pValue, verdict, detected, effect, threshold: THRESHOLDS[key], meaning,
      flag: detected ? 'uneven spread' : undefined, detail: { df: t.df, spreadRatio: s.ratio, seRatio: s.seRatio, widensUpward: s.wider === 'top' ? 1 : 0 },
    };
  });
}

/** True when v lies beyond 3 interquartile ranges outside the quartiles of its column (Tukey 1977, Exploratory
 * Data Analysis, Addison-Wesley: "far out"), the mark of a value keyed in wrong rather than an unusual one. */
function farOut(quartiles: [number, number], v: number): boolean {
  const [q1, q3] = quartiles;
  const iqr = q3 - q1;
  return iqr > 0 && (v < q1 - 3 * iqr || v > q3 + 3 * iqr);
}

function outlierRow(x: Float64Array, y: Float64Array, infl: LineInfluence, onLine: boolean, ctx: Context, cuts: XCuts): CheckRow {
  const key = 'outliers';
  const test = 'Largest studentized residual, Bonferroni';
  const n = infl.n;
  const where = ctx.where;
  if (n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (onLine) return notTestable(key, test, ON_LINE);
  const i = infl.maxStudentizedIndex;
  if (i < 0) return notTestable(key, test, 'no point has a studentized residual');
  return safely(key, test, () => {
    const t = infl.studentized[i];
    const p = bonferroniOutlierP(t, n);
    const base = { key, label: LABELS[key], test, threshold: THRESHOLDS[key], point: i, place: where(i) } as const;
    const loo = ctx.loo;
    const rWithout = loo ? loo.without[i] : NaN;
    const change = loo ? rWithout - loo.r : NaN;
    const changes = directionAt(rWithout, n - 1, ctx.level) !== ctx.direction;
    const effect: CheckEffect = {
      label: 'change in r',
      value: Math.abs(change),
      text: loo ? `leaving ${where(i)} out moves r from ${num(loo.r)} to ${num(rWithout)}` : '',
    };
    const typo = farOut(cuts().quartiles, x[i]) || farOut(typeSevenQuantiles(y, [0.25, 0.75]) as [number, number], y[i]);
    const detail = { df: n - 3, rWithout, changesConclusion: changes ? 1 : 0, farOut: typo ? 1 : 0 };
    if (!Number.isFinite(t)) {
      return {
        ...base, statistic: null, pValue: 0, verdict: 'problem', detected: true, effect,
        meaning: `${cap(where(i))} is off the straight line on which all the other points lie exactly.`,
        flag: `outlier at ${where(i)}`, detail,
      };
    }
    const detected = p < ctx.alpha;
    const verdict = judge(key, detected, Math.abs(change) >= SINGLE_ROW_LIMIT || changes, n);
    const keyedWrong = typo ? ` Its value is far outside the rest of its column: check it for a data-entry error first.` : '';
    const meaning =
      verdict === 'problem'
        ? `${cap(where(i))} lies far from the line (studentized residual ${num(t)}) and ${effect.text}${changes ? `, which changes the conclusion to ${DIRECTION_WORDS[directionAt(rWithout, n - 1, ctx.level)]}` : ''}.${keyedWrong}`
        : verdict === 'slight'
          ? `${cap(where(i))} lies off the line (studentized residual ${num(t)}), but ${effect.text}: present, and harmless with ${n} rows.${keyedWrong}`
          : verdict === 'too few rows'
            ? `No point stands out (the largest studentized residual is ${num(t)} at ${where(i)}), but ${tooFewWords(key, n)}.`
            : `No point stands out: the largest studentized residual, ${num(t)} at ${where(i)}, is within what chance gives for ${n} rows.`;
    return { ...base, statistic: t, pValue: p, verdict, detected, effect, meaning, flag: detected ? `outlier at ${where(i)}` : undefined, detail };
  });
}

function influenceRow(infl: LineInfluence, onLine: boolean, ctx: Context): CheckRow {
  const key = 'influence';
  const n = infl.n;
  const where = ctx.where;
  const h = infl.maxLeverageIndex;
  if (infl.leverage[h] >= SETS_SLOPE_LEVERAGE) {
    return {
      key, label: LABELS[key], test: 'Leverage (hat value)', statistic: infl.leverage[h], pValue: null, verdict: 'problem', detected: true, point: h, place: where(h),
      effect: { label: 'leverage', value: infl.leverage[h], text: `leverage ${num(infl.leverage[h])}: the line must pass through ${where(h)}` },
      threshold: THRESHOLDS[key],
      meaning: `${cap(where(h))} sets the slope on its own: its x is so far from the others (leverage ${num(infl.leverage[h])}) that the line must pass through it, and its Cook's distance is undefined.`,
      flag: `one point sets the slope (${where(h)})`,
      detail: { leverage: infl.leverage[h] },
    };
  }
  const test = "Cook's distance, and r without each row";
  if (n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (onLine) return notTestable(key, test, ON_LINE);
  const loo = ctx.loo;
  const i = loo ? loo.most : infl.maxCookIndex;
  if (i < 0 || !loo) return notTestable(key, test, "no point has a Cook's distance");
  return safely(key, test, () => {
    const d = infl.cooksDistance[i];
    const cutoff = cookCutoff(n);
    const dMax = infl.maxCookIndex >= 0 ? infl.cooksDistance[infl.maxCookIndex] : NaN;
    const cookFlag = dMax > cutoff;
    const rWithout = loo.rWithoutMost;
    const change = rWithout - loo.r;
    const after = directionAt(rWithout, n - 1, ctx.level);
    const changes = after !== ctx.direction;
    const moves = Math.abs(change) >= SINGLE_ROW_LIMIT;
    const verdict = changes ? 'problem' : cookFlag || moves ? 'slight' : 'fine';
    const effect: CheckEffect = { label: 'change in r', value: Math.abs(change), text: `leaving ${where(i)} out moves r from ${num(loo.r)} to ${num(rWithout)}` };
    const ref = `the median of F(2, ${n - 2})`;
    const meaning =
      verdict === 'problem'
        ? `The conclusion rests on ${where(i)}: ${effect.text}, which turns ${DIRECTION_WORDS[ctx.direction]} into ${DIRECTION_WORDS[after]}.`
        : verdict === 'slight'
          ? `${cap(where(i))} moves the line (${effect.text}${cookFlag ? `; the largest Cook's distance, ${num(dMax)}, exceeds ${num(cutoff)}, ${ref}` : ''}), but the conclusion holds without it.`
          : `No single row moves r much: the largest change, ${num(Math.abs(change))} (${where(i)}), leaves the conclusion as it is, and no Cook's distance exceeds ${num(cutoff)} (${ref}).`;
    return {
      key, label: LABELS[key], test, statistic: Number.isFinite(d) ? d : null, pValue: null, verdict, detected: cookFlag || changes, effect, threshold: THRESHOLDS[key],
      meaning, point: i, place: where(i),
      flag: verdict === 'problem' ? `conclusion rests on ${where(i)}` : verdict === 'slight' ? `influential point at ${where(i)}` : undefined,
      detail: { cutoff, leverage: infl.leverage[i], rWithout, changesConclusion: changes ? 1 : 0, cooksDistanceMax: dMax },
    };
  });
}

function rowOrderRow(x: Float64Array, fit: LineFit, onLine: boolean, ctx: Context, dependence: EffectiveRows | null): CheckRow {
  const key = 'row-order';
  const exact = fit.n <= DW_EXACT_MAX;
  const test = `Durbin–Watson, one-sided, ${exact ? 'exact' : 'saddle-point or Edgeworth approximation'}`;
  if (fit.n < MIN_FOR_RESIDUALS) return notTestable(key, test, tooFew(MIN_FOR_RESIDUALS));
  if (onLine) return notTestable(key, test, ON_LINE);
  return safely(key, test, () => {
    const t = durbinWatson(x, fit.residuals);
    const detected = t.pPositive < ctx.alpha;
    const nEff = dependence ? dependence.effective : fit.n;
    const inflation = Math.sqrt(fit.n / nEff);
    const verdict = judge(key, detected, inflation >= SE_INFLATION_LIMIT, fit.n);
    const effect: CheckEffect = {
      label: 'effective rows',
      value: nEff,
      text: `about ${num(nEff)} effective rows of ${fit.n} (lag-1 residual correlation ${num(t.lag1)})`,
    };
    const meaning =
      verdict === 'problem'
        ? `Neighbouring rows are alike (lag-1 residual correlation ${num(t.lag1)}), as in monthly or weekly series: the ${fit.n} rows carry about ${num(nEff)} rows' worth of information, so p-values and intervals computed as if the rows were independent are too optimistic.`
        : verdict === 'slight'
          ? `Neighbouring rows are somewhat alike (lag-1 residual correlation ${num(t.lag1)}), but x and y do not follow their row order enough to matter: about ${num(nEff)} effective rows of ${fit.n}.`
          : verdict === 'too few rows'
            ? `No sign that neighbouring rows are alike (Durbin–Watson ${num(t.statistic)}), but ${tooFewWords(key, fit.n)}.`
            : `Neighbouring rows are no more alike than chance would make them (Durbin–Watson ${num(t.statistic)}; about 2 means no dependence).`;
    return {
      key, label: LABELS[key], test, statistic: t.statistic, pValue: t.pPositive, verdict, detected, effect, threshold: THRESHOLDS[key], meaning,
      flag: detected ? 'neighbouring rows alike' : undefined,
      detail: { lag1: t.lag1, pTwoSided: t.pValue, pNegative: t.pNegative, effectiveRows: nEff },
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
