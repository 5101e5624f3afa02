/**
 * What to report and why, and the plain reading of a correlation: the words the cell functions (REPORT) and the
 * panel share. Built on the checks' verdicts (src/stats/checks/verdict.ts): a departure that is present but
 * harmless at this n does not change the advice, and a check that could not see (too few rows) never lets the
 * advice say the coefficient can be read as it stands.
 */
import type { CheckKey, CheckReport, CheckRow } from '../checks/check-report';
import type { EquivalenceResult } from '../correlation/benchmark';
import type { Turn } from './turn';
import { formatNumber as num } from '../format';
import { CorrelationResult, isOrdinal, isRobust, Method, METHOD_LABELS } from '../types';

/** The remedy an advice names, for the panel's buttons and the tests. */
export type Remedy = 'check-row' | 'collect-across-x' | 'rank' | 'robust' | 'ordinal' | 'effective-rows' | 'log' | 'more-rows' | 'each-side' | null;

/** What to report instead (or as well), and why. */
export interface Recommendation {
  /** A coefficient name ("Pearson", "Spearman", "Kendall tau-b", ...), or "none" when no coefficient is reliable. */
  name: string;
  /** The method behind that name, or null for "none". */
  method: Method | null;
  /** True when the recommendation differs from the coefficient that was computed. */
  changed: boolean;
  /** Why, in one or two plain sentences, naming the remedy. */
  reason: string;
  /** The main remedy named, if any. */
  remedy: Remedy;
}

/** What recommendCoefficient may also know about the data. */
export interface AdviceContext {
  /** Both columns look like rating-scale items (few whole-number categories; src/stats/ordinal/categories.ts). */
  ratingScales?: boolean;
  /** The percentage bend correlation on the same rows, to say how far a robust coefficient moves from Pearson. */
  robust?: number;
  /** Pearson's r on the same rows. */
  pearson?: number;
  /** Where the relationship turns back, when it does (turn.ts). */
  turn?: Turn | null;
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
 * 1970, Rank Correlation Methods, 4th ed.). Used to choose a strength word for tau, which runs smaller than r for
 * the same association, so that Cohen's words keep their meaning.
 */
export function tauOnRScale(tau: number): number {
  return Math.sin((Math.PI * tau) / 2);
}

/** The strength word of a result, read on the scale of r (Kendall's tau through Greiner's relation). */
export function strengthOf(result: CorrelationResult): { word: StrengthWord; rScale: number } {
  const rScale = result.method === 'kendall' ? tauOnRScale(result.statistic) : result.statistic;
  return { word: strengthWord(rScale), rScale };
}

/** The symbol a coefficient is reported under. */
export function coefficientSymbol(result: CorrelationResult): string {
  return METHOD_LABELS[result.method].symbol;
}

/** Fewer pairs than this: prefer Kendall's tau-b to Spearman's rho (common applied advice, not a theorem: its
 * null distribution nears the normal sooner and it handles ties more gracefully). */
const KENDALL_BELOW_N = 25;

/** Checks that could not see or run: from this many of the eight, the data are too few to judge the assumptions. */
export const BLIND_CHECKS_LIMIT = 4;

function rowOf(report: CheckReport, key: CheckKey): CheckRow {
  return report.checks.find((c) => c.key === key)!;
}

function problem(report: CheckReport, key: CheckKey): boolean {
  return rowOf(report, key).verdict === 'problem';
}

