/**
 * Cell function for the residuals of the least-squares straight line, one row per pair, so a sheet can plot
 * them (against the fitted values, or in row order) with charts that stay live. Thin adapter: read cells, call
 * the core (src/stats/correlation/residuals.ts), shape the answer.
 *
 * Size: the answer is three cells per pair used, each computed in one pass; the time at 1,000,000 rows is within
 * the call budget (docs/performance.md), so it is not listed in src/stats/budget/call-budget.ts.
 */
import { CellRange } from '../sheet/cells';
import { pointNumbering } from '../sheet/naming';
import { lineResiduals } from '../stats/correlation/residuals';
import { guard } from './errors';
import { requirePairs } from './read';
import { sharedPairs } from './shared-pairs';

/** The spilled block: [where the pair sits, fitted value, residual] per pair used, in sheet order. */
export function residualRows(x: CellRange, y: CellRange, xAddress?: string | null): number[][] {
  const { pairs } = sharedPairs(x, y);
  requirePairs(pairs, 3);
  const fit = lineResiduals(pairs.x, pairs.y);
  const at = pointNumbering(x, xAddress).number;
  const index = pairs.index;
  const out: number[][] = new Array(fit.n);
  for (let i = 0; i < fit.n; i++) out[i] = [at(index ? index[i] : i), fit.fitted[i], fit.residuals[i]];
  return out;
}

// The JSDoc description stays on one line: it is the tooltip.
/**
 * The residuals of the least-squares straight line of y on x, one row per pair used, for plotting against the fitted values or in row order: the pair's sheet row (its position in x where Excel gives no address), the fitted value, the residual.
 * @customfunction RESIDUALS
 * @param x First column (or row) of numbers: the line's x.
 * @param y Second column (or row) of numbers, the same size as x: the values the line predicts.
 * @param invocation Supplied by Excel: where x is, so that each pair is given its sheet row.
 * @returns One row per pair used (rows where either cell is blank, text or TRUE/FALSE are skipped), three columns: the sheet row of the pair (its sheet column number when x is a row, and its position in x, 1 for the first cell, when Excel gives no address), the fitted value a + b·x, and the residual y − (a + b·x).
 * @requiresParameterAddresses
 */
export function RESIDUALS(x: any[][], y: any[][], invocation?: CustomFunctions.Invocation): number[][] {
  return guard(() => residualRows(x, y, invocation?.parameterAddresses?.[0]));
}
