/**
 * Selection (Floyd & Rivest 1975) against the definition computed the slow way: the k-th value of the sorted
 * stretch, and the partition it leaves behind (nothing larger to the left of k, nothing smaller to the right),
 * on long arrays (past the 600-element stretch where the sampled bracket starts) with and without many ties.
 */
import fc from 'fast-check';
import { selectKth, selectKthAndNext, selectKthAndPrevious } from '../../../../src/stats/internal/select';

const sorted = (a: ArrayLike<number>, lo: number, hi: number) => Array.from(a).slice(lo, hi + 1).sort((p, q) => p - q);

test('selectKth on long stretches returns the k-th order statistic and leaves the stretch partitioned around it', () => {
  fc.assert(
    fc.property(
      fc.integer({ min: 601, max: 6000 }),
      fc.integer({ min: 1, max: 1e6 }),
      fc.boolean(),
      fc.nat(),
      fc.nat(),
      fc.nat(),
      (n, range, ties, k0, l0, r0) => {
        let s = k0 + 1;
        const rnd = () => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
        const a = Float64Array.from({ length: n }, () => (ties ? Math.floor(rnd() * 7) : (rnd() - 0.5) * range));
        const before = Float64Array.from(a);
        const left = l0 % (n >> 2);
        const right = n - 1 - (r0 % (n >> 2));
        const k = left + (k0 % (right - left + 1));
        const ref = sorted(a, left, right);
        expect(selectKth(a, k, left, right)).toBe(ref[k - left]);
        for (let i = left; i < k; i++) expect(a[i]).toBeLessThanOrEqual(a[k]);
        for (let i = k + 1; i <= right; i++) expect(a[i]).toBeGreaterThanOrEqual(a[k]);
        // Outside the stretch nothing moved, and inside it the same values are there.
        for (let i = 0; i < left; i++) expect(a[i]).toBe(before[i]);
        for (let i = right + 1; i < n; i++) expect(a[i]).toBe(before[i]);
        expect(sorted(a, left, right)).toEqual(ref);
      },
    ),
    { numRuns: 60 },
  );
});

test('the neighbouring order statistics come out with the k-th', () => {
  fc.assert(
    fc.property(fc.array(fc.integer({ min: -50, max: 50 }), { minLength: 2, maxLength: 3000 }), fc.nat(), (xs, k0) => {
      const k = k0 % xs.length;
      const ref = [...xs].sort((p, q) => p - q);
      expect(selectKthAndNext(Float64Array.from(xs), k)).toEqual([ref[k], k + 1 < xs.length ? ref[k + 1] : Infinity]);
      expect(selectKthAndPrevious(Float64Array.from(xs), k)).toEqual([ref[k], k > 0 ? ref[k - 1] : -Infinity]);
    }),
    { numRuns: 200 },
  );
});
