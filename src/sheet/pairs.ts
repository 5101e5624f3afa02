/**
 * Complete rows: which rows of several columns read by cells.ts hold a number in every column, and the columns
 * restricted to them, with the position of each kept row. The one rule for the cell functions (pairwise for two
 * ranges, row-wise for the comparisons and partial correlations) and the panel (whose points lead back to their
 * sheet rows through the positions). Pure.
 */
import { ColumnAllocator } from './cells';

/** Columns restricted to their complete rows. */
export interface CompleteRows {
  /** The kept rows of each column, in order. When every row is complete these are the input columns themselves. */
  columns: Float64Array[];
  /** Position (0-based) in the input of each kept row; null when every row was kept, so row i is input row i
   *  (saves a 4 MB array on a million complete rows). */
  index: Int32Array | null;
  /** Rows left out because a column held no number there. */
  skipped: number;
}

const fresh: ColumnAllocator = (n) => new Float64Array(n);

/**
 * Keeps the rows where every column holds a number (NaN marks a cell that does not count).
 * @param alloc where the kept columns are made when rows are dropped (default: new arrays)
 * @example completeRows([Float64Array.of(1, NaN, 3), Float64Array.of(4, 5, 6)]).index // Int32Array [0, 2]
 */
export function completeRows(columns: Float64Array[], alloc: ColumnAllocator = fresh): CompleteRows {
  const k = columns.length;
  const n = k === 0 ? 0 : columns[0].length;
  for (const c of columns) if (c.length !== n) throw new RangeError('the columns differ in length');
  if (k === 2) return completePairs(columns[0], columns[1], alloc);
  const keep = new Uint8Array(n);
  let used = 0;
  for (let i = 0; i < n; i++) {
    let ok = 1;
    for (let c = 0; c < k; c++) {
      const v = columns[c][i];
      if (v !== v) {
        ok = 0;
        break;
      }
    }
    keep[i] = ok;
    used += ok;
  }
  if (used === n) return { columns, index: null, skipped: 0 };
  const out = columns.map(() => alloc(used));
  const index = new Int32Array(used);
  let j = 0;
  for (let i = 0; i < n; i++) {
    if (!keep[i]) continue;
    for (let c = 0; c < k; c++) out[c][j] = columns[c][i];
    index[j] = i;
    j++;
  }
  return { columns: out, index, skipped: n - used };
}

/** The two-column case, in loops V8 keeps monomorphic (a million rows is the design size). */
function completePairs(xs: Float64Array, ys: Float64Array, alloc: ColumnAllocator): CompleteRows {
  const n = xs.length;
  let used = 0;
  for (let k = 0; k < n; k++) if (xs[k] === xs[k] && ys[k] === ys[k]) used++;
  // Every row pairs (the usual case): the columns just read are the pairs; no copy, no index.
  if (used === n) return { columns: [xs, ys], index: null, skipped: 0 };
  const x = alloc(used);
  const y = alloc(used);
  const index = new Int32Array(used);
  let j = 0;
  for (let k = 0; k < n; k++) {
    const a = xs[k];
    const b = ys[k];
    if (a === a && b === b) {
      x[j] = a;
      y[j] = b;
      index[j] = k;
      j++;
    }
  }
  return { columns: [x, y], index, skipped: n - used };
}
