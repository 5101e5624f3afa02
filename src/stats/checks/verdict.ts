/**
 * How each assumption check turns its test and its effect into a verdict: what the departure does to the
 * conclusion at this n, not the p-value alone. At 5 rows a test finds nothing because it could not; at 100,000 it
 * finds everything, most of it too small to matter. Four outcomes (plus "not testable"):
 * - "problem": the test found the departure and its effect is large enough to change what r, its p-value or its
 *   interval say;
 * - "slight": found, but too small to matter here (present but harmless at this n);
 * - "fine": not found, with enough rows that a serious departure would have been;
 * - "too few rows": not found, but with this few rows a serious departure would likely have gone unseen.
 *
 * Every threshold below names where it comes from. The rows a check needs come from a power computation at
 * alpha = 0.05 (test/fixtures/power/check-power.R, committed with its output): the smallest n at which the test
 * finds a serious departure 8 times in 10. They are used at every alpha, which the threshold text says.
 */
import { normalCdf } from '../distributions';
import type { CheckKey } from './check-report';

export type Verdict = 'fine' | 'slight' | 'problem' | 'too few rows' | 'not testable';

/** The verdict words in order of concern, for sorting and for tests. */
export const VERDICTS: readonly Verdict[] = ['problem', 'slight', 'too few rows', 'fine', 'not testable'];

/** Rows each check needs to find a serious departure 8 times in 10 at alpha 0.05 (check-power.R, see above). */
export const ROWS_TO_SEE: Record<CheckKey, number> = {
  'normal-x': 19,
  'normal-y': 19,
  'normal-residuals': 19,
  'straight-line': 25,
  'even-spread': 64,
  outliers: 10,
  influence: 4,
  'row-order': 33,
};

/** What each check counts as serious, as the power computation assumed it (shown with "too few rows"). */
export const SERIOUS_DEPARTURE: Record<CheckKey, string> = {
  'normal-x': 'a strongly skewed shape (skewness 2)',
  'normal-y': 'a strongly skewed shape (skewness 2)',
  'normal-residuals': 'a strongly skewed shape (skewness 2)',
  'straight-line': 'a marked curve (f² = 0.35)',
  'even-spread': 'a spread three times wider at one end',
  outliers: 'one value off the line by six standard deviations',
  influence: 'one row that carries the slope',
  'row-order': 'neighbouring rows correlated at 0.5',
};

/**
 * Shape: |skewness| >= 2 or excess kurtosis >= 7 is a substantial departure from normality (West, Finch & Curran
 * 1995, "Structural equation models with nonnormal variables: problems and remedies", in Hoyle (ed.), Structural
 * Equation Modeling, Sage, pp. 56-75).
 */
export const SHAPE_LIMITS = { skewness: 2, excessKurtosis: 7 };

/** Curvature: f^2 = 0.15, Cohen's (1988, Statistical Power Analysis for the Behavioral Sciences, ch. 9) medium effect. */
export const CURVE_F2_LIMIT = 0.15;

/**
 * Standard errors that are too small by this factor make a nominal 95% interval cover the truth only 90% of the
 * time: 2 Phi(1.96 / k) - 1 = 0.90 at k = 1.96 / 1.645 = 1.19. Used for uneven spread (the heteroscedasticity-
 * consistent standard error against the usual one) and for row order (sqrt(n / effective rows)).
 */
export const SE_INFLATION_LIMIT = 1.959963984540054 / 1.6448536269514722;

/** Coverage of a nominal 95% interval whose standard error is too small by the factor k. */
export function coverageWith(k: number): number {
  return 2 * normalCdf(1.959963984540054 / k) - 1;
}

/** One row moving r by this much moves it by a whole "small" correlation (Cohen 1988, ch. 3). */
export const SINGLE_ROW_LIMIT = 0.1;

/** The verdict of a check that has a test: found or not, serious or not, enough rows or not. */
export function judge(key: CheckKey, detected: boolean, serious: boolean, n: number): Verdict {
  if (detected) return serious ? 'problem' : 'slight';
  return n >= ROWS_TO_SEE[key] ? 'fine' : 'too few rows';
}

/** What a silent check could not have seen at this n. */
export function tooFewWords(key: CheckKey, n: number): string {
  return `with ${n} rows this check could miss ${SERIOUS_DEPARTURE[key]}: it needs about ${ROWS_TO_SEE[key]} rows to see one reliably`;
}

/** Which way a correlation points once its interval is taken into account. */
export type Direction = 'positive' | 'negative' | 'none';

/** The conclusion an interval supports: a positive or negative correlation when it excludes 0, else none. */
export function directionOf(lower: number, upper: number): Direction {
  if (lower > 0) return 'positive';
  if (upper < 0) return 'negative';
  return 'none';
}
