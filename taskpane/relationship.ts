/**
 * Everything the Relationship and Residual sections show for one pair, computed in one pass from the complete
 * pairs: the correlation, the eight checks with their per-point diagnostics, the smooth, and the few thousand
 * points to draw. Pure and host-free, so it runs on the main thread or in the panel's worker alike; the result
 * is plain data (typed arrays, objects) that survives structured cloning.
 *
 * Statistics use every row; only the drawing is thinned (see draw-sample.ts).
 */
import { sheetRowNaming } from '../src/sheet/naming';
import { listWords, readCorrelation, readTurn, Recommendation } from '../src/stats/verdict/advice';
import { conclude } from '../src/stats/verdict/conclusion';
import type { SensitivityRow, Summary } from '../src/stats/verdict/sensitivity';
import type { Direction } from '../src/stats/checks/verdict';
import { formatR } from '../src/stats/format';
import type { CheckRow } from '../src/stats/checks/check-report';
import { checksOf } from '../src/stats/checks/checked';
import { PreparedPairs } from '../src/stats/correlation/prepared';
import type { KeyedOrder } from '../src/stats/internal/sort';
import { lowess } from '../src/stats/plots/lowess';
import { normalScores, quartileLine } from '../src/stats/plots/qq';
import { CorrelationResult, Method, StatsInputError } from '../src/stats/types';
import { drawSample } from './draw-sample';
import { pairedRows, PairedRows } from './pairs';

export interface RelationshipOptions {
  method: Method;
  /** Confidence level, e.g. 0.95. */
  level: number;
  /** Significance level of the checks, e.g. 0.05. */
  alpha: number;
  /** The most points a chart draws. */
  drawLimit: number;
}

export const DEFAULT_RELATIONSHIP_OPTIONS: RelationshipOptions = { method: 'pearson', level: 0.95, alpha: 0.05, drawLimit: 2000 };

/** Most points the smooth is computed on: LOWESS on a fixed-hash uniform sample of this size beyond it. */
export const SMOOTH_LIMIT = 2000;

/** Why a drawn point is highlighted. Bit flags, so one point may carry several. */
export const FLAG_OUTLIER = 1;
export const FLAG_INFLUENTIAL = 2;
export const FLAG_SETS_SLOPE = 4;

/** The points actually drawn, one entry each. */
export interface DrawnPoints {
  /** Sheet row of each point. */
  rows: Int32Array;
  x: Float64Array;
  y: Float64Array;
  fitted: Float64Array;
  residuals: Float64Array;
  /** Normal quantile of the point's residual rank among ALL residuals (Q-Q plot abscissa). */
  normalScore: Float64Array;
  /** Highlight reasons (FLAG_* bits), 0 for an ordinary point. */
  flags: Uint8Array;
  studentized: Float64Array;
  cooksDistance: Float64Array;
  leverage: Float64Array;
}

export interface RelationshipView {
  sheet: string;
  xHeader: string;
  yHeader: string;
  /** Data rows read, pairs used, rows skipped. */
  total: number;
  n: number;
  skipped: number;
  /** Sheet rows of the first skipped rows (see PairedRows.skippedRows). */
  skippedRows: number[];
  correlation: CorrelationResult;
  line: { slope: number; intercept: number };
  checks: CheckRow[];
  flags: string[];
  /** Sheet rows of every flagged point (not only the drawn ones). */
  flaggedRows: number[];
  drawn: DrawnPoints;
  smooth: { x: Float64Array; y: Float64Array } | null;
  /** Reference line of the Q-Q plot through the quartiles: residual = qqIntercept + qqSlope * normal score. */
  qqLine: { intercept: number; slope: number };
  reading: string[];
  /** Which coefficient to report given the checks, and why (the same advice as COVARY.REPORT). */
  recommendation: Recommendation;
  /** Whether the conclusion holds (the same as COVARY.SENSITIVITY and the verdict rows of COVARY.REPORT). */
  verdict: VerdictView;
  /** Milliseconds spent computing (not drawing). */
  computeMs: number;
}

