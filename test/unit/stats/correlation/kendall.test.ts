/**
 * The counting under Kendall's tau-b and Spearman's ranks (src/stats/correlation/kendall.ts, codes.ts). The
 * coefficients themselves are held to R and scipy in correlate.test.ts and, at 1,000,000 rows, in
 * hostile/large-ranges.test.ts; here the counts of the Fenwick-tree path are held to their definitions, counted
 * one pair at a time, and the paths that skip the sort to the paths that sort.
 */
import { Codes, countingRanks, MAX_CODE_SPAN, smallSpanCodes } from '../../../../src/stats/correlation/codes';
import { kendallCounts, kendallFromTable } from '../../../../src/stats/correlation/kendall';
import { averageRanks } from '../../../../src/stats/correlation/ranks';

/** Kendall's counts one pair at a time, from their definitions. */
function byDefinition(x: Float64Array, y: Float64Array) {
  let discordant = 0;
  let tiedX = 0;
  let tiedY = 0;
  let tiedXY = 0;
  for (let i = 0; i < x.length; i++) {
    for (let j = i + 1; j < x.length; j++) {
      const dx = x[i] - x[j];
      const dy = y[i] - y[j];
      if (dx * dy < 0) discordant++;
      if (dx === 0) tiedX++;
      if (dy === 0) tiedY++;
      if (dx === 0 && dy === 0) tiedXY++;
    }
  }
  return { discordant, tiedX, tiedY, tiedXY };
}

describe('kendallCounts', () => {
  test.each([
    [5, 1, 1],
    [50, 7, 7],
    [400, 3, 50],
    [1500, 1500, 1500],
    [2000, 200, 9],
  ])('%i rows with %i and %i distinct values: the pair counts match the pair-by-pair ones', (n, kx, ky) => {
    let s = 20261203 + n;
    const u = () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) + 0.5) / 4294967296;
    const x = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = Math.floor(u() * kx) + 0.25;
      y[i] = kx === 1500 ? Math.sin(i) : Math.floor(((x[i] + u() * kx) / 2 / kx) * ky);
    }
    const c = kendallCounts(x, y);
    expect({ discordant: c.discordant, tiedX: c.tiedX, tiedY: c.tiedY, tiedXY: c.tiedXY }).toEqual(byDefinition(x, y));
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
    // places that grow along the column (0, then 1, 2 and 3): the codes before are made again at three places
    expect(smallSpanCodes(Float64Array.of(1, 2, 3.5, 4.25, 0.125), 5000)).toEqual({ codes: Int32Array.of(875, 1875, 3375, 4125, 0), span: 4125 });
  });
});
