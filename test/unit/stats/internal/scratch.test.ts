/**
 * The scratch pool behind the million-row sorts and checks (src/stats/internal/scratch.ts): bounded, reuses what was given
 * back, and lets newer sizes displace older ones. Pure bookkeeping, so the expectations follow from its contract.
 */
import { borrowF64, borrowU32, clearScratch, giveBack, scratchStats } from '../../../../src/stats/internal/scratch';

beforeEach(() => clearScratch());

test('an array given back is lent again for a request of the same size', () => {
  const a = borrowF64(100_000);
  giveBack(a);
  expect(scratchStats().buffers).toBe(1);
  const b = borrowF64(100_000);
  expect(b.buffer).toBe(a.buffer);
  expect(scratchStats().buffers).toBe(0);
});

test('a large buffer is not lent for a request under half its size', () => {
  giveBack(borrowF64(400_000));
  const small = borrowU32(20_000);
  expect(scratchStats().buffers).toBe(1);
  expect(small.length).toBe(20_000);
});

test('small arrays and views that do not start their buffer are never pooled', () => {
  giveBack(new Float64Array(100), borrowF64(50_000).subarray(1));
  expect(scratchStats().buffers).toBe(0);
});

test('at most 16 buffers and 96 MiB are held; the oldest leave first', () => {
  const small = Array.from({ length: 16 }, () => borrowF64(20_000));
  giveBack(...small);
  expect(scratchStats().buffers).toBe(16);
  const big = borrowF64(1_000_000); // 8 MB: one of the small ones must make room
  giveBack(big);
  expect(scratchStats().buffers).toBe(16);
  expect(borrowF64(1_000_000).buffer).toBe(big.buffer);
  for (let k = 0; k < 16; k++) giveBack(new Float64Array(2_000_000)); // 16 MB each
  expect(scratchStats().bytes).toBeLessThanOrEqual(96 * 1024 * 1024);
});