/** The verdict card's content: plain data, so it crosses to and from the panel's worker. */
export interface VerdictView {
  summary: Summary;
  line: string;
  rows: SensitivityRow[];
  direction: Direction;
  /** When the interval includes zero: the equivalence test at the default bound. */
  equivalence: { bound: number; negligible: boolean; pValue: number; lower: number; upper: number; level: number } | null;
  /** When the interval includes zero: the Bayes factor for Pearson's r (uniform prior, even odds). */
  bayes: { bf01: number; bf10: number; posteriorProbability: number } | null;
  /** The smallest correlation these rows detect 8 times in 10 at the interval's alpha. */
  detectable: number | null;
  /** Slight departures, and checks that had too few rows to tell. */
  minor: string[];
  tooFew: number;
}

/** A computation that could not run, with a message for the user. */
export interface RelationshipFailure {
  error: string;
}

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/**
 * The last answers of the two steps of a redraw that one edited cell rarely changes, kept so the next redraw can
 * reuse them. Both steps are pure functions of what is compared before reuse, so a reused answer is the one the
 * step would compute again. Measured in the panel preview at 100,000 rows: together 8-10 ms of a redraw. Owned by
 * whoever analyses one pair again and again (the panel; its worker holds its own).
 */
export class RedrawMemory {
  private draw = { n: -1, limit: -1, flagged: [] as number[], pick: new Int32Array(0) as Int32Array<ArrayBufferLike> };
  private smooth = {
    n: -1,
    positions: new Int32Array(0) as Int32Array<ArrayBufferLike>,
    x: new Float64Array(0),
    y: new Float64Array(0),
    curve: null as { x: Float64Array; y: Float64Array } | null,
  };

  /** Each column's last values with its sorted order and ranks, for the column an edit left unchanged. */
  private readonly sorts = [
    { values: new Float64Array(0), sorted: null as KeyedOrder | null, ranks: null as Float64Array | null },
    { values: new Float64Array(0), sorted: null as KeyedOrder | null, ranks: null as Float64Array | null },
  ];

  /**
   * Hands the sorted order and ranks of a column equal to the last one seen (element by element) to the new
   * prepared pairs: one edited cell changes one column, so the other's sort (about a quarter of a redraw's
   * computing at 100,000 rows) is not done again. Sorting depends on the values alone, so the order handed in is
   * the one the sort would give.
   */
  seedSorts(prepared: PreparedPairs): void {
    const cols = [prepared.x, prepared.y];
    const keys = SORT_KEYS;
    for (let c = 0; c < 2; c++) {
      const kept = this.sorts[c];
      if (!kept.sorted) continue;
      const changed = changedPlaces(kept.values, cols[c], RESORT_LIMIT);
      if (changed === null) continue;
      if (changed.length === 0) {
        prepared.seed(keys[c][0], kept.sorted);
        if (kept.ranks) prepared.seed(keys[c][1], kept.ranks);
        continue;
      }
      const order = resorted(kept.sorted.order, cols[c], changed);
      if (order) prepared.seed(keys[c][0], { order, sortedWords: null });
    }
  }

  /** Keeps what this redraw sorted (before the prepared pairs are released), for the next one. */
  keepSorts(prepared: PreparedPairs): void {
    const cols = [prepared.x, prepared.y];
    const keys = SORT_KEYS;
    for (let c = 0; c < 2; c++) {
      const sorted = prepared.keep(keys[c][0]) as KeyedOrder | undefined;
      if (!sorted) continue;
      const kept = this.sorts[c];
      const ranks = prepared.keep(keys[c][1]) as Float64Array | undefined;
      if (kept.sorted !== sorted) {
        // A new column (or a mended order): ranks kept for the old one must not follow it.
        kept.values = cols[c].slice();
        kept.sorted = sorted;
        kept.ranks = ranks ?? null;
      } else if (ranks) kept.ranks = ranks;
    }
  }

