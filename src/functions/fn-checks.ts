/**
 * Cell functions for the assumption checks of a correlation and the verdict built on them: the eight-row table
 * (CHECKS), the problems in one cell (FLAGS), whether the conclusion holds (SENSITIVITY) and the full report with
 * advice (REPORT). Thin adapter: read cells, call the core
 * (src/stats/checks), shape the answer. The check report is computed once per data and sheet position and shared
 * by every cell function on the same cells through the content cache (shared-pairs.ts). The panel builds its own
 * prepared pairs from what it reads through the Excel API and comes to the same core entry point
 * (src/stats/checks/checked.ts), but does not share this cache.
 */
import { assertWithinBudget } from '../stats/budget/call-budget';
import { coefficientSymbol, listWords } from '../stats/verdict/advice';
import { conclude } from '../stats/verdict/conclusion';
import { formatCorrelation, formatNumber, formatP } from '../stats/format';
import { CellRange, headerText } from '../sheet/cells';
import { pointNaming } from '../sheet/naming';
import { CheckReport } from '../stats/checks/check-report';
import { checksOf } from '../stats/checks/checked';
import { correlatePrepared } from '../stats/correlation/correlate';
import { Direction } from '../stats/checks/verdict';
import { PreparedPairs } from '../stats/correlation/prepared';
import { CLASSICAL_METHODS, Method, METHOD_LABELS } from '../stats/types';
import { optAlpha, optInterval, optLevel, optMethod } from './args';
import { cellValue, guard } from './errors';
import { PairedColumns, requirePairs } from './read';
import { sharedPairs } from './shared-pairs';

/** The significance level of the checks inside REPORT (the same default as CHECKS and FLAGS). */
const REPORT_CHECK_ALPHA = 0.05;

interface Checked {
  pairs: PairedColumns;
  prepared: PreparedPairs;
  report: CheckReport;
}

/** Reads the pairs and returns the (shared, memoised) check report for this data, alpha and sheet position. */
export function checkedPairs(x: CellRange, y: CellRange, alpha: number, xAddress?: string | null, beforeChecks?: (rows: number) => void): Checked {
  const { pairs, prepared } = sharedPairs(x, y);
  requirePairs(pairs, 3);
  beforeChecks?.(prepared.n);
  const naming = pointNaming(x, xAddress);
  const index = pairs.index;
  const report = checksOf(prepared, alpha, { key: naming.key, name: (i) => naming.name(index ? index[i] : i) });
  return { pairs, prepared, report };
}

/**
 * The problems in a few words each, then the slight departures, then how many checks could not see: never a bare
 * "no flags" when checks had too few rows or could not run.
 */
export function flagsText(report: CheckReport): string {
  const parts: string[] = [];
  parts.push(report.flags.length > 0 ? report.flags.join('; ') : 'no flags');
  if (report.minor.length > 0) parts.push(`slight: ${report.minor.join(', ')}`);
  const blind: string[] = [];
  if (report.tooFew > 0) blind.push(`${report.tooFew} check${report.tooFew === 1 ? '' : 's'} had too few rows to tell`);
  if (report.notTestable > 0) blind.push(`${report.notTestable} check${report.notTestable === 1 ? '' : 's'} not testable`);
  if (blind.length > 0) parts.push(`${report.flags.length === 0 && report.minor.length === 0 ? 'but ' : ''}${blind.join(', ')}`);
  return parts.join(report.flags.length === 0 && report.minor.length === 0 ? ', ' : '; ');
}

// The eight checks: normal shape of x, y and the residuals, a straight line, even spread, outliers, influential
// points, dependence on row order (see runChecks). The JSDoc description stays on one line: it is the tooltip.
/**
 * Checks the assumptions behind the correlation of x and y, one row per check: its test, how large the departure is, and what that does to the conclusion at this number of rows.
 * @customfunction CHECKS
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [alpha] Significance level of the tests, between 0 and 1; default 0.05.
 * @param invocation Supplied by Excel: where x is, so that points are named by their sheet row.
 * @returns A table with a header row and eight rows: check, test used, statistic, p-value, effect, verdict (fine, slight, problem, too few rows or not testable), what it means, and the rule the verdict applied.
 * @requiresParameterAddresses
 */
export function CHECKS(x: any[][], y: any[][], alpha?: number, invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => {
    const { report } = checkedPairs(x, y, optAlpha(alpha), invocation?.parameterAddresses?.[0]);
    const table: (string | number)[][] = [['Check', 'Test used', 'Statistic', 'p-value', 'Effect', 'Verdict', 'What it means', 'Judged by']];
    for (const row of report.checks) {
      table.push([row.label, row.test, cellValue(row.statistic), cellValue(row.pValue), row.effect?.text ?? '', row.verdict, row.meaning, row.threshold]);
    }
    return table;
  });
}

// Meant to sit beside a row of results; the same checks as CHECKS, shared through the cache.
/**
 * The assumption checks that found a problem, a few words each (e.g. "curved; outlier at row 12"), then slight departures and checks that had too few rows to tell.
 * @customfunction FLAGS
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [alpha] Significance level of the tests, between 0 and 1; default 0.05.
 * @param invocation Supplied by Excel: where x is, so that points are named by their sheet row.
 * @returns One cell of text.
 * @requiresParameterAddresses
 */
