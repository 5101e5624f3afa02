/**
 * Cell functions that compare two correlations, correlate two columns while holding others fixed, and lay out
 * many correlations at once. Thin adapter: read cells, call the core, shape the answer.
 */
import { compareIndependent, compareIndependentSamples } from '../stats/compare/independent';
import { compareSeparateSamples } from '../stats/compare/separate';
import { compareSharedSamples } from '../stats/compare/shared';
import { ComparisonResult, requireRows } from '../stats/compare/comparison';
import { assertMatrixFits, correlationMatrix, MATRIX_LIMITS, MATRIX_SHOWS, MatrixShow } from '../stats/compare/matrix';
import { partialCorrelation } from '../stats/compare/partial';
import { CellRange, filledRowCount, rangeShape, readHeaderRow } from '../sheet/cells';
import { Method, StatsInputError } from '../stats/types';
import { assertWithinBudget } from '../stats/budget/call-budget';
import { optClassicalMethod, optFlag, optLevel, optMethod, optTail, optionWord, requiredNumber } from './args';
import { guard } from './errors';
import { readAlignedVectors, readBlock, readPairs, readWithControls } from './read';

/** One row: r1 - r2, lower, upper, p. */
function comparisonRow(res: ComparisonResult): number[][] {
  return [[res.statistic, res.interval.lower, res.interval.upper, res.pValue]];
}

function options(level: unknown, tail: unknown, method: unknown = null): { level: number; tail: ReturnType<typeof optTail>; method: Method } {
  return { level: optLevel(level), tail: optTail(tail), method: optMethod(method) };
}

/**
 * Compares the correlation between two columns in one group with the same correlation in another group made of different people or rows (for example this region against that region). Answers whether the link is stronger in one group than in the other.
 * @customfunction DIFF_GROUPS
 * @param x1 First column (or row) of numbers in the first group.
 * @param y1 Second column (or row) of the first group, the same size as x1.
 * @param x2 First column (or row) of numbers in the second group, the same measure as x1.
 * @param y2 Second column (or row) of the second group, the same size as x2.
 * @param [level] Confidence level between 0 and 1, default 0.95 (95%).
 * @param [tail] "both" (default: any difference), "positive" (only a stronger correlation in the first group counts) or "negative" (only a weaker one).
 * @param [method] The coefficient compared: "pearson" (default), "spearman" or "kendall", or one that resists outliers, "percentage_bend", "winsorized", "biweight" or "skipped" (compared by a bootstrap of the rows, seeded from the data so the same cells give the same answer); a cell takes up to 700,000 rows in the two groups by these, any number by "pearson").
 * @returns {any[][]} One row of four cells: the first group's correlation minus the second's, the lower and upper ends of its confidence interval, and the p-value.
 */
export function DIFF_GROUPS(x1: any[][], y1: any[][], x2: any[][], y2: any[][], level?: number, tail?: string, method?: string): any[][] {
  return guard(() => {
    const opts = options(level, tail, method);
    const g1 = readPairs(x1, y1, 'x1', 'y1');
    const g2 = readPairs(x2, y2, 'x2', 'y2');
    requireRows(g1.x.length, 'the first group');
    requireRows(g2.x.length, 'the second group');
    assertWithinBudget('comparison', opts.method, g1.x.length + g2.x.length, g1.x.length + g2.x.length);
    return comparisonRow(compareIndependentSamples(g1.x, g1.y, g2.x, g2.y, opts));
  });
}

/**
 * Compares two correlations that share one column, measured on the same rows: is "common" more closely linked to "a" than to "b"? For example, does tenure predict performance better than the test score does (performance is the common column).
 * @customfunction DIFF_SHARED
 * @param common The column both correlations share, for example performance.
 * @param a The first column to correlate with common, the same size as common.
 * @param b The second column to correlate with common, the same size as common.
 * @param [level] Confidence level between 0 and 1, default 0.95 (95%).
 * @param [tail] "both" (default: any difference), "positive" (only a stronger link of common with a counts) or "negative" (only a stronger link with b).
 * @param [method] The coefficient compared: "pearson" (default), "spearman" or "kendall", or one that resists outliers, "percentage_bend", "winsorized", "biweight" or "skipped" (compared by a bootstrap of the rows, seeded from the data so the same cells give the same answer); a cell takes up to 350,000 rows by these, any number by "pearson").
 * @returns {any[][]} One row of four cells: correlation(common, a) minus correlation(common, b), the lower and upper ends of its confidence interval, and the p-value. Rows missing a number in any of the three columns are skipped.
 */