  /** drawSample(n, flagged, limit), reused while n, limit and the flagged positions stay the same. */
  drawnPositions(n: number, flagged: number[], limit: number): Int32Array {
    const d = this.draw;
    const same = d.n === n && d.limit === limit && d.flagged.length === flagged.length && d.flagged.every((f, k) => f === flagged[k]);
    if (!same) {
      d.pick = drawSample(n, flagged, limit);
      d.n = n;
      d.limit = limit;
      d.flagged = flagged.slice();
    }
    return d.pick;
  }

  /**
   * The LOWESS smooth of a fixed-hash sample of at most SMOOTH_LIMIT points. The sample's positions depend only on
   * n, so an edit outside them leaves its input, and so the curve, unchanged: the curve is reused when every
   * sampled (x, y) equals the last one (Object.is, so -0 and NaN count as changes).
   */
  smoothOf(x: Float64Array, y: Float64Array): { x: Float64Array; y: Float64Array } {
    const m = this.smooth;
    const n = x.length;
    if (m.n !== n) {
      // New positions: the loop below gathers their values, and with no curve kept it computes one.
      m.positions = drawSample(n, [], SMOOTH_LIMIT);
      m.x = new Float64Array(m.positions.length);
      m.y = new Float64Array(m.positions.length);
      m.n = n;
      m.curve = null;
    }
    const base = m.positions;
    const sx = m.x;
    const sy = m.y;
    let same = m.curve !== null;
    for (let k = 0; k < base.length; k++) {
      const i = base[k];
      if (!Object.is(sx[k], x[i]) || !Object.is(sy[k], y[i])) {
        same = false;
        sx[k] = x[i];
        sy[k] = y[i];
      }
    }
    if (!same || !m.curve) m.curve = lowess(sx, sy);
    // A copy: the caller owns its view (the panel's worker transfers the arrays, which would empty the kept ones).
    return { x: m.curve.x.slice(), y: m.curve.y.slice() };
  }
}

/** The prepared pairs' memo keys of each column's sorted order and ranks, x then y. */
const SORT_KEYS = [['sortedX', 'ranksX'], ['sortedY', 'ranksY']] as const;

/** Most changed places for which a sorted order is mended rather than sorted again (an edit, a short paste). */
const RESORT_LIMIT = 8;

/**
 * The places where b differs from a (Object.is: -0 and 0 differ), or null when the lengths differ or more than
 * `limit` places changed.
 */
function changedPlaces(a: Float64Array, b: Float64Array, limit: number): number[] | null {
  if (a.length !== b.length) return null;
  const out: number[] = [];
  for (let i = 0; i < a.length; i++) {
    if (a[i] !== b[i] || (a[i] === 0 && 1 / a[i] !== 1 / b[i])) {
      if (out.length === limit) return null;
      out.push(i);
    }
  }
  return out;
}

/**
 * The stable ascending order of `values` from the previous order, where only the `changed` places have new
 * values: they are taken out, and each is put back where its value (then its place, for equal values) belongs,
 * found by binary search. The same order a stable sort gives, in O(n) instead of O(n log n). Null when a changed
 * value is zero, where -0 and 0 meet: left to the sort itself rather than to this comparison (a caution; the
 * sort treats them as equal, as this does).
 */
export function resorted(previous: ArrayLike<number>, values: Float64Array, changed: number[]): Uint32Array | null {
  for (const i of changed) if (values[i] === 0) return null;
  const n = previous.length;
  const moved = new Uint8Array(n);
  for (const i of changed) moved[i] = 1;
  const order = new Uint32Array(n);
  let m = 0;
  for (let k = 0; k < n; k++) {
    const i = previous[k];
    if (!moved[i]) order[m++] = i;
  }
  for (const i of changed) {
    const v = values[i];
    // First place whose value is above v, or equal with a later place.
    let lo = 0;
    let hi = m;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      const w = values[order[mid]];
      if (w < v || (w === v && order[mid] < i)) lo = mid + 1;
      else hi = mid;
    }
    order.copyWithin(lo + 1, lo, m);
    order[lo] = i;
    m++;
  }
  return order;
}

