/**
 * Coefficients, p-values and intervals against outside references:
 * - R 4.2.2 stats::cor.test / cor / lm on datasets in test/fixtures/correlation/r-correlation.json
 *   (script: make-fixture.R beside it);
 * - scipy 1.10.1 spearmanr / kendalltau on the same datasets (scipy-spearman.json, make-fixture-scipy.py);
 * - published values collected in test/references.md, named beside each check.
 */
import { checkReported, correlate, spearmanTApproximation } from '../../../../src/stats/correlation/correlate';
import { fitLine } from '../../../../src/stats/correlation/regression';
import { Method, Tail } from '../../../../src/stats/types';
import { expectRel } from '../../../helpers/close';
import rFix from '../../../fixtures/correlation/r-correlation.json';
import sFix from '../../../fixtures/correlation/scipy-spearman.json';
import kFix from '../../../fixtures/correlation/exact-kendall.json';

type RCase = (typeof rFix.cases)[number] & Record<string, unknown>;
const R_ALT: Record<Tail, string> = { both: 'two.sided', positive: 'greater', negative: 'less' };
const S_ALT: Record<Tail, string> = { both: 'two-sided', positive: 'greater', negative: 'less' };
const TAILS: Tail[] = ['both', 'positive', 'negative'];
const run = (x: number[], y: number[], method: Method, tail: Tail = 'both', level = 0.95) =>
  correlate(x, y, { method, tail, level });

describe.each(rFix.cases.map((c) => [c.name, c] as [string, RCase]))('R 4.2.2 cor.test reference: %s', (_name, c) => {
  const x = c.x as number[];
  const y = c.y as number[];

  test('Pearson r, t and 95%/90% Fisher-z intervals (cor.test)', () => {
    const res = run(x, y, 'pearson');
    expectRel(res.statistic, c.pearson_r, 1e-9, 'r');
    expectRel(res.test.value, c.pearson_t, 1e-9, 't');
    expectRel(res.interval.lower, c.pearson_ci95[0], 1e-9, 'lower');
    expectRel(res.interval.upper, c.pearson_ci95[1], 1e-9, 'upper');
    const r90 = run(x, y, 'pearson', 'both', 0.9);
    expectRel(r90.interval.lower, c.pearson_ci90[0], 1e-9, 'lower 90');
    expectRel(r90.interval.upper, c.pearson_ci90[1], 1e-9, 'upper 90');
  });

  test.each(TAILS)('Pearson p-value, tail %s (cor.test alternative)', (tail) => {
    expectRel(run(x, y, 'pearson', tail).pValue, c[`pearson_p_${R_ALT[tail]}`] as number, 1e-6, 'p');
  });

  test('Spearman rho and Bonett-Wright interval (cor, formula evaluated in R)', () => {
    const res = run(x, y, 'spearman');
    expectRel(res.statistic, c.spearman_rho, 1e-9, 'rho');
    expectRel(res.interval.lower, c.spearman_ci95[0], 1e-9, 'lower');
    expectRel(res.interval.upper, c.spearman_ci95[1], 1e-9, 'upper');
  });

  test.each(TAILS)('Kendall tau-b and p-value, tail %s (cor.test: exact without ties for n < 50, else normal, no continuity correction)', (tail) => {
    const res = run(x, y, 'kendall', tail);
    expectRel(res.statistic, c.kendall_tau, 1e-9, 'tau');
    const rP = c[`kendall_p_${R_ALT[tail]}`] as number;
    if (c.kendall_exact) {
      // R forms the exact upper tail as 1 - cdf (absolute accuracy ~1e-16 only): compare absolutely with R, and
      // relatively with exact integer Mahonian counts (exact-kendall.json, Python fractions).
      expect(Math.abs(res.pValue - rP)).toBeLessThan(1e-12);
      const k = kFix.cases.find((e) => e.name === c.name) as Record<string, number | string>;
      expectRel(res.pValue, k[`p_${S_ALT[tail]}`] as number, 1e-10, 'exact p');
    } else {
      expectRel(res.pValue, rP, 1e-6, 'p');
    }
    expectRel(res.interval.lower, c.kendall_ci95[0], 1e-9, 'lower');
    expectRel(res.interval.upper, c.kendall_ci95[1], 1e-9, 'upper');
  });

  test('slope and intercept (lm)', () => {
    const fit = fitLine(x, y);
    expectRel(fit.slope, c.lm_slope, 1e-9, 'slope');
    expectRel(fit.intercept, c.lm_intercept, 1e-9, 'intercept');
  });
});