export function FLAGS(x: any[][], y: any[][], alpha?: number, invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => [[flagsText(checkedPairs(x, y, optAlpha(alpha), invocation?.parameterAddresses?.[0]).report)]]);
}

/** A value in the data's units, or words when the units of x and y are so far apart that it leaves the range of
 * numbers (the checks, being free of units, are unaffected). */
function inUnits(v: number): number | string {
  return Number.isFinite(v) ? v : 'too large to show in these units (x and y differ in scale by more than 1e300)';
}

const DIRECTION_TEXT: Record<Direction, string> = {
  positive: 'positive correlation',
  negative: 'negative correlation',
  none: 'no clear correlation',
};

/** The names of pairs for the verdict's sentences, by their sheet position. */
function pairNames(x: CellRange, pairs: PairedColumns, xAddress?: string | null): (i: number) => string {
  const naming = pointNaming(x, xAddress);
  const index = pairs.index;
  return (i) => naming.name(index ? index[i] : i);
}

/**
 * Whether the conclusion about x and y holds under each reasonable alternative: a rank coefficient, without the most influential row, without the flagged rows, and with the effective number of rows when neighbouring rows are alike; with a one-line summary.
 * @customfunction SENSITIVITY
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [level] Confidence level of the intervals, between 0 and 1; default 0.95 (95%).
 * @param [method] The coefficient the conclusion is about: "pearson" (default, straight line), "spearman" (rank order), "kendall" (rank agreement); resisting outliers: "percentage_bend", "winsorized", "biweight" or "skipped" (sets outlying rows aside); for rating-scale items: "polychoric" (both columns) or "polyserial" (one column).
 * @param invocation Supplied by Excel: where x is, so that rows are named by their sheet row.
 * @returns A table: a header row, one row per alternative (what was done, coefficient, lower, upper, p-value, rows, conclusion, whether it holds), and a last row with the summary. A cell takes up to 560,000 rows (the panel any number).
 * @requiresParameterAddresses
 */
export function SENSITIVITY(x: any[][], y: any[][], level?: number, method?: string, invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => {
    const lvl = optLevel(level);
    const m = optMethod(method);
    const address = invocation?.parameterAddresses?.[0];
    const { pairs, prepared, report } = checkedPairs(x, y, 1 - lvl, address, (n) => assertWithinBudget('sensitivity', m, n, n));
    const c = conclude(prepared, report, { method: m, level: lvl, name: pairNames(x, pairs, address) });
    const table: (string | number)[][] = [['Alternative', 'Coefficient', 'Lower', 'Upper', 'p-value', 'Rows', 'Conclusion', 'Holds']];
    for (const r of c.sensitivity.rows) {
      table.push([r.scenario === 'as computed' ? `as computed (${r.label})` : r.scenario === 'rank coefficient' ? `rank coefficient (${r.label})` : r.label,
        r.statistic, cellValue(r.lower), cellValue(r.upper), r.pValue, r.n, DIRECTION_TEXT[r.direction], r.holds ? 'yes' : 'no']);
    }
    table.push(['Summary', c.sensitivity.line, '', '', '', '', c.sensitivity.summary, '']);
    return table;
  });
}

// Rows: pairs used and skipped, the coefficient with its interval and p-value, r², the line, the other coefficients
// alongside, the verdict (does the conclusion hold), the checks (alpha = 1 - level), a recommended coefficient with
// its remedy, the evidence for no correlation when the interval includes zero, and a plain reading.
/**
 * A full report on the correlation of x and y: the numbers, whether the conclusion holds, the assumption checks, a recommendation and a reading.
 * @customfunction REPORT
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [level] Confidence level of the interval, between 0 and 1; default 0.95 (95%).
 * @param [method] "pearson" (default, straight line), "spearman" (rank order), "kendall" (rank agreement); resisting outliers: "percentage_bend", "winsorized", "biweight" or "skipped" (sets outlying rows aside); for rating-scale items: "polychoric" (both columns) or "polyserial" (one column).
 * @param [interval] How the interval is made: "fisher" (default for Pearson, Spearman and Kendall), "bca" (bias-corrected and accelerated bootstrap) or "percentile" (percentile bootstrap, the default for the outlier-resisting coefficients).
 * @param [x_name] A name for x in the reading, for example its header (default: the first cell of x when it is text, else "x").
 * @param [y_name] A name for y in the reading (default: the first cell of y when it is text, else "y").
 * @param invocation Supplied by Excel: where x is, so that points are named by their sheet row.
 * @returns A two-column table: what is reported, and its value. A cell takes up to 600,000 rows (the panel any number).
 * @requiresParameterAddresses
 */
