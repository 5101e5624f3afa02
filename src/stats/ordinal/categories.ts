/**
 * Ordered categories of a rating-scale column: its distinct values in ascending order, and each row's category
 * as a small integer code, found in one pass without per-row objects.
 */
import { StatsInputError } from '../types';

/** The most categories an ordinal column may have (a 10-point scale; more look like a measured quantity). */
export const MAX_CATEGORIES = 10;

/** A column read as ordered categories. */
export interface OrdinalColumn {
  /** The distinct values, ascending: category c is values[c]. */
  values: number[];
  /** Each row's category, 0 .. values.length − 1. */
  codes: Uint8Array;
  /** Rows in each category. */
  counts: number[];
}

/**
 * Reads `column` as ordered categories (its distinct values, ascending). `fn` and `label` name the coefficient and
 * the column in the messages ("polychoric", "x").
 * @throws StatsInputError 'bad-option' for a value that is not a finite number or for more than MAX_CATEGORIES
 *   distinct values; 'constant' when the column holds one value only; 'too-few' when it is empty.
 */
export function readCategories(column: ArrayLike<number>, fn: string, label: string): OrdinalColumn {
  const n = column.length;
  if (n === 0) throw new StatsInputError('too-few', `${fn} needs at least 2 rows`);
  const found: number[] = [];
  const codes = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const v = column[i];
    let c = 0;
    while (c < found.length && found[c] !== v) c++;
    if (c === found.length) {
      if (!Number.isFinite(v)) {
        throw new StatsInputError('bad-option', `${fn} needs a number in every row: ${label} has ${String(v)} in row ${i + 1}`);
      }
      if (found.length === MAX_CATEGORIES) throw tooManyCategories(column, fn, label);
      found.push(v);
    }
    codes[i] = c;
  }
  if (found.length < 2) {
    throw new StatsInputError('constant', `${fn} needs at least 2 categories: every value of ${label} is ${found[0]}`);
  }
  // Renumber the codes so that category order follows value order.
  const order = found.map((_, c) => c).sort((a, b) => found[a] - found[b]);
  const rank = new Uint8Array(found.length);
  for (let r = 0; r < order.length; r++) rank[order[r]] = r;
  const counts = new Array<number>(found.length).fill(0);
  for (let i = 0; i < n; i++) {
    const c = rank[codes[i]];
    codes[i] = c;
    counts[c]++;
  }
  return { values: order.map((c) => found[c]), codes, counts };
}

function tooManyCategories(column: ArrayLike<number>, fn: string, label: string): StatsInputError {
  // Only on the way out: count every distinct value for the message (a non-number among them is its own error).
  const seen = new Set<number>();
  for (let i = 0; i < column.length; i++) {
    const v = column[i];
    if (!Number.isFinite(v)) {
      return new StatsInputError('bad-option', `${fn} needs a number in every row: ${label} has ${String(v)} in row ${i + 1}`);
    }
    seen.add(v);
  }
  return new StatsInputError(
    'bad-option',
    `${fn} needs ordered categories: ${label} has ${seen.size} distinct values, at most ${MAX_CATEGORIES} are allowed`,
  );
}

/**
 * Number of distinct values in `column`, counting at most `limit` (by default one more than MAX_CATEGORIES, which
 * is all a choice between an ordinal and a continuous column needs): O(n·limit) time, no per-row allocation.
 * @example distinctCount([3, 1, 3, 2]) // 3
 * @example distinctCount(Float64Array.from({ length: 1000 }, (_, i) => i)) // 11
 */
export function distinctCount(column: ArrayLike<number>, limit = MAX_CATEGORIES + 1): number {
  const found: number[] = [];
  for (let i = 0; i < column.length && found.length < limit; i++) {
    const v = column[i];
    let c = 0;
    while (c < found.length && !(found[c] === v || (found[c] !== found[c] && v !== v))) c++;
    if (c === found.length) found.push(v);
  }
  return found.length;
}

/**
 * Whether a column looks like a rating-scale item, so that polychoric or polyserial coefficients are worth
 * suggesting: every value is a finite whole number and there are 2 to MAX_CATEGORIES (10) distinct values.
 * (Missing rows are expected to be removed before; a blank read as NaN makes the answer false.) Stops at the
 * first value that breaks the rule.
 * @example looksOrdinal([1, 2, 2, 5, 4, 3]) // true
 * @example looksOrdinal([1.5, 2, 3]) // false
 */
export function looksOrdinal(column: ArrayLike<number>): boolean {
  const found: number[] = [];
  for (let i = 0; i < column.length; i++) {
    const v = column[i];
    if (!Number.isInteger(v)) return false;
    let c = 0;
    while (c < found.length && found[c] !== v) c++;
    if (c === found.length) {
      if (found.length === MAX_CATEGORIES) return false;
      found.push(v);
    }
  }
  return found.length >= 2;
}