describe.each(sFix.cases.map((c) => [c.name, c] as [string, Record<string, number | string>]))('scipy 1.10.1 spearmanr reference: %s', (name, s) => {
  const c = rFix.cases.find((k) => k.name === name)!;
  test.each(TAILS)('Spearman p-value (t approximation), tail %s', (tail) => {
    const res = run(c.x as number[], c.y as number[], 'spearman', tail);
    expectRel(res.statistic, s.spearman_rho as number, 1e-9, 'rho');
    // The t approximation is what Covary uses with ties or beyond 1,290 rows; without ties below that it uses the
    // null distribution of S (held against R in spearman-exact.test.ts), so here the approximation is checked itself.
    expectRel(spearmanTApproximation(res.statistic, res.n, tail).p, s[`spearman_p_${S_ALT[tail]}`] as number, 1e-6, 'p');
    if (/t approximation/.test(res.pMethod)) expectRel(res.pValue, s[`spearman_p_${S_ALT[tail]}`] as number, 1e-6, 'p as used');
  });
  test('Kendall tau-b (kendalltau variant b)', () => {
    expectRel(run(c.x as number[], c.y as number[], 'kendall').statistic, s.kendall_tau_b as number, 1e-9, 'tau-b');
  });
});

describe('published values (test/references.md)', () => {
  const hwX = [44.4, 45.9, 41.9, 53.3, 44.7, 44.1, 50.7, 45.2, 60.1];
  const hwY = [2.6, 3.1, 2.5, 5.0, 3.6, 4.0, 5.2, 2.8, 3.8];

  test('R ?cor.test example (Hollander & Wolfe 1973): r, CI, p two-sided and one-sided', () => {
    const res = run(hwX, hwY, 'pearson');
    expectRel(res.statistic, 0.5711816, 1e-6);
    expectRel(res.interval.lower, -0.1497426, 1e-6);
    expectRel(res.interval.upper, 0.8955795, 1e-6);
    expect(res.pValue).toBeCloseTo(0.1082, 4);
    expect(run(hwX, hwY, 'pearson', 'positive').pValue).toBeCloseTo(0.05409, 5);
  });

  test('scipy test suite citing R: Kendall exact p, same data', () => {
    expectRel(run(hwX, hwY, 'kendall').statistic, 0.4444444, 1e-6);
    expectRel(run(hwX, hwY, 'kendall').pValue, 0.1194389329806, 1e-10);
    expectRel(run(hwX, hwY, 'kendall', 'positive').pValue, 0.0597194664903, 1e-10);
  });

  test('Spearman rho = 0.6, t-approximation p = 0.08762 (test/references.md); exact p as R cor.test', () => {
    const res = run(hwX, hwY, 'spearman');
    expectRel(res.statistic, 0.6, 1e-12);
    expect(spearmanTApproximation(res.statistic, 9, 'both').p).toBeCloseTo(0.08762, 5);
    // R 4.2.2: cor.test(x, y, method = "spearman", alternative = a)$p.value (no ties, n = 9: exact enumeration),
    // recorded in test/references.md: 0.096797839506172836 (two-sided), 0.048398919753086418 (greater).
    expectRel(res.pValue, 0.096797839506172836, 1e-12);
    expectRel(run(hwX, hwY, 'spearman', 'positive').pValue, 0.048398919753086418, 1e-12);
  });

  test('scipy pearsonr docstring: r, p, 90% CI', () => {
    const x = [1, 2, 3, 4, 5, 6, 7];
    const y = [10, 9, 2.5, 6, 4, 3, 2];
    const res = run(x, y, 'pearson', 'both', 0.9);
    expectRel(res.statistic, -0.828503883588428, 1e-12);
    expectRel(res.pValue, 0.021280260007523286, 1e-9);
    expectRel(res.interval.lower, -0.9644331982722841, 1e-9);
    expectRel(res.interval.upper, -0.3460237473272273, 1e-9);
  });

  test('scipy test suite citing R 3.6.2: n = 4', () => {
    const res = run([1, 2, 3, 4], [0, 1, 0.5, 1], 'pearson');
    expectRel(res.statistic, 0.6741998624632421, 1e-12);
    expectRel(res.pValue, 0.325800137536, 1e-9);
    expectRel(res.interval.lower, -0.814938968841, 1e-9);
    expectRel(res.interval.upper, 0.99230697523, 1e-9);
  });

  test('scipy test suite: tau-b with ties, normal approximation', () => {
    const res = run([12, 2, 1, 12, 2], [1, 4, 7, 1, 0], 'kendall');
    expectRel(res.statistic, -0.47140452079103173, 1e-12);
    expectRel(res.pValue, 0.2827454599327748, 1e-9);
  });

  test('scipy test suite ("cross-check with R"): Spearman with a tie', () => {
    const res = run([1, 2, 3, 4, 5], [5, 6, 7, 8, 7], 'spearman');
    expectRel(res.statistic, 0.82078268166812329, 1e-12);
    expectRel(res.pValue, 0.088587005313543798, 1e-9);
  });

  test.each([
    [10, 0.6319],
    [22, 0.4227],
    [32, 0.3494],
    [102, 0.1946],
  ])('handbook critical |r| at alpha .05 two-tailed, n = %i: p = .05 there', (n, rCrit) => {
    // [custom] critical values printed in most handbooks (exact: 0.63190, 0.42271, 0.34937, 0.19460): the
    // reported-r check must give p close to .05 at the critical value.
    const res = checkReported(rCrit, n, { method: 'pearson', tail: 'both', level: 0.95 });
    expect(Math.abs(res.pValue - 0.05)).toBeLessThan(3e-4);
  });
});

