import { CorrelationResult, Method, METHOD_LABELS } from '../types';
import { CheckKey, CheckReport } from './check-report';
import { formatNumber as num } from '../format';

/** What to report instead (or as well), and why. */
export interface Recommendation {
  /** A coefficient name ("Pearson", "Spearman", "Kendall tau-b", ...), or "none" when no coefficient is reliable. */
  name: string;
  /** The method behind that name, or null for "none". */
  method: Method | null;
  /** True when the recommendation differs from the coefficient that was computed. */
  changed: boolean;
  /** Why, in one or two plain sentences. */
  reason: string;
}

/** Cohen's (1988) words for the size of a correlation: .1 small, .3 medium, .5 large. */
export type StrengthWord = 'very small' | 'small' | 'medium' | 'large';

/** The convention the strength words follow, as stated to the user. */
export const STRENGTH_CONVENTION = "Cohen's (1988) convention (.1 small, .3 medium, .5 large)";

/**
 * Size word for a correlation on the scale of r, after Cohen (1988), Statistical Power Analysis for the Behavioral
 * Sciences, 2nd ed., ch. 3: |r| = .1 small, .3 medium, .5 large (below .1: very small).
 * @example strengthWord(-0.42) // "medium"
 */
export function strengthWord(r: number): StrengthWord {
  const a = Math.abs(r);
  if (a >= 0.5) return 'large';
  if (a >= 0.3) return 'medium';
  if (a >= 0.1) return 'small';
  return 'very small';
}

/**
 * Kendall's tau on the scale of r: r = sin(pi tau / 2), exact for bivariate normal data (Greiner 1909; Kendall
 * 1970, Rank Correlation Methods, 4th ed.). Used only to choose a strength word for tau, which runs
 * smaller than r for the same association.
 */
export function tauOnRScale(tau: number): number {
  return Math.sin((Math.PI * tau) / 2);
}

/** Fewer pairs than this: prefer Kendall's tau-b to Spearman's rho (common applied advice, not a theorem: its
 * null distribution nears the normal sooner and it handles ties more gracefully). */
const KENDALL_BELOW_N = 25;

function flagged(report: CheckReport, key: CheckKey): boolean {
  return report.checks.some((c) => c.key === key && c.verdict === 'flag');
}

function rowOf(report: CheckReport, key: CheckKey) {
  return report.checks.find((c) => c.key === key)!;
}

