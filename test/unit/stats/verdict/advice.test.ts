/**
 * The recommended coefficient and the plain reading, on samples whose flags are known from R (checks-r.json):
 * AR(1) rows (dwtest p = 4.7e-7), a spread that widens with x (bptest p < 1e-6), and the strength words of
 * Cohen (1988, ch. 3: .1 small, .3 medium, .5 large).
 */
import { plainReading, recommendCoefficient, strengthWord, tauOnRScale } from '../../../../src/stats/checks/advice';
import { runChecks } from '../../../../src/stats/checks/run-checks';
import { correlate } from '../../../../src/stats/correlation/correlate';
import { Method } from '../../../../src/stats/types';
import { R } from './fixtures';
import { simulate } from './simulated-data';

const opts = (method: Method) => ({ method, tail: 'both' as const, level: 0.95 });

test('strength words at the stated cut-offs', () => {
  expect([0.05, 0.1, 0.29, 0.3, -0.49, 0.5, -1].map(strengthWord)).toEqual(['very small', 'small', 'small', 'medium', 'medium', 'large', 'large']);
  expect(tauOnRScale(1)).toBe(1);
  expect(tauOnRScale(1 / 3)).toBeCloseTo(0.5, 15); // sin(pi/6)
});

test('neighbouring rows alike: the coefficient stays, with a caution about its p-value', () => {
  const s = R.simulated.find((c) => c.kind === 'ar1' && c.n === 99)!;
  expect(s.dw.p_greater).toBeLessThan(1e-5);
  const { x, y } = simulate('ar1', 99);
  const report = runChecks(x, y, { alpha: 0.05 });
  expect(report.flags).toContain('neighbouring rows alike');
  const rec = recommendCoefficient(report, correlate(x, y, opts('pearson')));
  expect(rec.reason).toMatch(/Neighbouring rows are alike, so whichever coefficient you report, its p-value and interval are too optimistic\./);
});

test('uneven spread alone: keep the coefficient, its interval is approximate', () => {
  // The widening sample of 400 (bptest p < 1e-6 in R) also has a uniform, hence non-normal, x; the branch for
  // uneven spread alone is checked on the clean sample of 30 with only that row turned into a flag.
  const s = R.simulated.find((c) => c.kind === 'widening' && c.n === 400)!;
  expect(s.bp.p).toBeLessThan(1e-6);
  const w = simulate('widening', 400);
  expect(runChecks(w.x, w.y, { alpha: 0.05 }).flags).toContain('uneven spread');
  const { x, y } = simulate('plain', 30);
  const clean = runChecks(x, y, { alpha: 0.05 });
  expect(clean.flags).toEqual([]);
  const report = {
    ...clean,
    checks: clean.checks.map((c) => (c.key === 'even-spread' ? { ...c, verdict: 'flag' as const, flag: 'uneven spread' } : c)),
    flags: ['uneven spread'],
  };
  const chosen = correlate(x, y, opts('pearson'));
  expect(recommendCoefficient(report, chosen)).toEqual({ name: 'Pearson', method: 'pearson', changed: false, reason: expect.stringMatching(/^The scatter is uneven across x: Pearson still summarises the trend/) });
  expect(plainReading(chosen, report, 0.05)).toMatch(/^Taken at face value \(see the flags\), across 30 pairs/);
});

test('a clean sample of 30: Pearson as it stands, reading without caveat; a heavy-tailed one: Spearman', () => {
  const { x, y } = simulate('plain', 30);
  const report = runChecks(x, y, { alpha: 0.05 });
  const chosen = correlate(x, y, opts('pearson'));
  expect(report.flags).toEqual([]);
  expect(recommendCoefficient(report, chosen).name).toBe('Pearson');
  expect(plainReading(chosen, report, 0.05)).toMatch(/^Across 30 pairs/);
  // Above 25 pairs the rank coefficient offered is Spearman's.
  const heavy = simulate('heavy', 30);
  const rep2 = runChecks(heavy.x, heavy.y, { alpha: 0.05 });
  const ref = R.simulated.find((c) => c.kind === 'heavy' && c.n === 30)!; // R: Bonferroni p 0.0013 at the 11th pair
  expect(ref.outlier.bonferroni_p).toBeLessThan(0.05);
  expect(rep2.flags).toContain(`outlier at position ${ref.outlier.index + 1}`);
  expect(recommendCoefficient(rep2, correlate(heavy.x, heavy.y, opts('pearson'))).name).toBe('Spearman');
});

test('a negative, non-significant correlation reads as such', () => {
  const x = [1, 2, 3, 4, 5, 6, 7, 8];
  const y = [5, 3, 6, 2, 4, 4, 1, 5];
  const chosen = correlate(x, y, opts('spearman'));
  const text = plainReading(chosen, null, 0.05);
  expect(text).toMatch(/^Across 8 pairs, rho = -?0\.\d+ is a (small|medium|large) negative correlation/);
  expect(text).toMatch(/can neither confirm a correlation nor rule one out/);
});