export function REPORT(x: any[][], y: any[][], level?: number, method?: string, interval?: string, x_name?: string, y_name?: string, invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => {
    const lvl = optLevel(level);
    const m = optMethod(method);
    const iv = optInterval(interval);
    const address = invocation?.parameterAddresses?.[0];
    const { pairs, prepared, report } = checkedPairs(x, y, REPORT_CHECK_ALPHA, address, (n) => assertWithinBudget('report', m, n, n));
    const names = pairNames(x, pairs, address);
    // The reading names the columns by their headers when the ranges start with one (as the report sheet's do).
    const xn = headerText(x_name)?.trim() ?? headerText(x?.[0]?.[0]) ?? 'x';
    const yn = headerText(y_name)?.trim() ?? headerText(y?.[0]?.[0]) ?? 'y';
    const columns = { x: xn, y: yn };
    const c = conclude(prepared, report, { method: m, level: lvl, name: names, interval: iv, columns });
    const result = c.correlation;
    const opts = (mm: Method) => ({ method: mm, tail: 'both' as const, level: lvl, interval: 'none' as const });
    const pearsonR = m === 'pearson' ? result.statistic : correlatePrepared(prepared, opts('pearson')).statistic;
    const pct = `${Number((lvl * 100).toPrecision(4))}%`;
    const sym = coefficientSymbol(result);
    const noInterval = result.interval.note ?? `needs at least ${m === 'kendall' ? 5 : 4} pairs`;
    const skippedRows = result.skippedRows ?? [];
    const rows: (string | number)[][] = [
      ['Pairs used', pairs.x.length],
      ['Pairs skipped (blank, text or TRUE/FALSE)', pairs.skipped],
      ['Coefficient', result.name],
      [sym, result.statistic],
      [`${pct} interval, lower`, Number.isFinite(result.interval.lower) ? result.interval.lower : noInterval],
      [`${pct} interval, upper`, Number.isFinite(result.interval.upper) ? result.interval.upper : noInterval],
      ['Interval method', result.interval.method],
      [`p-value (two-sided, ${result.pMethod})`, result.pValue],
      ['r² (Pearson: share of the variation in y the line accounts for)', pearsonR * pearsonR],
      ['Slope of the line (change in y per unit of x)', inUnits(report.line.slope)],
      ['Intercept of the line (y where x = 0)', inUnits(report.line.intercept)],
    ];
    if (result.method === 'skipped') {
      rows.push([`Rows set aside as outliers (${skippedRows.length})`, skippedRows.length === 0 ? 'none' : listWords(skippedRows.map(names))]);
    }
    for (const other of CLASSICAL_METHODS) {
      if (other !== m) rows.push([`${METHOD_LABELS[other].name} ${METHOD_LABELS[other].symbol} alongside`, correlatePrepared(prepared, opts(other)).statistic]);
    }
    const robustRow = c.sensitivity.rows.find((r) => r.scenario === 'robust coefficient');
    if (robustRow) rows.push([`Percentage bend r_pb alongside (resists outliers; ${formatP(robustRow.pValue)})`, robustRow.statistic]);
    rows.push(['Does the conclusion hold?', c.sensitivity.line]);
    for (const r of c.sensitivity.rows.slice(1)) {
      rows.push([`Conclusion ${r.scenario === 'rank coefficient' ? `with ${r.label}` : r.label}`,
        `${DIRECTION_TEXT[r.direction]} (${formatCorrelation(r.statistic)}${Number.isFinite(r.lower) ? `; ${pct} ${formatCorrelation(r.lower)} to ${formatCorrelation(r.upper)}` : ''}; ${formatP(r.pValue)})`]);
    }
    rows.push(
      ['Flags (assumption checks, alpha 0.05)', flagsText(report)],
      ['Recommended coefficient', c.recommendation.name === 'none' ? (c.recommendation.remedy === 'each-side' ? 'none: report each side of the turn' : 'none is reliable on these data') : c.recommendation.name],
      ['Why', c.recommendation.reason],
    );
    if (c.equivalence) {
      const e = c.equivalence;
      rows.push([`Within ±${e.bound}? (equivalence test, ${Number((100 * (1 - 2 * e.alpha)).toPrecision(4))}% interval ${formatNumber(e.interval.lower)} to ${formatNumber(e.interval.upper)})`,
        e.negligible ? `yes: ${c.sensitivity.direction === 'none' ? 'the correlation is negligible' : 'real but negligible'} (${formatP(e.pValue)})` : `not shown (${formatP(e.pValue)}): correlations beyond ±${e.bound} cannot be ruled out`]);
    }
    if (c.bayes) {
      rows.push(['Bayes factor for no correlation, BF01 (Pearson, uniform prior on rho)', Number.isFinite(c.bayes.bf01) ? c.bayes.bf01 : 'beyond 1e308']);
      rows.push(['Probability of a correlation given the data (even prior odds; not a p-value)', c.bayes.posteriorProbability]);
    }
    if (c.detectable !== null) rows.push([`Smallest correlation ${pairs.x.length} rows detect 8 times in 10 (alpha ${Number((1 - lvl).toPrecision(4))}, two-sided)`, c.detectable]);
    rows.push(['Reading', c.reading]);
    return rows;
  });
}
