/**
 * The bivariate normal distribution function and rectangle probabilities (Genz 2004) against mpmath 1.2.1 at 80
 * digits (test/fixtures/ordinal/bivariate-normal-mpmath.json, made by bivariate-normal-mpmath.py beside it: two
 * independent quadratures, Plackett's identity and conditioning on X, agreeing to 1e-30). 48 points of the
 * distribution function, including rho = ±0.999 and ±1, tails at −8 and infinite limits, and 16 rectangles.
 */
import {
  bivariateNormalCdf,
  bivariateNormalPdf,
  bivariateNormalRectangle,
  bivariateNormalUpper,
  normalInterval,
} from '../../../../src/stats/ordinal/bivariate-normal';
import { expectRel } from '../../../helpers/close';
import fix from '../../../fixtures/ordinal/bivariate-normal-mpmath.json';

type Limit = number | string;
const num = (v: Limit): number => (typeof v === 'number' ? v : v === 'Infinity' ? Infinity : -Infinity);

describe('P(X <= h, Y <= k) vs mpmath (bivariate-normal-mpmath.json): within 1e-13 absolute', () => {
  test.each(fix.cdf.map((c) => [c.h, c.k, c.rho, c.cdf] as [Limit, Limit, number, number]))('h = %s, k = %s, rho = %s', (h, k, rho, expected) => {
    expect(Math.abs(bivariateNormalCdf(num(h), num(k), rho) - expected)).toBeLessThan(1e-13);
  });

  test('relative accuracy where every term is positive (rho >= 0, value above 1e-300): 1e-13', () => {
    // Genz (2004) claims double precision absolute; for rho >= 0 no term cancels, so the tails keep their digits.
    for (const c of fix.cdf) {
      if (c.rho < 0 || !(c.cdf > 1e-300)) continue;
      expectRel(bivariateNormalCdf(num(c.h), num(c.k), c.rho), c.cdf, 1e-13, `(${c.h}, ${c.k}, ${c.rho})`);
    }
  });
});

describe('rectangle probabilities vs mpmath (bivariate-normal-mpmath.json): 1e-13 absolute and 1e-12 relative', () => {
  test.each(fix.rectangle.map((c) => [c.x0, c.x1, c.y0, c.y1, c.rho, c.p] as [Limit, Limit, Limit, Limit, number, number]))(
    '(%s, %s] x (%s, %s], rho = %s',
    (x0, x1, y0, y1, rho, expected) => {
      const p = bivariateNormalRectangle(num(x0), num(x1), num(y0), num(y1), rho);
      expect(Math.abs(p - expected)).toBeLessThan(1e-13);
      // Reflected towards the lower-left, small cells keep their digits too (the fixture's smallest is 6.6e-20),
      // except where rho < 0 meets a cell far from the centre.
      if (expected > 0 && !(rho < -0.99)) expectRel(p, expected, 1e-12, 'relative');
    },
  );
});

describe('identities of the bivariate normal [custom: from its symmetries]', () => {
  const points: [number, number, number][] = [
    [0.3, -1.2, 0.4],
    [-2, -0.5, -0.7],
    [1.5, 1.7, 0.95],
    [-0.4, 2.2, -0.97],
    [3, -3, 0.1],
  ];
  test.each(points)('(%s, %s, %s): upper orthant, exchange, and the sum over a 4 x 5 grid is 1', (h, k, rho) => {
    expect(Math.abs(bivariateNormalUpper(h, k, rho) - bivariateNormalCdf(-h, -k, rho))).toBe(0);
    expect(Math.abs(bivariateNormalCdf(h, k, rho) - bivariateNormalCdf(k, h, rho))).toBeLessThan(1e-16);
    const xs = [-Infinity, -1, h, 2, Infinity].sort((a, b) => a - b);
    const ys = [-Infinity, -1.5, k, 0.5, 1.8, Infinity].sort((a, b) => a - b);
    let total = 0;
    for (let i = 0; i + 1 < xs.length; i++) for (let j = 0; j + 1 < ys.length; j++) total += bivariateNormalRectangle(xs[i], xs[i + 1], ys[j], ys[j + 1], rho);
    expect(Math.abs(total - 1)).toBeLessThan(1e-15);
  });

  test('rho = 0 factorises: Φ(h)Φ(k) (R pnorm(0.7) * pnorm(-0.2) = 0.31893643321938536)', () => {
    expectRel(bivariateNormalCdf(0.7, -0.2, 0), 0.31893643321938536, 1e-15, 'product');
  });

  test('density: R mvtnorm::dmvnorm(c(0.5, -1), sigma = matrix(c(1, .6, .6, 1), 2)) = 0.046885537727871233', () => {
    expectRel(bivariateNormalPdf(0.5, -1, 0.6), 0.046885537727871233, 1e-14, 'density');
    expect(bivariateNormalPdf(Infinity, 0, 0.3)).toBe(0);
    expect(bivariateNormalPdf(0, 0, 1)).toBeNaN();
  });

  test('normalInterval: both tails differenced where small (R: pnorm(-8) - pnorm(-8.5) = 6.1261652260497512e-16)', () => {
    expectRel(normalInterval(8, 8.5), 6.1261652260497512e-16, 1e-14, 'upper tail');
    expectRel(normalInterval(-8.5, -8), 6.1261652260497512e-16, 1e-14, 'lower tail');
    expect(normalInterval(1, 1)).toBe(0);
    expect(normalInterval(-Infinity, Infinity)).toBe(1);
  });

  test('NaN in, NaN out; empty rectangles are 0', () => {
    expect(bivariateNormalCdf(NaN, 0, 0.5)).toBeNaN();
    expect(bivariateNormalCdf(0, 0, 1.5)).toBeNaN();
    expect(bivariateNormalRectangle(1, 0, -1, 1, 0.2)).toBe(0);
    expect(bivariateNormalRectangle(0, NaN, -1, 1, 0.2)).toBeNaN();
  });
});