/**
 * Computes the view of one pair, through the same core entry points as the cell functions (prepared pairs, the
 * memoised check report; src/stats/checks/checked.ts). Statistical input errors (too few pairs, a constant column)
 * come back as a failure with the core's message rather than an exception.
 * @param memory what the last redraw of this pair left to reuse; a fresh one reuses nothing
 */
export function analyseRelationship(p: PairedRows, opts: RelationshipOptions, memory: RedrawMemory = new RedrawMemory()): RelationshipView | RelationshipFailure {
  const t0 = now();
  const { x, y, rows } = p;
  const prepared = new PreparedPairs(x, y);
  memory.seedSorts(prepared);
  try {
    const n = x.length;
    const naming = sheetRowNaming(rows);
    const report = checksOf(prepared, opts.alpha, naming);
    const conclusion = conclude(prepared, report, { method: opts.method, level: opts.level, name: naming.name });
    const correlation = conclusion.correlation;
    const pts = report.points;
    const qqLine = quartileLine(pts.residuals);

    const reason = new Uint8Array(n);
    for (const i of pts.outliers) reason[i] |= FLAG_OUTLIER;
    for (const i of pts.influential) reason[i] |= FLAG_INFLUENTIAL;
    if (pts.setsSlope >= 0) reason[pts.setsSlope] |= FLAG_SETS_SLOPE;

    const pick = memory.drawnPositions(n, pts.flagged, opts.drawLimit);
    const m = pick.length;
    const drawn: DrawnPoints = {
      rows: new Int32Array(m),
      x: new Float64Array(m),
      y: new Float64Array(m),
      fitted: new Float64Array(m),
      residuals: new Float64Array(m),
      normalScore: new Float64Array(m),
      flags: new Uint8Array(m),
      studentized: new Float64Array(m),
      cooksDistance: new Float64Array(m),
      leverage: new Float64Array(m),
    };
    // Q-Q abscissae of the drawn residuals, from their ranks among all n residuals.
    const scores = normalScores(pts.residuals, Float64Array.from(pick, (i) => pts.residuals[i]));
    for (let k = 0; k < m; k++) {
      const i = pick[k];
      drawn.rows[k] = rows[i];
      drawn.x[k] = x[i];
      drawn.y[k] = y[i];
      drawn.fitted[k] = pts.fitted[i];
      drawn.residuals[k] = pts.residuals[i];
      drawn.normalScore[k] = scores[k];
      drawn.flags[k] = reason[i];
      drawn.studentized[k] = pts.studentized[i];
      drawn.cooksDistance[k] = pts.cooksDistance[i];
      drawn.leverage[k] = pts.leverage[i];
    }

    const smooth = n >= 4 ? memory.smoothOf(x, y) : null;

    return {
      sheet: p.sheet,
      xHeader: p.xHeader,
      yHeader: p.yHeader,
      total: p.total,
      n,
      skipped: p.skipped,
      skippedRows: Array.from(p.skippedRows ?? []),
      correlation,
      line: { slope: report.line.slope, intercept: report.line.intercept },
      checks: report.checks,
      flags: report.flags,
      flaggedRows: pts.flagged.map((i) => rows[i]),
      drawn,
      smooth,
      qqLine,
      reading: [
        // A curve that turns back is read side by side: one direction, or "no clear relationship", would be wrong.
        ...(conclusion.turn ? readTurn(conclusion.turn, p.xHeader, p.yHeader, formatR) : readCorrelation(correlation, p.xHeader, p.yHeader, formatR)),
        ...(correlation.skippedRows
          ? [correlation.skippedRows.length === 0
            ? 'The skipped correlation found no row outlying in both columns together, so it equals Pearson here.'
            : `The skipped correlation set aside ${correlation.skippedRows.length} row${correlation.skippedRows.length === 1 ? '' : 's'} outlying in both columns together: ${listWords(correlation.skippedRows.slice(0, 12).map(naming.name))}${correlation.skippedRows.length > 12 ? ' and more' : ''}.`]
          : []),
        ...(correlation.interval.replicates ? [`Interval by ${correlation.interval.method}: the same cells always give the same interval.`] : []),
      ],
      recommendation: conclusion.recommendation,
      verdict: {
        summary: conclusion.sensitivity.summary,
        line: conclusion.sensitivity.line,
        rows: conclusion.sensitivity.rows,
        direction: conclusion.sensitivity.direction,
        equivalence: conclusion.equivalence
          ? { bound: conclusion.equivalence.bound, negligible: conclusion.equivalence.negligible, pValue: conclusion.equivalence.pValue, lower: conclusion.equivalence.interval.lower, upper: conclusion.equivalence.interval.upper, level: conclusion.equivalence.interval.level }
          : null,
        bayes: conclusion.bayes ? { bf01: conclusion.bayes.bf01, bf10: conclusion.bayes.bf10, posteriorProbability: conclusion.bayes.posteriorProbability } : null,
        detectable: conclusion.detectable,
        minor: report.minor,
        tooFew: report.tooFew,
      },
      computeMs: now() - t0,
    };
  } catch (e) {
    if (e instanceof StatsInputError) return { error: e.message };
    throw e;
  } finally {
    // The per-point columns of all n rows, the ranks and the sorted orders are done with (the view keeps only the
    // drawn points): back to the core's pool, so the next redraw reuses their pages instead of allocating and
    // collecting new columns.
    memory.keepSorts(prepared);
    prepared.release();
  }
}

