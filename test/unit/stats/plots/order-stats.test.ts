/**
 * Order statistics by selection and by one-pass ranking, against the definitions computed the slow way (full
 * sort): R's quantile type 7 (Hyndman & Fan 1996, The American Statistician 50:361-365; worked example
 * quantile(1:4, c(.25, .75)) = 1.75, 3.25 in R) and average ranks.
 */
import fc from 'fast-check';
import { selectKth } from '../../../../src/stats/internal/select';
import { ranksAmong, typeSevenQuantiles } from '../../../../src/stats/plots/order-stats';

function bySorting(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  const h = (s.length - 1) * p;
  const lo = Math.floor(h);
  return s[lo] + (h - lo) * (s[Math.min(s.length - 1, lo + 1)] - s[lo]);
}

function averageRank(all: number[], v: number): number {
  const below = all.filter((a) => a < v).length;
  const equal = all.filter((a) => a === v).length;
  return below + (equal - 1) / 2;
}

test('R: quantile(1:4, c(.25, .75), type = 7) = 1.75, 3.25', () => {
  expect(typeSevenQuantiles([1, 2, 3, 4], [0.25, 0.75])).toEqual([1.75, 3.25]);
});

test('quantiles by selection equal quantiles by sorting', () => {
  fc.assert(
    fc.property(fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 1, maxLength: 300 }), fc.double({ min: 0, max: 1, noNaN: true }), (xs, p) => {
      expect(typeSevenQuantiles(xs, [p])[0]).toBeCloseTo(bySorting(xs, p), 10);
    }),
    { numRuns: 300 },
  );
});

test('selectKth returns the k-th order statistic', () => {
  fc.assert(
    fc.property(fc.array(fc.double({ min: -1e6, max: 1e6, noNaN: true }), { minLength: 1, maxLength: 200 }), fc.nat(), (xs, k0) => {
      const k = k0 % xs.length;
      // `+ 0` turns -0 into 0: the two zeros are equal values, and either is a correct k-th order statistic.
      expect(selectKth(Float64Array.from(xs), k) + 0).toBe([...xs].sort((a, b) => a - b)[k] + 0);
    }),
  );
});

test('ranks of a subset among all values are average ranks (ties share the middle rank)', () => {
  expect(Array.from(ranksAmong([5, 1, 3, 3, 9], [3, 9, 1]))).toEqual([1.5, 4, 0]);
  fc.assert(
    fc.property(fc.array(fc.integer({ min: 0, max: 20 }), { minLength: 1, maxLength: 200 }), fc.array(fc.nat(), { minLength: 1, maxLength: 30 }), (all, picks) => {
      const subset = picks.map((p) => all[p % all.length]);
      const got = Array.from(ranksAmong(all, subset));
      expect(got).toEqual(subset.map((v) => averageRank(all, v)));
    }),
    { numRuns: 300 },
  );
});
