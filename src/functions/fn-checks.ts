/**
 * Cell functions for the assumption checks of a correlation: the eight-row table (CHECKS), the raised flags in one
 * cell (FLAGS) and the full report with advice (REPORT). Thin adapter: read cells, call the core
 * (src/stats/checks), shape the answer. The check report is computed once per data and sheet position and shared
 * by every cell function on the same cells through the content cache (shared-pairs.ts). The panel builds its own
 * prepared pairs from what it reads through the Excel API and comes to the same core entry point
 * (src/stats/checks/checked.ts), but does not share this cache.
 */
import { recommendCoefficient, plainReading, coefficientSymbol } from '../stats/checks/advice';
import { CellRange } from '../sheet/cells';
import { pointNaming } from '../sheet/naming';
import { CheckReport } from '../stats/checks/check-report';
import { checksOf } from '../stats/checks/checked';
import { correlatePrepared } from '../stats/correlation/correlate';
import { PreparedPairs } from '../stats/correlation/prepared';
import { Method, METHOD_LABELS, METHODS } from '../stats/types';
import { optAlpha, optLevel, optMethod } from './args';
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
export function checkedPairs(x: CellRange, y: CellRange, alpha: number, xAddress?: string | null): Checked {
  const { pairs, prepared } = sharedPairs(x, y);
  requirePairs(pairs, 3);
  const naming = pointNaming(x, xAddress);
  const index = pairs.index;
  const report = checksOf(prepared, alpha, { key: naming.key, name: (i) => naming.name(index ? index[i] : i) });
  return { pairs, prepared, report };
}

/** The flags in a few words each, or a plain none; untestable checks are counted so "no flags" is not overread. */
export function flagsText(report: CheckReport): string {
  const untested = report.notTestable > 0 ? `${report.notTestable} check${report.notTestable === 1 ? '' : 's'} not testable` : '';
  if (report.flags.length === 0) return untested ? `no flags (${untested})` : 'no flags';
  return untested ? `${report.flags.join('; ')}; ${untested}` : report.flags.join('; ');
}

// The eight checks: normal shape of x, y and the residuals, a straight line, even spread, outliers, influential
// points, dependence on row order (see runChecks). The JSDoc description stays on one line: it is the tooltip.
/**
 * Checks the assumptions behind the correlation of x and y, one row per check with its test, result and meaning.
 * @customfunction CHECKS
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [alpha] Significance level for raising a flag, between 0 and 1; default 0.05.
 * @param invocation Supplied by Excel: where x is, so that points are named by their sheet row.
 * @returns A table with a header row and eight rows: check, test used, statistic, p-value, verdict (ok, flag or not testable), what it means.
 * @requiresParameterAddresses
 */
export function CHECKS(x: any[][], y: any[][], alpha?: number, invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => {
    const { report } = checkedPairs(x, y, optAlpha(alpha), invocation?.parameterAddresses?.[0]);
    const table: (string | number)[][] = [['Check', 'Test used', 'Statistic', 'p-value', 'Verdict', 'What it means']];
    for (const row of report.checks) {
      table.push([row.label, row.test, cellValue(row.statistic), cellValue(row.pValue), row.verdict, row.meaning]);
    }
    return table;
  });
}

// Meant to sit beside a row of results; the same checks as CHECKS, shared through the cache.
/**
 * The assumption checks that raised a flag, a few words each (e.g. "curved; outlier at row 12"), or "no flags".
 * @customfunction FLAGS
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [alpha] Significance level for raising a flag, between 0 and 1; default 0.05.
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

// Rows: pairs used and skipped, the coefficient with its interval and p-value, r², the line, the other coefficients
// alongside, the flags of the checks (alpha 0.05), a recommended coefficient with its reason, a plain reading.
/**
 * A full report on the correlation of x and y: the numbers, the assumption checks, a recommendation and a reading.
 * @customfunction REPORT
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param [level] Confidence level of the interval, between 0 and 1; default 0.95 (95%).
 * @param [method] "pearson" (default), "spearman" or "kendall".
 * @param invocation Supplied by Excel: where x is, so that points are named by their sheet row.
 * @returns A two-column table: what is reported, and its value.
 * @requiresParameterAddresses
 */
export function REPORT(x: any[][], y: any[][], level?: number, method?: string, invocation?: CustomFunctions.Invocation): any[][] {
  return guard(() => {
    const lvl = optLevel(level);
    const m = optMethod(method);
    const { pairs, prepared, report } = checkedPairs(x, y, REPORT_CHECK_ALPHA, invocation?.parameterAddresses?.[0]);
    const opts = (mm: Method) => ({ method: mm, tail: 'both' as const, level: lvl });
    const result = correlatePrepared(prepared, opts(m));
    const pearsonR = m === 'pearson' ? result.statistic : correlatePrepared(prepared, opts('pearson')).statistic;
    const pct = `${Number((lvl * 100).toPrecision(4))}%`;
    const sym = coefficientSymbol(result);
    const noInterval = `needs at least ${m === 'kendall' ? 5 : 4} pairs`;
    const rows: (string | number)[][] = [
      ['Pairs used', pairs.x.length],
      ['Pairs skipped (blank, text or TRUE/FALSE)', pairs.skipped],
      ['Coefficient', result.name],
      [sym, result.statistic],
      [`${pct} interval, lower`, Number.isFinite(result.interval.lower) ? result.interval.lower : noInterval],
      [`${pct} interval, upper`, Number.isFinite(result.interval.upper) ? result.interval.upper : noInterval],
      [`p-value (two-sided, ${result.pMethod})`, result.pValue],
      ['r² (Pearson: share of the variation in y the line accounts for)', pearsonR * pearsonR],
      ['Slope of the line (change in y per unit of x)', inUnits(report.line.slope)],
      ['Intercept of the line (y where x = 0)', inUnits(report.line.intercept)],
    ];
    for (const other of METHODS) {
      if (other !== m) rows.push([`${METHOD_LABELS[other].name} ${METHOD_LABELS[other].symbol} alongside`, correlatePrepared(prepared, opts(other)).statistic]);
    }
    const rec = recommendCoefficient(report, result);
    rows.push(
      ['Flags (assumption checks, alpha 0.05)', flagsText(report)],
      ['Recommended coefficient', rec.name === 'none' ? 'none is reliable on these data' : rec.name],
      ['Why', rec.reason],
      ['Reading', plainReading(result, report, 1 - lvl)],
    );
    return rows;
  });
}
