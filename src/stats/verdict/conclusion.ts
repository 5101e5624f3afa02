/**
 * Everything the reader is told about one correlation, computed once for REPORT and the panel alike: the
 * coefficient, the advice, whether the conclusion holds (sensitivity.ts), the evidence for a correlation too small
 * to matter (an equivalence test: when the interval includes zero, and when a clear correlation is negligible), the
 * Bayes factor when the interval includes zero (neither when the relationship turns back, which a flat average
 * would misstate), where the relationship turns back, and the smallest correlation these rows could detect.
 */
import type { CheckReport } from '../checks/check-report';
import { bayesCorrelation, BayesResult } from '../correlation/bayes';
import { equivalenceTest, EquivalenceResult } from '../correlation/benchmark';
import { correlatePrepared } from '../correlation/correlate';
import { PreparedPairs } from '../correlation/prepared';
import { detectableCorrelation, MAX_PLANNING_N } from '../planning/power';
import { CorrelationResult, IntervalMethod, Method } from '../types';
import { plainReading, recommendCoefficient, Recommendation } from './advice';
import { sensitivity, Sensitivity } from './sensitivity';
import { looksOrdinal } from '../ordinal/categories';
import { turnOf, Turn } from './turn';

/** The equivalence bound used when none is asked for: |rho| < 0.1, below Cohen's (1988) "small". */
export const NEGLIGIBLE_BOUND = 0.1;

export interface Conclusion {
  correlation: CorrelationResult;
  recommendation: Recommendation;
  sensitivity: Sensitivity;
  /** Is the correlation within +/- NEGLIGIBLE_BOUND? Given when the interval includes zero, and when a clear
   *  correlation is negligible all the same (real but too small to matter); null otherwise. */
  equivalence: EquivalenceResult | null;
  /** When the interval includes zero: the Bayes factor for Pearson's r, uniform prior, even prior odds. */
  bayes: BayesResult | null;
  /** The smallest correlation these rows detect 8 times in 10 at the interval's alpha (two-sided, exact). */
  detectable: number | null;
  /** Where the relationship turns back (y rises then falls, or the reverse), when it does; see turn.ts. */
  turn: Turn | null;
  reading: string;
}

export interface ConclusionOptions {
  method: Method;
  level: number;
  /** How the coefficient's interval is made (its default when omitted). */
  interval?: IntervalMethod;
  name: (i: number) => string;
  /** The columns' names for the reading (their headers), when known; "x" and "y" otherwise. */
  columns?: { x: string; y: string };
}

export function conclude(prepared: PreparedPairs, report: CheckReport, opts: ConclusionOptions): Conclusion {
  const correlation = correlatePrepared(prepared, { method: opts.method, tail: 'both', level: opts.level, interval: opts.interval });
  let yAllPositive = true;
  for (let i = 0; i < prepared.n && yAllPositive; i++) if (!(prepared.y[i] > 0)) yAllPositive = false;
  const turn = turnOf(prepared, report, opts.level);
  const sens = sensitivity(prepared, report, { ...opts, main: correlation, turn });
  const robustRow = sens.rows.find((r) => r.scenario === 'robust coefficient');
  const pearson = opts.method === 'pearson' ? correlation.statistic : undefined;
  const recommendation = recommendCoefficient(report, correlation, yAllPositive, {
    ratingScales: looksOrdinal(prepared.x) && looksOrdinal(prepared.y),
    turn,
    robust: robustRow?.statistic,
    pearson: pearson ?? (robustRow ? correlatePrepared(prepared, { method: 'pearson', tail: 'both', level: opts.level }).statistic : undefined),
  });
  const n = prepared.n;
  const alpha = 1 - opts.level;
  let equivalence: EquivalenceResult | null = null;
  let bayes: BayesResult | null = null;
  // The equivalence test answers "too small to matter?" both ways: with no clear direction, whether the data
  // rule out a correlation worth the name; with a clear one (at thousands of rows even r = 0.02 is significant),
  // whether it is real but negligible. A clear correlation that is not shown negligible needs no extra line.
  // A relationship that turns back is not "too small to matter" for being flat on average: no such lines then.
  if (!turn) {
    try {
      const e = equivalenceTest(correlation.statistic, n, opts.method, NEGLIGIBLE_BOUND, Math.min(alpha, 0.49));
      if (sens.direction === 'none' || e.negligible) equivalence = e;
    } catch {
      equivalence = null; // robust and ordinal coefficients, a perfect r, too few pairs
    }
  }
  if (sens.direction === 'none' && !turn) {
    try {
      const pearson = opts.method === 'pearson' ? correlation : correlatePrepared(prepared, { method: 'pearson', tail: 'both', level: opts.level });
      bayes = bayesCorrelation(pearson.statistic, n);
    } catch {
      bayes = null;
    }
  }
  let detectable: number | null = null;
  if (n >= 4 && n <= MAX_PLANNING_N) {
    try {
      detectable = detectableCorrelation(n, 0.8, { alpha, tail: 'both' }).rho;
    } catch {
      detectable = null;
    }
  }
  return { correlation, recommendation, sensitivity: sens, equivalence, bayes, detectable, turn, reading: plainReading(correlation, report, alpha, opts.columns, equivalence, turn) };
}