export function isFailure(v: RelationshipView | RelationshipFailure): v is RelationshipFailure {
  return (v as RelationshipFailure).error !== undefined;
}

/** Rows of the invented data warmUpRound analyses. */
export const WARM_UP_ROWS = 50000;

/**
 * One round of the analysis on n invented rows (a line with noise, one outlier), nothing kept. The panel runs it to
 * get the script engine's compilation out of the way of the user's edits:
 * - Priming, before the first analysis of a large sheet, on 6,000 rows. The engine optimises a function while its
 *   first long loop is still running, so code after the loop, not yet run, is optimised without knowing what it
 *   meets: each later call bails out there, and after a few such bail-outs the engine throws the code away and
 *   starts over, leaving the next redraws unoptimised. Measured in the panel preview (Chromium 156, 2-core
 *   machine, 3 runs of 8 edits at 100,000 rows): without priming the 5th edit took 130-190 ms where the others
 *   took 50-110; with it no edit took over 116 ms. 6,000 rows take the same branches as 100,000 (over 5,000 the
 *   normality check is D'Agostino-Pearson; from 100 Durbin-Watson is approximate).
 * - Warm-up, in idle time after the first large redraw, on WARM_UP_ROWS rows: the script engine compiles a
 *   function for speed only after it has run a few times. Without it the 1st-5th redraws after opening a
 *   100,000-row sheet took 180-420 ms; with 6 rounds every redraw took 58-166 ms. A round takes about 20 ms.
 */
export function warmUpRound(round: number, opts: RelationshipOptions, n = WARM_UP_ROWS): void {
  let s = (round + 1) * 2654435761;
  const u = (): number => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const rows = new Int32Array(n);
  // Rounds vary the kinds of numbers a sheet holds, which take different paths through the code: whole
  // numbers, two-decimal values, and full-precision results of formulas.
  const xScale = round % 3 === 0 ? 1 : 100;
  const yScale = round % 2 === 1 ? 0 : 100;
  for (let i = 0; i < n; i++) {
    x[i] = Math.round((50 + 10 * Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u())) * xScale) / xScale;
    const v = 0.5 * x[i] + 8 * (u() - 0.5);
    y[i] = yScale ? Math.round(v * yScale) / yScale : v;
    rows[i] = i + 2;
  }
  y[n >> 1] += 500;
  analyseRelationship(pairedRows(x, y, rows, '', n, 0, 'x', 'y'), opts);
}