export function DIFF_SHARED(common: any[][], a: any[][], b: any[][], level?: number, tail?: string, method?: string): any[][] {
  return guard(() => {
    const opts = options(level, tail, method);
    const [c, u, v] = readAlignedVectors([common, a, b], ['common', 'a', 'b']);
    requireRows(c.length, 'the data');
    assertWithinBudget('comparison', opts.method, 2 * c.length, c.length);
    return comparisonRow(compareSharedSamples(c, u, v, opts));
  });
}

/**
 * Compares two correlations between four different columns measured on the same rows: is a more closely linked to b than c is to d? For example, this year's sales against visits compared with this year's returns against complaints, in the same stores.
 * @customfunction DIFF_SEPARATE
 * @param a First column of the first pair.
 * @param b Second column of the first pair, the same size as a.
 * @param c First column of the second pair, the same size as a.
 * @param d Second column of the second pair, the same size as a.
 * @param [level] Confidence level between 0 and 1, default 0.95 (95%).
 * @param [tail] "both" (default: any difference), "positive" (only a stronger a-b link counts) or "negative" (only a stronger c-d link).
 * @param [method] The coefficient compared: "pearson" (default), "spearman" or "kendall", or one that resists outliers, "percentage_bend", "winsorized", "biweight" or "skipped" (compared by a bootstrap of the rows, seeded from the data so the same cells give the same answer); a cell takes up to 350,000 rows by these, any number by "pearson").
 * @returns {any[][]} One row of four cells: correlation(a, b) minus correlation(c, d), the lower and upper ends of its confidence interval, and the p-value. Rows missing a number in any of the four columns are skipped.
 */
export function DIFF_SEPARATE(a: any[][], b: any[][], c: any[][], d: any[][], level?: number, tail?: string, method?: string): any[][] {
  return guard(() => {
    const opts = options(level, tail, method);
    const [p, q, s, t] = readAlignedVectors([a, b, c, d], ['a', 'b', 'c', 'd']);
    requireRows(p.length, 'the data');
    assertWithinBudget('comparison', opts.method, 2 * p.length, p.length);
    return comparisonRow(compareSeparateSamples(p, q, s, t, opts));
  });
}

/**
 * Compares two correlations reported elsewhere (a paper, a slide, last year's report) for two separate groups of different people or rows, from just each correlation and its number of rows.
 * @customfunction DIFF_REPORTED
 * @param r1 The first group's correlation, strictly between -1 and 1.
 * @param n1 The number of rows behind r1, a whole number of at least 4.
 * @param r2 The second group's correlation, strictly between -1 and 1.
 * @param n2 The number of rows behind r2, a whole number of at least 4.
 * @param [level] Confidence level between 0 and 1, default 0.95 (95%).
 * @param [tail] "both" (default: any difference), "positive" (only r1 larger counts) or "negative" (only r1 smaller).
 * @param [method] The coefficient both were reported as: "pearson" (default), "spearman" (Bonett and Wright standard error) or "kendall" (Fieller, Hartley and Pearson standard error).
 * @returns {any[][]} One row of four cells: r1 minus r2, the lower and upper ends of its confidence interval, and the p-value.
 */
export function DIFF_REPORTED(r1: number, n1: number, r2: number, n2: number, level?: number, tail?: string, method?: string): any[][] {
  return guard(() => {
    const opts = { ...options(level, tail), method: optClassicalMethod(method) };
    return comparisonRow(
      compareIndependent(requiredNumber(r1, 'r1'), requiredNumber(n1, 'n1'), requiredNumber(r2, 'r2'), requiredNumber(n2, 'n2'), opts),
    );
  });
}

/**
 * The correlation between two columns once one or more other columns are held fixed: does the link survive when, say, seniority is taken into account? Each control's straight-line influence is removed from both columns before they are correlated.
 * @customfunction PARTIAL
 * @param x First column (or row) of numbers.
 * @param y Second column (or row) of numbers, the same size as x.
 * @param controls One or more columns to hold fixed, side by side, with exactly as many rows as x (if x is a row: one or more rows as long as x). A cell takes up to 650,000 rows with three controls, any number with one.
 * @param [level] Confidence level between 0 and 1, default 0.95 (95%).
 * @param [tail] "both" (default: any correlation), "positive" (only a positive one counts) or "negative".
 * @returns {any[][]} One row of four cells: the partial correlation, the lower and upper ends of its confidence interval, and the p-value. Rows missing a number in x, y or any control are skipped.
 */
