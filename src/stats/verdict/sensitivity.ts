/**
 * Does the conclusion hold? The main conclusion (a positive, a negative or no clear correlation: the direction of
 * the interval) restated under each reasonable alternative the checks point to, and one line that sums it up.
 */
import type { CheckReport } from '../checks/check-report';
import { directionOf, Direction } from '../checks/verdict';
import { correlate, correlatePrepared, fisherStandardError } from '../correlation/correlate';
import { fisherInterval, pFromT, tFromR } from '../correlation/fisher';
import { PreparedPairs } from '../correlation/prepared';
import { formatNumber as num } from '../format';
import { CorrelationResult, isClassical, isRobust, Method } from '../types';
import { listWords, tooFewToJudge } from './advice';
import type { Turn } from './turn';

/** The alternatives tried. */
export type Scenario = 'as computed' | 'rank coefficient' | 'robust coefficient' | 'without the most influential row' | 'without the flagged rows' | 'effective rows' | 'below the turn' | 'above the turn';

export interface SensitivityRow {
  scenario: Scenario;
  /** What the row did, in a few words ("Kendall tau-b", "without row 28", "about 14 effective rows"). */
  label: string;
  method: Method;
  statistic: number;
  lower: number;
  upper: number;
  pValue: number;
  /** Rows behind it (effective rows for that scenario). */
  n: number;
  direction: Direction;
  /** Whether the direction is that of the coefficient as computed. */
  holds: boolean;
}

/** The one-line summary's kinds. */
export type Summary =
  | 'holds under every check'
  | 'rests on one row'
  | 'depends on the row order'
  | 'changes without the flagged rows'
  | 'changes with the coefficient'
  | 'turns back'
  | 'too few rows to say';

export interface Sensitivity {
  direction: Direction;
  rows: SensitivityRow[];
  summary: Summary;
  /** The summary as a sentence for the reader. */
  line: string;
}

export interface SensitivityOptions {
  method: Method;
  level: number;
  /** Names pair i in words ("row 28"). */
  name: (i: number) => string;
  /** The coefficient as computed, when the caller already has it (a bootstrap interval is not drawn twice). */
  main?: CorrelationResult;
  /** Where the relationship turns back, when it does (turn.ts). */
  turn?: Turn | null;
}

/** Above this many rows a rank coefficient is not recomputed without rows (see sensitivity). */
export const RANK_RECOMPUTE_MAX = 20000;

const DIRECTION_WORDS: Record<Direction, string> = {
  positive: 'a positive correlation',
  negative: 'a negative correlation',
  none: 'no clear correlation',
};

function rowOf(scenario: Scenario, label: string, res: CorrelationResult, reference: Direction): SensitivityRow {
  const { lower, upper } = res.interval;
  const direction = Number.isFinite(lower) && Number.isFinite(upper) ? directionOf(lower, upper) : res.pValue < 1 - res.interval.level ? (res.statistic > 0 ? 'positive' : 'negative') : 'none';
  return { scenario, label, method: res.method, statistic: res.statistic, lower, upper, pValue: res.pValue, n: res.n, direction, holds: direction === reference };
}

/** Effective rows as they read: whole above 10, one decimal below. */
function effectiveWords(v: number): string {
  return v >= 10 ? Math.round(v).toLocaleString('en-US') : v.toFixed(1);
}

/** The columns without the rows in `drop` (ascending positions). */
function without(x: Float64Array, y: Float64Array, drop: number[]): { x: Float64Array; y: Float64Array } {
  const n = x.length;
  const xs = new Float64Array(n - drop.length);
  const ys = new Float64Array(n - drop.length);
  for (let i = 0, t = 0, d = 0; i < n; i++) {
    if (d < drop.length && drop[d] === i) {
      d++;
      continue;
    }
    xs[t] = x[i];
    ys[t] = y[i];
    t++;
  }
  return { x: xs, y: ys };
}

/**
 * The coefficient's test and interval with n replaced by the effective rows n* (Pyper & Peterman 1998, via
 * Bartlett 1946): t with n* - 2 df, and the method's Fisher-z standard error at n*.
 */
