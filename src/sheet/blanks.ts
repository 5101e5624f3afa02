/**
 * Blanks passed as zeros. Some desktop builds of Excel hand an empty cell to a custom function as the number 0,
 * which no function can tell from a typed 0. A long run of rows at the end of the ranges where every cell is 0 is
 * the signature of that (an over-long or whole-column reference such as B:B); such input is refused with a
 * message rather than answered with a wrong number. Shorter runs cannot be told apart from real zeros: the README
 * says so. The panel reads cells through the Excel API, which gives blanks as "", so this applies to the cell
 * functions only. Pure.
 */
import { StatsInputError } from '../stats/types';

/** Trailing rows where every cell is 0 from which the input is taken for blanks passed as zeros. */
export const ZERO_TAIL_LIMIT = 100;

/**
 * Refuses columns ending in ZERO_TAIL_LIMIT or more rows that are 0 in every column.
 * @param what the ranges in the message, e.g. "x and y" or "data"
 * @param example a range of filled rows to suggest, e.g. "B2:B500"
 * @param pair true for two single-column ranges (x and y), false for a block or several ranges
 */
export function refuseBlanksAsZeros(columns: ArrayLike<number>[], what: string, example: string, pair: boolean): void {
  if (columns.length === 0) return;
  const n = columns[0].length;
  let k = n - 1;
  while (k >= 0 && columns.every((c) => c[k] === 0)) k--;
  const run = n - 1 - k;
  if (run >= ZERO_TAIL_LIMIT) {
    throw new StatsInputError(
      'out-of-range',
      `the last ${run} rows of ${what} are all 0: these look like empty cells that this version of Excel passes as 0. ` +
        `Pass only the filled rows (e.g. ${example}) or ${pair ? 'a table column instead of a whole column' : 'table columns instead of whole columns'}`,
    );
  }
}
