/**
 * The Bayes factor for a correlation against none (Ly, Verhagen & Wagenmakers 2016; Jeffreys's exact likelihood,
 * stretched beta prior of width kappa) against R 4.2.2 BayesFactor 0.9.12-4.4 correlationBF(y, x, rscale = kappa)
 * (test/fixtures/verdict/bayes-factor-r.R and .json; 126 cases, n = 5..1000, kappa = 1, 1/sqrt(3), 1/3), to
 * relative 1e-6 in BF10 (on log BF10 where R's BF10 leaves the doubles).
 */
import * as fs from 'fs';
import * as path from 'path';
import { bayesCorrelation } from '../../../../src/stats/correlation/bayes';

const R = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../fixtures/verdict/bayes-factor-r.json'), 'utf8'));
type Case = { n: number; r: number; rscale: number; rscale_label: string; bf10: number | null; log_bf10: number | null };
// R returns NA where its own hypergeometric series does not converge (n = 1000, r = 0.9): those three cases are
// held against the mpmath evaluation instead (bayes-posterior-mpmath.json, below).
const withR = (R.cases as Case[]).filter((c) => c.log_bf10 !== null);

describe('BF10 against BayesFactor::correlationBF', () => {
  test('the fixture covers small and large n, all three widths, and correlations near zero and strong ones', () => {
    const cases = R.cases as Case[];
    expect(cases.length - withR.length).toBe(3);
    expect(new Set(cases.map((c) => c.n))).toEqual(new Set([5, 10, 20, 48, 100, 1000]));
    expect(new Set(cases.map((c) => c.rscale_label)).size).toBe(3);
    expect(Math.min(...withR.map((c) => c.bf10 as number))).toBeLessThan(0.2);
    expect(Math.max(...withR.map((c) => c.log_bf10 as number))).toBeGreaterThan(100);
  });
  test.each(withR.map((c, i) => [i, c.n, c.r, c.rscale_label, c] as const))('case %i: n = %i, r = %d, kappa = %s', (_i, _n, _r, _k, c) => {
    const b = bayesCorrelation(c.r, c.n, { priorWidth: c.rscale });
    const bf = c.bf10 as number;
    if (Number.isFinite(bf) && bf < 1e300) expect(Math.abs(b.bf10 / bf - 1)).toBeLessThan(1e-6);
    expect(Math.abs(b.logBf10 - (c.log_bf10 as number))).toBeLessThan(1e-6);
    expect(b.bf01 * b.bf10).toBeCloseTo(1, 12);
    expect(b.lower).toBeLessThanOrEqual(b.median);
    expect(b.median).toBeLessThanOrEqual(b.upper);
  });
});

describe('posterior probability and prior odds', () => {
  test('P(H1 | data) = BF10 odds / (1 + BF10 odds)', () => {
    const b = bayesCorrelation(0.3, 48, { priorOdds: 0.25 });
    const odds = b.bf10 * 0.25;
    expect(b.posteriorProbability).toBeCloseTo(odds / (1 + odds), 14);
  });
  test('bad priors are refused', () => {
    expect(() => bayesCorrelation(0.3, 48, { priorWidth: 0 })).toThrow(/prior width/);
    expect(() => bayesCorrelation(0.3, 48, { priorOdds: -1 })).toThrow(/prior odds/);
    expect(() => bayesCorrelation(1, 48)).toThrow(/strictly between/);
  });
});

/**
 * The posterior of rho under H1 (median, 95% central credible interval, mean) and BF10 where R gives NA, against
 * mpmath quadrature of the same likelihood and prior at 40 and 55 digits (test/fixtures/verdict/
 * bayes-posterior-mpmath.py and .json, mpmath 1.2.1, Python 3.11.2; the cases are those of bayes-factor-r.json).
 * Quantiles and mean are on rho's own scale and BF10 on its log, held to 1e-10 absolute (the largest differences
 * seen: 2.3e-13 in log BF10, 3.3e-14 in the median).
 */
describe('posterior of rho against mpmath', () => {
  const M = JSON.parse(fs.readFileSync(path.resolve(__dirname, '../../../fixtures/verdict/bayes-posterior-mpmath.json'), 'utf8'));
  type Post = {
    case: number; n: number; r: number; rscale: number; rscale_label: string; log_bf10: string; R_status: string;
    posterior_median: string; posterior_q025: string; posterior_q975: string; posterior_mean: string;
  };
  const cases = M.cases as Post[];
  test('the fixture has every case of the R fixture, including the three where R returned NA', () => {
    expect(cases.length).toBe((R.cases as Case[]).length);
    expect(cases.filter((c) => c.R_status !== 'ok').map((c) => c.case)).toEqual([120, 121, 122]);
  });
  test.each(cases.map((c) => [c.case, c.n, c.r, c.rscale_label, c] as const))('case %i: n = %i, r = %d, kappa = %s', (_i, _n, _r, _k, c) => {
    const b = bayesCorrelation(c.r, c.n, { priorWidth: c.rscale, level: 0.95 });
    expect(Math.abs(b.logBf10 - Number(c.log_bf10))).toBeLessThan(1e-10);
    expect(Math.abs(b.median - Number(c.posterior_median))).toBeLessThan(1e-10);
    expect(Math.abs(b.lower - Number(c.posterior_q025))).toBeLessThan(1e-10);
    expect(Math.abs(b.upper - Number(c.posterior_q975))).toBeLessThan(1e-10);
    expect(Math.abs(b.mean - Number(c.posterior_mean))).toBeLessThan(1e-10);
  });
});
