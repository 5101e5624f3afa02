/**
 * The counting under Kendall's tau-b and Spearman's ranks (src/stats/correlation/kendall.ts, codes.ts). The
 * coefficients themselves are held to R and scipy in correlate.test.ts and, at 1,000,000 rows, in
 * hostile/large-ranges.test.ts; here the Fenwick-tree count is held to its definition (pairs i < j with
 * a[i] > a[j], counted one pair at a time), and the paths that skip the sort to the paths that sort.
 */
import { Codes, countingRanks, MAX_CODE_SPAN, smallSpanCodes } from '../../../../src/stats/correlation/codes';
import { kendallCounts, kendallFromTable, strictInversions } from '../../../../src/stats/correlation/kendall';
import { averageRanks } from '../../../../src/stats/correlation/ranks';

function byDefinition(a: Int32Array): number {
  let count = 0;
  for (let i = 0; i < a.length; i++) for (let j = i + 1; j < a.length; j++) if (a[i] > a[j]) count++;
  return count;
}

describe('strictInversions', () => {
  test.each([
    [1, 1],
    [2, 2],
    [50, 7],
    [400, 3],
    [1500, 1500],
    [2000, 200],
  ])('%i values over %i ranks, ties included, match the pair-by-pair count', (n, ranks) => {
    let s = 20261203 + n;
    const a = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
      a[i] = Math.floor((s / 4294967296) * ranks);
    }
    expect(strictInversions(a, ranks)).toBe(byDefinition(a));
  });

  test('a descending run of n distinct ranks has n(n-1)/2 inversions, an ascending one none', () => {
    const n = 70000; // above the scratch pool's minimum, so the tree is a pooled (stale) buffer
    const down = new Int32Array(n);
    const up = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      down[i] = n - 1 - i;
      up[i] = i;
    }
    expect(strictInversions(down, n)).toBe((n * (n - 1)) / 2);
    expect(strictInversions(up, n)).toBe(0);
  });
});

describe('counts without a sort, for few-valued columns', () => {
  // The frequency-table counts and the counting mid-ranks must be exactly what the sorting paths give (which
  // correlate.test.ts holds to R and scipy), on ratings, small counts and amounts to the cent.
  const columns = (n: number, kind: 'ratings' | 'counts' | 'cents', seed: number) => {
    let s = seed;
    const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const a = u();
      const b = u();
      if (kind === 'ratings') {
        x[i] = 1 + Math.floor(a * 7);
        y[i] = Math.min(7, Math.max(1, Math.round(x[i] + 3 * (b - 0.5))));
      } else if (kind === 'counts') {
        x[i] = Math.floor(a * a * 40);
        y[i] = Math.floor(b * 25) + (x[i] > 20 ? 5 : 0);
      } else {
        x[i] = Math.round((20 + 15 * a) * 100) / 100;
        y[i] = Math.round((x[i] * 0.4 + 9 * b) * 100) / 100;
      }
    }
    return { x, y };
  };

  test.each([
    [60, 'ratings'],
    [5000, 'ratings'],
    [3000, 'counts'],
    [40000, 'counts'],
  ] as const)('%i rows of %s: the table gives the sorting path\'s counts exactly', (n, kind) => {
    const { x, y } = columns(n, kind, 7 + n);
    const cx = smallSpanCodes(x, MAX_CODE_SPAN);
    const cy = smallSpanCodes(y, MAX_CODE_SPAN);
    expect(cx).not.toBeNull();
    expect(cy).not.toBeNull();
    const table = kendallFromTable(cx as Codes, cy as Codes);
    expect(table).not.toBeNull();
    expect(table).toEqual(kendallCounts(x, y));
  });

  test('a table larger than twice the rows is declined', () => {
    const { x, y } = columns(500, 'cents', 11);
    expect(kendallFromTable(smallSpanCodes(x, MAX_CODE_SPAN) as Codes, smallSpanCodes(y, MAX_CODE_SPAN) as Codes)).toBeNull();
  });

  test.each([
    [80, 'ratings'],
    [30000, 'counts'],
    [30000, 'cents'],
  ] as const)('%i rows of %s: counted mid-ranks equal the sorted ones bit for bit', (n, kind) => {
    const { x, y } = columns(n, kind, 3 + n);
    for (const v of [x, y]) {
      const c = smallSpanCodes(v, MAX_CODE_SPAN) as Codes;
      expect(Array.from(countingRanks(c))).toEqual(Array.from(averageRanks(v)));
    }
  });

  test('a column with more places than nine, or a span past the limit, gets no codes', () => {
    expect(smallSpanCodes(Float64Array.of(1, Math.PI, 2), MAX_CODE_SPAN)).toBeNull();
    expect(smallSpanCodes(Float64Array.of(0, 1e7), MAX_CODE_SPAN)).toBeNull();
    expect(smallSpanCodes(Float64Array.of(0.5, 2.25, -1), 325)).toEqual({ codes: Int32Array.of(150, 325, 0), span: 325 });
    expect(smallSpanCodes(Float64Array.of(0.5, 2.25, -1), 324)).toBeNull();
  });
});
