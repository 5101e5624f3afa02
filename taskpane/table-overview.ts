/**
 * What the "Across the table" section shows, computed from column reads: the correlation matrix of a table's
 * numeric columns (each pair on its own complete rows, p-values Holm-adjusted across the pairs) and the partial
 * correlation of the main pair holding chosen columns fixed. Pure and host-free; the section draws the result.
 */
import { correlationMatrix, CorrelationMatrix } from '../src/stats/compare/matrix';
import { partialCorrelation } from '../src/stats/compare/partial';
import { correlate } from '../src/stats/correlation/correlate';
import { isClassical, Method, StatsInputError } from '../src/stats/types';
import { formatR } from '../src/stats/format';
import type { NumericColumnRead } from './workbook';

/** A column of the table as read, with its place in the table. */
export interface OverviewColumn {
  name: string;
  /** 0-based place in the table. */
  position: number;
  read: NumericColumnRead;
}

export interface OverviewMatrix {
  table: string;
  /** The columns in the matrix, in table order. */
  columns: { name: string; position: number }[];
  /** Columns left out, with the reason. */
  left: { name: string; why: string }[];
  matrix: CorrelationMatrix;
  /** Set when the coefficient above is not one the matrix computes, saying what it uses instead. */
  methodNote: string | null;
}

export interface OverviewFailure {
  error: string;
}

export function isOverviewFailure(v: unknown): v is OverviewFailure {
  return typeof v === 'object' && v !== null && 'error' in v;
}

/** The coefficient the heatmap uses: the one above when it is Pearson, Spearman or Kendall, else Spearman. */
export function matrixMethod(method: Method): Method {
  return isClassical(method) ? method : 'spearman';
}

/** Numbers in a column and whether they vary. */
function census(v: Float64Array): { count: number; varies: boolean } {
  let count = 0;
  let first = NaN;
  let varies = false;
  for (let i = 0; i < v.length; i++) {
    const a = v[i];
    if (a !== a) continue;
    if (count === 0) first = a;
    else if (a !== first) varies = true;
    count++;
  }
  return { count, varies };
}

/**
 * The matrix of every numeric column of a table. Columns with fewer than 3 numbers (labels, notes) or one value
 * throughout are left out and listed. A failure names the reason (fewer than 2 usable columns, a pair sharing
 * fewer than 3 rows, a table too large for one computation).
 */
export function tableMatrix(table: string, columns: OverviewColumn[], method: Method): OverviewMatrix | OverviewFailure {
  const kept: OverviewColumn[] = [];
  const left: { name: string; why: string }[] = [];
  for (const c of columns) {
    const { count, varies } = census(c.read.numbers);
    if (count < 3) left.push({ name: c.name, why: count === 0 ? 'no numbers' : `only ${count} number${count === 1 ? '' : 's'}` });
    else if (!varies) left.push({ name: c.name, why: 'the same value in every row' });
    else kept.push(c);
  }
  if (kept.length < 2) {
    return { error: `${table} has ${kept.length === 0 ? 'no columns' : 'only one column'} of varying numbers: a heatmap needs at least two.` };
  }
  const use = matrixMethod(method);
  const rows = Math.min(...kept.map((c) => c.read.numbers.length));
  const aligned = kept.map((c) => (c.read.numbers.length === rows ? c.read.numbers : c.read.numbers.subarray(0, rows)));
  let matrix: CorrelationMatrix;
  try {
    matrix = correlationMatrix(aligned, use, kept.map((c) => c.name));
  } catch (e) {
    if (e instanceof StatsInputError) return { error: e.message.charAt(0).toUpperCase() + e.message.slice(1) + '.' };
    throw e;
  }
  return {
    table,
    columns: kept.map((c) => ({ name: c.name, position: c.position })),
    left,
    matrix,
    methodNote: use === method ? null : `The heatmap uses Spearman's rank correlation: the coefficient chosen above is not computed for every pair of a table.`,
  };
}

/** One step of the diverging scale: the sign and a strength level 0 (near zero) to 4 (0.7 or stronger). */
export interface HeatStep {
  sign: 'pos' | 'neg';
  level: 0 | 1 | 2 | 3 | 4;
}

/** The limits of |r| between the five strength levels. */
export const HEAT_LIMITS = [0.1, 0.3, 0.5, 0.7] as const;

export function heatStep(r: number): HeatStep {
  const a = Math.abs(r);
  let level = 0;
  while (level < HEAT_LIMITS.length && a >= HEAT_LIMITS[level]) level++;
  return { sign: r < 0 ? 'neg' : 'pos', level: level as HeatStep['level'] };
}

/**
 * A coefficient for a heatmap cell: formatR's digits (two decimals, more where two would show a small value as
 * zero or a value short of 1 as 1) without the leading zero, so the cell's text is part of its spoken label.
 */