describe('names the coefficient', () => {
  test('point-biserial when one column is two-valued, phi when both are', () => {
    expect(run([0, 1, 0, 1, 1], [2.5, 3.1, 2.2, 4.0, 3.3], 'pearson').name).toBe('point-biserial');
    expect(run([0, 1, 0, 1, 1, 0], [1, 1, 0, 1, 0, 0], 'pearson').name).toBe('phi');
    expect(run([1, 2, 3], [2, 1, 4], 'pearson').name).toBe('Pearson');
    expect(run([0, 1, 0, 1, 1], [2.5, 3.1, 2.2, 4.0, 3.3], 'spearman').name).toBe('Spearman');
  });
});

describe('REPORTED: interval and p from r and n alone equal those from raw data (R cor.test fixture)', () => {
  test.each(rFix.cases.map((c) => [c.name, c] as [string, RCase]))('%s', (_n, c) => {
    const n = (c.x as number[]).length;
    for (const tail of TAILS) {
      const res = checkReported(c.pearson_r, n, { method: 'pearson', tail, level: 0.95 });
      expectRel(res.pValue, c[`pearson_p_${R_ALT[tail]}`] as number, 1e-6, 'p');
      expectRel(res.interval.lower, c.pearson_ci95[0], 1e-9, 'lower');
      expectRel(res.interval.upper, c.pearson_ci95[1], 1e-9, 'upper');
    }
  });
});
