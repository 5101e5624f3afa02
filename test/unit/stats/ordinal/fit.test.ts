/**
 * The interval and the likelihood-ratio fields shared by the ordinal coefficients. Expected values from R 4.2.2:
 * tanh(atanh(rho) + c(-1, 1) * qnorm(0.5 + level/2) * se / (1 - rho^2)) and pchisq(g2, 1, lower.tail = FALSE),
 * printed with digits = 17.
 */
import { likelihoodRatio, ordinalInterval, readEstimator, RHO_BOUND } from '../../../../src/stats/ordinal/fit';
import { expectRel } from '../../../helpers/close';

describe('ordinalInterval: Wald on the Fisher z scale', () => {
  test('rho 0.5, se 0.05, 95% (R: 0.39578567141811960, 0.59150015847447601)', () => {
    const ci = ordinalInterval(0.5, 0.05, 0.95);
    expectRel(ci.lower, 0.3957856714181196, 1e-14, 'lower');
    expectRel(ci.upper, 0.59150015847447601, 1e-14, 'upper');
    expect(ci).toMatchObject({ level: 0.95, method: 'Wald on Fisher z, SE(z) = SE(rho)/(1 - rho^2)' });
  });
  test('rho -0.8, se 0.1, 90% (R: -0.91469104703128823, -0.56606173037142915)', () => {
    const ci = ordinalInterval(-0.8, 0.1, 0.9);
    expectRel(ci.lower, -0.91469104703128823, 1e-14, 'lower');
    expectRel(ci.upper, -0.56606173037142915, 1e-14, 'upper');
  });
  test('no standard error (rho at the bound): NaN bounds and a note', () => {
    const ci = ordinalInterval(RHO_BOUND, NaN, 0.95);
    expect([ci.lower, ci.upper]).toEqual([NaN, NaN]);
    expect(ci.note).toBe('no standard error, so no interval: rho is at its bound');
  });
  test('a level outside (0, 1) is refused', () => {
    expect(() => ordinalInterval(0.3, 0.1, 95)).toThrow(expect.objectContaining({ code: 'bad-option' }));
  });
});

describe('likelihoodRatio', () => {
  test('G^2 = 3.841458820694124 gives p = 0.05 (R pchisq: 0.049999999999999975) and signed root ±1.959963984540054', () => {
    const pos = likelihoodRatio(0.2, -100 + 3.841458820694124 / 2, -100);
    expectRel(pos.lrStatistic, 3.841458820694124, 1e-13, 'G^2');
    expectRel(pos.pValue, 0.049999999999999975, 1e-12, 'p');
    expectRel(pos.signedZ, 1.959963984540054, 1e-13, 'z');
    expectRel(likelihoodRatio(-0.2, -100 + 3.841458820694124 / 2, -100).signedZ, -1.959963984540054, 1e-13, 'z');
  });
  test('rounding below the null likelihood gives G^2 = 0, p = 1', () => {
    expect(likelihoodRatio(0, -100 - 1e-14, -100)).toEqual({ lrStatistic: 0, pValue: 1, signedZ: 0 });
  });
});

describe('readEstimator', () => {
  test('two-step by default; ml when asked; anything else refused', () => {
    expect(readEstimator(undefined, 'polychoric')).toBe('two-step');
    expect(readEstimator({ estimator: 'ml' }, 'polychoric')).toBe('ml');
    expect(() => readEstimator({ estimator: 'ML' as never }, 'polyserial')).toThrow(
      'polyserial: the estimator must be "two-step" or "ml" (got "ML")',
    );
  });
});
