/**
 * From a relationship view to what a point chart draws: the drawn points in chart coordinates, and the tooltip
 * lines of each (its sheet row, values, residual and why it is flagged). Shared by the scatter and the residual
 * plots, so a point reads the same in every chart.
 */
import { formatCount, formatValue } from '../../src/stats/format';
import { PlotPoint } from '../charts';
import type { ChartData } from '../widgets';
import { FLAG_INFLUENTIAL, FLAG_OUTLIER, FLAG_SETS_SLOPE, RelationshipView } from '../relationship';

/** Why a point is flagged, in words. */
export function flagWords(bits: number): string[] {
  const words: string[] = [];
  if (bits & FLAG_OUTLIER) words.push('outlier');
  if (bits & FLAG_INFLUENTIAL) words.push('influential');
  if (bits & FLAG_SETS_SLOPE) words.push('sets the slope');
  return words;
}

/** The drawn points at (xs[k], ys[k]), each with its sheet row and flags. */
export function pointsOf(v: RelationshipView, xs: ArrayLike<number>, ys: ArrayLike<number>): PlotPoint[] {
  const d = v.drawn;
  const out: PlotPoint[] = new Array(d.rows.length);
  for (let k = 0; k < d.rows.length; k++) out[k] = { x: xs[k], y: ys[k], row: d.rows[k], flags: d.flags[k] };
  return out;
}

/** Tooltip lines of a drawn point (text only). */
export function describer(v: RelationshipView): (p: PlotPoint) => string[] {
  const index = new Map<number, number>();
  v.drawn.rows.forEach((r, k) => index.set(r, k));
  return (p) => {
    const k = index.get(p.row);
    if (k === undefined) return [`Row ${p.row}`];
    const d = v.drawn;
    const lines = [`Row ${p.row}`, `${v.xHeader}: ${formatValue(d.x[k])}   ${v.yHeader}: ${formatValue(d.y[k])}`, `Residual ${formatValue(d.residuals[k])}`];
    const words = flagWords(d.flags[k]);
    if (words.length) lines.push(`Flagged: ${words.join(', ')}`);
    lines.push('Click to select this row');
    return lines;
  };
}

/** Marks a chart's frame with what it drew (test hooks: data-drawn-count, data-flagged-rows). */
export function markFrame(frame: HTMLElement, v: RelationshipView): void {
  const d = v.drawn;
  const flaggedDrawn: number[] = [];
  for (let k = 0; k < d.rows.length; k++) if (d.flags[k]) flaggedDrawn.push(d.rows[k]);
  frame.setAttribute('data-drawn-count', String(d.rows.length));
  frame.setAttribute('data-flagged-rows', flaggedDrawn.join(','));
}

/**
 * The numbers behind a point chart of the drawn sample, for its text alternative: one row per drawn point with its
 * sheet row and whether it is flagged, and a summary of how many points stand for how many pairs.
 */
export function pointTable(v: RelationshipView, what: string, xName: string, yName: string, xs: ArrayLike<number>, ys: ArrayLike<number>): ChartData {
  const d = v.drawn;
  const m = d.rows.length;
  let flagged = 0;
  for (let k = 0; k < m; k++) if (d.flags[k]) flagged++;
  const sample = m < v.n ? ` (${formatCount(m)} of the ${formatCount(v.n)} pairs drawn, every flagged one among them)` : '';
  return {
    summary: `${what}: ${formatCount(m)} points${sample}, ${formatCount(flagged)} flagged. The table "Numbers behind this chart" lists them.`,
    // Against the sheet row, the row is the x value: one column for it, not two.
    columns: xs === d.rows ? ['sheet row', yName, 'flagged'] : ['sheet row', xName, yName, 'flagged'],
    rows: () => Array.from({ length: m }, (_, k) => (xs === d.rows ? [d.rows[k], ys[k], d.flags[k] ? 'yes' : ''] : [d.rows[k], xs[k], ys[k], d.flags[k] ? 'yes' : ''])),
  };
}
