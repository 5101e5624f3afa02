/**
 * The bootstrap's generator against a C reference with true unsigned 32-bit arithmetic
 * (test/fixtures/bootstrap/xoshiro-ref.c, gcc 12.2, output xoshiro-ref.json): xoshiro128** (Blackman & Vigna
 * 2021) seeded by SplitMix32, and Lemire's (2019) unbiased mapping to [0, n). Plus the seed from the data.
 */
import refJson from '../../../fixtures/bootstrap/xoshiro-ref.json';
import { seedFromData, Xoshiro128 } from '../../../../src/stats/bootstrap/rng';

const ref = refJson as unknown as { cases: { seed: number; outputs: number[]; below_1000003: number[] }[] };

test.each(ref.cases.map((c) => [c.seed, c] as const))('seed %d: the same 32-bit outputs and the same draws in [0, 1000003) as the C reference', (_s, c) => {
  const g = new Xoshiro128(c.seed);
  expect(Array.from({ length: 12 }, () => g.nextU32())).toEqual(c.outputs);
  expect(Array.from({ length: 12 }, () => g.below(1000003))).toEqual(c.below_1000003);
});

test('fillCounts draws exactly what below() draws, one by one', () => {
  const n = 1000003;
  const a = new Xoshiro128(7);
  const b = new Xoshiro128(7);
  const counts = new Int32Array(n);
  a.fillCounts(counts, n, 5000);
  const expected = new Int32Array(n);
  for (let k = 0; k < 5000; k++) expected[b.below(n)]++;
  expect(Array.from(counts)).toEqual(Array.from(expected));
  expect(a.nextU32()).toBe(b.nextU32());
});

test('the seed depends on every bit of the data and on nothing else', () => {
  const x = [1.5, 2.25, 3];
  expect(seedFromData(x, [4, 5, 6])).toBe(seedFromData(Float64Array.from(x), Float64Array.of(4, 5, 6)));
  expect(seedFromData(x, [4, 5, 6])).not.toBe(seedFromData(x, [4, 5, 6 + 2 ** -50]));
  expect(seedFromData([0], [1])).toBe(seedFromData([-0], [1]));
  expect(seedFromData([1, 2], [3])).not.toBe(seedFromData([1], [2, 3]));
});
