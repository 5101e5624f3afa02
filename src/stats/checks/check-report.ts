/** Shared shapes of the assumption checks: one object per (x, y), read by the cell functions and the panel. */
import type { EffectiveRows } from '../correlation/effective-n';
import type { Verdict } from './verdict';

export type { Verdict } from './verdict';

/** How large a departure is, in the check's own terms (the verdict weighs it against the check's threshold). */
export interface CheckEffect {
  /** What is measured, e.g. "shape", "curve", "spread ratio", "change in r", "effective rows". */
  label: string;
  /** The number the verdict compares with its threshold. */
  value: number;
  /** The effect in words with its figures, e.g. "skewness 4.22, excess kurtosis 21.4". */
  text: string;
}

/** The eight checks, always in this order. */
export type CheckKey =
  | 'normal-x'
  | 'normal-y'
  | 'normal-residuals'
  | 'straight-line'
  | 'even-spread'
  | 'outliers'
  | 'influence'
  | 'row-order';

export const CHECK_KEYS: readonly CheckKey[] = [
  'normal-x',
  'normal-y',
  'normal-residuals',
  'straight-line',
  'even-spread',
  'outliers',
  'influence',
  'row-order',
];

/** One row of the checks table. */
export interface CheckRow {
  key: CheckKey;
  /** Short name of what is checked, e.g. "Straight line". */
  label: string;
  /** The test used, e.g. "Shapiro-Wilk W"; for a not-testable row, the test that would have been used. */
  test: string;
  /** The test statistic (signed for the outlier row), or null when there is none. */
  statistic: number | null;
  /** The p-value, or null when the check has none (Cook's distance, leverage) or did not run. */
  pValue: number | null;
  /** What the departure does to the conclusion at this n: see verdict.ts. */
  verdict: Verdict;
  /** Whether the test found a departure at alpha (Cook's distance: above its cut-off); null when it did not run. */
  detected: boolean | null;
  /** How large the departure is, or null when the check did not run. */
  effect: CheckEffect | null;
  /** The rule the verdict applied and where it comes from. */
  threshold: string;
  /** One plain sentence saying what the result means for the correlation (or why the check could not run). */
  meaning: string;
  /** Why the check could not run; present only when verdict is "not testable". */
  reason?: string;
  /** A few words for the lists of problems and slight departures, e.g. "curved"; present for those verdicts. */
  flag?: string;
  /** The point (0-based index into the pairs) the row is about: the outlier row and the influence row. */
  point?: number;
  /** Where that point is, as named in the messages: "row 12", "position 3". */
  place?: string;
  /** Further figures behind the row, e.g. skewness, excess kurtosis, df, cut-off; on the straight-line row judged a
   *  problem, turnAt: where the least-squares parabola turns, in x's units, when that lies inside x's range. */
  detail: Record<string, number>;
}

/** Per-point values for plots; every array has one entry per pair, in the order given. NaN = undefined there. */
export interface PointDiagnostics {
  fitted: Float64Array;
  residuals: Float64Array;
  /** Externally studentized residuals (NaN at leverage 1 or with fewer than 4 points; +/-Infinity when all
   * other points lie exactly on a line). */
  studentized: Float64Array;
  /** Hat values. */
  leverage: Float64Array;
  /** Cook's distances (NaN at leverage 1 or when the points lie exactly on a line). */
  cooksDistance: Float64Array;
  /** Points whose Bonferroni outlier p-value is below alpha, ascending. */
  outliers: number[];
  /** Points whose Cook's distance exceeds the median of F(2, n - 2), ascending. */
  influential: number[];
  /** The point whose leverage is at least 0.99 (it sets the slope on its own), or -1. */
  setsSlope: number;
  /** Union of the three above, ascending. */
  flagged: number[];
}

/** Everything the checks found for one (x, y). */
export interface CheckReport {
  /** Pairs checked. */
  n: number;
  alpha: number;
  /** The least-squares line the residual checks refer to, in the data's units. The slope (y units per x unit) and
   * the residual sum of squares can overflow to Infinity, or underflow to 0, when the units of x and y differ by
   * more than about 1e300; the checks themselves are free of units and unaffected. */
  line: { slope: number; intercept: number; rss: number };
  /** Exactly eight rows, in CHECK_KEYS order. */
  checks: CheckRow[];
  /** The flag words of the checks judged a problem, in row order (empty when none is). */
  flags: string[];
  /** The flag words of the checks that found a slight departure (present, harmless at this n). */
  minor: string[];
  /** How many checks had too few rows to tell. */
  tooFew: number;
  /** How many rows are not testable. */
  notTestable: number;
  /** Pearson's r of all rows and without its most influential row (the largest change), by sheet position. */
  leaveOneOut: { r: number; most: number; rWithoutMost: number } | null;
  /** Effective rows when neighbouring rows are alike (Pyper & Peterman 1998), from x and y in row order. */
  effectiveRows: EffectiveRows | null;
  points: PointDiagnostics;
}