export function withEffectiveRows(res: CorrelationResult, effective: number): CorrelationResult {
  const m = Math.max(3, effective);
  const df = m - 2;
  const t = tFromR(res.statistic, df);
  const se = isClassical(res.method) ? fisherStandardError(res.method, res.statistic, m) : NaN;
  const interval = Number.isFinite(se) && Math.abs(res.statistic) < 1
    ? fisherInterval(res.statistic, se, res.interval.level, `${res.interval.method}, with n = ${num(m)} effective rows`)
    : { lower: NaN, upper: NaN, level: res.interval.level, method: res.interval.method, note: 'too few effective rows for an interval' };
  return { ...res, pValue: pFromT(t, df, 'both'), interval, n: m, test: { name: 't', value: t, df }, pMethod: `t test with ${num(m)} effective rows (Pyper & Peterman 1998)` };
}

/**
 * Restates the conclusion of the chosen coefficient under each alternative the data call for:
 * - as computed;
 * - a rank coefficient (Spearman for Pearson; Kendall for Spearman; Spearman for others);
 * - a robust coefficient, the percentage bend correlation (Wilcox 1994) by its t test, unless one was chosen;
 * - without the single most influential row (the largest change in Pearson's r when one row is left out,
 *   report.leaveOneOut, O(n));
 * - without all the flagged rows (outliers, influential points), when there are any and at most a tenth of the rows;
 * - with the effective rows when neighbouring rows are alike (fewer than 95% of the rows count);
 * - on each side of the turn, when the relationship turns back (turn.ts).
 * Summary, in this order: too few rows to say (four or more of the eight checks could not see or run), turns back
 * (y rises then falls, or the reverse: no one direction describes it), depends on the row order, rests on one row, changes without the flagged rows, changes with the coefficient, and otherwise
 * holds under every check.
 */
