/**
 * Two Spearman or two Kendall coefficients from independent groups (DIFF_GROUPS and DIFF_REPORTED with a rank
 * method) against the formulas computed in R 4.2.2 (test/fixtures/compare/rank-diff-r.R, which writes
 * rank-diff-r.json with the formulas as text): Fisher's z with the Bonett & Wright (2000) or Fieller, Hartley &
 * Pearson (1957) standard error, and Zou's (2007) interval from each coefficient's own Fisher-z limits.
 */
import rankJson from '../../../fixtures/compare/rank-diff-r.json';
import { compareIndependent, compareIndependentSamples } from '../../../../src/stats/compare/independent';
import { correlate } from '../../../../src/stats/correlation/correlate';
import { Tail } from '../../../../src/stats/types';

interface RankCase {
  method: 'spearman' | 'kendall';
  r1: number; n1: number; r2: number; n2: number;
  z: number; p_both: number; p_positive: number; p_negative: number;
  lower_95: number; upper_95: number; lower_90: number; upper_90: number;
}
const ref = rankJson as unknown as { spearman: RankCase[]; kendall: RankCase[] };
const cases = [...ref.spearman, ...ref.kendall];
const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1e-300, Math.abs(b));

test.each(cases.map((c) => [`${c.method} r1 ${c.r1} (n ${c.n1}) vs r2 ${c.r2} (n ${c.n2})`, c] as const))('%s', (_l, c) => {
  const tails: [Tail, number][] = [['both', c.p_both], ['positive', c.p_positive], ['negative', c.p_negative]];
  for (const [tail, p] of tails) {
    const res = compareIndependent(c.r1, c.n1, c.r2, c.n2, { tail, level: 0.95, method: c.method });
    expect(rel(res.test.value, c.z)).toBeLessThan(1e-12); // rank-diff-r.json: z
    expect(rel(res.pValue, p)).toBeLessThan(1e-9); // pnorm, per tail
    expect(Math.abs(res.interval.lower - c.lower_95)).toBeLessThan(1e-12); // Zou (2007), 95%
    expect(Math.abs(res.interval.upper - c.upper_95)).toBeLessThan(1e-12);
  }
  const r90 = compareIndependent(c.r1, c.n1, c.r2, c.n2, { tail: 'both', level: 0.9, method: c.method });
  expect(Math.abs(r90.interval.lower - c.lower_90)).toBeLessThan(1e-12); // Zou (2007), 90%
  expect(Math.abs(r90.interval.upper - c.upper_90)).toBeLessThan(1e-12);
});

test('from raw data, each group\'s rank coefficient is computed and compared the same way', () => {
  const x1 = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
  const y1 = [2, 1, 4, 3, 6, 5, 8, 7, 10, 9];
  const x2 = [1, 2, 3, 4, 5, 6, 7, 8];
  const y2 = [8, 6, 7, 5, 3, 4, 1, 2];
  const opts = { tail: 'both' as const, level: 0.95, method: 'spearman' as const };
  const res = compareIndependentSamples(x1, y1, x2, y2, opts);
  const r1 = correlate(x1, y1, { ...opts }).statistic;
  const r2 = correlate(x2, y2, { ...opts }).statistic;
  expect(res.statistic).toBe(r1 - r2);
  expect(res.pValue).toBe(compareIndependent(r1, 10, r2, 8, opts).pValue);
  expect(res.pMethod).toMatch(/Bonett & Wright/);
});

test('polychoric and robust coefficients cannot be compared from r and n alone', () => {
  expect(() => compareIndependent(0.3, 50, 0.1, 60, { tail: 'both', level: 0.95, method: 'biweight' })).toThrow(/Pearson, Spearman and Kendall only/);
});
