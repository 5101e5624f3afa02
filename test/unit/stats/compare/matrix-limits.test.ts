/**
 * The size limit of the correlation matrix: an oversized request is refused from its dimensions, before any cell
 * is read, and the cost model behind the limit (MATRIX_LIMITS in src/stats/compare/matrix.ts) behaves as documented.
 * No wall-clock check of the model here: timings inside jest run many times slower than in node or a browser,
 * and on a shared 2-core machine other work makes them swing by a factor of ten (see MATRIX_LIMITS for how the
 * figures were measured).
 */
import { MATRIX } from '../../../../src/functions/fn-compare';
import { CellError } from '../../../../src/functions/errors';
import { assertMatrixFits, correlationMatrix, MATRIX_LIMITS, predictedMatrixMs } from '../../../../src/stats/compare/matrix';
import { StatsInputError } from '../../../../src/stats/types';

/** Park & Miller (1988) uniforms: deterministic data. */
function columns(k: number, n: number): Float64Array[] {
  let s = 12345;
  const next = () => (s = (s * 16807) % 2147483647) / 2147483647;
  const base = Array.from({ length: n }, next);
  return Array.from({ length: k }, () => Float64Array.from(base, (b) => b + next()));
}

/** Largest row count the dimension check accepts for k columns. */
function rowsAtLimit(k: number, method: 'pearson' | 'kendall'): number {
  let lo = 3;
  let hi = 2_000_000;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    try {
      assertMatrixFits(k, mid, method);
      lo = mid;
    } catch {
      hi = mid;
    }
  }
  return lo;
}

/** A range whose rows count every cell read. */
function watchedRange(rows: number, cols: number): { range: unknown[][]; reads: () => number } {
  let reads = 0;
  const range: unknown[][] = [];
  for (let r = 0; r < rows; r++) {
    const cells = new Array(cols).fill(1);
    range.push(
      new Proxy(cells, {
        get(target, key, receiver) {
          if (typeof key === 'string' && /^\d+$/.test(key)) reads++;
          return Reflect.get(target, key, receiver);
        },
      }),
    );
  }
  return { range, reads: () => reads };
}

describe('matrix size limit', () => {
  test('10,000 columns are refused before any cell is read, in well under a second', () => {
    const { range, reads } = watchedRange(20, 10_000);
    const t0 = performance.now();
    let caught: unknown;
    try {
      MATRIX(range);
    } catch (e) {
      caught = e;
    }
    const ms = performance.now() - t0;
    expect(caught).toBeInstanceOf(CellError);
    expect((caught as CellError).code).toBe('#VALUE!');
    expect((caught as CellError).message).toMatch(/10,000 columns is too many for one matrix: at most 200/);
    expect(reads()).toBe(0);
    expect(ms).toBeLessThan(1000);
  });

  test('too many rows for the columns: refused before the block is read, and the message says how far to go', () => {
    const { range, reads } = watchedRange(30_000, 150);
    expect(() => MATRIX(range, 'kendall')).toThrow(/Kendall matrix of 150 columns and 30,000 rows is too much to compute promptly: with 150 columns use at most \d+ rows/);
    // One cell: the last row's first, which shows the block is filled to the end (a whole-column reference with
    // blank rows below its data would be judged by the rows it fills instead).
    expect(reads()).toBe(1);
    // 20 columns of 80,000 rows: 190 pairs and 1.6 million cells read, about 0.8 s by the cost model (src/stats/compare/matrix.ts).
    expect(() => assertMatrixFits(20, 80_000, 'pearson')).not.toThrow();
    expect(() => assertMatrixFits(201, 10, 'pearson')).toThrow(StatsInputError);
  });

  test('the cost model: within budget at the limit, over it one row later, and rising with rows and columns', () => {
    for (const [k, method] of [[200, 'pearson'], [40, 'pearson'], [60, 'kendall'], [15, 'kendall']] as const) {
      const n = rowsAtLimit(k, method);
      const pairs = (k * (k - 1)) / 2;
      const at = (rows: number) => (method === 'pearson' ? predictedMatrixMs(pairs, 0, rows, k) : predictedMatrixMs(0, pairs, rows, k));
      expect(at(n)).toBeLessThanOrEqual(MATRIX_LIMITS.budgetMs);
      expect(at(n + 1)).toBeGreaterThan(MATRIX_LIMITS.budgetMs);
    }
    expect(predictedMatrixMs(0, 100, 1000, 15)).toBeGreaterThan(predictedMatrixMs(100, 0, 1000, 15));
  });

  test('a Spearman request with gaps is re-checked once the gaps are known', () => {
    const k = 60;
    const cols = columns(k, rowsAtLimit(k, 'pearson'));
    cols.forEach((c, i) => (c[i] = NaN)); // every column has a gap: every pair is ranked on its own
    expect(() => correlationMatrix(cols, 'spearman')).toThrow(/too much to compute promptly/);
  });
});
