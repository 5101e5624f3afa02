/**
 * Everything the Relationship and Residual sections show for one pair, computed in one pass from the complete
 * pairs: the correlation, the eight checks with their per-point diagnostics, the smooth, and the few thousand
 * points to draw. Pure and host-free, so it runs on the main thread or in the panel's worker alike; the result
 * is plain data (typed arrays, objects) that survives structured cloning.
 *
 * Statistics use every row; only the drawing is thinned (see draw-sample.ts).
 */
import { correlate } from '../src/stats/correlation/correlate';
import { normalQuantile } from '../src/stats/distributions';
import { lowess } from '../src/stats/plots/lowess';
import { recommendCoefficient, Recommendation } from '../src/stats/checks/advice';
import { runChecks } from '../src/stats/checks/run-checks';
import { giveBack } from '../src/stats/internal/scratch';
import type { CheckRow } from '../src/stats/checks/check-report';
import { CorrelationResult, Method, StatsInputError } from '../src/stats/types';
import { drawSample } from './draw-sample';
import { ranksAmong, typeSevenQuantiles } from './order-stats';
import { pairedRows, PairedRows } from './pairs';
import { readCorrelation } from './reading';

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
  /** Milliseconds spent computing (not drawing). */
  computeMs: number;
}

/** A computation that could not run, with a message for the user. */
export interface RelationshipFailure {
  error: string;
}

/**
 * Plotting positions for a normal Q-Q plot, as R's ppoints(): (i - a)/(n + 1 - 2a) with a = 3/8 for n <= 10
 * (Blom 1958, Statistical Estimates and Transformed Beta-Variables, Wiley) and a = 1/2 above (Hazen 1914).
 */
export function plottingPosition(rank: number, n: number): number {
  const a = n <= 10 ? 3 / 8 : 1 / 2;
  return (rank + 1 - a) / (n + 1 - 2 * a);
}

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/**
 * The last answers of the two steps of a redraw that one edited cell rarely changes, kept so the next redraw can
 * reuse them. Both steps are pure functions of what is compared before reuse, so a reused answer is the one the
 * step would compute again. Measured in the panel preview at 100,000 rows: together 8-10 ms of a redraw.
 */
const lastDraw = { n: -1, limit: -1, flagged: [] as number[], pick: new Int32Array(0) as Int32Array<ArrayBufferLike> };
const lastSmooth = {
  n: -1,
  positions: new Int32Array(0) as Int32Array<ArrayBufferLike>,
  x: new Float64Array(0),
  y: new Float64Array(0),
  curve: null as { x: Float64Array; y: Float64Array } | null,
};

/** drawSample(n, flagged, limit), reused while n, limit and the flagged positions stay the same. */
function drawnPositions(n: number, flagged: number[], limit: number): Int32Array {
  const same = lastDraw.n === n && lastDraw.limit === limit && lastDraw.flagged.length === flagged.length && lastDraw.flagged.every((f, k) => f === flagged[k]);
  if (!same) {
    lastDraw.pick = drawSample(n, flagged, limit);
    lastDraw.n = n;
    lastDraw.limit = limit;
    lastDraw.flagged = flagged.slice();
  }
  return lastDraw.pick;
}

/**
 * The LOWESS smooth of a fixed-hash sample of at most SMOOTH_LIMIT points. The sample's positions depend only on
 * n, so an edit outside them leaves its input, and so the curve, unchanged: the curve is reused when every sampled
 * (x, y) equals the last one (Object.is, so -0 and NaN count as changes).
 */
