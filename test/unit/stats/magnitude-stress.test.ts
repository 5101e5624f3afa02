/**
 * Stress data with huge and tiny magnitudes: the same data rescaled by powers of two from 2^-1000 (~1e-301) to
 * 2^1000 (~1e301), x and y independently. Power-of-two scaling is exact in binary floating point, so the true r,
 * p-value and interval do not change; any change would be the function's own overflow, underflow or rounding.
 *
 * References: scipy.stats.pearsonr on each rescaled data set (test/fixtures/stress/make-stress.py, scipy 1.10.1),
 * and R's cor.test where R's own sums stay in range (|k| <= 300; test/fixtures/stress/make-stress.R, R 4.2.2).
 */
import { COEF, INTERVAL, PVALUE } from '../../../src/functions/fn-correlation';
import { expectRel } from '../../helpers/close';
import scipy from '../../fixtures/stress/stress-scipy.json';
import rRef from '../../fixtures/stress/stress-r.json';

const col = (v: number[]) => v.map((a) => [a]);
const scaled = (v: number[], k: number) => v.map((a) => a * 2 ** k);
const none = null as unknown as string;
const noLevel = null as unknown as number;

describe('full-precision doubles (scipy fixture "gauss"): r, p and interval are bit-for-bit the same at every scale', () => {
  const { x, y, cases } = scipy.datasets.gauss;
  const base = { r: COEF(col(x), col(y)), p: PVALUE(col(x), col(y)), ci: INTERVAL(col(x), col(y), noLevel, none) };

  test.each(cases.map((c) => [c.kx, c.ky, c] as const))('x * 2^%d, y * 2^%d', (kx, ky, c) => {
    const X = col(scaled(x, kx));
    const Y = col(scaled(y, ky));
    // Exact invariance: the columns are scaled back by the same powers of two before any arithmetic.
    expect(COEF(X, Y)).toBe(base.r);
    expect(PVALUE(X, Y)).toBe(base.p);
    expect(INTERVAL(X, Y, noLevel, none)).toEqual(base.ci);
    // scipy.stats.pearsonr on the scaled data (c.call).
    expectRel(COEF(X, Y), c.r, 1e-12, c.call);
    expectRel(PVALUE(X, Y), c.p, 1e-9, c.call);
  });

  test('Spearman and Kendall are unchanged too (ranks do not see the scale)', () => {
    for (const method of ['spearman', 'kendall']) {
      const r0 = COEF(col(x), col(y), method);
      expect(COEF(col(scaled(x, -1000)), col(scaled(y, 1000)), method)).toBe(r0);
      expect(COEF(col(scaled(x, 1000)), col(scaled(y, -1000)), method)).toBe(r0);
    }
  });
});

describe('decimals as typed (Hollander & Wolfe data, R ?cor.test): every scale agrees with scipy and R', () => {
  const { x, y, cases } = scipy.datasets.hw;

  test.each(cases.map((c) => [c.kx, c.ky, c] as const))('x * 2^%d, y * 2^%d matches scipy', (kx, ky, c) => {
    const X = col(scaled(x, kx));
    const Y = col(scaled(y, ky));
    expectRel(COEF(X, Y), c.r, 1e-12, c.call);
    expectRel(PVALUE(X, Y), c.p, 1e-9, c.call);
    // Unscaled, the columns are read as the decimals they were typed as; scaled by 2^k they are binary fractions
    // and take the binary path. Both paths agree to a few units in the last place.
    expectRel(COEF(X, Y), COEF(col(x), col(y)), 4e-16, `x * 2^${kx}, y * 2^${ky} against the unscaled data`);
  });

  test.each(rRef.pearson.map((c) => [c.k, c] as const))('x and y * 2^%d match R cor.test (r, p, 95%% interval)', (k, c) => {
    const X = col(scaled(rRef.x, k));
    const Y = col(scaled(rRef.y, k));
    expectRel(COEF(X, Y), c.r, 1e-12, c.call);
    expectRel(PVALUE(X, Y), c.p, 1e-9, c.call);
    const [[lo, hi]] = INTERVAL(X, Y, noLevel, none);
    expectRel(lo, c.lower, 1e-9, `${c.call} lower`);
    expectRel(hi, c.upper, 1e-9, `${c.call} upper`);
  });
});
