/**
 * Cell functions for evidence about a correlation beyond its p-value: whether it is too small to matter (an
 * equivalence test) and the Bayes factor for a correlation against none, from cells or from a reported r and n.
 * Thin adapter: read cells, call the core, shape the answer.
 */
import { CellRange } from '../sheet/cells';
import { bayesCorrelation, BayesResult } from '../stats/correlation/bayes';
import { equivalenceTest } from '../stats/correlation/benchmark';
import { correlatePrepared } from '../stats/correlation/correlate';
import { omitted, optAlpha, optClassicalMethod, optLevel, optNumber, optionWord, requiredNumber } from './args';
import { cellValue, guard } from './errors';
import { correctionText, correctValidity } from '../stats/corrections/corrected';
import { requirePairs } from './read';
import { sharedPairs } from './shared-pairs';

/**
 * Whether the correlation between two columns is too small to matter: an equivalence test that it lies within plus or minus a bound (two one-sided Fisher z tests). A small p-value here is evidence for no correlation worth the name.
 * @customfunction NEGLIGIBLE
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [bound] The largest correlation that would not matter, between 0 and 1; default 0.1.
 * @param [alpha] Significance level of each one-sided test, between 0 and 0.5; default 0.05 (the interval shown is then 90%).
 * @param [method] "pearson" (default), "spearman" or "kendall".
 * @returns {any[][]} One row: the larger one-sided p-value, the lower and upper ends of the 1 - 2 alpha interval, and the verdict in words.
 */
export function NEGLIGIBLE(x: any[][], y: any[][], bound?: number, alpha?: number, method?: string): any[][] {
  return guard(() => {
    const b = optNumber(bound, 0.1, 'bound');
    const a = optAlpha(alpha);
    const m = optClassicalMethod(method);
    const { pairs, prepared } = sharedPairs(x as CellRange, y as CellRange);
    requirePairs(pairs, 4);
    const r = correlatePrepared(prepared, { method: m, tail: 'both', level: 0.95 });
    const e = equivalenceTest(r.statistic, r.n, m, b, a);
    const words = e.negligible
      ? `negligible: the correlation lies within ±${b}`
      : `not shown to be negligible: correlations beyond ±${b} cannot be ruled out`;
    return [[e.pValue, e.interval.lower, e.interval.upper, words]];
  });
}

/** One row: BF10, BF01, P(correlation | data), posterior median, lower, upper. Factors beyond doubles become words. */
function bayesRow(b: BayesResult): (number | string)[][] {
  const big = (v: number): number | string => (Number.isFinite(v) ? v : `above 1e308 (log ${b.logBf10.toPrecision(6)})`);
  return [[big(b.bf10), Number.isFinite(b.bf01) ? b.bf01 : big(b.bf01), b.posteriorProbability, b.median, b.lower, b.upper]];
}

function priorOptions(priorWidth: unknown, priorOdds: unknown): { priorWidth: number; priorOdds: number } {
  return { priorWidth: optNumber(priorWidth, 1, 'prior_width'), priorOdds: optNumber(priorOdds, 1, 'prior_odds') };
}

/**
 * The Bayes factor for a Pearson correlation between two columns against none, with the posterior of the correlation: how much more likely the data are if there is a correlation than if there is none (BF10), and the reverse (BF01).
 * @customfunction BAYES
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [prior_width] Width of the prior on the correlation, above 0; default 1 (every correlation from -1 to 1 equally likely beforehand); smaller values expect smaller correlations.
 * @param [prior_odds] Prior odds of a correlation against none, above 0; default 1 (even odds).
 * @returns {any[][]} One row: BF10, BF01, the probability of a correlation given the data and the prior odds, the posterior median of the correlation, and the lower and upper ends of its 95% credible interval.
 */
export function BAYES(x: any[][], y: any[][], prior_width?: number, prior_odds?: number): any[][] {
  return guard(() => {
    const { pairs, prepared } = sharedPairs(x as CellRange, y as CellRange);
    requirePairs(pairs, 3);
    const r = correlatePrepared(prepared, { method: 'pearson', tail: 'both', level: 0.95 });
    return bayesRow(bayesCorrelation(r.statistic, r.n, priorOptions(prior_width, prior_odds)));
  });
}

/**
 * The Bayes factor for a Pearson correlation reported elsewhere, from just r and the number of pairs, with the posterior of the correlation.
 * @customfunction BAYES_REPORTED
 * @param r The reported correlation, strictly between -1 and 1.
 * @param n The number of pairs it was computed from, at least 3.
 * @param [prior_width] Width of the prior on the correlation, above 0; default 1 (uniform from -1 to 1).
 * @param [prior_odds] Prior odds of a correlation against none, above 0; default 1.
 * @returns {any[][]} One row: BF10, BF01, the probability of a correlation given the data and the prior odds, the posterior median, and the lower and upper ends of the 95% credible interval.
 */
export function BAYES_REPORTED(r: number, n: number, prior_width?: number, prior_odds?: number): any[][] {
  return guard(() => bayesRow(bayesCorrelation(requiredNumber(r, 'r'), requiredNumber(n, 'n'), priorOptions(prior_width, prior_odds))));
}

/**
 * Corrects an observed validity (the correlation between a selection measure and later performance, say) for unreliable measures and for range restriction, in the order Hunter and Schmidt prescribe: criterion unreliability, then restriction, then predictor unreliability. The answer estimates the correlation among all applicants, not among the people in the sheet.
 * @customfunction CORRECTED
 * @param r The observed correlation, strictly between -1 and 1.
 * @param [rel_x] Reliability of the predictor x among applicants (the unrestricted group), between 0 and 1. Given: the answer is the true-score correlation (constructs, for theory). Omitted: the operational validity (x as measured, for decisions).
 * @param [rel_y] Reliability of the criterion y in the sample (for example inter-rater reliability of performance ratings), between 0 and 1.
 * @param [sd_ratio] Standard deviation of x among applicants divided by its standard deviation in the sample (above 1 when the sample was selected on x).
 * @param [restriction] "direct" (default: people were selected on x itself; Thorndike's Case II) or "indirect" (selected on something related to x; Case IV, which needs rel_x).
 * @param [n] Rows behind r, at least 4: gives the interval, made by correcting the ends of the observed Fisher-z interval.
 * @param [level] Confidence level between 0 and 1, default 0.95 (95%).
 * @returns {any[][]} One row: the corrected correlation, the lower and upper ends of its interval (empty without n), and the steps applied with which figure answers which question.
 */
export function CORRECTED(r: number, rel_x?: number, rel_y?: number, sd_ratio?: number, restriction?: string, n?: number, level?: number): any[][] {
  return guard(() => {
    const opt = (v: unknown, name: string): number | undefined => (omitted(v) ? undefined : requiredNumber(v, name));
    const res = correctValidity({
      r: requiredNumber(r, 'r'),
      relX: opt(rel_x, 'rel_x'),
      relY: opt(rel_y, 'rel_y'),
      sdRatio: opt(sd_ratio, 'sd_ratio'),
      restriction: omitted(restriction) ? undefined : optionWord(restriction, ['direct', 'indirect'] as const, 'direct', 'restriction'),
      n: opt(n, 'n'),
      level: omitted(level) ? undefined : optLevel(level),
    });
    return [[res.corrected, cellValue(res.lower), cellValue(res.upper), correctionText(res)]];
  });
}