function smoothOf(x: Float64Array, y: Float64Array): { x: Float64Array; y: Float64Array } {
  const n = x.length;
  if (lastSmooth.n !== n) {
    // New positions: the loop below gathers their values, and with no curve kept it computes one.
    lastSmooth.positions = drawSample(n, [], SMOOTH_LIMIT);
    lastSmooth.x = new Float64Array(lastSmooth.positions.length);
    lastSmooth.y = new Float64Array(lastSmooth.positions.length);
    lastSmooth.n = n;
    lastSmooth.curve = null;
  }
  const base = lastSmooth.positions;
  const sx = lastSmooth.x;
  const sy = lastSmooth.y;
  let same = lastSmooth.curve !== null;
  for (let k = 0; k < base.length; k++) {
    const i = base[k];
    if (!Object.is(sx[k], x[i]) || !Object.is(sy[k], y[i])) {
      same = false;
      sx[k] = x[i];
      sy[k] = y[i];
    }
  }
  if (!same || !lastSmooth.curve) lastSmooth.curve = lowess(sx, sy);
  // A copy: the caller owns its view (the panel's worker transfers the arrays, which would empty the kept ones).
  return { x: lastSmooth.curve.x.slice(), y: lastSmooth.curve.y.slice() };
}

/**
 * Computes the view of one pair. Statistical input errors (too few pairs, a constant column) come back as a
 * failure with the core's message rather than an exception.
 */
export function analyseRelationship(p: PairedRows, opts: RelationshipOptions): RelationshipView | RelationshipFailure {
  const t0 = now();
  try {
    const { x, y, rows } = p;
    const n = x.length;
    const correlation = correlate(x, y, { method: opts.method, tail: 'both', level: opts.level });
    const report = runChecks(x, y, { alpha: opts.alpha, rows });
    const pts = report.points;

    // Chambers, Cleveland, Kleiner & Tukey (1983), Graphical Methods for Data Analysis, sec. 6.3: the reference
    // line through the first and third quartiles (as R's qqline).
    const [q1, q3] = typeSevenQuantiles(pts.residuals, [0.25, 0.75]);
    const z1 = normalQuantile(0.25);
    const z3 = normalQuantile(0.75);
    const qqSlope = (q3 - q1) / (z3 - z1);
    const qqLine = { slope: qqSlope, intercept: q1 - qqSlope * z1 };

    const reason = new Uint8Array(n);
    for (const i of pts.outliers) reason[i] |= FLAG_OUTLIER;
    for (const i of pts.influential) reason[i] |= FLAG_INFLUENTIAL;
    if (pts.setsSlope >= 0) reason[pts.setsSlope] |= FLAG_SETS_SLOPE;

    const pick = drawnPositions(n, pts.flagged, opts.drawLimit);
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
    // Ranks of the drawn residuals among all n residuals, for their Q-Q abscissae.
    const ranks = ranksAmong(pts.residuals, Float64Array.from(pick, (i) => pts.residuals[i]));
    for (let k = 0; k < m; k++) {
      const i = pick[k];
      drawn.rows[k] = rows[i];
      drawn.x[k] = x[i];
      drawn.y[k] = y[i];
      drawn.fitted[k] = pts.fitted[i];
      drawn.residuals[k] = pts.residuals[i];
      drawn.normalScore[k] = normalQuantile(plottingPosition(ranks[k], n));
      drawn.flags[k] = reason[i];
      drawn.studentized[k] = pts.studentized[i];
      drawn.cooksDistance[k] = pts.cooksDistance[i];
      drawn.leverage[k] = pts.leverage[i];
    }

    // The per-point columns of all n rows are done with (the view keeps only the drawn ones): back to the scratch
    // pool, so the next redraw reuses their pages instead of allocating and collecting 5 new columns.
    giveBack(pts.fitted, pts.residuals, pts.studentized, pts.leverage, pts.cooksDistance);

    const smooth = n >= 4 ? smoothOf(x, y) : null;

    return {
      sheet: p.sheet,
      xHeader: p.xHeader,
      yHeader: p.yHeader,
      total: p.total,
      n,
      skipped: p.skipped,
      correlation,
      line: { slope: report.line.slope, intercept: report.line.intercept },
      checks: report.checks,
      flags: report.flags,
      flaggedRows: pts.flagged.map((i) => rows[i]),
      drawn,
      smooth,
      qqLine,
      reading: readCorrelation(correlation, p.xHeader, p.yHeader),
      recommendation: recommendCoefficient(report, correlation),
      computeMs: now() - t0,
    };
  } catch (e) {
    if (e instanceof StatsInputError) return { error: e.message };
    throw e;
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