/** "a, b and c". */
export function listWords(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** True when too many checks could not see or run for the assumptions to be judged. */
export function tooFewToJudge(report: CheckReport): boolean {
  return report.tooFew + report.notTestable >= BLIND_CHECKS_LIMIT;
}

/**
 * Which coefficient to report, and the remedy that fits what the checks found (the usual guidance of applied
 * texts, e.g. Wilcox 2017, Introduction to Robust Estimation and Hypothesis Testing, 4th ed., ch. 9: rank
 * coefficients resist single points and need no normal shape; none repairs dependence between rows or a curve
 * that turns back). In order:
 * - both columns rating-scale items: the polychoric correlation (Olsson 1979);
 * - one point sets the slope: no coefficient is reliable; collect data across x;
 * - the relationship turns back (turn.ts: clear correlations of opposite sign on the two sides of the fitted
 *   parabola's turn): no single coefficient, rank ones included; report each side, or the curve;
 * - an outlier whose value is far outside its column: check that row for a data-entry error first;
 * - neighbouring rows alike: keep the coefficient, but read the p-value and interval with the effective rows
 *   (Pyper & Peterman 1998) or correlate the changes from row to row; a rank coefficient fixes neither;
 * - a curve: a rank coefficient, which follows any steadily rising or falling pattern;
 * - an outlier, a row the conclusion rests on, or a strongly non-normal shape: the percentage bend correlation
 *   (Wilcox 1994), saying how far it moves from Pearson; a rank or robust coefficient already chosen is kept;
 * - uneven spread: the logarithm of y when y is positive and the spread widens with x, else a rank coefficient;
 * - (a rank coefficient is Kendall's tau-b below 25 pairs, Spearman's rho otherwise; a rank coefficient already
 *   chosen is kept);
 * - nothing serious, but too few rows for the checks to see: collect more rows before relying on the result;
 * - only slight departures, or none: the coefficient as it stands.
 */
export function recommendCoefficient(report: CheckReport, chosen: CorrelationResult, yAllPositive = false, context: AdviceContext = {}): Recommendation {
  const n = report.n;
  const rankName = n < KENDALL_BELOW_N ? 'Kendall tau-b' : 'Spearman';
  const rankMethod: Method = n < KENDALL_BELOW_N ? 'kendall' : 'spearman';
  const rankWhy = n < KENDALL_BELOW_N ? ` (Kendall's tau-b suits fewer than ${KENDALL_BELOW_N} pairs)` : '';
  const chosenIsRank = chosen.method === 'spearman' || chosen.method === 'kendall';
  const chosenIsRobust = chosenIsRank || isRobust(chosen.method);
  const moved = context.robust !== undefined && context.pearson !== undefined
    ? ` On these rows it gives r_pb = ${num(context.robust)} against Pearson's r = ${num(context.pearson)}${Math.abs(context.robust - context.pearson) < 0.05 ? ', close enough that the outlying values do not change the picture' : `, a shift of ${num(Math.abs(context.robust - context.pearson))}`}.`
    : '';
  const toRobust = (reason: string, remedy: Remedy = 'robust'): Recommendation =>
    chosenIsRobust
      ? { name: chosen.name, method: chosen.method, changed: false, reason: `${reason} ${capital(chosen.name)} (as chosen) ${chosenIsRank ? 'is a rank coefficient and ' : ''}resists it.`, remedy }
      : {
        name: 'percentage bend', method: 'percentage_bend', changed: true, remedy,
        reason: `${reason} The percentage bend correlation (Wilcox 1994) caps the pull of the most extreme 20% of each column and comes with a bootstrap interval; a rank coefficient${rankWhy} also resists it.${moved}`,
      };
  const keep = (reason: string, remedy: Remedy): Recommendation => ({ name: chosen.name, method: chosen.method, changed: false, reason, remedy });
  const toRank = (reason: string, remedy: Remedy = 'rank'): Recommendation =>
    chosenIsRank
      ? { name: chosen.name, method: chosen.method, changed: false, reason: `${reason} ${chosen.name} (as chosen) is a rank coefficient and resists it.`, remedy }
      : { name: rankName, method: rankMethod, changed: true, reason: `${reason} A rank coefficient${rankWhy} resists it.`, remedy };
  const order = problem(report, 'row-order');
  const orderWords = (() => {
    if (!order) return '';
    const eff = report.effectiveRows;
    const rows = eff ? ` (about ${num(eff.effective)} effective rows of ${n})` : '';
    return ` Neighbouring rows are alike${rows}: read the p-value and interval with the effective rows, or correlate the changes from one row to the next instead of the levels.`;
  })();

  if (report.points.setsSlope >= 0) {
    const infl = rowOf(report, 'influence');
    return {
      name: 'none', method: null, changed: true, remedy: 'collect-across-x',
      reason: `${capital(infl.flag ?? 'one point sets the slope')}: every coefficient, rank-based ones included, rests on that point, so collect data across the range of x before reading a correlation.${orderWords}`,
    };
  }
  const outlier = rowOf(report, 'outliers');
  // An outlier whose value is far outside its column: a typing slip to check before anything else is read.
  const farOut = outlier.verdict === 'problem' && outlier.detail.farOut === 1;
  if (context.turn) {
    const t = context.turn;
    const side = (r: CorrelationResult) => `r = ${num(r.statistic)} on ${r.n.toLocaleString('en-US')} rows`;
    const orderNote = order
      ? t.xInRowOrder
        ? ' The rows run in the order of x, so the curve itself makes neighbouring rows alike; the row-order flag is its doing.'
        : orderWords
      : '';
    const farNote = farOut ? ` Check ${outlier.place} too: its value lies far outside the rest of its column.` : '';
    return {
      name: 'none', method: null, changed: true, remedy: 'each-side',
      reason: `The points ${t.shape === 'peak' ? 'rise and then fall' : 'fall and then rise'}: the fitted curve turns at x = ${num(t.at)}, inside the data, so Pearson's r and the rank coefficients average the two sides into one number that describes neither. Report each side (x at or below ${num(t.at)}: ${side(t.below)}; above: ${side(t.above)}) or the curve itself, and look at the scatter.${orderNote}${farNote}`,
    };
  }
  if (context.ratingScales && !isOrdinal(chosen.method) && chosen.name !== 'phi') {
    const rec: Recommendation = {
      name: 'polychoric', method: 'polychoric', changed: true, remedy: 'ordinal',
      reason: 'Both columns look like rating-scale items (a few whole-number categories): the polychoric correlation (Olsson 1979) estimates the correlation of the continuous attitudes behind the ratings, which Pearson on category numbers understates; Spearman or Kendall tau-b suits a purely rank-order reading.',
    };
    return rec;
  }
  if (chosen.name === 'phi') {
    return keep(`Both columns take two values, so phi (Pearson on a 2 x 2 table) is the usual coefficient and the shape checks do not apply.${orderWords}`, order ? 'effective-rows' : null);
  }
  if (farOut) {
    const rec = toRobust(`Check ${outlier.place} for a data-entry error first: its value lies far outside the rest of its column (more than three interquartile ranges beyond the quartiles, Tukey 1977), and ${outlier.effect?.text ?? 'it moves r'}. If the value is right, report a coefficient that resists it.`);
    return { ...rec, reason: `${rec.reason}${orderWords}`, remedy: 'check-row' };
  }
  if (order) {
    return keep(
      `${orderWords.trim()} A rank coefficient would not help: it assumes independent rows too.`,
      'effective-rows',
    );
  }
  const influence = rowOf(report, 'influence');
  const shapes = (['normal-x', 'normal-y', 'normal-residuals'] as const).filter((k) => problem(report, k));
  const shapeNames = { 'normal-x': 'x', 'normal-y': 'y', 'normal-residuals': 'the residuals' } as const;
  const causes: string[] = [];
  if (outlier.verdict === 'problem') causes.push(`an outlier (${outlier.place}) ${outlier.effect?.text ? `moves r: ${outlier.effect.text}` : 'pulls Pearson\'s r'}`);
  if (influence.verdict === 'problem' && influence.place !== outlier.place) causes.push(`the conclusion rests on ${influence.place}`);
  if (shapes.length > 0) {
    causes.push(`${listWords(shapes.map((k) => shapeNames[k]))} ${shapes.length > 1 || shapes[0] === 'normal-residuals' ? 'are' : 'is'} strongly non-normal, so Pearson's p-value and interval are unreliable`);
  }
  if (problem(report, 'straight-line')) {
    const also = causes.length > 0 ? ` Also, ${causes.join('; ')}.` : '';
    return toRank(`The points bend away from a straight line, which Pearson's r measures only in part; a coefficient that follows any steadily rising or falling pattern fits better, but if the curve turns back no single coefficient describes it.${also}`);
  }
  if (causes.length > 0) return toRobust(`${capital(causes.join('; '))}.`);
  const spread = rowOf(report, 'even-spread');
  if (spread.verdict === 'problem') {
    const widens = spread.detail.widensUpward === 1;
    if (yAllPositive && widens) {
      return keep(
        `The scatter widens as x grows, enough to make Pearson's interval too narrow (${spread.effect?.text ?? ''}). Take the logarithm of y, which often evens such a spread out, or use a rank coefficient${rankWhy}.`,
        'log',
      );
    }
    return toRank(`The scatter is uneven across x (${spread.effect?.text ?? ''}), so Pearson's p-value and interval are too optimistic.`);
  }
  const slight = report.minor;
  const slightWords = slight.length > 0 ? ` Slight departures were found (${slight.join('; ')}), too small to change the conclusion at ${n.toLocaleString('en-US')} rows.` : '';
  if (tooFewToJudge(report)) {
    return keep(
      `With ${n} rows most of the checks cannot see whether the assumptions hold (${report.tooFew + report.notTestable} of the eight could not tell): read ${chosen.name}'s interval, not just its value, and collect more rows before a decision rests on it.${slightWords}`,
      'more-rows',
    );
  }
  const blind = report.tooFew + report.notTestable;
  const blindWords = blind > 0 ? ` (${blind} of the eight could not tell with ${n} rows; see CHECKS)` : '';
  return keep(`No check found a departure that changes the conclusion${blindWords}, so ${chosen.name} can be read as it stands.${slightWords}`, null);
}

/**
 * One plain-language sentence reading the correlation: when its interval includes zero, that the data show no
 * clear relationship and which correlations they cannot rule out (never a direction); otherwise its direction and
 * strength in Cohen's (1988) words, read on the scale of r (Kendall's tau through Greiner's relation), what the
 * p-value is (the chance of data at least this extreme if there were no correlation) and is not (the chance that
 * there is none), and that a correlation does not by itself show cause. A clear correlation that the equivalence
 * test (Schuirmann 1987; see benchmark.ts) places within its bound is read as real but negligible, with the share
 * of y's variation the far end of its interval would account for.
 * @param significance the level below which p counts as evidence, normally 1 - the interval's level
 * @param columns the columns' names (their headers) when known, so the sentence names them instead of x and y
 * @param negligible the equivalence test at NEGLIGIBLE_BOUND, when one was made
 * @param turn where the relationship turns back, when it does (turn.ts): then the sentence reads each side
 */
export function plainReading(result: CorrelationResult, report: CheckReport | null, significance: number, columns?: { x: string; y: string }, negligible?: EquivalenceResult | null, turn?: Turn | null): string {
  const xn = columns?.x ?? 'x';
  const yn = columns?.y ?? 'y';
  const sym = coefficientSymbol(result);
  const est = result.statistic;
  const { word, rScale } = strengthOf(result);
  const estText = result.method === 'kendall' ? `${sym} = ${num(est)} (about r = ${num(rScale)} by Greiner's relation)` : `${sym} = ${num(est)}`;
  const p = result.pValue;
  const pText = p < 0.001 ? 'p, below 0.001,' : `p = ${String(Number(p.toPrecision(2)))}`;
  const pMeaning = `${pText} is the chance of data at least this extreme if there were no correlation (not the chance that there is none)`;
  const caveat = report && report.flags.length > 0 ? 'Taken at face value (see the flags), across' : 'Across';
  const n = result.n;
  const levelPct = `${Number((result.interval.level * 100).toPrecision(4))}%`;
  const { lower, upper } = result.interval;
  const hasInterval = Number.isFinite(lower) && Number.isFinite(upper);
  const clear = hasInterval ? lower > 0 || upper < 0 : p < significance;
  if (turn) {
    // Neither "no clear relationship" nor one direction is true of a curve that turns back.
    const side = (r: CorrelationResult, where: string) => `${where}, ${yn} tends to ${r.statistic > 0 ? 'rise' : 'fall'} as ${xn} rises (r = ${num(r.statistic)}, ${r.n.toLocaleString('en-US')} rows)`;
    return `Across ${n.toLocaleString('en-US')} pairs, ${yn} follows ${xn} along a curve that ${turn.shape === 'peak' ? 'peaks' : 'bottoms out'} at ${xn} = ${num(turn.at)}: ${side(turn.below, `at or below it`)}; ${side(turn.above, 'above it')}. The single ${estText} averages the two sides away and understates how closely ${yn} follows ${xn}; and a relationship by itself does not show that ${xn} causes ${yn}.`;
  }
  if (!clear || est === 0) {
    const range = hasInterval
      ? `: the ${levelPct} interval runs from ${num(lower)} to ${num(upper)}, so the data cannot rule out a correlation as strong as ${num(Math.abs(lower))} in the negative direction or ${num(Math.abs(upper))} in the positive`
      : '';
    return `${caveat} ${n} pairs the data show no clear relationship (${estText}; ${pMeaning})${range}.`;
  }
  const direction = est > 0 ? `${yn} tends to rise as ${xn} rises` : `${yn} tends to fall as ${xn} rises`;
  if (negligible?.negligible && hasInterval) {
    // Real but too small to matter: the case a p-value alone gets wrong at thousands of rows.
    const far = est > 0 ? upper : lower;
    const share = result.method === 'pearson'
      ? `even at the far end of its ${levelPct} interval, ${num(far)}, the line through ${xn} accounts for ${String(Number((100 * far * far).toPrecision(2)))}% of the variation in ${yn}`
      : `even the far end of its ${levelPct} interval is only ${num(far)}`;
    return `${caveat} ${n.toLocaleString('en-US')} pairs, ${direction}, but negligibly: ${estText} is a ${word} correlation by ${STRENGTH_CONVENTION}, and while ${p < 0.001 ? 'p < 0.001' : pText} makes chance alone an unlikely explanation, the equivalence test places it within ±${negligible.bound} (${negligible.pValue < 0.001 ? 'p < 0.001' : `p = ${String(Number(negligible.pValue.toPrecision(2)))}`}): ${share}. At this many rows even a trivial correlation is significant; this one is real but too small to matter for most decisions.`;
  }
  return `${caveat} ${n} pairs, ${direction}: ${estText} is a ${word} correlation by ${STRENGTH_CONVENTION}, and ${pMeaning}, so chance alone is an unlikely explanation, though a correlation by itself does not show that ${xn} causes ${yn}.`;
}

/**
 * The panel's reading of a relationship that turns back (turn.ts), in short sentences naming the columns: where
 * it turns, each side's correlation, and why the single coefficient misleads.
 * @example readTurn(turn, 'Overtime', 'Output', formatR)[0] // "Output follows Overtime along a curve that peaks at Overtime = 25.3."
 */
export function readTurn(turn: Turn, xName: string, yName: string, show: (v: number) => string): string[] {
  const side = (r: CorrelationResult, where: string) => `${where}, higher ${xName} tends to go with ${r.statistic > 0 ? 'higher' : 'lower'} ${yName}: r = ${show(r.statistic)} on ${r.n.toLocaleString('en-US')} rows.`;
  return [
    `${yName} follows ${xName} along a curve that ${turn.shape === 'peak' ? 'peaks' : 'bottoms out'} at ${xName} = ${num(turn.at)}.`,
    side(turn.below, `At or below ${num(turn.at)}`),
    side(turn.above, `Above ${num(turn.at)}`),
    'A single correlation averages the two sides away, so it understates how closely they are related.',
  ];
}

/**
 * The panel's reading in short sentences naming the columns: a clear relationship with its strength and
 * direction, or no clear relationship with the correlations the data cannot rule out; the interval; the p-value
 * and what it is not.
 * @example readCorrelation(res, 'Visits', 'Sales')[0] // "Medium positive correlation by Cohen's (1988) convention ..."
 */
export function readCorrelation(res: CorrelationResult, xName: string, yName: string, show: (v: number) => string): string[] {
  const r = res.statistic;
  const { word, rScale } = strengthOf(res);
  const lines: string[] = [];
  const pct = `${Math.round(res.interval.level * 100)}%`;
  const { lower, upper } = res.interval;
  const hasInterval = Number.isFinite(lower) && Number.isFinite(upper);
  const clear = hasInterval ? lower > 0 || upper < 0 : res.pValue < 1 - res.interval.level;
  const greiner = res.method === 'kendall' ? ` (τ-b ${show(r)} is about r = ${show(rScale)} by Greiner's relation, sin(πτ/2))` : '';
  if (r === 0 || !clear) {
    lines.push(`No clear relationship between ${xName} and ${yName} in these ${res.n.toLocaleString('en-US')} rows.`);
    if (hasInterval) {
      lines.push(
        `The ${pct} interval, ${show(lower)} to ${show(upper)}, includes zero: the data cannot rule out a correlation as strong as ${show(Math.abs(lower))} (negative) or ${show(Math.abs(upper))} (positive).`,
      );
    }
  } else {
    lines.push(
      `${word[0].toUpperCase()}${word.slice(1)} ${r > 0 ? 'positive' : 'negative'} correlation by ${STRENGTH_CONVENTION}${greiner}: higher ${xName} tends to go with ${r > 0 ? 'higher' : 'lower'} ${yName}.`,
    );
    if (hasInterval) lines.push(`The ${pct} interval, ${show(lower)} to ${show(upper)}, holds the correlations these data are consistent with.`);
  }
  if (!hasInterval && res.interval.note) lines.push(`No interval: ${res.interval.note}.`);
  const p = res.pValue < 0.001 ? '< 0.001' : res.pValue.toFixed(3);
  lines.push(`p ${p.startsWith('<') ? p : `= ${p}`} is how often data at least this far from zero correlation would turn up if there were none; it is not the chance that there is none.`);
  return lines;
}
