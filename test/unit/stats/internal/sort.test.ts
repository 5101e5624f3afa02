/** argsort against the definition: a stable ascending order, checked at sizes on both sides of the switch from
 * the comparison sort to the radix passes (64 keys) and at sizes where a pass is skipped or not, with negatives,
 * -0, ties, huge and tiny magnitudes, and on decimal columns (one 32-bit key word instead of two). */
import { argsort } from '../../../../src/stats/internal/sort';
import { averageRanks } from '../../../../src/stats/correlation/ranks';

function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296;
}

test.each([5, 63, 64, 65, 1000, 32767, 32768, 100000])('stable ascending order, n = %i', (n) => {
  const u = lcg(n);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const k = Math.floor(u() * 7);
    v[i] = k === 0 ? -0 : k === 1 ? 0 : k === 2 ? Math.round(u() * 20) - 10 : k === 3 ? (u() - 0.5) * 1e300 : k === 4 ? (u() - 0.5) * 1e-300 : u() - 0.5;
  }
  const order = argsort(v);
  // reference: Array.prototype.sort is stable (ES2019) and numeric with this comparator
  const ref = Array.from({ length: n }, (_, i) => i).sort((a, b) => v[a] - v[b]);
  // -0 and 0 compare equal, so stability decides their order in both
  expect(Array.from(order)).toEqual(ref);
});

test('average ranks of a small example by hand: ties share the mean of their ranks', () => {
  expect(Array.from(averageRanks([10, 20, 20, 30, 20]))).toEqual([1, 3, 3, 5, 3]);
});

test.each([100, 5000, 70000])('decimal columns (one-word keys) sort as the definition, n = %i', (n) => {
  const u = lcg(n + 1);
  const v = Float64Array.from({ length: n }, () => Math.round((u() - 0.3) * 1e6) / 100);
  const ref = Array.from({ length: n }, (_, i) => i).sort((a, b) => v[a] - v[b]);
  expect(Array.from(argsort(v))).toEqual(ref);
});
