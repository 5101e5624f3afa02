/**
 * The inversion count under Kendall's tau-b (src/stats/correlation/kendall.ts). The coefficient itself is held to R
 * and scipy in correlate.test.ts and, at 1,000,000 rows, in hostile/large-ranges.test.ts; here the Fenwick-tree
 * count is held to its definition, pairs i < j with a[i] > a[j], counted one pair at a time.
 */
import { strictInversions } from '../../../../src/stats/correlation/kendall';

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
