/** Shared result and option types of the statistics core. Plain data: no host, DOM or cell types. */

/** Which alternative a p-value refers to: "both" (two-sided), "positive" (rho > 0) or "negative" (rho < 0). */
export type Tail = 'both' | 'positive' | 'negative';

/** The correlation methods a user can ask for. */
export type Method = 'pearson' | 'spearman' | 'kendall';

/** The coefficient actually reported; Pearson on two-valued columns is named point-biserial or phi. */
export type CoefficientName = 'Pearson' | 'point-biserial' | 'phi' | 'Spearman' | 'Kendall tau-b';

export interface Interval {
  lower: number;
  upper: number;
  /** Confidence level, e.g. 0.95. */
  level: number;
  /** How the interval was made, e.g. "Fisher z, SE = 1/sqrt(n - 3)". */
  method: string;
}

/** The result of one correlation test. */
export interface CorrelationResult {
  method: Method;
  name: CoefficientName;
  /** The coefficient, clipped to [-1, 1]. */
  statistic: number;
  pValue: number;
  tail: Tail;
  interval: Interval;
  /** Complete pairs used. */
  n: number;
  /** The test statistic behind the p-value. */
  test: { name: 't' | 'z' | 'S'; value: number; df?: number };
  /** How the p-value was obtained, e.g. "t test, df = n - 2", "exact distribution of S". */
  pMethod: string;
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

export const TAILS: readonly Tail[] = ['both', 'positive', 'negative'];
export const METHODS: readonly Method[] = ['pearson', 'spearman', 'kendall'];
