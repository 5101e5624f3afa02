/**
 * The time budget of a cell function, for the calls whose cost at sheet scale can pass it.
 *
 * Why: a cell function runs on the workbook's calculation thread. Desktop Excel restarts an add-in that stays
 * unresponsive for about 5 s, taking every function of the workbook with it, so each call must answer within
 * CALL_BUDGET_MS or refuse before the costly work, saying how many rows would fit and what to use instead.
 *
 * The costs are microseconds per row of a cold call on host arrays built afresh (what Excel passes), slowest
 * option, measured at 1,000,000 rows on the two-core bench machine by test/unit/properties/support/
 * time-budget-child.js (docs/performance.md keeps the figures): the rank and robust comparisons 1.6-2.4 s for
 * two coefficients, SENSITIVITY 1.5 s, REPORT 1.4 s, PARTIAL with three controls 0.6-1.3 s. Most of it is the work itself (sorts, selections,
 * resamples); a fifth to a third is the full garbage collections that the host's million one-cell arrays make
 * expensive. Every other function answers within the budget at 1,000,000 rows and is not listed.
 */
import { METHOD_LABELS, Method, StatsInputError } from '../types';

export const CALL_BUDGET_MS = 1000;
/** The share of the budget a prediction may use: the rest covers a slower machine or a busy moment. */
const MARGIN = 0.85;
/** What a predicted time may reach (MATRIX's cost model uses it too). */
export const PREDICTION_BUDGET_MS = CALL_BUDGET_MS * MARGIN;

export type BudgetedCall = 'comparison' | 'sensitivity' | 'report' | 'partial';

/** Microseconds per row and coefficient for a comparison by a rank or robust coefficient (Pearson is far below). */
const COMPARISON_US = 1.2;
const SENSITIVITY_US = 1.5;
const REPORT_US = 1.4;
/** Per row and column read (x, y and each control): 0.6-1.3 s for five columns at 1,000,000 rows, first call. */
const PARTIAL_US = 0.26;

function usPerRow(call: BudgetedCall, method: Method): number {
  if (call === 'comparison') return method === 'pearson' ? 0 : COMPARISON_US;
  if (call === 'partial') return PARTIAL_US;
  return call === 'sensitivity' ? SENSITIVITY_US : REPORT_US;
}

/** The most rows (a round figure) that `call` handles within the budget, or Infinity when its cost is negligible. */
export function rowsWithinBudget(call: BudgetedCall, method: Method): number {
  const us = usPerRow(call, method);
  if (us === 0) return Infinity;
  return Math.floor((PREDICTION_BUDGET_MS * 1000) / us / 10000) * 10000;
}

const fmt = (n: number) => n.toLocaleString('en-US');

/**
 * Refuses, before the costly work, a call whose predicted time passes the budget.
 * @param rows the rows the work runs over: for a comparison, the rows of each coefficient added up (two
 *   coefficients on the same n rows count 2n; two groups count n1 + n2).
 * @param shownRows the rows to name in the message (n, or n1 + n2).
 * @throws StatsInputError('too-large') saying how many rows fit and what to use instead.
 */
export function assertWithinBudget(call: BudgetedCall, method: Method, rows: number, shownRows: number): void {
  const us = usPerRow(call, method);
  const ms = (us * rows) / 1000;
  if (ms <= PREDICTION_BUDGET_MS) return;
  const perShown = rows / shownRows;
  const fit = Math.floor(rowsWithinBudget(call, method) / perShown / 10000) * 10000;
  const seconds = ms >= 10000 ? Math.round(ms / 1000).toString() : (ms / 1000).toFixed(1);
  const what =
    call === 'comparison'
      ? `comparing two ${METHOD_LABELS[method].name} correlations`
      : call === 'partial'
        ? `a partial correlation with ${Math.round(perShown) - 2} control column${Math.round(perShown) - 2 === 1 ? '' : 's'}`
        : call === 'sensitivity'
        ? 'the sensitivity table (every alternative coefficient, with and without the influential and flagged rows)'
        : 'the full report (the checks, the alternatives and the verdict)';
  const instead =
    call === 'comparison'
      ? 'compare by "pearson" (fast at any length)'
      : call === 'partial'
        ? 'fewer control columns'
        : 'use COEF, INTERVAL and CHECKS, which answer at this length';
  throw new StatsInputError(
    'too-large',
    `${what} on ${fmt(shownRows)} rows would take about ${seconds} s, more than a cell function may take ` +
      `(${CALL_BUDGET_MS / 1000} s, so the workbook is not held up): up to ${fmt(fit)} rows fit. ` +
      `Use a shorter range (a random sample of the rows), ${instead}, or the Covary panel, which reads and ` +
      'computes any length in the background',
  );
}
