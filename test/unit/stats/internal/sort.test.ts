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

/** Full-precision columns whose values agree in their high 32 bits in runs (short runs, a few long runs, long runs
 *  everywhere), so the order rests on the low word's passes, with and without a given initial order. */
test.each([
  ['short runs of nearly equal values', 'short'],
  ['a few long runs under a sixteenth of the rows', 'few-long'],
  ['long runs everywhere (clustered within a millionth)', 'clustered'],
] as const)('stable ascending order on %s', (_label, kind) => {
  const n = 50000;
  const u = lcg(kind.length);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const base = kind === 'clustered' ? 1e6 + Math.floor(u() * 20) : (u() - 0.3) * 100;
    // Offsets below the high word's resolution (2^-20 relative), repeated values among them.
    const near = u() < 0.3 ? base * (1 + Math.floor(u() * 5) * 2 ** -40) : base;
    v[i] = kind === 'few-long' && i % 40 === 0 ? 7 + Math.floor(u() * 1000) * 2 ** -45 : near;
  }
  const order = argsort(v);
  const ref = Array.from({ length: n }, (_, i) => i).sort((a, b) => v[a] - v[b]);
  expect(Array.from(order)).toEqual(ref);
  // Stable with respect to a given initial order as well.
  const initial = Uint32Array.from({ length: n }, (_, i) => n - 1 - i);
  const refInitial = Array.from(initial).sort((a, b) => v[a] - v[b]);
  expect(Array.from(argsort(v, initial))).toEqual(refInitial);
});

/** Full-precision columns where the digit passes see little variation: neighbouring doubles (one high word, so
 *  the high word's passes are all skipped), neighbours across a power of two, and small values across zero. */
test.each([
  ['neighbouring doubles above 1', (u: () => number) => 1 + Math.floor(u() * 5e5) * 2 ** -52],
  ['doubles on both sides of 2', (u: () => number) => 2 + (Math.floor(u() * 2e5) - 1e5) * 2 ** -50],
  ['values on both sides of zero', (u: () => number) => (u() - 0.5) * 1e-3],
] as const)('stable ascending order on %s', (_label, draw) => {
  const n = 40000;
  const u = lcg(_label.length + 3);
  const v = Float64Array.from({ length: n }, () => draw(u));
  const ref = Array.from({ length: n }, (_, i) => i).sort((a, b) => v[a] - v[b]);
  expect(Array.from(argsort(v))).toEqual(ref);
  expect(Array.from(averageRanks(v))).toEqual(Array.from(averageRanks(Array.from(v), Uint32Array.from(ref))));
});