export function sensitivity(prepared: PreparedPairs, report: CheckReport, opts: SensitivityOptions): Sensitivity {
  const { method, level } = opts;
  const main = opts.main ?? correlatePrepared(prepared, { method, tail: 'both', level });
  const first = rowOf('as computed', main.name, main, 'none');
  const direction = first.direction;
  first.holds = true;
  const rows: SensitivityRow[] = [first];
  const n = prepared.n;
  const rankMethod: Method = method === 'spearman' ? 'kendall' : 'spearman';
  try {
    const rank = correlatePrepared(prepared, { method: rankMethod, tail: 'both', level });
    rows.push(rowOf('rank coefficient', rank.name, rank, direction));
  } catch {
    // A constant rank column cannot happen when the values vary; nothing to add if it does.
  }
  if (!isRobust(method) && n >= 5) {
    try {
      // Its t test alone: the bootstrap interval is for when it is the coefficient chosen.
      const robust = correlatePrepared(prepared, { method: 'percentage_bend', tail: 'both', level, interval: 'none' });
      rows.push(rowOf('robust coefficient', 'percentage bend', robust, direction));
    } catch {
      // Undefined when most of a column shares one value: the rank row covers that case.
    }
  }
  const loo = report.leaveOneOut;
  let restsOn: number | null = null;
  // Taking rows out of a rank coefficient means sorting again; above this many rows a few rows cannot move its
  // conclusion unless it sits on the edge, and the sensitivity keeps its cost to the shared work.
  const recompute = method === 'pearson' || n <= RANK_RECOMPUTE_MAX;
  if (loo && n >= 5 && recompute) {
    const cut = without(prepared.x, prepared.y, [loo.most]);
    try {
      const res = correlate(cut.x, cut.y, { method, tail: 'both', level, interval: isClassical(method) ? 'fisher' : 'none' });
      const row = rowOf('without the most influential row', `without ${opts.name(loo.most)}`, res, direction);
      rows.push(row);
      if (!row.holds) restsOn = loo.most;
    } catch {
      // Without that row a column is constant: the conclusion surely rests on it.
      restsOn = loo.most;
    }
  }
  const flagged = report.points.flagged;
  let flaggedChange = false;
  if (recompute && flagged.length > 0 && flagged.length <= n / 10 && n - flagged.length >= 5 && !(flagged.length === 1 && loo && flagged[0] === loo.most)) {
    const cut = without(prepared.x, prepared.y, flagged);
    try {
      const res = correlate(cut.x, cut.y, { method, tail: 'both', level, interval: isClassical(method) ? 'fisher' : 'none' });
      const row = rowOf('without the flagged rows', `without the ${flagged.length} flagged rows`, res, direction);
      rows.push(row);
      flaggedChange = !row.holds;
    } catch {
      flaggedChange = true;
    }
  }
  const eff = report.effectiveRows;
  let orderChange = false;
  const orderRow = report.checks.find((c) => c.key === 'row-order');
  const alike = orderRow !== undefined && (orderRow.verdict === 'problem' || orderRow.verdict === 'slight');
  if (eff && alike && eff.effective < 0.95 * n) {
    const res = withEffectiveRows(main, eff.effective);
    const row = rowOf('effective rows', `with about ${effectiveWords(eff.effective)} effective rows`, res, direction);
    rows.push(row);
    orderChange = !row.holds;
  }
  const turn = opts.turn ?? null;
  if (turn) {
    rows.push(rowOf('below the turn', `x at or below the turn, ${num(turn.at)}`, turn.below, direction));
    rows.push(rowOf('above the turn', `x above the turn, ${num(turn.at)}`, turn.above, direction));
  }
  const rankChange = rows.some((r) => (r.scenario === 'rank coefficient' || r.scenario === 'robust coefficient') && !r.holds);
  const conclusion = DIRECTION_WORDS[direction];
  let summary: Summary;
  let line: string;
  if (report.points.setsSlope >= 0) {
    summary = 'rests on one row';
    line = `Rests on ${opts.name(report.points.setsSlope)}: that row alone sets the slope, so no conclusion can be drawn until there are data across the range of x.`;
  } else if (tooFewToJudge(report)) {
    summary = 'too few rows to say';
    line = direction === 'none'
      ? `Too few rows to say: with ${n} rows the data show no clear correlation, and the checks cannot see whether the assumptions hold, so this is not evidence that there is none.`
      : `Too few rows to say: with ${n} rows the checks cannot see whether the ${direction} correlation would survive a departure from the assumptions.`;
  } else if (turn) {
    summary = 'turns back';
    const side = (r: CorrelationResult) => `${r.statistic > 0 ? 'a positive' : 'a negative'} correlation (r = ${num(r.statistic)}, ${r.n.toLocaleString('en-US')} rows)`;
    line = `Turns back: the relationship changes direction at x = ${num(turn.at)}. At or below it, ${side(turn.below)}; above it, ${side(turn.above)}. No single coefficient describes a relationship that ${turn.shape === 'peak' ? 'rises and then falls' : 'falls and then rises'}: report each side, or the curve.`;
  } else if (orderChange) {
    summary = 'depends on the row order';
    const row = rows.find((r) => r.scenario === 'effective rows')!;
    line = `Depends on the row order: counting neighbouring rows as alike (${row.label} of ${n}), the data show ${DIRECTION_WORDS[row.direction]}. Correlate the changes from one row to the next, or read the interval with the effective rows.`;
  } else if (restsOn !== null) {
    summary = 'rests on one row';
    const row = rows.find((r) => r.scenario === 'without the most influential row');
    line = `Rests on ${opts.name(restsOn)}: without it the data show ${row ? DIRECTION_WORDS[row.direction] : 'no correlation at all'}. Check that row before relying on the result.`;
  } else if (flaggedChange) {
    summary = 'changes without the flagged rows';
    const row = rows.find((r) => r.scenario === 'without the flagged rows');
    line = row
      ? `Changes without the flagged rows: leaving out the ${flagged.length} rows the checks flagged, the data show ${DIRECTION_WORDS[row.direction]}.`
      : `Changes without the flagged rows: leaving out the ${flagged.length} rows the checks flagged leaves a column constant, so no correlation is left at all.`;
  } else if (rankChange) {
    summary = 'changes with the coefficient';
    const changed = rows.filter((r) => (r.scenario === 'rank coefficient' || r.scenario === 'robust coefficient') && !r.holds);
    line = `Changes with the coefficient: ${listWords(changed.map((r) => `${r.label} shows ${DIRECTION_WORDS[r.direction]}`))}.`;
  } else {
    summary = 'holds under every check';
    line = `Holds under every check: ${conclusion} with every alternative tried (${rows.slice(1).map((r) => r.label).join(', ') || 'none was needed'}).`;
  }
  return { direction, rows, summary, line };
}