/** "a, b and c". */
function listWords(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/**
 * Which coefficient to report, given what the checks found (the usual guidance of applied texts, e.g. Wilcox 2017,
 * Introduction to Robust Estimation and Hypothesis Testing, ch. 9: rank coefficients resist single points and need
 * no normal shape; none of the three repairs dependence between rows or a curve that turns back):
 * - one point sets the slope: none is reliable; gather data across x;
 * - a curve: a rank coefficient, which follows any steadily rising or falling pattern (a curve comes before the
 *   flags below, which a misfitting straight line produces by itself);
 * - outliers, influential points or a non-normal shape: a rank coefficient;
 * - (a rank coefficient is Kendall's tau-b below 25 pairs, Spearman's rho otherwise; a rank coefficient already
 *   chosen is kept);
 * - uneven spread alone: keep the coefficient, but its p-value and interval are approximate;
 * - neighbouring rows alike: a caution added to any of the above.
 */
export function recommendCoefficient(report: CheckReport, chosen: CorrelationResult): Recommendation {
  const n = report.n;
  const rank = n < KENDALL_BELOW_N ? 'Kendall tau-b' : 'Spearman';
  const rankMethod: Method = n < KENDALL_BELOW_N ? 'kendall' : 'spearman';
  const rankWhy = n < KENDALL_BELOW_N ? `Kendall's tau-b suits fewer than ${KENDALL_BELOW_N} pairs` : '';
  const chosenIsRank = chosen.method !== 'pearson';
  const orderCaution = flagged(report, 'row-order')
    ? ' Neighbouring rows are alike, so whichever coefficient you report, its p-value and interval are too optimistic.'
    : '';
  const influence = rowOf(report, 'influence');

  if (report.points.setsSlope >= 0) {
    return {
      name: 'none',
      method: null,
      changed: true,
      reason: `${capital(influence.flag ?? 'one point sets the slope')}: every coefficient, rank-based ones included, rests on that point, so collect data across the range of x before reading a correlation.${orderCaution}`,
    };
  }
  if (chosen.name === 'phi') {
    return {
      name: 'phi',
      method: 'pearson',
      changed: false,
      reason: `Both columns take two values, so phi (Pearson on a 2 x 2 table) is the usual coefficient and the shape checks do not apply.${orderCaution}`,
    };
  }
  const outlier = rowOf(report, 'outliers');
  const pulls: string[] = [];
  if (flagged(report, 'outliers')) pulls.push(`an outlier (${outlier.place})`);
  if (flagged(report, 'influence') && !(flagged(report, 'outliers') && influence.place === outlier.place)) {
    pulls.push(`an influential point (${influence.place})`);
  }
  const SHAPE_NAMES = { 'normal-x': 'x', 'normal-y': 'y', 'normal-residuals': 'the residuals' } as const;
  const shapes: string[] = [];
  for (const key of ['normal-x', 'normal-y', 'normal-residuals'] as const) if (flagged(report, key)) shapes.push(SHAPE_NAMES[key]);
  const curved = flagged(report, 'straight-line');

  const causes: string[] = [];
  if (pulls.length > 0) causes.push(`${listWords(pulls)} ${pulls.length > 1 ? 'pull' : 'pulls'} Pearson's r`);
  if (shapes.length > 0) {
    causes.push(`${listWords(shapes)} ${shapes.length > 1 || shapes[0] === 'the residuals' ? 'are' : 'is'} not normal, so Pearson's p-value and interval are approximate`);
  }
  const rankTail = rankWhy ? ` (${rankWhy})` : '';

  if (curved) {
    // A curve comes first: outliers and shape flags of a straight line that does not fit follow from it.
    const also = causes.length > 0 ? ` Also, ${causes.join('; ')}.` : '';
    const follows = 'follows any steadily rising or falling pattern, but if the curve turns back no single coefficient describes it';
    if (chosenIsRank) {
      return { name: chosen.name, method: chosen.method, changed: false, reason: `The points bend away from a straight line; ${chosen.name} (as chosen) ${follows}.${also}${orderCaution}` };
    }
    return {
      name: rank,
      method: rankMethod,
      changed: true,
      reason: `The points bend away from a straight line, which Pearson's r measures only in part; a rank coefficient${rankTail} ${follows}.${also}${orderCaution}`,
    };
  }
  if (causes.length > 0) {
    const why = `${capital(causes.join('; '))}. Rank coefficients resist single points and need no normal shape`;
    if (chosenIsRank) {
      return { name: chosen.name, method: chosen.method, changed: false, reason: `${why}, so ${chosen.name} (as chosen) suits these data.${orderCaution}` };
    }
    return { name: rank, method: rankMethod, changed: true, reason: `${why}${rankWhy ? `; ${rankWhy}` : ''}.${orderCaution}` };
  }
  if (flagged(report, 'even-spread')) {
    return { name: chosen.name, method: chosen.method, changed: false, reason: `The scatter is uneven across x: ${chosen.name} still summarises the trend, but its p-value and interval are approximate.${orderCaution}` };
  }
  const untested = report.notTestable > 0 ? ` (${report.notTestable} of the eight could not run; see CHECKS)` : '';
  if (orderCaution) {
    return { name: chosen.name, method: chosen.method, changed: false, reason: `No check of shape or single points raised a flag${untested}.${orderCaution}` };
  }
  return { name: chosen.name, method: chosen.method, changed: false, reason: `No check raised a flag${untested}, so ${chosen.name} can be read as it stands.` };
}

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** The symbol a coefficient is reported under. */
export function coefficientSymbol(result: CorrelationResult): string {
  return METHOD_LABELS[result.method].symbol;
}

/**
 * One plain-language sentence reading the correlation: direction, strength in Cohen's (1988) words, what the
 * p-value is (the chance of data at least this extreme if there were no correlation) and is not (the chance that
 * there is none), and, when the data point to a correlation, that it does not by itself show cause.
 * @param significance the level below which p counts as evidence, normally 1 - the interval's level
 */
export function plainReading(result: CorrelationResult, report: CheckReport | null, significance: number): string {
  const sym = coefficientSymbol(result);
  const est = result.statistic;
  const rScale = result.method === 'kendall' ? tauOnRScale(est) : est;
  const strength = strengthWord(rScale);
  const estText = result.method === 'kendall'
    ? `${sym} = ${num(est)} (about r = ${num(rScale)} by Greiner's relation)`
    : `${sym} = ${num(est)}`;
  const p = result.pValue;
  const pText = p < 0.001 ? 'p, below 0.001,' : `p = ${String(Number(p.toPrecision(2)))}`;
  const pMeaning = `${pText} is the chance of data at least this extreme if there were no correlation (not the chance that there is none)`;
  const caveat = report && report.flags.length > 0 ? 'Taken at face value (see the flags), across' : 'Across';
  const n = result.n;
  const levelPct = `${Number((result.interval.level * 100).toPrecision(4))}%`;
  const hasInterval = Number.isFinite(result.interval.lower) && Number.isFinite(result.interval.upper);
  if (est === 0) {
    return `${caveat} ${n} pairs, ${estText} shows no ${result.method === 'pearson' ? 'straight-line ' : ''}association; ${pMeaning}.`;
  }
  if (p < significance) {
    const direction = est > 0 ? 'y tends to rise as x rises' : 'y tends to fall as x rises';
    return `${caveat} ${n} pairs, ${direction}: ${estText} is a ${strength} correlation by ${STRENGTH_CONVENTION}, and ${pMeaning}, so chance alone is an unlikely explanation, though a correlation by itself does not show that x causes y.`;
  }
  const sign = est > 0 ? 'positive' : 'negative';
  const interval = hasInterval ? `: the ${levelPct} interval runs from ${num(result.interval.lower)} to ${num(result.interval.upper)}` : '';
  return `${caveat} ${n} pairs, ${estText} is a ${strength} ${sign} correlation by ${STRENGTH_CONVENTION}, but ${pMeaning}, so these data can neither confirm a correlation nor rule one out${interval}.`;
}
