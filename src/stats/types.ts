/**
 * Shared result and option types of the statistics core, and the one table of words for each coefficient. Plain
 * data: no host, DOM or cell types.
 *
 * Every test of a correlation, or of a difference between two, returns a TestResult: what was tested (`method`,
 * typed, its words in METHOD_LABELS), the estimate, its p-value and tail, its two-sided interval, the test
 * statistic behind the p-value, how that p-value was obtained (`pMethod`) and the rows behind it.
 */

/** Which alternative a p-value refers to: "both" (two-sided), "positive" (rho > 0) or "negative" (rho < 0). */
export type Tail = 'both' | 'positive' | 'negative';

/** The classical coefficients, whose intervals and tests come from Fisher's z and need only r and n. */
export type ClassicalMethod = 'pearson' | 'spearman' | 'kendall';

/** Coefficients that resist outliers and heavy tails (src/stats/robust/). */
export type RobustMethod = 'percentage_bend' | 'winsorized' | 'biweight' | 'skipped';

/** Coefficients for ordered categories (src/stats/ordinal/). */
export type OrdinalMethod = 'polychoric' | 'polyserial';

/** The correlation methods a user can ask for. */
export type Method = ClassicalMethod | RobustMethod | OrdinalMethod;

/** The coefficient actually reported; Pearson on two-valued columns is named point-biserial or phi. */
export type CoefficientName =
  | 'Pearson' | 'point-biserial' | 'phi' | 'Spearman' | 'Kendall tau-b'
  | 'percentage bend' | 'winsorized' | 'biweight midcorrelation' | 'skipped Pearson'
  | 'polychoric' | 'polyserial';

export const TAILS: readonly Tail[] = ['both', 'positive', 'negative'];
export const CLASSICAL_METHODS: readonly ClassicalMethod[] = ['pearson', 'spearman', 'kendall'];
export const ROBUST_METHODS: readonly RobustMethod[] = ['percentage_bend', 'winsorized', 'biweight', 'skipped'];
export const ORDINAL_METHODS: readonly OrdinalMethod[] = ['polychoric', 'polyserial'];
export const METHODS: readonly Method[] = [...CLASSICAL_METHODS, ...ROBUST_METHODS, ...ORDINAL_METHODS];

export function isClassical(m: Method): m is ClassicalMethod {
  return m === 'pearson' || m === 'spearman' || m === 'kendall';
}
export function isRobust(m: Method): m is RobustMethod {
  return (ROBUST_METHODS as readonly string[]).includes(m);
}
export function isOrdinal(m: Method): m is OrdinalMethod {
  return m === 'polychoric' || m === 'polyserial';
}

/** How a two-sided interval is made: Fisher's z (classical coefficients), or a bootstrap of the rows. */
export type IntervalMethod = 'fisher' | 'percentile' | 'bca';
export const INTERVAL_METHODS: readonly IntervalMethod[] = ['fisher', 'percentile', 'bca'];

/** The words for each method, used by every layer (cell answers, the report, the panel, written formulas). */
export interface MethodLabel {
  /** The coefficient's name: "Pearson", "Spearman", "Kendall". */
  name: string;
  /** Its symbol in plain text, as a cell shows it: "r", "rho", "tau-b". */
  symbol: string;
  /** Its symbol in typeset text, as the panel shows it: "r", "ρ", "τ-b". */
  glyph: string;
  /** What it measures, in two or three words. */
  gist: string;
}

export const METHOD_LABELS: Record<Method, MethodLabel> = {
  pearson: { name: 'Pearson', symbol: 'r', glyph: 'r', gist: 'straight line' },
  spearman: { name: 'Spearman', symbol: 'rho', glyph: 'ρ', gist: 'rank order' },
  kendall: { name: 'Kendall', symbol: 'tau-b', glyph: 'τ-b', gist: 'rank agreement' },
  percentage_bend: { name: 'Percentage bend', symbol: 'r_pb', glyph: 'r_pb', gist: 'resists outliers' },
  winsorized: { name: 'Winsorized', symbol: 'r_w', glyph: 'r_w', gist: 'tails pulled in' },
  biweight: { name: 'Biweight', symbol: 'r_bw', glyph: 'r_bw', gist: 'outliers down-weighted' },
  skipped: { name: 'Skipped', symbol: 'r_skip', glyph: 'r_skip', gist: 'outlying rows set aside' },
  polychoric: { name: 'Polychoric', symbol: 'rho_pc', glyph: 'ρ_pc', gist: 'two rating scales' },
  polyserial: { name: 'Polyserial', symbol: 'rho_ps', glyph: 'ρ_ps', gist: 'rating scale and measure' },
};

export interface Interval {
  lower: number;
  upper: number;
  /** Confidence level, e.g. 0.95. */
  level: number;
  /** How the interval was made, e.g. "Fisher z, SE = 1/sqrt(n - 3)". */
  method: string;
  /** Why the bounds are NaN, when they are (too few rows, perfect rank agreement). */
  note?: string;
  /** Bootstrap intervals: the number of resamples behind the bounds. */
  replicates?: number;
}

/** The statistic behind a p-value. */
export interface TestStatistic {
  name: 't' | 'z' | 'S';
  value: number;
  df?: number;
}

/** What every test of a correlation (or of the difference of two) returns; see the note at the top. */
export interface TestResult {
  method: Method;
  /** The estimate: a coefficient clipped to [-1, 1], or a difference of two. */
  statistic: number;
  pValue: number;
  tail: Tail;
  /** Two-sided interval at the requested level, whatever the tail. */
  interval: Interval;
  test: TestStatistic;
  /** How the p-value was obtained, e.g. "t test, df = n - 2", "exact null distribution of S". */
  pMethod: string;
  /** Complete rows behind the result (for two independent groups, both groups together). */
  n: number;
}

/** The result of one correlation test. */
export interface CorrelationResult extends TestResult {
  name: CoefficientName;
  /** The skipped correlation's set-aside rows, 0-based positions in the columns it was given. */
  skippedRows?: number[];
  /** Anything the reader must know about how this coefficient was reached (a cap, a fallback). */
  note?: string;
}

/** Error codes of the core's input validation; the cell layer maps them to host errors. */
export type StatsErrorCode =
  | 'too-few'
  | 'constant'
  | 'unequal-length'
  | 'bad-option'
  | 'out-of-range'
  | 'too-large';

/** The one error type the core throws for bad input; `message` is written for a spreadsheet user. */
export class StatsInputError extends Error {
  readonly code: StatsErrorCode;
  constructor(code: StatsErrorCode, message: string) {
    super(message);
    this.name = 'StatsInputError';
    this.code = code;
  }
}