export function cellText(r: number): string {
  return formatR(r).replace(/^(\u2212?)0\./, '$1.');
}

export interface PartialView {
  r: number;
  lower: number;
  upper: number;
  p: number;
  /** Complete rows (x, y and every control a number). */
  n: number;
  /** The plain correlation of x and y on the same rows, to compare with. */
  plain: number;
  plainLower: number;
  plainUpper: number;
  controls: string[];
  level: number;
}

/**
 * The partial correlation of the main pair holding the chosen columns fixed, on the rows complete in all of them
 * (matched by sheet row), with the plain correlation on the same rows beside it. Pearson on both.
 */
export function partialOf(x: NumericColumnRead, y: NumericColumnRead, controls: OverviewColumn[], level: number): PartialView | OverviewFailure {
  if (controls.length === 0) return { error: 'Tick one or more columns to hold fixed.' };
  const others = controls.find((c) => c.read.sheet !== x.sheet || c.read.sheet !== y.sheet);
  if (others) return { error: `${others.name} is on the sheet ${others.read.sheet} and the pair on ${x.sheet}: a partial correlation matches rows on one sheet.` };
  if (x.firstRow !== y.firstRow || x.numbers.length !== y.numbers.length) return { error: 'The pair is not read from the same rows.' };
  const n0 = x.numbers.length;
  const xs: number[] = [];
  const ys: number[] = [];
  const zs: number[][] = controls.map(() => []);
  for (let i = 0; i < n0; i++) {
    const a = x.numbers[i];
    const b = y.numbers[i];
    if (a !== a || b !== b) continue;
    const row = x.firstRow + i;
    let ok = true;
    for (const c of controls) {
      const j = row - c.read.firstRow;
      const v = j >= 0 && j < c.read.numbers.length ? c.read.numbers[j] : NaN;
      if (v !== v) {
        ok = false;
        break;
      }
    }
    if (!ok) continue;
    xs.push(a);
    ys.push(b);
    controls.forEach((c, k) => zs[k].push(c.read.numbers[row - c.read.firstRow]));
  }
  try {
    const part = partialCorrelation(xs, ys, zs, { tail: 'both', level });
    const plain = correlate(xs, ys, { method: 'pearson', tail: 'both', level });
    return {
      r: part.statistic,
      lower: part.interval.lower,
      upper: part.interval.upper,
      p: part.pValue,
      n: xs.length,
      plain: plain.statistic,
      plainLower: plain.interval.lower,
      plainUpper: plain.interval.upper,
      controls: controls.map((c) => c.name),
      level,
    };
  } catch (e) {
    if (e instanceof StatsInputError) return { error: e.message.charAt(0).toUpperCase() + e.message.slice(1) + '.' };
    throw e;
  }
}

/**
 * What the partial correlation says next to the plain one, in words: whether a relationship is left once the
 * columns are held fixed. Plain words, not causal claims: holding a column fixed can remove a confounder or a
 * path the effect runs through, and the numbers cannot tell which.
 */
export function partialReading(v: PartialView, names: { x: string; y: string }): string {
  const held = v.controls.length === 1 ? v.controls[0] : `${v.controls.slice(0, -1).join(', ')} and ${v.controls[v.controls.length - 1]}`;
  const zeroIn = (lo: number, hi: number) => lo <= 0 && hi >= 0;
  const plainZero = zeroIn(v.plainLower, v.plainUpper);
  const partZero = zeroIn(v.lower, v.upper);
  const why = `${held} may be a common cause of both, or a step between them; the numbers cannot tell which.`;
  if (!plainZero && partZero) return `Once ${held} is held fixed, no correlation between ${names.x} and ${names.y} is left that these rows can tell from zero. ${why}`;
  if (plainZero && !partZero) return `${names.x} and ${names.y} show a correlation only once ${held} is held fixed: ${held} may mask it in the plain figures, or may be a result of both, which holding it fixed can create; the numbers cannot tell which.`;
  if (!partZero && Math.sign(v.r) !== Math.sign(v.plain)) return `Holding ${held} fixed reverses the direction of the correlation: read neither figure alone.`;
  if (partZero) return `Neither with nor without ${held} held fixed do these rows show a correlation they can tell from zero.`;
  if (Math.abs(v.r) < Math.abs(v.plain) * 0.7) return `The correlation is weaker with ${held} held fixed but still there: part of it goes with ${held}.`;
  if (Math.abs(v.r) > Math.abs(v.plain) / 0.7) return `The correlation is stronger with ${held} held fixed: ${held} may mask part of it in the plain figures, or may be a result of both; the numbers cannot tell which.`;
  return `Holding ${held} fixed changes little: the correlation does not go with ${held}.`;
}