export function PARTIAL(x: any[][], y: any[][], controls: any[][], level?: number, tail?: string): any[][] {
  return guard(() => {
    const opts = options(level, tail);
    const data = readWithControls(x, y, controls);
    const columns = 2 + data.controls.length;
    assertWithinBudget('partial', 'pearson', columns * data.x.length, data.x.length);
    const res = partialCorrelation(data.x, data.y, data.controls, opts);
    return [[res.statistic, res.interval.lower, res.interval.upper, res.pValue]];
  });
}

/**
 * The correlations between every pair of columns in a block of data, laid out as a table with one row and one column per data column; for many columns at once, with p-values adjusted for testing them all. Each pair uses the rows where both columns hold numbers.
 * @customfunction MATRIX
 * @param data A block of two or more columns of numbers side by side, one column per measure (at most 200 columns; fewer when there are many rows).
 * @param [method] "pearson" (default, straight-line association), "spearman" (rank order), "kendall" (rank agreement); resisting outliers: "percentage_bend", "winsorized", "biweight" or "skipped"; for rating-scale items "polychoric" or "polyserial".
 * @param [show] What each cell shows: "coef" (default: the correlation), "pvalue" (its p-value, two-sided), "pvalue_holm" (p-value adjusted by Holm's method, which guards against any false alarm among all the pairs), "pvalue_fdr" (adjusted by Benjamini and Hochberg's method, which keeps the share of false alarms low) or "pairs" (the rows used).
 * @param [headers] TRUE if the first row of data holds column names: the answer then carries them along its top and left side. Default FALSE.
 * @returns {any[][]} A square table. The diagonal (each column with itself) shows 1 for "coef", the count of numbers in that column for "pairs", and an empty cell for the p-values, since a column is not tested against itself.
 */
export function MATRIX(data: any[][], method?: string, show?: string, headers?: boolean): any[][] {
  return guard(() => {
    const m = optMethod(method);
    const what: MatrixShow = optionWord(show, MATRIX_SHOWS, 'coef', 'show');
    const hasHeaders = optFlag(headers, 'headers');
    // Refuse an oversized request from its dimensions alone, before reading any cell.
    const { rows, cols } = rangeShape(data as CellRange, 'data');
    if (cols < 2) throw new StatsInputError('too-few', 'data must hold at least 2 columns side by side');
    const skip = hasHeaders ? 1 : 0;
    // Judged first from the range's size alone; a request that looks too large is judged again by its filled
    // rows, found from the bottom up, so a whole-column reference counts the data it holds (a full block costs
    // one cell read to find that out).
    let dataRows = rows - skip;
    try {
      assertMatrixFits(cols, dataRows, m);
    } catch (e) {
      if (!(e instanceof StatsInputError) || cols > MATRIX_LIMITS.maxColumns) throw e;
      dataRows = filledRowCount(data as CellRange, skip);
      if (dataRows === rows - skip) throw e;
      assertMatrixFits(cols, dataRows, m);
    }
    const names = hasHeaders ? readHeaderRow(data, 'data') : undefined;
    const columns = readBlock(dataRows + skip < rows ? data.slice(0, dataRows + skip) : data, 'data', skip);
    const res = correlationMatrix(columns, m, names);
    const k = res.k;
    const source = what === 'coef' ? res.coef : what === 'pvalue' ? res.pValue : what === 'pvalue_holm' ? res.pHolm : what === 'pvalue_fdr' ? res.pFdr : res.pairs;
    const out: any[][] = [];
    if (hasHeaders) out.push(['', ...res.names]);
    for (let i = 0; i < k; i++) {
      const row: any[] = hasHeaders ? [res.names[i]] : [];
      for (let j = 0; j < k; j++) {
        const v = source[i * k + j];
        row.push(v === v ? v : ''); // NaN marks the p-value diagonal: an empty-looking cell, never null (shows as 0)
      }
      out.push(row);
    }
    return out;
  });
}
