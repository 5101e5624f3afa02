/**
 * Does the relationship turn back? When the straight-line check finds a curve that matters (f² at least Cohen's
 * medium) and the least-squares parabola turns inside the data, the rows on each side of the turn are correlated
 * separately. The relationship turns back when both sides hold enough rows and show clear correlations of
 * opposite sign: y rises and then falls (or the reverse), which no single coefficient, Pearson's or a rank one,
 * describes; each averages the two sides into a number that fits neither (Anscombe 1973, "Graphs in statistical
 * analysis", The American Statistician 27:17-21, shows the parabola with the same r as a straight line).
 */
import type { CheckReport } from '../checks/check-report';
import { directionOf } from '../checks/verdict';
import { correlate } from '../correlation/correlate';
import { PreparedPairs } from '../correlation/prepared';
import { CorrelationResult } from '../types';

/** Each side of the turn needs at least this many rows, and at least TURN_SIDE_SHARE of them. */
export const TURN_SIDE_MIN = 5;
export const TURN_SIDE_SHARE = 0.1;

export interface Turn {
  /** The x at which the fitted parabola turns, in x's units. */
  at: number;
  /** "peak": y rises, then falls; "trough": y falls, then rises. */
  shape: 'peak' | 'trough';
  /** Pearson's r, its interval and p on the rows with x at or below the turn, and on those above it. */
  below: CorrelationResult;
  above: CorrelationResult;
  /** The rows run in x's order (x never falls, or never rises, down the rows): a curve then makes neighbouring
   *  rows' residuals alike, so a row-order flag can be the curve's doing. */
  xInRowOrder: boolean;
}

/**
 * The turn of the relationship, or null when the curve does not turn back within the data (no curve that
 * matters, a turn outside x's range, a side with too few rows, or a side without a clear correlation of the
 * opposite sign at the interval's level).
 * @example turnOf(prepared, report, 0.95)?.at // e.g. 25.3 for y = 50 + 4x - 0.08x^2 + noise on 0 <= x <= 40
 */
export function turnOf(prepared: PreparedPairs, report: CheckReport, level: number): Turn | null {
  const row = report.checks.find((c) => c.key === 'straight-line');
  const at = row?.verdict === 'problem' ? row.detail.turnAt : undefined;
  if (at === undefined || !Number.isFinite(at)) return null;
  const { x, y, n } = prepared;
  let below = 0;
  for (let i = 0; i < n; i++) if (x[i] <= at) below++;
  const least = Math.max(TURN_SIDE_MIN, Math.ceil(TURN_SIDE_SHARE * n));
  if (below < least || n - below < least) return null;
  const xb = new Float64Array(below), yb = new Float64Array(below);
  const xa = new Float64Array(n - below), ya = new Float64Array(n - below);
  for (let i = 0, b = 0, a = 0; i < n; i++) {
    if (x[i] <= at) {
      xb[b] = x[i];
      yb[b++] = y[i];
    } else {
      xa[a] = x[i];
      ya[a++] = y[i];
    }
  }
  let low: CorrelationResult, high: CorrelationResult;
  try {
    low = correlate(xb, yb, { method: 'pearson', tail: 'both', level });
    high = correlate(xa, ya, { method: 'pearson', tail: 'both', level });
  } catch {
    return null; // a side whose x or y does not vary
  }
  const d1 = directionOf(low.interval.lower, low.interval.upper);
  const d2 = directionOf(high.interval.lower, high.interval.upper);
  if (d1 === 'none' || d2 === 'none' || d1 === d2) return null;
  let rises = true, falls = true;
  for (let i = 1; i < n && (rises || falls); i++) {
    if (x[i] < x[i - 1]) rises = false;
    if (x[i] > x[i - 1]) falls = false;
  }
  return { at, shape: d1 === 'positive' ? 'peak' : 'trough', below: low, above: high, xInRowOrder: rises || falls };
}
